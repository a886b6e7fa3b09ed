#!/usr/bin/python3
"""The figures the documentation prints come from runs of the examples as shipped: this script
runs them, reads each figure out of the text where it is printed, and fails when the text and the
run disagree beyond the precision the text states (its last printed digit, half a unit either way).
`cheap`: the gold grating example (seconds) and the dimer mesh (`check` only); in the default suite. `all`: also the SPR chip
flagship (about 6 minutes on two cores; labelled slow, run before each release note).
Usage: printed_figures_check.py YEEGAP_BINARY SOURCE_DIR cheap|all"""
import json
import os
import re
import subprocess
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, run_example

yeegap, src, scope = sys.argv[1], sys.argv[2], sys.argv[3]
checks = Checks()


def printed(path, pattern):
    """The numbers a regular expression finds in a documentation file, as text (to keep the digits)."""
    with open(os.path.join(src, path), encoding="utf-8") as f:
        m = re.search(pattern, f.read())
    if not m:
        sys.exit(f"{path}: the text no longer matches /{pattern}/; update this check with the text")
    return m.groups()


def agrees(text, value, what, where):
    """The run's value rounds to the printed one: within half a unit of its last digit."""
    digits = len(text.split(".")[1]) if "." in text else 0
    ok = abs(float(text) - value) <= 0.5 * 10 ** -digits + 1e-12
    checks(ok, f"{where}: {what} printed {text}, run gives {value:.{digits + 2}f}")


with tempfile.TemporaryDirectory() as work:
    # The gold grating (examples/README.md): the order +1 dip, the lowest sampled R.
    out = os.path.join(work, "grating.h5")
    run_example(yeegap, src, "gold_grating.yaml", out)
    with h5py.File(out, "r") as f:
        t = f["outputs/plane_wave"]
        r, lam = t["reflectance"][()], t["wavelength_nm"][()]
        orders_gap = np.max(np.abs(f["outputs/orders/reflected_sum"][()] - r))
    i = int(np.argmin(r))
    dip_nm, dip_r = printed("examples/README.md", r"dip of order \+1 sits at ([0-9.]+) nm \(R = ([0-9.]+)")
    agrees(dip_nm, lam[i], "gold grating dip (nm)", "examples/README.md")
    agrees(dip_r, r[i], "gold grating R at the dip", "examples/README.md")
    (bound,) = printed("examples/README.md", r"the reflected orders add up to R within ([0-9.e-]+)")
    checks(orders_gap <= float(bound) and orders_gap > 0.1 * float(bound),
           f"examples/README.md: orders vs R printed 'within {bound}', run gives {orders_gap:.2e}")

    # The dimer mesh (README.md, examples/README.md): `check` only, no run.
    done = subprocess.run([yeegap, "check", os.path.join(src, "examples", "dimer_gap_mesh.yaml"), "--json"],
                          capture_output=True, text=True)
    checks(done.returncode == 0, f"check of dimer_gap_mesh.yaml: exit {done.returncode}: {done.stderr[-300:]}")
    if done.returncode == 0:
        j = json.loads(done.stdout)
        cells, uniform = j["cells"], j["uniform_cells_at_smallest"]
        millions, billions, times = printed(
            "README.md", r"two 40 nm gold spheres 0.5 nm apart: ([0-9.]+) million cells instead of ([0-9.]+) "
            r"billion at the gap's 0.125 nm step, ([0-9]+)× fewer")
        agrees(millions, cells / 1e6, "dimer mesh cells (millions)", "README.md")
        agrees(billions, uniform / 1e9, "dimer uniform cells (billions)", "README.md")
        agrees(times, uniform / cells, "dimer mesh saving (times)", "README.md")
        grid = printed("examples/README.md", r"\| ([0-9]+)×([0-9]+)×([0-9]+) graded cells; meant for `check`")
        checks([int(g) for g in grid] == [int(x) for x in j["grid"]],
               f"examples/README.md: dimer grid printed {'x'.join(grid)}, check gives {j['grid']}")

    if scope == "all":
        # The SPR chip flagship: the README's table and the example's own comment.
        out = os.path.join(work, "chip.h5")
        run_example(yeegap, src, "spr_sensor_chip.yaml", out)
        with h5py.File(out, "r") as f:
            a = dict(f["outputs/chip"].attrs)
        table = {
            "resonance angle, with the bound layer": ("resonance_angle_deg", r"([0-9.]+)°"),
            "minimum reflectance": ("r_min", r"([0-9.]+)"),
            "width at half depth": ("width_deg", r"([0-9.]+)°"),
            r"sensitivity \(buffer index \+0.001\)": ("sensitivity_deg_per_riu", r"([0-9.]+) °/RIU"),
            "figure of merit": ("figure_of_merit", r"([0-9.]+) /RIU"),
            "resonance angle before binding": ("resonance_angle_deg_before_binding", r"([0-9.]+)°"),
            r"binding shift of the 5 nm layer \(n = 1.45\)": ("binding_shift_deg", r"\+([0-9.]+)°"),
        }
        for row, (key, cell) in table.items():
            (text,) = printed("README.md", r"\| " + row + r" \| " + cell)
            agrees(text, float(a[key]), key, "README.md")
        (text,) = printed("examples/spr_sensor_chip.yaml", r"dip ([0-9.]+) deg")
        agrees(text, float(a["resonance_angle_deg"]), "resonance_angle_deg", "examples/spr_sensor_chip.yaml")

checks.finish()
