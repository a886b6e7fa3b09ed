#!/usr/bin/python3
"""Runs a coarse version of examples/gold_grating.yaml end to end and checks what holds at any
resolution: the reflected orders split the flux-based reflectance (their sum equals R within 1e-3:
the same planes, Parseval), R + T + A = 1 by construction of A, every reported order obeys the
grating equation sin(theta_m) = sin(theta_0) + m lambda / period (Petit (ed.), Electromagnetic
Theory of Gratings, 1980, ch. 1), the results file has the documented layout (docs/results_file.md), and
`yeegap view` draws the orders figure.
Usage: example_gold_grating_check.py YEEGAP_BINARY SOURCE_DIR"""
import os
import subprocess
import sys
import tempfile

import h5py
import numpy as np

yeegap, src = sys.argv[1], sys.argv[2]
with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "coarse.h5")
    # The example's own cells (12 320 of them, 2D), 13 wavelengths instead of 37: about 10 s of CPU.
    # (At 20 nm cells the absorber, 2 cells behind the reflected plane, drains 1.3e-3 of the incident
    # power from evanescent orders near the Rayleigh anomaly at 596 nm: the check would then measure
    # the coarse grid, not the orders.)
    cmd = [yeegap, "run", os.path.join(src, "examples", "gold_grating.yaml"), "-o", out,
           "--set", "excitation[0].plane_wave.frequencies.count=13"]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"run failed ({done.returncode}):\n{done.stderr}")
    with h5py.File(out, "r") as f:
        t, o = f["outputs/plane_wave"], f["outputs/orders"]
        assert o.attrs["kind"] == b"orders", o.attrs["kind"]
        for name in ["omega", "wavelength_nm", "row", "side", "order", "direction", "angle", "efficiency",
                     "reflected_sum", "transmitted_sum", "incidence_angle"]:
            assert name in o, name
            assert "units" in o[name].attrs, name
        R = t["reflectance"][()]
        worst = np.max(np.abs(o["reflected_sum"][()] - R))
        print(f"reflected orders vs flux R: max difference {worst:.2e}")
        assert worst < 1e-3, worst  # 4.4e-4 over the 37 wavelengths of the example (nearer 596 nm)
        period = o.attrs["period"][0]
        lam = o["wavelength_nm"][()] * 1e-9
        sin0 = np.sin(o["incidence_angle"][()])
        row, m, d = o["row"][()], o["order"][()][:, 0], o["direction"][()]
        predicted = sin0[row] + m * lam[row] / period
        assert np.max(np.abs(d[:, 0] - predicted)) < 1e-9, np.max(np.abs(d[:, 0] - predicted))
        assert set(m.tolist()) >= {-1, 0}, set(m.tolist())  # order -1 propagates at the short wavelengths
    # The orders figure (tools/plot/plot_orders.py) through `yeegap view`.
    view = subprocess.run([yeegap, "view", out], capture_output=True, text=True)
    assert view.returncode == 0, view.stderr
    assert os.path.getsize(os.path.join(work, "coarse_orders.png")) > 10000, os.listdir(work)
print("1 passed, 0 failed")
