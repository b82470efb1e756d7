package surface

import (
	"fmt"
	"math"

	"farforce/field"
)

// loadMesh turns zone z of file path into a checked, outward-oriented
// fileMesh; see FileSurface.
func loadMesh(path string, z *field.Zone) (*fileMesh, error) {
	if z == nil {
		return nil, fmt.Errorf("surface file %q: no zone", path)
	}
	if err := z.Validate(); err != nil {
		return nil, fmt.Errorf("surface file %q: %w", path, err)
	}
	dim := 0
	for c := 0; c < z.NumCells(); c++ {
		d := 0
		switch z.Types[c] {
		case field.Vertex:
			continue
		case field.Line:
			d = 2
		case field.Triangle, field.Quad, field.Polygon:
			d = 3
		default:
			return nil, fmt.Errorf("surface file %q: cell %d is a %s; a surface needs triangles, quads or polygons (3D) or lines (2D)", path, c, z.Types[c])
		}
		if dim != 0 && d != dim {
			return nil, fmt.Errorf("surface file %q: cell %d is a %s but earlier cells are %s; a surface file holds either lines (2D) or polygons (3D)", path, c, z.Types[c], map[int]string{2: "lines", 3: "polygons"}[dim])
		}
		dim = d
	}
	if dim == 0 {
		return nil, fmt.Errorf("surface file %q: no line or polygon cells", path)
	}
	// Merge points with identical coordinates so that facets written with
	// their own copies of shared vertices still connect.
	f := &Facets{Dim: dim}
	id := make(map[[3]float64]int32)
	remap := make([]int32, z.NumPoints())
	for i := range remap {
		p := z.Point(int32(i))
		if !finite(p[:]...) {
			return nil, fmt.Errorf("surface file %q: point %d (%g, %g, %g) is not finite", path, i, p[0], p[1], p[2])
		}
		if dim == 2 && p[2] != z.Points[2] {
			return nil, fmt.Errorf("surface file %q: point %d has z = %g but point 0 has z = %g; a 2D contour lies in a plane z = const", path, i, p[2], z.Points[2])
		}
		j, ok := id[p]
		if !ok {
			j = int32(len(f.Verts))
			id[p] = j
			f.Verts = append(f.Verts, p)
		}
		remap[i] = j
	}
	for c := 0; c < z.NumCells(); c++ {
		nodes := z.CellNodes(c)
		switch z.Types[c] {
		case field.Line:
			f.Index = append(f.Index, remap[nodes[0]], remap[nodes[1]])
		case field.Triangle, field.Quad, field.Polygon:
			for i := 1; i+1 < len(nodes); i++ {
				f.Index = append(f.Index, remap[nodes[0]], remap[nodes[i]], remap[nodes[i+1]])
			}
		}
	}
	if err := orientClosed(path, f); err != nil {
		return nil, err
	}
	lo, hi := [3]float64{math.Inf(1), math.Inf(1), math.Inf(1)}, [3]float64{math.Inf(-1), math.Inf(-1), math.Inf(-1)}
	for _, p := range f.Verts {
		for k := 0; k < 3; k++ {
			lo[k], hi[k] = math.Min(lo[k], p[k]), math.Max(hi[k], p[k])
		}
	}
	area, _ := f.Measure()
	return &fileMesh{facets: f, centre: scale(add(lo, hi), 0.5), area: area}, nil
}

// edgeKey is an undirected edge (a < b) of a surface, or a vertex (a == b)
// of a contour.
type edgeKey struct{ a, b int32 }

// orientClosed checks that every edge (3D) or vertex (2D) of f is shared by
// exactly two facets, makes the facets of each connected component agree
// in orientation, and flips every component whose enclosed volume (area)
// is negative. Errors: an open or non-manifold edge, a non-orientable
// surface, a degenerate facet; point numbers are those after merging
// duplicates, 0-based.
func orientClosed(path string, f *Facets) error {
	n := f.Len()
	d := f.Dim
	// keys returns the shared entities of facet i with the direction in
	// which facet i traverses them (+1 along a→b, -1 against; for a
	// contour vertex, +1 if it is the facet's end, -1 if its start).
	keys := func(i int, dst []edgeKey, dir []int8) ([]edgeKey, []int8) {
		dst, dir = dst[:0], dir[:0]
		if d == 2 {
			a, b := f.Index[2*i], f.Index[2*i+1]
			return append(dst, edgeKey{a, a}, edgeKey{b, b}), append(dir, -1, 1)
		}
		for k := 0; k < 3; k++ {
			a, b := f.Index[3*i+k], f.Index[3*i+(k+1)%3]
			if a < b {
				dst, dir = append(dst, edgeKey{a, b}), append(dir, 1)
			} else {
				dst, dir = append(dst, edgeKey{b, a}), append(dir, -1)
			}
		}
		return dst, dir
	}
	what := map[int]string{2: "vertex", 3: "edge"}[d]
	users := make(map[edgeKey][]int32, n*3/2)
	var ks []edgeKey
	var ds []int8
	for i := 0; i < n; i++ {
		ks, ds = keys(i, ks, ds)
		for _, k := range ks {
			if d == 3 && k.a == k.b || d == 2 && f.Index[2*i] == f.Index[2*i+1] {
				return fmt.Errorf("surface file %q: facet %d is degenerate (repeats point %d)", path, i, k.a)
			}
			users[k] = append(users[k], int32(i))
		}
	}
	for i := 0; i < n; i++ { // report the first bad entity in facet order
		ks, ds = keys(i, ks, ds)
		for _, k := range ks {
			if u := len(users[k]); u != 2 {
				return fmt.Errorf("surface file %q: %s %s is used by %d facets; a closed surface needs exactly 2", path, what, entityName(k), u)
			}
		}
	}
	flipped := make([]bool, n)
	seen := make([]bool, n)
	comp := make([]int32, 0, 64)
	var ks2 []edgeKey
	var ds2 []int8
	for start := 0; start < n; start++ {
		if seen[start] {
			continue
		}
		seen[start] = true
		comp = append(comp[:0], int32(start))
		for q := 0; q < len(comp); q++ {
			i := int(comp[q])
			ks, ds = keys(i, ks, ds)
			for e, k := range ks {
				dirI := ds[e]
				if flipped[i] {
					dirI = -dirI
				}
				u := users[k]
				j := int(u[0])
				if j == i {
					j = int(u[1])
				}
				ks2, ds2 = keys(j, ks2, ds2)
				var dirJ int8
				for e2, k2 := range ks2 {
					if k2 == k {
						dirJ = ds2[e2]
					}
				}
				if !seen[j] {
					seen[j] = true
					flipped[j] = dirJ == dirI // must traverse the shared entity the other way
					comp = append(comp, int32(j))
					continue
				}
				if flipped[j] {
					dirJ = -dirJ
				}
				if dirJ == dirI {
					return fmt.Errorf("surface file %q: the surface is not orientable (facets %d and %d around %s %s cannot agree)", path, i, j, what, entityName(k))
				}
			}
		}
		for _, i := range comp {
			if flipped[i] {
				j := d * int(i)
				f.Index[j], f.Index[j+1] = f.Index[j+1], f.Index[j]
			}
		}
		sub := &Facets{Dim: d, Verts: f.Verts}
		for _, i := range comp {
			sub.Index = append(sub.Index, f.Index[d*int(i):d*int(i)+d]...)
		}
		v := sub.SignedVolume()
		if v == 0 {
			return fmt.Errorf("surface file %q: the part holding facet %d encloses no volume", path, start)
		}
		if v < 0 {
			for _, i := range comp {
				j := d * int(i)
				f.Index[j], f.Index[j+1] = f.Index[j+1], f.Index[j]
			}
		}
	}
	return nil
}

func entityName(k edgeKey) string {
	if k.a == k.b {
		return fmt.Sprintf("at point %d", k.a)
	}
	return fmt.Sprintf("between points %d and %d", k.a, k.b)
}
