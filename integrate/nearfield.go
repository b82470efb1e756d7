package integrate

import (
	"cmp"
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"slices"

	"farforce/field"
)

// WallOptions says which arrays of a wall surface carry the surface loads
// and how to orient a wall that is not closed. Array names refer to arrays
// of the wall zone, at points or at cells (each array independently).
type WallOptions struct {
	// Pressure names the static-pressure array (Pa, 1 component); the
	// reference pressure p_ref = Options.Free.P is subtracted. On a closed
	// wall p_ref cancels (∮ n_b dA = 0); on an open wall it does not.
	// Empty means no pressure load.
	Pressure string
	// PressureCoefficient says the Pressure array holds
	// C_p = (p − p_ref)/q∞ instead of p; then p − p_ref = q∞ C_p.
	PressureCoefficient bool
	// Traction names the wall shear traction τ·n_b (Pa, 2 or 3 components,
	// n_b out of the body). At most one of Traction and SkinFriction may be
	// set; both empty means no friction load.
	Traction string
	// SkinFriction names a skin-friction coefficient vector
	// c_f = (τ·n_b)/q∞ (2 or 3 components); the traction is q∞ c_f.
	SkinFriction string
	// Inside is a point inside the body used to orient walls that are not
	// closed (a half model, a wall patch). Nil means: the area centroid of
	// each open part of the wall.
	Inside *Vec3
}

// NearResult is the near-field (body-surface) force and moment:
//
//	F = ∮ [ −(p − p_ref) n_b + τ·n_b ] dA = Pressure + Friction
//	M = ∮ (x − x_c) × [ −(p − p_ref) n_b + τ·n_b ] dA
//
// with n_b the unit normal out of the body into the fluid, so F is the
// force of the fluid on the body in body axes (N, or N/m per unit span for
// a 2D wall) and M its moment about MomentCenter (N·m, or N·m/m; for a 2D
// wall the centre is projected into the wall plane, so only M_z is
// non-zero).
//
// The wind-axis fields have the meaning of the same fields of Result
// (same axes, dynamic pressure and reference quantities, from the Options
// given to NearField), so near- and far-field numbers compare directly;
// PressureWind and FrictionWind split Wind, PressureCoefficients and
// FrictionCoefficients split Coefficients.
//
// Area is the area (length in 2D) of the discrete wall, Facets the number
// of wall cells integrated, Parts the number of edge-connected parts of the
// wall and Open how many of them are not closed, Flipped how many cells had
// their node order reversed to point n_b out of the body.
type NearResult struct {
	Dim          int  `json:"dim"`
	Pressure     Vec3 `json:"pressure"`
	Friction     Vec3 `json:"friction"`
	Force        Vec3 `json:"force"`
	Moment       Vec3 `json:"moment"`
	MomentCenter Vec3 `json:"moment_center"`

	HasWind              bool    `json:"has_wind"`
	Axes                 Axes    `json:"axes"`
	Wind                 Wind    `json:"wind"`
	PressureWind         Wind    `json:"pressure_wind"`
	FrictionWind         Wind    `json:"friction_wind"`
	DynamicPressure      float64 `json:"dynamic_pressure"`
	HasCoefficients      bool    `json:"has_coefficients"`
	Coefficients         Wind    `json:"coefficients"`
	PressureCoefficients Wind    `json:"pressure_coefficients"`
	FrictionCoefficients Wind    `json:"friction_coefficients"`
	DragCounts           float64 `json:"drag_counts"`
	// HasMomentCoefficients and MomentCoefficients: as in Result.
	HasMomentCoefficients bool `json:"has_moment_coefficients"`
	MomentCoefficients    Vec3 `json:"moment_coefficients"`

	Area    float64 `json:"area"`
	Facets  int     `json:"facets"`
	Parts   int     `json:"parts"`
	Open    int     `json:"open_parts"`
	Flipped int     `json:"flipped"`
}

// ErrWall is wrapped by every error NearField returns for unusable wall
// data (missing arrays, bad cells, non-orientable or degenerate walls).
var ErrWall = errors.New("unusable wall surface")

// NearField integrates the surface loads named in w over the wall zone z
// and returns the near-field force and moment (see NearResult for the
// formula). From opt it uses the reference pressure p_ref = opt.Free.P,
// the moment centre, and the freestream, up axis and reference quantities
// for the wind axes and coefficients exactly as Forces does; the dynamic
// pressure q∞ = ½ρ∞|V∞|² also turns coefficient arrays into stresses.
// opt.Plain, NoConvection and Workers do not apply.
//
// The wall is either a surface in 3D (Triangle, Quad and Polygon cells) or,
// for a 2D field, a polyline of Line cells in a plane z = const (the result
// is then per unit span). Vertex cells are ignored; volume cells, or lines
// mixed with surface cells, are errors.
//
// Orientation comes from geometry, never from node order. Points with equal
// coordinates are merged, cells are grouped into parts connected across
// edges used by exactly two cells (nodes used by two segments in 2D), and
// the cells of a part are oriented consistently with each other (an error if
// the part is not orientable). A closed part is then turned so that its
// signed volume (area in 2D) is positive, i.e. n_b points out of the volume
// it encloses. An open part is turned so that the cone it subtends at
// w.Inside (or at its own area centroid when Inside is nil) has positive
// volume: n_b points away from that point.
//
// Quadrature. A Quad or Polygon is split into triangles about its node
// centroid, whose point value is the mean of the node values (exact for
// bilinear data on a parallelogram). Point data are linear on each triangle
// (segment in 2D) and cell data constant; with the flat facet normal the
// force integrand is then linear and the moment integrand quadratic, and both
// are integrated exactly:
//
//	∫_T f dA = A (f0+f1+f2)/3,  ∫_T f g dA = A/12 (Σ f_i g_i + Σf_i Σg_i)
//	∫_S f ds = L (f0+f1)/2,     ∫_S f g ds = L/6  (Σ f_i g_i + Σf_i Σg_i)
//
// so the result is the exact integral of the interpolated loads over the
// polyhedral (polygonal) wall; its error against a smooth wall is O(h²) in
// the facet size h. Sums are compensated and run in cell order, so the
// result is deterministic. Two-component traction arrays get a zero z
// component.
//
// Errors: invalid options (ErrOption, as for Forces); otherwise they wrap
// ErrWall and name the zone, cell or array index: missing or mis-shaped
// arrays, NaN or Inf values, coefficient arrays without a positive q∞,
// unsupported cells, a 2D wall off a plane z = const, a part that is not
// orientable, or has no volume (area), or no extent to orient it by.
// NearField does not modify z and is safe for concurrent use.
func NearField(z *field.Zone, w WallOptions, opt Options) (NearResult, error) {
	var res NearResult
	if z == nil {
		return res, fmt.Errorf("%w: no wall zone", ErrWall)
	}
	if err := opt.check(); err != nil {
		return res, err
	}
	if err := z.Validate(); err != nil {
		return res, fmt.Errorf("%w: %v", ErrWall, err)
	}
	wl, err := newWall(z)
	if err != nil {
		return res, err
	}
	axes, hasWind, err := windAxes(opt.Free.V, opt.Up, wl.dim)
	if err != nil {
		return res, err
	}
	q := 0.5 * opt.Free.Rho * dot(opt.Free.V, opt.Free.V)
	p, t, err := wallLoads(z, w, opt.Free.P, q)
	if err != nil {
		return res, err
	}
	if w.Inside != nil && !finiteVec(*w.Inside) {
		return res, fmt.Errorf("%w: inside point %v is not finite", ErrWall, *w.Inside)
	}
	if err := wl.orient(w.Inside); err != nil {
		return res, err
	}
	xc := opt.MomentCenter
	if wl.dim == 2 {
		// Moments of a 2D wall are taken about the centre projected into
		// the wall's plane, so only M_z is non-zero.
		xc[2] = z.Points[3*wl.facets[0].nodes[0]+2]
	}
	res = wl.loadSums(&p, &t, xc)
	res.Dim, res.MomentCenter = wl.dim, xc
	res.HasWind, res.Axes = hasWind, axes
	res.project(&opt)
	return res, nil
}

// project fills the wind-axis fields of r with the rules of Forces
// (applyWind), for the total and for each part.
func (r *NearResult) project(opt *Options) {
	part := func(f, m Vec3) Result {
		x := Result{Dim: r.Dim, Force: f, Moment: m, HasWind: r.HasWind, Axes: r.Axes}
		applyWind(&x, opt)
		return x
	}
	tot := part(r.Force, r.Moment)
	pr, fr := part(r.Pressure, Vec3{}), part(r.Friction, Vec3{})
	r.Wind, r.PressureWind, r.FrictionWind = tot.Wind, pr.Wind, fr.Wind
	r.DynamicPressure, r.HasCoefficients = tot.DynamicPressure, tot.HasCoefficients
	r.Coefficients, r.PressureCoefficients, r.FrictionCoefficients = tot.Coefficients, pr.Coefficients, fr.Coefficients
	r.DragCounts = tot.DragCounts
	r.HasMomentCoefficients, r.MomentCoefficients = tot.HasMomentCoefficients, tot.MomentCoefficients
}

// wallFacet is one wall cell: its index in the zone and its nodes.
type wallFacet struct {
	cell  int
	nodes []int32 // zone point indices
}

// wall is the geometric view of a wall zone: facets (segments in 2D), the
// merged node identity, and the orientation found for each facet.
type wall struct {
	name   string
	dim    int // 2 for a polyline, 3 for a surface
	facets []wallFacet
	canon  []int32 // zone point index → merged node id
	flip   []bool  // per facet: reverse the node order
	part   []int32 // per facet: connected part
	open   []bool  // per part: has free or non-manifold edges
	points func(i int32) [3]float64
}

// newWall classifies the cells of z and merges coincident points.
func newWall(z *field.Zone) (*wall, error) {
	w := &wall{name: z.Name, dim: 3, points: z.Point}
	lines, surfs := 0, 0
	for c, t := range z.Types {
		switch t.Dim() {
		case 0:
			continue
		case 1:
			lines++
		case 2:
			surfs++
		default:
			return nil, fmt.Errorf("%w: zone %q: cell %d is a %s; a wall holds lines or surface cells", ErrWall, z.Name, c, t)
		}
		w.facets = append(w.facets, wallFacet{cell: c, nodes: z.CellNodes(c)})
	}
	switch {
	case lines > 0 && surfs > 0:
		return nil, fmt.Errorf("%w: zone %q mixes %d line cells with %d surface cells", ErrWall, z.Name, lines, surfs)
	case lines == 0 && surfs == 0:
		return nil, fmt.Errorf("%w: zone %q has no line or surface cells", ErrWall, z.Name)
	case lines > 0:
		w.dim = 2
		p0 := w.facets[0].nodes[0]
		z0 := z.Points[3*p0+2]
		for _, f := range w.facets {
			for _, p := range f.nodes {
				if zp := z.Points[3*p+2]; zp != z0 {
					return nil, fmt.Errorf("%w: zone %q: a 2D wall (line cells) must lie in a plane z = const: point %d (cell %d) is at z = %g, point %d at z = %g",
						ErrWall, z.Name, p, f.cell, zp, p0, z0)
				}
			}
		}
	}
	w.canon = make([]int32, z.NumPoints())
	seen := make(map[[3]float64]int32, z.NumPoints())
	for i := range w.canon {
		p := z.Point(int32(i))
		id, ok := seen[p]
		if !ok {
			id = int32(len(seen))
			seen[p] = id
		}
		w.canon[i] = id
	}
	return w, nil
}

// edgeUse is one facet's use of an edge key: in 3D a key is a merged node
// pair (a < b) and fw means the facet runs a→b in its stored node order; in
// 2D a key is (node, −1) and fw means the segment ends at that node.
type edgeUse struct {
	a, b, facet int32
	fw          bool
}

// link is a facet's neighbour across a manifold edge; same says both run
// through the edge in the same direction (one of them must be flipped).
type link struct {
	facet int32
	same  bool
}

// adjacency returns, for every facet, its neighbours across edges used by
// exactly two facets (CSR: links[start[f]:start[f+1]], in edge order), and
// whether the facet has a free or non-manifold edge.
func (w *wall) adjacency() (start []int32, links []link, free []bool) {
	nf := len(w.facets)
	uses := make([]edgeUse, 0, 4*nf)
	for fi, f := range w.facets {
		n := len(f.nodes)
		if w.dim == 2 {
			a, b := w.canon[f.nodes[0]], w.canon[f.nodes[1]]
			if a != b {
				uses = append(uses, edgeUse{a, -1, int32(fi), false}, edgeUse{b, -1, int32(fi), true})
			}
			continue
		}
		for i := 0; i < n; i++ {
			a, b := w.canon[f.nodes[i]], w.canon[f.nodes[(i+1)%n]]
			switch {
			case a < b:
				uses = append(uses, edgeUse{a, b, int32(fi), true})
			case b < a:
				uses = append(uses, edgeUse{b, a, int32(fi), false})
			}
		}
	}
	slices.SortFunc(uses, func(x, y edgeUse) int {
		if c := cmp.Compare(x.a, y.a); c != 0 {
			return c
		}
		if c := cmp.Compare(x.b, y.b); c != 0 {
			return c
		}
		return cmp.Compare(x.facet, y.facet)
	})
	free = make([]bool, nf)
	count := make([]int32, nf+1)
	// Two passes over the groups of equal keys: count, then fill.
	groups := func(fn func(u, v edgeUse)) {
		for i := 0; i < len(uses); {
			j := i + 1
			for j < len(uses) && uses[j].a == uses[i].a && uses[j].b == uses[i].b {
				j++
			}
			switch {
			case j-i == 2 && uses[i].facet != uses[i+1].facet:
				fn(uses[i], uses[i+1])
			case j-i != 2:
				for _, u := range uses[i:j] {
					free[u.facet] = true
				}
			}
			i = j
		}
	}
	groups(func(u, v edgeUse) { count[u.facet+1]++; count[v.facet+1]++ })
	for i := 1; i <= nf; i++ {
		count[i] += count[i-1]
	}
	start = append([]int32(nil), count...)
	links = make([]link, count[nf])
	groups(func(u, v edgeUse) {
		links[count[u.facet]] = link{v.facet, u.fw == v.fw}
		count[u.facet]++
		links[count[v.facet]] = link{u.facet, u.fw == v.fw}
		count[v.facet]++
	})
	return start, links, free
}

// orient sets w.flip so that every facet's normal points out of the body.
func (w *wall) orient(inside *Vec3) error {
	nf := len(w.facets)
	w.flip = make([]bool, nf)
	w.part = make([]int32, nf)
	for i := range w.part {
		w.part[i] = -1
	}
	start, links, free := w.adjacency()
	var queue []int32
	for s := 0; s < nf; s++ {
		if w.part[s] >= 0 {
			continue
		}
		p := int32(len(w.open))
		w.open = append(w.open, false)
		w.part[s] = p
		queue = append(queue[:0], int32(s))
		for len(queue) > 0 {
			g := queue[0]
			queue = queue[1:]
			w.open[p] = w.open[p] || free[g]
			for _, l := range links[start[g]:start[g+1]] {
				want := w.flip[g] != l.same // flip h iff the directions agree
				if w.part[l.facet] < 0 {
					w.part[l.facet] = p
					w.flip[l.facet] = want
					queue = append(queue, l.facet)
				} else if w.flip[l.facet] != want {
					return fmt.Errorf("%w: zone %q: the wall is not orientable (cells %d and %d cannot both point out of the body)",
						ErrWall, w.name, w.facets[g].cell, w.facets[l.facet].cell)
				}
			}
		}
	}
	return w.orientParts(inside)
}

// orientParts turns each part as a whole so that its facets point out of
// the body, from its signed volume (closed part) or the cone it subtends at
// the inside point (open part).
func (w *wall) orientParts(inside *Vec3) error {
	np := len(w.open)
	ref := make([][3]float64, np) // reference point per part
	set := make([]bool, np)
	// Closed parts: the first node of the part's first facet keeps the sums
	// well conditioned (the signed volume does not depend on it).
	// Open parts: the inside point, or the part's area centroid.
	var cen [][4]float64 // per part: Σ A c (3) and Σ A
	if inside == nil {
		cen = make([][4]float64, np)
	}
	for fi, f := range w.facets {
		p := w.part[fi]
		if !set[p] {
			set[p] = true
			ref[p] = w.points(f.nodes[0])
			if w.open[p] && inside != nil {
				ref[p] = *inside
			}
		}
		if cen != nil && w.open[p] {
			w.forEachPiece(fi, func(x [3][3]float64, m int, an [3]float64) {
				a := norm(an)
				c := vmean(x[:m])
				for k := 0; k < 3; k++ {
					cen[p][k] += a * c[k]
				}
				cen[p][3] += a
			})
		}
	}
	for p := range cen {
		if w.open[p] && cen[p][3] > 0 {
			for k := 0; k < 3; k++ {
				ref[p][k] = cen[p][k] / cen[p][3]
			}
		}
	}
	vol := make([]float64, np)   // Σ (c − ref)·(A n), as oriented so far
	scale := make([]float64, np) // Σ |c − ref| A, to judge vol against rounding
	for fi := range w.facets {
		p := w.part[fi]
		s := 1.0
		if w.flip[fi] {
			s = -1
		}
		w.forEachPiece(fi, func(x [3][3]float64, m int, an [3]float64) {
			c := vmean(x[:m])
			d := [3]float64{c[0] - ref[p][0], c[1] - ref[p][1], c[2] - ref[p][2]}
			vol[p] += s * dot(d, an)
			scale[p] += norm(d) * norm(an)
		})
	}
	first := make([]int, np)
	for i := range first {
		first[i] = -1
	}
	for fi := range w.facets {
		if first[w.part[fi]] < 0 {
			first[w.part[fi]] = fi
		}
	}
	for p := 0; p < np; p++ {
		if scale[p] == 0 {
			continue // degenerate part (zero area): contributes nothing
		}
		if math.Abs(vol[p]) <= 1e-12*scale[p] {
			what := "encloses no volume"
			if w.dim == 2 {
				what = "encloses no area"
			}
			if w.open[p] {
				what = "is open and cannot be oriented from the reference point (the given inside point, or the part's centroid), which lies in its plane or line; give a point inside the body"
			}
			return fmt.Errorf("%w: zone %q: the wall part containing cell %d %s", ErrWall, w.name, w.facets[first[p]].cell, what)
		}
	}
	for fi := range w.facets {
		if vol[w.part[fi]] < 0 {
			w.flip[fi] = !w.flip[fi]
		}
	}
	return nil
}

// forEachPiece calls fn for each flat piece of facet fi, with its m
// vertices in x[:m] in stored node order: a segment (2D, m = 2;
// an = (Δy, −Δx, 0)), or a triangle (3D, m = 3; an = half the cross
// product of its edges). A Quad or Polygon gives the fan of triangles
// (centroid, v_i, v_{i+1}); x[0] is then the node centroid. x is passed by
// value so that nothing escapes to the heap.
func (w *wall) forEachPiece(fi int, fn func(x [3][3]float64, m int, an [3]float64)) {
	f := w.facets[fi]
	var buf [3][3]float64
	if w.dim == 2 {
		a, b := w.points(f.nodes[0]), w.points(f.nodes[1])
		buf[0], buf[1] = a, b
		fn(buf, 2, [3]float64{b[1] - a[1], a[0] - b[0], 0})
		return
	}
	n := len(f.nodes)
	if n == 3 {
		buf[0], buf[1], buf[2] = w.points(f.nodes[0]), w.points(f.nodes[1]), w.points(f.nodes[2])
		fn(buf, 3, triVecArea(buf[0], buf[1], buf[2]))
		return
	}
	var c [3]float64
	for _, id := range f.nodes {
		p := w.points(id)
		for k := 0; k < 3; k++ {
			c[k] += p[k]
		}
	}
	for k := 0; k < 3; k++ {
		c[k] /= float64(n)
	}
	for i := 0; i < n; i++ {
		buf[0], buf[1], buf[2] = c, w.points(f.nodes[i]), w.points(f.nodes[(i+1)%n])
		fn(buf, 3, triVecArea(buf[0], buf[1], buf[2]))
	}
}

func triVecArea(a, b, c [3]float64) [3]float64 {
	u := [3]float64{b[0] - a[0], b[1] - a[1], b[2] - a[2]}
	v := [3]float64{c[0] - a[0], c[1] - a[1], c[2] - a[2]}
	return [3]float64{
		0.5 * (u[1]*v[2] - u[2]*v[1]),
		0.5 * (u[2]*v[0] - u[0]*v[2]),
		0.5 * (u[0]*v[1] - u[1]*v[0]),
	}
}

func vmean(x [][3]float64) [3]float64 {
	var c [3]float64
	for _, p := range x {
		for k := 0; k < 3; k++ {
			c[k] += p[k]
		}
	}
	inv := 1 / float64(len(x))
	return [3]float64{c[0] * inv, c[1] * inv, c[2] * inv}
}

// wallLoad is one load array of the wall resolved for reading: its data,
// components and centring, or nil data when the load is absent.
type wallLoad struct {
	data  []float64
	comps int
	cells bool
	scale float64 // multiplies every value (q∞ for coefficients)
	shift float64 // subtracted before scaling (p_ref)
}

// at returns the load value (up to 3 components, the rest zero) for node
// point of cell c.
func (l *wallLoad) at(c int, point int32) Vec3 {
	var v Vec3
	if l.data == nil {
		return v
	}
	i := int(point)
	if l.cells {
		i = c
	}
	for k := 0; k < l.comps && k < 3; k++ {
		v[k] = (l.data[i*l.comps+k] - l.shift) * l.scale
	}
	return v
}

// wallLoads resolves the pressure and friction arrays named in w; pRef is
// subtracted from pressure, q scales coefficient arrays.
func wallLoads(z *field.Zone, w WallOptions, pRef, q float64) (p, t wallLoad, err error) {
	if w.Traction != "" && w.SkinFriction != "" {
		return p, t, fmt.Errorf("%w: give a wall traction array (%q) or a skin-friction array (%q), not both", ErrWall, w.Traction, w.SkinFriction)
	}
	if w.Pressure == "" && w.Traction == "" && w.SkinFriction == "" {
		return p, t, fmt.Errorf("%w: no pressure, traction or skin-friction array named", ErrWall)
	}
	if ((w.PressureCoefficient && w.Pressure != "") || w.SkinFriction != "") && !(q > 0) {
		return p, t, fmt.Errorf("%w: coefficient arrays need a freestream with dynamic pressure q > 0, got %g", ErrWall, q)
	}
	get := func(name string, comps ...int) (wallLoad, error) {
		var l wallLoad
		if name == "" {
			return l, nil
		}
		a := z.Array(name)
		if a == nil {
			return l, fmt.Errorf("%w: zone %q has no array %q", ErrWall, z.Name, name)
		}
		ok := false
		for _, c := range comps {
			ok = ok || a.Components == c
		}
		if !ok {
			return l, fmt.Errorf("%w: zone %q: array %q has %d components, want %v", ErrWall, z.Name, name, a.Components, comps)
		}
		for i, v := range a.Data {
			if !finite(v) {
				return l, fmt.Errorf("%w: zone %q: array %q: %s %d component %d is %g", ErrWall, z.Name, name, a.Location, i/a.Components, i%a.Components, v)
			}
		}
		return wallLoad{data: a.Data, comps: a.Components, cells: a.Location == field.AtCells, scale: 1}, nil
	}
	if p, err = get(w.Pressure, 1); err != nil {
		return p, t, err
	}
	if w.PressureCoefficient {
		p.scale = q
	} else {
		p.shift = pRef
	}
	if w.SkinFriction != "" {
		t, err = get(w.SkinFriction, 2, 3)
		t.scale = q
	} else {
		t, err = get(w.Traction, 2, 3)
	}
	return p, t, err
}

// loadSums sums the loads over the oriented wall (see NearField for the
// quadrature) with compensated sums in facet order.
func (w *wall) loadSums(p, t *wallLoad, xc Vec3) NearResult {
	var fp, ff, mo [3]field.CompensatedSum
	var area field.CompensatedSum
	var res NearResult
	var pv [3]float64 // pressure at the piece's nodes
	var tv [3]Vec3    // traction at the piece's nodes
	for fi, f := range w.facets {
		s := 1.0
		if w.flip[fi] {
			s = -1
			res.Flipped++
		}
		// Node-centroid values for fans: the mean of the node values.
		var pc float64
		var tc Vec3
		n := len(f.nodes)
		fan := w.dim == 3 && n > 3
		if fan {
			for _, id := range f.nodes {
				pc += p.at(f.cell, id)[0]
				tk := t.at(f.cell, id)
				for k := 0; k < 3; k++ {
					tc[k] += tk[k]
				}
			}
			pc /= float64(n)
			for k := 0; k < 3; k++ {
				tc[k] /= float64(n)
			}
		}
		piece := 0
		w.forEachPiece(fi, func(xa [3][3]float64, np int, an [3]float64) {
			x := xa[:np]
			// Node values of this piece, in the order of x.
			if fan {
				pv[0], tv[0] = pc, tc
				for j, id := range []int32{f.nodes[piece], f.nodes[(piece+1)%n]} {
					pv[j+1], tv[j+1] = p.at(f.cell, id)[0], t.at(f.cell, id)
				}
			} else {
				for j := range x {
					pv[j], tv[j] = p.at(f.cell, f.nodes[j])[0], t.at(f.cell, f.nodes[j])
				}
			}
			piece++
			for k := 0; k < 3; k++ {
				an[k] *= s
			}
			a := norm(an)
			if a == 0 {
				return
			}
			area.Add(a)
			m := float64(len(x))
			var psum float64
			var tsum, rsum, lsum, rl Vec3
			for j := range x {
				psum += pv[j]
				var l Vec3
				for k := 0; k < 3; k++ {
					tsum[k] += tv[j][k]
					l[k] = -pv[j]*an[k]/a + tv[j][k]
					rsum[k] += x[j][k] - xc[k]
					lsum[k] += l[k]
				}
				c := cross([3]float64{x[j][0] - xc[0], x[j][1] - xc[1], x[j][2] - xc[2]}, l)
				for k := 0; k < 3; k++ {
					rl[k] += c[k]
				}
			}
			// Exact moment rule: A/12 (triangle) or L/6 (segment) times
			// (Σ r_i × l_i + Σ r_i × Σ l_i).
			mw := a / 12
			if m == 2 {
				mw = a / 6
			}
			rs := cross(rsum, lsum)
			for k := 0; k < 3; k++ {
				fp[k].Add(-an[k] * psum / m)
				ff[k].Add(a * tsum[k] / m)
				mo[k].Add(mw * (rl[k] + rs[k]))
			}
		})
	}
	res.setForces(&fp, &ff, &mo)
	res.Area = area.Value()
	res.Facets = len(w.facets)
	res.Parts = len(w.open)
	for _, o := range w.open {
		if o {
			res.Open++
		}
	}
	return res
}

// NearFarDifference is the far-field minus the near-field result: force
// (body axes), wind components, coefficients and drag counts (zero unless
// both results have coefficients), and the drag difference in percent of
// the near-field drag. HasDragPercent says whether that percentage is
// defined (see DragPercentDefined); when it is not, DragPercent is zero and
// the JSON form carries "drag_percent": null.
type NearFarDifference struct {
	Force          Vec3    `json:"force"`
	Wind           Wind    `json:"wind"`
	Coefficients   Wind    `json:"coefficients"`
	DragCounts     float64 `json:"drag_counts"`
	DragPercent    float64 `json:"drag_percent"`
	HasDragPercent bool    `json:"-"`
}

// MarshalJSON writes d with drag_percent null when it is undefined.
func (d NearFarDifference) MarshalJSON() ([]byte, error) {
	type plain NearFarDifference
	out := struct {
		plain
		DragPercent *float64 `json:"drag_percent"`
	}{plain: plain(d)}
	if d.HasDragPercent {
		out.DragPercent = &d.DragPercent
	}
	return json.Marshal(out)
}

// DragPercentDefined reports whether a difference in percent of the
// near-field drag means something: not when that drag is zero to rounding,
// at most 1e-9 of the force scale max(|F|, q∞·Area) (a body whose force is
// all lift, or whose loads cancel, as potential-flow pressure does).
func DragPercentDefined(near NearResult) bool {
	scale := max(math.Sqrt(dot(near.Force, near.Force)), near.DynamicPressure*near.Area)
	return near.HasWind && math.Abs(near.Wind.Drag) > 1e-9*scale
}

// CompareNearFar returns far − near. Both must come from the same Options
// (axes, dynamic pressure and reference quantities) for the wind and
// coefficient differences to mean anything; CompareNearFar does not check.
func CompareNearFar(far Result, near NearResult) NearFarDifference {
	d := NearFarDifference{
		Force: sub(far.Force, near.Force),
		Wind:  Wind{Drag: far.Wind.Drag - near.Wind.Drag, Lift: far.Wind.Lift - near.Wind.Lift, Side: far.Wind.Side - near.Wind.Side},
	}
	if far.HasCoefficients && near.HasCoefficients {
		c, n := far.Coefficients, near.Coefficients
		d.Coefficients = Wind{Drag: c.Drag - n.Drag, Lift: c.Lift - n.Lift, Side: c.Side - n.Side}
		d.DragCounts = 1e4 * d.Coefficients.Drag
	}
	if DragPercentDefined(near) {
		d.DragPercent = 100 * d.Wind.Drag / math.Abs(near.Wind.Drag)
		d.HasDragPercent = true
	}
	return d
}

// setForces stores in r the compensated sums of the pressure force fp,
// the friction force ff and the moment mo, with Force = Pressure +
// Friction.
func (r *NearResult) setForces(fp, ff, mo *[3]field.CompensatedSum) {
	for k := 0; k < 3; k++ {
		r.Pressure[k] = fp[k].Value()
		r.Friction[k] = ff[k].Value()
		r.Force[k] = r.Pressure[k] + r.Friction[k]
		r.Moment[k] = mo[k].Value()
	}
}
