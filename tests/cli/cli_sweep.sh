#!/usr/bin/env bash
# `yeegap sweep` end to end on a 3-point sweep of a cheap 2D scene (a gold cylinder, 48 x 48 cells):
# one results file per point, the merged table (HDF5 and CSV) with the parameters as written and
# each figure equal to the peak recomputed from that point's own spectrum, a re-run that skips
# finished points and one that reruns only a deleted point, --jobs 2 giving the same numbers bit for
# bit, --merge-only --plot drawing the heat map, a plane-wave sweep run as Bloch runs, run --point,
# check with a sweep, the Slurm script, and errors that point at the text.
# Usage: cli_sweep.sh YEEGAP_BINARY PYTHON3
set -u
yeegap=$1
python=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
source "$(dirname "$0")/cli_expect.sh"  # fails, pass, fail, ok, expect


# py NAME CODE: runs python code (with h5py, numpy) in $work; passes when it exits 0.
py() {
  local name=$1
  if (cd "$work" && "$python" -c "$2"); then ok; else fail "$name"; fi
}

cat >"$work/cyl.yaml" <<'SCENE'
# A gold cylinder along z (2D: one periodic cell along z), E across its axis: the dipole plasmon
# sits inside 400-800 nm, so each spectrum has an interior peak. Radius from the sweep.
scene: {version: 1, title: "cylinder, radius ${radius}"}
materials:
  gold: {library: Au}
domain:
  size: [240 nm, 240 nm, 5 nm]
  step: 5 nm
  edges: {z: periodic}
  cpml: {cells: 8}
bodies:
  - {shape: cylinder, material: ${mat}, center: [0, 0, 0], axis: z, radius: ${radius}, length: 100 nm}
excitation:
  - tfsf: {box: {from: [-55 nm, -55 nm, -2.5 nm], to: [55 nm, 55 nm, 2.5 nm]}, direction: x, polarization: y,
           band: {from: 400 nm, to: 800 nm}}
outputs:
  - cross_sections: {name: cyl, frequencies: {from: 400 nm, to: 800 nm, count: 21}}
stop: {energy_below: 1e-4}
sweep:
  radius: {from: 15 nm, to: 25 nm, count: 3}
  mat: [gold]
SCENE

# The first sweep runs all three points.
out=$("$yeegap" sweep "$work/cyl.yaml" 2>&1); code=$?
if [ $code -eq 0 ] && grep -q "0 already finished, 3 to run" <<<"$out"; then ok; else fail "first sweep: exit $code"; echo "$out"; fi
for k in 0 1 2; do [ -f "$work/cyl_sweep/point_000$k.h5" ] && ok || fail "no point file $k"; done

py merged_table '
import h5py, numpy as np, csv
t = h5py.File("cyl_sweep/sweep.h5", "r")
assert t.attrs["format"].decode() == "yeegap-sweep", t.attrs["format"]
assert list(t["points/index"][:]) == [0, 1, 2]
assert [f.decode() for f in t["points/file"][:]] == ["point_0000.h5", "point_0001.h5", "point_0002.h5"]
r = t["parameters/radius"]
assert list(r[:]) == [15.0, 20.0, 25.0] and r.attrs["units"].decode() == "nm", (r[:], r.attrs["units"])
assert [m.decode() for m in t["parameters/mat"][:]] == ["gold"] * 3
def parabola_peak(w, y):
    o = np.argsort(w); w = w[o]; y = y[o]; b = int(np.argmax(y))
    if b == 0 or b == len(w) - 1: return w[b], y[b]
    h0, h2 = w[b-1] - w[b], w[b+1] - w[b]
    s0, s2 = (y[b-1] - y[b]) / h0, (y[b+1] - y[b]) / h2
    a = (s2 - s0) / (h2 - h0); c = s0 - a * h0
    if not a < 0: return w[b], y[b]
    d = min(max(-c / (2 * a), h0), h2)
    return w[b] + d, y[b] + a * d * d + c * d
c0 = 299792458.0
for row, name in enumerate(["point_0000.h5", "point_0001.h5", "point_0002.h5"]):
    p = h5py.File("cyl_sweep/" + name, "r")
    assert p["sweep/point"][0] == row
    g = p["outputs/cyl"]
    for q in ["extinction", "scattering", "absorption"]:
        w, v = parabola_peak(g["omega"][:], g[q][:])
        got = t["figures/cyl.%s_peak" % q][row]
        lam = t["figures/cyl.%s_peak_wavelength_nm" % q][row]
        assert abs(got - v) <= 1e-12 * abs(v), (name, q, got, v)
        assert abs(lam - 2 * np.pi * c0 / w * 1e9) <= 1e-9 * lam, (name, q, lam)
        assert 400 - 1e-6 <= lam <= 800 + 1e-6, (name, q, lam)
    # The plasmon peak is inside the band, not at its edge: the parabola was used.
    wl = g["wavelength_nm"][:]; ext = g["extinction"][:]
    assert 0 < int(np.argmax(ext)) < len(ext) - 1, ext
assert t["figures/cyl.extinction_peak"].attrs["units"].decode() == "m"
# Small-particle limit: the cross section per length grows with the area pi r^2 (Bohren & Huffman,
# Absorption and Scattering of Light by Small Particles, Wiley 1983, ch. 8), so it rises with r.
ext = t["figures/cyl.extinction_peak"][:]
assert ext[0] < ext[1] < ext[2], ext
rows = list(csv.reader(open("cyl_sweep/sweep.csv")))
assert len(rows) == 4 and rows[0][:3] == ["point", "radius [nm]", "mat"], rows[0]
assert [r[1] for r in rows[1:]] == ["15", "20", "25"], rows
assert abs(float(rows[2][3]) - t["figures/" + rows[0][3].split(" [")[0]][1]) <= 1e-9 * abs(float(rows[2][3]))
'

# A second sweep runs nothing and leaves the point files alone.
before=$(stat -c %Y.%s "$work"/cyl_sweep/point_000*.h5 | tr '\n' ' ')
sleep 1
expect rerun_skips_finished 0 "3 already finished, 0 to run" -- "$yeegap" sweep "$work/cyl.yaml"
after=$(stat -c %Y.%s "$work"/cyl_sweep/point_000*.h5 | tr '\n' ' ')
[ "$before" = "$after" ] && ok || fail "a re-run touched the point files: $before / $after"

# A lost point runs again, alone; the table comes out the same.
cp "$work/cyl_sweep/sweep.csv" "$work/first.csv"
rm "$work/cyl_sweep/point_0001.h5"
expect rerun_missing_point 0 "2 already finished, 1 to run" -- "$yeegap" sweep "$work/cyl.yaml"
cmp -s "$work/first.csv" "$work/cyl_sweep/sweep.csv" && ok || fail "table changed after rerunning point 1"

# --merge-only --plot runs nothing and draws the heat map of the extinction over radius and wavelength.
expect merge_only_plot 0 "sweep_cyl_extinction.png" -- "$yeegap" sweep "$work/cyl.yaml" --merge-only --plot
py heat_map_written '
import matplotlib.image
image = matplotlib.image.imread("cyl_sweep/sweep_cyl_extinction.png")
assert image.shape[:2] == (560, 700), image.shape
'

# A sweep of a plane-wave scene runs each point as a Bloch run (not as a plain Simulation, which has
# no plane wave): each point file holds its reflectance table at its own angle, and --plot draws it.
cat >"$work/film.yaml" <<'SCENE'
# Invented numbers, chosen only to be small: a glass prism, 40 nm of a Drude metal, vacuum; 1D.
scene: {version: 1, title: "film, ${angle}"}
materials:
  glass: {index: 1.5}
  metal: {poles: {eps_inf: 1, drude: [{plasma_frequency: 8 eV, damping: 0.1 eV}]}}
domain: {size: [10 nm, 10 nm, 600 nm], step: 5 nm, edges: {x: bloch, y: bloch, z: cpml}, cpml: {cells: 20}}
bodies:
  - {shape: slab, material: glass, axis: z, from: -400 nm, to: -50 nm}
  - {shape: slab, material: metal, axis: z, from: -50 nm, to: -10 nm}
excitation:
  - plane_wave: {from: low, polarization: p, angle: ${angle}, band: {from: 500 nm, to: 800 nm},
                 frequencies: {from: 520 nm, to: 780 nm, count: 5}}
stop: {after: 100 fs}
sweep:
  angle: [10 deg, 20 deg]
SCENE
expect plane_wave_sweep 0 "sweep_plane_wave_reflectance.png" -- "$yeegap" sweep "$work/film.yaml" --plot
py plane_wave_sweep_points '
import h5py, numpy as np
for k, angle in ((0, 10), (1, 20)):
    g = h5py.File("film_sweep/point_000%d.h5" % k, "r")["outputs/plane_wave"]
    a, r = g["angle_deg"][:], g["reflectance"][:]
    assert len(r) == 5 and np.all((r > 0.5) & (r < 1)), r
    # each row at its own angle; at the band centre frequency (615 nm), the swept one
    assert min(a) < angle < max(a), (k, a)
'

# Two points at a time, one thread each: the same numbers (results never depend on threads).
expect jobs_two 0 "2 at a time" -- "$yeegap" sweep "$work/cyl.yaml" --jobs 2 -o "$work/two"
cmp -s "$work/first.csv" "$work/two/sweep.csv" && ok || fail "--jobs 2 gave another table"

# run: refused without --point; with it, one point whose figures match its table row.
expect run_needs_point 2 "cyl.yaml:[0-9]+:1: this scene is a sweep of 3 points.*--point K" -- "$yeegap" run "$work/cyl.yaml"
expect run_one_point 0 "" -- "$yeegap" run "$work/cyl.yaml" --point 2 -o "$work/p2.h5"
py run_point_matches_row '
import h5py
p = h5py.File("p2.h5", "r"); t = h5py.File("cyl_sweep/sweep.h5", "r")
names = [n.decode() for n in p["sweep/figure_names"][:]]
for n, v in zip(names, p["sweep/figure_values"][:]):
    assert v == t["figures/" + n][2], (n, v, t["figures/" + n][2])
'

# check: the number of points and the cost of all of them.
expect check_sweep 0 "sweep +3 points \(grid\)" -- "$yeegap" check "$work/cyl.yaml" --quick
expect check_sweep_json 0 '"sweep": \{"points": 3, "combine": "grid", "cell_updates": [0-9.e+]+' -- "$yeegap" check "$work/cyl.yaml" --json --quick

# The Slurm script: an array of 3 tasks, each running one point; valid shell.
expect batch_slurm 0 "sbatch --dependency=afterok" -- "$yeegap" sweep "$work/cyl.yaml" --batch slurm -o "$work/batch" --threads 2
script="$work/batch/sweep.sbatch"
if [ -f "$script" ] && grep -q -- "--array=0-2$" "$script" && grep -q -- "--cpus-per-task=2" "$script" &&
   grep -q -- "--point \"\$SLURM_ARRAY_TASK_ID\"" "$script" && bash -n "$script"; then ok; else fail "slurm script"; cat "$script"; fi
ls "$work/batch"/point_* >/dev/null 2>&1 && fail "--batch ran points" || ok
# A newline and a quote in the scene's and the folder's names: the script stays valid shell, the
# names appear only quoted (or escaped in comments), and running it as a task (a fake sbatch
# environment, the program replaced by a stub that prints its arguments) passes the names unbroken.
odd="$work/odd
name's"
mkdir -p "$odd"
cp "$work/cyl.yaml" "$odd/cyl.yaml"
expect batch_odd_names 0 "sbatch --dependency=afterok" -- "$yeegap" sweep "$odd/cyl.yaml" --batch slurm -o "$odd/batch
dir" --threads 2
script="$odd/batch
dir/sweep.sbatch"
# In the comments the newline shows as \x0a (a raw one would end the comment and run the rest).
if [ -f "$script" ] && bash -n "$script" && grep -q '^#   .*odd\\x0aname' "$script"; then ok; else fail "odd names"; cat "$script"; fi
stub="$work/stub"
printf '#!/bin/bash\nfor a in "$@"; do printf "[%%s]\\n" "$a"; done\n' >"$stub" && chmod +x "$stub"
sed "s|^exec '[^']*' sweep|exec '$stub' sweep|; s|^exec [^ ]*/yeegap sweep|exec '$stub' sweep|" "$script" >"$work/task.sh"
SLURM_ARRAY_JOB_ID=7 SLURM_ARRAY_TASK_ID=1 SLURM_CPUS_PER_TASK=2 bash "$work/task.sh"
log="$odd/batch
dir/slurm_7_1.txt"
want=$(printf '[%s]\n' sweep "$odd/cyl.yaml" -o "$odd/batch
dir" --point 1 --threads 2)
if [ -f "$log" ] && [ "$(cat "$log")" = "$want" ]; then ok; else fail "task arguments"; cat "$log" "$work/task.sh"; fi

# Errors point at the text: an unknown ${name}, a zip of unequal lengths.
sed 's/radius: ${radius}, length/radius: ${raduis}, length/' "$work/cyl.yaml" | sed 's/title: "cylinder, radius ${radius}"/title: "r ${radius}"/' >"$work/typo.yaml"
line=$(grep -n 'raduis' "$work/typo.yaml" | cut -d: -f1)
col=$(awk -v l="$line" 'NR == l { print index($0, "${raduis}") }' "$work/typo.yaml")
expect unknown_parameter 2 "typo.yaml:$line:$col: unknown sweep parameter 'raduis'; did you mean 'radius'" -- "$yeegap" sweep "$work/typo.yaml"
sed 's/^  mat: \[gold\]/  mat: [gold, gold]\n  combine: zip/' "$work/cyl.yaml" >"$work/zip.yaml"
line=$(grep -n '^  mat:' "$work/zip.yaml" | cut -d: -f1)
expect zip_lengths 2 "zip.yaml:$line:3: .*'radius' has 3, 'mat' has 2" -- "$yeegap" check "$work/zip.yaml"
[ -e "$work/typo_sweep" ] && fail "a sweep folder was made for an invalid scene" || ok

echo "$pass passed, $fails failed"
[ "$fails" -eq 0 ]
