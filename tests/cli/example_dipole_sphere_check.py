#!/usr/bin/python3
"""Runs a coarse version of examples/dipole_near_sphere.yaml end to end and checks physics that
holds at any resolution: the sphere is lossless, so the power leaving a box around the dipole alone
equals the power leaving a box around dipole and sphere (Poynting's theorem), to 1 %; and the
results file has the documented layout (docs/results_file.md).
Usage: example_dipole_sphere_check.py YEEGAP_BINARY SOURCE_DIR"""
import json
import os
import subprocess
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, quoted_figure

yeegap, src = sys.argv[1], sys.argv[2]
with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "coarse.h5")
    # 8 nm cells and 8-cell absorbers: 50^3 cells, a few seconds; the boxes stay clear of the layers.
    cmd = [yeegap, "run", os.path.join(src, "examples", "dipole_near_sphere.yaml"), "-o", out, "--json",
           "--set", "domain.step=8 nm", "--set", "domain.cpml.cells=8"]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"run failed ({done.returncode}):\n{done.stderr}")
    summary = json.loads(done.stdout)
    emitted = np.array([row["power"] for row in summary["outputs"]["emitted"]])
    radiated = np.array([row["power"] for row in summary["outputs"]["radiated"]])
    worst = np.max(np.abs(radiated / emitted - 1))
    print(f"lossless sphere: max |radiated/emitted - 1| = {worst:.2e}")
    assert worst < 0.01, worst
    check = Checks()
    check(True, f"radiated/emitted within 1 % ({worst:.1e})")
    quoted_figure(check, src, "README.md", "lossless_sphere_boxes", f"{worst:.1e}".replace("e-0", "e-"))
    assert summary["stop_reason"] == "energy_below", summary["stop_reason"]
    with h5py.File(out, "r") as f:
        assert f.attrs["format"] == b"yeegap-results", f.attrs["format"]
        for name in ["grid/x", "grid/y", "grid/z", "materials/map", "outputs/xz_plane", "outputs/emitted"]:
            assert name in f, name
        assert f["grid/x"].shape == (51,), f["grid/x"].shape
        for ds in f["outputs/emitted"].values():
            assert "units" in ds.attrs, ds.name
check.finish()
