package field

import (
	"fmt"
	"slices"
)

// BoundaryFace is a face of a fluid cell that no other fluid cell shares: a
// piece of the mesh boundary (a wall, an outer or symmetry boundary, or the
// interface with blanked cells). In a 2D field a face is an edge of a
// triangle, quad or polygon.
type BoundaryFace struct {
	// Cell is the fluid cell the face belongs to.
	Cell CellRef
	// Face is the index of the face in Types[c].Faces() (for a polygon,
	// edge i joins its nodes i and i+1).
	Face int
	// Nodes are the face's point indices in zone Cell.Zone, in the order of
	// the face table. Orientation is not guaranteed: compare with the
	// cell's centroid, which lies on the fluid side.
	Nodes []int32
}

// BoundaryFaces returns the boundary faces of f whose node centroid
// satisfies inside (nil keeps every face), sorted by zone, cell and face.
//
// Only non-blank cells of the field's dimension (f.Dim(): volume cells in
// 3D, surface cells in 2D) count. A face is a boundary face when exactly one
// such cell uses it; faces are matched by the coordinates of their nodes,
// so faces shared between zones (partitions, blocks) are interior as long
// as their points coincide exactly. A face shared by three or more cells
// (a non-conforming mesh) is not a boundary face.
//
// Errors: a zone that fails Validate. Cost: one hash-map entry per distinct
// point and per face.
func BoundaryFaces(f *Field, inside func(p [3]float64) bool) ([]BoundaryFace, error) {
	for _, z := range f.Zones {
		if err := z.Validate(); err != nil {
			return nil, fmt.Errorf("field: boundary faces: %w", err)
		}
	}
	dim := f.Dim()
	// Merged point ids, so that faces match across zones.
	ids := make([][]int32, len(f.Zones))
	merged := map[[3]float64]int32{}
	for zi, z := range f.Zones {
		ids[zi] = make([]int32, z.NumPoints())
		for i := range ids[zi] {
			p := z.Point(int32(i))
			id, ok := merged[p]
			if !ok {
				id = int32(len(merged))
				merged[p] = id
			}
			ids[zi][i] = id
		}
	}
	type faceKey [4]int32 // sorted merged ids, unused slots -1
	count := map[faceKey]int32{}
	var faces []BoundaryFace
	var keys []faceKey
	var nodes []int32
	for zi, z := range f.Zones {
		for c := 0; c < z.NumCells(); c++ {
			if !boundaryCell(z, c, dim) {
				continue
			}
			cn := z.CellNodes(c)
			nf := cellFaceCount(z.Types[c], len(cn))
			for fi := 0; fi < nf; fi++ {
				nodes = cellFace(z.Types[c], cn, fi, nodes[:0])
				k := faceKey{-1, -1, -1, -1}
				for i, n := range nodes {
					k[i] = ids[zi][n]
				}
				slices.Sort(k[:len(nodes)])
				count[k]++
				keys = append(keys, k)
				faces = append(faces, BoundaryFace{Cell: CellRef{int32(zi), int32(c)}, Face: fi, Nodes: append([]int32(nil), nodes...)})
			}
		}
	}
	out := faces[:0]
	for i, fc := range faces {
		if count[keys[i]] != 1 {
			continue
		}
		if inside != nil && !inside(f.Zones[fc.Cell.Zone].centroid(fc.Nodes)) {
			continue
		}
		out = append(out, fc)
	}
	return out, nil
}

// boundaryCell reports whether cell c of z takes part in the boundary
// search of a field of dimension dim.
func boundaryCell(z *Zone, c, dim int) bool {
	if z.Blank != nil && z.Blank[c] {
		return false
	}
	t := z.Types[c]
	if dim == 2 {
		return t == Triangle || t == Quad || t == Polygon
	}
	return t.Dim() == 3
}

// cellFaceCount returns the number of faces (edges in 2D) of a cell of type
// t with n nodes.
func cellFaceCount(t CellType, n int) int {
	if t == Polygon {
		return n
	}
	return len(t.Faces())
}

// cellFace appends the point indices of face fi of a cell of type t with
// nodes cn to dst.
func cellFace(t CellType, cn []int32, fi int, dst []int32) []int32 {
	if t == Polygon {
		return append(dst, cn[fi], cn[(fi+1)%len(cn)])
	}
	for _, k := range t.Faces()[fi] {
		dst = append(dst, cn[k])
	}
	return dst
}
