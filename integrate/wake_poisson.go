package integrate

import (
	"math"

	"gonum.org/v1/gonum/dsp/fourier"
)

// poissonGrid is the node grid of a Poisson problem on a rectangle:
// (m1+2) × (m2+2) nodes with spacings h1, h2, node (i, j) at index
// j·(m1+2) + i; the m1 × m2 interior nodes are unknown and the frame
// (i = 0, m1+1 or j = 0, m2+1) holds Dirichlet values.
type poissonGrid struct {
	m1, m2 int
	h1, h2 float64
}

func (g poissonGrid) idx(i, j int) int { return j*(g.m1+2) + i }

// solve returns u on all nodes with the 5-point discrete Laplacian
//
//	(u[i−1,j] − 2u[i,j] + u[i+1,j])/h1² + (u[i,j−1] − 2u[i,j] + u[i,j+1])/h2² = f[i,j]
//
// at every interior node and u = frame on the frame (f and frame are node
// arrays; f's frame entries and frame's interior entries are ignored). The
// system is diagonalised by the type-I discrete sine transform in both
// directions (eigenvalues (2cos(kπ/(m+1)) − 2)/h²; e.g. Press et al.,
// Numerical Recipes, 3rd ed., §20.4, from memory), exact to rounding, in
// O(m1 m2 log(m1 m2)) operations. Deterministic, single-threaded.
func (g poissonGrid) solve(f, frame []float64) []float64 {
	m1, m2 := g.m1, g.m2
	u := make([]float64, (m1+2)*(m2+2))
	for j := 0; j < m2+2; j++ {
		for i := 0; i < m1+2; i++ {
			if i == 0 || j == 0 || i == m1+1 || j == m2+1 {
				u[g.idx(i, j)] = frame[g.idx(i, j)]
			}
		}
	}
	if m1 == 0 || m2 == 0 {
		return u
	}
	a1, a2 := 1/(g.h1*g.h1), 1/(g.h2*g.h2)
	// Right-hand side with the frame moved over, row-major m1 × m2.
	r := make([]float64, m1*m2)
	for j := 1; j <= m2; j++ {
		for i := 1; i <= m1; i++ {
			v := f[g.idx(i, j)]
			if i == 1 {
				v -= a1 * u[g.idx(0, j)]
			}
			if i == m1 {
				v -= a1 * u[g.idx(m1+1, j)]
			}
			if j == 1 {
				v -= a2 * u[g.idx(i, 0)]
			}
			if j == m2 {
				v -= a2 * u[g.idx(i, m2+1)]
			}
			r[(j-1)*m1+i-1] = v
		}
	}
	t1, t2 := fourier.NewDST(m1), fourier.NewDST(m2)
	col := make([]float64, m2)
	transform := func() {
		for j := 0; j < m2; j++ {
			row := r[j*m1 : (j+1)*m1]
			t1.Transform(row, row)
		}
		for i := 0; i < m1; i++ {
			for j := 0; j < m2; j++ {
				col[j] = r[j*m1+i]
			}
			t2.Transform(col, col)
			for j := 0; j < m2; j++ {
				r[j*m1+i] = col[j]
			}
		}
	}
	transform()
	// The unnormalised transform applied twice multiplies by 2(m+1).
	norm := 1 / (4 * float64(m1+1) * float64(m2+1))
	for j := 0; j < m2; j++ {
		mu := a2 * (2*math.Cos(float64(j+1)*math.Pi/float64(m2+1)) - 2)
		for i := 0; i < m1; i++ {
			lam := a1 * (2*math.Cos(float64(i+1)*math.Pi/float64(m1+1)) - 2)
			r[j*m1+i] *= norm / (lam + mu)
		}
	}
	transform()
	for j := 1; j <= m2; j++ {
		for i := 1; i <= m1; i++ {
			u[g.idx(i, j)] = r[(j-1)*m1+i-1]
		}
	}
	return u
}
