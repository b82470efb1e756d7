package integrate

import (
	"fmt"
	"math"

	"farforce/field"
)

// NearFieldVolume integrates the wall loads over boundary faces of a volume
// mesh (from field.BoundaryFaces, typically the faces enclosed by a surface
// around the body), with pressure and stress taken from the fluid cell each
// face belongs to:
//
//	F = Σ_faces ∫ [ −(p − p_ref) n_b + τ·n_b ] dA
//	τ = μ_eff (∇V + ∇Vᵀ) − ⅔ μ_eff (∇·V) I,   μ_eff = μ + μ_t
//
// with the conventions of NearResult and NearField (p_ref = opt.Free.P,
// moment about opt.MomentCenter, wind axes and coefficients as in Forces).
// n_b points from the face into its cell, i.e. out of the body into the
// fluid, whatever the node order. p, μ, μ_t and ∇V come from flow at
// points located in the face's own cell with l.InCell, so one-sided
// (cell) gradients are used, as a solver's wall stress is.
//
// A quadrature point of a warped (non-planar) quadrilateral face can fall
// just outside its trilinear cell; it is then moved towards the cell's
// centroid by the smallest of 10⁻⁶, 10⁻⁴, 10⁻³, 10⁻², 5·10⁻² of the
// distance that brings it inside (the warp, and so the move, is O(h²), so
// the order of accuracy is kept).
//
// Quadrature: a 3D face is split into triangles (a quad or polygon about
// its node centroid) and each triangle uses its three edge midpoints
// (exact for quadratic integrands); a 2D face (an edge) uses two-point
// Gauss–Legendre (exact for cubics). With linear cells p is linear and ∇V
// constant on a face, so the force and moment of the interpolated field are
// integrated exactly. Sums are compensated and run in face order: the
// result is deterministic. Parts and Open are not computed (zero).
//
// Errors: invalid options (ErrOption); a face whose quadrature point is not
// in its cell, or whose cell does not exist (ErrWall); a NaN or infinite
// flow value (*ValueError with Spec "wall", Point the face index).
func NearFieldVolume(l *field.Locator, flow field.FlowEvaluator, faces []field.BoundaryFace, opt Options) (NearResult, error) {
	var res NearResult
	if l == nil || flow == nil {
		return res, fmt.Errorf("%w: nil locator or flow evaluator", ErrOption)
	}
	if err := opt.check(); err != nil {
		return res, err
	}
	if len(faces) == 0 {
		return res, fmt.Errorf("%w: no boundary faces to integrate over", ErrWall)
	}
	f := l.Field()
	dim := l.Dim()
	axes, hasWind, err := windAxes(opt.Free.V, opt.Up, dim)
	if err != nil {
		return res, err
	}
	xc := opt.MomentCenter
	var fp, ff, mo [3]field.CompensatedSum
	var area field.CompensatedSum
	var st field.FlowState
	var cache field.FlowCache
	var pts []facePoint
	for fi, fc := range faces {
		if fc.Cell.Zone < 0 || int(fc.Cell.Zone) >= len(f.Zones) || fc.Cell.Cell < 0 || int(fc.Cell.Cell) >= f.Zones[fc.Cell.Zone].NumCells() {
			return res, fmt.Errorf("%w: face %d: no cell %d in zone %d", ErrWall, fi, fc.Cell.Cell, fc.Cell.Zone)
		}
		z := f.Zones[fc.Cell.Zone]
		if dim == 2 {
			// Moments of a 2D field are taken about the centre projected
			// into its plane.
			xc[2] = z.Points[3*fc.Nodes[0]+2]
		}
		cen := z.Centroid(int(fc.Cell.Cell))
		pts = faceQuadrature(z, fc, cen, dim, pts[:0])
		for _, q := range pts {
			loc, x, ok := locateOnFace(l, fc.Cell, q.x, cen)
			if !ok {
				return res, fmt.Errorf("%w: face %d of zone %d cell %d: quadrature point (%g, %g, %g) is not in the cell",
					ErrWall, fi, fc.Cell.Zone, fc.Cell.Cell, q.x[0], q.x[1], q.x[2])
			}
			evalFlow(flow, loc, x, &st, &cache)
			if name, v, ok := checkState(&st); !ok {
				return res, &ValueError{Spec: "wall", Point: fi, X: x, Cell: fc.Cell, Quantity: name, Value: v}
			}
			prs, vis := wallTraction(&st, q.n, opt.Free.P)
			r := sub(q.x, xc)
			m := cross(r, Vec3{prs[0] + vis[0], prs[1] + vis[1], prs[2] + vis[2]})
			for k := 0; k < 3; k++ {
				fp[k].Add(q.w * prs[k])
				ff[k].Add(q.w * vis[k])
				mo[k].Add(q.w * m[k])
			}
			area.Add(q.w)
		}
	}
	res.setForces(&fp, &ff, &mo)
	res.Area, res.Facets = area.Value(), len(faces)
	res.Dim, res.MomentCenter = dim, xc
	res.HasWind, res.Axes = hasWind, axes
	res.project(&opt)
	return res, nil
}

// facePoint is one quadrature point of a boundary face: position, weight
// (area or length) and unit normal out of the body (into the cell).
type facePoint struct {
	x, n Vec3
	w    float64
}

// faceQuadrature appends the quadrature points of face fc of zone z (see
// NearFieldVolume) to dst; cell is the node centroid of the face's cell.
func faceQuadrature(z *field.Zone, fc field.BoundaryFace, cell Vec3, dim int, dst []facePoint) []facePoint {
	nn := len(fc.Nodes)
	var fcen Vec3
	for _, id := range fc.Nodes {
		p := z.Point(id)
		for k := 0; k < 3; k++ {
			fcen[k] += p[k] / float64(nn)
		}
	}
	in := sub(cell, fcen) // towards the fluid
	if dim == 2 {
		a, b := z.Point(fc.Nodes[0]), z.Point(fc.Nodes[1])
		d := sub(b, a)
		ln := norm(d)
		if ln == 0 {
			return dst
		}
		n := Vec3{d[1] / ln, -d[0] / ln, 0}
		if dot(n, in) < 0 {
			n = scale(n, -1)
		}
		g := 0.5 / math.Sqrt(3) // Gauss–Legendre nodes at ½ ∓ 1/(2√3)
		for _, t := range [2]float64{0.5 - g, 0.5 + g} {
			dst = append(dst, facePoint{x: Vec3{a[0] + t*d[0], a[1] + t*d[1], a[2] + t*d[2]}, n: n, w: ln / 2})
		}
		return dst
	}
	tri := func(a, b, c Vec3) {
		an := triVecArea(a, b, c)
		ar := norm(an)
		if ar == 0 {
			return
		}
		n := scale(an, 1/ar)
		if dot(n, in) < 0 {
			n = scale(n, -1)
		}
		for _, e := range [3][2]Vec3{{a, b}, {b, c}, {c, a}} {
			dst = append(dst, facePoint{x: scale(Vec3{e[0][0] + e[1][0], e[0][1] + e[1][1], e[0][2] + e[1][2]}, 0.5), n: n, w: ar / 3})
		}
	}
	if nn == 3 {
		tri(z.Point(fc.Nodes[0]), z.Point(fc.Nodes[1]), z.Point(fc.Nodes[2]))
		return dst
	}
	for i := 0; i < nn; i++ {
		tri(fcen, z.Point(fc.Nodes[i]), z.Point(fc.Nodes[(i+1)%nn]))
	}
	return dst
}

// wallTraction returns the pressure and viscous parts of the traction
// −(p − pRef) n + τ·n of state s on a surface of unit normal n.
func wallTraction(s *field.FlowState, n Vec3, pRef float64) (prs, vis Vec3) {
	mu := s.Mu + s.MuT
	g := &s.GradV
	div := g[0][0] + g[1][1] + g[2][2]
	for k := 0; k < 3; k++ {
		prs[k] = -(s.P - pRef) * n[k]
		var t float64
		for j := 0; j < 3; j++ {
			t += (g[k][j] + g[j][k]) * n[j]
		}
		vis[k] = mu * (t - 2.0/3.0*div*n[k])
	}
	return prs, vis
}

// locateOnFace locates the face point x in cell ref, moving it slightly
// towards the cell centroid cen when it falls just outside (see
// NearFieldVolume). It returns the location and the point used.
func locateOnFace(l *field.Locator, ref field.CellRef, x, cen Vec3) (field.Location, Vec3, bool) {
	if loc, ok := l.InCell(ref, x); ok {
		return loc, x, true
	}
	d := sub(cen, x)
	for _, t := range [...]float64{1e-6, 1e-4, 1e-3, 1e-2, 5e-2} {
		y := Vec3{x[0] + t*d[0], x[1] + t*d[1], x[2] + t*d[2]}
		if loc, ok := l.InCell(ref, y); ok {
			return loc, y, true
		}
	}
	return field.Location{}, x, false
}
