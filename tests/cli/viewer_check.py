#!/usr/bin/python3
"""ParaView reads what `yeegap view` writes: a small results file on a graded grid (made here with
h5py in the layout of docs/results_file.md: a material map, a plane field map at two wavelengths and a
volume field map) gets its sidecar from `yeegap view --no-plots`, and ParaView's own XDMF 3 readers
(Xdmf3ReaderT, which keeps grid names, and Xdmf3ReaderS, which ParaView picks by default) open it.
Checked against h5py: the graded node coordinates, the cell-centred material map, and every
node-centred array of every grid, value for value.
Skips (exit code 77) when ParaView's Python modules are absent (`bash tools/setup.sh --viewer`).
Usage: viewer_check.py YEEGAP_BINARY"""
import os
import subprocess
import sys
import tempfile

SKIP = 77
try:
    from paraview import simple
    from vtkmodules.util.numpy_support import vtk_to_numpy
except ImportError as e:
    print(f"SKIP: ParaView's Python modules are not installed ({e}); bash tools/setup.sh --viewer")
    sys.exit(SKIP)
import h5py
import numpy as np

yeegap = sys.argv[1]
failures = []
passes = 0


def check(ok, message):
    global passes
    if ok:
        passes += 1
    else:
        failures.append(message)
        print("FAIL", message)


# ---- a synthetic results file (invented numbers: only their round trip matters) ----

X = np.array([0.0, 2.0, 3.0, 3.5, 3.75, 4.0, 6.0]) * 1e-9    # graded along x
Y = np.array([0.0, 1.0, 2.0, 3.0, 4.0]) * 1e-9
Z = np.array([0.0, 1.0, 1.5, 2.5]) * 1e-9                    # graded along z
WAVELENGTHS_NM = np.array([500.0, 650.0])
MAPS = {"xz_plane": (X, Y[2:3], Z), "volume": (X[1:5], Y[1:4], Z)}


def fixed(strings):
    """Fixed-length ASCII strings, as docs/results_file.md says every string is stored."""
    return np.array([s.encode() for s in strings])


def write_results(path):
    rng = np.random.default_rng(7)
    omega = 2 * np.pi * 299792458.0 / (WAVELENGTHS_NM * 1e-9)
    with h5py.File(path, "w") as f:
        f.attrs["format"] = np.bytes_("yeegap-results")
        f.attrs["format_version"] = np.int32(1)
        for axis, values in zip("xyz", (X, Y, Z)):
            f[f"grid/{axis}"] = values
        f["materials/names"] = fixed(["vacuum", "gold", "glass"])
        f["materials/map"] = rng.integers(0, 3, size=(len(Z) - 1, len(Y) - 1, len(X) - 1), dtype=np.uint8)
        for name, (mx, my, mz) in MAPS.items():
            g = f.create_group(f"outputs/{name}")
            g.attrs["kind"] = np.bytes_("field_map")
            g.attrs["components"] = fixed(["Ex", "Ez"])
            g["x"], g["y"], g["z"] = mx, my, mz
            g["omega"], g["wavelength_nm"] = omega, WAVELENGTHS_NM
            shape = (len(WAVELENGTHS_NM), len(mz), len(my), len(mx))
            e2 = np.zeros(shape)
            for c in ("Ex", "Ez"):
                re, im = rng.normal(size=shape), rng.normal(size=shape)
                g[c + "_re"], g[c + "_im"] = re, im
                e2 += re**2 + im**2
            g["E_squared"] = e2
        probe = f.create_group("outputs/probe_a")  # not a field map: no grid of its own
        probe.attrs["kind"] = np.bytes_("probe")
        probe["time"] = np.arange(3.0)


# ---- reading with ParaView ----

def blocks(data):
    """[(name, dataset)] of a multiblock output, descending into multipiece blocks."""
    out = []
    if data.IsA("vtkMultiBlockDataSet"):
        for i in range(data.GetNumberOfBlocks()):
            meta = data.GetMetaData(i) if data.HasMetaData(i) else None
            name = meta.Get(data.NAME()) if meta is not None else None
            child = data.GetBlock(i)
            if child is not None and child.IsA("vtkMultiPieceDataSet"):
                out += [(name, child.GetPiece(j)) for j in range(child.GetNumberOfPieces())]
            elif child is not None and child.IsA("vtkMultiBlockDataSet"):
                out += blocks(child)
            else:
                out.append((name, child))
    elif data.IsA("vtkMultiPieceDataSet"):
        out += [(None, data.GetPiece(j)) for j in range(data.GetNumberOfPieces())]
    else:
        out.append((None, data))
    return out


def read_with(reader_name, xmf):
    reader = getattr(simple, reader_name)(FileName=[xmf])  # an absolute path (platform.md pitfall)
    reader.UpdatePipeline()
    # The client-side object, not servermanager.Fetch(), which garbles rectilinear coordinates.
    return blocks(reader.GetClientSideObject().GetOutputDataObject(0))


def point_array(grid, name):
    a = grid.GetPointData().GetArray(name)
    return None if a is None else vtk_to_numpy(a)


def check_mesh(label, grid, xyz):
    check(grid is not None and grid.IsA("vtkRectilinearGrid"), f"{label}: not a rectilinear grid")
    if grid is None:
        return
    check(grid.GetDimensions() == tuple(len(c) for c in xyz),
          f"{label}: dimensions {grid.GetDimensions()}, want {[len(c) for c in xyz]}")
    for axis, coords, got in zip("xyz", xyz, (grid.GetXCoordinates(), grid.GetYCoordinates(),
                                              grid.GetZCoordinates())):
        check(np.array_equal(vtk_to_numpy(got), coords), f"{label}: {axis} coordinates differ from the file")


def check_materials(label, grid, f):
    check_mesh(label, grid, (X, Y, Z))
    got = grid.GetCellData().GetArray("material")
    want = f["materials/map"][...].ravel()  # (nz, ny, nx) in C order = VTK's x-fastest cell order
    check(got is not None and np.array_equal(vtk_to_numpy(got), want), f"{label}: cell data 'material' differs")


def check_field_map(label, grid, f, name, q):
    check_mesh(label, grid, MAPS[name])
    for array in ("Ex_re", "Ex_im", "Ez_re", "Ez_im", "E_squared"):
        got = point_array(grid, array)
        want = f[f"outputs/{name}/{array}"][q].ravel()
        check(got is not None and np.array_equal(got, want), f"{label}: node data '{array}' differs from the file")


with tempfile.TemporaryDirectory() as work:
    results = os.path.join(work, "graded.h5")
    write_results(results)
    done = subprocess.run([yeegap, "view", results, "--no-plots"], capture_output=True, text=True)
    check(done.returncode == 0, f"yeegap view exit code {done.returncode}: {done.stderr}")
    xmf = os.path.join(work, "graded.xmf")
    check(os.path.isfile(xmf), "no sidecar next to the results")
    expected = [("materials", None, None)] + [(f"{name} {wl:g} nm", name, q) for name in sorted(MAPS)
                                              for q, wl in enumerate(WAVELENGTHS_NM)]
    with h5py.File(results, "r") as f:
        # Xdmf3ReaderT: one named block per grid.
        got = dict(read_with("Xdmf3ReaderT", xmf))
        check(sorted(got) == sorted(e[0] for e in expected), f"Xdmf3ReaderT blocks {sorted(got)}")
        for block, name, q in expected:
            if block not in got:
                continue
            if name is None:
                check_materials(f"T {block}", got[block], f)
            else:
                check_field_map(f"T {block}", got[block], f, name, q)
        # Xdmf3ReaderS (ParaView's default for .xmf): the same grids as unnamed pieces, in file order.
        pieces = [grid for _, grid in read_with("Xdmf3ReaderS", xmf)]
        check(len(pieces) == len(expected), f"Xdmf3ReaderS gave {len(pieces)} pieces, want {len(expected)}")
        if len(pieces) == len(expected):
            order = ["materials"] + [f"{n} {wl:g} nm" for n in sorted(MAPS) for wl in WAVELENGTHS_NM]
            for grid, block in zip(pieces, order):
                _, name, q = next(e for e in expected if e[0] == block)
                if name is None:
                    check_materials(f"S {block}", grid, f)
                else:
                    check_field_map(f"S {block}", grid, f, name, q)

print(f"{passes} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
