package surface

import (
	"errors"
	"fmt"
	"math"

	"farforce/field"
)

// FileSurface is a closed surface (3D: triangles, quads or polygons) or a
// closed contour (2D: line cells in a plane z = const) given as a zone,
// typically read from a VTK POLYDATA file by the caller (this package does
// not read files). ParseSpec("file path=P") returns an unloaded
// FileSurface; the caller reads P and calls Load with the zone.
//
// Load merges points with identical coordinates, splits polygons into
// triangles about their first node, and checks that the surface is closed:
// every edge is shared by exactly two facets (every contour vertex by two
// segments). It orients the facets consistently and, per connected
// component, outward (positive enclosed volume or area). Scale, when not 0
// or 1, scales the surface about the centre of its bounding box.
type FileSurface struct {
	Path  string
	Scale float64
	Res   Resolution
	mesh  *fileMesh
}

// fileMesh is the loaded, checked and oriented surface of a FileSurface,
// in file coordinates. It is immutable once built.
type fileMesh struct {
	facets *Facets
	centre [3]float64
	area   float64
}

// ErrNotLoaded is returned when a FileSurface is used before Load.
var ErrNotLoaded = errors.New("the surface file is not loaded")

// Load returns a copy of s holding the surface of zone z, checked for
// closure and oriented outward. Errors name the file, the point indices
// (0-based, as in the file) and what was expected.
func (s FileSurface) Load(z *field.Zone) (FileSurface, error) {
	m, err := loadMesh(s.Path, z)
	if err != nil {
		return s, err
	}
	s.mesh = m
	return s, nil
}

// Loaded reports whether Load has given s its surface.
func (s FileSurface) Loaded() bool { return s.mesh != nil }

// Dim returns 3 for a surface, 2 for a contour, 0 before Load.
func (s FileSurface) Dim() int {
	if s.mesh == nil {
		return 0
	}
	return s.mesh.facets.Dim
}

// String returns the spec "file path=P [scale=K] [facets=N|size=H]".
func (s FileSurface) String() string {
	spec := "file path=" + s.Path
	if s.Scale != 0 && s.Scale != 1 {
		spec += " scale=" + fnum(s.Scale)
	}
	return spec + s.Res.specFields()
}

// factor returns the scale factor (1 when unset).
func (s FileSurface) factor() float64 {
	if s.Scale == 0 {
		return 1
	}
	return s.Scale
}

// Pivot returns the centre of the bounding box (the origin before Load).
func (s FileSurface) Pivot() [3]float64 {
	if s.mesh == nil {
		return [3]float64{}
	}
	return s.mesh.centre
}

// Scaled returns the surface scaled by k more about its bounding-box
// centre.
func (s FileSurface) Scaled(k float64) Shape {
	checkScale(k)
	s.Scale = s.factor() * k
	return s
}

// ExactArea returns the area (length in 2D) of the surface, which is its
// own exact shape (NaN before Load).
func (s FileSurface) ExactArea() float64 {
	if s.mesh == nil {
		return math.NaN()
	}
	k := s.factor()
	if s.mesh.facets.Dim == 2 {
		return s.mesh.area * k
	}
	return s.mesh.area * k * k
}

// Resolution returns the facets=/size= setting.
func (s FileSurface) Resolution() Resolution { return s.Res }

// Tessellate returns the file's facets, scaled, with a 2D contour put in
// the plane z. With a resolution, or with size flatFactor times the size
// function at each facet, facets longer than that are split uniformly
// (triangles into m² triangles, segments into m); new vertices lie on the
// original edges, so closure is kept to rounding. Error: ErrNotLoaded.
func (s FileSurface) Tessellate(size SizeFunc, z float64) (*Facets, error) {
	spec := s.String()
	if s.mesh == nil {
		return nil, fmt.Errorf("surface %q: %w", spec, ErrNotLoaded)
	}
	src := s.mesh.facets
	k, c := s.factor(), s.mesh.centre
	place := func(p [3]float64) [3]float64 {
		q := add(c, scale(sub(p, c), k))
		if src.Dim == 2 {
			q[2] = z
		}
		return q
	}
	fixed := s.Res.uniform(s.ExactArea(), map[int]float64{2: 0, 3: 0.5}[src.Dim])
	if fixed == 0 && size == nil {
		out := &Facets{Dim: src.Dim, Verts: make([][3]float64, len(src.Verts)), Index: append([]int32(nil), src.Index...)}
		for i, p := range src.Verts {
			out.Verts[i] = place(p)
		}
		return out, nil
	}
	out := &Facets{Dim: src.Dim}
	for i := 0; i < src.Len(); i++ {
		v := src.Facet(i)
		for j := 0; j < src.Dim; j++ {
			v[j] = place(v[j])
		}
		h := fixed
		if h == 0 {
			cen := scale(add(add(v[0], v[1]), v[2]), 1/float64(src.Dim))
			if src.Dim == 2 {
				cen = scale(add(v[0], v[1]), 0.5)
			}
			hs, err := sizeAt(size, spec, cen)
			if err != nil {
				return nil, err
			}
			h = flatFactor * hs
		}
		longest := norm(sub(v[1], v[0]))
		if src.Dim == 3 {
			longest = math.Max(longest, math.Max(norm(sub(v[2], v[1])), norm(sub(v[0], v[2]))))
		}
		m, err := divisions(spec, longest, h)
		if err != nil {
			return nil, err
		}
		if out.Len()+m*m > MaxFacets {
			return nil, fmt.Errorf("surface %q: more than %d facets; give a larger size= or fewer facets=", spec, MaxFacets)
		}
		if src.Dim == 2 {
			appendSplitSegment(out, v[0], v[1], m)
		} else {
			appendSplitTriangle(out, v[0], v[1], v[2], m)
		}
	}
	return out, nil
}

// appendSplitSegment appends segment a→b cut into m equal segments.
func appendSplitSegment(f *Facets, a, b [3]float64, m int) {
	base := int32(len(f.Verts))
	for i := 0; i <= m; i++ {
		f.Verts = append(f.Verts, lerp3(a, b, float64(i)/float64(m)))
	}
	for i := int32(0); i < int32(m); i++ {
		f.Index = append(f.Index, base+i, base+i+1)
	}
}

// appendSplitTriangle appends triangle a, b, c split into m² triangles of
// the same orientation on the grid a + (i/m)(b-a) + (j/m)(c-a).
func appendSplitTriangle(f *Facets, a, b, c [3]float64, m int) {
	base := int32(len(f.Verts))
	row := make([]int32, m+2) // row[j] = index of point (0, j)
	u, v := sub(b, a), sub(c, a)
	for j := 0; j <= m; j++ {
		row[j] = int32(len(f.Verts)) - base
		for i := 0; i+j <= m; i++ {
			f.Verts = append(f.Verts, add(a, add(scale(u, float64(i)/float64(m)), scale(v, float64(j)/float64(m)))))
		}
	}
	id := func(i, j int) int32 { return base + row[j] + int32(i) }
	for j := 0; j < m; j++ {
		for i := 0; i+j < m; i++ {
			f.Index = append(f.Index, id(i, j), id(i+1, j), id(i, j+1))
			if i+j < m-1 {
				f.Index = append(f.Index, id(i+1, j), id(i+1, j+1), id(i, j+1))
			}
		}
	}
}
