#!/usr/bin/env bash
# `yeegap tunnelling`: the JSON rows carry the documented keys, gamma_g rises with the gap width for every
# barrier, tables go to stdout and notes to stderr, and user errors exit with code 2; the verb's old
# name `gap` is refused with the new one named.
# Usage: cli_tunnelling.sh YEEGAP_BINARY
set -u
yeegap=$1
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
source "$(dirname "$0")/cli_expect.sh"  # fails, pass, fail, ok, expect

keys="gap_nm transmission_fermi conductance_per_area_S_m2 sigma0_S_m gamma_g_eV eps_re eps_im"

# check_json NAME WANT_ROWS -- command...: every row has every key; gamma_g_eV strictly increases;
# eps_im is never negative (a passive medium, exp(-i omega t)).
check_json() {
  local name=$1 want_rows=$2
  shift 3
  "$@" >"$work/out.json" 2>"$work/err.txt"
  local code=$?
  if [ "$code" -ne 0 ]; then fail "$name: exit code $code"; head -3 "$work/err.txt"; return; fi
  local rows
  rows=$(grep -c '^  {' "$work/out.json")
  [ "$rows" -eq "$want_rows" ] || { fail "$name: $rows rows, want $want_rows"; return; }
  head -1 "$work/out.json" | grep -qx '\[' || { fail "$name: output does not open a JSON array"; return; }
  tail -1 "$work/out.json" | grep -qx '\]' || { fail "$name: output does not close the JSON array"; return; }
  for k in $keys; do
    [ "$(grep -c "\"$k\": " "$work/out.json")" -eq "$rows" ] || { fail "$name: key $k missing from some rows"; return; }
  done
  if ! awk -F'"gamma_g_eV": ' '/^  \{/ { split($2, a, ","); g = a[1] + 0;
         if (NR > 2 && !(g > prev)) { print "gamma_g_eV " g " after " prev; bad = 1 } prev = g }
         END { exit bad }' "$work/out.json"; then
    fail "$name: gamma_g_eV is not strictly increasing"; return
  fi
  if grep -qE '"eps_im": -' "$work/out.json"; then fail "$name: negative eps_im"; return; fi
  ok
}

# 0.1 to 1.2 nm in 0.05 nm steps: 23 rows, both ends included.
check_json default_rectangular 23 -- "$yeegap" tunnelling --json
check_json image_barrier 11 -- "$yeegap" tunnelling --barrier image --from 0nm --to 1nm --step 0.1nm --json
check_json fit_in_wavelength 9 -- "$yeegap" tunnelling --metal Ag --barrier fit --from 0.2nm --to 1nm --step 0.1nm --at 700nm --json

# The human table: header and rows on stdout, the model notes on stderr.
"$yeegap" tunnelling --from 0.3nm --to 0.5nm --step 0.1nm >"$work/table.txt" 2>"$work/notes.txt"
code=$?
if [ "$code" -ne 0 ]; then fail "table: exit code $code"
elif grep -q '^gap_nm' "$work/table.txt" && [ "$(wc -l <"$work/table.txt")" -eq 4 ] &&
     grep -q 'cut-off' "$work/notes.txt" && ! grep -q 'cut-off' "$work/table.txt"; then ok
else fail "table: header/rows not on stdout or notes not on stderr"; cat "$work/table.txt"; fi

expect unknown_metal 2 "unknown metal 'Au-jelly'.*did you mean 'Au-jellium'" -- "$yeegap" tunnelling --metal Au-jelly
expect unknown_barrier 2 "did you mean 'image_rounded'" -- "$yeegap" tunnelling --barrier image_round
check_json scene_barrier_word 9 -- "$yeegap" tunnelling --metal Ag --barrier exponential_fit --from 0.2nm --to 1nm --step 0.1nm --at 700nm --json
expect reversed_range 2 "below --from" -- "$yeegap" tunnelling --from 1nm --to 0.5nm
expect zero_step 2 "--step: must be positive" -- "$yeegap" tunnelling --step 0nm
expect negative_gap 2 "cannot be negative" -- "$yeegap" tunnelling --from -0.1nm
expect bare_photon_energy 2 "--at: expected a photon energy" -- "$yeegap" tunnelling --at 1.8
expect wrong_unit 2 "'fs' is not a spectral unit" -- "$yeegap" tunnelling --at 3fs
expect too_many_rows 2 "check the units" -- "$yeegap" tunnelling --step 1e-6nm

# A paper's numbers in place of the preset's, and the short-gap join moved or turned off.
check_json given_numbers 5 -- "$yeegap" tunnelling --fermi-energy 5.53eV --work-function 5.1eV --plasma-frequency 9eV \
  --damping 0.07eV --from 0.3nm --to 0.7nm --step 0.1nm --json
expect given_numbers_named 0 "given instead: W 5.1 eV, E_F 5.53 eV, hbar omega_p 9 eV" -- \
  "$yeegap" tunnelling --fermi-energy 5.53eV --work-function 5.1eV --plasma-frequency 9eV --from 0.3nm --to 0.4nm
expect join_explained 0 "short-gap join: below l' = " -- "$yeegap" tunnelling --from 0.3nm --to 0.4nm
expect join_off 0 "no short-gap join" -- "$yeegap" tunnelling --join none --from 0.3nm --to 0.4nm
check_json join_moved 5 -- "$yeegap" tunnelling --join 0.001 --from 0.3nm --to 0.7nm --step 0.1nm --json
expect join_range 2 "--join: expected a transmission" -- "$yeegap" tunnelling --join 2
expect join_with_fit 2 "has no join" -- "$yeegap" tunnelling --barrier fit --join none
expect energy_unit 2 "--fermi-energy: expected a positive energy in eV" -- "$yeegap" tunnelling --fermi-energy 5.53nm

# The old verb: recognised, refused with exit code 2 and the new verb named, with or without options,
# and not listed in the program's help.
old_verb="yeegap: the verb 'gap' is now 'tunnelling' \\(same options\\): yeegap tunnelling \\.\\.\\."
expect old_verb 2 "^$old_verb\$" -- "$yeegap" gap
expect old_verb_with_options 2 "^$old_verb\$" -- "$yeegap" gap --metal Au --from 0.3nm --json
expect old_verb_help 2 "^$old_verb\$" -- "$yeegap" gap --help
"$yeegap" --help >"$work/help.txt" 2>&1
if grep -qE '^ +tunnelling ' "$work/help.txt" && ! grep -qE '^ +gap ' "$work/help.txt"; then ok
else fail "help: want 'tunnelling' listed and 'gap' not"; cat "$work/help.txt"; fi

echo "$pass passed, $fails failed"
[ "$fails" -eq 0 ]
