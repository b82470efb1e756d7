#!/usr/bin/python3
"""make_vtk_fixtures.py writes the legacy VTK reader fixtures of farforce.

Every .vtk file under testdata/vtk/ is written by VTK's own legacy writers
(vtkUnstructuredGridWriter, vtkStructuredPointsWriter, vtkStructuredGridWriter,
vtkRectilinearGridWriter, vtkPolyDataWriter) from an in-memory VTK data set
built below. Beside each file, a JSON file records what VTK holds in memory
after reading that file back with its own legacy reader (vtkDataSetReader):
point coordinates, cells with their VTK type ids and point ids, every array
with its name, location, components, VTK data type, values, first/last tuple
and per-component sums. Before writing the JSON the script checks that the
read-back object equals the source object (within the digits VTK's ASCII
writer prints). The Go tests (readers/fixtures_test.go) compare the farforce
reader against these JSON files, so the expected values come from an
independent general-purpose library, not from farforce.

Usage (from the repository root; needs Debian's python3-vtk9, which installs
the module for the system interpreter /usr/bin/python3):

    /usr/bin/python3 testdata/gen/make_vtk_fixtures.py testdata/vtk

With the argument `real` followed by .vtk paths it instead writes a JSON
summary (counts, bounds, first/last tuple and sums of every array, as VTK reads
them) beside each given file; used for testdata/real/:

    /usr/bin/python3 testdata/gen/make_vtk_fixtures.py real testdata/real/*.vtk

It also writes gzip (python gzip module, mtime 0) copies of two files; zstd
copies are made by the `zstd` command line tool if it is on PATH.
"""

import gzip
import json
import math
import os
import shutil
import subprocess
import sys

import vtk

VERSIONS = {
    "42": vtk.vtkDataWriter.VTK_LEGACY_READER_VERSION_4_2,
    "51": vtk.vtkDataWriter.VTK_LEGACY_READER_VERSION_5_1,
}

# ---------------------------------------------------------------- helpers


def typed_array(cls, name, ncomp, values):
    """Returns a VTK array of class cls filled with values (flat, interleaved)."""
    a = cls()
    a.SetName(name)
    a.SetNumberOfComponents(ncomp)
    a.SetNumberOfTuples(len(values) // ncomp)
    for i, v in enumerate(values):
        a.SetValue(i, v)
    return a


def describe_array(a, location, kind):
    """JSON description of VTK array a, read back from the array itself."""
    n = a.GetNumberOfTuples()
    c = a.GetNumberOfComponents()
    if not a.IsNumeric():
        return {"name": a.GetName(), "location": location, "kind": kind, "vtk_type": a.GetDataTypeAsString(),
                "components": c, "tuples": n, "strings": [a.GetValue(i) for i in range(a.GetNumberOfValues())]}
    data = [float(a.GetComponent(i, k)) for i in range(n) for k in range(c)]
    sums = [math.fsum(data[k::c]) for k in range(c)]
    return {
        "name": a.GetName(),
        "location": location,
        "kind": kind,  # how the writer is expected to store it (SCALARS, VECTORS, TENSORS, FIELD, ...)
        "vtk_type": a.GetDataTypeAsString(),
        "components": c,
        "tuples": n,
        "first": data[:c],
        "last": data[-c:] if n else [],
        "sum": sums,
        "nan_count": sum(1 for v in data if v != v),
        "data": data,
    }


def attribute_kind(attrs, a):
    """Returns how vtkDataWriter writes array a of the vtkDataSetAttributes attrs."""
    if attrs.GetScalars() is not None and attrs.GetScalars().GetName() == a.GetName():
        return "SCALARS"
    if attrs.GetVectors() is not None and attrs.GetVectors().GetName() == a.GetName():
        return "VECTORS"
    if attrs.GetNormals() is not None and attrs.GetNormals().GetName() == a.GetName():
        return "NORMALS"
    if attrs.GetTensors() is not None and attrs.GetTensors().GetName() == a.GetName():
        return "TENSORS"
    if attrs.GetTCoords() is not None and attrs.GetTCoords().GetName() == a.GetName():
        return "TEXTURE_COORDINATES"
    return "FIELD"


def describe(ds, dataset, version, fmt, writer_name):
    """JSON description of data set ds as VTK holds it in memory."""
    pts = []
    for i in range(ds.GetNumberOfPoints()):
        pts.extend(float(x) for x in ds.GetPoint(i))
    cells = []
    ids = vtk.vtkIdList()
    for c in range(ds.GetNumberOfCells()):
        ds.GetCellPoints(c, ids)
        cells.append({
            "type": ds.GetCellType(c),
            "points": [ids.GetId(k) for k in range(ids.GetNumberOfIds())],
        })
    arrays = []
    for loc, attrs in (("point", ds.GetPointData()), ("cell", ds.GetCellData())):
        for i in range(attrs.GetNumberOfArrays()):
            a = attrs.GetAbstractArray(i)
            arrays.append(describe_array(a, loc, attribute_kind(attrs, a)))
    field_data = []
    fd = ds.GetFieldData()
    for i in range(fd.GetNumberOfArrays()):
        field_data.append(describe_array(fd.GetArray(i), "dataset", "FIELD"))
    types = {}
    for c in cells:
        types[str(c["type"])] = types.get(str(c["type"]), 0) + 1
    return {
        "generator": "VTK %s %s (python3-vtk9)" % (vtk.vtkVersion.GetVTKVersion(), writer_name),
        "dataset": dataset,
        "version": {"42": "4.2", "51": "5.1"}[version],
        "format": fmt,
        "points": ds.GetNumberOfPoints(),
        "cells": ds.GetNumberOfCells(),
        "cell_type_counts": types,
        "coords": pts,
        "cell_list": cells,
        "arrays": arrays,
        "dataset_field_data": field_data,
    }


def write(ds, writer_cls, dataset, base, outdir, version, binary):
    """Writes ds with writer_cls and its JSON description; returns the .vtk path."""
    fmt = "BINARY" if binary else "ASCII"
    name = "%s_v%s_%s" % (base, version, fmt.lower())
    path = os.path.join(outdir, name + ".vtk")
    w = writer_cls()
    w.SetFileName(path)
    w.SetInputData(ds)
    w.SetFileVersion(VERSIONS[version])
    if binary:
        w.SetFileTypeToBinary()
    else:
        w.SetFileTypeToASCII()
    w.SetHeader("farforce fixture %s written by VTK %s" % (name, vtk.vtkVersion.GetVTKVersion()))
    if w.Write() != 1:
        raise SystemExit("writing %s failed" % path)
    back = read_back(path)
    check_same(ds, back, path)
    desc = describe(back, dataset, version, fmt, writer_cls.__name__)
    desc["file"] = name + ".vtk"
    with open(os.path.join(outdir, name + ".json"), "w") as f:
        json.dump(desc, f, indent=1, sort_keys=True)
        f.write("\n")
    return path


def read_back(path):
    """Reads path with VTK's own legacy reader, keeping every attribute array."""
    r = vtk.vtkDataSetReader()
    r.SetFileName(path)
    r.ReadAllScalarsOn()
    r.ReadAllVectorsOn()
    r.ReadAllNormalsOn()
    r.ReadAllTensorsOn()
    r.ReadAllColorScalarsOn()
    r.ReadAllTCoordsOn()
    r.ReadAllFieldsOn()
    r.Update()
    out = r.GetOutput()
    if out is None or out.GetNumberOfPoints() == 0:
        raise SystemExit("VTK could not read back %s" % path)
    return out


def close(a, b, rel):
    return a == b or abs(a - b) <= rel * max(abs(a), abs(b))


def check_same(src, back, path):
    """Asserts that VTK's read-back object equals the source object.

    ASCII files lose digits: VTK 9.1's vtkDataWriter prints float data with
    "%g" (6 significant digits) and double data with "%.11lg" (11 digits), so
    values are compared with a relative tolerance of 1e-5 (covers 6 digits);
    binary files must agree exactly (checked by the same test: rel 1e-5 is an
    upper bound, exact equality is asserted for integer arrays).
    """
    def fail(msg):
        raise SystemExit("%s: read-back differs from source: %s" % (path, msg))
    if src.GetNumberOfPoints() != back.GetNumberOfPoints():
        fail("points")
    if src.GetNumberOfCells() != back.GetNumberOfCells():
        fail("cells")
    for i in range(src.GetNumberOfPoints()):
        for a, b in zip(src.GetPoint(i), back.GetPoint(i)):
            if not close(a, b, 1e-5) and abs(a - b) > 1e-12:
                fail("point %d" % i)
    for c in range(src.GetNumberOfCells()):
        if src.GetCellType(c) != back.GetCellType(c):
            fail("cell type %d" % c)
    for attr in ("GetPointData", "GetCellData"):
        s, b = getattr(src, attr)(), getattr(back, attr)()
        for i in range(s.GetNumberOfArrays()):
            sa = s.GetAbstractArray(i)
            ba = b.GetAbstractArray(sa.GetName())
            if ba is None:
                fail("array %r missing" % sa.GetName())
            if sa.GetNumberOfComponents() != ba.GetNumberOfComponents() or sa.GetNumberOfTuples() != ba.GetNumberOfTuples():
                fail("array %r shape" % sa.GetName())
            if not sa.IsNumeric():
                if [sa.GetValue(k) for k in range(sa.GetNumberOfValues())] != [ba.GetValue(k) for k in range(ba.GetNumberOfValues())]:
                    fail("string array %r" % sa.GetName())
                continue
            exact = sa.GetDataType() not in (vtk.VTK_FLOAT, vtk.VTK_DOUBLE)
            for t in range(sa.GetNumberOfTuples()):
                for k in range(sa.GetNumberOfComponents()):
                    x, y = sa.GetComponent(t, k), ba.GetComponent(t, k)
                    if (exact and x != y) or (not exact and not close(x, y, 1e-5) and abs(x - y) > 1e-9):
                        fail("array %r tuple %d: %r vs %r" % (sa.GetName(), t, x, y))


def add_point_arrays(ds, with_types=False):
    """Adds the standard set of point arrays to ds, as functions of the coordinates."""
    n = ds.GetNumberOfPoints()
    P = [ds.GetPoint(i) for i in range(n)]
    pd = ds.GetPointData()
    temp = typed_array(vtk.vtkFloatArray, "temperature", 1,
                       [300.0 + 0.5 * x + 0.25 * y - 0.125 * z for x, y, z in P])
    pd.SetScalars(temp)
    vel = typed_array(vtk.vtkFloatArray, "velocity", 3,
                      [v for x, y, z in P for v in (1.0 + 0.1 * y, -0.2 * x, 0.05 * z * x)])
    pd.SetVectors(vel)
    ten = typed_array(vtk.vtkDoubleArray, "stress", 9,
                      [v for x, y, z in P for v in (x, 0.1, 0.2, 0.1, y, 0.3, 0.2, 0.3, z + 1.0 / 3.0)])
    pd.SetTensors(ten)
    # Further arrays are written in a FIELD block by vtkDataWriter.
    pd.AddArray(typed_array(vtk.vtkDoubleArray, "pressure", 1,
                            [101325.0 + math.sin(x) * math.cos(y) for x, y, z in P]))
    pd.AddArray(typed_array(vtk.vtkIntArray, "node_id", 1, [1000 * i - 7 for i in range(n)]))
    pd.AddArray(typed_array(vtk.vtkUnsignedCharArray, "flag", 1, [(7 * i) % 256 for i in range(n)]))
    two = typed_array(vtk.vtkFloatArray, "wall shear", 2,
                      [v for x, y, z in P for v in (x * y - 0.5, 1e-3 * (y - z))])
    two.SetComponentName(0, "tau x")
    two.SetComponentName(1, "tau_y")
    pd.AddArray(two)
    if with_types:
        pd.AddArray(typed_array(vtk.vtkShortArray, "short_s", 1, [(-1) ** i * 13 * i for i in range(n)]))
        pd.AddArray(typed_array(vtk.vtkUnsignedShortArray, "ushort_s", 1, [65535 - 11 * i for i in range(n)]))
        pd.AddArray(typed_array(vtk.vtkSignedCharArray, "char_s", 1, [((5 * i) % 256) - 128 for i in range(n)]))
        pd.AddArray(typed_array(vtk.vtkUnsignedIntArray, "uint_s", 1, [4000000000 - 17 * i for i in range(n)]))
        pd.AddArray(typed_array(vtk.vtkTypeInt64Array, "int64_s", 1, [-(2 ** 40) + 3 * i for i in range(n)]))
        pd.AddArray(typed_array(vtk.vtkIdTypeArray, "idtype_s", 1, [i * 2 for i in range(n)]))


def add_cell_arrays(ds):
    """Adds the standard set of cell arrays to ds."""
    n = ds.GetNumberOfCells()
    cd = ds.GetCellData()
    sc = typed_array(vtk.vtkDoubleArray, "cell_rgb", 3,
                     [v for c in range(n) for v in (c + 0.5, -c / 3.0, 1e20 * (c + 1))])
    cd.SetScalars(sc)
    cd.AddArray(typed_array(vtk.vtkIntArray, "material", 1, [c % 3 + 1 for c in range(n)]))
    cd.AddArray(typed_array(vtk.vtkFloatArray, "cell_vec", 3,
                            [v for c in range(n) for v in (0.1 * c, 1.0, -2.5e-5 * c)]))


def add_dataset_field(ds):
    """Adds a data-set level FIELD (TIME, CYCLE) as solvers write it."""
    fd = vtk.vtkFieldData()
    fd.AddArray(typed_array(vtk.vtkDoubleArray, "TIME", 1, [12.5]))
    fd.AddArray(typed_array(vtk.vtkIntArray, "CYCLE", 1, [42]))
    ds.SetFieldData(fd)


# ---------------------------------------------------------------- data sets


def mixed_ugrid():
    """One cell of each supported kind, each on its own points, shifted in x."""
    cells = [
        # (VTK type id, local points)
        (vtk.VTK_TRIANGLE, [(0, 0, 0), (1, 0, 0), (0, 1, 0)]),
        (vtk.VTK_QUAD, [(0, 0, 0), (1, 0, 0), (1, 1, 0), (0, 1, 0)]),
        (vtk.VTK_PIXEL, [(0, 0, 0), (1, 0, 0), (0, 1, 0), (1, 1, 0)]),
        (vtk.VTK_TETRA, [(0, 0, 0), (1, 0, 0), (0, 1, 0), (0, 0, 1)]),
        (vtk.VTK_HEXAHEDRON, [(0, 0, 0), (1, 0, 0), (1, 1, 0), (0, 1, 0),
                              (0, 0, 1), (1, 0, 1), (1, 1, 1), (0, 1, 1)]),
        (vtk.VTK_VOXEL, [(0, 0, 0), (1, 0, 0), (0, 1, 0), (1, 1, 0),
                         (0, 0, 1), (1, 0, 1), (0, 1, 1), (1, 1, 1)]),
        (vtk.VTK_WEDGE, [(0, 0, 0), (1, 0, 0), (0, 1, 0), (0, 0, 1), (1, 0, 1), (0, 1, 1)]),
        (vtk.VTK_PYRAMID, [(0, 0, 0), (1, 0, 0), (1, 1, 0), (0, 1, 0), (0.5, 0.5, 0.75)]),
        (vtk.VTK_QUADRATIC_TETRA, [(0, 0, 0), (1, 0, 0), (0, 1, 0), (0, 0, 1),
                                   (0.5, 0, 0), (0.5, 0.5, 0), (0, 0.5, 0),
                                   (0, 0, 0.5), (0.5, 0, 0.5), (0, 0.5, 0.5)]),
    ]
    pts = vtk.vtkPoints()
    pts.SetDataTypeToFloat()
    ug = vtk.vtkUnstructuredGrid()
    ug.SetPoints(pts)
    ug.Allocate(len(cells))
    for k, (ctype, local) in enumerate(cells):
        ids = vtk.vtkIdList()
        for (x, y, z) in local:
            ids.InsertNextId(pts.InsertNextPoint(2.0 * k + x + 0.125, y - 0.25, z + 0.0625 * k))
        ug.InsertNextCell(ctype, ids)
    add_point_arrays(ug, with_types=True)
    add_cell_arrays(ug)
    add_dataset_field(ug)
    return ug


def tri2d_ugrid():
    """A small structured-looking triangle mesh in the plane z = 0 (4x3 points)."""
    nx, ny = 4, 3
    pts = vtk.vtkPoints()
    pts.SetDataTypeToDouble()
    for j in range(ny):
        for i in range(nx):
            pts.InsertNextPoint(0.3 * i + 0.05 * j * j, 0.2 * j, 0.0)
    ug = vtk.vtkUnstructuredGrid()
    ug.SetPoints(pts)
    for j in range(ny - 1):
        for i in range(nx - 1):
            a = j * nx + i
            b, c, d = a + 1, a + nx + 1, a + nx
            for tri in ((a, b, c), (a, c, d)):
                ids = vtk.vtkIdList()
                for p in tri:
                    ids.InsertNextId(p)
                ug.InsertNextCell(vtk.VTK_TRIANGLE, ids)
    add_point_arrays(ug)
    add_cell_arrays(ug)
    return ug


def structured_points(dims=(4, 3, 2)):
    im = vtk.vtkStructuredPoints()
    im.SetDimensions(*dims)
    im.SetOrigin(-1.0, 0.5, 2.0)
    im.SetSpacing(0.5, 0.25, 1.5)
    add_point_arrays(im)
    add_cell_arrays(im)
    return im


def structured_grid(nz, nx=3, ny=4):
    pts = vtk.vtkPoints()
    pts.SetDataTypeToFloat()
    for k in range(nz):
        for j in range(ny):
            for i in range(nx):
                r = 1.0 + 0.5 * i
                t = 0.4 * j
                pts.InsertNextPoint(r * math.cos(t), r * math.sin(t), 0.75 * k)
    sg = vtk.vtkStructuredGrid()
    sg.SetDimensions(nx, ny, nz)
    sg.SetPoints(pts)
    add_point_arrays(sg)
    add_cell_arrays(sg)
    return sg


def rectilinear_grid(dims=(4, 3, 2)):
    rg = vtk.vtkRectilinearGrid()
    rg.SetDimensions(*dims)
    rg.SetXCoordinates(typed_array(vtk.vtkFloatArray, "x", 1, [0.0, 0.1, 0.3, 0.7][:dims[0]]))
    rg.SetYCoordinates(typed_array(vtk.vtkFloatArray, "y", 1, [-1.0, 0.0, 2.5][:dims[1]]))
    rg.SetZCoordinates(typed_array(vtk.vtkFloatArray, "z", 1, [5.0, 5.5][:dims[2]]))
    add_point_arrays(rg)
    add_cell_arrays(rg)
    return rg


def polydata():
    """Vertices, lines (a segment and a polyline), polygons and a strip."""
    pts = vtk.vtkPoints()
    pts.SetDataTypeToFloat()
    coords = [
        (0, 0, 0), (1, 0, 0), (2, 0, 0), (3, 0.5, 0),            # 0-3 verts / polyline
        (0, 1, 0), (1, 1, 0), (1, 2, 0), (0, 2, 0),              # 4-7 quad
        (2, 1, 0), (3, 1, 0), (3.5, 1.8, 0), (2.5, 2.6, 0), (1.8, 1.9, 0),  # 8-12 pentagon
        (0, 3, 0.5), (1, 3, 0), (0, 4, 0.5), (1, 4, 0), (0, 5, 0.5), (1, 5, 0),  # 13-18 strip
    ]
    for p in coords:
        pts.InsertNextPoint(*p)
    pd = vtk.vtkPolyData()
    pd.SetPoints(pts)

    def cellarray(lists):
        ca = vtk.vtkCellArray()
        for l in lists:
            ca.InsertNextCell(len(l))
            for p in l:
                ca.InsertCellPoint(p)
        return ca

    pd.SetVerts(cellarray([[0], [1, 2]]))            # a vertex and a poly-vertex
    pd.SetLines(cellarray([[0, 1], [0, 1, 2, 3]]))   # a line and a polyline
    pd.SetPolys(cellarray([[4, 5, 6], [4, 5, 6, 7], [8, 9, 10, 11, 12]]))
    pd.SetStrips(cellarray([[13, 14, 15, 16, 17, 18]]))
    add_point_arrays(pd)
    add_cell_arrays(pd)
    return pd


def attrs_ugrid():
    """Three hexahedra with the less common attribute kinds VTK writes:
    NORMALS, TEXTURE_COORDINATES, unsigned char RGBA scalars (written as
    COLOR_SCALARS), a bit array and a string array in FIELD blocks, and the
    cell ghost array vtkGhostType (bit 1 = duplicate cell, vtkDataSetAttributes)."""
    pts = vtk.vtkPoints()
    pts.SetDataTypeToDouble()
    for k in range(2):
        for j in range(2):
            for i in range(4):
                pts.InsertNextPoint(0.5 * i, 0.5 * j + 0.1 * i, 0.5 * k)
    ug = vtk.vtkUnstructuredGrid()
    ug.SetPoints(pts)
    for i in range(3):
        a = i
        ids = vtk.vtkIdList()
        for p in (a, a + 1, a + 5, a + 4, a + 8, a + 9, a + 13, a + 12):
            ids.InsertNextId(p)
        ug.InsertNextCell(vtk.VTK_HEXAHEDRON, ids)
    n = ug.GetNumberOfPoints()
    pd = ug.GetPointData()
    nrm = []
    for i in range(n):
        x, y, z = ug.GetPoint(i)
        r = math.sqrt(x * x + y * y + 1.0)
        nrm += [x / r, y / r, 1.0 / r]
    pd.SetNormals(typed_array(vtk.vtkFloatArray, "normals", 3, nrm))
    pd.SetTCoords(typed_array(vtk.vtkFloatArray, "uv", 2, [v for i in range(n) for v in (i / 16.0, 1 - i / 16.0)]))
    pd.SetScalars(typed_array(vtk.vtkUnsignedCharArray, "rgba", 4,
                              [v for i in range(n) for v in (17 * i % 256, 255 - 9 * i, 0, 255)]))
    pd.AddArray(typed_array(vtk.vtkBitArray, "bits", 1, [(i * 5) % 3 == 0 for i in range(n)]))
    pd.AddArray(typed_array(vtk.vtkFloatArray, "p", 1, [0.25 * i - 1 for i in range(n)]))
    names = vtk.vtkStringArray()
    names.SetName("labels")
    for i in range(n):
        names.InsertNextValue("pt %d" % i)
    pd.AddArray(names)
    cd = ug.GetCellData()
    ghost = typed_array(vtk.vtkUnsignedCharArray, vtk.vtkDataSetAttributes.GhostArrayName(), 1,
                        [0, vtk.vtkDataSetAttributes.DUPLICATECELL, 0])
    cd.AddArray(ghost)
    cd.AddArray(typed_array(vtk.vtkDoubleArray, "cp", 1, [0.5, -0.25, 1.75]))
    return ug


def compress(path):
    """Writes path.gz (python gzip, mtime 0) and path.zst (zstd CLI) copies."""
    with open(path, "rb") as f:
        raw = f.read()
    with open(path + ".gz", "wb") as f:
        with gzip.GzipFile(filename="", mode="wb", fileobj=f, mtime=0, compresslevel=9) as g:
            g.write(raw)
    if shutil.which("zstd"):
        subprocess.run(["zstd", "-q", "-f", "-19", "--no-progress", path, "-o", path + ".zst"], check=True)


def summarize_real(path):
    """Writes path's .json summary (no full data) as read by VTK's legacy reader."""
    ds = read_back(path)
    desc = describe(ds, ds.GetClassName(), "42", "", "vtkDataSetReader")
    del desc["version"], desc["format"], desc["coords"], desc["cell_list"]
    desc["generator"] = "VTK %s vtkDataSetReader (python3-vtk9), summary of a file written elsewhere" % (
        vtk.vtkVersion.GetVTKVersion())
    for a in desc["arrays"]:
        del a["data"]
    lo = [min(ds.GetPoint(i)[k] for i in range(ds.GetNumberOfPoints())) for k in range(3)]
    hi = [max(ds.GetPoint(i)[k] for i in range(ds.GetNumberOfPoints())) for k in range(3)]
    desc["bounds"] = [lo, hi]
    desc["file"] = os.path.basename(path)
    with open(os.path.splitext(path)[0] + ".json", "w") as f:
        json.dump(desc, f, indent=1, sort_keys=True)
        f.write("\n")


def main():
    if len(sys.argv) > 2 and sys.argv[1] == "real":
        # /usr/bin/python3 testdata/gen/make_vtk_fixtures.py real testdata/real/*.vtk
        for p in sys.argv[2:]:
            summarize_real(p)
        return
    outdir = sys.argv[1] if len(sys.argv) > 1 else "testdata/vtk"
    os.makedirs(outdir, exist_ok=True)
    U, SP = vtk.vtkUnstructuredGridWriter, vtk.vtkStructuredPointsWriter
    SG, RG, PD = vtk.vtkStructuredGridWriter, vtk.vtkRectilinearGridWriter, vtk.vtkPolyDataWriter
    written = []
    for v in ("42", "51"):
        for b in (False, True):
            written.append(write(mixed_ugrid(), U, "UNSTRUCTURED_GRID", "ugrid_mixed", outdir, v, b))
            written.append(write(polydata(), PD, "POLYDATA", "polydata", outdir, v, b))
    written.append(write(attrs_ugrid(), U, "UNSTRUCTURED_GRID", "ugrid_attrs", outdir, "42", False))
    written.append(write(attrs_ugrid(), U, "UNSTRUCTURED_GRID", "ugrid_attrs", outdir, "51", True))
    written.append(write(tri2d_ugrid(), U, "UNSTRUCTURED_GRID", "ugrid_tri2d", outdir, "51", True))
    written.append(write(structured_points(), SP, "STRUCTURED_POINTS", "spoints", outdir, "42", False))
    written.append(write(structured_points(), SP, "STRUCTURED_POINTS", "spoints", outdir, "51", True))
    written.append(write(structured_grid(2), SG, "STRUCTURED_GRID", "sgrid3d", outdir, "42", False))
    written.append(write(structured_grid(1), SG, "STRUCTURED_GRID", "sgrid2d", outdir, "51", True))
    written.append(write(rectilinear_grid(), RG, "RECTILINEAR_GRID", "rgrid", outdir, "42", True))
    written.append(write(rectilinear_grid(), RG, "RECTILINEAR_GRID", "rgrid", outdir, "51", False))
    # Lower-dimensional structured sets: VTK makes pixels in the xz plane,
    # lines along one axis, a single vertex for one point.
    written.append(write(structured_points((3, 1, 4)), SP, "STRUCTURED_POINTS", "spoints_xz", outdir, "42", False))
    written.append(write(structured_points((5, 1, 1)), SP, "STRUCTURED_POINTS", "spoints_line", outdir, "51", True))
    written.append(write(rectilinear_grid((1, 3, 2)), RG, "RECTILINEAR_GRID", "rgrid_yz", outdir, "42", False))
    written.append(write(structured_grid(1, 1, 1), SG, "STRUCTURED_GRID", "sgrid_point", outdir, "42", False))
    compress(os.path.join(outdir, "ugrid_mixed_v51_binary.vtk"))
    compress(os.path.join(outdir, "polydata_v42_ascii.vtk"))
    for p in written:
        print(p)


if __name__ == "__main__":
    main()
