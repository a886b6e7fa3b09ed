"""Field maps of a results file: |E|^2 (the `E_squared` dataset, or |E|^2/|E_inc|^2 from
`E_enhancement` when the run has a plane wave) on the map's plane, one figure per
frequency, on a logarithmic colour scale, drawn at the true node coordinates (pcolormesh with
Gouraud shading over the node positions, so graded grids come out right). The material
boundaries are drawn on top along the cell edges where the material changes, as the solver sees
them (staircased). A volume map is shown on the slice through its peak, normal to its thinnest
axis; a line map as a curve."""
import numpy as np
from matplotlib.collections import LineCollection
from matplotlib.colors import LogNorm

from plot_common import new_figure

AXES = "xyz"
IN_PLANE = {0: (1, 2), 1: (0, 2), 2: (0, 1)}  # normal axis -> (horizontal, vertical) axes
DECADES = 5                                  # colour range below the top of the scale
TOP_PERCENTILE = 99.5                        # top of the colour scale: a source's own node is singular


# (title word, colour-bar label) of what a figure shows.
E_SQUARED = ("|E|²", "|E|² (V² s²/m²)")
ENHANCEMENT = ("|E|²/|E₀|²", "|E|²/|E₀|² (enhancement over the incident wave)")

def choose_plane(coords, e2):
    """(normal axis, node index along it, description) of the plane to show."""
    lengths = [len(c) for c in coords]
    flat = [a for a in range(3) if lengths[a] == 1]
    if flat:
        return flat[0], 0, "plane"
    normal = int(np.argmin(lengths))
    peak = np.unravel_index(int(np.argmax(e2)), e2.shape)  # (z, y, x) indices
    return normal, int(peak[2 - normal]), "slice through the peak"


def material_slice(f, normal, position):
    """Node coordinates (horizontal, vertical) and material indices (rows vertical) of the cell layer
    of the whole grid next to the plane at `position` along `normal` (the layer above it, or below
    at the top face)."""
    grid = [f["grid/x"][...], f["grid/y"][...], f["grid/z"][...]]
    k = int(np.argmin(np.abs(grid[normal] - position)))
    k = min(k, len(grid[normal]) - 2)
    u, v = IN_PLANE[normal]
    materials = np.take(f["materials/map"][...], k, axis=2 - normal)
    return grid[u], grid[v], materials


def boundary_segments(gu, gv, m):
    """Cell edges between neighbouring cells of different material, as line segments; `m` has rows
    along gv and columns along gu (one fewer than the node coordinates)."""
    jj, ii = np.nonzero(m[:, :-1] != m[:, 1:])           # edges of constant u = gu[i + 1]
    vertical = np.stack([np.stack([gu[ii + 1], gv[jj]], -1), np.stack([gu[ii + 1], gv[jj + 1]], -1)], 1)
    jj, ii = np.nonzero(m[:-1, :] != m[1:, :])           # edges of constant v = gv[j + 1]
    horizontal = np.stack([np.stack([gu[ii], gv[jj + 1]], -1), np.stack([gu[ii + 1], gv[jj + 1]], -1)], 1)
    return np.concatenate([vertical.reshape(-1, 2, 2), horizontal.reshape(-1, 2, 2)])


def dipoles_in_plane(f, normal, position, u, v):
    """In-plane coordinates (m) of the dipoles lying within half a cell of the plane."""
    if "sources/position" not in f or f["sources/position"].shape[0] == 0:
        return np.empty((0, 2))
    grid = f["grid/" + AXES[normal]][...]
    half_cell = 0.5 * np.min(np.diff(grid)) if len(grid) > 1 else 0.0
    p = f["sources/position"][...]
    near = np.abs(p[:, normal] - position) <= half_cell * (1 + 1e-9)
    return p[near][:, [u, v]]


def plane_figure(f, name, e2, coords, wavelength_nm, quantity=E_SQUARED):
    normal, index, how = choose_plane(coords, e2)
    u, v = IN_PLANE[normal]
    position = coords[normal][index]
    values = np.take(e2, index, axis=2 - normal)         # rows along v, columns along u
    fig, (ax,) = new_figure(1)
    top = float(np.percentile(values, TOP_PERCENTILE))
    if top <= 0:
        top = float(np.max(values))
    norm = LogNorm(vmin=top * 10.0**-DECADES, vmax=top) if top > 0 else None
    shown = np.clip(values, top * 10.0**-DECADES, top) if top > 0 else values
    mesh = ax.pcolormesh(coords[u] * 1e9, coords[v] * 1e9, shown, shading="gouraud", cmap="inferno", norm=norm,
                         rasterized=True)
    fig.colorbar(mesh, ax=ax, extend="both", label=f"{quantity[1]}, log scale")
    gu, gv, materials = material_slice(f, normal, position)
    segments = boundary_segments(gu * 1e9, gv * 1e9, materials)
    if len(segments):
        ax.add_collection(LineCollection(segments, colors="cyan", linewidths=1.0, label="material boundary"))
    for pu, pv in dipoles_in_plane(f, normal, position, u, v):
        ax.plot(pu * 1e9, pv * 1e9, marker="+", color="lime", ms=10, mew=1.5, ls="none", label="dipole")
    ax.set_xlim(coords[u][0] * 1e9, coords[u][-1] * 1e9)
    ax.set_ylim(coords[v][0] * 1e9, coords[v][-1] * 1e9)
    ax.set_aspect("equal")
    ax.set_xlabel(f"{AXES[u]} (nm)")
    ax.set_ylabel(f"{AXES[v]} (nm)")
    at = round(position * 1e9, 3) + 0.0  # + 0.0: no "-0"
    ax.set_title(f"{name}: {quantity[0]} at {wavelength_nm:.1f} nm, {how} {AXES[normal]} = {at:g} nm")
    if len(segments) or ax.get_legend_handles_labels()[0]:
        ax.legend(fontsize="small", loc="upper right", framealpha=0.6)
    return fig


def line_figure(name, e2, coords, wavelength_nm, quantity=E_SQUARED):
    along = int(np.argmax([len(c) for c in coords]))
    fig, (ax,) = new_figure(1)
    ax.semilogy(coords[along] * 1e9, e2.reshape(-1), marker=".")
    ax.set_xlabel(f"{AXES[along]} (nm)")
    ax.set_ylabel(quantity[1])
    ax.set_title(f"{name}: {quantity[0]} at {wavelength_nm:.1f} nm")
    ax.grid(True, alpha=0.3)
    return fig


def field_map_figures(f, name, g):
    """Yields (wavelength_nm, figure) for each frequency of the field map; nothing if it recorded
    no E component (then it has no E_squared) or is a single point."""
    if "E_squared" not in g:
        return
    # Under a plane wave the map also holds |E|²/|E_inc|², the near-field enhancement: plot that.
    if "E_enhancement" in g:
        data, quantity = g["E_enhancement"], ENHANCEMENT
    else:
        data, quantity = g["E_squared"], E_SQUARED
    coords = [g["x"][...], g["y"][...], g["z"][...]]
    long_axes = sum(len(c) > 1 for c in coords)
    if long_axes == 0:
        return
    wavelengths = g["wavelength_nm"][...]
    for q, wl in enumerate(wavelengths):
        e2 = data[q]
        if long_axes == 1:
            yield wl, line_figure(name, e2, coords, wl, quantity)
        else:
            yield wl, plane_figure(f, name, e2, coords, wl, quantity)
