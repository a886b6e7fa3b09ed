#!/usr/bin/python3
"""Runs examples/tunnelling_gap_sweep.yaml (6 points, about 2 min of CPU time) with `yeegap sweep
--jobs 2` and checks the merged table against what the physics predicts qualitatively:
- classical: the gap (bonding) mode moves to longer wavelengths as the gap closes, 0.2 -> 0.15 ->
  0.1 nm (Romero, Aizpurua, Bryant and Garcia de Abajo, Opt. Express 14, 9988 (2006): the bonding
  dimer plasmon red-shifts without limit as the gap closes in a classical description);
- quantum-corrected: once the gap conducts, the gap mode fades instead (Esteban, Borisov,
  Nordlander and Aizpurua, Nat. Commun. 3, 825 (2012)): at 0.15 and 0.1 nm (gap medium
  eps_g = 0.86+1.85i and -4.3+10.3i at 1.8 eV, `yeegap tunnelling --metal Au`) its extinction peak in the
  gap-mode window is below 0.7 of the classical one (measured 0.49 and 0.43); at 0.2 nm
  (eps_g = 1.00+0.26i) the mode is still there, within 5 nm of the classical one, and weaker.
The thresholds 0.7 and 5 nm are ours (demo numbers, measured ratios in the comment above).
Usage: example_tunnelling_sweep_check.py YEEGAP_BINARY SOURCE_DIR"""
import os
import re
import subprocess
import sys
import tempfile

import h5py
import numpy as np

yeegap, src = sys.argv[1], sys.argv[2]
with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "gaps")
    cmd = [yeegap, "sweep", os.path.join(src, "examples", "tunnelling_gap_sweep.yaml"), "-o", out, "--jobs", "2"]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"sweep failed ({done.returncode}):\n{done.stderr}")
    with h5py.File(os.path.join(out, "sweep.h5"), "r") as t:
        gap = t["parameters/gap"][:]
        model = t["parameters/model"][:].astype(str)
        lam = t["figures/gap_mode.extinction_peak_wavelength_nm"][:]
        peak = t["figures/gap_mode.extinction_peak"][:]
        smallest = t["figures/gap.left-right.smallest_width_nm"][:]
    assert list(gap) == [0.1, 0.1, 0.15, 0.15, 0.2, 0.2], gap
    assert list(model) == ["classical", "quantum_corrected"] * 3, model
    for g, m, l, p in zip(gap, model, lam, peak):
        print(f"gap {g:.2f} nm {m:17s}: gap mode {l:6.1f} nm, extinction {p:.3e} m")
    # The narrowest gap on the grid is the swept width: the sweep really moved the cylinder.
    assert np.all(np.abs(smallest - gap) < 0.01), smallest
    c = model == "classical"
    q = ~c
    window_low = 540.0  # the gap_mode output's shortest wavelength
    # Classical: interior peaks, red-shifting as the gap closes (gap values are ascending).
    assert np.all(lam[c] > window_low + 1), lam[c]
    assert lam[c][0] > lam[c][1] > lam[c][2], lam[c]
    # Quantum-corrected at 0.1 and 0.15 nm: the gap mode fades.
    ratio = peak[q] / peak[c]
    print("quantum-corrected / classical gap-mode peak:", np.round(ratio, 3))
    assert ratio[0] < 0.7 and ratio[1] < 0.7, ratio
    # At 0.2 nm: still there, near the classical wavelength, weaker.
    assert lam[q][2] > window_low + 1 and abs(lam[q][2] - lam[c][2]) < 5, (lam[q][2], lam[c][2])
    assert ratio[2] < 1, ratio
    # The figures examples/README.md prints from this sweep, to their last printed digit.
    with open(os.path.join(src, "examples", "README.md"), encoding="utf-8") as f:
        text = f.read()
    m = re.search(r"red-shifting ([0-9.]+) → ([0-9.]+) → ([0-9.]+) nm", text)
    assert m, "examples/README.md: the classical gap-mode wavelengths are no longer printed as expected"
    for printed_nm, run_nm in zip(m.groups(), lam[c][::-1]):  # printed from 0.2 nm to 0.1 nm
        assert abs(float(printed_nm) - run_nm) <= 0.05 + 1e-9, (printed_nm, run_nm)
    m = re.search(r"its peak ([0-9.]+), ([0-9.]+), ([0-9.]+) of the classical one at 0.2, 0.15, 0.1 nm", text)
    assert m, "examples/README.md: the quantum-corrected ratios are no longer printed as expected"
    for printed_ratio, run_ratio in zip(m.groups(), ratio[::-1]):
        assert abs(float(printed_ratio) - run_ratio) <= 0.005 + 1e-9, (printed_ratio, run_ratio)
    print("examples/README.md figures agree with the run")
print("1 passed, 0 failed")
