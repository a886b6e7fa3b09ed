#!/usr/bin/env bash
# `yeegap check` on the dimer example: the graded mesh found the 0.5 nm gap, put 4 cells across it,
# and has at least 50 times fewer cells than a uniform grid at the gap's step (the issue's
# done-criterion); the human output lists each axis with its smallest and largest cell.
# Usage: cli_mesh.sh YEEGAP_BINARY SOURCE_DIR
set -u
yeegap=$1
src=$2
fails=0
fail() { echo "FAIL $*"; fails=$((fails + 1)); }

json=$("$yeegap" check "$src/examples/dimer_gap_mesh.yaml" --json --quick) || { echo "FAIL: check exited with $?"; exit 1; }
num() { sed -n "s/.*\"$1\": \\([-0-9.e+]*\\).*/\\1/p" <<<"$json"; }
cells=$(num cells)
uniform=$(num uniform_cells_at_smallest)
width=$(sed -n 's/.*"width_m": \([-0-9.e+]*\).*/\1/p' <<<"$json")
across=$(sed -n 's/.*"cells_across": \([0-9]*\).*/\1/p' <<<"$json")
smallest=$(num smallest_cell_m)
[ -n "$cells" ] && [ -n "$uniform" ] && [ -n "$width" ] && [ -n "$across" ] || { echo "FAIL: keys missing in: $json"; exit 1; }
# The gap: 0.5 nm within 1e-6 relative, at least 4 cells across, smallest cell 0.125 nm.
awk -v w="$width" 'BEGIN { exit !(w > 0.5e-9 * (1 - 1e-6) && w < 0.5e-9 * (1 + 1e-6)) }' || fail "gap width $width, want 5e-10"
[ "$across" -ge 4 ] || fail "$across cells across the gap, want at least 4"
awk -v s="$smallest" 'BEGIN { exit !(s > 0.125e-9 * (1 - 1e-6) && s < 0.125e-9 * (1 + 1e-6)) }' || fail "smallest cell $smallest"
# The uniform count at the gap step, from the domain size: 340 x 260 x 260 nm / 0.125 nm.
awk -v u="$uniform" 'BEGIN { want = 2720 * 2080 * 2080; exit !(u == want) }' || fail "uniform count $uniform, want 2720*2080*2080"
awk -v c="$cells" -v u="$uniform" 'BEGIN { exit !(u / c >= 50) }' || fail "graded $cells vs uniform $uniform: less than 50x"
echo "graded cells $cells, uniform at the gap step $uniform, ratio $(awk -v c="$cells" -v u="$uniform" 'BEGIN { printf "%.0f", u / c }')"

text=$("$yeegap" check "$src/examples/dimer_gap_mesh.yaml" --quick 2>&1) || fail "human check exited with $?"
grep -qE "^  x axis +[0-9]+ cells, 0\.125 to 5 nm" <<<"$text" || fail "no x axis line: $text"
grep -qE "^  gaps? +bodies 0 and 1: 0\.5 nm" <<<"$text" || fail "no gap line: $text"
grep -qE "uniform" <<<"$text" || fail "no uniform comparison: $text"

[ "$fails" -eq 0 ]
