#!/usr/bin/python3
"""Runs a coarse version of point 5 of examples/particle_on_mirror.yaml (a 10 nm-radius sphere on a
30 nm platelet, 3 nm cells, the 0.5 nm spacer still 4 cells across, quantum-corrected) end to end and
checks what must hold at any resolution: the spacer is found and resolved, its cells are gap medium
(the gap is narrower than the model's 0.55 nm cut-off), the run stops by decay, absorption and
scattering are positive, the gap plasmon lies red of a lone small sphere's dipole resonance (the
Froehlich condition Re eps = -2 eps_b, Bohren & Huffman 1983, ch. 12: 526 nm for the library gold
in index 1.45, `yeegap materials show Au`), and the field half-way across the spacer is far
stronger than the incident one.
Usage: example_particle_on_mirror_check.py YEEGAP_BINARY SOURCE_DIR"""
import json
import os
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, run_example

yeegap, src = sys.argv[1], sys.argv[2]
check = Checks()

COARSE = [
    "domain.step=3nm", "domain.grading=1.5", "domain.cpml.cells=6",
    "domain.size=[99nm,57nm,96nm]", "domain.center=[0nm,28.5nm,6nm]",
    "domain.refine=[{from: [-4 nm, 0 nm, -1 nm], to: [4 nm, 4 nm, 2 nm], step: 1 nm}]",
    "bodies[0].size=[30nm,30nm,10nm]", "bodies[0].center=[0nm,0nm,-5nm]",
    "bodies[1].radius=10nm", "bodies[1].center=[0nm,0nm,10nm]",
    "excitation[0].tfsf.box={from: [-18 nm, 0 nm, -12 nm], to: [18 nm, 18 nm, 24 nm]}",
    "outputs[0].cross_sections.frequencies.count=16", "outputs[1].field_map.frequencies.count=11",
    "stop.energy_below=1e-3",
]


with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "pom.h5")
    # Point 5 of the scene's sweep: the 0.5 nm spacer, quantum-corrected.
    # One thread: on this small grid a second one mostly waits at the loop barriers, and CI shares
    # its cores with other tests.
    done = run_example(yeegap, src, "particle_on_mirror.yaml", out, "--point", "5", "--json", "--threads", "1",
                       overrides=COARSE)
    summary = json.loads(done.stdout)
    check(summary["stop_reason"] == "energy_below", "the run stops by decay")
    with h5py.File(out, "r") as f:
        t = f["tunnelling"]
        width, cells = float(t["smallest_width"][0]), int(t["cells"][0])
        print(f"     gap cells {cells}, narrowest {width * 1e9:.4f} nm, cut-off {t['cutoff'][0] * 1e9:.3f} nm")
        check(int(t["quantum_corrected"][0]) == 1 and cells > 0, "the spacer holds quantum-corrected gap cells")
        check(abs(width - 0.5e-9) < 0.01e-9, "the narrowest gap cell is 0.5 nm wide (the spacer, on the axis)")
        g = f["outputs/particle_on_mirror"]
        wl, ab, sca = g["wavelength_nm"][:], g["absorption"][:], g["scattering"][:]
        check(bool(np.all(ab > 0)), "absorption is positive at every wavelength")
        check(bool(np.all(sca > 0)), "scattering is positive at every wavelength")
        peak = wl[np.argmax(sca)]
        print(f"     scattering peak at {peak:.0f} nm, {sca.max() * 1e18:.0f} nm^2")
        check(peak > 560, "the gap plasmon lies red of a lone sphere's resonance (526 nm)")
        m = f["outputs/gap_plane"]
        x, y, z = m["x"][:], m["y"][:], m["z"][:]
        check(len(z) == 5, f"the spacer has 4 cells across it on the field map ({len(z)} nodes)")
        mid = int(np.argmin(np.abs(z - 0.25e-9)))
        e2 = m["E_squared"][:, mid, int(np.argmin(np.abs(y))), int(np.argmin(np.abs(x)))]
        om = f["sources/omega"][:]
        inc = f["sources/incident_re"][0] + 1j * f["sources/incident_im"][0]
        idx = [int(np.argmin(np.abs(om - w))) for w in m["omega"][:]]
        enhancement = e2 / np.abs(inc[idx]) ** 2
        k = int(np.argmax(enhancement))
        print(f"     largest |E|^2/|E_inc|^2 at the gap centre: {enhancement[k]:.3g} at {m['wavelength_nm'][k]:.0f} nm")
        check(enhancement[k] > 100, "the gap field intensity is more than 100 times the incident one")

check.finish()
