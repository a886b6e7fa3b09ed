#!/usr/bin/env bash
# Every scene the fuzzers found breaking a reader (tests/fuzz/regressions/) is now refused: exit 2,
# a message naming the file, within 20 s (one used to hang with memory growing without bound).
# Usage: cli_fuzz_regressions.sh YEEGAP_BINARY SOURCE_DIR
set -u
yeegap=$1
dir=$2/tests/fuzz/regressions/scene_reader
fails=0 pass=0
cd "$dir" || exit 1
for f in *.yaml; do
  out=$(timeout 20 "$yeegap" check "$f" --quick 2>&1)
  code=$?
  if [ "$code" -eq 2 ] && grep -q "\.\(yaml\|csv\|stl\)" <<<"$out"; then
    pass=$((pass + 1))
  else
    echo "FAIL $f: exit $code (want 2): $(head -2 <<<"$out")"
    fails=$((fails + 1))
  fi
done
echo "$pass passed, $fails failed"
[ "$fails" -eq 0 ] && [ "$pass" -ge 7 ]
