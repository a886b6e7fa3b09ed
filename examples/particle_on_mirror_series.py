#!/usr/bin/python3
"""The particle-on-mirror series: examples/particle_on_mirror.yaml run for each spacer width and both
gap models (classical, quantum-corrected), with `yeegap run --set` overrides, then one table and one
figure side by side: the scattering spectra of each model and the gap field enhancement
|E|^2/|E_inc|^2 at the centre of the spacer against the spacer width. Until the scene's `sweep`
block lands, this script is the sweep.

Usage: particle_on_mirror_series.py [--yeegap PATH] [--spacers 2,1,0.5,0.3,0.2] [--out DIR]
                                    [--set KEY=VALUE ...]
Cost: one run per spacer and model; `yeegap check examples/particle_on_mirror.yaml` prints the cost
of one (the 0.2 nm runs take 2.5 times the 0.5 nm one: the time step follows the spacer)."""
import argparse
import os
import subprocess
import sys

import h5py
import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
RADIUS_NM = 20.0            # the particle's radius in the scene


def run(yeegap, spacer_nm, model, out_dir, extra):
    """Runs one spacer width and model; returns the results file's path."""
    name = os.path.join(out_dir, f"pom_{spacer_nm:g}nm_{model}.h5")
    z = spacer_nm / 2  # the plane half-way across the spacer, a grid node (4 cells across)
    cmd = [yeegap, "run", os.path.join(HERE, "particle_on_mirror.yaml"), "-o", name, "--json",
           "--set", f"bodies[1].center=[0 nm, 0 nm, {spacer_nm + RADIUS_NM:g} nm]",
           "--set", f"tunnelling.model={model}",
           "--set", f"outputs[1].field_map.region={{from: [-8 nm, 0 nm, {z:g} nm], to: [8 nm, 8 nm, {z:g} nm]}}",
           "--set", f'scene.title="particle on mirror, {spacer_nm:g} nm spacer, {model}"']
    for e in extra:
        cmd += ["--set", e]
    print(f"running spacer {spacer_nm:g} nm, {model} ...", file=sys.stderr, flush=True)
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"yeegap run failed ({done.returncode}):\n{done.stderr}")
    return name


def read(path):
    """Wavelengths (nm), scattering and absorption (nm^2), the gap-centre enhancement at the field
    map's wavelengths, and the gap cells reported."""
    with h5py.File(path, "r") as f:
        cs = f["outputs/particle_on_mirror"]
        wl = cs["wavelength_nm"][:]
        sca, ab = cs["scattering"][:] * 1e18, cs["absorption"][:] * 1e18
        m = f["outputs/gap_plane"]
        x, y = m["x"][:], m["y"][:]
        e2 = m["E_squared"][:, 0, int(np.argmin(np.abs(y))), int(np.argmin(np.abs(x)))]
        # |E_inc|^2 at the field map's frequencies from the plane wave's own spectrum (/sources).
        om, inc = f["sources/omega"][:], f["sources/incident_re"][0] + 1j * f["sources/incident_im"][0]
        idx = [int(np.argmin(np.abs(om - w))) for w in m["omega"][:]]
        enhancement = e2 / np.abs(inc[idx]) ** 2
        cells = int(f["tunnelling"]["cells"][0]) if "tunnelling" in f and "cells" in f["tunnelling"] else 0
        return wl, sca, ab, m["wavelength_nm"][:], enhancement, cells


def main():
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--yeegap", default=os.path.join(HERE, "..", "build", "tools", "yeegap"))
    p.add_argument("--spacers", default="2,1,0.5,0.3,0.2", help="spacer widths in nm, comma-separated")
    p.add_argument("--out", default=os.path.join(HERE, "particle_on_mirror_series"))
    p.add_argument("--set", action="append", default=[], help="extra overrides for every run")
    a = p.parse_args()
    os.makedirs(a.out, exist_ok=True)
    spacers = [float(s) for s in a.spacers.split(",")]
    models = ["classical", "quantum_corrected"]
    table = {}
    for s in spacers:
        for model in models:
            table[s, model] = read(run(a.yeegap, s, model, a.out, a.set))

    print("spacer_nm  model              gap_cells  scattering_peak_nm  C_sca_peak_nm2  "
          "gap_enhancement_max  at_nm")
    for s in spacers:
        for model in models:
            wl, sca, ab, wl_map, enh, cells = table[s, model]
            k, q = int(np.argmax(sca)), int(np.argmax(enh))
            print(f"{s:8.2f}   {model:18s} {cells:9d}  {wl[k]:18.1f}  {sca[k]:14.1f}  {enh[q]:19.4g}  {wl_map[q]:5.0f}")

    try:
        import matplotlib
        matplotlib.use("Agg")
        import matplotlib.pyplot as plt
    except ImportError:
        print("matplotlib is not installed: no figure", file=sys.stderr)
        return
    fig, ax = plt.subplots(1, 3, figsize=(15, 4.5))
    for i, model in enumerate(models):
        for s in spacers:
            wl, sca = table[s, model][0], table[s, model][1]
            ax[i].plot(wl, sca, label=f"{s:g} nm")
        ax[i].set(title=model.replace("_", "-"), xlabel="wavelength (nm)", ylabel="scattering cross section (nm²)")
        ax[i].legend(title="spacer")
    for model, style in zip(models, ["o--", "s-"]):
        peak = [table[s, model][4].max() for s in spacers]
        ax[2].semilogy(spacers, peak, style, label=model.replace("_", "-"))
    ax[2].set(xlabel="spacer (nm)", ylabel="largest |E|²/|E_inc|² at the gap centre", title="gap field enhancement")
    ax[2].legend()
    fig.tight_layout()
    png = os.path.join(a.out, "particle_on_mirror_series.png")
    fig.savefig(png, dpi=120)
    print(f"figure: {png}", file=sys.stderr)


if __name__ == "__main__":
    main()
