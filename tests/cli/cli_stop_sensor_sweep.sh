#!/bin/bash
# SIGTERM where a run does more than one run's work: during a sensor's repeated scan (the finished
# scan is checkpointed first: exit 3, partial results, and --resume gives the uninterrupted run's
# results bit for bit) and during a sweep (finished points kept, the point in progress not
# published, exit 3; the same command finishes the sweep with the uninterrupted sweep's table).
# Usage: cli_stop_sensor_sweep.sh YEEGAP_BINARY PYTHON_WITH_H5PY
set -u
yeegap=$1
py=$2
here=$(cd "$(dirname "$0")" && pwd)
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT
cd "$work" || exit 1
failures=0
fail() { echo "FAIL: $*"; failures=$((failures + 1)); }
# stop_once CONDITION PID: once CONDITION holds (at most 60 s), a little later SIGTERM to PID; returns its exit code.
stop_once() {
  for _ in $(seq 1 6000); do
    eval "$1" && break
    kill -0 "$2" 2>/dev/null || break
    sleep 0.01
  done
  sleep 0.2
  kill -TERM "$2" 2>/dev/null
  wait "$2"
}

# Invented numbers, chosen only to be small: a glass prism, 40 nm of a Drude metal and an analyte
# of index 1.0 above it, 5 nm cells; a scan of 6 angles at 633 nm, and the sensor's repeat of it.
cat > sensor.yaml <<'EOF2'
scene: {version: 1, title: sensor stop check}
materials:
  glass: {index: 1.5}
  metal: {poles: {eps_inf: 1, drude: [{plasma_frequency: 8 eV, damping: 0.1 eV}]}}
  analyte: {index: 1.0}
domain:
  size: [10 nm, 10 nm, 600 nm]
  step: 5 nm
  edges: {x: bloch, y: bloch, z: cpml}
  cpml: {cells: 20}
  background: analyte
bodies:
  - {shape: slab, material: glass, axis: z, from: -400 nm, to: -50 nm}
  - {shape: slab, material: metal, axis: z, from: -50 nm, to: -10 nm}
excitation:
  - plane_wave: {from: low, polarization: p, wavelength: 633 nm, angles: {from: 40 deg, to: 60 deg, count: 6}}
outputs:
  - sensor: {name: chip, medium: analyte, delta_n: 0.01}
stop: {after: 120 fs}
EOF2

"$yeegap" run sensor.yaml -o whole.h5 --threads 2 2> whole.log || fail "uninterrupted sensor run: $(cat whole.log)"
# Stopped once the repeat has begun (its announcement is on stderr), a little into it.
"$yeegap" run sensor.yaml -o stopped.h5 --threads 2 --checkpoint-every off 2> stopped.log &
pid=$!
stop_once 'grep -q "sensor: the scan again" stopped.log' "$pid"
code=$?
[ $code -eq 3 ] || fail "sensor: stopped run: exit code $code, want 3: $(cat stopped.log)"
grep -q "during the sensor's repeats" stopped.log || fail "sensor: no message about the repeats: $(cat stopped.log)"
[ -f stopped.checkpoint.h5 ] || fail "sensor: no checkpoint of the finished scan"
"$py" - stopped.h5 <<'EOF2' || fail "sensor: partial results"
import sys, h5py
f = h5py.File(sys.argv[1], "r")
s = f["/summary"].attrs
assert s["stop_reason"] == b"interrupted", s["stop_reason"]
print(f"partial results: {s['steps']} steps, groups {sorted(f.keys())}")
EOF2
"$yeegap" run sensor.yaml -o stopped.h5 --threads 1 --resume 2> resumed.log || fail "sensor: resume: $(cat resumed.log)"
[ -e stopped.checkpoint.h5 ] && fail "sensor: the checkpoint of the finished run was left behind"
"$py" "$here/same_results.py" whole.h5 stopped.h5 "angle scan (6 runs) and its repeat with analyte raised by 0.01 (sensor)" 10000 ||
  fail "sensor: resumed results differ from the uninterrupted run's"

# A sweep of three points (the metal's thickness); stopped during the second point.
sed 's/from: -50 nm, to: -10 nm/from: ${bottom}, to: -10 nm/; /^outputs:/,/sensor:/d' sensor.yaml > sweep.yaml
printf 'outputs:\n  - flux: {name: behind, plane: {axis: z, at: 100 nm}, frequencies: [633 nm]}\nsweep:\n  bottom: [-50 nm, -45 nm, -40 nm]\n' >> sweep.yaml
sed -i 's/angles: {from: 40 deg, to: 60 deg, count: 6}/angle: 45 deg/' sweep.yaml
"$yeegap" sweep sweep.yaml -o whole_sweep --threads 2 2> whole_sweep.log || fail "uninterrupted sweep: $(cat whole_sweep.log)"
"$yeegap" sweep sweep.yaml -o stopped_sweep --threads 2 2> stopped_sweep.log &
pid=$!
stop_once '[ -e stopped_sweep/point_0000.h5 ]' "$pid"
code=$?
[ $code -eq 3 ] || fail "sweep: stopped run: exit code $code, want 3: $(cat stopped_sweep.log)"
grep -q "sweep stopped by SIGTERM" stopped_sweep.log || fail "sweep: no stop message: $(cat stopped_sweep.log)"
[ -e stopped_sweep/point_0000.h5 ] || fail "sweep: the finished point was not kept"
ls stopped_sweep | grep -q "incomplete" && fail "sweep: a point in progress was left half-written"
"$yeegap" sweep sweep.yaml -o stopped_sweep --threads 2 2> resumed_sweep.log || fail "sweep: re-run: $(cat resumed_sweep.log)"
grep -Eq "[1-2] already finished" resumed_sweep.log || fail "sweep: the re-run did not skip the finished points: $(cat resumed_sweep.log)"
"$py" - whole_sweep/sweep.h5 stopped_sweep/sweep.h5 <<'EOF2' || fail "sweep: tables differ"
import sys, h5py, numpy as np
a, b = h5py.File(sys.argv[1], "r"), h5py.File(sys.argv[2], "r")
names = sorted(a["figures"].keys())
assert names and names == sorted(b["figures"].keys()), names
for n in names:
    assert np.array_equal(a["figures/" + n][()], b["figures/" + n][()]), n
print(f"tables equal: {len(names)} figures")
EOF2

[ $failures -eq 0 ] && echo "all stop checks passed"
exit $((failures > 0))
