package field

import "math"

// CellCentroid returns the volume centroid (area centroid for 2D cells) of
// cell c of z under its shape-function map:
//
//	x_c = ∫ x dV / ∫ dV,   dV = |det J| dr
//
// computed with a quadrature that is exact for the map of each type
// (2-point Gauss per direction on quads, hexahedra and pyramids; the
// 3-point degree-2 triangle rule times 2-point Gauss on wedges). For
// triangles and tetrahedra it is the mean of the nodes. It differs from the
// node mean (Zone.Centroid) for non-parallelepiped cells, by a quarter of
// the height for pyramids. A finite-volume solver's cell value is the value
// at this point to second order, which is how the Sampler reads cell data.
// Cells without shape functions and degenerate cells give the node mean.
func (z *Zone) CellCentroid(c int) [3]float64 {
	var g cellGeom
	if !z.gather(c, &g) {
		return z.Centroid(c)
	}
	var pts []quadPoint
	switch g.t {
	case Triangle, Tetra:
		return z.Centroid(c)
	case Quad:
		if g.x[0][2] != g.x[1][2] || g.x[0][2] != g.x[2][2] || g.x[0][2] != g.x[3][2] {
			return surfaceQuadCentroid(&g)
		}
		pts = quadGauss2[:]
	case Hexa, Pyramid:
		pts = hexGauss2[:]
	case Wedge:
		pts = wedgeRule[:]
	}
	m := g.multilinear()
	var sx [3]float64
	vol := 0.0
	for _, q := range pts {
		x, J := m.eval(q.r, g.dim)
		d := q.w * det3(J)
		vol += d
		for k := 0; k < 3; k++ {
			sx[k] += d * x[k]
		}
	}
	if !(math.Abs(vol) > 0) {
		return z.Centroid(c)
	}
	for k := 0; k < 3; k++ {
		sx[k] /= vol
	}
	if g.dim == 2 {
		sx[2] = g.x[0][2]
	}
	return sx
}

// surfaceQuadCentroid returns the area centroid of a bilinear quad that
// does not lie in a plane z = const (a wall or surface cell in 3D space):
//
//	x_c = ∫ x |∂x/∂u × ∂x/∂v| du dv / ∫ |∂x/∂u × ∂x/∂v| du dv
//
// with the 2×2 Gauss rule (the area element of a warped quad is not
// polynomial; the rule is exact for planar quads and second-order accurate
// otherwise).
func surfaceQuadCentroid(g *cellGeom) [3]float64 {
	var sx [3]float64
	area := 0.0
	for _, q := range quadGauss2 {
		u, v := q.r[0], q.r[1]
		N := [4]float64{(1 - u) * (1 - v), u * (1 - v), u * v, (1 - u) * v}
		dNu := [4]float64{-(1 - v), 1 - v, v, -v}
		dNv := [4]float64{-(1 - u), -u, u, 1 - u}
		var x, xu, xv [3]float64
		for i := 0; i < 4; i++ {
			for k := 0; k < 3; k++ {
				x[k] += N[i] * g.x[i][k]
				xu[k] += dNu[i] * g.x[i][k]
				xv[k] += dNv[i] * g.x[i][k]
			}
		}
		cx := xu[1]*xv[2] - xu[2]*xv[1]
		cy := xu[2]*xv[0] - xu[0]*xv[2]
		cz := xu[0]*xv[1] - xu[1]*xv[0]
		d := q.w * math.Sqrt(cx*cx+cy*cy+cz*cz)
		area += d
		for k := 0; k < 3; k++ {
			sx[k] += d * x[k]
		}
	}
	if !(area > 0) {
		var m [3]float64
		for i := 0; i < 4; i++ {
			for k := 0; k < 3; k++ {
				m[k] += g.x[i][k] / 4
			}
		}
		return m
	}
	for k := 0; k < 3; k++ {
		sx[k] /= area
	}
	return sx
}

// quadPoint is a point of a quadrature rule on a reference cell.
type quadPoint struct {
	r [3]float64
	w float64
}

// Gauss-Legendre 2-point abscissae on [0,1]: (1 ∓ 1/√3)/2.
var gaussLo, gaussHi = (1 - 1/math.Sqrt(3)) / 2, (1 + 1/math.Sqrt(3)) / 2

var (
	quadGauss2 [4]quadPoint
	hexGauss2  [8]quadPoint
	wedgeRule  [6]quadPoint
)

func init() {
	g := [2]float64{gaussLo, gaussHi}
	for i := 0; i < 8; i++ {
		hexGauss2[i] = quadPoint{[3]float64{g[i&1], g[i>>1&1], g[i>>2&1]}, 1.0 / 8}
		if i < 4 {
			quadGauss2[i] = quadPoint{[3]float64{g[i&1], g[i>>1&1], 0}, 1.0 / 4}
		}
	}
	// Degree-2 triangle rule (Strang & Fix 1973): points (1/6,1/6),
	// (2/3,1/6), (1/6,2/3), each weight 1/6 of the unit triangle's area 1/2.
	tri := [3][2]float64{{1.0 / 6, 1.0 / 6}, {2.0 / 3, 1.0 / 6}, {1.0 / 6, 2.0 / 3}}
	for i, p := range tri {
		for j, t := range g {
			wedgeRule[2*i+j] = quadPoint{[3]float64{p[0], p[1], t}, 1.0 / 12}
		}
	}
}

// det3 returns the determinant of J.
func det3(J [3][3]float64) float64 {
	return J[0][0]*(J[1][1]*J[2][2]-J[1][2]*J[2][1]) -
		J[0][1]*(J[1][0]*J[2][2]-J[1][2]*J[2][0]) +
		J[0][2]*(J[1][0]*J[2][1]-J[1][1]*J[2][0])
}
