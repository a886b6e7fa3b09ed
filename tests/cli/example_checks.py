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


_NUMBER = re.compile(r"[+-]?[0-9]+(\.[0-9]+)?([eE][+-]?[0-9]+)?")


def _last_digit_unit(text):
    mantissa, _, exponent = text.lower().partition("e")
    decimals = len(mantissa.split(".")[1]) if "." in mantissa else 0
    return 10.0 ** ((int(exponent) if exponent else 0) - decimals)


def quoted_figure(checks, src, page, name, text):
    """A figure a page quotes as `<!-- measured: NAME by FILE -->TEXT<!-- /measured -->` against the
    run's TEXT: the words must match and each number lie within one unit of its last printed digit
    (tests/support/table_agreement.h does the same for the C++ tests). With YEEGAP_WRITE_MEASURED
    set the run's text is written into the page instead."""
    path = os.path.join(src, page)
    with open(path, encoding="utf-8") as f:
        content = f.read()
    m = re.search(r"<!-- measured: " + re.escape(name) + r" [^>]*-->(.*?)<!-- /measured -->", content)
    if not m:
        checks(False, f"{page} quotes no figure '{name}'")
        return
    if os.environ.get("YEEGAP_WRITE_MEASURED", "0") not in ("", "0"):
        with open(path, "w", encoding="utf-8") as f:
            f.write(content[:m.start(1)] + text + content[m.end(1):])
        print(f"wrote figure '{name}' into {page}")
        return
    quoted = m.group(1)
    same_words = _NUMBER.sub("#", quoted) == _NUMBER.sub("#", text)
    pairs = list(zip([x.group(0) for x in _NUMBER.finditer(quoted)], [x.group(0) for x in _NUMBER.finditer(text)]))
    close = all(abs(float(a) - float(b)) <= 1.000001 * _last_digit_unit(a) for a, b in pairs)
    checks(same_words and close, f"{page}, figure '{name}': quoted '{quoted}', run gives '{text}'")
