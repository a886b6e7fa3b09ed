#!/usr/bin/env bash
# `yeegap materials`: `show` prints the published models (checked against the physics notes' values),
# `list` names every entry, `fit` recovers a synthetic table's permittivity and prints a block that a
# scene accepts as is; a `table:` scene is fitted on load with the fit error on stderr; user errors
# exit with code 2 and say where.
# Usage: materials_cli.sh YEEGAP_BINARY PYTHON3
set -u
yeegap=$1
python=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
source "$(dirname "$0")/cli_expect.sh"  # fails, pass, fail, ok, expect


# py NAME -- python code reading files in $work: passes when the script exits 0.
py() {
  local name=$1
  shift 2
  if "$python" - "$work" "$@" >"$work/py.txt" 2>&1; then ok; else fail "$name:"; head -8 "$work/py.txt"; fi
}

# ---- show: the published models ----

# Rakic et al., Appl. Opt. 37, 5271 (1998), Au Lorentz-Drude parameters; eps at 632.8 nm =
# -9.800 + 1.965i as computed in the physics notes section 2.2, to 1e-3 absolute (the notes' tolerance).
# Etchegoin, Le Ru, Meyer, J. Chem. Phys. 125, 164705 (2006), gold: -11.411 + 1.187i (notes section 2.3).
"$yeegap" materials show Au --from 632.8nm --to 632.8nm --json >"$work/au.json" 2>"$work/au.err" || fail "show Au exit $?"
"$yeegap" materials show Au_critical_points --from 632.8nm --to 632.8nm --json >"$work/aucp.json" 2>/dev/null ||
  fail "show Au_critical_points exit $?"
py show_matches_published_check_values -- <<'EOF'
import json, sys
work = sys.argv[1]
for name, want in (("au", complex(-9.800, 1.965)), ("aucp", complex(-11.411, 1.187))):
    rows = json.load(open(f"{work}/{name}.json"))
    assert len(rows) == 1, rows
    r = rows[0]
    assert set(r) == {"wavelength_nm", "eps_re", "eps_im", "n", "k"}, r
    assert abs(r["wavelength_nm"] - 632.8) < 1e-9, r
    eps = complex(r["eps_re"], r["eps_im"])
    assert abs(eps.real - want.real) <= 1e-3 and abs(eps.imag - want.imag) <= 1e-3, (name, eps, want)
    # n + i k is the principal square root of eps (k >= 0 absorbs in exp(-i omega t)).
    assert abs(complex(r["n"], r["k"]) ** 2 - eps) < 1e-8 * abs(eps) and r["k"] >= 0, r
    print(name, eps)
EOF
grep -q "warning" "$work/au.err" && fail "show Au inside its range warned: $(cat "$work/au.err")" || ok

# The default table: 400 to 900 nm in 10 nm steps, header and 51 rows on stdout, notes on stderr.
"$yeegap" materials show Ag >"$work/ag.txt" 2>"$work/ag.err"
code=$?
if [ "$code" -ne 0 ]; then fail "show Ag: exit $code"
elif head -1 "$work/ag.txt" | grep -qE '^wavelength_nm +eps_re +eps_im +n +k' && [ "$(wc -l <"$work/ag.txt")" -eq 52 ] &&
     grep -q "Rakic" "$work/ag.err" && ! grep -q "Rakic" "$work/ag.txt"; then ok
else fail "show Ag: table not on stdout or notes not on stderr"; head -3 "$work/ag.txt"; fi

expect unknown_name 2 "unknown material 'Auu'; did you mean 'Au'\?" -- "$yeegap" materials show Auu
expect reversed_range 2 "below --from" -- "$yeegap" materials show Au --from 900nm --to 400nm
expect wrong_unit 2 "'eV' is not a length unit" -- "$yeegap" materials show Au --from 2eV
expect too_many_rows 2 "check the units" -- "$yeegap" materials show Au --step 1e-6nm

# Outside the entry's range: a warning naming the range on stderr, the table still printed, exit 0.
"$yeegap" materials show Ti --from 400nm --to 500nm >"$work/ti.txt" 2>"$work/ti.err"
code=$?
if [ "$code" -eq 0 ] && grep -q "warning: 400 nm to 500 nm leaves the valid range of Ti, 469.6 nm to 20 um" "$work/ti.err" &&
   [ "$(wc -l <"$work/ti.txt")" -eq 12 ] && ! grep -q warning "$work/ti.txt"; then ok
else fail "show Ti outside its range: exit $code"; cat "$work/ti.err"; fi

# ---- list ----

"$yeegap" materials list --json >"$work/list.json" 2>/dev/null || fail "list --json exit $?"
"$yeegap" materials list >"$work/list.txt" 2>/dev/null || fail "list exit $?"
py list_has_every_entry_once -- <<'EOF'
import json, sys
work = sys.argv[1]
entries = json.load(open(f"{work}/list.json"))
names = [e["name"] for e in entries]
assert len(names) == len(set(n.lower() for n in names)), names
# The entries the physics notes document (sections 2.2 and 2.3) are all there.
for want in ("Ag", "Au", "Cu", "Al", "Au_critical_points"):
    assert want in names, want
for e in entries:
    for key in ("summary", "model", "valid_range", "source"):
        assert e[key], (e["name"], key)
    assert 0 < e["wavelength_min_nm"] < e["wavelength_max_nm"], e["name"]
# The text listing has one line per entry starting with its name (and a source line each).
text = open(f"{work}/list.txt").read().splitlines()
listed = [l.split()[0] for l in text[1:] if l and not l.startswith(" ")]
assert listed == names, (listed, names)
open(f"{work}/names.txt", "w").write("\n".join(names) + "\n")
EOF
# Every listed entry shows over its default band with eps_im >= 0 and k >= 0 (passive, exp(-i omega t)).
while read -r name; do
  "$yeegap" materials show "$name" --json >"$work/show_$name.json" 2>/dev/null || fail "show $name: exit $?"
done <"$work/names.txt"
py every_entry_is_passive_over_the_default_band -- <<'EOF'
import glob, json, sys
work = sys.argv[1]
files = glob.glob(f"{work}/show_*.json")
assert len(files) == len(open(f"{work}/names.txt").read().split()), files
for f in files:
    rows = json.load(open(f))
    assert len(rows) == 51, (f, len(rows))
    for r in rows:
        assert r["eps_im"] >= 0 and r["k"] >= 0, (f, r)
EOF

# ---- fit ----

# A synthetic table from a gold-like model with invented numbers (eV): eps_inf 2, Drude 8.5/0.07,
# Lorentz (1.2, 2.9, 0.8) and (2.0, 4.2, 1.5); 400 to 1000 nm, 40 rows, n and k from eps.
py write_synthetic_table -- <<'EOF'
import cmath, sys
work = sys.argv[1]
hc = 1239.84198  # eV nm (CODATA 2018 h c)
def eps(nm):
    E = hc / nm
    e = 2.0 - 8.5**2 / (E * E + 1j * 0.07 * E)
    for s, r, g in ((1.2, 2.9, 0.8), (2.0, 4.2, 1.5)):
        e += s * r * r / (r * r - E * E - 1j * g * E)
    return e
with open(f"{work}/gold_like.csv", "w") as f:
    f.write("# synthetic, invented numbers\nwavelength_nm,n,k\n")
    for i in range(40):
        nm = 400 + 600 * i / 39
        nk = cmath.sqrt(eps(nm))
        f.write(f"{nm:.10g},{nk.real:.10g},{nk.imag:.10g}\n")
EOF
"$yeegap" materials fit "$work/gold_like.csv" --poles 2 --drude 1 --json >"$work/fit.json" 2>"$work/fit_json.err" ||
  fail "fit --json: exit $?"
"$yeegap" materials fit "$work/gold_like.csv" --poles 2 --drude 1 --name fitted_gold >"$work/snippet.yaml" 2>"$work/fit.err" ||
  fail "fit: exit $?"
py fit_recovers_eps_within_one_percent -- <<'EOF'
import json, re, sys
work = sys.argv[1]
hc = 1239.84198
def truth(nm):
    E = hc / nm
    e = 2.0 - 8.5**2 / (E * E + 1j * 0.07 * E)
    for s, r, g in ((1.2, 2.9, 0.8), (2.0, 4.2, 1.5)):
        e += s * r * r / (r * r - E * E - 1j * g * E)
    return e
def model(eps_inf, drude, lorentz, nm):
    E = hc / nm
    e = complex(eps_inf)
    for wp, g in drude:
        e -= wp * wp / (E * E + 1j * g * E)
    for s, r, g in lorentz:
        e += s * r * r / (r * r - E * E - 1j * g * E)
    return e
grid = [400 + 5 * i for i in range(121)]  # finer than the table
j = json.load(open(f"{work}/fit.json"))
assert j["rows"] == 40 and len(j["drude"]) == 1 and len(j["lorentz"]) == 2, j
drude = [(p["plasma_frequency_eV"], p["damping_eV"]) for p in j["drude"]]
lorentz = [(p["strength"], p["resonance_eV"], p["damping_eV"]) for p in j["lorentz"]]
worst = max(abs(model(j["eps_inf"], drude, lorentz, nm) - truth(nm)) / abs(truth(nm)) for nm in grid)
print("fit worst relative error", worst, "reported", j["max_relative_error"])
assert worst < 0.01, worst
# The printed block (text mode) holds the same model: parse its numbers and check it against the truth.
text = open(f"{work}/snippet.yaml").read()
assert text == j["snippet"].replace("gold_like:", "fitted_gold:"), "text and JSON snippets differ"
num = r"([-+0-9.eE]+)"
eps_inf = float(re.search(r"eps_inf: " + num, text).group(1))
drude = [tuple(map(float, m)) for m in re.findall(r"plasma_frequency: " + num + " eV, damping: " + num + " eV", text)]
lorentz = [tuple(map(float, m)) for m in
           re.findall(r"strength: " + num + ", resonance: " + num + " eV, damping: " + num + " eV", text)]
assert len(drude) == 1 and len(lorentz) == 2, text
worst_text = max(abs(model(eps_inf, drude, lorentz, nm) - truth(nm)) / abs(truth(nm)) for nm in grid)
assert worst_text < 0.01, worst_text
EOF
grep -q "RMS |delta eps|" "$work/fit.err" && grep -q "^# RMS |delta eps|" "$work/snippet.yaml" &&
  ! grep -q "RMS" "$work/fit_json.err" && ok || fail "fit: the error is not reported on stderr and in the block"

# The printed block goes into a scene as is and `yeegap check` accepts it.
cat >"$work/head.yaml" <<'EOF'
scene: {version: 1, title: "a fitted gold-like sphere"}
domain: {size: 300 nm, step: 10 nm}
bodies: {shape: sphere, material: fitted_gold, center: [0, 0, 0], radius: 40 nm}
excitation: {dipole: {position: [0, 0, 80 nm], direction: z, band: {from: 450 nm, to: 900 nm}}}
stop: {after: 10 fs}
EOF
cat "$work/head.yaml" "$work/snippet.yaml" >"$work/fitted_scene.yaml"
expect snippet_parses_in_a_scene 0 "fitted_scene.yaml: valid" -- "$yeegap" check "$work/fitted_scene.yaml" --quick

# The same table named in a scene (relative to the scene file) is fitted on load, with the error on stderr.
mkdir -p "$work/tables"
cp "$work/gold_like.csv" "$work/tables/"
cp "$work/head.yaml" "$work/table_scene.yaml"
printf 'materials:\n  fitted_gold: {table: tables/gold_like.csv, poles: 2}\n' >>"$work/table_scene.yaml"
expect table_scene_reports_fit 0 "table_scene.yaml:7:24: note: materials.fitted_gold: fitted 1 Drude \+ 2 Lorentz poles to 'tables/gold_like.csv' \(40 rows, 400 nm to 1000 nm\): RMS" -- "$yeegap" check "$work/table_scene.yaml" --quick

# Bad tables: file:line:column, exit code 2.
printf 'wavelength_nm,n,k\n400,1.5,0.1\n500,1.4,0.1\n600,1.3,-0.1\n' >"$work/gain.csv"
expect fit_negative_k 2 "gain.csv:4:9: k must be non-negative" -- "$yeegap" materials fit "$work/gain.csv"
printf 'wavelength_nm,n,kappa\n400,1.5,0.1\n' >"$work/header.csv"
expect fit_bad_header 2 "header.csv:1:17: unknown column 'kappa'" -- "$yeegap" materials fit "$work/header.csv"
printf 'wavelength_nm,n,k\n400,1.5,0.1\n500,1.4\n' >"$work/short_row.csv"
expect fit_short_row 2 "short_row.csv:3:1: row has 2 cells" -- "$yeegap" materials fit "$work/short_row.csv"
printf 'wavelength_nm,n,k\n400,1.5,0.1\n500,1.4,0.1\n600,1.3,0.1\n' >"$work/few.csv"
expect fit_too_few_rows 2 "few.csv:4:.*the table has 3 rows" -- "$yeegap" materials fit "$work/few.csv"
expect fit_missing_file 2 "no_such.csv: cannot open the table file" -- "$yeegap" materials fit "$work/no_such.csv"
expect fit_no_poles 2 "at least one pole" -- "$yeegap" materials fit "$work/gold_like.csv" --poles 0 --drude 0
expect fit_bad_name 2 "not a usable material name" -- "$yeegap" materials fit "$work/gold_like.csv" --name 2gold
expect no_verb 2 "subcommand is required" -- "$yeegap" materials

echo "$pass passed, $fails failed"
[ "$fails" -eq 0 ]
