#!/usr/bin/python3
"""The plot script (tools/plot/yeegap_plot.py) and the commands that run it, headless:
- on a small results file made here with h5py (docs/results_file.md layout; graded grid, one dipole in a
  background of index 1.33, two flux outputs, a probe, a plane and a volume field map, cross sections and a far field) it writes
  every expected PNG and SVG; each PNG has the fixed size and is not blank (many distinct colours,
  and coloured pixels, which axes and text alone do not have);
- the flux figure's 'relative to the dipole alone' curve is P / P0 with P0 = n eta0 k0^2 |I l|^2 /
  (12 pi) (Jackson, Classical Electrodynamics, 3rd ed., 1999, eq. 9.24), n read from the scene;
- the far-field figure's planes join the phi and phi + 180 degree halves of the direction grid;
- the field-map figure is drawn on the graded node coordinates and the material outline runs along
  cell edges of the graded grid;
- a Python without numpy/h5py/matplotlib gives the install hint and no traceback, from the script
  and from `yeegap view`;
- the sensor figure draws both R(theta) curves and marks each dip at the file's resonance angle;
- `yeegap run --plot --json` on a coarse example writes the sidecar and figures and keeps stdout
  one JSON object;
- a sweep table made here (3 gaps x 2 models, rows out of order, point files with an extinction
  spectrum and a reflectance): one heat map per spectrum, PNG of the fixed size and not blank, a
  panel per model, each column at its gap value and holding that point's own spectrum in nm^2;
  `yeegap view` draws it without writing a sidecar; a lost point file leaves its column blank with
  a note; no numpy/h5py/matplotlib gives the install hint.
Usage: plot_check.py YEEGAP_BINARY SOURCE_DIR"""
import json
import os
import stat
import subprocess
import sys
import tempfile

import h5py
import numpy as np

yeegap, src = sys.argv[1], sys.argv[2]
script = os.path.join(src, "tools", "plot", "yeegap_plot.py")
sys.path.insert(0, os.path.dirname(script))
import matplotlib  # noqa: E402

matplotlib.use("Agg")
import matplotlib.image  # noqa: E402
import plot_common  # noqa: E402
import plot_field_maps  # noqa: E402
import plot_particles  # noqa: E402
import plot_sensor  # noqa: E402
import plot_spectra  # noqa: E402
import plot_sweep  # noqa: E402

HINT = "install python3-matplotlib python3-h5py"
C0, ETA0 = 299792458.0, 376.730313668
failures, passes = [], 0


def check(ok, message):
    global passes
    if ok:
        passes += 1
    else:
        failures.append(message)
        print("FAIL", message)


# ---- a synthetic results file (invented numbers) ----

X = np.array([-40, -20, -10, -5, 0, 5, 10, 20, 40.0]) * 1e-9   # graded: fine in the middle
Y = np.array([-20, -10, 0, 10, 20.0]) * 1e-9
Z = np.array([-30, -15, -7.5, 0, 7.5, 15, 30.0]) * 1e-9
N_BACKGROUND = 1.33
WAVELENGTHS_NM = np.array([500.0, 600.0, 700.0])
OMEGA = 2 * np.pi * C0 / (WAVELENGTHS_NM * 1e-9)
IL = np.array([1e-16 + 2e-16j, 3e-16 - 1e-16j, 2e-16 + 0j])    # A m s, the dipole's current-moment spectrum
ENHANCEMENT = np.array([3.0, 2.0, 1.5])                       # P / P0 the flux outputs are given
SENSOR_DIPS = (71.0, 71.15)                                   # deg, the sensor's two resonance angles
SCENE = f"""scene: {{version: 1}}
domain: {{background: water}}
materials:
  water: {{index: {N_BACKGROUND}}}
  blob: {{index: 2}}
"""


def fixed(strings):
    return np.array([s.encode() for s in strings])


def p0(omega, il, n):
    """Jackson 1999, eq. 9.24 for a dipole of current moment I l in a medium of index n."""
    k = n * omega / C0
    eta = ETA0 / n
    return eta * k**2 * abs(il) ** 2 / (12 * np.pi)


def material_map():
    """A box of material 1 over cells 3..5 in x, 1..2 in y, 2..3 in z (cell indices)."""
    m = np.zeros((len(Z) - 1, len(Y) - 1, len(X) - 1), dtype=np.uint8)
    m[2:4, 1:3, 3:6] = 1
    return m


def write_results(path):
    rng = np.random.default_rng(3)
    with h5py.File(path, "w") as f:
        f.attrs["format"] = np.bytes_("yeegap-results")
        f.attrs["format_version"] = np.int32(1)
        f["scene/text"] = np.bytes_(SCENE)
        f.create_group("program").attrs["command_line"] = np.bytes_("yeegap run synthetic.yaml")
        for axis, values in zip("xyz", (X, Y, Z)):
            f[f"grid/{axis}"] = values
        f["materials/names"] = fixed(["water", "blob"])
        f["materials/map"] = material_map()
        f["sources/omega"] = OMEGA[::-1]             # another order than the outputs: matched by value
        f["sources/spectrum_re"] = IL.real[::-1][None, :]
        f["sources/spectrum_im"] = IL.imag[::-1][None, :]
        f["sources/position"] = np.array([[0.0, 0.0, 0.0]])
        for name, closed in (("emitted", 1), ("through_top", 0)):
            g = f.create_group(f"outputs/{name}")
            g.attrs["kind"], g.attrs["closed"], g.attrs["normal_axis"] = np.bytes_("flux"), np.int32(closed), np.int32(2)
            g["omega"], g["wavelength_nm"] = OMEGA, WAVELENGTHS_NM
            g["power"] = ENHANCEMENT * p0(OMEGA, IL, N_BACKGROUND) * (1.0 if closed else 0.5)
        g = f.create_group("outputs/at_dipole")
        g.attrs["kind"], g.attrs["components"] = np.bytes_("probe"), fixed(["Ex", "Hy"])
        g.attrs["position"] = np.array([0.0, 0.0, 0.0])
        t = np.arange(400) * 1e-17
        g["time"] = t
        g["Ex"] = np.sin(2 * np.pi * t / 1.5e-15) * np.exp(-(((t - 2e-15) / 8e-16) ** 2))
        g["Hy"] = 0.01 * g["Ex"][...]
        g["Hy"].attrs["sample_time_offset"] = -0.5e-17
        for name, (mx, my, mz) in {"xz_plane": (X, Y[2:3], Z), "volume": (X[2:7], Y, Z[1:6])}.items():
            g = f.create_group(f"outputs/{name}")
            g.attrs["kind"], g.attrs["components"] = np.bytes_("field_map"), fixed(["Ex", "Ez"])
            g["x"], g["y"], g["z"] = mx, my, mz
            g["omega"], g["wavelength_nm"] = OMEGA, WAVELENGTHS_NM
            shape = (len(OMEGA), len(mz), len(my), len(mx))
            zz, yy, xx = np.meshgrid(mz, my, mx, indexing="ij")
            r2 = xx**2 + yy**2 + zz**2 + (3e-9) ** 2
            e2 = np.broadcast_to(1e-20 / r2**3 * 1e-54, shape) * (1 + rng.random(shape))
            g["Ex_re"], g["Ex_im"] = np.sqrt(e2), np.zeros(shape)
            g["Ez_re"], g["Ez_im"] = np.zeros(shape), np.zeros(shape)
            g["E_squared"] = e2
        # A lit particle: cross sections over the three wavelengths and a far field on a
        # 19 x 4 grid of directions (phi = 0, 90, 180, 270 degrees), a dipole-like sin^2 pattern.
        g = f.create_group("outputs/particle")
        g.attrs["kind"], g.attrs["per_unit_length"] = np.bytes_("cross_sections"), np.int32(0)
        g["omega"], g["wavelength_nm"] = OMEGA, WAVELENGTHS_NM
        g["scattering"], g["absorption"] = np.array([1.0, 3.0, 2.0]) * 1e-15, np.array([2.0, 4.0, 1.0]) * 1e-15
        g["extinction"] = g["scattering"][...] + g["absorption"][...]
        g = f.create_group("outputs/pattern")
        g.attrs["kind"], g.attrs["theta_count"], g.attrs["phi_count"] = np.bytes_("far_field"), np.int32(19), np.int32(4)
        theta, phi = np.meshgrid(np.linspace(0, np.pi, 19), np.radians([0, 90, 180, 270]), indexing="ij")
        g["theta"], g["phi"] = theta.reshape(-1), phi.reshape(-1)
        g["omega"], g["wavelength_nm"] = OMEGA[:1], WAVELENGTHS_NM[:1]
        g["directivity"] = 1.5 * np.sin(theta.reshape(1, -1)) ** 2
        g = f.create_group("outputs/chip")                  # a sensor: two Lorentzian dips (invented)
        g.attrs["kind"], g.attrs["medium"] = np.bytes_("sensor"), np.bytes_("water")
        g.attrs["index"], g.attrs["delta_n"], g.attrs["wavelength_nm"] = 1.3317, 1e-3, 632.8
        angle = np.arange(60, 85.001, 0.05)
        g["angle_deg"] = angle
        for suffix, centre in (("", SENSOR_DIPS[0]), ("_raised", SENSOR_DIPS[1])):
            g["reflectance" + suffix] = 0.98 - 0.95 / (1 + ((angle - centre) / 1.7) ** 2)
            g.attrs["resonance_angle_deg" + suffix], g.attrs["r_min" + suffix] = centre, 0.03
            g.attrs["baseline" + suffix], g.attrs["half_depth_angles_deg" + suffix] = 0.9, np.array([centre - 2, centre + 2])
        g.attrs["width_deg"], g.attrs["sensitivity_deg_per_riu"], g.attrs["figure_of_merit"] = 4.0, 150.0, 37.5
        g = f.create_group("outputs/inner")                 # a kind with no figure of its own: drawn
        g.attrs["kind"] = np.bytes_("energy")               # against time from the generic layout
        t = np.linspace(0, 30e-15, 300)
        g["time"], g["magnetic_time"] = t, t - 0.05e-15
        for key, value in (("electric", np.sin(t / 2e-15) ** 2), ("magnetic", np.cos(t / 2e-15) ** 2), ("total", np.ones(300))):
            g[key] = value * 1e-28
            g[key].attrs["units"] = np.bytes_("J")


# A sweep (invented numbers): rows out of gap order, a peak that moves with the gap and is weaker
# for one model, and a reflectance dip that moves the same way.
SWEEP_GAPS = [0.2, 0.1, 0.15, 0.1, 0.2, 0.15]
SWEEP_MODELS = ["classical", "classical", "classical", "quantum", "quantum", "quantum"]
SWEEP_WAVELENGTHS_NM = np.linspace(900.0, 500.0, 41)  # descending, as omega ascending gives


def sweep_spectrum(gap, model):
    """Extinction in m^2: a Lorentzian peak at 600 nm + 200 nm (0.2 nm - gap)/0.1 nm."""
    centre = 600 + 2000 * (0.2 - gap)
    return (1.0 if model == "classical" else 0.4) * 1e-15 / (1 + ((SWEEP_WAVELENGTHS_NM - centre) / 30) ** 2)


def write_sweep(folder):
    os.makedirs(folder)
    for row, (gap, model) in enumerate(zip(SWEEP_GAPS, SWEEP_MODELS)):
        with h5py.File(os.path.join(folder, f"point_{row:04d}.h5"), "w") as f:
            f.attrs["format"] = np.bytes_("yeegap-results")
            f.attrs["format_version"] = np.int32(1)
            g = f.create_group("outputs/dimer")
            g.attrs["kind"], g.attrs["per_unit_length"] = np.bytes_("cross_sections"), np.int32(0)
            g["wavelength_nm"] = SWEEP_WAVELENGTHS_NM
            g["extinction"] = sweep_spectrum(gap, model)
            g = f.create_group("outputs/plane_wave")
            g.attrs["kind"], g.attrs["angle_scan"] = np.bytes_("reflectance"), np.int32(0)
            g["wavelength_nm"] = SWEEP_WAVELENGTHS_NM
            g["reflectance"] = 1 - 0.8 * sweep_spectrum(gap, model) / 1e-15
    with h5py.File(os.path.join(folder, "sweep.h5"), "w") as t:
        t.attrs["format"], t.attrs["format_version"] = np.bytes_("yeegap-sweep"), np.int32(1)
        t["points/index"] = np.arange(len(SWEEP_GAPS), dtype=np.int64)
        t["points/file"] = fixed([f"point_{row:04d}.h5" for row in range(len(SWEEP_GAPS))])
        t["parameters/gap"] = np.array(SWEEP_GAPS)
        t["parameters/gap"].attrs["units"], t["parameters/gap"].attrs["kind"] = np.bytes_("nm"), np.bytes_("number")
        t["parameters/model"] = fixed(SWEEP_MODELS)
        t["parameters/model"].attrs["units"], t["parameters/model"].attrs["kind"] = np.bytes_("none"), np.bytes_("text")


def png_is_a_picture(path):
    """Size and content of a PNG: (width, height, distinct colours, fraction of coloured pixels).
    Axes, ticks and text are grey, so an empty figure has hundreds of colours (anti-aliasing) but
    no coloured pixels at all (measured: 0 of 392000); curves and colour maps are coloured."""
    image = matplotlib.image.imread(path)
    rgb = (image[..., :3] * 255).round().astype(np.int32).reshape(-1, 3)
    colours = len(np.unique(rgb, axis=0))
    coloured = float(np.mean(rgb.max(axis=1) - rgb.min(axis=1) > 40))
    return image.shape[1], image.shape[0], colours, coloured


def check_figures(folder, prefix, stems, min_coloured):
    """Each stem has a PNG and an SVG in `folder`; the PNG has the fixed size, is not blank (many
    colours) and has at least `min_coloured` of its pixels coloured."""
    for stem in stems:
        for ext in ("png", "svg"):
            path = os.path.join(folder, f"{prefix}{stem}.{ext}")
            check(os.path.isfile(path) and os.path.getsize(path) > 1000, f"{path} missing or tiny")
        png = os.path.join(folder, f"{prefix}{stem}.png")
        if os.path.isfile(png):
            width, height, colours, coloured = png_is_a_picture(png)
            check((width, height) == plot_common.FIGURE_SIZE_PX, f"{stem}: {width} x {height} pixels")
            check(colours >= 20, f"{stem}: only {colours} distinct colours (blank?)")
            check(coloured > min_coloured, f"{stem}: only {coloured:.2%} of the pixels are coloured (nothing drawn?)")
            print(f"{stem}.png: {width} x {height}, {colours} colours, {coloured:.1%} coloured")


def without_python_packages(work):
    """An interpreter that cannot import numpy, h5py or matplotlib: Debian's python3 with -S (no
    site directories, so no dist-packages)."""
    wrapper = os.path.join(work, "bare_python")
    with open(wrapper, "w") as w:
        w.write(f'#!/bin/sh\nexec {sys.executable} -S "$@"\n')
    os.chmod(wrapper, os.stat(wrapper).st_mode | stat.S_IXUSR)
    return wrapper


headless = {k: v for k, v in os.environ.items() if k not in ("DISPLAY", "WAYLAND_DISPLAY", "MPLBACKEND")}

with tempfile.TemporaryDirectory() as work:
    results = os.path.join(work, "synthetic.h5")
    write_results(results)

    # 1. The script itself: every figure, as PNG and SVG, each PNG a real picture.
    done = subprocess.run([sys.executable, script, results], capture_output=True, text=True, env=headless)
    check(done.returncode == 0, f"plot script exit code {done.returncode}: {done.stderr}")
    check(done.stdout == "", f"the plot script wrote to stdout: {done.stdout!r}")
    stems = ["flux", "probe_at_dipole", "particle", "pattern", "sensor_chip", "inner"] + [f"{m}_{w}nm" for m in ("volume", "xz_plane") for w in (500, 600, 700)]
    check_figures(work, "synthetic_", stems, min_coloured=0.005)

    with h5py.File(results, "r") as f:
        # 2. The relative curve is P / P0 (Jackson 1999, eq. 9.24) with n from the scene.
        notes = []
        fig = plot_spectra.flux_figure(f, notes)
        check(len(fig.axes) >= 2 and not notes, f"no relative panel: {notes}")
        if len(fig.axes) >= 2:
            curves = {line.get_label(): line.get_ydata() for line in fig.axes[1].get_lines()}
            check(np.allclose(curves.get("emitted", []), ENHANCEMENT, rtol=1e-12),
                  f"emitted P/P0 {curves.get('emitted')} want {ENHANCEMENT}")
            check(np.allclose(curves.get("through_top", []), 0.5 * ENHANCEMENT, rtol=1e-12),
                  f"through_top P/P0 {curves.get('through_top')}")

        # 2b. The sensor figure: both curves, each dip marked at the file's resonance angle.
        fig = plot_sensor.sensor_figure("chip", f["outputs/chip"])
        lines = fig.axes[0].get_lines()
        check(sum(len(line.get_xdata()) == 501 for line in lines) == 2, "the sensor figure lacks a curve")
        markers = sorted(float(line.get_xdata()[0]) for line in lines if line.get_marker() == "v")
        check(np.allclose(markers, SENSOR_DIPS), f"dip markers at {markers}, want {SENSOR_DIPS}")

        # 3. Graded coordinates: the colour mesh sits on the file's node coordinates, and the
        # material outline on cell edges of the graded grid (the box spans x nodes 3..6, z nodes 2..4).
        g = f["outputs/xz_plane"]
        fig = plot_field_maps.plane_figure(f, "xz_plane", g["E_squared"][0], [X, Y[2:3], Z], 500.0)
        ax = fig.axes[0]
        mesh = next(c for c in ax.collections if hasattr(c, "get_coordinates"))
        vertices = mesh.get_coordinates()                      # (nz, nx, 2) in nm
        check(np.allclose(vertices[0, :, 0], X * 1e9) and np.allclose(vertices[:, 0, 1], Z * 1e9),
              "the field map is not drawn on the graded node coordinates")
        outline = [c for c in ax.collections if c.get_label() == "material boundary"]
        check(len(outline) == 1, "no material outline")
        if outline:
            points = np.concatenate(outline[0].get_segments())
            xs, zs = set(np.round(points[:, 0], 6)), set(np.round(points[:, 1], 6))
            check(xs == set(np.round(X[3:7] * 1e9, 6)), f"outline x positions {sorted(xs)}")
            check(zs == set(np.round(Z[2:5] * 1e9, 6)), f"outline z positions {sorted(zs)}")

        # 3b. The far-field cuts join phi with phi + 180 degrees into one plane through z: two planes
        # of 38 directions, polar angle +theta then -theta, the directivity read at the right rows.
        g = f["outputs/pattern"]
        cuts = plot_particles.principal_cuts(g["theta"][...], g["phi"][...], 19, 4)
        check([c[0] for c in cuts] == ["φ = 0°", "φ = 90°"], f"cuts {[c[0] for c in cuts]}")
        for label, angles, rows in cuts:
            d = g["directivity"][0][rows]
            check(len(rows) == 38 and np.allclose(d, 1.5 * np.sin(angles) ** 2, atol=1e-12),
                  f"{label}: the pattern read along the cut is not 1.5 sin^2(theta)")

    # 4. No numpy/h5py/matplotlib: a hint, no traceback, from the script and from `yeegap view`.
    bare = without_python_packages(work)
    done = subprocess.run([bare, script, results], capture_output=True, text=True, env=headless)
    check(done.returncode == 3 and HINT in done.stderr and "Traceback" not in done.stderr,
          f"script without packages: exit {done.returncode}, stderr {done.stderr!r}")
    done = subprocess.run([yeegap, "view", results], capture_output=True, text=True, env=dict(headless, YEEGAP_PYTHON=bare))
    check(done.returncode == 1 and HINT in done.stderr and "Traceback" not in done.stderr,
          f"yeegap view without packages: exit {done.returncode}, stderr {done.stderr!r}")
    check(os.path.isfile(os.path.join(work, "synthetic.xmf")), "yeegap view wrote no sidecar")
    done = subprocess.run([yeegap, "view", results], capture_output=True, text=True,
                          env=dict(headless, YEEGAP_PLOT_SCRIPT=os.path.join(work, "nowhere.py")))
    check(done.returncode == 1 and "nowhere.py" in done.stderr, f"missing script: {done.returncode} {done.stderr!r}")

    # 5. `yeegap run --plot --json` on a coarse example: sidecar, figures, and stdout still one JSON object.
    out = os.path.join(work, "coarse.h5")
    done = subprocess.run([yeegap, "run", os.path.join(src, "examples", "dipole_near_sphere.yaml"), "-o", out,
                           "--plot", "--json", "--set", "domain.step=10 nm", "--set", "domain.cpml.cells=6"],
                          capture_output=True, text=True, env=headless)
    check(done.returncode == 0, f"run --plot exit code {done.returncode}: {done.stderr[-2000:]}")
    try:
        json.loads(done.stdout)
        check(True, "")
    except ValueError:
        check(False, f"stdout is not one JSON object: {done.stdout[:300]!r}")
    for name in ("coarse.xmf", "coarse_flux.png", "coarse_probe_at_dipole.png", "coarse_xz_plane_650nm.png"):
        check(os.path.isfile(os.path.join(work, name)), f"run --plot did not write {name}")

    # 6. Sweep heat maps: the script on a sweep table, the columns' places and values, `yeegap view`.
    folder = os.path.join(work, "gaps_sweep")
    write_sweep(folder)
    table = os.path.join(folder, "sweep.h5")
    done = subprocess.run([sys.executable, script, table], capture_output=True, text=True, env=headless)
    check(done.returncode == 0, f"sweep plots: exit code {done.returncode}: {done.stderr}")
    # Two panels of colour map fill most of the figure; a figure of empty axes has no coloured pixel.
    check_figures(folder, "", ("sweep_dimer_extinction", "sweep_plane_wave_reflectance"), min_coloured=0.3)
    notes = []
    figures = dict(plot_sweep.sweep_figures(table, folder, ["png"], notes))
    fig = figures.get(os.path.join(folder, "sweep_dimer_extinction"))
    check(fig is not None and not notes, f"no extinction heat map ({list(figures)}, notes {notes})")
    if fig is not None:
        panels = [ax for ax in fig.axes if ax.get_title()]
        check([ax.get_title() for ax in panels] == ["model = classical", "model = quantum"],
              f"panels {[ax.get_title() for ax in panels]}")
        # Gaps 0.1, 0.15, 0.2 nm: columns between the midpoints, ends half a spacing out.
        want_edges = [(0.075, 0.125), (0.125, 0.175), (0.175, 0.225)]
        wl_sorted = np.sort(SWEEP_WAVELENGTHS_NM)
        for ax, model in zip(panels, ("classical", "quantum")):
            meshes = [c for c in ax.collections if hasattr(c, "get_coordinates")]
            check(len(meshes) == 3, f"{model}: {len(meshes)} columns, want 3")
            for mesh, (lo, hi), gap in zip(meshes, want_edges, (0.1, 0.15, 0.2)):
                xy = mesh.get_coordinates()
                check(np.allclose([xy[0, 0, 0], xy[0, -1, 0]], [lo, hi]), f"{model} gap {gap}: column x {xy[0, :, 0]}")
                check(np.isclose(xy[0, 0, 1], wl_sorted[0] - 5) and np.isclose(xy[-1, 0, 1], wl_sorted[-1] + 5),
                      f"{model} gap {gap}: column y from {xy[0, 0, 1]} to {xy[-1, 0, 1]}")
                want = sweep_spectrum(gap, model)[np.argsort(SWEEP_WAVELENGTHS_NM)] * 1e18  # nm^2
                check(np.allclose(np.ravel(mesh.get_array()), want, rtol=1e-12), f"{model} gap {gap}: column values")
    done = subprocess.run([yeegap, "view", table], capture_output=True, text=True, env=headless)
    check(done.returncode == 0 and "sweep_dimer_extinction.png" in done.stderr,
          f"yeegap view sweep.h5: exit {done.returncode}, {done.stderr!r}")
    check(not os.path.exists(os.path.join(folder, "sweep.xmf")), "yeegap view wrote a sidecar for a sweep table")
    done = subprocess.run([yeegap, "view", table], capture_output=True, text=True, env=dict(headless, YEEGAP_PYTHON=bare))
    check(done.returncode == 1 and HINT in done.stderr and "Traceback" not in done.stderr,
          f"yeegap view sweep.h5 without packages: exit {done.returncode}, stderr {done.stderr!r}")
    os.remove(os.path.join(folder, "point_0004.h5"))
    done = subprocess.run([sys.executable, script, table], capture_output=True, text=True, env=headless)
    check(done.returncode == 0 and "cannot read 1 point files (point_0004.h5)" in done.stderr,
          f"lost point file: exit {done.returncode}, {done.stderr!r}")

print(f"{passes} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
