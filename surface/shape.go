package surface

import (
	"fmt"
	"math"
	"strconv"
)

// Shape is an exact closed control surface (3D) or contour (2D). Shapes are
// immutable values, safe for concurrent use.
type Shape interface {
	// Dim returns 3 for a surface, 2 for a contour in a plane z = const
	// (0 for a file surface whose zone is not loaded yet).
	Dim() int
	// String returns the spec of the shape; ParseSpec(s.String()) gives
	// back an equal shape.
	String() string
	// Pivot returns the point about which Scaled scales the shape (its
	// centre).
	Pivot() [3]float64
	// Scaled returns the shape scaled by k > 0 about Pivot, keeping its
	// resolution setting. It panics if k is not positive (programmer error).
	Scaled(k float64) Shape
	// ExactArea returns the area (length in 2D) of the exact shape; for
	// flat shapes it equals the tessellated area.
	ExactArea() float64
	// Resolution returns the facets=/size= setting (zero when the size
	// follows the mesh).
	Resolution() Resolution
	// Tessellate returns the facets of the shape. size gives the target
	// edge length at a point and is used only when Resolution is zero; a
	// 2D shape puts its vertices at z. Errors: bad size values, a facet
	// count above MaxFacets, a file shape without its zone.
	Tessellate(size SizeFunc, z float64) (*Facets, error)
}

// SizeFunc returns the target facet edge length (metres) near point p; it
// must be positive and finite. The default one follows the mesh cell size.
type SizeFunc func(p [3]float64) float64

// MaxFacets bounds the facet count of any tessellation, so that a tiny size
// or a huge surface fails with an error instead of exhausting memory.
const MaxFacets = 20_000_000

// Resolution is the optional facets=N / size=H setting of a shape. At most
// one of the two is non-zero; both zero means the size follows the mesh.
type Resolution struct {
	// Facets is the approximate total number of facets wanted.
	Facets int
	// Size is the wanted facet edge length in metres.
	Size float64
}

// specFields returns the " facets=N" or " size=H" suffix of a spec.
func (r Resolution) specFields() string {
	switch {
	case r.Facets > 0:
		return " facets=" + strconv.Itoa(r.Facets)
	case r.Size > 0:
		return " size=" + fnum(r.Size)
	}
	return ""
}

// uniform returns the fixed edge length of r for a shape of area (length
// in 2D) area whose facets each cover perFacet·h² (h in 2D), or 0 when r
// is unset.
func (r Resolution) uniform(area, perFacet float64) float64 {
	switch {
	case r.Size > 0:
		return r.Size
	case r.Facets > 0:
		if perFacet == 0 { // 2D: length per segment is h
			return area / float64(r.Facets)
		}
		return math.Sqrt(area / (perFacet * float64(r.Facets)))
	}
	return 0
}

// sizer returns the size function to use for a shape with resolution r:
// a constant when r fixes it, else size. It fails when neither is usable.
func (r Resolution) sizer(spec string, size SizeFunc, area, perFacet float64) (SizeFunc, error) {
	if h := r.uniform(area, perFacet); h > 0 {
		if !finite(h) {
			return nil, fmt.Errorf("surface %q: facet size %g is not finite", spec, h)
		}
		return func([3]float64) float64 { return h }, nil
	}
	if size == nil {
		return nil, fmt.Errorf("surface %q: no facet size: give facets=N or size=H, or cut it through a mesh", spec)
	}
	return size, nil
}

// Scale returns s scaled by k about its centre; see Shape.Scaled.
func Scale(s Shape, k float64) Shape { return s.Scaled(k) }

// checkScale panics on a non-positive or non-finite scale factor.
func checkScale(k float64) {
	if !(k > 0) || math.IsInf(k, 0) {
		panic(fmt.Sprintf("surface: scale factor %g must be positive and finite", k))
	}
}

// fnum formats v so that strconv.ParseFloat gives back the same bits.
func fnum(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

// fvec formats a vector as comma-separated numbers.
func fvec(v ...float64) string {
	s := ""
	for i, x := range v {
		if i > 0 {
			s += ","
		}
		s += fnum(x)
	}
	return s
}

// sizeAt evaluates size at p and checks that the result is usable.
func sizeAt(size SizeFunc, spec string, p [3]float64) (float64, error) {
	h := size(p)
	if !(h > 0) || math.IsInf(h, 0) {
		return 0, fmt.Errorf("surface %q: facet size %g near (%g, %g, %g) is not a positive finite length", spec, h, p[0], p[1], p[2])
	}
	return h, nil
}
