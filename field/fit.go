package field

import (
	"math"
	"sync"
)

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
// axis, all > 0). With vals nil it returns instead the fit operator: a fit
// of comps = m components whose coefficients coef[t*m+i] map sample values
// to coefficients, coef_t = Σ_i coef[t*m+i] v_i. ok is false when the
// stencil does not determine the polynomial: fewer points than terms, or a
// geometry so close to degenerate that, with the columns of the
// least-squares matrix scaled to unit norm, the smallest |R_ii| of its QR
// factor is below tol times the largest.
func fitStencil(dim, deg int, x0, h [3]float64, pts [][3]float64, vals []float64, comps int, tol float64) (polyFit, bool) {
	if vals == nil {
		return fitOperator(dim, deg, numTerms(dim, deg), x0, h, pts, tol)
	}
	n, m := numTerms(dim, deg), len(pts)
	fit := polyFit{dim: dim, terms: n, comps: comps, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	w := getFitWork(m * n)
	defer fitPool.Put(w)
	var colScale, diag, vn [10]float64
	if !fit.design(pts, w.a, &colScale) {
		return fit, false
	}
	B := make([]float64, m*comps)
	copy(B, vals)
	if !householder(w.a, m, n, B, comps, tol, &diag, &vn) {
		return fit, false
	}
	// Back substitution R X = Qᵀ B (first n rows); R_jt = a[t*m+j].
	fit.coef = make([]float64, n*comps)
	X := fit.coef
	for c := 0; c < comps; c++ {
		for j := n - 1; j >= 0; j-- {
			s := B[j*comps+c]
			for t := j + 1; t < n; t++ {
				s -= w.a[t*m+j] * X[t*comps+c]
			}
			X[j*comps+c] = s / diag[j]
		}
	}
	fit.unscale(&colScale)
	return fit, true
}

// fitOperator returns the fit operator of fitStencil (vals nil) restricted
// to the first rows basis terms (1 <= rows <= numTerms(dim, deg)): the
// least-squares fit is still of degree deg over all its terms, but only the
// coefficients of the first rows terms are kept (terms = rows), for callers
// that need no more, such as the value and gradient at the centre (rows =
// dim+1). ok is as for fitStencil.
func fitOperator(dim, deg, rows int, x0, h [3]float64, pts [][3]float64, tol float64) (polyFit, bool) {
	n, m := numTerms(dim, deg), len(pts)
	fit := polyFit{dim: dim, terms: n, comps: m, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	size := m * n
	if rows == n {
		size *= 2 // lsqOperator needs A itself too
	}
	w := getFitWork(size)
	defer fitPool.Put(w)
	a, a0 := w.a[:m*n], w.a[m*n:]
	var colScale, diag, vn [10]float64
	if !fit.design(pts, a, &colScale) {
		return fit, false
	}
	if rows == n {
		copy(a0, a)
	}
	if !householder(a, m, n, nil, 0, tol, &diag, &vn) {
		return fit, false
	}
	fit.coef = make([]float64, rows*m)
	if rows == n {
		lsqOperator(a, a0, m, n, &diag, fit.coef)
	} else {
		lsqOperatorRows(a, m, n, rows, &diag, &vn, fit.coef)
	}
	fit.terms = rows
	fit.unscale(&colScale)
	return fit, true
}

// fitWork is scratch space for one fit, pooled so that building many fits
// allocates only their results. Its contents never outlive a fit.
type fitWork struct{ a []float64 }

var fitPool = sync.Pool{New: func() any { return new(fitWork) }}

// getFitWork returns pooled scratch with len(w.a) == size.
func getFitWork(size int) *fitWork {
	w := fitPool.Get().(*fitWork)
	if cap(w.a) < size {
		w.a = make([]float64, size)
	}
	w.a = w.a[:size]
	return w
}

// design stores in a the least-squares matrix of the fit at pts, column
// by column (a[j*m+i] is basis term j at sample i, m = len(pts)), each
// column scaled to unit norm by colScale[j] (equilibration: the rank test
// then measures the geometry of the stencil and not the scaling of the
// basis). It returns false when a column is zero.
func (p *polyFit) design(pts [][3]float64, a []float64, colScale *[10]float64) bool {
	n, m := p.terms, len(pts)
	var row [10]float64
	for i, x := range pts {
		basisRow(p.dim, p.scaled(x), row[:n])
		for j := 0; j < n; j++ {
			a[j*m+i] = row[j]
		}
	}
	for j := 0; j < n; j++ {
		col := a[j*m : (j+1)*m]
		s := 0.0 // entries are O(1) after scaling by h: no overflow
		for _, v := range col {
			s += v * v
		}
		if s == 0 {
			return false
		}
		colScale[j] = 1 / math.Sqrt(s)
		for i := range col {
			col[i] *= colScale[j]
		}
	}
	return true
}

// unscale maps coefficients of the equilibrated basis back to the basis:
// row t of coef (comps values) times colScale[t].
func (p *polyFit) unscale(colScale *[10]float64) {
	for t := 0; t < p.terms; t++ {
		for c := 0; c < p.comps; c++ {
			p.coef[t*p.comps+c] *= colScale[t]
		}
	}
}

// lsqOperator stores in W (n×m, row-major) the least-squares operator of
// the equilibrated matrix a0 (column-major, m×n): W = (AᵀA)⁻¹Aᵀ =
// R⁻¹R⁻ᵀAᵀ with R from the Householder QR of A, held in a and diag as
// householder leaves them (semi-normal equations; A is equilibrated and
// well-posed, so the squared condition number stays far from rounding
// trouble).
func lsqOperator(a, a0 []float64, m, n int, diag *[10]float64, W []float64) {
	var R [10 * 10]float64 // R[j*10+t] = R_jt, t > j, row-major copy
	for j := 0; j < n; j++ {
		for t := j + 1; t < n; t++ {
			R[j*10+t] = a[t*m+j]
		}
	}
	var y, z [10]float64
	for i := 0; i < m; i++ {
		// Rᵀ y = a_i (forward), then R z = y (backward); z is column i of W.
		for j := 0; j < n; j++ {
			s := a0[j*m+i]
			col := a[j*m : j*m+j] // R_tj, t < j
			for t, r := range col {
				s -= r * y[t]
			}
			y[j] = s / diag[j]
		}
		for j := n - 1; j >= 0; j-- {
			s := y[j]
			for t := j + 1; t < n; t++ {
				s -= R[j*10+t] * z[t]
			}
			z[j] = s / diag[j]
			W[j*m+i] = z[j]
		}
	}
}

// lsqOperatorRows stores in W (rows×m) the first rows rows of the
// least-squares operator (AᵀA)⁻¹Aᵀ = R⁻¹Q₁ᵀ of the equilibrated matrix
// whose Householder QR householder left in a, diag and vn (Q₁ the first n
// columns of Q = H₀H₁…H₍ₙ₋₁₎): row r is (Q [y; 0])ᵀ with Rᵀy = e_r, so
// that only rows rather than the whole operator are formed.
func lsqOperatorRows(a []float64, m, n, rows int, diag, vn *[10]float64, W []float64) {
	for r := 0; r < rows; r++ {
		var y [10]float64
		for j := r; j < n; j++ {
			s := 0.0
			if j == r {
				s = 1
			}
			col := a[j*m : j*m+j] // R_tj, t < j
			for t := r; t < j; t++ {
				s -= col[t] * y[t]
			}
			y[j] = s / diag[j]
		}
		x := W[r*m : (r+1)*m]
		copy(x, y[:n])
		for j := n - 1; j >= 0; j-- {
			if vn[j] != 0 {
				reflect(a[j*m+j:(j+1)*m], vn[j], x[j:])
			}
		}
	}
}

// reflect applies the Householder reflection I − 2vvᵀ/(vᵀv), with
// vnorm2 = vᵀv, to x (len(x) = len(v)): x −= (2 vᵀx / vᵀv) v.
func reflect(v []float64, vnorm2 float64, x []float64) {
	x = x[:len(v)]
	s := 0.0
	for i, vi := range v {
		s += vi * x[i]
	}
	s = 2 * s / vnorm2
	for i, vi := range v {
		x[i] -= s * vi
	}
}

// reflectStrided is reflect on x[0], x[k], x[2k], ...
func reflectStrided(v []float64, vnorm2 float64, x []float64, k int) {
	s := 0.0
	for i, vi := range v {
		s += vi * x[i*k]
	}
	s = 2 * s / vnorm2
	for i, vi := range v {
		x[i*k] -= s * vi
	}
}

// householder reduces a (m×n, column-major: a[j*m+i] is entry (i, j)) to R
// by Householder reflections, applying them to B (m×k, row-major) too: on
// return R_jt (t > j) is a[t*m+j] and diag holds R_jj. It returns false
// when the smallest |R_jj| is below tol times the largest. vn[j] = vᵀv of
// reflection j (0: none), its vector v being a[j*m+j : (j+1)*m].
func householder(a []float64, m, n int, B []float64, k int, tol float64, diag, vn *[10]float64) bool {
	for j := 0; j < n; j++ {
		v := a[j*m+j : (j+1)*m]
		norm := 0.0 // entries are O(1) after equilibration: no overflow
		for _, x := range v {
			norm += x * x
		}
		norm = math.Sqrt(norm)
		if norm == 0 {
			return false
		}
		alpha := -math.Copysign(norm, v[0])
		// v = x - alpha e1 stored in a[j:,j]; R_jj = alpha.
		v[0] -= alpha
		vnorm2 := 0.0
		for _, x := range v {
			vnorm2 += x * x
		}
		diag[j], vn[j] = alpha, vnorm2
		if vnorm2 == 0 {
			continue
		}
		for c := j + 1; c < n; c++ {
			reflect(v, vnorm2, a[c*m+j:(c+1)*m])
		}
		for c := 0; c < k; c++ {
			reflectStrided(v, vnorm2, B[j*k+c:], k)
		}
	}
	big := 0.0
	for _, d := range diag[:n] {
		big = math.Max(big, math.Abs(d))
	}
	for _, d := range diag[:n] {
		if !(math.Abs(d) > tol*big) {
			return false
		}
	}
	return true
}
