#!/usr/bin/python3
"""make_malformed.py writes the malformed legacy VTK corpus of farforce.

Each file in testdata/malformed/ breaks one rule of the legacy VTK format
(Kitware, "VTK File Formats", legacy section; 5.1 layout from VTK 9's
vtkDataReader/vtkUnstructuredGridReader) in one place, so that the reader's
error can be checked exactly (readers/malformed_test.go holds the expected
sentinel, line or byte offset and message parts for each). The binary cases
are cut from testdata/vtk/ugrid_tri2d_v51_binary.vtk, a file written by VTK
9.1 (see testdata/vtk/README.md). Only the Python standard library is used.

Usage, from the repository root (after make_vtk_fixtures.py):

    python3 testdata/gen/make_malformed.py testdata/malformed
"""

import gzip
import io
import os
import sys

HEAD42 = "# vtk DataFile Version 4.2\nmalformed fixture\nASCII\nDATASET UNSTRUCTURED_GRID\n"
HEAD51 = "# vtk DataFile Version 5.1\nmalformed fixture\nASCII\nDATASET UNSTRUCTURED_GRID\n"
PTS4 = "POINTS 4 float\n0 0 0 1 0 0\n0 1 0 0 0 1\n"
TET42 = "CELLS 1 5\n4 0 1 2 3\nCELL_TYPES 1\n10\n"


def tet51(offsets, conn, types, ncells_line=None):
    noff = len(offsets.split())
    nconn = len(conn.split())
    cells = ncells_line or "CELLS %d %d" % (noff, nconn)
    return "%s\nOFFSETS vtktypeint64\n%s\nCONNECTIVITY vtktypeint64\n%s\nCELL_TYPES %d\n%s\n" % (
        cells, offsets, conn, len(types.split()), types)


def ascii_cases():
    return {
        # --- format recognition
        "bad_magic.vtk": "# vtk DataFile Versoin 4.2\nx\nASCII\nDATASET UNSTRUCTURED_GRID\n" + PTS4,
        "not_vtk.vtk": "solid cube\n  facet normal 0 0 1\n    outer loop\n",
        "empty.vtk": "",
        "bad_format_word.vtk": "# vtk DataFile Version 4.2\nx\nASCIX\nDATASET UNSTRUCTURED_GRID\n" + PTS4,
        "unknown_dataset.vtk": "# vtk DataFile Version 4.2\nx\nASCII\nDATASET HYPER_GRID\n" + PTS4,
        "unknown_keyword.vtk": HEAD42 + PTS4 + "CELLZ 1 5\n4 0 1 2 3\n",
        "unknown_keyword_header.vtk": "# vtk DataFile Version 4.2\nx\nASCII\nDATAZET UNSTRUCTURED_GRID\n" + PTS4,
        "unknown_keyword_attr.vtk": HEAD42 + PTS4 + TET42 + "POINT_DATA 4\nSCALARZ p float 1\n1 2 3 4\n",
        "unknown_datatype.vtk": HEAD42 + "POINTS 4 quadruple\n0 0 0 1 0 0\n0 1 0 0 0 1\n",
        # --- counts and numbers
        "points_short_eof.vtk": HEAD42 + "POINTS 4 float\n0 0 0 1 0 0\n0 1 0\n",
        "points_short_keyword.vtk": HEAD42 + "POINTS 4 float\n0 0 0 1 0 0\n0 1 0\n" + TET42,
        "bad_number.vtk": HEAD42 + "POINTS 4 float\n0 0 0 1 0 0\n0 1.0.0 0 0 0 1\n" + TET42,
        "negative_points.vtk": HEAD42 + "POINTS -3 float\n0 0 0\n",
        "negative_cells.vtk": HEAD42 + PTS4 + "CELLS -1 5\n4 0 1 2 3\nCELL_TYPES 1\n10\n",
        "points_beyond_file.vtk": HEAD42 + "POINTS 100000000 float\n0 0 0 1 0 0\n",
        "binary_points_beyond_file.vtk": HEAD42.replace("ASCII", "BINARY") + "POINTS 100000000 double\n" + "\0" * 48 + "\n",
        "huge_points.vtk": HEAD42 + "POINTS 1000000000000 float\n0 0 0 1 0 0\n",
        "huge_cells.vtk": HEAD42 + PTS4 + "CELLS 1000000000000 5000000000000\n4 0 1 2 3\n",
        "pointdata_count.vtk": HEAD42 + PTS4 + TET42 + "POINT_DATA 5\nSCALARS p float 1\nLOOKUP_TABLE default\n1 2 3 4 5\n",
        # --- topology
        "cell_index_range.vtk": HEAD42 + PTS4 + "CELLS 2 9\n4 0 1 2 3\n3 0 1 7\nCELL_TYPES 2\n10 5\n",
        "cell_index_negative.vtk": HEAD42 + PTS4 + "CELLS 1 4\n3 0 -1 2\nCELL_TYPES 1\n5\n",
        # Variable-size cell types with no nodes (found by FuzzReadVTK).
        "cell_zero_nodes_polygon.vtk": HEAD42 + PTS4 + "CELLS 2 5\n3 0 1 2\n0\nCELL_TYPES 2\n5 7\n",
        "cell_zero_nodes_strip.vtk": HEAD42 + PTS4 + "CELLS 2 5\n3 0 1 2\n0\nCELL_TYPES 2\n5 6\n"
        "CELL_DATA 2\nSCALARS c float\nLOOKUP_TABLE default\n1 2\n",
        "celltype_mismatch.vtk": HEAD42 + PTS4 + "CELLS 1 4\n3 0 1 2\nCELL_TYPES 1\n10\n",
        "celltype_unknown.vtk": HEAD42 + PTS4 + "CELLS 1 4\n3 0 1 2\nCELL_TYPES 1\n99\n",
        "celltype_polyhedron.vtk": HEAD42 + PTS4 + "CELLS 1 5\n4 0 1 2 3\nCELL_TYPES 1\n42\n",
        "cells_size_mismatch.vtk": HEAD42 + PTS4 + "CELLS 1 6\n4 0 1 2 3\nCELL_TYPES 1\n10\n",
        "celltypes_count.vtk": HEAD42 + PTS4 + "CELLS 1 5\n4 0 1 2 3\nCELL_TYPES 2\n10 10\n",
        # --- 5.1 offsets
        "v51_offsets_first.vtk": HEAD51 + PTS4 + tet51("1 4", "0 1 2 3", "10"),
        "v51_offsets_last.vtk": HEAD51 + PTS4 + tet51("0 3", "0 1 2 3", "10"),
        "v51_offsets_decreasing.vtk": HEAD51 + PTS4 + tet51("0 3 1 4", "0 1 2 3", "5 3 5"),
        "v51_celltypes_count.vtk": HEAD51 + PTS4 + tet51("0 4", "0 1 2 3", "10 10"),
        "v51_huge_offsets.vtk": HEAD51 + PTS4 + tet51("0 4", "0 1 2 3", "10", "CELLS 1000000000001 1000000000000"),
        # --- values that are legal: NaN and Inf are kept (VTK TestLegacyArrayInfNan)
        "nan_values.vtk": HEAD42 + PTS4 + TET42 + "POINT_DATA 4\nSCALARS p double 1\nLOOKUP_TABLE default\n"
        "nan -nan inf 1.5\nFIELD FieldData 1\nq 2 4 float\n0 NaN -Inf 2\n3 4 5 6\n",
    }


def binary_cases(src):
    """Cuts of the VTK-written binary file src, plus declared-count bombs."""
    data = open(src, "rb").read()
    cases = {}
    i = data.index(b"POINTS 12 double\n") + len(b"POINTS 12 double\n")
    cases["binary_truncated_points.vtk"] = data[: i + 100]  # 12 full doubles + 4 bytes of the 13th
    j = data.index(b"CELL_TYPES 12\n") + len(b"CELL_TYPES 12\n")
    cases["binary_truncated_celltypes.vtk"] = data[: j + 10]  # 2 types and 2 bytes of the third
    m = data.index(b"METADATA")
    cases["binary_truncated_tail.vtk"] = data[: m - 61]  # inside the last FIELD array ("wall shear")
    o = data.index(b"OFFSETS vtktypeint64\n") + len(b"OFFSETS vtktypeint64\n")
    cases["binary_offsets_decreasing.vtk"] = data[: o + 8 * 5] + be_q(1) + data[o + 8 * 6:]  # offsets[5] = 1
    c = data.index(b"CONNECTIVITY vtktypeint64\n") + len(b"CONNECTIVITY vtktypeint64\n")
    cases["binary_cell_index_range.vtk"] = data[: c + 8 * 7] + be_q(99) + data[c + 8 * 8:]  # conn[7] = 99
    head = data[: data.index(b"POINTS")]
    cases["binary_huge_points.vtk"] = head + b"POINTS 1000000000000 float\n" + b"\0" * 48 + b"\n"
    k = data.index(b"CELLS 13 36\n")
    cases["binary_huge_cells.vtk"] = data[:k] + b"CELLS 1000000000001 1000000000000\n" + data[k + len(b"CELLS 13 36\n"):]
    return cases


def be_q(v):
    return v.to_bytes(8, "big", signed=True)


def gz(b):
    buf = io.BytesIO()
    with gzip.GzipFile(filename="", mode="wb", fileobj=buf, mtime=0, compresslevel=9) as g:
        g.write(b)
    return buf.getvalue()


def bomb_whitespace():
    """A gzip stream whose declared counts are small but which inflates to
    about 16 MB: blank lines between the header and POINTS."""
    return gz((HEAD42).encode() + b"\n" * (16 << 20) + PTS4.encode() + TET42.encode())


def spoints_blank_bomb():
    """A 267-byte gzip stream: 130 KB of blank lines, then a STRUCTURED_POINTS
    grid of 10^6 implicit points with no data at all. Nothing in the file
    backs a million points; reading it must not allocate tens of MB."""
    return gz(b"# vtk DataFile Version 4.2\nx\nASCII\nDATASET STRUCTURED_POINTS\n" + b"\n" * 130000
              + b"DIMENSIONS 100 100 100\nSPACING 1 1 1\nORIGIN 0 0 0\n")


def bomb():
    """A valid-looking gzip stream that inflates to about 30 MB of ASCII zeros."""
    n = 5_000_000
    buf = io.BytesIO()
    with gzip.GzipFile(filename="", mode="wb", fileobj=buf, mtime=0, compresslevel=9) as g:
        g.write((HEAD42 + "POINTS %d float\n" % n).encode())
        row = b"0 0 0\n" * 10000
        for _ in range(n // 10000):
            g.write(row)
    return buf.getvalue()


def main():
    out = sys.argv[1] if len(sys.argv) > 1 else "testdata/malformed"
    os.makedirs(out, exist_ok=True)
    for name, text in ascii_cases().items():
        with open(os.path.join(out, name), "wb") as f:
            f.write(text.encode())
    for name, raw in binary_cases("testdata/vtk/ugrid_tri2d_v51_binary.vtk").items():
        with open(os.path.join(out, name), "wb") as f:
            f.write(raw)
    with open(os.path.join(out, "bomb.vtk.gz"), "wb") as f:
        f.write(bomb())
    with open(os.path.join(out, "bomb_whitespace.vtk.gz"), "wb") as f:
        f.write(bomb_whitespace())
    with open(os.path.join(out, "spoints_blank_bomb.vtk.gz"), "wb") as f:
        f.write(spoints_blank_bomb())
    gz = open("testdata/vtk/ugrid_mixed_v51_binary.vtk.gz", "rb").read()
    with open(os.path.join(out, "truncated.vtk.gz"), "wb") as f:
        f.write(gz[: len(gz) // 2])
    zs = open("testdata/vtk/ugrid_mixed_v51_binary.vtk.zst", "rb").read()
    with open(os.path.join(out, "truncated.vtk.zst"), "wb") as f:
        f.write(zs[: len(zs) // 2])


if __name__ == "__main__":
    main()
