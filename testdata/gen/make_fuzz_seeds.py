#!/usr/bin/python3
"""make_fuzz_seeds.py writes the committed seed corpus of the reader fuzz targets.

The seeds are hand-made legacy VTK inputs for corners of the format that the
VTK-written fixtures (testdata/vtk) do not reach: CRLF line ends, a missing
final newline, lower-case keywords, a long title, METADATA blocks in BINARY,
a standalone LOOKUP_TABLE, TENSORS6, NULL_ARRAY field entries, STRUCTURED_POINTS
with the version-1 ASPECT_RATIO keyword in another order, empty 5.1 sections,
vtkGhostLevels in a version 3 file, a bare FIELD data set. Facts on the format
are from the legacy VTK format document and VTK's vtkDataReader (see
FORMATS.md section 1). The files are in Go's fuzz corpus format
("go test fuzz v1"), one []byte argument each (FuzzReadVTK) or a []byte and
a bool (FuzzParseNumber).

Usage, from the repository root:

    python3 testdata/gen/make_fuzz_seeds.py readers/testdata/fuzz
"""

import os
import struct
import sys

H42 = "# vtk DataFile Version 4.2\nseed\nASCII\nDATASET UNSTRUCTURED_GRID\n"
TET = "POINTS 4 float\n0 0 0 1 0 0 0 1 0 0 0 1\nCELLS 1 5\n4 0 1 2 3\nCELL_TYPES 1\n10\n"


def be(fmt, *v):
    return struct.pack(">" + fmt, *v)


def binary_tet_with_metadata():
    b = b"# vtk DataFile Version 5.1\nseed\nBINARY\nDATASET UNSTRUCTURED_GRID\n"
    b += b"POINTS 4 float\n" + be("12f", 0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1) + b"\n"
    b += b"METADATA\nINFORMATION 0\n\n"
    b += b"CELLS 2 4\nOFFSETS vtktypeint64\n" + be("2q", 0, 4) + b"\n"
    b += b"CONNECTIVITY vtktypeint64\n" + be("4q", 0, 1, 2, 3) + b"\n"
    b += b"CELL_TYPES 1\n" + be("i", 10) + b"\n"
    b += b"POINT_DATA 4\nSCALARS p double 1\nLOOKUP_TABLE default\n" + be("4d", 1.5, -2, 3e10, 0) + b"\n"
    b += b"METADATA\nCOMPONENT_NAMES\np%20x\n\n"
    b += b"FIELD FieldData 2\nq 2 4 short\n" + be("8h", *range(-4, 4)) + b"\nNULL_ARRAY\n"
    return b


def binary_little_endian():
    # Some third-party writers emit little-endian (FORMATS.md 1.9).
    b = b"# vtk DataFile Version 4.2\nseed\nBINARY\nDATASET UNSTRUCTURED_GRID\n"
    b += b"POINTS 3 float\n" + struct.pack("<9f", 0, 0, 0, 1, 0, 0, 0, 1, 0) + b"\n"
    b += b"CELLS 1 4\n" + struct.pack("<4i", 3, 0, 1, 2) + b"\n"
    b += b"CELL_TYPES 1\n" + struct.pack("<i", 5) + b"\n"
    return b


def seeds():
    return {
        "crlf": (H42 + TET + "POINT_DATA 4\nSCALARS t float\nLOOKUP_TABLE default\n1 2 3 4\n").replace("\n", "\r\n").encode(),
        "no_final_newline": (H42 + TET + "CELL_DATA 1\nSCALARS c int 1\nLOOKUP_TABLE default\n7").encode(),
        "lower_case": H42.lower().replace("# vtk datafile version", "# vtk DataFile Version").encode()
        + TET.lower().encode(),
        "long_title": ("# vtk DataFile Version 3.0\n" + "t" * 300 + "\nASCII\nDATASET UNSTRUCTURED_GRID\n" + TET).encode(),
        "lookup_table": (H42 + TET + "POINT_DATA 4\nSCALARS s float 1\nLOOKUP_TABLE mytable\n0 1 2 3\n"
                         "LOOKUP_TABLE mytable 2\n0 0 0 1 1 1 1 1\nTENSORS6 sym double\n"
                         + "1 2 3 4 5 6\n" * 4).encode(),
        "field_null_array": (H42 + TET + "CELL_DATA 1\nFIELD FieldData 3\nNULL_ARRAY\na 2 1 double\n1 2\n"
                             "b%20c 1 1 int\n5\n").encode(),
        "spoints_aspect": ("# vtk DataFile Version 1.0\nseed\nASCII\nDATASET STRUCTURED_POINTS\n"
                           "ORIGIN 0 0 0\nASPECT_RATIO 1 2 3\nDIMENSIONS 3 2 1\n"
                           "POINT_DATA 6\nSCALARS u float\nLOOKUP_TABLE default\n1 2 3 4 5 6\n").encode(),
        "v51_empty_sections": ("# vtk DataFile Version 5.1\nseed\nASCII\nDATASET POLYDATA\nPOINTS 3 double\n"
                               "0 0 0 1 0 0 0 1 0\nVERTICES 0 0\nOFFSETS vtktypeint64\n\nCONNECTIVITY vtktypeint64\n\n"
                               "POLYGONS 2 3\nOFFSETS vtktypeint64\n0 3\nCONNECTIVITY vtktypeint64\n0 1 2\n").encode(),
        "ghost_levels_v3": ("# vtk DataFile Version 3.0\nseed\nASCII\nDATASET UNSTRUCTURED_GRID\n" + TET
                            + "CELL_DATA 1\nSCALARS vtkGhostLevels unsigned_char\nLOOKUP_TABLE default\n1\n").encode(),
        # Regression: a 0-node POLYGONS cell in 5.1 (FuzzReadVTK found the
        # reader accepting it into the zone).
        "regress_zero_node_polygon": ("# vtk DataFile Version 5.1\nseed\nASCII\nDATASET POLYDATA\nPOINTS 3 float\n"
                                      "0 0 0 1 0 0 0 1 0\nPOLYGONS 3 3\nOFFSETS vtktypeint64\n0 3 3\n"
                                      "CONNECTIVITY vtktypeint64\n0 1 2\nCELL_DATA 2\nSCALARS c float\n"
                                      "LOOKUP_TABLE default\n1 2\n").encode(),
        "bare_field": b"# vtk DataFile Version 4.2\nseed\nASCII\nFIELD FieldData 1\nx 1 2 float\n1 2\n",
        "binary_metadata": binary_tet_with_metadata(),
        "binary_little_endian": binary_little_endian(),
    }


def golit(b):
    """Go interpreted string literal for bytes b."""
    out = []
    for c in b:
        if c == 0x22:
            out.append('\\"')
        elif c == 0x5C:
            out.append("\\\\")
        elif c == 0x0A:
            out.append("\\n")
        elif 0x20 <= c < 0x7F:
            out.append(chr(c))
        else:
            out.append("\\x%02x" % c)
    return '"' + "".join(out) + '"'


def main():
    root = sys.argv[1] if len(sys.argv) > 1 else "readers/testdata/fuzz"
    d = os.path.join(root, "FuzzReadVTK")
    os.makedirs(d, exist_ok=True)
    for name, b in seeds().items():
        with open(os.path.join(d, "seed_" + name), "w") as f:
            f.write("go test fuzz v1\n[]byte(%s)\n" % golit(b))
    d = os.path.join(root, "FuzzParseNumber")
    os.makedirs(d, exist_ok=True)
    for i, (tok, f32) in enumerate([("1.00000005960464477539062500", True), ("-NaN", False),
                                    ("9.999999999999999999999e-1", False), ("0x10", False)]):
        with open(os.path.join(d, "seed_%d" % i), "w") as f:
            f.write("go test fuzz v1\n[]byte(%s)\nbool(%s)\n" % (golit(tok.encode()), "true" if f32 else "false"))


if __name__ == "__main__":
    main()
