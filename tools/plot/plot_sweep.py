"""Heat maps of a sweep: a spectrum of every point (its cross sections' extinction, a plane wave's
reflectance, a flux's power or fraction, a decay rate's total enhancement) over the swept parameter
(x) and the wavelength (y), one figure per spectrum, with a panel for each value of the other
parameters (the model of a tunnelling sweep, say). The merged table sweep.h5 (docs/results_file.md,
"Sweeps") names the points' results files; the spectra are read from them, so keep them beside it.
An angle scan's reflectance is drawn over the angle instead of the wavelength."""
import os

import h5py
import numpy as np

from plot_common import DPI, FIGURE_SIZE_IN, NotResults, safe_name, text

SWEEP_FORMAT, SWEEP_VERSION = "yeegap-sweep", 1
MAX_PANELS = 4  # more combinations of the other parameters than this: the first ones only, with a note


def is_sweep_table(path):
    """Whether `path` is a sweep table (format yeegap-sweep), without raising for other files."""
    try:
        with h5py.File(path, "r") as f:
            return text(f.attrs.get("format", b"")) == SWEEP_FORMAT
    except OSError:
        return False


class Table:
    """The rows of sweep.h5: point files (absolute), parameter values, units and kinds."""

    def __init__(self, path):
        with h5py.File(path, "r") as f:
            if text(f.attrs.get("format", b"")) != SWEEP_FORMAT:
                raise NotResults(f"'{path}' is not a {SWEEP_FORMAT} table")
            version = int(f.attrs.get("format_version", 0))
            if not 1 <= version <= SWEEP_VERSION:
                raise NotResults(f"'{path}' has format_version {version}; this script reads 1 to {SWEEP_VERSION}")
            folder = os.path.dirname(os.path.abspath(path))
            self.files = [os.path.join(folder, text(s)) for s in f["points/file"][...]]
            self.points = [int(p) for p in f["points/index"][...]]
            self.parameters = {}  # name -> (values, unit, numeric)
            for name, d in f["parameters"].items():
                numeric = text(d.attrs.get("kind", b"text")) == "number"
                values = d[...] if numeric else [text(v) for v in d[...]]
                unit = text(d.attrs.get("units", b"none"))
                self.parameters[name] = (np.asarray(values, dtype=float) if numeric else values, unit, numeric)

    def axis_parameter(self):
        """The parameter along x: the first numeric one that takes more than one value, else None."""
        for name, (values, _, numeric) in self.parameters.items():
            if numeric and len(set(values.tolist())) > 1:
                return name
        return None

    def label(self, name, value):
        values, unit, numeric = self.parameters[name]
        if not numeric:
            return f"{name} = {value}"
        return f"{name} = {value:g}" + ("" if unit in ("1", "none") else f" {unit}")


def spectra_of(path):
    """{(output, quantity): (y values, y label, data, data unit)} of one point's results file."""
    out = {}
    with h5py.File(path, "r") as f:
        for name, g in (f["outputs"].items() if "outputs" in f else []):
            kind = text(g.attrs.get("kind", b""))
            if kind == "cross_sections":
                per_length = bool(g.attrs.get("per_unit_length", 0))
                scale, unit = (1e9, "nm, per unit length") if per_length else (1e18, "nm²")
                out[(name, "extinction")] = (g["wavelength_nm"][...], "wavelength (nm)", g["extinction"][...] * scale, unit)
            elif kind == "reflectance":
                scan = bool(g.attrs.get("angle_scan", 0))
                y = (g["angle_deg"][...], "angle of incidence (deg)") if scan else (g["wavelength_nm"][...], "wavelength (nm)")
                out[(name, "reflectance")] = (*y, g["reflectance"][...], "1")
            elif kind == "flux":
                quantity = "fraction" if "fraction" in g else "power"
                out[(name, quantity)] = (g["wavelength_nm"][...], "wavelength (nm)", g[quantity][...],
                                         text(g[quantity].attrs.get("units", b"")))
            elif kind == "decay_rate":
                out[(name, "total")] = (g["wavelength_nm"][...], "wavelength (nm)", g["total"][...], "1")
    return out


def edges(centres):
    """Cell edges around sorted centres: midpoints, the ends half a spacing out (one centre: +-0.5)."""
    c = np.asarray(centres, dtype=float)
    if len(c) == 1:
        return np.array([c[0] - 0.5, c[0] + 0.5])
    mid = 0.5 * (c[1:] + c[:-1])
    return np.concatenate([[c[0] - (mid[0] - c[0])], mid, [c[-1] + (c[-1] - mid[-1])]])


def panels(table, x_name):
    """Row indices grouped by the values of the parameters other than `x_name`, in row order."""
    others = [n for n in table.parameters if n != x_name]
    groups = {}
    for row in range(len(table.files)):
        key = tuple(table.parameters[n][0][row] for n in others)
        groups.setdefault(key, []).append(row)
    labels = [", ".join(table.label(n, v) for n, v in zip(others, key)) for key in groups]
    return list(zip(labels, groups.values()))


def heat_map(table, key, spectra, x_name, notes):
    """One figure: a panel per group of rows, columns at the x parameter's values (or one per row
    when no numeric parameter varies), each column the point's spectrum; one colour scale."""
    import matplotlib.pyplot as plt

    groups = panels(table, x_name) if x_name else [("", list(range(len(table.files))))]
    if len(groups) > MAX_PANELS:
        notes.append(f"{key[0]}.{key[1]}: {len(groups)} combinations of the other parameters; the first {MAX_PANELS} drawn")
        groups = groups[:MAX_PANELS]
    present = [s[2] for s in spectra if s is not None]
    lo = min(float(np.nanmin(d)) for d in present)
    hi = max(float(np.nanmax(d)) for d in present)
    fig, axes = plt.subplots(len(groups), 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained", squeeze=False)
    mesh, y_label, unit = None, "", ""
    for (label, rows), (ax,) in zip(groups, axes):
        if x_name:
            xs = table.parameters[x_name][0][rows]
            order = np.argsort(xs, kind="stable")
            rows, xs = [rows[i] for i in order], xs[order]
        else:
            xs = np.arange(len(rows), dtype=float)
        x_edges = edges(xs)
        for i, row in enumerate(rows):
            s = spectra[row]
            if s is None:
                continue
            y, y_label, data, unit = s
            o = np.argsort(y)
            mesh = ax.pcolormesh(x_edges[i:i + 2], edges(y[o]), data[o][:, None], vmin=lo, vmax=hi,
                                 cmap="viridis", shading="flat")
        if x_name:
            _, x_unit, _ = table.parameters[x_name]
            ax.set_xlabel(x_name + ("" if x_unit in ("1", "none") else f" ({x_unit})"))
            ax.set_xticks(xs)
            ax.set_xticklabels([f"{v:g}" for v in xs])
        else:
            ax.set_xticks(xs)
            ax.set_xticklabels([f"point {table.points[r]}" for r in rows], fontsize=8)
        ax.set_xlim(x_edges[0], x_edges[-1])
        ax.set_ylabel(y_label)
        ax.set_title(label, fontsize=9)
    if mesh is not None:
        fig.colorbar(mesh, ax=[row[0] for row in axes],
                     label=f"{key[0]} {key[1]}" + ("" if unit in ("1", "") else f" ({unit})"))
    fig.suptitle(f"{key[0]}: {key[1]} over the sweep", fontsize=11)
    return fig


def sweep_figures(path, out_dir, formats, notes):
    """Every heat map of the sweep table at `path`; returns (stem, figure) pairs."""
    table = Table(path)
    if not table.files:
        notes.append(f"{path} has no finished points")
        return []
    spectra, missing = [], []
    for row, file in enumerate(table.files):
        try:
            spectra.append(spectra_of(file))
        except OSError:
            spectra.append({})
            missing.append(os.path.basename(file))
    if missing:
        notes.append(f"cannot read {len(missing)} point files ({', '.join(missing)}): their columns stay blank; "
                     "keep the point files beside sweep.h5")
    keys = []
    for s in spectra:
        keys += [k for k in s if k not in keys]
    x_name = table.axis_parameter()
    stem = os.path.join(out_dir, os.path.splitext(os.path.basename(path))[0])
    figures = []
    for key in keys:
        column = [s.get(key) for s in spectra]
        figures.append((f"{stem}_{safe_name(key[0])}_{key[1]}", heat_map(table, key, column, x_name, notes)))
    return figures
