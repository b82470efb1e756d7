package surface

import (
	"fmt"
	"math"
	"strings"

	"farforce/field"
)

// Plane is an open wake plane (a Trefftz plane): the flat region through
// Origin normal to Normal (unit, pointing downstream, out of the control
// volume), bounded by a rectangle or a circle given in the plane's own
// coordinates (s1, s2) = ((x − Origin)·E1, (x − Origin)·E2). The in-plane
// axes are
//
//	E2 = the component of Up normal to Normal, normalised ("lift" axis)
//	E1 = E2 × Normal                                  ("span" axis)
//
// so (E1, E2, Normal) is right-handed; for the plane x = X with Up = +z,
// Origin = (X, 0, 0), E1 = +y, E2 = +z and (s1, s2) = (y, z). In a 2D field
// the plane is the segment s1 ∈ [Min[0], Max[0]] along E1 = ẑ × Normal.
//
// Unlike the closed shapes a Plane has no closure requirement; CutSurface
// still checks that every facet lies in fluid cells. A Plane with neither
// bounds nor radius is "the mesh section": Fit replaces it by the
// rectangle of the mesh's bounding box projected on the plane (exact for
// an axis-aligned box mesh; give bounds otherwise).
//
// Plane is a value type, safe for concurrent use.
type Plane struct {
	// Origin is the plane's reference point (m), Normal its unit normal
	// and Up the wanted lift direction (zero: +z, see Axes).
	Origin, Normal, Up [3]float64
	// Min, Max bound a rectangle in (s1, s2); used when Radius is zero.
	Min, Max [2]float64
	// Radius > 0 makes the plane the disc of that radius about Center
	// (in (s1, s2)).
	Radius float64
	Center [2]float64
	// Bounded is false for the mesh section (no bounds given).
	Bounded bool
	// Dim2 marks a plane of a 2D field: a segment (Fit sets it).
	Dim2 bool
	// Res is the optional facets=/size= setting of the tessellation.
	Res Resolution
}

// planeKeys are the keys of a plane spec.
var planeKeys = []string{"x", "origin", "normal", "up", "ymin", "ymax", "zmin", "zmax", "radius", "center", "facets", "size"}

// ParsePlane reads a wake-plane spec, optionally starting with the word
// "plane":
//
//	x=X [ymin=A ymax=B zmin=C zmax=D] [size=H|facets=N]
//	x=X radius=R [center=Y,Z]
//	origin=X,Y,Z normal=NX,NY,NZ [up=UX,UY,UZ] [ymin=.. ymax=.. zmin=.. zmax=..|radius=R [center=S1,S2]]
//
// x=X is the plane normal to +x through (X, 0, 0). ymin..zmax are the
// bounds along E1 and E2 (y and z for x=X); all four or none (none: the
// mesh section; in 2D only ymin and ymax). up defaults to +z, or +y when
// the normal is within 8° of z. Errors are *SpecError values naming the
// key.
func ParsePlane(spec string) (Plane, error) {
	fields := strings.Fields(spec)
	if len(fields) > 0 && strings.EqualFold(fields[0], "plane") {
		fields = fields[1:]
	}
	vals := make(map[string]string)
	for _, f := range fields {
		k, v, ok := strings.Cut(f, "=")
		if !ok || k == "" {
			return Plane{}, &SpecError{spec, "", fmt.Sprintf("field %q is not key=value", f)}
		}
		k = strings.ToLower(k)
		if !contains(planeKeys, k) {
			return Plane{}, &SpecError{spec, k, "unknown key for a plane; expected one of " + strings.Join(planeKeys, ", ")}
		}
		if _, dup := vals[k]; dup {
			return Plane{}, &SpecError{spec, k, "given twice"}
		}
		vals[k] = v
	}
	p := parser{spec: spec, vals: vals}
	pl := Plane{Res: p.resolution(), Normal: [3]float64{1, 0, 0}}
	_, hasX := vals["x"]
	_, hasO := vals["origin"]
	switch {
	case hasX && hasO:
		p.fail("x", "give x= or origin= with normal=, not both")
	case hasX:
		pl.Origin[0] = p.numbers("x", vals["x"], 1, "a number")[0]
		if _, ok := vals["normal"]; ok {
			p.fail("normal", "x=X fixes the normal to +x; use origin= with normal=")
		}
	case hasO:
		pl.Origin = p.vec3("origin")
		if _, ok := vals["normal"]; !ok {
			p.fail("origin", "needs normal=NX,NY,NZ")
		} else {
			pl.Normal = p.vec3("normal")
		}
	default:
		p.fail("x", "missing; a plane needs x=X or origin= and normal=")
	}
	if p.err == nil {
		if norm(pl.Normal) == 0 {
			p.fail("normal", "must not be the zero vector")
		}
		pl.Normal = unit(pl.Normal)
	}
	if _, ok := vals["up"]; ok {
		pl.Up = p.vec3("up")
	}
	n := 0
	for _, k := range []string{"ymin", "ymax", "zmin", "zmax"} {
		if _, ok := vals[k]; ok {
			n++
		}
	}
	_, hasR := vals["radius"]
	switch {
	case hasR && n > 0:
		p.fail("radius", "give radius= or the bounds ymin.. zmax, not both")
	case hasR:
		pl.Radius, pl.Bounded = p.positive("radius"), true
		if _, ok := vals["center"]; ok {
			pl.Center = p.vec2("center")
		}
	case n == 4 || n == 2 && hasKey(vals, "ymin") && hasKey(vals, "ymax"):
		pl.Bounded = true
		pl.Min[0] = p.numbers("ymin", vals["ymin"], 1, "a number")[0]
		pl.Max[0] = p.numbers("ymax", vals["ymax"], 1, "a number")[0]
		if n == 4 {
			pl.Min[1] = p.numbers("zmin", vals["zmin"], 1, "a number")[0]
			pl.Max[1] = p.numbers("zmax", vals["zmax"], 1, "a number")[0]
		} else {
			pl.Dim2 = true // only valid for a 2D field; Fit checks
		}
		for i, k := range []string{"ymax", "zmax"} {
			if i == 1 && n != 4 {
				break
			}
			if p.err == nil && !(pl.Max[i] > pl.Min[i]) {
				p.fail(k, fmt.Sprintf("%g must exceed the minimum %g", pl.Max[i], pl.Min[i]))
			}
		}
	case n > 0:
		p.fail("ymin", "give all four bounds ymin, ymax, zmin, zmax (2D: ymin, ymax), or none for the mesh section")
	}
	if _, ok := vals["center"]; ok && !hasR {
		p.fail("center", "only with radius=")
	}
	if p.err != nil {
		return Plane{}, p.err
	}
	if _, _, _, err := pl.Axes(); err != nil {
		return Plane{}, &SpecError{spec, "up", err.Error()}
	}
	return pl, nil
}

// hasKey reports whether the spec gave key k.
func hasKey(m map[string]string, k string) bool { _, ok := m[k]; return ok }

// Axes returns the in-plane axes E1, E2 and the unit normal (see Plane).
// It fails when Up is parallel to the normal.
func (p Plane) Axes() (e1, e2, n [3]float64, err error) {
	n = unit(p.Normal)
	if p.Dim2 {
		e1 = [3]float64{-n[1], n[0], 0} // ẑ × n
		return e1, [3]float64{0, 0, 1}, n, nil
	}
	up := p.Up
	if up == ([3]float64{}) {
		up = [3]float64{0, 0, 1}
		if math.Abs(n[2]) > math.Cos(8*math.Pi/180) {
			up = [3]float64{0, 1, 0}
		}
	}
	l := sub(up, scale(n, dot(up, n)))
	if norm(l) <= 1e-9*norm(up) {
		return e1, e2, n, fmt.Errorf("up axis (%g, %g, %g) is parallel to the plane normal", up[0], up[1], up[2])
	}
	e2 = unit(l)
	e1 = cross(e2, n)
	return e1, e2, n, nil
}

// At returns the point with plane coordinates (s1, s2).
func (p Plane) At(s1, s2 float64) [3]float64 {
	e1, e2, _, _ := p.Axes()
	return add(p.Origin, add(scale(e1, s1), scale(e2, s2)))
}

// Coords returns the plane coordinates (s1, s2) of x.
func (p Plane) Coords(x [3]float64) (s1, s2 float64) {
	e1, e2, _, _ := p.Axes()
	d := sub(x, p.Origin)
	return dot(d, e1), dot(d, e2)
}

// Dim returns 2 for a 2D plane (a segment), else 3.
func (p Plane) Dim() int {
	if p.Dim2 {
		return 2
	}
	return 3
}

// String returns the spec, which ParsePlane reads back (the mesh section
// prints no bounds).
func (p Plane) String() string {
	var b strings.Builder
	b.WriteString("plane")
	if p.Normal == [3]float64{1, 0, 0} && p.Origin[1] == 0 && p.Origin[2] == 0 && p.Up == ([3]float64{}) {
		b.WriteString(" x=" + fnum(p.Origin[0]))
	} else {
		b.WriteString(" origin=" + fvec(p.Origin[:]...) + " normal=" + fvec(p.Normal[:]...))
		if p.Up != ([3]float64{}) {
			b.WriteString(" up=" + fvec(p.Up[:]...))
		}
	}
	switch {
	case !p.Bounded:
	case p.Radius > 0:
		b.WriteString(" radius=" + fnum(p.Radius))
		if p.Center != ([2]float64{}) {
			b.WriteString(" center=" + fvec(p.Center[:]...))
		}
	case p.Dim2:
		b.WriteString(" ymin=" + fnum(p.Min[0]) + " ymax=" + fnum(p.Max[0]))
	default:
		b.WriteString(" ymin=" + fnum(p.Min[0]) + " ymax=" + fnum(p.Max[0]) + " zmin=" + fnum(p.Min[1]) + " zmax=" + fnum(p.Max[1]))
	}
	b.WriteString(p.Res.specFields())
	return b.String()
}

// Pivot returns the centre of the bounded region.
func (p Plane) Pivot() [3]float64 {
	if p.Radius > 0 {
		return p.At(p.Center[0], p.Center[1])
	}
	if p.Dim2 {
		return p.At((p.Min[0]+p.Max[0])/2, 0)
	}
	return p.At((p.Min[0]+p.Max[0])/2, (p.Min[1]+p.Max[1])/2)
}

// Scaled returns the plane with its bounds scaled by k about their centre
// (the station is unchanged).
func (p Plane) Scaled(k float64) Shape {
	checkScale(k)
	if p.Radius > 0 {
		p.Radius *= k
		return p
	}
	for i := 0; i < 2; i++ {
		c, h := (p.Min[i]+p.Max[i])/2, (p.Max[i]-p.Min[i])/2*k
		p.Min[i], p.Max[i] = c-h, c+h
	}
	return p
}

// ExactArea returns the area of the rectangle or disc (length in 2D).
func (p Plane) ExactArea() float64 {
	switch {
	case p.Radius > 0:
		return math.Pi * p.Radius * p.Radius
	case p.Dim2:
		return p.Max[0] - p.Min[0]
	}
	return (p.Max[0] - p.Min[0]) * (p.Max[1] - p.Min[1])
}

// Resolution returns the facets=/size= setting.
func (p Plane) Resolution() Resolution { return p.Res }

// Tessellate returns the facets of the plane, oriented along Normal: a
// rectangle as a grid of triangle pairs, a disc as rings of an inscribed
// polygon, a 2D plane as segments. Errors: an unbounded plane (call Fit),
// bad bounds or size, too many facets.
func (p Plane) Tessellate(size SizeFunc, z float64) (*Facets, error) {
	spec := p.String()
	if !p.Bounded {
		return nil, fmt.Errorf("surface %q: the mesh section has no bounds yet; fit it to a mesh first", spec)
	}
	e1, e2, _, err := p.Axes()
	if err != nil {
		return nil, fmt.Errorf("surface %q: %w", spec, err)
	}
	if p.Dim2 {
		a, b := p.At(p.Min[0], 0), p.At(p.Max[0], 0)
		a[2], b[2] = z, z
		h, err := flatSize(spec, p.Res, size, p.ExactArea(), 0, lineSamples(a, b))
		if err != nil {
			return nil, err
		}
		m, err := divisions(spec, p.ExactArea(), h)
		if err != nil {
			return nil, err
		}
		f := &Facets{Dim: 2}
		for k := 0; k <= m; k++ {
			f.Verts = append(f.Verts, lerp3(a, b, float64(k)/float64(m)))
		}
		for k := 0; k < m; k++ {
			f.Index = append(f.Index, int32(k), int32(k+1))
		}
		return f, nil
	}
	if p.Radius > 0 {
		return p.tessellateDisc(spec, size, e1, e2)
	}
	o := p.At(p.Min[0], p.Min[1])
	u := scale(e1, p.Max[0]-p.Min[0])
	v := scale(e2, p.Max[1]-p.Min[1])
	h, err := flatSize(spec, p.Res, size, p.ExactArea(), 0.5, faceSamples(o, u, v))
	if err != nil {
		return nil, err
	}
	mu, err := divisions(spec, norm(u), h)
	if err != nil {
		return nil, err
	}
	mv, err := divisions(spec, norm(v), h)
	if err != nil {
		return nil, err
	}
	if 2*float64(mu)*float64(mv) > MaxFacets {
		return nil, fmt.Errorf("surface %q: %d×%d facets exceeds the limit of %d; give a larger size=", spec, mu, mv, MaxFacets)
	}
	f := &Facets{Dim: 3}
	appendGrid(f, o, u, v, mu, mv)
	return f, nil
}

// tessellateDisc returns the disc as m sectors by nr rings: a central fan
// and quads split in two, all oriented along e1 × e2 = Normal.
func (p Plane) tessellateDisc(spec string, size SizeFunc, e1, e2 [3]float64) (*Facets, error) {
	c := p.At(p.Center[0], p.Center[1])
	r := p.Radius
	h, err := flatSize(spec, p.Res, size, p.ExactArea(), 0.5, faceSamples(sub(c, add(scale(e1, r), scale(e2, r))), scale(e1, 2*r), scale(e2, 2*r)))
	if err != nil {
		return nil, err
	}
	if math.IsInf(h, 1) {
		h = r
	}
	nr, err := divisions(spec, r, h)
	if err != nil {
		return nil, err
	}
	m, err := divisions(spec, 2*math.Pi*r, h)
	if err != nil {
		return nil, err
	}
	m = max(m, 8)
	if 2*float64(m)*float64(nr) > MaxFacets {
		return nil, fmt.Errorf("surface %q: %d×%d facets exceeds the limit of %d; give a larger size=", spec, m, nr, MaxFacets)
	}
	f := &Facets{Dim: 3, Verts: [][3]float64{c}}
	for k := 1; k <= nr; k++ {
		rk := r * float64(k) / float64(nr)
		for j := 0; j < m; j++ {
			s, co := math.Sincos(2 * math.Pi * float64(j) / float64(m))
			f.Verts = append(f.Verts, add(c, add(scale(e1, rk*co), scale(e2, rk*s))))
		}
	}
	id := func(k, j int) int32 { return int32(1 + (k-1)*m + j%m) }
	for j := 0; j < m; j++ {
		f.Index = append(f.Index, 0, id(1, j), id(1, j+1))
	}
	for k := 1; k < nr; k++ {
		for j := 0; j < m; j++ {
			f.Index = append(f.Index, id(k, j), id(k+1, j), id(k+1, j+1), id(k, j), id(k+1, j+1), id(k, j+1))
		}
	}
	return f, nil
}

// Fit returns p ready for the field of l: a 2D plane for a 2D field, and
// the mesh section's bounds when p has none. Errors: a 3D-only plane in a
// 2D field (or the reverse), a disc in 2D, an up axis parallel to the
// normal.
func (p Plane) Fit(l *field.Locator) (Plane, error) {
	spec := p.String()
	if l.Dim() == 2 {
		if p.Bounded && !p.Dim2 {
			return p, fmt.Errorf("surface %q: a 2D field needs a plane bounded by ymin and ymax only", spec)
		}
		if p.Normal[2] != 0 {
			return p, fmt.Errorf("surface %q: in a 2D field the plane normal must lie in the x-y plane", spec)
		}
		p.Dim2 = true
	} else if p.Dim2 {
		return p, fmt.Errorf("surface %q: a 3D field needs all four bounds ymin, ymax, zmin, zmax (or none)", spec)
	}
	if _, _, _, err := p.Axes(); err != nil {
		return p, fmt.Errorf("surface %q: %w", spec, err)
	}
	if p.Bounded {
		return p, nil
	}
	lo, hi := l.Field().Bounds()
	p.Min = [2]float64{math.Inf(1), math.Inf(1)}
	p.Max = [2]float64{math.Inf(-1), math.Inf(-1)}
	for c := 0; c < 8; c++ {
		x := lo
		for k := 0; k < 3; k++ {
			if c>>k&1 == 1 {
				x[k] = hi[k]
			}
		}
		s1, s2 := p.Coords(x)
		p.Min[0], p.Max[0] = math.Min(p.Min[0], s1), math.Max(p.Max[0], s1)
		p.Min[1], p.Max[1] = math.Min(p.Min[1], s2), math.Max(p.Max[1], s2)
	}
	if p.Dim2 {
		p.Min[1], p.Max[1] = 0, 0
	}
	p.Bounded = true
	return p, nil
}

// CutPlane fits p to the field of l (see Fit) and cuts it through the
// cells like any other surface (see CutSurface): the quadrature points of
// the returned Cut carry the unit Normal. Cut.Closure is Normal times the
// area (the plane is open). Errors: those of Fit and CutSurface; a
// *CoverageError when part of the plane lies outside the fluid.
func CutPlane(l *field.Locator, p Plane, opt CutOptions) (*Cut, Plane, error) {
	p, err := p.Fit(l)
	if err != nil {
		return nil, p, err
	}
	c, err := CutSurface(l, p, opt)
	return c, p, err
}

// lineSamples yields flatSamples+1 points from a to b.
func lineSamples(a, b [3]float64) func(yield func(p [3]float64) bool) {
	return func(yield func(p [3]float64) bool) {
		for k := 0; k <= flatSamples; k++ {
			if !yield(lerp3(a, b, float64(k)/flatSamples)) {
				return
			}
		}
	}
}

// faceSamples yields a (flatSamples+1)² grid of points over the
// parallelogram o + a u + b v.
func faceSamples(o, u, v [3]float64) func(yield func(p [3]float64) bool) {
	return func(yield func(p [3]float64) bool) {
		for j := 0; j <= flatSamples; j++ {
			for i := 0; i <= flatSamples; i++ {
				a, b := float64(i)/flatSamples, float64(j)/flatSamples
				if !yield(add(o, add(scale(u, a), scale(v, b)))) {
					return
				}
			}
		}
	}
}
