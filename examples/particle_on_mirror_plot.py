#!/usr/bin/python3
"""Table and figure of the particle-on-mirror sweep (examples/particle_on_mirror.yaml, run with
`yeegap sweep examples/particle_on_mirror.yaml`): for each spacer width and tunnelling model, the number of
gap cells, the scattering peak, and the gap field enhancement |E|^2/|E_inc|^2 half-way across the
spacer on the axis; the figure puts the classical and quantum-corrected scattering spectra side by
side with the enhancement against the spacer width. Points not run yet are left out.

Usage: particle_on_mirror_plot.py [SWEEP_DIR]      (default: examples/particle_on_mirror_sweep)"""
import os
import sys

import h5py
import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))


def text(v):
    return v.decode() if isinstance(v, bytes) else str(v)


def gap_enhancement(f):
    """|E|^2/|E_inc|^2 at the field map's node on the axis half-way across the spacer, per frequency,
    with |E_inc|^2 from the plane wave's own spectrum (/sources)."""
    m = f["outputs/gap_plane"]
    x, y, z = m["x"][:], m["y"][:], m["z"][:]
    mid = 0.5 * (z[0] + z[-1])
    e2 = m["E_squared"][:, int(np.argmin(np.abs(z - mid))), int(np.argmin(np.abs(y))), int(np.argmin(np.abs(x)))]
    om = f["sources/omega"][:]
    inc = f["sources/incident_re"][0] + 1j * f["sources/incident_im"][0]
    idx = [int(np.argmin(np.abs(om - w))) for w in m["omega"][:]]
    return m["wavelength_nm"][:], e2 / np.abs(inc[idx]) ** 2


def read_point(path):
    with h5py.File(path, "r") as f:
        s = f["sweep"]
        values = dict(zip((text(n) for n in s["parameter_names"][:]), (text(v) for v in s["parameter_values"][:])))
        cs = f["outputs/particle_on_mirror"]
        wl_map, enhancement = gap_enhancement(f)
        cells = int(f["tunnelling/cells"][0]) if "tunnelling" in f else 0
        return {"spacer_nm": float(values["spacer"].split()[0]), "model": values["model"], "cells": cells,
                "wl": cs["wavelength_nm"][:], "sca": cs["scattering"][:] * 1e18, "wl_map": wl_map,
                "enhancement": enhancement}


def main():
    folder = sys.argv[1] if len(sys.argv) > 1 else os.path.join(HERE, "particle_on_mirror_sweep")
    points = [read_point(os.path.join(folder, n)) for n in sorted(os.listdir(folder))
              if n.startswith("point_") and n.endswith(".h5")]
    if not points:
        sys.exit(f"no finished points in {folder}: run `yeegap sweep examples/particle_on_mirror.yaml` first")
    points.sort(key=lambda p: (-p["spacer_nm"], p["model"]))
    print("spacer_nm  model              gap_cells  scattering_peak_nm  C_sca_peak_nm2  gap_enhancement_max  at_nm")
    for p in points:
        k, q = int(np.argmax(p["sca"])), int(np.argmax(p["enhancement"]))
        print(f"{p['spacer_nm']:8.2f}   {p['model']:18s} {p['cells']:9d}  {p['wl'][k]:18.1f}  {p['sca'][k]:14.1f}  "
              f"{p['enhancement'][q]:19.4g}  {p['wl_map'][q]:5.0f}")
    try:
        import matplotlib
        matplotlib.use("Agg")
        import matplotlib.pyplot as plt
    except ImportError:
        print("matplotlib is not installed: no figure", file=sys.stderr)
        return
    models = ["classical", "quantum_corrected"]
    fig, ax = plt.subplots(1, 3, figsize=(15, 4.5))
    for i, model in enumerate(models):
        for p in (p for p in points if p["model"] == model):
            ax[i].plot(p["wl"], p["sca"], label=f"{p['spacer_nm']:g} nm")
        ax[i].set(title=model.replace("_", "-"), xlabel="wavelength (nm)", ylabel="scattering cross section (nm²)")
        ax[i].legend(title="spacer")
    for model, style in zip(models, ["o--", "s-"]):
        mine = [p for p in points if p["model"] == model]
        ax[2].semilogy([p["spacer_nm"] for p in mine], [p["enhancement"].max() for p in mine], style,
                       label=model.replace("_", "-"))
    ax[2].set(xlabel="spacer (nm)", ylabel="largest |E|²/|E_inc|² at the gap centre", title="gap field enhancement")
    ax[2].legend()
    fig.tight_layout()
    png = os.path.join(folder, "particle_on_mirror.png")
    fig.savefig(png, dpi=120)
    print(f"figure: {png}", file=sys.stderr)


if __name__ == "__main__":
    main()
