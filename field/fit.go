package field

import "math"

// Polynomial least-squares fits used by cell-data reconstruction and nodal
// gradient recovery. A fit is centred on a point x0 and scaled by a length
// h: with u = (x - x0)/h the basis is
//
//	3D: 1, u, v, w, u², v², w², uv, vw, wu   (10 terms; the first 4 are linear)
//	2D: 1, u, v, u², v², uv                   (6 terms; the first 3 are linear)
//
// The scaling keeps the least-squares matrix entries of order one so that
// its conditioning reflects only the geometry of the stencil.

// numTerms returns the number of basis terms of degree deg (0, 1 or 2) in
// dim dimensions.
func numTerms(dim, deg int) int {
	switch deg {
	case 0:
		return 1
	case 1:
		return dim + 1
	}
	if dim == 2 {
		return 6
	}
	return 10
}

// basisRow stores the first len(row) basis terms at u.
func basisRow(dim int, u [3]float64, row []float64) {
	var all [10]float64
	if dim == 2 {
		all = [10]float64{1, u[0], u[1], u[0] * u[0], u[1] * u[1], u[0] * u[1]}
	} else {
		all = [10]float64{1, u[0], u[1], u[2], u[0] * u[0], u[1] * u[1], u[2] * u[2], u[0] * u[1], u[1] * u[2], u[2] * u[0]}
	}
	copy(row, all[:len(row)])
}

// basisGrad stores in d[t] the gradient with respect to u of the first
// len(d) basis terms at u.
func basisGrad(dim int, u [3]float64, d [][3]float64) {
	var all [10][3]float64
	if dim == 2 {
		all = [10][3]float64{{}, {1, 0, 0}, {0, 1, 0}, {2 * u[0], 0, 0}, {0, 2 * u[1], 0}, {u[1], u[0], 0}}
	} else {
		all = [10][3]float64{{}, {1, 0, 0}, {0, 1, 0}, {0, 0, 1},
			{2 * u[0], 0, 0}, {0, 2 * u[1], 0}, {0, 0, 2 * u[2]},
			{u[1], u[0], 0}, {0, u[2], u[1]}, {u[2], 0, u[0]}}
	}
	copy(d, all[:len(d)])
}

// polyFit is a fitted polynomial for comps components: coef[t*comps+c] is
// the coefficient of basis term t for component c. Each axis is scaled by
// its own length h[k], so stretched stencils stay well conditioned.
type polyFit struct {
	dim, terms, comps int
	x0, h             [3]float64
	coef              []float64
}

func (p *polyFit) scaled(x [3]float64) (u [3]float64) {
	for k := 0; k < p.dim; k++ {
		u[k] = (x[k] - p.x0[k]) / p.h[k]
	}
	return u
}

// value stores the fitted values at x in dst[:comps].
func (p *polyFit) value(x [3]float64, dst []float64) {
	var row [10]float64
	basisRow(p.dim, p.scaled(x), row[:p.terms])
	for c := 0; c < p.comps; c++ {
		s := 0.0
		for t := 0; t < p.terms; t++ {
			s += row[t] * p.coef[t*p.comps+c]
		}
		dst[c] = s
	}
}

// gradient stores the fitted gradients at x in dst[3*c+j] = ∂f_c/∂x_j.
func (p *polyFit) gradient(x [3]float64, dst []float64) {
	var d [10][3]float64
	basisGrad(p.dim, p.scaled(x), d[:p.terms])
	for c := 0; c < p.comps; c++ {
		for j := 0; j < 3; j++ {
			s := 0.0
			for t := 0; t < p.terms; t++ {
				s += d[t][j] * p.coef[t*p.comps+c]
			}
			if j < p.dim {
				s /= p.h[j]
			}
			dst[3*c+j] = s
		}
	}
}

// fitStencil fits a polynomial of degree deg to m samples at points pts with
// values vals (m×comps, interleaved), centred on x0 and scaled by h (per
// axis, all > 0). ok is false when the stencil does not determine the
// polynomial: fewer points than terms, or a geometry so close to degenerate
// that, with the columns of the least-squares matrix scaled to unit norm,
// the smallest |R_ii| of its QR factor is below tol times the largest.
func fitStencil(dim, deg int, x0, h [3]float64, pts [][3]float64, vals []float64, comps int, tol float64) (polyFit, bool) {
	n := numTerms(dim, deg)
	m := len(pts)
	fit := polyFit{dim: dim, terms: n, comps: comps, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	A := make([]float64, m*n)
	B := make([]float64, m*comps)
	copy(B, vals)
	for i, x := range pts {
		basisRow(dim, fit.scaled(x), A[i*n:(i+1)*n])
	}
	// Equilibrate: unit column norms, so that the rank test measures the
	// geometry of the stencil and not the scaling of the basis.
	var colScale [10]float64
	for j := 0; j < n; j++ {
		s := 0.0
		for i := 0; i < m; i++ {
			s = math.Hypot(s, A[i*n+j])
		}
		if s == 0 {
			return fit, false
		}
		colScale[j] = 1 / s
		for i := 0; i < m; i++ {
			A[i*n+j] *= colScale[j]
		}
	}
	fit.coef = make([]float64, n*comps)
	if !lsqSolve(A, m, n, B, comps, fit.coef, tol) {
		return fit, false
	}
	for j := 0; j < n; j++ {
		for c := 0; c < comps; c++ {
			fit.coef[j*comps+c] *= colScale[j]
		}
	}
	return fit, true
}

// lsqSolve solves the least-squares problem min ||A X - B|| for X (n×k) by
// Householder QR. A (m×n) and B (m×k) are row-major and overwritten. It
// returns false when A is rank deficient at tolerance tol (see fitStencil).
func lsqSolve(A []float64, m, n int, B []float64, k int, X []float64, tol float64) bool {
	diag := make([]float64, n)
	for j := 0; j < n; j++ {
		norm := 0.0
		for i := j; i < m; i++ {
			norm = math.Hypot(norm, A[i*n+j])
		}
		if norm == 0 {
			return false
		}
		alpha := -math.Copysign(norm, A[j*n+j])
		// v = x - alpha e1 stored in A[j:,j]; R_jj = alpha.
		A[j*n+j] -= alpha
		vnorm2 := 0.0
		for i := j; i < m; i++ {
			vnorm2 += A[i*n+j] * A[i*n+j]
		}
		diag[j] = alpha
		if vnorm2 == 0 {
			continue
		}
		for c := j + 1; c < n; c++ {
			s := 0.0
			for i := j; i < m; i++ {
				s += A[i*n+j] * A[i*n+c]
			}
			s = 2 * s / vnorm2
			for i := j; i < m; i++ {
				A[i*n+c] -= s * A[i*n+j]
			}
		}
		for c := 0; c < k; c++ {
			s := 0.0
			for i := j; i < m; i++ {
				s += A[i*n+j] * B[i*k+c]
			}
			s = 2 * s / vnorm2
			for i := j; i < m; i++ {
				B[i*k+c] -= s * A[i*n+j]
			}
		}
	}
	big := 0.0
	for _, d := range diag {
		big = math.Max(big, math.Abs(d))
	}
	for _, d := range diag {
		if !(math.Abs(d) > tol*big) {
			return false
		}
	}
	// Back substitution R X = Qᵀ B (first n rows).
	for c := 0; c < k; c++ {
		for j := n - 1; j >= 0; j-- {
			s := B[j*k+c]
			for t := j + 1; t < n; t++ {
				s -= A[j*n+t] * X[t*k+c]
			}
			X[j*k+c] = s / diag[j]
		}
	}
	return true
}
