#!/usr/bin/python3
"""ParaView reads a real run on a graded grid: `yeegap run` of a small scene with a `refine` zone
(a gold sphere in 1 nm cells along x and z inside a 4 nm grid), then ParaView's own XDMF 3 reader
(Xdmf3ReaderT) on the sidecar. Checked: the coordinates ParaView gives are the file's /grid nodes,
are graded as the scene asks (at most 1 nm across the zone, the 4 nm base step at the ends and y
left uniform, neighbours within the grading ratio),
and put the gold where the sphere is; the field map's coordinates and every node value match the
file, a value looked up by position through ParaView's own point search is the file's value at
that position, and E_squared equals |Ex|^2 + |Ey|^2 + |Ez|^2 recomputed from the parts.
Skips (exit code 77) when ParaView's Python modules are absent (`bash tools/setup.sh --viewer`).
Usage: viewer_graded_run_check.py YEEGAP_BINARY"""
import os
import subprocess
import sys
import tempfile

SKIP = 77
try:
    from paraview import simple
    from vtkmodules.util.numpy_support import vtk_to_numpy
    from vtkmodules.vtkCommonCore import reference
except ImportError as e:
    print(f"SKIP: ParaView's Python modules are not installed ({e}); bash tools/setup.sh --viewer")
    sys.exit(SKIP)
import h5py
import numpy as np

yeegap = sys.argv[1]
failures, passes = [], 0


def check(ok, message):
    global passes
    if ok:
        passes += 1
    else:
        failures.append(message)
        print("FAIL", message)


NM = 1e-9
# Invented numbers, chosen only to be small: a 96 nm box of 4 nm cells with room for the cells to
# grow from 1 nm back to 4 nm (at 1.2 per cell, about 17 nm) before the 16 nm absorbers.
ZONE = 6.0  # nm, half-width of the refined box
SCENE = f"""scene: {{version: 1, title: graded viewer check}}
materials:
  vacuum: {{index: 1}}
  gold: {{library: Au}}
domain:
  size: [96 nm, 96 nm, 96 nm]
  step: 4 nm
  edges: cpml
  cpml: {{cells: 4}}
  refine:
    - {{from: [-{ZONE} nm, -{ZONE} nm, -{ZONE} nm], to: [{ZONE} nm, {ZONE} nm, {ZONE} nm], step: [1 nm, 4 nm, 1 nm]}}
  grading: 1.2
bodies:
  - {{shape: sphere, material: gold, center: [0, 0, 0], radius: 4 nm}}
excitation:
  - dipole: {{position: [0, 0, 5.5 nm], direction: z, band: {{from: 400 nm, to: 1000 nm}}}}
outputs:
  - field_map: {{name: xz, plane: {{axis: y, at: 0 nm}}, frequencies: [600 nm], components: [Ex, Ey, Ez]}}
stop: {{after: 1.5 fs}}
"""


def read_blocks(xmf):
    reader = simple.Xdmf3ReaderT(FileName=[xmf])  # an absolute path (platform notes: a bare name misleads it)
    reader.UpdatePipeline()
    data = reader.GetClientSideObject().GetOutputDataObject(0)  # not Fetch(): it garbles rectilinear coordinates
    out = {}
    for i in range(data.GetNumberOfBlocks()):
        name = data.GetMetaData(i).Get(data.NAME()) if data.HasMetaData(i) else None
        out[name] = data.GetBlock(i)
    return out


def coords(grid):
    return [vtk_to_numpy(c) for c in (grid.GetXCoordinates(), grid.GetYCoordinates(), grid.GetZCoordinates())]


with tempfile.TemporaryDirectory() as work:
    scene = os.path.join(work, "graded.yaml")
    with open(scene, "w") as f:
        f.write(SCENE)
    results = os.path.join(work, "graded.h5")
    done = subprocess.run([yeegap, "run", scene, "-o", results, "--threads", "2"], capture_output=True, text=True)
    check(done.returncode == 0, f"yeegap run exit code {done.returncode}: {done.stderr}")
    xmf = os.path.join(work, "graded.xmf")
    check(os.path.isfile(xmf), "no sidecar next to the results")
    if failures:
        sys.exit(1)
    blocks = read_blocks(xmf)
    check(sorted(blocks) == ["materials", "xz 600 nm"], f"blocks {sorted(blocks)}")

    with h5py.File(results, "r") as f:
        # ---- the whole grid and the material map ----
        grid = blocks.get("materials")
        check(grid is not None and grid.IsA("vtkRectilinearGrid"), "materials: not a rectilinear grid")
        xyz = coords(grid)
        for axis, got in zip("xyz", xyz):
            want = f[f"grid/{axis}"][...]
            check(np.array_equal(got, want), f"{axis}: ParaView's coordinates differ from /grid/{axis}")
            steps = np.diff(got) / NM
            # The scene asks for cells of at most 1 nm across the zone along x and z (the mesh
            # builder may go a little finer to put edges on the sphere's extremes), the 4 nm base
            # step elsewhere and all along y, growing by at most 1.2 from one cell to the next
            # (docs/scene.md, `refine`).
            check(np.isclose(steps[0], 4.0, rtol=1e-9) and np.isclose(steps[-1], 4.0, rtol=1e-9),
                  f"{axis}: end cells {steps[0]}, {steps[-1]} nm, want the base step 4 nm")
            if axis == "y":
                check(np.allclose(steps, 4.0, rtol=1e-9), f"y is not refined, yet its cells are {steps} nm")
                continue
            inside = (got[:-1] >= -ZONE * NM - 1e-15) & (got[1:] <= ZONE * NM + 1e-15)
            check(inside.sum() >= 2 * ZONE and steps[inside].max() <= 1.0 + 1e-9,
                  f"{axis}: cells across the refined zone are {steps[inside]} nm, want at most 1 nm")
            ratio = np.maximum(steps[1:] / steps[:-1], steps[:-1] / steps[1:])
            check(ratio.max() <= 1.2 + 1e-9, f"{axis}: neighbouring cells differ by {ratio.max():.4f}, above 1.2")
            print(f"{axis}: {len(got) - 1} cells, {steps.min():.3g} to {steps.max():.3g} nm")
        material = grid.GetCellData().GetArray("material")
        check(material is not None, "no cell data 'material'")
        if material is not None:
            m = vtk_to_numpy(material)
            check(np.array_equal(m, f["materials/map"][...].ravel()), "cell data 'material' differs from the file")
            names = [n.decode() for n in f["materials/names"][...]]
            # Through ParaView's own search: the cell holding the sphere's centre is gold, a corner cell is
            # vacuum, so the map sits on the graded coordinates where the scene put the sphere.
            # The y cells are 4 nm wide ([-4, 0] and [0, 4] hold the centre), so points at y = 1 nm.
            for point, want in (((0.5 * NM, 1 * NM, 0.5 * NM), "gold"), ((-40 * NM, -40 * NM, -40 * NM), "vacuum"),
                                ((2.5 * NM, 1 * NM, 0.5 * NM), "gold"), ((5.5 * NM, 1 * NM, 0.5 * NM), "vacuum")):
                cell = grid.FindCell(point, None, 0, 1e-24, reference(0), [0.0] * 3, [0.0] * 8)
                check(cell >= 0 and names[m[cell]] == want,
                      f"cell at {np.array(point) / NM} nm is {names[m[cell]] if cell >= 0 else 'not found'}, want {want}")
            # Every cell: gold exactly where its centre (from ParaView's coordinates) lies inside the
            # 4 nm sphere (the map holds the material at each cell centre, docs/results_file.md).
            cx, cy, cz = (0.5 * (c[1:] + c[:-1]) for c in xyz)
            r = np.sqrt(cz[:, None, None] ** 2 + cy[None, :, None] ** 2 + cx[None, None, :] ** 2) / NM
            gold = m.reshape(r.shape) == names.index("gold")
            clear = np.abs(r - 4.0) > 1e-6
            wrong = np.count_nonzero((gold != (r < 4.0)) & clear)
            check(wrong == 0 and gold.sum() > 0, f"{wrong} cells disagree with the sphere (gold cells: {gold.sum()})")
            print(f"material map: {gold.sum()} gold cells, all inside the sphere, none outside")

        # ---- the field map ----
        fm = blocks.get("xz 600 nm")
        g = f["outputs/xz"]
        check(fm is not None and fm.IsA("vtkRectilinearGrid"), "field map: not a rectilinear grid")
        for axis, got in zip("xyz", coords(fm)):
            check(np.array_equal(got, g[axis][...]), f"field map {axis} coordinates differ from the file")
        check(len(np.unique(np.round(np.diff(g["x"][...]) / NM, 9))) > 1, "the field map's x nodes are not graded")
        e2 = np.zeros(g["E_squared"].shape[1:])
        for name in ("Ex", "Ey", "Ez"):
            re, im = g[name + "_re"][0], g[name + "_im"][0]
            e2 += re**2 + im**2
            for part, want in (("_re", re), ("_im", im)):
                a = fm.GetPointData().GetArray(name + part)
                check(a is not None and np.array_equal(vtk_to_numpy(a), want.ravel()), f"node data {name}{part} differs")
        a = fm.GetPointData().GetArray("E_squared")
        check(a is not None and np.allclose(vtk_to_numpy(a), e2.ravel(), rtol=1e-12, atol=0),
              "E_squared differs from |Ex|^2 + |Ey|^2 + |Ez|^2 of the parts")
        check(e2.max() > 0, "the field map is all zero: the value checks would prove nothing")
        # A value by position: ParaView's point search on the graded grid, against the file's value at
        # the node with those coordinates (one in the fine zone, one in the coarse part).
        x, z = g["x"][...], g["z"][...]
        for i, k in ((np.argmin(abs(x - 3 * NM)), np.argmin(abs(z - 7 * NM))), (1, len(z) - 2)):
            pid = fm.FindPoint(x[i], g["y"][0], z[k])
            want = g["Ez_re"][0, k, 0, i]
            got = vtk_to_numpy(fm.GetPointData().GetArray("Ez_re"))[pid] if pid >= 0 else None
            check(got == want, f"Ez_re at ({x[i] / NM:.3g}, {z[k] / NM:.3g}) nm: ParaView {got}, file {want}")

print(f"{passes} passed, {len(failures)} failed")
sys.exit(1 if failures else 0)
