#!/usr/bin/env python3
"""A smoke run of yeegap_benchmark on tiny boxes (not a timing: the figures of so small a run mean
nothing): every measurement runs, the thread counts leave the same fields, and the last line is
one JSON object holding every headline key with a positive number, the scene time included.
Usage: benchmark_smoke.py BENCHMARK SOURCE_DIR"""
import json
import os
import re
import subprocess
import sys
import tempfile

HEADLINE = ["triad_GBps", "bare_fused_Mcells", "vacuum_Mcells", "vacuum_vs_bare", "vacuum_ratio",
            "dispersive_Mcells", "dispersive_bytes_per_cell_step", "dispersive_ratio", "averaging_cost",
            "dft_overhead", "bytes_per_cell_vacuum", "scan_1d_seconds"]


def main():
    benchmark, source = sys.argv[1], sys.argv[2]
    chip = open(os.path.join(source, "examples", "spr_sensor_chip.yaml")).read()
    # Two angles near the dip instead of 33, and no sensor repeats: the same kind of run, short.
    small, n = re.subn(r"angles: \{from: 64 deg, to: 80 deg, count: 33\}", "angles: {from: 71 deg, to: 72 deg, count: 2}", chip)
    assert n == 1, "the chip example's angle list changed: update this test"
    small = re.sub(r"\n  - sensor:.*", "", small).replace("\noutputs:\n", "\noutputs: []\n")
    failures = []
    with tempfile.TemporaryDirectory() as tmp:
        scene = os.path.join(tmp, "chip.yaml")
        open(scene, "w").write(small)
        for mode in ([], ["--json"]):
            run = subprocess.run([benchmark, "--cells", "24", "--steps", "2", "--batches", "2", "--threads", "2",
                                  "--sphere-cells", "12", "--gold-cells", "12", "--triad-elements", "200000",
                                  "--scene", scene] + mode, capture_output=True, text=True, timeout=600)
            label = "json" if mode else "table"
            if run.returncode != 0:
                failures.append(f"{label}: exit {run.returncode}: {run.stderr[-500:]}")
                continue
            last = run.stdout.strip().splitlines()[-1]
            figures = json.loads(last)
            for key in HEADLINE:
                if not isinstance(figures.get(key), (int, float)) or not figures[key] > 0:
                    failures.append(f"{label}: '{key}' is {figures.get(key)!r}, expected a positive number")
            if mode and figures.get("fields_identical") is not True:
                failures.append("json: fields differ between thread counts")
            if not mode and "bit-identical for every thread count: yes" not in run.stdout:
                failures.append("table: fields differ between thread counts")
    for f in failures:
        print("FAIL", f)
    print("benchmark smoke run:", "FAILED" if failures else "ok")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
