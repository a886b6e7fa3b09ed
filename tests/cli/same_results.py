"""Every dataset and attribute of two results files, compared byte for byte, except the run-time
figures and provenance that docs/results_file.md ("Checkpoints") lists as differing between runs. Also
checks that the first file's run stopped for the expected reason after enough steps, so that a
comparison of two runs that stopped early cannot pass.
Usage: same_results.py REFERENCE.h5 OTHER.h5 STOP_REASON MIN_STEPS   (exit 1 on any difference)"""
import sys

import h5py
import numpy as np

DIFFER = {("/summary", "wall_seconds"), ("/summary", "cell_updates_per_second"), ("/program", "command_line"),
          ("/program", "start_time"), ("/program", "threads")}
a, b = h5py.File(sys.argv[1], "r"), h5py.File(sys.argv[2], "r")
stop_reason, min_steps = sys.argv[3].encode(), int(sys.argv[4])
problems, datasets = [], 0


def same(x, y):
    x, y = np.asarray(x), np.asarray(y)
    return x.dtype == y.dtype and x.shape == y.shape and x.tobytes() == y.tobytes()


def visit(name, obj):
    global datasets
    path = "/" + name
    other = b.get(path)
    if other is None:
        problems.append(f"{path} missing from {sys.argv[2]}")
        return
    if isinstance(obj, h5py.Dataset):
        datasets += 1
        if not same(obj[()], other[()]):
            problems.append(f"dataset {path} differs")
    for key in set(obj.attrs) | set(other.attrs):
        if (path, key) in DIFFER:
            continue
        if key not in obj.attrs or key not in other.attrs or not same(obj.attrs[key], other.attrs[key]):
            problems.append(f"attribute {path}@{key} differs")


a.visititems(visit)
for key in set(a.attrs) | set(b.attrs):
    if not same(a.attrs.get(key), b.attrs.get(key)):
        problems.append(f"root attribute {key} differs")
b.visititems(lambda name, _: None if ("/" + name) in a else problems.append(f"/{name} only in {sys.argv[2]}"))
summary = a["/summary"].attrs
if summary["stop_reason"] != stop_reason or summary["steps"] < min_steps:
    problems.append(f"the reference run stopped for {summary['stop_reason']} after {summary['steps']} steps, "
                    f"expected {stop_reason} after at least {min_steps}")
for p in problems:
    print("FAIL:", p)
print(f"{datasets} datasets compared, {len(problems)} differences")
sys.exit(1 if problems else 0)
