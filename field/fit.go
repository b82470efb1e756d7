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
// its own length h[k], so stretched stencils stay well conditioned. A fit
// operator may keep only the terms first..terms-1 (see fitOperator): then
// coef[(t-first)*comps+c] is the coefficient of term t, and value and
// gradient must not be used.
type polyFit struct {
	dim, first, terms, comps int
	x0, h                    [3]float64
	coef                     []float64
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
		w := fitPool.Get().(*fitWork)
		defer fitPool.Put(w)
		return fitOperator(dim, deg, 0, numTerms(dim, deg), x0, h, pts, tol, w)
	}
	n, m := numTerms(dim, deg), len(pts)
	fit := polyFit{dim: dim, terms: n, comps: comps, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	w := fitPool.Get().(*fitWork)
	defer fitPool.Put(w)
	w.size(m * n)
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
// to the basis terms first..rows-1 (0 <= first < rows <= numTerms(dim,
// deg)): the least-squares fit is still of degree deg over all its terms,
// but only the coefficients of those terms are kept (first, terms = rows;
// coef[(t-first)*m+i]), for callers that need no more, such as the
// gradient at the centre (first = 1, rows = dim+1). The kept coefficients
// do not depend on first. ok is as for fitStencil. w is scratch space.
func fitOperator(dim, deg, first, rows int, x0, h [3]float64, pts [][3]float64, tol float64, w *fitWork) (polyFit, bool) {
	n, m := numTerms(dim, deg), len(pts)
	fit := polyFit{dim: dim, terms: n, comps: m, x0: x0, h: h}
	if m < n {
		return fit, false
	}
	size := m * n
	if rows == n {
		size *= 2 // lsqOperator needs A itself too
	}
	w.size(size)
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
	if rows == n {
		fit.coef = make([]float64, rows*m)
		lsqOperator(a, a0, m, n, &diag, fit.coef)
		fit.coef = fit.coef[first*m:]
	} else {
		fit.coef = make([]float64, (rows-first)*m)
		lsqOperatorRows(a, m, n, first, rows, &diag, &vn, fit.coef)
	}
	fit.first, fit.terms = first, rows
	fit.unscale(&colScale)
	return fit, true
}

// fitWork is scratch space for one fit at a time, reused so that building
// many fits allocates only their results: kept with a stencil's scratch
// (stencilWork) or pooled. Its contents never outlive a fit.
type fitWork struct{ a []float64 }

var fitPool = sync.Pool{New: func() any { return new(fitWork) }}

// size makes len(w.a) == n.
func (w *fitWork) size(n int) {
	if cap(w.a) < n {
		w.a = make([]float64, n)
	}
	w.a = w.a[:n]
}

// design stores in a the least-squares matrix of the fit at pts, column
// by column (a[j*m+i] is basis term j at sample i, m = len(pts)), each
// column scaled to unit norm by colScale[j] (equilibration: the rank test
// then measures the geometry of the stencil and not the scaling of the
// basis). It returns false when a column is zero.
func (p *polyFit) design(pts [][3]float64, a []float64, colScale *[10]float64) bool {
	n, m := p.terms, len(pts)
	col := func(j int) []float64 { return a[j*m : (j+1)*m : (j+1)*m] }
	// ss[j] = Σ_i a_ij² in sample order, formed with the column. Entries
	// are O(1) after scaling by h: no overflow.
	var ss [10]float64
	c0 := col(0)
	for i := range c0 {
		c0[i] = 1
	}
	ss[0] = float64(m) // Σ 1·1, exact
	// u_k, as scaled computes them.
	if n > 1 {
		for k := 0; k < p.dim; k++ {
			ck, x0, h := col(1+k), p.x0[k], p.h[k]
			s := 0.0
			for i := range ck {
				u := (pts[i][k] - x0) / h
				ck[i] = u
				s += u * u
			}
			ss[1+k] = s
		}
	}
	// Products u_a u_b, in the order of basisRow.
	if n > p.dim+1 {
		pairs := [][2]int{{0, 0}, {1, 1}, {2, 2}, {0, 1}, {1, 2}, {2, 0}}
		if p.dim == 2 {
			pairs = [][2]int{{0, 0}, {1, 1}, {0, 1}}
		}
		for q, ab := range pairs {
			cq, ua, ub := col(p.dim+1+q), col(1+ab[0]), col(1+ab[1])
			s := 0.0
			for i := range cq {
				v := ua[i] * ub[i]
				cq[i] = v
				s += v * v
			}
			ss[p.dim+1+q] = s
		}
	}
	for j := 0; j < n; j++ {
		if ss[j] == 0 {
			return false
		}
		colScale[j] = 1 / math.Sqrt(ss[j])
		cj := col(j)
		for i := range cj {
			cj[i] *= colScale[j]
		}
	}
	return true
}

// unscale maps coefficients of the equilibrated basis back to the basis:
// the row of term t (comps values) times colScale[t].
func (p *polyFit) unscale(colScale *[10]float64) {
	for t := p.first; t < p.terms; t++ {
		row := p.coef[(t-p.first)*p.comps : (t-p.first+1)*p.comps]
		for c := range row {
			row[c] *= colScale[t]
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

// lsqOperatorRows stores in W ((rows-first)×m, zero on entry) the rows
// first..rows-1 of the least-squares operator (AᵀA)⁻¹Aᵀ = R⁻¹Q₁ᵀ of the
// equilibrated matrix whose Householder QR householder left in a, diag and
// vn (Q₁ the first n columns of Q = H₀H₁…H₍ₙ₋₁₎): row r is (Q [y; 0])ᵀ with
// Rᵀy = e_r, so that only the rows needed rather than the whole operator
// are formed. The rows go through the reflections together
// (reflectColumns); each row is the same whichever others are formed.
func lsqOperatorRows(a []float64, m, n, first, rows int, diag, vn *[10]float64, W []float64) {
	for r := first; r < rows; r++ {
		y := W[(r-first)*m : (r-first)*m+n]
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
	}
	for j := n - 1; j >= 0; j-- {
		if vn[j] != 0 {
			reflectColumns(a[j*m+j:(j+1)*m], vn[j], W, j, m, rows-first)
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

// reflectColumns applies reflect(v, vnorm2, ·) to the k vectors
// x[off+c*stride:][:len(v)], c < k. Up to four go through each loop
// together, each with its own sum in the same order as reflect, so the
// results are those of reflect bit for bit while the sums, each a chain of
// dependent additions, overlap.
func reflectColumns(v []float64, vnorm2 float64, x []float64, off, stride, k int) {
	col := func(c int) []float64 { return x[off+c*stride:][:len(v)] }
	c := 0
	for ; c+4 <= k; c += 4 {
		reflect4(v, vnorm2, col(c), col(c+1), col(c+2), col(c+3))
	}
	switch k - c {
	case 3:
		reflect3(v, vnorm2, col(c), col(c+1), col(c+2))
	case 2:
		reflect2(v, vnorm2, col(c), col(c+1))
	case 1:
		reflect(v, vnorm2, col(c))
	}
}

// reflect2 is reflect on x0 and x1 (each len(v) long).
func reflect2(v []float64, vnorm2 float64, x0, x1 []float64) {
	x0, x1 = x0[:len(v)], x1[:len(v)]
	s0, s1 := 0.0, 0.0
	for i, vi := range v {
		s0 += vi * x0[i]
		s1 += vi * x1[i]
	}
	s0 = 2 * s0 / vnorm2
	s1 = 2 * s1 / vnorm2
	for i, vi := range v {
		x0[i] -= s0 * vi
		x1[i] -= s1 * vi
	}
}

// reflect3 is reflect on x0, x1 and x2 (each len(v) long).
func reflect3(v []float64, vnorm2 float64, x0, x1, x2 []float64) {
	x0, x1, x2 = x0[:len(v)], x1[:len(v)], x2[:len(v)]
	s0, s1, s2 := 0.0, 0.0, 0.0
	for i, vi := range v {
		s0 += vi * x0[i]
		s1 += vi * x1[i]
		s2 += vi * x2[i]
	}
	s0 = 2 * s0 / vnorm2
	s1 = 2 * s1 / vnorm2
	s2 = 2 * s2 / vnorm2
	for i, vi := range v {
		x0[i] -= s0 * vi
		x1[i] -= s1 * vi
		x2[i] -= s2 * vi
	}
}

// reflect4 is reflect on x0 … x3 (each len(v) long).
func reflect4(v []float64, vnorm2 float64, x0, x1, x2, x3 []float64) {
	x0, x1, x2, x3 = x0[:len(v)], x1[:len(v)], x2[:len(v)], x3[:len(v)]
	s0, s1, s2, s3 := 0.0, 0.0, 0.0, 0.0
	for i, vi := range v {
		s0 += vi * x0[i]
		s1 += vi * x1[i]
		s2 += vi * x2[i]
		s3 += vi * x3[i]
	}
	s0 = 2 * s0 / vnorm2
	s1 = 2 * s1 / vnorm2
	s2 = 2 * s2 / vnorm2
	s3 = 2 * s3 / vnorm2
	for i, vi := range v {
		x0[i] -= s0 * vi
		x1[i] -= s1 * vi
		x2[i] -= s2 * vi
		x3[i] -= s3 * vi
	}
}

// reflectPivot forms vnorm2 = vᵀv and, unless it is 0, applies
// reflect(v, vnorm2, ·) to x (len(x) = len(v)), the column after the pivot
// in a Householder step, returning next = Σ_{i≥1} x_i² of the result: the
// norm² of the next pivot column. Both sums run in index order, as
// separate loops would form them, alongside the work of the reflection.
func reflectPivot(v, x []float64) (vnorm2, next float64) {
	x = x[:len(v)]
	s := 0.0
	for i, vi := range v {
		vnorm2 += vi * vi
		s += vi * x[i]
	}
	if vnorm2 == 0 {
		return 0, 0
	}
	s = 2 * s / vnorm2
	x[0] -= s * v[0]
	for i := 1; i < len(v); i++ {
		x[i] -= s * v[i]
		next += x[i] * x[i]
	}
	return vnorm2, next
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
	// norm2 is Σ x² over the pivot column from the diagonal down, formed
	// by the previous step's reflectPivot when known.
	norm2, known := 0.0, false
	for j := 0; j < n; j++ {
		v := a[j*m+j : (j+1)*m]
		if !known {
			norm2 = 0.0 // entries are O(1) after equilibration: no overflow
			for _, x := range v {
				norm2 += x * x
			}
		}
		norm := math.Sqrt(norm2)
		if norm == 0 {
			return false
		}
		alpha := -math.Copysign(norm, v[0])
		// v = x - alpha e1 stored in a[j:,j]; R_jj = alpha.
		v[0] -= alpha
		var vnorm2 float64
		if j+1 < n {
			vnorm2, norm2 = reflectPivot(v, a[(j+1)*m+j:(j+2)*m])
			known = vnorm2 != 0
		} else {
			for _, x := range v {
				vnorm2 += x * x
			}
		}
		diag[j], vn[j] = alpha, vnorm2
		if vnorm2 == 0 {
			continue
		}
		if j+2 < n {
			reflectColumns(v, vnorm2, a, (j+2)*m+j, m, n-j-2)
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
