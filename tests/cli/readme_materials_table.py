"""The README's "Materials library" table lists exactly the library's entries, in library order, with the
model, source and valid range that `yeegap materials list --json` prints for each. The table is written
by hand; this test says when it has fallen out of step with materials/library_*.cpp.

Usage: readme_materials_table.py YEEGAP_BINARY README.md
"""
import json
import subprocess
import sys


def readme_rows(path):
    lines = open(path, encoding="utf-8").read().splitlines()
    try:
        start = lines.index("## Materials library")
    except ValueError:
        sys.exit(f"{path}: no '## Materials library' section")
    header = "| name | model | source | valid range |"
    try:
        at = lines.index(header, start)
    except ValueError:
        sys.exit(f"{path}: the Materials library section has no table headed '{header}'")
    rows = []
    for number, line in enumerate(lines[at + 2:], start=at + 3):  # skip the |---| line
        if not line.startswith("|"):
            break
        cells = [c.strip() for c in line.strip().strip("|").split("|")]
        if len(cells) != 4:
            sys.exit(f"{path}:{number}: expected 4 cells, got {len(cells)}: {line}")
        cells[0] = cells[0].strip("`")
        rows.append((number, cells))
    return rows


def main():
    yeegap, readme = sys.argv[1], sys.argv[2]
    listed = json.loads(subprocess.run([yeegap, "materials", "list", "--json"], check=True,
                                       capture_output=True, text=True).stdout)
    want = [[e["name"], e["model"], e["source"], e["valid_range"]] for e in listed]
    got = readme_rows(readme)
    problems = []
    got_names = [cells[0] for _, cells in got]
    want_names = [w[0] for w in want]
    for name in want_names:
        if name not in got_names:
            problems.append(f"library entry '{name}' is missing from the README table")
    for number, cells in got:
        if cells[0] not in want_names:
            problems.append(f"README.md:{number}: '{cells[0]}' is not a library entry")
    if not problems and got_names != want_names:
        problems.append(f"README table order {got_names} differs from the library order {want_names}")
    columns = ["name", "model", "source", "valid range"]
    by_name = {w[0]: w for w in want}
    for number, cells in got:
        w = by_name.get(cells[0])
        if w is None:
            continue
        for col, (have, should) in enumerate(zip(cells, w)):
            if have != should:
                problems.append(f"README.md:{number}: {cells[0]} {columns[col]} is '{have}', "
                                f"`yeegap materials list` says '{should}'")
    for p in problems:
        print("FAIL", p)
    print(f"{len(got)} README rows, {len(want)} library entries, {len(problems)} problems")
    return 1 if problems else 0


if __name__ == "__main__":
    sys.exit(main())
