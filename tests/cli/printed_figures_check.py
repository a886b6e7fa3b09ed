#!/usr/bin/python3
"""The figures the documentation prints come from runs of the examples as shipped: this script
runs them, reads each figure out of the text where it is printed, and fails when the text and the
run disagree beyond the precision the text states (its last printed digit, half a unit either way).
`cheap`: the gold grating example (seconds) and the dimer mesh (`check` only); in the default suite
(the dimer antenna's figures are checked by its own example test). `all`: also the SPR chip flagship
(`chip`, about 6 minutes on two cores) and the particle-on-mirror sweep at the coarse settings
examples/README.md gives (`mirror`, 10 points, about 10 minutes with two jobs); labelled slow, run
before each release note.
Usage: printed_figures_check.py YEEGAP_BINARY SOURCE_DIR cheap|chip|mirror|all
With YEEGAP_KEEP=DIR in the environment the particle-on-mirror sweep's points stay in DIR/pom."""
import json
import os
import shlex
import subprocess
import sys
import tempfile

import h5py
import numpy as np

from example_checks import Checks, agrees as agrees_with, printed as printed_in, run_example

yeegap, src, scope = sys.argv[1], sys.argv[2], sys.argv[3]
checks = Checks()


def printed(path, pattern):
    return printed_in(src, path, pattern)


def agrees(text, value, what, where):
    agrees_with(checks, text, value, what, where)


def check_particle_on_mirror(work):
    """The sweep exactly as examples/README.md prints its command, then the README's figures."""
    (command,) = printed("examples/README.md", r"```bash (build/tools/yeegap sweep examples/particle_on_mirror.yaml [^`]*?) "
                         r"examples/particle_on_mirror_plot.py")
    args = shlex.split(command.replace("\\ ", " "))[1:]
    folder = os.path.join(os.environ.get("YEEGAP_KEEP", work), "pom")
    args[args.index("-o") + 1] = folder
    args = [os.path.join(src, a) if a.startswith("examples/") else a for a in args]
    if "--threads" in args:  # the printed command runs on one core; here two points go at once
        del args[args.index("--threads"):args.index("--threads") + 2]
    args += ["--jobs", "2", "--threads", "1"]
    done = subprocess.run([yeegap, *args], capture_output=True, text=True)
    checks(done.returncode == 0, f"particle-on-mirror sweep: exit {done.returncode}: {done.stderr[-300:]}")
    if done.returncode != 0:
        return
    sys.path.insert(0, os.path.join(src, "examples"))
    from particle_on_mirror_plot import read_point

    points = {}
    for name in sorted(os.listdir(folder)):
        if name.startswith("point_") and name.endswith(".h5"):
            p = read_point(os.path.join(folder, name))
            points[(p["spacer_nm"], p["model"])] = p

    def gap_mode(spacer, model):
        """The gap mode's sample: the reddest local maximum of the scattering spectrum that reaches half
        its largest value (below 0.5 nm a mode to the blue outgrows the gap mode; weak bumps near the
        band's red end, a fifth of the peak or less, are not it)."""
        p = points[(spacer, model)]
        order = np.argsort(p["wl"])
        wl, sca = p["wl"][order], p["sca"][order]
        peaks = [i for i in range(1, len(sca) - 1)
                 if sca[i] > sca[i - 1] and sca[i] >= sca[i + 1] and sca[i] >= 0.5 * sca.max()]
        i = peaks[-1] if peaks else int(np.argmax(sca))
        return wl[i], sca[i]

    def peak_nm(spacer, model):
        return gap_mode(spacer, model)[0]

    def peak_sca(spacer, model):
        return gap_mode(spacer, model)[1]

    def field(spacer, model):
        return points[(spacer, model)]["enhancement"].max()

    where = "README.md"
    agreeing = printed(where, r"gap-mode scattering peak ([0-9]+), ([0-9]+), ([0-9]+) nm at 2, 1, 0.5 nm")
    for text, spacer in zip(agreeing, (2.0, 1.0, 0.5)):
        for model in ("classical", "quantum_corrected"):
            agrees(text, peak_nm(spacer, model), f"{model} scattering peak at {spacer:g} nm (nm)", where)
    red = printed(where, r"keeps red-shifting \(([0-9]+) nm at 0.3 nm, ([0-9]+) nm at 0.2 nm\)")
    agrees(red[0], peak_nm(0.3, "classical"), "classical scattering peak at 0.3 nm (nm)", where)
    agrees(red[1], peak_nm(0.2, "classical"), "classical scattering peak at 0.2 nm (nm)", where)
    grow = printed(where, r"\|E\|²/\|E_inc\|² up to ([0-9.]+)e([0-9]+) and ([0-9.]+)e([0-9]+)\)")
    for mantissa, exponent, spacer in ((grow[0], grow[1], 0.3), (grow[2], grow[3], 0.2)):
        agrees(mantissa, field(spacer, "classical") / 10 ** int(exponent), f"classical gap field at {spacer:g} nm "
               f"(x 1e{exponent})", where)
    weaker = printed(where, r"the 0.3 nm peak is ([0-9]+) % weaker \(([0-9.]+) against ([0-9.]+) nm²\) and its field "
                     r"([0-9.]+)e([0-9]+)")
    quantum, classical = peak_sca(0.3, "quantum_corrected"), peak_sca(0.3, "classical")
    agrees(weaker[0], 100 * (1 - quantum / classical), "quantum-corrected peak weaker at 0.3 nm (%)", where)
    agrees(weaker[1], quantum, "quantum-corrected scattering peak at 0.3 nm (nm²)", where)
    agrees(weaker[2], classical, "classical scattering peak at 0.3 nm (nm²)", where)
    agrees(weaker[3], field(0.3, "quantum_corrected") / 10 ** int(weaker[4]), "quantum-corrected gap field at 0.3 nm "
           f"(x 1e{weaker[4]})", where)
    drops = printed(where, r"the gap field drops ([0-9]+)-fold, to ([0-9.]+)e([0-9]+)")
    agrees(drops[0], field(0.2, "classical") / field(0.2, "quantum_corrected"), "gap field ratio at 0.2 nm", where)
    agrees(drops[1], field(0.2, "quantum_corrected") / 10 ** int(drops[2]), "quantum-corrected gap field at 0.2 nm "
           f"(x 1e{drops[2]})", where)


with tempfile.TemporaryDirectory() as work:
    # The gold grating (examples/README.md): the order +1 dip, the lowest sampled R.
    out = os.path.join(work, "grating.h5")
    run_example(yeegap, src, "gold_grating.yaml", out)
    with h5py.File(out, "r") as f:
        t = f["outputs/plane_wave"]
        r, lam = t["reflectance"][()], t["wavelength_nm"][()]
        orders_gap = np.max(np.abs(f["outputs/orders/reflected_sum"][()] - r))
        t = t["transmittance"][()]
    i = int(np.argmin(r))
    dip_nm, dip_r = printed("examples/README.md", r"dip of order \+1 sits at ([0-9.]+) nm \(R = ([0-9.]+)")
    agrees(dip_nm, lam[i], "gold grating dip (nm)", "examples/README.md")
    agrees(dip_r, r[i], "gold grating R at the dip", "examples/README.md")
    (bound,) = printed("examples/README.md", r"the reflected orders add up to R within ([0-9.e-]+)")
    checks(orders_gap <= float(bound) and orders_gap > 0.1 * float(bound),
           f"examples/README.md: orders vs R printed 'within {bound}', run gives {orders_gap:.2e}")
    t_low, t_high = printed("examples/README.md", r"the 150 nm film lets through T = ([0-9.e-]+) to ([0-9.e-]+), positive at "
                            r"every wavelength")
    agrees(t_low.split("e")[0], t.min() / 10 ** float(t_low.split("e")[1]), "gold grating smallest T", "examples/README.md")
    agrees(t_high.split("e")[0], t.max() / 10 ** float(t_high.split("e")[1]), "gold grating largest T", "examples/README.md")
    checks(bool(np.all(t > 0)), f"examples/README.md: the grating's T is positive at every wavelength (smallest {t.min():.2e})")

    # The dimer mesh (README.md, examples/README.md): `check` only, no run.
    done = subprocess.run([yeegap, "check", os.path.join(src, "examples", "dimer_gap_mesh.yaml"), "--json", "--quick"],
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

    if scope in ("all", "mirror"):
        check_particle_on_mirror(work)

    if scope in ("all", "chip"):
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
