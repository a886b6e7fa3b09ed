#!/bin/bash
# Checkpoints of Bloch runs through `yeegap run`: a broadband plane wave at 20 deg on a film stack
# (complex fields, the incident problem beside it) and an angle scan of 8 angles, each stopped by
# SIGTERM at about half-way and finished with --resume, end with results equal to an
# uninterrupted run's bit for bit (same_results.py). The scan keeps whole angles: the stopped run
# leaves some angles finished (kept, in its partial results and checkpoint) and the rest for the
# resume. Periodic checkpoints during the uninterrupted runs change nothing.
# Usage: cli_resume_bloch.sh YEEGAP_BINARY PYTHON_WITH_H5PY
set -u
yeegap=$1
py=$2
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
cd "$work" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

# Invented numbers, chosen only to be small: a 1D stack (glass prism, 40 nm of a Drude metal,
# vacuum) of 120 cells of 5 nm; the scene reduces it to one lateral cell.
stack='scene: {version: 1, title: Bloch resume check}
materials:
  glass: {index: 1.5}
  metal: {poles: {eps_inf: 1, drude: [{plasma_frequency: 8 eV, damping: 0.1 eV}]}}
domain:
  size: [10 nm, 10 nm, 600 nm]
  step: 5 nm
  edges: {x: bloch, y: bloch, z: cpml}
  cpml: {cells: 20}
bodies:
  - {shape: slab, material: glass, axis: z, from: -400 nm, to: -50 nm}
  - {shape: slab, material: metal, axis: z, from: -50 nm, to: -10 nm}'
cat > band.yaml <<EOF2
$stack
excitation:
  - plane_wave: {from: low, polarization: p, angle: 20 deg, band: {from: 500 nm, to: 800 nm},
                 frequencies: {from: 520 nm, to: 780 nm, count: 5}}
outputs:
  - flux: {name: behind, plane: {axis: z, at: 100 nm}, frequencies: [550 nm, 700 nm]}
  - probe: {name: film, position: [0, 0, -30 nm], components: [Ex, Ez]}
stop: {after: 400 fs}
EOF2
cat > scan.yaml <<EOF2
$stack
excitation:
  - plane_wave: {from: low, polarization: p, wavelength: 633 nm, angles: {from: 30 deg, to: 60 deg, count: 8}}
stop: {after: 120 fs}
EOF2

cpu_ticks() { awk '{print $14 + $15}' "/proc/$1/stat" 2>/dev/null; }

# check NAME STOP_REASON MIN_STEPS: uninterrupted run (periodic checkpoints), SIGTERM at half its
# CPU time, resume, compare.
check() {
  local name=$1 reason=$2 min_steps=$3
  "$yeegap" run "$name.yaml" -o "$name.whole.h5" --threads 2 --checkpoint-every 0.05s 2> "$name.whole.log" &
  local pid=$! total=0 t code
  while kill -0 "$pid" 2>/dev/null; do
    t=$(cpu_ticks "$pid")
    [ -n "$t" ] && total=$t
    sleep 0.02
  done
  wait $pid
  code=$?
  [ $code -eq 0 ] || fail "$name: uninterrupted run: exit code $code: $(cat "$name.whole.log")"
  grep -q "checkpoint at" "$name.whole.log" || fail "$name: no periodic checkpoint in a run of $total ticks"
  [ -e "$name.whole.checkpoint.h5" ] && fail "$name: the checkpoint of a finished run was left behind"
  echo "$name: uninterrupted run: $total CPU ticks"

  # As often checkpointed as the first run, so half its CPU time is half its steps on a busy machine.
  "$yeegap" run "$name.yaml" -o "$name.h5" --threads 2 --checkpoint-every 0.05s 2> "$name.stopped.log" &
  pid=$!
  while kill -0 "$pid" 2>/dev/null; do
    t=$(cpu_ticks "$pid")
    if [ -n "$t" ] && [ "$t" -ge $((total / 2)) ]; then kill -TERM "$pid"; break; fi
    sleep 0.01
  done
  wait $pid
  code=$?
  [ $code -eq 3 ] || fail "$name: stopped run: exit code $code, want 3: $(cat "$name.stopped.log")"
  grep -q "stopped by SIGTERM" "$name.stopped.log" || fail "$name: no 'stopped by SIGTERM': $(cat "$name.stopped.log")"
  [ -f "$name.checkpoint.h5" ] || fail "$name: no checkpoint after SIGTERM"
  "$py" - "$name.h5" <<'EOF2' || fail "$name: partial results"
import sys, h5py
s = h5py.File(sys.argv[1], "r")["/summary"].attrs
print(f"partial results: {s['steps']} steps, stop reason {s['stop_reason'].decode()}")
sys.exit(0 if s["stop_reason"] == b"interrupted" else 1)
EOF2

  "$yeegap" run "$name.yaml" -o "$name.h5" --threads 1 --resume 2> "$name.resumed.log"
  code=$?
  [ $code -eq 0 ] || fail "$name: resumed run: exit code $code: $(cat "$name.resumed.log")"
  grep "resuming from" "$name.resumed.log"
  [ -e "$name.checkpoint.h5" ] && fail "$name: the checkpoint of the finished run was left behind"
  "$py" "$here/same_results.py" "$name.whole.h5" "$name.h5" "$reason" "$min_steps" || fail "$name: results differ"
}

check band time 20000
# What the stopped scan kept is in the resume message: some angles finished, not all.
check scan "angle scan (8 runs)" 40000
grep -Eq "resuming from scan.checkpoint.h5 at [1-7] of 8 angles finished" scan.resumed.log ||
  fail "scan: the stopped run should have kept some but not all angles: $(cat scan.resumed.log)"
grep -q "resuming from band.checkpoint.h5 at step [1-9]" band.resumed.log || fail "band: resume message"

[ $failures -eq 0 ] && echo "all Bloch resume checks passed"
exit $((failures > 0))
