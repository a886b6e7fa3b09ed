#!/bin/bash
# `yeegap run` stopped by SIGTERM at about half-way and finished with `--resume` writes a results
# file whose every dataset and attribute equals an uninterrupted run's, bit for bit (apart from the
# run-time figures and provenance listed in docs/results_file.md, "Checkpoints"). Also: exit code 3 with a
# checkpoint and partial results after the signal; periodic checkpoints that change no result; the
# checkpoint removed once the run is done; a mismatched scene, a truncated checkpoint, a missing
# checkpoint and a bad --checkpoint-every refused with exit code 2 and a message naming the file.
# Usage: cli_resume.sh YEEGAP_BINARY PYTHON_WITH_H5PY
set -u
yeegap=$1
py=$2
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
cd "$work" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }

# Invented numbers, chosen only to be small: 26^3 cells of 4 nm, 2116 steps; a gold sphere
# (dispersive), absorbers on every face, a plane-wave box, a probe, a field map, a flux box and
# cross sections. Long enough that the setup before the time loop (about 0.25 s of CPU, when no
# signal handler is installed yet) stays well below half the run's CPU time.
cat > scene.yaml <<'EOF'
scene: {version: 1, title: resume check}
materials:
  vacuum: {index: 1}
  gold: {library: Au}
domain: {size: [104 nm, 104 nm, 104 nm], step: 4 nm, edges: cpml, cpml: {cells: 6}}
bodies:
  - {shape: sphere, material: gold, center: [0, 0, 0], radius: 6 nm}
excitation:
  - tfsf: {box: {from: [-16 nm, -16 nm, -16 nm], to: [16 nm, 16 nm, 16 nm]}, direction: z, polarization: x,
           band: {from: 400 nm, to: 1000 nm}}
outputs:
  - probe: {name: near, position: [0, 0, 8 nm], components: [Ex, Hy]}
  - field_map: {name: xz, plane: {axis: y, at: 0 nm}, frequencies: [550 nm, 700 nm], components: [Ex, Ez]}
  - flux: {name: around, box: {from: [-20 nm, -20 nm, -20 nm], to: [20 nm, 20 nm, 20 nm]}, frequencies: [550 nm, 700 nm]}
  - cross_sections: {name: sphere, frequencies: [550 nm, 700 nm]}
stop: {after: 16 fs}
EOF

# CPU time (user + system, clock ticks) a process has used so far, from /proc: unlike wall time it
# hardly depends on how busy the machine is.
cpu_ticks() { awk '{print $14 + $15}' "/proc/$1/stat" 2>/dev/null; }

# 1. The uninterrupted run, with checkpoints every 0.05 s (they must change nothing).
"$yeegap" run scene.yaml -o whole.h5 --threads 2 --checkpoint-every 0.05s 2> whole.log &
pid=$!
total=0
while kill -0 "$pid" 2>/dev/null; do
  t=$(cpu_ticks "$pid")
  [ -n "$t" ] && total=$t
  sleep 0.05
done
wait $pid
code=$?
[ $code -eq 0 ] || fail "uninterrupted run: exit code $code: $(cat whole.log)"
grep -q "checkpoint at step" whole.log || fail "no periodic checkpoint was reported in a run of $total ticks: $(cat whole.log)"
[ -e whole.checkpoint.h5 ] && fail "the checkpoint of a finished run was left behind"
echo "uninterrupted run: $total CPU ticks"

# 2. The same run, stopped by SIGTERM when it has used about half that CPU time. It checkpoints as
# often as the first, so that its CPU time per step is the same on a busy machine (where the periodic
# checkpoints take a larger share) and half the time is half the steps.
"$yeegap" run scene.yaml -o resumed.h5 --threads 2 --checkpoint-every 0.05s 2> stopped.log &
pid=$!
while kill -0 "$pid" 2>/dev/null; do
  t=$(cpu_ticks "$pid")
  if [ -n "$t" ] && [ "$t" -ge $((total / 2)) ]; then kill -TERM "$pid"; break; fi
  sleep 0.02
done
wait $pid
code=$?
[ $code -eq 3 ] || fail "stopped run: exit code $code, want 3: $(cat stopped.log)"
grep -q "stopped by SIGTERM" stopped.log || fail "no 'stopped by SIGTERM' message: $(cat stopped.log)"
[ -f resumed.checkpoint.h5 ] || fail "no checkpoint after SIGTERM"
[ -f resumed.h5 ] || fail "no partial results after SIGTERM"
ls ./*.partial 2>/dev/null && fail "a .partial file was left behind"
"$py" - resumed.h5 <<'EOF' || failures=$((failures + 1))
import sys, h5py
s = h5py.File(sys.argv[1], "r")["/summary"].attrs
print(f"partial results: {s['steps']} steps, stop reason {s['stop_reason'].decode()}")
sys.exit(0 if s["stop_reason"] == b"interrupted" and 0 < s["steps"] < 2116 else 1)
EOF

# 3. Refusals, before the real resume (each leaves the checkpoint as it was).
sed 's/radius: 6 nm/radius: 5 nm/' scene.yaml > other.yaml
cp resumed.checkpoint.h5 other.checkpoint.h5
out=$("$yeegap" run other.yaml -o other.h5 --resume 2>&1)
code=$?
[ $code -eq 2 ] || fail "resume with another scene: exit code $code, want 2: $out"
echo "$out" | grep -q "checkpoint 'other.checkpoint.h5' cannot be resumed: the scene text differs" ||
  fail "mismatch message: $out"
echo "$out" | grep -q "radius: 5 nm" || fail "mismatch message does not show the differing line: $out"

head -c $(($(stat -c %s resumed.checkpoint.h5) / 2)) resumed.checkpoint.h5 > cut.checkpoint.h5
out=$("$yeegap" run scene.yaml -o cut.h5 --resume 2>&1)
code=$?
[ $code -eq 2 ] || fail "resume from a truncated checkpoint: exit code $code, want 2: $out"
echo "$out" | grep -q "checkpoint 'cut.checkpoint.h5' cannot be resumed: it is damaged or unreadable" ||
  fail "truncation message: $out"

out=$("$yeegap" run scene.yaml -o none.h5 --resume 2>&1)
code=$?
[ $code -eq 2 ] || fail "resume without a checkpoint: exit code $code, want 2"
echo "$out" | grep -q "none.checkpoint.h5' cannot be resumed: there is no such file" || fail "missing-file message: $out"

out=$("$yeegap" run scene.yaml --checkpoint-every 10 2>&1)
code=$?
[ $code -eq 2 ] || fail "--checkpoint-every 10 (no unit): exit code $code, want 2"
echo "$out" | grep -q "expected a duration like 10min" || fail "duration message: $out"

# 4. Resume and compare with the uninterrupted run.
"$yeegap" run scene.yaml -o resumed.h5 --threads 1 --resume 2> resumed.log
code=$?
[ $code -eq 0 ] || fail "resumed run: exit code $code: $(cat resumed.log)"
grep -q "resuming from resumed.checkpoint.h5 at step" resumed.log || fail "no resume message: $(cat resumed.log)"
[ -e resumed.checkpoint.h5 ] && fail "the checkpoint of the finished run was left behind"

"$py" "$here/same_results.py" whole.h5 resumed.h5 time 500 || failures=$((failures + 1))

[ $failures -eq 0 ] && echo "all resume checks passed"
exit $((failures > 0))
