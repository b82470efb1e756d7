package fieldtest

import "farforce/field"

// SampleCellAverages adds an array at the cells of z holding the average of
// f over each cell, computed on the conforming simplex split of the cell
// (z.Simplices) with the degree-3 Stroud T3:3-1 rule on each tetrahedron
// or the degree-3 Strang-Fix rule on each triangle: the value a
// finite-volume solver's cell average converges to.
func SampleCellAverages(z *field.Zone, name string, comps int, f func(x [3]float64, dst []float64)) {
	n := z.NumCells()
	a := field.Array{Name: name, Location: field.AtCells, Components: comps, Data: make([]float64, n*comps)}
	var simp [][4][3]float64
	val := make([]float64, comps)
	for c := 0; c < n; c++ {
		simp = z.Simplices(c, simp[:0])
		dim := z.Types[c].Dim()
		out := a.Data[c*comps : (c+1)*comps]
		vol := 0.0
		for _, s := range simp {
			v := simplexMeasure(s, dim)
			for _, q := range simplexRule(dim) {
				var x [3]float64
				for k := 0; k < 3; k++ {
					x[k] = s[0][k]
					for m := 0; m < dim; m++ {
						x[k] += q.b[m] * (s[m+1][k] - s[0][k])
					}
				}
				f(x, val)
				for i := range out {
					out[i] += v * q.w * val[i]
				}
			}
			vol += v
		}
		for i := range out {
			out[i] /= vol
		}
	}
	z.Arrays = append(z.Arrays, a)
}

type simplexPoint struct {
	b [3]float64 // barycentric coordinates of vertices 1..dim
	w float64    // weight, summing to 1
}

// simplexRule returns a degree-3 rule on the reference simplex: for
// triangles Strang & Fix (1973) 4-point (centroid weight -27/48, three
// points (0.6,0.2,0.2) weight 25/48); for tetrahedra Keast (1986) 5-point
// (centroid weight -4/5, four points (1/2,1/6,1/6,1/6) weight 9/20).
func simplexRule(dim int) []simplexPoint {
	if dim == 2 {
		return []simplexPoint{
			{[3]float64{1.0 / 3, 1.0 / 3}, -27.0 / 48},
			{[3]float64{0.2, 0.2}, 25.0 / 48}, {[3]float64{0.6, 0.2}, 25.0 / 48}, {[3]float64{0.2, 0.6}, 25.0 / 48},
		}
	}
	return []simplexPoint{
		{[3]float64{0.25, 0.25, 0.25}, -4.0 / 5},
		{[3]float64{1.0 / 6, 1.0 / 6, 1.0 / 6}, 9.0 / 20}, {[3]float64{0.5, 1.0 / 6, 1.0 / 6}, 9.0 / 20},
		{[3]float64{1.0 / 6, 0.5, 1.0 / 6}, 9.0 / 20}, {[3]float64{1.0 / 6, 1.0 / 6, 0.5}, 9.0 / 20},
	}
}

// simplexMeasure returns the area (dim 2, x-y plane) or volume of s.
func simplexMeasure(s [4][3]float64, dim int) float64 {
	var u, v, w [3]float64
	for k := 0; k < 3; k++ {
		u[k], v[k], w[k] = s[1][k]-s[0][k], s[2][k]-s[0][k], s[3][k]-s[0][k]
	}
	if dim == 2 {
		return abs(u[0]*v[1]-u[1]*v[0]) / 2
	}
	return abs(u[0]*(v[1]*w[2]-v[2]*w[1])-u[1]*(v[0]*w[2]-v[2]*w[0])+u[2]*(v[0]*w[1]-v[1]*w[0])) / 6
}

func abs(x float64) float64 {
	if x < 0 {
		return -x
	}
	return x
}
