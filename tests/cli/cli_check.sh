#!/usr/bin/env bash
# Command-line behaviour that users and scripts rely on: exit codes, where error messages point,
# the JSON of `check`. Usage: cli_check.sh YEEGAP_BINARY SOURCE_DIR
set -u
yeegap=$1
src=$2
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
source "$(dirname "$0")/cli_expect.sh"

# A misspelt top-level key: file:line:column, a suggestion, exit code 2, nothing run.
sed 's/^outputs:/outptus:/' "$src/examples/dipole_near_sphere.yaml" >"$work/misspelt.yaml"
line=$(grep -n '^outptus:' "$work/misspelt.yaml" | cut -d: -f1)
expect misspelt_top_level_key 2 "misspelt.yaml:$line:1: .*outptus.*did you mean 'outputs'" -- "$yeegap" check "$work/misspelt.yaml"
expect misspelt_key_not_run 2 "did you mean" -- "$yeegap" run "$work/misspelt.yaml" -o "$work/never.h5"
[ -e "$work/never.h5" ] && { echo "FAIL: a results file was written for an invalid scene"; fails=$((fails + 1)); }

# An explicit time step above the Courant limit is refused before the run, exit code 2.
expect unstable_time_step 2 "Courant limit" -- "$yeegap" check "$src/examples/dipole_near_sphere.yaml" --set "domain.time_step=1 fs"

# A plane-wave box reaching into an absorbing layer is refused by `check`, as `run` would refuse it.
expect tfsf_box_in_absorber 2 "particle_on_mirror.yaml:[0-9]+:[0-9]+: the plane-wave box must lie inside the domain, clear of the absorbing layers" -- \
  "$yeegap" check "$src/examples/particle_on_mirror.yaml" --set "excitation[0].tfsf.box={from: [-36 nm, 0 nm, -24 nm], to: [36 nm, 36 nm, 60 nm]}"

# So are cross-section flux boxes without room before the absorber; a sweep names the point.
expect cross_section_margin 2 "sweep point 0 \(spacer = 2 nm, model = classical\): .*particle_on_mirror.yaml:[0-9]+:[0-9]+: cross sections need 3 free cells" -- \
  "$yeegap" check "$src/examples/particle_on_mirror.yaml" --set "domain.size=[140nm,60nm,132nm]" --set "domain.center=[0nm,30nm,14nm]"

# check --json: one object with the documented keys.
expect check_json 0 '"cells": 512000.*"memory_bytes": [0-9]+.*"time_step_s": [0-9.e-]+.*"steps": [0-9]+' -- \
  "$yeegap" check "$src/examples/dipole_near_sphere.yaml" --json --quick

# check's time estimate: from this scene's own steps, timed for about a second; --quick assumes a rate.
expect check_timed 0 '"estimated_seconds": [0-9.e+-]+, "cell_updates_per_second": [0-9.e+]+, "rate_source": "timed", "setup_seconds": [0-9.e+-]+, "timed_steps": [1-9][0-9]*' -- \
  "$yeegap" check "$src/examples/gold_grating.yaml" --json
expect check_timed_text 0 "cost +about .* cell updates: .* at [0-9.]+ Mcells/s, this machine's rate for this scene \([0-9]+ steps timed" -- \
  "$yeegap" check "$src/examples/gold_grating.yaml"
expect check_quick 0 '"cell_updates_per_second": 100000000, "rate_source": "assumed", "setup_seconds": 0, "timed_steps": 0' -- \
  "$yeegap" check "$src/examples/gold_grating.yaml" --json --quick

# A missing file, a bad option.
expect missing_file 2 "nothing.yaml" -- "$yeegap" check "$work/nothing.yaml"
expect unknown_option 2 "" -- "$yeegap" run --no-such-option x.yaml
expect version 0 "yeegap [0-9]+\.[0-9]+" -- "$yeegap" --version

# An unwritable results path fails before running and says which path.
expect unwritable_output 1 "$work/no/such/dir/out.h5" -- "$yeegap" run "$src/examples/dipole_near_sphere.yaml" -o "$work/no/such/dir/out.h5"

# A results file that would replace the scene (or its sidecar or checkpoint would) is refused, exit 2,
# and the scene is left as it was.
cp "$src/examples/dipole_near_sphere.yaml" "$work/scene.yaml"
expect output_is_the_scene 2 "would write '.*scene.yaml', which is the scene file" -- "$yeegap" run "$work/scene.yaml" -o "$work/scene.yaml"
cmp -s "$src/examples/dipole_near_sphere.yaml" "$work/scene.yaml" || { echo "FAIL: the scene was changed"; fails=$((fails + 1)); }
cp "$work/scene.yaml" "$work/scene.xmf"
expect sidecar_would_replace_the_scene 2 "would write '.*scene.xmf', which is the scene file" -- "$yeegap" run "$work/scene.xmf" -o "$work/scene.h5"

# A source whose amplitude overflows single precision: the guard stops the run within 50 steps of the
# first non-finite value, says where, writes the results as they stood and exits with code 4.
expect diverged_run 4 "the fields diverged by step [0-9]+: non-finite fields" -- \
  "$yeegap" run "$work/scene.yaml" -o "$work/diverged.h5" --set "excitation[0].dipole.moment=1e40 C m"
[ -e "$work/diverged.h5" ] || { echo "FAIL: a diverged run wrote no results file"; fails=$((fails + 1)); }

# A plane-wave box in a dispersive background (library water, a Sellmeier model with poles) is refused
# at the box with the constant index that stands in for it; the example's constant index runs.
expect tfsf_dispersive_background 2 "gold_dimer_antenna.yaml:[0-9]+:[0-9]+: .*background 'water' .*poles.*'water: \{index: 1\.33[0-9]*\}'" -- \
  "$yeegap" check "$src/examples/gold_dimer_antenna.yaml" --quick --set "materials.water={library: water}"

# A run stopped before its pulse reaches the box: the cross sections (normalised by an incident
# intensity of zero) print as "undefined" with a note, never as "-nan"; JSON gives null.
cat > "$work/early.yaml" <<'EOF2'
scene: {version: 1, title: stopped before the pulse arrives}
materials: {metal: {poles: {eps_inf: 1, drude: [{plasma_frequency: 8 eV, damping: 0.1 eV}]}}}
domain: {size: [300 nm, 300 nm, 300 nm], step: 10 nm, edges: cpml, cpml: {cells: 6}}
bodies:
  - {shape: sphere, material: metal, center: [0, 0, 0], radius: 20 nm}
excitation:
  - tfsf: {box: {from: [-40 nm, -40 nm, -40 nm], to: [40 nm, 40 nm, 40 nm]}, direction: z, polarization: x,
           band: {from: 450 nm, to: 900 nm}}
outputs:
  - cross_sections: {name: sphere, frequencies: [500 nm, 600 nm]}
stop: {after: 0.02 fs}
EOF2
expect stopped_before_the_pulse 0 "500.00 nm  undefined  undefined  undefined" -- "$yeegap" run "$work/early.yaml" -o "$work/early.h5"
expect stopped_before_the_pulse_note 0 "'undefined' values are normalised by light" -- "$yeegap" run "$work/early.yaml" -o "$work/early.h5"
"$yeegap" run "$work/early.yaml" -o "$work/early.h5" 2>&1 | grep -q -- "-nan" && { echo "FAIL: -nan printed"; fails=$((fails + 1)); }

# A curved metal body on a staircase: `check` warns with the measured cost; averaging silences it; an
# aligned metal box (faces on the grid planes) is not warned about.
expect staircased_metal_warning 0 "warning +body 0 'left' \(gold\) is a curved or tilted metal body on a staircase" -- \
  "$yeegap" check "$src/examples/gold_dimer_antenna.yaml" --quick
"$yeegap" check "$src/examples/gold_dimer_antenna.yaml" --quick --set domain.averaging=on 2>&1 | grep -q "on a staircase" &&
  { echo "FAIL: warned with averaging on"; fails=$((fails + 1)); }
"$yeegap" check "$src/examples/gold_grating.yaml" --quick 2>&1 | grep -q "on a staircase" &&
  { echo "FAIL: warned about aligned boxes"; fails=$((fails + 1)); }

# A Drude film through two meeting absorbing layers: warned (docs/reliability.md row 50).
cat > "$work/corner.yaml" <<'EOF2'
scene: {version: 1, title: film through an absorber corner}
materials: {drude: {poles: {eps_inf: 1, drude: [{plasma_frequency: 9 eV, damping: 0.1 eV}]}}}
domain: {size: [200 nm, 200 nm, 200 nm], step: 10 nm, edges: {z_low: metal}, cpml: {cells: 6}}
bodies:
  - {shape: slab, material: drude, axis: z, from: -1 m, to: -1 nm}
excitation:
  - dipole: {position: [0, 0, 20 nm], direction: z, band: {from: 450 nm, to: 800 nm}}
stop: {energy_below: 1e-5}
EOF2
expect absorber_corner_warning 0 "warning +body 0 \(drude\) runs into the absorbing layers of 2 axes \(xy\)" -- "$yeegap" check "$work/corner.yaml" --quick

# Memory: a run over the --memory limit (or over what the machine has free) is refused before it
# allocates anything, exit 2, no results file; `check` prints the same as a warning; a bad size is an
# option error.
expect over_memory_limit 2 "needs about [0-9.]+ MB .*more than --memory 1 MB allows" -- \
  "$yeegap" run "$work/scene.yaml" -o "$work/too_big.h5" --memory 1MB
[ -e "$work/too_big.h5" ] && { echo "FAIL: a refused run wrote results"; fails=$((fails + 1)); }
expect check_over_memory 0 "warning .*more than --memory 1 MB allows" -- "$yeegap" check "$work/scene.yaml" --memory 1MB
expect over_machine_memory 2 "but this machine has .* free" -- \
  "$yeegap" run "$work/scene.yaml" -o "$work/too_big.h5" --set "domain.size=[40 um, 40 um, 40 um]"
expect bad_memory_size 2 "expected a size like 8GB" -- "$yeegap" run "$work/scene.yaml" --memory lots

# The energy in a box: its summary line, headline figures and JSON, and its group in the results
# file, with no code for it outside its recorder and its scene reader.
cat > "$work/energy.yaml" <<'EOF2'
scene: {version: 1, title: energy in a box}
domain: {size: [800 nm, 800 nm, 800 nm], step: 20 nm, edges: cpml}
excitation:
  - dipole: {position: [0, 0, 0], direction: z, band: {from: 500 nm, to: 900 nm}}
outputs:
  - energy: {name: inner, box: {from: [-100 nm, -100 nm, -100 nm], to: [100 nm, 100 nm, 100 nm]}}
stop: {energy_below: 1e-4}
EOF2
expect energy_summary 0 "energy inner: [0-9]+ samples, cells 15..24 x 15..24 x 15..24" -- "$yeegap" run "$work/energy.yaml" -o "$work/energy.h5"
expect energy_json 0 '"inner": \{"peak": [0-9.e+-]+, "peak_time": [0-9.e+-]+, "final": [0-9.e+-]+\}' -- \
  "$yeegap" run "$work/energy.yaml" -o "$work/energy.h5" --json
expect energy_headline 0 "^    largest total [0-9.e+-]+ J at [0-9.]+ fs; total_final [0-9.e+-]+ J$" -- \
  "$yeegap" run "$work/energy.yaml" -o "$work/energy.h5"
expect run_json_figures 0 '"figures": \{"inner.total_peak": [0-9.e+-]+, "inner.total_peak_time": [0-9.e+-]+, "inner.total_final": [0-9.e+-]+\}' -- \
  "$yeegap" run "$work/energy.yaml" -o "$work/energy.h5" --json
expect energy_group 0 '\(0\): "J"' -- h5dump -a /outputs/inner/total/units "$work/energy.h5"

echo "$pass passed, $fails failed"
[ "$fails" -eq 0 ]
