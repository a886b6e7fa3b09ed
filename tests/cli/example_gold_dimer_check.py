#!/usr/bin/python3
"""Runs a coarse version of examples/gold_dimer_antenna.yaml (2 nm cells) end to end and checks what
must hold at any resolution: passivity (absorption >= 0, extinction >= absorption), a far-field
collection fraction in (0, 1), a bonding plasmon red of the single sphere's resonance (526.5 nm for
one 20 nm-radius sphere of the same gold model in water, from materials/mie_sphere.h; the
plasmon-ruler trend of Jain, Huang, El-Sayed, Nano Lett. 7, 2080 (2007) puts a gap of a tenth of
the diameter about 10 % further red), and a gap field well above the incident one; and that the
figures README.md prints for this coarse run (peak, gap enhancement, collected fraction) are the
run's, to their printed precision.
Usage: example_gold_dimer_check.py YEEGAP_BINARY SOURCE_DIR [KEEP_DIR]
With KEEP_DIR the results (dimer.h5) stay there instead of in a temporary folder."""
import json
import os
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, agrees, printed, run_example

yeegap, src_dir = sys.argv[1], sys.argv[2]
check = Checks()


with tempfile.TemporaryDirectory() as scratch:
    work = sys.argv[3] if len(sys.argv) > 3 else scratch
    out = os.path.join(work, "dimer.h5")
    done = run_example(yeegap, src_dir, "gold_dimer_antenna.yaml", out, "--json",
                       overrides=["domain.step=2 nm", "domain.cpml.cells=6",
                                  "outputs[0].cross_sections.frequencies.count=23"])
    summary = json.loads(done.stdout)
    check(summary["stop_reason"] == "energy_below", "the run stops by decay")
    with h5py.File(out, "r") as f:
        g = f["outputs/dimer"]
        wl, ext, ab, sca = g["wavelength_nm"][:], g["extinction"][:], g["absorption"][:], g["scattering"][:]
        i0 = g["incident_intensity"][:]
        check(bool(np.all(ab > 0)), "absorption is positive at every wavelength")
        check(bool(np.all(sca > 0)), "scattering is positive at every wavelength")
        peak = wl[np.argmax(ext)]
        print(f"     extinction peak at {peak:.0f} nm, {ext.max() * 1e18:.0f} nm^2")
        check(560 <= peak <= 700, "the bonding plasmon lies red of a single sphere's, between 560 and 700 nm")
        far = f["outputs/scattered"]
        frac = far["collected"][0] / far["power"][0]
        check(0 < frac < 1, f"the 0.9 NA objective collects a fraction in (0, 1): {frac:.3f}")
        # Gap enhancement |E|^2 / |E_inc|^2 at 620 nm, with |E_inc|^2 of the plane wave at the map's
        # exact frequency from /sources (the cross-section grid above only comes near 620 nm).
        m = f["outputs/xy_plane"]
        k = int(np.argmin(np.abs(m["wavelength_nm"][:] - 620)))
        e2 = m["E_squared"][k, 0]
        x, y = m["x"][:], m["y"][:]
        gap = e2[np.argmin(np.abs(y)), np.argmin(np.abs(x))]
        src = f["sources"]
        s = int(np.argmin(np.abs(src["wavelength_nm"][:] - m["wavelength_nm"][k])))
        enhancement = gap / (src["incident_re"][0, s] ** 2 + src["incident_im"][0, s] ** 2)
        print(f"     |E|^2 enhancement at the gap centre, 620 nm: {enhancement:.1f}")
        check(enhancement > 10, "the gap field is more than ten times the incident intensity")
        # The file's own E_enhancement must be that same ratio.
        stored = m["E_enhancement"][k, 0][np.argmin(np.abs(y)), np.argmin(np.abs(x))]
        check(abs(stored / enhancement - 1) < 1e-9,
              f"E_enhancement at the gap centre ({stored:.1f}) is |E|^2 / |E_inc|^2 from /sources")
    # The README's figures of this run (its "A gold dimer antenna" section).
    text_peak, text_gap, text_collected = printed(
        src_dir, "README.md", r"the bonding plasmon at ([0-9.]+) nm, red of a single sphere's[\s\S]*?of about ([0-9]+) in "
        r"the middle of the gap at 620 nm[\s\S]*?collects ([0-9]+) % of the scattered power")
    agrees(check, text_peak, peak, "dimer extinction peak (nm, sampled)", "README.md")
    agrees(check, text_gap, enhancement, "dimer gap enhancement at 620 nm (about)", "README.md", unit=10)
    agrees(check, text_collected, 100 * frac, "dimer fraction collected by 0.9 NA (%)", "README.md")
check.finish()
