#!/usr/bin/env bash
# The checked build, for CI and before a release: one clang build with AddressSanitizer + UBSan
# (YEEGAP_SANITIZE) and the libFuzzer targets (YEEGAP_FUZZ). Runs the unit tests under the sanitizers,
# then every fuzz target for a bounded time; exits non-zero on any failure or finding (docs/fuzzing.md).
# Usage: bash tools/sanitize.sh [BUILD_DIR]        (default: build-sanitize in the repository)
#   YEEGAP_FUZZ_SECONDS  seconds per fuzz target (default 12; 0 skips fuzzing)
#   YEEGAP_JOBS          build and test jobs (default 2)
#   YEEGAP_SKIP_TESTS=1  build only the fuzz targets, then fuzz (what CI runs: a few minutes)
#   YEEGAP_FUZZ_SEED     libFuzzer's -seed (default: random; CI fixes it so a run can be repeated)
#   YEEGAP_SANITIZE_ALL=1  also the unit tests tools/sanitize_slow_tests.txt leaves out (about 13 min more)
set -euo pipefail
root=$(cd "$(dirname "$0")/.." && pwd)
build=$(realpath -m "${1:-$root/build-sanitize}")
seconds=${YEEGAP_FUZZ_SECONDS:-12}
jobs=${YEEGAP_JOBS:-2}
if ! command -v clang++ >/dev/null; then
  echo "sanitize.sh: clang++ not found (bash tools/setup.sh --sanitizers)" >&2
  exit 1
fi

# Every report stops the program with a symbolised stack; leaks and static initialisation order count.
export ASAN_OPTIONS=${ASAN_OPTIONS:-detect_leaks=1:check_initialization_order=1:strict_init_order=1}
export UBSAN_OPTIONS=${UBSAN_OPTIONS:-print_stacktrace=1:halt_on_error=1}

# -O2 keeps the tests fast under the sanitizers; line tables give file:line in reports at less build
# time than full -g. No -DNDEBUG, so YG_ASSERT and Eigen's index checks are on as well.
cmake -S "$root" -B "$build" -DCMAKE_BUILD_TYPE=RelWithDebInfo \
  -DCMAKE_CXX_FLAGS_RELWITHDEBINFO="-O2 -gline-tables-only" -DCMAKE_C_COMPILER=clang -DCMAKE_CXX_COMPILER=clang++ \
  -DYEEGAP_SANITIZE=ON -DYEEGAP_FUZZ=ON >/dev/null

# Only what runs below: the program (the cli.* tests call it), the unit test programs and the fuzzers.
# Test programs are test_<folder>_<file stem> (tests/CMakeLists.txt); the list comes from the
# configured build, not from the files, so a test file added or removed meanwhile cannot break it.
targets=(yeegap_fuzzers)
if [ "${YEEGAP_SKIP_TESTS:-0}" != 1 ]; then
  targets+=(yeegap)
  while IFS= read -r t; do
    case "$t" in *_validation_test | *_slow_test | *_mpi_test) ;; *) targets+=("$t") ;; esac
  done < <(cmake --build "$build" --target help | grep -oE '\btest_[A-Za-z0-9_]+_test\b' | sort -u)
fi
cmake --build "$build" -j "$jobs" --target "${targets[@]}"
echo "sanitize.sh: configured and built in $SECONDS s" >&2

failed=0
if [ "${YEEGAP_SKIP_TESTS:-0}" != 1 ]; then
  skip=()
  if [ "${YEEGAP_SANITIZE_ALL:-0}" != 1 ]; then
    names=$(grep -v '^ *#' "$root/tools/sanitize_slow_tests.txt" | grep . | sed 's/[.]/\\./g' | paste -sd'|')
    skip=(-E "^($names)\$")
  fi
  start=$SECONDS
  ctest --test-dir "$build" -L unit -LE "slow|validation" "${skip[@]}" -j "$jobs" --output-on-failure || failed=1
  echo "sanitize.sh: unit tests in $((SECONDS - start)) s" >&2
fi

# Each target: its working corpus first (new inputs go there and stay for the next run), then the
# seeds; findings go to fuzz/findings/<target>/. -max_len keeps an input quick to read.
if [ "$seconds" -gt 0 ]; then
  python3 "$root/tests/fuzz/gather_seeds.py" "$root" "$build/fuzz/seeds" >/dev/null
  declare -A max_len=([scene_reader]=8192 [overrides]=8192 [units]=64 [nk_table]=2048 [stl]=4096)
  for exe in "$build"/tests/fuzz/fuzz_*; do
    name=${exe##*/fuzz_}
    seeds="$build/fuzz/seeds/$name" corpus="$build/fuzz/corpus/$name" findings="$build/fuzz/findings/$name"
    mkdir -p "$seeds" "$corpus" "$findings"
    options=(-max_total_time="$seconds" -timeout=10 -rss_limit_mb=2048 -max_len="${max_len[$name]:-4096}"
             -print_final_stats=1 -artifact_prefix="$findings/")
    if [ -f "$seeds.dict" ]; then options+=(-dict="$seeds.dict"); fi
    if [ -n "${YEEGAP_FUZZ_SEED:-}" ]; then options+=(-seed="$YEEGAP_FUZZ_SEED"); fi
    echo "sanitize.sh: fuzzing $name for $seconds s" >&2
    if ! "$exe" "${options[@]}" "$corpus" "$seeds" >"$build/fuzz/$name.log" 2>&1; then
      failed=1
      echo "sanitize.sh: FINDING in $name (log: $build/fuzz/$name.log):" >&2
      grep -E "fuzz finding|internal error|Assertion|ERROR:|SUMMARY:|runtime error|Test unit written" \
        "$build/fuzz/$name.log" >&2 || true
    fi
  done
fi
echo "sanitize.sh: $([ "$failed" = 0 ] && echo passed || echo FAILED) after $SECONDS s" >&2
exit "$failed"
