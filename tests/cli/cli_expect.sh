# What the command-line test scripts share: pass/fail counters (fails, pass) and `expect`, which
# runs a command and checks its exit code and a pattern in its output. Sourced, not run.

fails=0
pass=0
fail() { echo "FAIL $*"; fails=$((fails + 1)); }
ok() { pass=$((pass + 1)); }

# expect NAME WANT_EXIT PATTERN -- command...: exit code and a pattern in stdout+stderr.
expect() {
  local name=$1 want=$2 pattern=$3
  shift 4
  local out code
  out=$("$@" 2>&1)
  code=$?
  if [ "$code" -ne "$want" ] || ! grep -qE -- "$pattern" <<<"$out"; then
    fail "$name: exit $code (want $want), output:"; echo "$out" | head -8
  else ok; fi
}
