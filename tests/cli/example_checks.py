"""What the example checks in this folder share: a tally of named checks, running an example scene
with `yeegap run` (stopping with its error output when the run fails), and reading a figure the
documentation prints to compare it with a run."""
import os
import re
import subprocess
import sys


class Checks:
    """Prints each check as `ok` or `FAIL` and counts the failures."""

    def __init__(self):
        self.passed = 0
        self.failed = 0

    def __call__(self, ok, what):
        print(("ok   " if ok else "FAIL ") + what)
        if ok:
            self.passed += 1
        else:
            self.failed += 1

    def finish(self):
        """Prints the tally and exits with 1 if any check failed."""
        print(f"{self.passed} passed, {self.failed} failed")
        sys.exit(1 if self.failed else 0)


def run_example(yeegap, src, scene, out, *args, overrides=()):
    """`yeegap run examples/SCENE -o OUT ARGS` with each override as `--set`; the finished process."""
    cmd = [yeegap, "run", os.path.join(src, "examples", scene), "-o", out, *args]
    for s in overrides:
        cmd += ["--set", s]
    done = subprocess.run(cmd, capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"run failed ({done.returncode}):\n{done.stderr}")
    return done


def printed(src, path, pattern):
    """The numbers a regular expression finds in a documentation file, as text (to keep the digits).
    Line breaks and runs of spaces in the file count as one space, as they do in the rendered text."""
    with open(os.path.join(src, path), encoding="utf-8") as f:
        m = re.search(pattern, " ".join(f.read().split()))
    if not m:
        sys.exit(f"{path}: the text no longer matches /{pattern}/; update this check with the text")
    return m.groups()


def agrees(checks, text, value, what, where, unit=None):
    """The run's value rounds to the printed one: within half a unit of its last digit, or of `unit`
    for a figure printed rounded ("about 1770": unit 10)."""
    digits = len(text.split(".")[1]) if "." in text else 0
    step = unit if unit is not None else 10 ** -digits
    ok = abs(float(text) - value) <= 0.5 * step + 1e-12
    checks(ok, f"{where}: {what} printed {text}, run gives {value:.{digits + 2}f}")
