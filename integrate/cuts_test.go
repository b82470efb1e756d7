package integrate

import (
	"math"

	"gonum.org/v1/gonum/integrate/quad"

	"farforce/surface"
)

// Hand-built cuts for the analytic-evaluator tests: closed polygons (2D) and
// closed triangulated surfaces (3D) with Gauss quadrature on every facet.
// The location of each quadrature point is left zero: the exact flows
// ignore it.

// contour returns the closed polygon through verts (counter-clockwise, so
// the outward normal of edge a→b is (b−a) rotated by −90°), each edge split
// into segments no longer than h, each with ng Gauss–Legendre points.
func contour(spec string, verts [][2]float64, h float64, ng int, exact float64) *surface.Cut {
	c := &surface.Cut{Spec: spec, Dim: 2, ExactArea: exact}
	gx, gw := make([]float64, ng), make([]float64, ng)
	quad.Legendre{}.FixedLocations(gx, gw, 0, 1)
	for i := range verts {
		a, b := verts[i], verts[(i+1)%len(verts)]
		dx, dy := b[0]-a[0], b[1]-a[1]
		L := math.Hypot(dx, dy)
		n := [3]float64{dy / L, -dx / L, 0}
		m := max(1, int(math.Ceil(L/h-1e-9)))
		for s := 0; s < m; s++ {
			t0, t1 := float64(s)/float64(m), float64(s+1)/float64(m)
			p0 := [3]float64{a[0] + t0*dx, a[1] + t0*dy, 0}
			p1 := [3]float64{a[0] + t1*dx, a[1] + t1*dy, 0}
			addPiece(c, [][3]float64{p0, p1}, n, L/float64(m), func(add func(x [3]float64, w float64)) {
				for k := range gx {
					add([3]float64{p0[0] + gx[k]*(p1[0]-p0[0]), p0[1] + gx[k]*(p1[1]-p0[1]), 0}, gw[k])
				}
			})
			c.Facets++
		}
	}
	return c
}

// circle returns a regular n-gon inscribed in the circle of radius r about
// (cx, cy), ng Gauss points per side.
func circle(cx, cy, r float64, n, ng int) *surface.Cut {
	v := make([][2]float64, n)
	for i := range v {
		t := 2 * math.Pi * float64(i) / float64(n)
		v[i] = [2]float64{cx + r*math.Cos(t), cy + r*math.Sin(t)}
	}
	return contour("circle", v, math.Inf(1), ng, 2*math.Pi*r)
}

// rect returns the rectangle [x0,x1]×[y0,y1] split into segments of at most
// h, ng Gauss points each.
func rect(x0, x1, y0, y1, h float64, ng int) *surface.Cut {
	return contour("rect", [][2]float64{{x0, y0}, {x1, y0}, {x1, y1}, {x0, y1}}, h, ng, 2*(x1-x0+y1-y0))
}

// Dunavant's degree-5 seven-point rule on the triangle (Dunavant 1985,
// IJNME 21:1129–1148, table for p = 5): barycentric points and weights
// summing to 1.
var dunavant5 = func() (pts [][3]float64, w []float64) {
	pts = append(pts, [3]float64{1.0 / 3, 1.0 / 3, 1.0 / 3})
	w = append(w, 0.225)
	for _, g := range []struct{ a, b, w float64 }{
		{0.059715871789770, 0.470142064105115, 0.132394152788506},
		{0.797426985353087, 0.101286507323456, 0.125939180544827},
	} {
		pts = append(pts, [3]float64{g.a, g.b, g.b}, [3]float64{g.b, g.a, g.b}, [3]float64{g.b, g.b, g.a})
		w = append(w, g.w, g.w, g.w)
	}
	return pts, w
}

// polyhedron returns the closed surface made of the triangles tris, each
// oriented away from inner (the surface must be star-shaped about it), with
// Dunavant's degree-5 rule on every triangle.
func polyhedron(spec string, tris [][3][3]float64, inner [3]float64, exact float64) *surface.Cut {
	c := &surface.Cut{Spec: spec, Dim: 3, ExactArea: exact}
	bp, bw := dunavant5()
	for _, t := range tris {
		n := cross(sub(t[1], t[0]), sub(t[2], t[0]))
		area := norm(n) / 2
		n = scale(n, 1/(2*area))
		cen := scale([3]float64{t[0][0] + t[1][0] + t[2][0], t[0][1] + t[1][1] + t[2][1], t[0][2] + t[1][2] + t[2][2]}, 1.0/3)
		if dot(n, sub(cen, inner)) < 0 {
			n = scale(n, -1)
		}
		addPiece(c, t[:], n, area, func(add func(x [3]float64, w float64)) {
			for k, b := range bp {
				var x [3]float64
				for d := 0; d < 3; d++ {
					x[d] = b[0]*t[0][d] + b[1]*t[1][d] + b[2]*t[2][d]
				}
				add(x, bw[k])
			}
		})
		c.Facets++
	}
	return c
}

// addPiece appends a piece with the given vertices, normal and measure;
// pts calls add with each quadrature point and its weight as a fraction of
// the measure.
func addPiece(c *surface.Cut, verts [][3]float64, n [3]float64, measure float64, pts func(add func(x [3]float64, w float64))) {
	first := int32(len(c.Points))
	pts(func(x [3]float64, w float64) {
		c.Points = append(c.Points, surface.QuadPoint{X: x, W: w * measure, N: n})
	})
	c.Pieces = append(c.Pieces, surface.Piece{Verts: append([][3]float64(nil), verts...), N: n, Area: measure,
		First: first, Count: int32(len(c.Points)) - first})
	c.Area += measure
	for k := 0; k < 3; k++ {
		c.Closure[k] += measure * n[k]
	}
}

// box returns the surface of the box [lo,hi], each face split into
// rectangles with sides of at most h, each cut into two triangles.
func box(lo, hi [3]float64, h float64) *surface.Cut {
	var tris [][3][3]float64
	for ax := 0; ax < 3; ax++ {
		u, v := (ax+1)%3, (ax+2)%3
		mu := max(1, int(math.Ceil((hi[u]-lo[u])/h-1e-9)))
		mv := max(1, int(math.Ceil((hi[v]-lo[v])/h-1e-9)))
		for _, side := range []float64{lo[ax], hi[ax]} {
			at := func(i, j int) [3]float64 {
				var p [3]float64
				p[ax] = side
				p[u] = lo[u] + (hi[u]-lo[u])*float64(i)/float64(mu)
				p[v] = lo[v] + (hi[v]-lo[v])*float64(j)/float64(mv)
				return p
			}
			for i := 0; i < mu; i++ {
				for j := 0; j < mv; j++ {
					tris = append(tris, [3][3]float64{at(i, j), at(i+1, j), at(i+1, j+1)},
						[3][3]float64{at(i, j), at(i+1, j+1), at(i, j+1)})
				}
			}
		}
	}
	var inner [3]float64
	var area float64
	for k := 0; k < 3; k++ {
		inner[k] = (lo[k] + hi[k]) / 2
		area += 2 * (hi[(k+1)%3] - lo[(k+1)%3]) * (hi[(k+2)%3] - lo[(k+2)%3])
	}
	return polyhedron("box", tris, inner, area)
}

// sphere returns a polyhedral sphere of radius r about c: the faces of an
// octahedron split into m² triangles whose vertices are projected onto the
// sphere (8m² facets, edge length ≈ 1.6r/m).
func sphere(c [3]float64, r float64, m int) *surface.Cut {
	oct := [6][3]float64{{1, 0, 0}, {-1, 0, 0}, {0, 1, 0}, {0, -1, 0}, {0, 0, 1}, {0, 0, -1}}
	faces := [8][3]int{{0, 2, 4}, {2, 1, 4}, {1, 3, 4}, {3, 0, 4}, {2, 0, 5}, {1, 2, 5}, {3, 1, 5}, {0, 3, 5}}
	proj := func(p [3]float64) [3]float64 {
		s := r / norm(p)
		return [3]float64{c[0] + s*p[0], c[1] + s*p[1], c[2] + s*p[2]}
	}
	var tris [][3][3]float64
	for _, f := range faces {
		A, B, C := oct[f[0]], oct[f[1]], oct[f[2]]
		at := func(i, j int) [3]float64 { // i steps towards B, j towards C
			var p [3]float64
			for d := 0; d < 3; d++ {
				p[d] = A[d] + (B[d]-A[d])*float64(i)/float64(m) + (C[d]-A[d])*float64(j)/float64(m)
			}
			return proj(p)
		}
		for i := 0; i < m; i++ {
			for j := 0; i+j < m; j++ {
				tris = append(tris, [3][3]float64{at(i, j), at(i+1, j), at(i, j+1)})
				if i+j+2 <= m {
					tris = append(tris, [3][3]float64{at(i+1, j), at(i+1, j+1), at(i, j+1)})
				}
			}
		}
	}
	return polyhedron("sphere", tris, c, 4*math.Pi*r*r)
}
