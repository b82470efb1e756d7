#!/usr/bin/env python3
"""Write the malformed ffcg corpus (Python standard library only).

Each file is the small valid case VALID below with one rule of
docs/cgns-text-format.md broken in one known place; the expected error of
each (sentinel, line, exact message) is in readers/ffcg_malformed_test.go.
Usage, from the repository root:  python3 testdata/ffcg/make_malformed.py testdata/ffcg/malformed
"""
import gzip
import os
import sys

VALID = """ffcg 1
# line 2: a valid two-zone case that every file below breaks once
base B CellDimension=2 PhysicalDimension=2
  zone S Structured VertexSize=3,2
    GridCoordinates
      data CoordinateX R8 6
        0 1 2 0 1 2
      data CoordinateY R8 6
        0 0 0 1 1 1
    end GridCoordinates
    FlowSolution C GridLocation=CellCenter Rind=1,1,0,0
      data Pressure R8 4
        0 1 2 0
    end FlowSolution
    ZoneBC
      BC Wall BCWall PointRange=1,1,3,1
      end BC
    end ZoneBC
  end zone
  zone U Unstructured VertexSize=4 CellSize=2
    GridCoordinates
      data CoordinateX R8 4
        0 1 1 0
      data CoordinateY R8 4
        2 2 3 3
    end GridCoordinates
    Elements Tris TRI_3 ElementRange=1,2
      data ElementConnectivity I4 6
        1 2 3
        1 3 4
    end Elements
    FlowSolution V
      data Density R8 4
        1 1 1 1
      data MomentumX R8 4
        2 2 2 2
    end FlowSolution
  end zone
end base
"""

# name -> (old text, new text); the old text must occur in VALID.
CASES = {
    "bad_magic": ("ffcg 1\n", "ffcg one\n"),
    "not_base": ("base B CellDimension=2", "bass B CellDimension=2"),
    "bad_dimension": ("CellDimension=2 PhysicalDimension=2", "CellDimension=3 PhysicalDimension=2"),
    "unknown_attribute": ("zone S Structured VertexSize=3,2", "zone S Structured VertexSiz=3,2"),
    "vertexsize_count": ("VertexSize=3,2\n", "VertexSize=3,2,2\n"),
    "huge_structured": ("VertexSize=3,2\n", "VertexSize=100000,100000\n"),
    "coordinate_count": ("data CoordinateX R8 6", "data CoordinateX R8 5"),
    "bad_number": ("0 1 2 0 1 2", "0 1 2 0 1x 2"),
    "comment_in_values": ("0 0 0 1 1 1", "0 0 0 # y = 1\n 1 1 1"),
    "extra_values": ("0 1 2 0 1 2", "0 1 2 0 1 2 7"),
    "unknown_type": ("data CoordinateY R8 6", "data CoordinateY R16 6"),
    "rind_count": ("data Pressure R8 4", "data Pressure R8 2"),
    "rind_list": ("Rind=1,1,0,0", "Rind=1,1"),
    "gridlocation": ("GridLocation=CellCenter", "GridLocation=FaceCenter"),
    "bc_type": ("BC Wall BCWall", "BC Wall BCWal"),
    "bc_range": ("PointRange=1,1,3,1", "PointRange=1,1,4,1"),
    "end_mismatch": ("    end GridCoordinates\n    FlowSolution C", "    end FlowSolution\n    FlowSolution C"),
    "missing_coordinate": ("      data CoordinateY R8 4\n        2 2 3 3\n", ""),
    "huge_vertices": ("VertexSize=4 CellSize=2\n    GridCoordinates\n      data CoordinateX R8 4",
                      "VertexSize=2000000000 CellSize=2\n    GridCoordinates\n      data CoordinateX R8 2000000000"),
    "huge_count": ("Tris TRI_3 ElementRange=1,2\n      data ElementConnectivity I4 6",
                   "Tris MIXED ElementRange=1,2\n      data ElementConnectivity I4 6000000000000"),
    "element_type": ("Tris TRI_3", "Tris TRI_4"),
    "nface": ("Tris TRI_3", "Tris NFACE_n"),
    "node_range": ("1 3 4\n", "1 3 5\n"),
    "connectivity_count": ("data ElementConnectivity I4 6", "data ElementConnectivity I4 5"),
    "mixed_type": ("Tris TRI_3 ElementRange=1,2\n      data ElementConnectivity I4 6\n        1 2 3\n        1 3 4\n",
                   "Tris MIXED ElementRange=1,2\n      data ElementConnectivity I4 8\n        22 1 2 3\n        5 1 3 4\n"),
    "mixed_short": ("Tris TRI_3 ElementRange=1,2\n      data ElementConnectivity I4 6\n        1 2 3\n        1 3 4\n",
                    "Tris MIXED ElementRange=1,2\n      data ElementConnectivity I4 7\n        5 1 2 3\n        5 1 3\n"),
    "ngon_offsets": ("Tris TRI_3 ElementRange=1,2", "Tris NGON_n ElementRange=1,2"),
    "cellsize_gap": ("VertexSize=4 CellSize=2", "VertexSize=4 CellSize=3"),
    "range_gap": ("ElementRange=1,2", "ElementRange=2,3"),
    "float_connectivity": ("data ElementConnectivity I4 6", "data ElementConnectivity R8 6"),
    "zero_density": ("        1 1 1 1\n      data MomentumX", "        1 1 0 1\n      data MomentumX"),
    "truncated": ("        2 2 2 2\n    end FlowSolution\n  end zone\nend base\n", "        2 2"),
    "missing_end": ("  end zone\nend base\n", "  end zone\n"),
    "duplicate_array": ("data MomentumX R8 4", "data Density R8 4"),
}


def main(out):
    os.makedirs(out, exist_ok=True)
    for name, (old, new) in CASES.items():
        assert VALID.count(old) >= 1, name
        with open(os.path.join(out, name + ".ffcg"), "w") as f:
            f.write(VALID.replace(old, new, 1))
    with open(os.path.join(out, "valid.ffcg"), "w") as f:
        f.write(VALID)
    # The first half of the gzip stream of VALID: the decompressor runs dry.
    z = gzip.compress(VALID.encode(), mtime=0)
    with open(os.path.join(out, "truncated.ffcg.gz"), "wb") as f:
        f.write(z[: len(z) // 2])
    # 8 MiB of blank lines inside a value block: compressed to a few KiB,
    # rejected by Options.MaxBytes without holding the text.
    bomb = VALID.replace("0 1 2 0 1 2", "0 1" + "\n" * (8 << 20) + "2 0 1 2", 1)
    with open(os.path.join(out, "bomb.ffcg.gz"), "wb") as f:
        f.write(gzip.compress(bomb.encode(), mtime=0))


if __name__ == "__main__":
    main(sys.argv[1])
