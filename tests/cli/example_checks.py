"""What the example checks in this folder share: a tally of named checks and running an example
scene with `yeegap run`, stopping with its error output when the run fails."""
import os
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
