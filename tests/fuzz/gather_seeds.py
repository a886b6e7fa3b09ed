#!/usr/bin/env python3
"""Seeds for the fuzz targets, gathered (not committed) so they follow the tests: the examples, the
scenes, tables, meshes, values and --set lines written in the tests, tests/fuzz/seeds/<target>/ and
the past findings in tests/fuzz/regressions/<target>/;
and a libFuzzer dictionary per target, since mutated bytes rarely spell 'THz' or 'e-320'.
Usage: gather_seeds.py REPO_ROOT OUT_DIR  (writes OUT_DIR/<target>/ and OUT_DIR/<target>.dict)"""
import hashlib
import pathlib
import re
import sys

TARGETS = ("scene_reader", "overrides", "units", "nk_table", "stl")
SCENE_KEYS = re.compile(r"^(scene|domain|materials|bodies|tunnelling|excitation|outputs|stop|sweep):", re.M)
OVERRIDE = re.compile(r"^[A-Za-z_][A-Za-z0-9_.\[\]]*=\S.*$")
NUMBER_WITH_UNIT = re.compile(r"^[+-]?(\d|\.\d)[0-9.eE+-]*\s*[A-Za-z\xb5\xb7/* ]{0,8}$")
UNITS = ["nm", "um", "\xb5m", "m", "fs", "ps", "ns", "s", "eV", "meV", "THz", "GHz", "Hz", "rad/s", "S/m", "C m",
         "e nm"]
# Numbers at the edges of int and double: overflow, underflow to denormals and zero, signs, not-a-numbers.
EXTREMES = ["2147483647", "4294967296", "9223372036854775807", "e308", "e309", "e-308", "e-320", "e-330", "1e300",
            "-0", "nan", "inf", "0x1p-1074", "+", "."]
TOKENS = {
    "scene_reader": ["${", "}", "---", "...", "&a ", "*a", "!!str ", "<<: ", "? ", ": ", "- ", "[", "]", "{", "}"],
    "nk_table": ["wavelength_nm", "wavelength_um", "wavelength_m", "wavelength", "n", "k", ",", "#", "\r\n"],
    "stl": ["solid ", "facet normal ", "outer loop", "vertex ", "endloop", "endfacet", "endsolid"],
}
TOKENS["overrides"] = TOKENS["scene_reader"] + ["=", ".", "[0]", "[1000000]"]
MAX_SEED = 16384  # bytes; larger texts are left out (the fuzzers run with smaller -max_len anyway)


def cpp_literals(source):
    """The string literals of a C++ file, adjacent ones joined, escapes of ordinary ones undone."""
    out, i, pending = [], 0, None
    token = re.compile(r'R"([^(\s"\\]{0,16})\(|"|//[^\n]*|/\*.*?\*/|\'(?:\\.|[^\\\'])*\'|\s+|.', re.S)
    while i < len(source):
        m = token.match(source, i)
        text = m.group(0)
        if text.startswith('R"'):
            end = source.find(")" + m.group(1) + '"', m.end())
            if end < 0:
                break
            piece, i = source[m.end():end], end + len(m.group(1)) + 2
        elif text == '"':
            lit = re.compile(r'((?:\\.|[^"\\\n])*)"', re.S).match(source, m.end())
            if not lit:
                break
            piece, i = unescape(lit.group(1)), lit.end()
        else:
            i = m.end()
            if not text.isspace() and pending is not None:
                out.append(pending)
                pending = None
            continue
        pending = piece if pending is None else pending + piece
    if pending is not None:
        out.append(pending)
    return out


def unescape(body):
    simple = {"n": "\n", "r": "\r", "t": "\t", '"': '"', "'": "'", "\\": "\\", "0": "\0"}
    def one(m):
        e = m.group(1)
        if e.startswith("x"):
            return chr(int(e[1:], 16))
        return simple.get(e, e)
    return re.sub(r"\\(x[0-9A-Fa-f]{2}|.)", one, body)


def dict_entry(word):
    """One line of a libFuzzer dictionary: the word's UTF-8 bytes in quotes, others as \\xHH."""
    body = "".join(chr(b) if 32 <= b < 127 and b not in (34, 92) else f"\\x{b:02X}" for b in word.encode())
    return f'"{body}"\n'


def heredocs(script):
    """Bodies of here-documents in a shell script (<<EOF, <<'EOF', <<-EOF)."""
    out = []
    for m in re.finditer(r"<<-?\s*['\"]?(\w+)['\"]?[^\n]*\n(.*?)\n\s*\1\s*$", script, re.S | re.M):
        out.append(m.group(2) + "\n")
    return out


def shell_overrides(script):
    return [m.group(2) or m.group(3) for m in re.finditer(r"--set\s+(\"([^\"]+)\"|(\S+))", script)]


def yaml_values(text):
    """The plain values of a scene ("40 nm", "1e-30 C m"), the units fuzzer's seeds."""
    values = set()
    for line in text.splitlines():
        line = line.split("#", 1)[0]
        for piece in re.split(r"[,\[\]{}]|:\s", line):
            piece = piece.strip().strip("-").strip()
            if piece and NUMBER_WITH_UNIT.match(piece):
                values.add(piece)
    return values


def main():
    root, out = pathlib.Path(sys.argv[1]), pathlib.Path(sys.argv[2])
    seeds = {t: set() for t in TARGETS}
    texts = []
    for path in sorted((root / "tests").rglob("*")):
        if path.suffix in (".cpp", ".h") and "fuzz" not in path.parts:
            texts += cpp_literals(path.read_text(errors="replace"))
        elif path.suffix == ".sh":
            script = path.read_text(errors="replace")
            texts += heredocs(script)
            seeds["overrides"].update(shell_overrides(script))
    examples = [p.read_text() for p in sorted((root / "examples").glob("*.yaml"))]
    texts += examples
    for text in texts:
        stripped = text.lstrip()
        if SCENE_KEYS.search(text):
            seeds["scene_reader"].add(text)
        if "wavelength_" in text and "," in text:
            seeds["nk_table"].add(text)
        if stripped.startswith("solid") and "facet" in text:
            seeds["stl"].add(text)
        if len(text) <= 40 and NUMBER_WITH_UNIT.match(text.strip()):
            seeds["units"].add(text)
        if len(text) <= 200 and "\n" not in text and OVERRIDE.match(text):
            seeds["overrides"].add(text)
    for text in examples:
        seeds["units"].update(yaml_values(text))
    # The overrides fuzzer reads "override lines, an empty line, the scene": pair each example with
    # one override, round robin, so both the built-in scene and the examples get edited.
    overrides = sorted(o for o in seeds["overrides"] if "\n" not in o)
    for k, scene in enumerate(examples):
        if overrides:
            seeds["overrides"].add(overrides[k % len(overrides)] + "\n\n" + scene)
    keys = set()
    for text in seeds["scene_reader"]:
        keys.update(re.findall(r"([A-Za-z_][A-Za-z0-9_]*):", text))
    out.mkdir(parents=True, exist_ok=True)
    for target in TARGETS:
        words = UNITS + EXTREMES + TOKENS.get(target, [])
        if target in ("scene_reader", "overrides"):
            words += sorted(keys)
        (out / f"{target}.dict").write_text("".join(dict_entry(w) for w in words))
    for target in TARGETS:
        folder = out / target
        folder.mkdir(parents=True, exist_ok=True)
        data = [s.encode("utf-8", "surrogateescape") for s in seeds[target]]
        # Hand-made seeds, and every past finding: each run starts by replaying them.
        for kept in (root / "tests" / "fuzz" / "seeds" / target, root / "tests" / "fuzz" / "regressions" / target):
            if kept.is_dir():
                data += [p.read_bytes() for p in sorted(kept.iterdir()) if p.is_file()]
        for blob in data:
            if 0 < len(blob) <= MAX_SEED:
                (folder / hashlib.sha1(blob).hexdigest()[:16]).write_bytes(blob)
        print(f"{target}: {len(list(folder.iterdir()))} seeds in {folder}")


if __name__ == "__main__":
    main()
