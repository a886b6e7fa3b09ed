#!/bin/bash
# A full disk: a run whose results (and periodic checkpoints) do not fit a small tmpfs exits with
# code 1 and says why, leaves no partial file and keeps the older results file there intact; it
# never crashes at exit (HDF5's clean-up used to segfault after a failed close: code 139).
# Needs to mount a tmpfs (root); exits 77 (skipped) where it cannot.
# Usage: cli_full_disk.sh YEEGAP_BINARY
set -u
yeegap=$1
work=$(mktemp -d)
disk="$work/disk"
mkdir -p "$disk"
if ! mount -t tmpfs -o size=256k tmpfs "$disk" 2>/dev/null; then
  echo "skipped: cannot mount a tmpfs here (needs root and a kernel that allows it)"
  rm -rf "$work"
  exit 77
fi
trap 'umount "$disk"; rm -rf "$work"' EXIT
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

# Invented numbers: a dipole in vacuum, 24^3 cells of 10 nm, and a field map of the whole domain at
# three wavelengths (about 2 MB of results: more than the disk holds).
cat > "$work/scene.yaml" <<'EOF2'
scene: {version: 1, title: full disk check}
domain: {size: [240 nm, 240 nm, 240 nm], step: 10 nm, edges: cpml, cpml: {cells: 6}}
excitation:
  - dipole: {position: [0, 0, 0], direction: z, band: {from: 500 nm, to: 900 nm}}
outputs:
  - field_map: {name: all, region: {from: [-120 nm, -120 nm, -120 nm], to: [120 nm, 120 nm, 120 nm]},
                frequencies: [500 nm, 700 nm, 900 nm]}
stop: {after: 30 fs}
EOF2
head -c 100000 /dev/urandom > "$disk/out.h5"
cp "$disk/out.h5" "$work/old.h5"

for every in off 0.02s; do
  "$yeegap" run "$work/scene.yaml" -o "$disk/out.h5" --threads 2 --checkpoint-every "$every" > "$work/log" 2>&1
  code=$?
  [ $code -eq 1 ] || fail "checkpoints $every: exit code $code, want 1: $(tail -3 "$work/log")"
  grep -q "cannot write results file" "$work/log" || fail "checkpoints $every: no message: $(tail -3 "$work/log")"
  grep -q "No space left on device" "$work/log" || fail "checkpoints $every: the cause is not named"
  cmp -s "$disk/out.h5" "$work/old.h5" || fail "checkpoints $every: the older results file was changed"
  ls "$disk" | grep -q partial && fail "checkpoints $every: a partial file was left: $(ls "$disk")"
  echo "checkpoints $every: exit $code; $(grep -c 'the run goes on' "$work/log") failed checkpoint(s) reported"
done
grep -q "the run goes on" "$work/log" || fail "a failed periodic checkpoint was not reported"

[ $failures -eq 0 ] && echo "all full-disk checks passed"
exit $((failures > 0))
