#!/usr/bin/python3
"""make_meshio_fixtures.py writes legacy VTK fixtures with meshio, a second
independent general-purpose library (Debian python3-meshio 7.0.0).

meshio lays files out differently from VTK itself (its own numbers per line,
cell data and extra point data in FIELD blocks, 64-bit offsets/connectivity in
5.1, numpy dtypes), which is what a reader meets in the wild. As for the VTK
fixtures, the companion JSON is what VTK 9.1's own legacy reader
(vtkDataSetReader) holds after reading the meshio file; the script first
checks that object against the meshio mesh it wrote (points, cell types and
nodes, every array), so both libraries agree on each expected value.

Usage, from the repository root (after make_vtk_fixtures.py):

    /usr/bin/python3 testdata/gen/make_meshio_fixtures.py testdata/vtk
"""

import json
import os
import sys

import meshio
import numpy as np
import vtk

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
import make_vtk_fixtures as mvf  # noqa: E402  (read_back, describe)

# meshio cell block name -> VTK cell type id (vtkCellType.h)
VTK_ID = {"vertex": 1, "line": 3, "triangle": 5, "quad": 9, "tetra": 10,
          "hexahedron": 12, "wedge": 13, "pyramid": 14}


def mesh():
    """One block of each cell kind on shared points of a 3x3x2 lattice."""
    pts = np.array([[0.5 * i + 0.01 * j * k, 0.25 * j, 0.75 * k]
                    for k in range(2) for j in range(3) for i in range(3)], dtype=np.float64)

    def p(i, j, k):
        return 9 * k + 3 * j + i

    cells = [
        ("vertex", [[p(2, 2, 1)]]),
        ("line", [[p(0, 0, 0), p(2, 0, 0)]]),
        ("triangle", [[p(0, 0, 0), p(1, 0, 0), p(1, 1, 0)], [p(0, 0, 0), p(1, 1, 0), p(0, 1, 0)]]),
        ("quad", [[p(1, 0, 0), p(2, 0, 0), p(2, 1, 0), p(1, 1, 0)]]),
        ("hexahedron", [[p(0, 1, 0), p(1, 1, 0), p(1, 2, 0), p(0, 2, 0),
                         p(0, 1, 1), p(1, 1, 1), p(1, 2, 1), p(0, 2, 1)]]),
        ("wedge", [[p(1, 1, 0), p(2, 1, 0), p(1, 2, 0), p(1, 1, 1), p(2, 1, 1), p(1, 2, 1)]]),
        ("pyramid", [[p(0, 0, 1), p(1, 0, 1), p(1, 1, 1), p(0, 1, 1), p(2, 2, 0)]]),
        ("tetra", [[p(2, 1, 0), p(2, 2, 0), p(1, 2, 0), p(2, 2, 1)]]),
    ]
    cells = [(t, np.array(c, dtype=np.int64)) for t, c in cells]
    n = len(pts)
    point_data = {
        "pressure": (1e5 + pts[:, 0] * pts[:, 1] - pts[:, 2]).astype(np.float64),
        "velocity": np.stack([1 + pts[:, 1], -pts[:, 0], 0.1 * pts[:, 2]], axis=1).astype(np.float32),
        "node_tag": (np.arange(n) * 3 - 20).astype(np.int64),
    }
    cell_data = {
        "material": [np.full(len(c), k + 1, dtype=np.int64) for k, (_, c) in enumerate(cells)],
        "heat": [np.array([[0.5 * k + i, -1.25 * i, 1e-3 * k] for i in range(len(c))], dtype=np.float64)
                 for k, (_, c) in enumerate(cells)],
    }
    return meshio.Mesh(pts, cells, point_data=point_data, cell_data=cell_data)


def check(m, ds, path):
    """Asserts that VTK's read-back object ds equals meshio mesh m."""
    def fail(msg):
        raise SystemExit("%s: VTK and meshio disagree: %s" % (path, msg))
    if ds.GetNumberOfPoints() != len(m.points):
        fail("points")
    for i, q in enumerate(m.points):
        if not np.allclose(ds.GetPoint(i), q, rtol=1e-6, atol=0):
            fail("point %d" % i)
    ids = vtk.vtkIdList()
    c = 0
    for block in m.cells:
        for nodes in block.data:
            ds.GetCellPoints(c, ids)
            got = [ids.GetId(k) for k in range(ids.GetNumberOfIds())]
            want = list(nodes)
            if block.type == "wedge":
                # meshio keeps wedges in gmsh order and writes VTK order
                # nodes[[0, 2, 1, 3, 5, 4]] (meshio/_vtk_common.py).
                want = [want[i] for i in (0, 2, 1, 3, 5, 4)]
            if ds.GetCellType(c) != VTK_ID[block.type] or got != want:
                fail("cell %d" % c)
            c += 1
    if c != ds.GetNumberOfCells():
        fail("cell count")
    for name, d in m.point_data.items():
        a = ds.GetPointData().GetArray(name)
        flat = np.asarray(d, dtype=np.float64).reshape(-1)
        if a is None or a.GetNumberOfValues() != len(flat):
            fail("point array %r" % name)
        if not np.allclose([a.GetValue(i) for i in range(len(flat))], flat, rtol=1e-6, atol=1e-12):
            fail("point array %r values" % name)
    for name, blocks in m.cell_data.items():
        a = ds.GetCellData().GetArray(name)
        flat = np.concatenate([np.asarray(b, dtype=np.float64).reshape(-1) for b in blocks])
        if a is None or a.GetNumberOfValues() != len(flat):
            fail("cell array %r" % name)
        if not np.allclose([a.GetValue(i) for i in range(len(flat))], flat, rtol=1e-6, atol=1e-12):
            fail("cell array %r values" % name)


def describe_meshio(m, name, version, fmt):
    """JSON description from the meshio mesh itself (for files VTK 9.1
    cannot read: its reader lacks the vtktypeint32 name meshio writes)."""
    cells = []
    for block in m.cells:
        for nodes in block.data:
            nodes = [int(x) for x in nodes]
            if block.type == "wedge":
                nodes = [nodes[i] for i in (0, 2, 1, 3, 5, 4)]
            cells.append({"type": VTK_ID[block.type], "points": nodes})
    counts = {}
    for c in cells:
        counts[str(c["type"])] = counts.get(str(c["type"]), 0) + 1
    vtype = {np.dtype(np.float32): "float", np.dtype(np.float64): "double", np.dtype(np.int32): "int",
             np.dtype(np.int64): "long long", np.dtype(np.uint8): "unsigned char"}

    def arr(nm, loc, d):
        d = np.asarray(d)
        c = 1 if d.ndim == 1 else d.shape[1]
        data = [float(x) for x in d.reshape(-1)]
        return {"name": nm, "location": loc, "kind": "FIELD", "vtk_type": vtype[d.dtype], "components": c,
                "tuples": len(d), "first": data[:c], "last": data[-c:],
                "sum": [float(np.sum(d.reshape(len(d), c)[:, k].astype(np.float64))) for k in range(c)],
                "nan_count": int(np.isnan(d.astype(np.float64)).sum()), "data": data}
    arrays = [arr(k, "point", v) for k, v in m.point_data.items()]
    arrays += [arr(k, "cell", np.concatenate(v)) for k, v in m.cell_data.items()]
    return {"generator": "meshio %s (python3-meshio 7.0.0) meshio.vtk.write; JSON from the meshio mesh" % meshio.__version__,
            "dataset": "UNSTRUCTURED_GRID", "version": version, "format": fmt, "file": name + ".vtk",
            "points": len(m.points), "cells": len(cells), "cell_type_counts": counts,
            "coords": [float(x) for x in m.points.reshape(-1)], "cell_list": cells, "arrays": arrays,
            "dataset_field_data": []}


def int32_mesh():
    """Two tetrahedra with int32, uint8 and float32 arrays: meshio 5.1 names
    them vtktypeint32, vtktypeuint8 and float."""
    pts = np.array([[0, 0, 0], [1, 0, 0], [0, 1, 0], [0, 0, 1], [1, 1, 1]], dtype=np.float64)
    cells = [("tetra", np.array([[0, 1, 2, 3], [1, 2, 3, 4]], dtype=np.int64))]
    return meshio.Mesh(pts, cells,
                       point_data={"id32": np.array([-2147483648, -1, 0, 7, 2147483647], dtype=np.int32),
                                   "flag8": np.array([0, 1, 128, 254, 255], dtype=np.uint8)},
                       cell_data={"f32": [np.array([1.5, -3.25e-7], dtype=np.float32)]})


def main():
    outdir = sys.argv[1] if len(sys.argv) > 1 else "testdata/vtk"
    m = mesh()
    for version in ("4.2", "5.1"):
        for binary in (False, True):
            fmt = "BINARY" if binary else "ASCII"
            name = "meshio_mixed_v%s_%s" % (version.replace(".", ""), fmt.lower())
            path = os.path.join(outdir, name + ".vtk")
            meshio.vtk.write(path, m, binary=binary, fmt_version=version)
            ds = mvf.read_back(path)
            check(m, ds, path)
            desc = mvf.describe(ds, "UNSTRUCTURED_GRID", version.replace(".", ""), fmt, "vtkDataSetReader")
            desc["generator"] = "meshio %s (python3-meshio 7.0.0) meshio.vtk.write(binary=%s, fmt_version=%r); " \
                "JSON from VTK %s vtkDataSetReader" % (meshio.__version__, binary, version, vtk.vtkVersion.GetVTKVersion())
            desc["file"] = name + ".vtk"
            with open(os.path.join(outdir, name + ".json"), "w") as f:
                json.dump(desc, f, indent=1, sort_keys=True)
                f.write("\n")
            print(path)
    m = int32_mesh()
    for binary in (False, True):
        fmt = "BINARY" if binary else "ASCII"
        name = "meshio_int32_v51_%s" % fmt.lower()
        meshio.vtk.write(os.path.join(outdir, name + ".vtk"), m, binary=binary, fmt_version="5.1")
        with open(os.path.join(outdir, name + ".json"), "w") as f:
            json.dump(describe_meshio(m, name, "5.1", fmt), f, indent=1, sort_keys=True)
            f.write("\n")


if __name__ == "__main__":
    main()
