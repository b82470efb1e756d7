package field

import "math"

// maxCellNodes is the largest node count of a supported cell (hexahedron).
const maxCellNodes = 8

// localTol is the tolerance on local coordinates used by containment tests:
// a point whose local coordinates lie within localTol outside the reference
// cell counts as inside. It is relative to the cell size.
const localTol = 1e-9

// cellGeom holds the node coordinates of one cell, gathered for the shape
// function routines. For 2D cells only x and y are used.
type cellGeom struct {
	t   CellType
	n   int
	dim int
	x   [maxCellNodes][3]float64
}

// supported reports whether the shape functions handle cell type t.
func supported(t CellType) bool {
	switch t {
	case Triangle, Quad, Tetra, Hexa, Wedge, Pyramid:
		return true
	}
	return false
}

// gather fills g with the nodes of cell c of z. It returns false for cell
// types without shape functions (vertices, lines, polygons).
func (z *Zone) gather(c int, g *cellGeom) bool {
	t := z.Types[c]
	if !supported(t) {
		return false
	}
	z.gatherNodes(t, z.Conn[z.Offsets[c]:z.Offsets[c+1]], g)
	return true
}

// gatherNodes fills g with a cell of supported type t and the given nodes
// (at most maxCellNodes).
func (z *Zone) gatherNodes(t CellType, nodes []int32, g *cellGeom) {
	g.t, g.dim = t, t.Dim()
	g.n = len(nodes)
	for i, p := range nodes {
		q := z.Points[3*p : 3*p+3 : 3*p+3]
		g.x[i] = [3]float64{q[0], q[1], q[2]}
	}
}

// shapeValues stores in N the shape functions of type t at local
// coordinates r (see Location for the parametrisation of each type).
func shapeValues(t CellType, r [3]float64, N *[maxCellNodes]float64) {
	u, v, w := r[0], r[1], r[2]
	switch t {
	case Triangle:
		N[0], N[1], N[2] = 1-u-v, u, v
	case Tetra:
		N[0], N[1], N[2], N[3] = 1-u-v-w, u, v, w
	case Quad:
		N[0], N[1], N[2], N[3] = (1-u)*(1-v), u*(1-v), u*v, (1-u)*v
	case Hexa:
		a, b := 1-w, w
		N[0], N[1], N[2], N[3] = (1-u)*(1-v)*a, u*(1-v)*a, u*v*a, (1-u)*v*a
		N[4], N[5], N[6], N[7] = (1-u)*(1-v)*b, u*(1-v)*b, u*v*b, (1-u)*v*b
	case Wedge:
		l := 1 - u - v
		N[0], N[1], N[2] = l*(1-w), u*(1-w), v*(1-w)
		N[3], N[4], N[5] = l*w, u*w, v*w
	case Pyramid:
		a := 1 - w
		N[0], N[1], N[2], N[3] = (1-u)*(1-v)*a, u*(1-v)*a, u*v*a, (1-u)*v*a
		N[4] = w
	}
}

// shapeDerivs stores in dN the derivatives of the shape functions of type t
// with respect to the local coordinates, dN[i][j] = ∂N_i/∂r_j.
func shapeDerivs(t CellType, r [3]float64, dN *[maxCellNodes][3]float64) {
	u, v, w := r[0], r[1], r[2]
	switch t {
	case Triangle:
		dN[0] = [3]float64{-1, -1, 0}
		dN[1] = [3]float64{1, 0, 0}
		dN[2] = [3]float64{0, 1, 0}
	case Tetra:
		dN[0] = [3]float64{-1, -1, -1}
		dN[1] = [3]float64{1, 0, 0}
		dN[2] = [3]float64{0, 1, 0}
		dN[3] = [3]float64{0, 0, 1}
	case Quad:
		dN[0] = [3]float64{-(1 - v), -(1 - u), 0}
		dN[1] = [3]float64{1 - v, -u, 0}
		dN[2] = [3]float64{v, u, 0}
		dN[3] = [3]float64{-v, 1 - u, 0}
	case Hexa:
		a, b := 1-w, w
		dN[0] = [3]float64{-(1 - v) * a, -(1 - u) * a, -(1 - u) * (1 - v)}
		dN[1] = [3]float64{(1 - v) * a, -u * a, -u * (1 - v)}
		dN[2] = [3]float64{v * a, u * a, -u * v}
		dN[3] = [3]float64{-v * a, (1 - u) * a, -(1 - u) * v}
		dN[4] = [3]float64{-(1 - v) * b, -(1 - u) * b, (1 - u) * (1 - v)}
		dN[5] = [3]float64{(1 - v) * b, -u * b, u * (1 - v)}
		dN[6] = [3]float64{v * b, u * b, u * v}
		dN[7] = [3]float64{-v * b, (1 - u) * b, (1 - u) * v}
	case Wedge:
		l := 1 - u - v
		dN[0] = [3]float64{-(1 - w), -(1 - w), -l}
		dN[1] = [3]float64{1 - w, 0, -u}
		dN[2] = [3]float64{0, 1 - w, -v}
		dN[3] = [3]float64{-w, -w, l}
		dN[4] = [3]float64{w, 0, u}
		dN[5] = [3]float64{0, w, v}
	case Pyramid:
		a := 1 - w
		dN[0] = [3]float64{-(1 - v) * a, -(1 - u) * a, -(1 - u) * (1 - v)}
		dN[1] = [3]float64{(1 - v) * a, -u * a, -u * (1 - v)}
		dN[2] = [3]float64{v * a, u * a, -u * v}
		dN[3] = [3]float64{-v * a, (1 - u) * a, -(1 - u) * v}
		dN[4] = [3]float64{0, 0, 1}
	}
}

// contains reports whether local coordinates r lie in the reference cell of
// type t, allowing tol outside.
func contains(t CellType, r [3]float64, tol float64) bool {
	u, v, w := r[0], r[1], r[2]
	lo, hi := -tol, 1+tol
	switch t {
	case Triangle:
		return u >= lo && v >= lo && u+v <= hi
	case Tetra:
		return u >= lo && v >= lo && w >= lo && u+v+w <= hi
	case Quad:
		return u >= lo && u <= hi && v >= lo && v <= hi
	case Hexa, Pyramid:
		return u >= lo && u <= hi && v >= lo && v <= hi && w >= lo && w <= hi
	case Wedge:
		return u >= lo && v >= lo && u+v <= hi && w >= lo && w <= hi
	}
	return false
}

// jacobian returns J[i][j] = ∂x_i/∂r_j of the map of g at the derivatives
// dN, restricted to g.dim rows and columns (the rest is the identity).
func (g *cellGeom) jacobian(dN *[maxCellNodes][3]float64) (J [3][3]float64) {
	for k := 0; k < g.n; k++ {
		x, d := &g.x[k], &dN[k]
		for i := 0; i < g.dim; i++ {
			for j := 0; j < g.dim; j++ {
				J[i][j] += x[i] * d[j]
			}
		}
	}
	if g.dim == 2 {
		J[2][2] = 1
	}
	return J
}

// position returns the point of g at local coordinates r.
func (g *cellGeom) position(r [3]float64) (x [3]float64) {
	var N [maxCellNodes]float64
	shapeValues(g.t, r, &N)
	for k := 0; k < g.n; k++ {
		for i := 0; i < 3; i++ {
			x[i] += N[k] * g.x[k][i]
		}
	}
	return x
}

// paddedBox returns the bounding box of the nodes of g enlarged on every
// side by boxPad times its largest extent over the first dim axes (plus
// 1e-300, so that a point cell still has a box). For dim 2 the z range is
// unbounded. A NaN coordinate makes the box NaN, which holds no point. The
// Locator's query-time box test and CellMap use it, and the Locator's
// per-cell boxes (nodeBox) pad the same bounds by the same padBox, so all
// agree bit for bit.
func (g *cellGeom) paddedBox(dim int) (lo, hi [3]float64) {
	lo, hi = g.x[0], g.x[0]
	for i := 1; i < g.n; i++ {
		x := &g.x[i] // builtin min and max: no branches to mispredict
		lo = [3]float64{min(lo[0], x[0]), min(lo[1], x[1]), min(lo[2], x[2])}
		hi = [3]float64{max(hi[0], x[0]), max(hi[1], x[1]), max(hi[2], x[2])}
	}
	lo[0], lo[1], lo[2], hi[0], hi[1], hi[2] = padBox(dim, lo[0], lo[1], lo[2], hi[0], hi[1], hi[2])
	return lo, hi
}

// padBox returns the bounds x0 <= x1, y0 <= y1, z0 <= z1 of some nodes
// enlarged as paddedBox describes (all in registers: the Locator's build
// computes the bounds straight from the points and pads them here, so that
// its boxes are those of paddedBox).
func padBox(dim int, x0, y0, z0, x1, y1, z1 float64) (float64, float64, float64, float64, float64, float64) {
	// h holds the bits of the largest extent over the first dim axes. An
	// extent is +0, positive or NaN, and such values order as their bits
	// do (NaN last, as the builtin max propagates it): integer max, which
	// compiles to a conditional move, gives the builtin's result.
	h := uint64(0)
	if dim >= 1 {
		h = max(h, math.Float64bits(x1-x0))
	}
	if dim >= 2 {
		h = max(h, math.Float64bits(y1-y0))
	}
	if dim >= 3 {
		h = max(h, math.Float64bits(z1-z0))
	}
	pad := boxPad*math.Float64frombits(h) + 1e-300
	if dim == 2 {
		return x0 - pad, y0 - pad, math.Inf(-1), x1 + pad, y1 + pad, math.Inf(1)
	}
	return x0 - pad, y0 - pad, z0 - pad, x1 + pad, y1 + pad, z1 + pad
}

// size returns the largest extent of the bounding box of g.
func (g *cellGeom) size() float64 {
	var h float64
	for i := 0; i < g.dim; i++ {
		lo, hi := g.x[0][i], g.x[0][i]
		for k := 1; k < g.n; k++ {
			lo, hi = min(lo, g.x[k][i]), max(hi, g.x[k][i])
		}
		h = max(h, hi-lo)
	}
	return h
}

// start returns the local coordinates of the node centroid of type t, where
// Newton iterations begin.
func start(t CellType) [3]float64 {
	switch t {
	case Quad:
		return [3]float64{0.5, 0.5, 0}
	case Hexa:
		return [3]float64{0.5, 0.5, 0.5}
	case Wedge:
		return [3]float64{1.0 / 3, 1.0 / 3, 0.5}
	case Pyramid:
		return [3]float64{0.5, 0.5, 0.2}
	}
	return [3]float64{}
}

// newtonDone is the Newton step below which the iteration stops: with
// quadratic convergence the remaining error is about the square of the
// last step (times a factor of order one for a valid cell), below
// rounding.
const newtonDone = 1e-9

// newtonIters bounds the Newton iterations of the inverse map; a point
// inside a valid cell converges in 2-6 (quadratic convergence from the
// centroid), so hitting the bound means the point is far outside or the
// cell is folded.
const newtonIters = 40

// local returns the local coordinates of p in g. ok is false when the
// inverse map could not be computed (degenerate cell, or Newton iteration
// not converged, which happens only for points well outside the cell), and
// may be false for a point clearly outside the cell (beyond 1e-4 in local
// coordinates) found so before convergence. Simplices are inverted
// directly; other types by Newton iteration from the centroid with steps
// limited to the box [-1,2]^d, which keeps iterates near the cell for
// distorted shapes (see inverseMap).
func (g *cellGeom) local(p [3]float64) (r [3]float64, ok bool) {
	var im inverseMap
	im.init(g)
	return im.local(p)
}

// inverseMap is the prepared inverse of the map of a cell: for a quad,
// hexahedron, wedge or pyramid its monomial coefficients, its length
// scale, and the map and Jacobian at the Newton start, which do not depend
// on the point. An affine map (every simplex; a quad or hexahedron whose
// bilinear and trilinear coefficients are exactly zero, a parallelogram or
// parallelepiped as in structured meshes) is inverted with the inverse
// Jacobian kept here, without iterating.
type inverseMap struct {
	t      CellType
	dim    int
	m      multilinearMap
	h      float64
	r0, x0 [3]float64    // Newton start and the map there
	j0     [3][3]float64 // Jacobian at r0
	affine bool          // the bilinear and trilinear coefficients are 0
	cof    [3][3]float64 // adjugate of j0 over its determinant (affine)
	good   bool          // affine only: j0 is regular (solve3's test), and cof is set
}

// init prepares the inverse of the map of g.
func (im *inverseMap) init(g *cellGeom) {
	im.t, im.dim = g.t, g.dim
	if g.t == Triangle || g.t == Tetra {
		im.initSimplex(g)
	} else {
		g.multilinearInto(&im.m)
		im.h = im.m.scale()
		im.r0 = start(g.t)
		im.m.evalInto(im.r0, g.dim, &im.x0, &im.j0)
		im.affine = true
		for i := 4; i < 8; i++ {
			for k := 0; k < g.dim; k++ {
				if im.m[i][k] != 0 {
					im.affine = false
				}
			}
		}
	}
	if !im.affine {
		return // good and cof serve only the direct inverse
	}
	J := &im.j0
	c0 := J[1][1]*J[2][2] - J[1][2]*J[2][1]
	c1 := J[1][2]*J[2][0] - J[1][0]*J[2][2]
	c2 := J[1][0]*J[2][1] - J[1][1]*J[2][0]
	det := J[0][0]*c0 + J[0][1]*c1 + J[0][2]*c2
	im.good = regular(J, det)
	if !im.good {
		return
	}
	inv := 1 / det
	im.cof = [3][3]float64{
		{c0 * inv, (J[0][2]*J[2][1] - J[0][1]*J[2][2]) * inv, (J[0][1]*J[1][2] - J[0][2]*J[1][1]) * inv},
		{c1 * inv, (J[0][0]*J[2][2] - J[0][2]*J[2][0]) * inv, (J[0][2]*J[1][0] - J[0][0]*J[1][2]) * inv},
		{c2 * inv, (J[0][1]*J[2][0] - J[0][0]*J[2][1]) * inv, (J[0][0]*J[1][1] - J[0][1]*J[1][0]) * inv},
	}
}

// initSimplex prepares the affine map of a triangle or tetrahedron:
// x = x_0 + J r with the edge vectors from node 0 as the columns of J.
func (im *inverseMap) initSimplex(g *cellGeom) {
	im.r0, im.x0, im.j0 = [3]float64{}, g.x[0], [3][3]float64{}
	im.h = 0
	for i := 0; i < g.dim; i++ {
		for j := 0; j < g.dim; j++ {
			im.j0[i][j] = g.x[j+1][i] - g.x[0][i]
			im.h = max(im.h, math.Abs(im.j0[i][j]))
		}
	}
	if g.dim == 2 {
		im.j0[2][2] = 1
	}
	im.affine = true
}

// local returns the local coordinates of p (see cellGeom.local). An affine
// map (every simplex) is inverted directly: Newton's method would reach
// the same point, up to rounding, in one step and stop after a second; a
// point whose coordinates leave [-1,2]^d, where Newton would stall at the
// clamp, is reported outside.
func (im *inverseMap) local(p [3]float64) (r [3]float64, ok bool) {
	if !(im.h > 0) {
		return r, false
	}
	if im.affine {
		if !im.good {
			return r, false
		}
		var b [3]float64
		for i := 0; i < im.dim; i++ {
			b[i] = p[i] - im.x0[i]
		}
		ok = true
		for i := 0; i < im.dim; i++ {
			r[i] = im.r0[i] + (im.cof[i][0]*b[0] + im.cof[i][1]*b[1] + im.cof[i][2]*b[2])
			if !(r[i] >= -1 && r[i] <= 2) {
				ok = false
				r[i] = max(-1, min(2, r[i]))
			}
		}
		return r, ok
	}
	r = im.r0
	for it := 0; it < newtonIters; it++ {
		var d, res [3]float64
		var good bool
		if it == 0 {
			for i := 0; i < im.dim; i++ {
				res[i] = p[i] - im.x0[i]
			}
			J := &im.j0
			d[0], d[1], d[2], good = solve3s(J[0][0], J[0][1], J[0][2], J[1][0], J[1][1], J[1][2], J[2][0], J[2][1], J[2][2], res[0], res[1], res[2])
		} else if im.dim == 3 {
			d[0], d[1], d[2], good = im.m.newtonStep3(r[0], r[1], r[2], &p)
			if !good {
				_, res, _ = im.m.newtonStep(r, p, im.dim)
			}
		} else {
			d, res, good = im.m.newtonStep(r, p, im.dim)
		}
		if !good {
			if im.t == Pyramid && math.Abs(r[2]-1) < 1e-6 {
				// At the apex the map is singular; the point is the apex.
				return r, norm2(res) <= (localTol*im.h)*(localTol*im.h)
			}
			return r, false
		}
		step := 0.0
		for i := 0; i < im.dim; i++ {
			r[i] += d[i]
			if a := math.Abs(d[i]); a > step || a != a {
				step = a
			}
			if r[i] < -1 {
				r[i] = -1
			} else if r[i] > 2 {
				r[i] = 2
			}
		}
		if step < newtonDone {
			// Quadratic convergence: the next step would be of the order
			// of step², below rounding.
			return r, true
		}
		if step < 1e-7 && !contains(im.t, r, 1e-4) {
			// Converging (quadratically) to a point clearly outside: the
			// remaining error, about the size of the next step, is far
			// below the distance to the reference cell.
			return r, false
		}
		if im.t == Pyramid && r[2] > 1-1e-12 && r[2] < 1+1e-12 {
			// Keep off the singular apex plane while iterating.
			r[2] = 1 - 1e-12
		}
	}
	// Accept a converged residual even if steps stagnated at rounding level.
	x, _ := im.m.eval(r, im.dim)
	var res [3]float64
	for i := 0; i < im.dim; i++ {
		res[i] = p[i] - x[i]
	}
	return r, norm2(res) <= (1e-12*im.h)*(1e-12*im.h)
}

// multilinearMap is the map of a quad, hexahedron, wedge or pyramid written
// in monomials of the local coordinates:
//
//	x(u,v,w) = a + b u + c v + d w + e uv + f vw + g wu + h uvw
//
// (coefficients in that order). Every non-simplex type has this form; it
// evaluates x and J in about 60 flops.
type multilinearMap [8][3]float64

// multilinear returns the monomial coefficients of the map of g.
func (g *cellGeom) multilinear() (m multilinearMap) {
	g.multilinearInto(&m)
	return m
}

// multilinearInto stores the monomial coefficients of the map of g in m
// (multilinear without copying the result).
func (g *cellGeom) multilinearInto(m *multilinearMap) {
	X := &g.x
	for k := 0; k < 3; k++ {
		var a, b, c, d, e, f, gg, h float64
		switch g.t {
		case Quad:
			a, b, c = X[0][k], X[1][k]-X[0][k], X[3][k]-X[0][k]
			e = X[2][k] - X[1][k] - X[3][k] + X[0][k]
		case Hexa:
			a, b, c, d = X[0][k], X[1][k]-X[0][k], X[3][k]-X[0][k], X[4][k]-X[0][k]
			e = X[2][k] - X[1][k] - X[3][k] + X[0][k]
			f = X[7][k] - X[3][k] - X[4][k] + X[0][k]
			gg = X[5][k] - X[1][k] - X[4][k] + X[0][k]
			h = X[6][k] - X[2][k] - X[5][k] - X[7][k] + X[1][k] + X[3][k] + X[4][k] - X[0][k]
		case Pyramid:
			// (1-w)·bilinear(u,v) + w·apex
			a, b, c = X[0][k], X[1][k]-X[0][k], X[3][k]-X[0][k]
			e = X[2][k] - X[1][k] - X[3][k] + X[0][k]
			d, f, gg, h = X[4][k]-a, -c, -b, -e
		case Wedge:
			a, b, c, d = X[0][k], X[1][k]-X[0][k], X[2][k]-X[0][k], X[3][k]-X[0][k]
			f = X[5][k] - X[3][k] - X[2][k] + X[0][k]
			gg = X[4][k] - X[3][k] - X[1][k] + X[0][k]
		}
		m[0][k], m[1][k], m[2][k], m[3][k] = a, b, c, d
		m[4][k], m[5][k], m[6][k], m[7][k] = e, f, gg, h
	}
}

// eval returns x(r) and J = ∂x/∂r, restricted to dim rows and columns (the
// rest of J is the identity).
func (m *multilinearMap) eval(r [3]float64, dim int) (x [3]float64, J [3][3]float64) {
	m.evalInto(r, dim, &x, &J)
	return x, J
}

// evalInto is eval storing x and every entry of J through pointers.
func (m *multilinearMap) evalInto(r [3]float64, dim int, x *[3]float64, J *[3][3]float64) {
	u, v, w := r[0], r[1], r[2]
	for k := 0; k < dim; k++ {
		a, b, c, d, e, f, g, h := m[0][k], m[1][k], m[2][k], m[3][k], m[4][k], m[5][k], m[6][k], m[7][k]
		x[k] = a + b*u + c*v + d*w + e*u*v + f*v*w + g*w*u + h*u*v*w
		J[k][0] = b + e*v + g*w + h*v*w
		J[k][1] = c + e*u + f*w + h*u*w
		J[k][2] = d + f*v + g*u + h*u*v
	}
	if dim == 2 {
		x[2] = 0
		J[0][2], J[1][2] = 0, 0
		J[2] = [3]float64{0, 0, 1}
	}
}

// newtonStep returns the Newton step d = J⁻¹ (p - x(r)) at r, the residual
// p - x(r), and whether J is regular: eval followed by solve3, with the
// same arithmetic.
func (m *multilinearMap) newtonStep(r, p [3]float64, dim int) (d, res [3]float64, ok bool) {
	x, J := m.eval(r, dim)
	for k := 0; k < dim; k++ {
		res[k] = p[k] - x[k]
	}
	d, ok = solve3(J, res)
	return d, res, ok
}

// newtonStep3 is newtonStep for dim 3 written out on scalars (same
// operations in the same order, so the same bits), without the residual;
// it is the inner loop of locating points in hexahedra, wedges and
// pyramids.
func (m *multilinearMap) newtonStep3(u, v, w float64, p *[3]float64) (d0, d1, d2 float64, ok bool) {
	var x, J0, J1, J2 [3]float64
	for k := 0; k < 3; k++ {
		a, b, c, d, e, f, g, h := m[0][k], m[1][k], m[2][k], m[3][k], m[4][k], m[5][k], m[6][k], m[7][k]
		x[k] = p[k] - (a + b*u + c*v + d*w + e*u*v + f*v*w + g*w*u + h*u*v*w)
		J0[k] = b + e*v + g*w + h*v*w
		J1[k] = c + e*u + f*w + h*u*w
		J2[k] = d + f*v + g*u + h*u*v
	}
	// solve3 on rows J[k] = (J0[k], J1[k], J2[k]).
	return solve3s(J0[0], J1[0], J2[0], J0[1], J1[1], J2[1], J0[2], J1[2], J2[2], x[0], x[1], x[2])
}

// solve3s is solve3 on scalars (same operations in the same order, so the
// same bits), which the register calling convention passes without
// copying arrays.
func solve3s(j00, j01, j02, j10, j11, j12, j20, j21, j22, b0, b1, b2 float64) (d0, d1, d2 float64, ok bool) {
	c0 := j11*j22 - j12*j21
	c1 := j12*j20 - j10*j22
	c2 := j10*j21 - j11*j20
	det := j00*c0 + j01*c1 + j02*c2
	scale := math.Abs(j00) + math.Abs(j01) + math.Abs(j02)
	scale *= math.Abs(j10) + math.Abs(j11) + math.Abs(j12)
	scale *= math.Abs(j20) + math.Abs(j21) + math.Abs(j22)
	if !(math.Abs(det) > 1e-14*scale) {
		return 0, 0, 0, false
	}
	inv := 1 / det
	d0 = (b0*c0 + b1*(j02*j21-j01*j22) + b2*(j01*j12-j02*j11)) * inv
	d1 = (b0*c1 + b1*(j00*j22-j02*j20) + b2*(j02*j10-j00*j12)) * inv
	d2 = (b0*c2 + b1*(j01*j20-j00*j21) + b2*(j00*j11-j01*j10)) * inv
	return d0, d1, d2, true
}

// scale returns a length of the cell: the largest component of its edge
// vectors b, c, d from node 0.
func (m *multilinearMap) scale() float64 {
	h := 0.0
	for i := 1; i <= 3; i++ {
		for k := 0; k < 3; k++ {
			if a := math.Abs(m[i][k]); a > h {
				h = a
			}
		}
	}
	return h
}

// solve3 solves J x = b by Cramer's rule. ok is false when J is singular
// relative to the size of its entries.
func solve3(J [3][3]float64, b [3]float64) (x [3]float64, ok bool) {
	c0 := J[1][1]*J[2][2] - J[1][2]*J[2][1]
	c1 := J[1][2]*J[2][0] - J[1][0]*J[2][2]
	c2 := J[1][0]*J[2][1] - J[1][1]*J[2][0]
	det := J[0][0]*c0 + J[0][1]*c1 + J[0][2]*c2
	if !regular(&J, det) {
		return x, false
	}
	inv := 1 / det
	x[0] = (b[0]*c0 + b[1]*(J[0][2]*J[2][1]-J[0][1]*J[2][2]) + b[2]*(J[0][1]*J[1][2]-J[0][2]*J[1][1])) * inv
	x[1] = (b[0]*c1 + b[1]*(J[0][0]*J[2][2]-J[0][2]*J[2][0]) + b[2]*(J[0][2]*J[1][0]-J[0][0]*J[1][2])) * inv
	x[2] = (b[0]*c2 + b[1]*(J[0][1]*J[2][0]-J[0][0]*J[2][1]) + b[2]*(J[0][0]*J[1][1]-J[0][1]*J[1][0])) * inv
	return x, true
}

// regular reports whether the determinant det of J is not negligible
// relative to the product of the row sums of |J|.
func regular(J *[3][3]float64, det float64) bool {
	scale := 0.0
	for i := 0; i < 3; i++ {
		s := math.Abs(J[i][0]) + math.Abs(J[i][1]) + math.Abs(J[i][2])
		if i == 0 {
			scale = s
		} else {
			scale *= s
		}
	}
	return math.Abs(det) > 1e-14*scale
}

// solve3T solves Jᵀ x = b.
func solve3T(J [3][3]float64, b [3]float64) ([3]float64, bool) {
	var T [3][3]float64
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			T[i][j] = J[j][i]
		}
	}
	return solve3(T, b)
}

func norm2(v [3]float64) float64 { return v[0]*v[0] + v[1]*v[1] + v[2]*v[2] }

// gradientMap returns the shape-function derivatives with respect to x of
// cell g at local coordinates r: dNdx[k][j] = ∂N_k/∂x_j, computed through the
// Jacobian, ∇_x N = J⁻ᵀ ∇_r N. For a pyramid the apex plane r[2] = 1 is
// singular; r[2] is capped just below it, which keeps gradients of fields
// that the pyramid represents exactly (linear fields) exact. ok is false for
// a degenerate cell.
func (g *cellGeom) gradientMap(r [3]float64, dNdx *[maxCellNodes][3]float64) bool {
	if g.t == Pyramid && r[2] > 1-1e-7 {
		r[2] = 1 - 1e-7
	}
	var dN [maxCellNodes][3]float64
	shapeDerivs(g.t, r, &dN)
	J := g.jacobian(&dN)
	// Invert J once: columns of J⁻ᵀ give the map of each gradient.
	var inv [3][3]float64
	for j := 0; j < 3; j++ {
		var e [3]float64
		e[j] = 1
		col, ok := solve3T(J, e)
		if !ok {
			return false
		}
		for i := 0; i < 3; i++ {
			inv[i][j] = col[i]
		}
	}
	for k := 0; k < g.n; k++ {
		d := dN[k]
		for i := 0; i < 3; i++ {
			dNdx[k][i] = inv[i][0]*d[0] + inv[i][1]*d[1] + inv[i][2]*d[2]
		}
		if g.dim == 2 {
			dNdx[k][2] = 0
		}
	}
	return true
}
