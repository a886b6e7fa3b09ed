#!/usr/bin/env bash
# The measured tables of docs/: each sits between "<!-- measured: NAME by tests/<folder>/<stem>.cpp -->"
# and "<!-- end measured -->", and the named test fails when its run and the page disagree.
#   measured_tables.sh list                    every table and the test that makes it
#   measured_tables.sh check-markers           each marker names a test file that writes that table
#   measured_tables.sh write BUILD_DIR [NAME]  rerun the tests (each once) and write what they measured
#                                              into the pages; the slow ones take hours together
set -euo pipefail
root="$(cd "$(dirname "$0")/../.." && pwd)"

markers() {  # page name test, one line each
  grep -o '<!-- measured: [A-Za-z0-9_]* by [^ ]* -->' "$root"/docs/*.md "$root"/README.md "$root"/examples/README.md \
    2>/dev/null | sed -E 's#^'"$root"'/([^:]*):<!-- measured: ([^ ]*) by ([^ ]*) -->#\1 \2 \3#'
}

case "${1:-}" in
  list)
    markers ;;
  check-markers)
    status=0
    while read -r page name test; do
      if [[ ! -f "$root/$test" ]]; then
        echo "$page: table '$name' names $test, which does not exist"; status=1
      elif ! grep -q "\"$name\"" "$root/$test"; then
        echo "$page: table '$name' is not written by $test"; status=1
      fi
      if [[ $(grep -c "<!-- measured: $name " "$root/$page") != 1 ]]; then
        echo "$page: table '$name' is not quoted exactly once"; status=1
      fi
    done < <(markers)
    [[ $(markers | wc -l) -gt 0 ]] || { echo "no measured tables found"; status=1; }
    exit $status ;;
  write)
    build="${2:?write needs the build directory}"
    only="${3:-}"
    markers | while read -r page name test; do
      [[ -z "$only" || "$only" == "$name" ]] && echo "$test"
    done | awk '!seen[$0]++' | while read -r test; do
      echo "== $test"
      if [[ "$test" == *.py ]]; then
        YEEGAP_WRITE_MEASURED=1 /usr/bin/python3 "$root/$test" "$build/tools/yeegap" "$root" | grep -E "^wrote|FAIL" || true
        continue
      fi
      rel="${test#tests/}"; folder="${rel%%/*}"; stem="$(basename "$rel" .cpp)"
      program="$build/tests/test_${folder}_${stem}"
      [[ -x "$program" ]] || { echo "build $program first (cmake --build $build --target test_${folder}_${stem})"; exit 1; }
      YEEGAP_WRITE_MEASURED=1 "$program" --gtest_brief=1 | grep -E "^wrote|FAILED" || true
    done ;;
  *)
    sed -n '2,6p' "$0"; exit 2 ;;
esac
