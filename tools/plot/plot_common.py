"""Shared pieces of the yeegap plot script: opening a results file (docs/results_file.md layout, format
yeegap-results version 1), reading its fixed-length strings, naming and saving figures.
Every figure has the same size in pixels (FIGURE_SIZE_PX), so a check can rely on it."""
import os
import re

import h5py
import matplotlib.pyplot as plt

RESULTS_FORMAT = "yeegap-results"
RESULTS_VERSION = 1          # the newest format_version this script reads (docs/results_file.md, "Versions")
DPI = 100
FIGURE_SIZE_IN = (7.0, 5.6)  # 700 x 560 pixels at DPI
FIGURE_SIZE_PX = (int(FIGURE_SIZE_IN[0] * DPI), int(FIGURE_SIZE_IN[1] * DPI))


class NotResults(Exception):
    """The file is not a results file this script can read."""


def text(value):
    """An HDF5 string (docs/results_file.md: fixed-length ASCII, which h5py returns as bytes) as str."""
    if hasattr(value, "decode"):
        return value.decode("utf-8", "replace")
    return str(value)


def texts(values):
    """A string-array attribute as a list of str."""
    return [text(v) for v in values]


def open_results(path):
    """Opens `path` read-only after checking its format and version."""
    try:
        f = h5py.File(path, "r")
    except OSError as e:
        raise NotResults(f"cannot open '{path}' as HDF5: {e}") from None
    fmt = text(f.attrs.get("format", b""))
    version = int(f.attrs.get("format_version", 0))
    if fmt != RESULTS_FORMAT:
        f.close()
        raise NotResults(f"'{path}' is not a {RESULTS_FORMAT} file")
    if not 1 <= version <= RESULTS_VERSION:
        f.close()
        raise NotResults(f"'{path}' has format_version {version}; this script reads 1 to {RESULTS_VERSION}")
    return f


def outputs_of_kind(f, kind):
    """(name, group) of every output of the given kind ('probe', 'field_map', 'flux'), by name."""
    if "outputs" not in f:
        return []
    return [(name, g) for name, g in sorted(f["outputs"].items()) if text(g.attrs.get("kind", b"")) == kind]


def safe_name(name):
    """A file-name-safe version of an output name."""
    return re.sub(r"[^A-Za-z0-9_.-]", "_", name)


def wavelength_label(nm):
    """500 -> '500', 632.81 -> '632.8': wavelengths in file names, to 0.1 nm."""
    return f"{nm:.1f}".rstrip("0").rstrip(".")


def new_figure(rows=1):
    fig, axes = plt.subplots(rows, 1, figsize=FIGURE_SIZE_IN, dpi=DPI, layout="constrained", squeeze=False)
    return fig, [row[0] for row in axes]


def save(fig, stem, formats):
    """Writes `stem`.<format> for each format and closes the figure; returns the paths."""
    paths = []
    for ext in formats:
        path = f"{stem}.{ext}"
        fig.savefig(path, dpi=DPI)
        paths.append(path)
    plt.close(fig)
    return paths


def output_stem(results_path, out_dir, *parts):
    """<out_dir>/<results stem>_<part>_<part>...: figures sit next to the results by default."""
    base = os.path.splitext(os.path.basename(results_path))[0]
    return os.path.join(out_dir, "_".join([base] + [safe_name(p) for p in parts]))
