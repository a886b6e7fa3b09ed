#!/usr/bin/python3
"""Runs examples/spr_sensor_chip.yaml end to end with 9 angles instead of 33 (1 deg steps over the
dip) and checks it against the transfer-matrix reflectance of the same stack (Born & Wolf,
Principles of Optics, 7th ed., 1999, sec. 1.6: characteristic matrix of a layered medium), with the
permittivities the program itself reports for its library entries at 632.8 nm (`yeegap materials
show`): both curves, after and before binding, within 0.01 in R (the tolerance of the Kretschmann
check), the binding shift within 5 % of the transfer-matrix one, the printed figures, the results
layout (docs/results_file.md) and the R(theta) figure of `--plot`.
Usage: example_spr_sensor_chip_check.py YEEGAP_BINARY SOURCE_DIR"""
import json
import os
import subprocess
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, quoted_figure, run_example

yeegap, src = sys.argv[1], sys.argv[2]
WAVELENGTH = 632.8e-9
N_PRISM, N_BUFFER, N_LAYER = 1.5151, 1.3317, 1.45  # the example's own values


def library_eps(name):
    rows = json.loads(subprocess.run([yeegap, "materials", "show", name, "--from", "632.8nm", "--to", "632.8nm",
                                      "--json"], capture_output=True, text=True, check=True).stdout)
    return complex(rows[0]["eps_re"], rows[0]["eps_im"])


def tmm_r(theta_deg, layers, eps_exit):
    """p-polarized |r|^2 of prism / layers (eps, thickness) / exit medium (characteristic matrix)."""
    k0 = 2 * np.pi / WAVELENGTH
    kx = N_PRISM * k0 * np.sin(np.radians(theta_deg))

    def admittance(eps):
        kz = np.sqrt(eps * k0 ** 2 - kx ** 2 + 0j)
        kz = kz if kz.imag >= 0 else -kz
        return kz, kz / eps

    m = np.eye(2, dtype=complex)
    for eps, d in layers:
        kz, y = admittance(eps)
        m = m @ np.array([[np.cos(kz * d), -1j * np.sin(kz * d) / y], [-1j * y * np.sin(kz * d), np.cos(kz * d)]])
    y0, ys = admittance(N_PRISM ** 2)[1], admittance(eps_exit)[1]
    b, c = m @ np.array([1, ys])
    return abs((y0 * b - c) / (y0 * b + c)) ** 2


def tmm_minimum(layers):
    lo, hi, g = 66.0, 80.0, (np.sqrt(5) - 1) / 2
    for _ in range(80):
        a, b = hi - g * (hi - lo), lo + g * (hi - lo)
        if tmm_r(a, layers, N_BUFFER ** 2) < tmm_r(b, layers, N_BUFFER ** 2):
            hi = b
        else:
            lo = a
    return 0.5 * (lo + hi)


chromium, gold = library_eps("Cr"), library_eps("Au_critical_points")
after = [(chromium, 2e-9), (gold, 48e-9), (N_LAYER ** 2, 5e-9)]
before = [(chromium, 2e-9), (gold, 48e-9)]
check = Checks()


with tempfile.TemporaryDirectory() as work:
    out = os.path.join(work, "chip.h5")
    done = run_example(yeegap, src, "spr_sensor_chip.yaml", out, "--json", "--plot",
                       overrides=["excitation[0].plane_wave.angles={from: 70 deg, to: 78 deg, count: 9}"])
    check("sensitivity" in done.stderr and "binding shift" in done.stderr, "the run prints the sensor figures")
    summary = json.loads(done.stdout)
    chip_json = summary["outputs"]["chip"][0] if isinstance(summary["outputs"]["chip"], list) else summary["outputs"]["chip"]
    check("binding_shift_deg" in chip_json, "the --json summary carries the binding shift")
    with h5py.File(out, "r") as f:
        g = f["outputs/chip"]
        check(g.attrs["kind"] == b"sensor" and g.attrs["binding"] == b"bound_layer", "sensor group with its binding")
        theta = g["angle_deg"][()]
        worst_both = 0
        for name, layers in (("reflectance", after), ("reflectance_before_binding", before)):
            r = g[name][()]
            tmm = np.array([tmm_r(t, layers, N_BUFFER ** 2) for t in theta])
            worst = np.max(np.abs(r - tmm))
            print(f"     {name}: max |R - R_TMM| {worst:.4f} over {theta[0]:.0f}-{theta[-1]:.0f} deg")
            check(worst < 0.01, f"{name} within 0.01 of the transfer matrix")
            worst_both = max(worst_both, worst)
        shift, tmm_shift = g.attrs["binding_shift_deg"], tmm_minimum(after) - tmm_minimum(before)
        print(f"     binding shift {shift:.4f} deg, transfer matrix {tmm_shift:.4f} deg")
        check(abs(shift / tmm_shift - 1) < 0.05, "binding shift within 5 % of the transfer matrix")
        quoted_figure(check, src, "README.md", "flagship_chip_scan",
                      f"R within {worst_both:.4f} over {theta[0]:.0f}–{theta[-1]:.0f}°; shift {shift:.3f}° vs "
                      f"{tmm_shift:.3f}° ({100 * (shift / tmm_shift - 1):+.1f} %; 1° sampling)")
        check(abs(g.attrs["binding_equivalent_index"] - np.radians(shift) / g.attrs["sensitivity"]) < 1e-12,
              "equivalent index = shift / sensitivity")
    pngs = [p for p in os.listdir(work) if p.endswith(".png") and "chip" in p]
    check(any(os.path.getsize(os.path.join(work, p)) > 10000 for p in pngs), f"--plot drew the R(theta) figure {pngs}")
check.finish()
