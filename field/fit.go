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

// centreGradient stores in dst[3*c+j] the gradient of the fit at its centre
// x0, where only the linear terms contribute.
func (p *polyFit) centreGradient(dst []float64) {
	for c := 0; c < p.comps; c++ {
		for j := 0; j < 3; j++ {
			v := 0.0
			if j < p.dim && p.terms > 1 {
				v = p.coef[(1+j)*p.comps+c] / p.h[j]
			}
			dst[3*c+j] = v
		}
	}
}

// fitStencil fits a polynomial of degree deg to m samples at points pts with
// values vals (m×comps, interleaved), centred on x0 and scaled by h (per
// axis, all > 0). With vals nil it returns instead the fit operator: a fit
// of comps = m components whose coefficients coef[t*m+i] map sample values
// to coefficients, coef_t = Σ_i coef[t*m+i] v_i. ok is false when the
// stencil does not determine the polynomial: fewer points than terms, or a
// geometry so close to degenerate that, with the columns of the
// least-squares matrix scaled to unit norm, the smallest |R_ii| of its QR
// factor is below tol times the largest.
func fitStencil(dim, deg int, x0, h [3]float64, pts [][3]float64, vals []float64, comps int, tol float64) (polyFit, bool) {
	n := numTerms(dim, deg)
	m := len(pts)
	if vals == nil {
		comps = m
	}
	fit := polyFit{dim: dim, terms: n, comps: comps, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	A := make([]float64, m*n)
	for i, x := range pts {
		basisRow(dim, fit.scaled(x), A[i*n:(i+1)*n])
	}
	// Equilibrate: unit column norms, so that the rank test measures the
	// geometry of the stencil and not the scaling of the basis.
	var colScale [10]float64
	for j := 0; j < n; j++ {
		s := 0.0
		for i := 0; i < m; i++ {
			s += A[i*n+j] * A[i*n+j]
		}
		if s == 0 {
			return fit, false
		}
		colScale[j] = 1 / math.Sqrt(s)
		for i := 0; i < m; i++ {
			A[i*n+j] *= colScale[j]
		}
	}
	fit.coef = make([]float64, n*comps)
	if vals == nil {
		if !lsqOperator(A, m, n, fit.coef, tol) {
			return fit, false
		}
	} else {
		B := make([]float64, m*comps)
		copy(B, vals)
		if !lsqSolve(A, m, n, B, comps, fit.coef, tol) {
			return fit, false
		}
	}
	for j := 0; j < n; j++ {
		for c := 0; c < comps; c++ {
			fit.coef[j*comps+c] *= colScale[j]
		}
	}
	return fit, true
}

// lsqOperator stores in W (n×m) the least-squares operator of A (m×n,
// row-major, overwritten): W = (AᵀA)⁻¹Aᵀ = R⁻¹R⁻ᵀAᵀ with R from the
// Householder QR of A (semi-normal equations; A is equilibrated and
// well-posed, so the squared condition number stays far from rounding
// trouble). It returns false when A is rank deficient at tolerance tol.
func lsqOperator(A []float64, m, n int, W []float64, tol float64) bool {
	At := make([]float64, m*n)
	copy(At, A)
	diag, ok := householder(A, m, n, nil, 0, tol)
	if !ok {
		return false
	}
	var y [10]float64
	for i := 0; i < m; i++ {
		a := At[i*n : (i+1)*n]
		// Rᵀ y = a (forward), then R z = y (backward); z is column i of W.
		for j := 0; j < n; j++ {
			s := a[j]
			for t := 0; t < j; t++ {
				s -= A[t*n+j] * y[t]
			}
			y[j] = s / diag[j]
		}
		for j := n - 1; j >= 0; j-- {
			s := y[j]
			for t := j + 1; t < n; t++ {
				s -= A[j*n+t] * W[t*m+i]
			}
			W[j*m+i] = s / diag[j]
		}
	}
	return true
}

// lsqSolve solves the least-squares problem min ||A X - B|| for X (n×k) by
// Householder QR. A (m×n) and B (m×k) are row-major and overwritten. It
// returns false when A is rank deficient at tolerance tol (see fitStencil).
func lsqSolve(A []float64, m, n int, B []float64, k int, X []float64, tol float64) bool {
	diag, ok := householder(A, m, n, B, k, tol)
	if !ok {
		return false
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

// reflectColumn applies the Householder reflection I − 2vvᵀ/(vᵀv), with
// v = A[j:m, j] (A has row stride n) and vnorm2 = vᵀv, to rows j..m−1 of
// column c of X (row stride k): x −= (2 vᵀx / vᵀv) v.
func reflectColumn(A []float64, n, j, m int, vnorm2 float64, X []float64, k, c int) {
	s := 0.0
	for i := j; i < m; i++ {
		s += A[i*n+j] * X[i*k+c]
	}
	s = 2 * s / vnorm2
	for i := j; i < m; i++ {
		X[i*k+c] -= s * A[i*n+j]
	}
}

// householder reduces A (m×n) to R by Householder reflections, applying
// them to B (m×k) too: on return the strict upper triangle of A's first n
// rows holds R above its diagonal, and diag holds R_jj. ok is false when
// the smallest |R_jj| is below tol times the largest.
func householder(A []float64, m, n int, B []float64, k int, tol float64) (diag []float64, ok bool) {
	diag = make([]float64, n)
	for j := 0; j < n; j++ {
		norm := 0.0 // entries are O(1) after equilibration: no overflow
		for i := j; i < m; i++ {
			norm += A[i*n+j] * A[i*n+j]
		}
		norm = math.Sqrt(norm)
		if norm == 0 {
			return nil, false
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
			reflectColumn(A, n, j, m, vnorm2, A, n, c)
		}
		for c := 0; c < k; c++ {
			reflectColumn(A, n, j, m, vnorm2, B, k, c)
		}
	}
	big := 0.0
	for _, d := range diag {
		big = math.Max(big, math.Abs(d))
	}
	for _, d := range diag {
		if !(math.Abs(d) > tol*big) {
			return nil, false
		}
	}
	return diag, true
}
