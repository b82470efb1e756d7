package surface

import (
	"math"
	"math/rand/v2"
	"sync"
	"testing"
)

// The cutter's hot loops are written out by component and take shortcuts
// (an axis-aligned plane's distance from one coordinate, an unchanged
// polygon returned as is). These tests check them bit for bit against the
// plain vector formulas and the textbook clipping loop they replace, so
// that the cut stays the same to the last bit.

// clipReference is the Sutherland–Hodgman step (I. E. Sutherland and G. W.
// Hodgman, "Reentrant polygon clipping", Comm. ACM 17 (1974) 32–42) as
// the cutter first implemented it: every vertex classified by
// halfSpace.side, crossings by crossing, repeated vertices dropped.
func clipReference(in [][3]float64, h *halfSpace, n [3]float64, tol float64) [][3]float64 {
	var out [][3]float64
	if len(in) == 0 {
		return out
	}
	prev := in[len(in)-1]
	dPrev, inPrev := h.side(prev, n, tol)
	for _, cur := range in {
		dCur, inCur := h.side(cur, n, tol)
		if inCur != inPrev {
			x := crossing(prev, cur, dPrev, dCur)
			if len(out) == 0 || out[len(out)-1] != x {
				out = append(out, x)
			}
		}
		if inCur && (len(out) == 0 || out[len(out)-1] != cur) {
			out = append(out, cur)
		}
		prev, dPrev, inPrev = cur, dCur, inCur
	}
	for len(out) > 1 && out[0] == out[len(out)-1] {
		out = out[:len(out)-1]
	}
	return out
}

// randomPlane returns a half-space through a random point near the unit
// cube: axis-aligned (both signs, as ownFaces makes them) or oblique.
func randomPlane(rng *rand.Rand) halfSpace {
	p := [3]float64{rng.Float64(), rng.Float64(), rng.Float64()}
	var m [3]float64
	if k := rng.IntN(5); k < 3 {
		m[k] = 1
		if rng.IntN(2) == 0 {
			m[k] = -1
		}
		if rng.IntN(2) == 0 {
			// A Newell normal scaled to unit length, possibly 1 ± ulp.
			m[k] *= 1 + float64(rng.IntN(40))
			m = unit(m)
		}
	} else {
		m = unit([3]float64{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()})
	}
	return makeHalfSpace(m, dot(m, p))
}

// TestClipPolygonMatchesReference clips random triangles, some with
// vertices exactly on the plane or within the tolerance of it, through
// several planes in turn, and requires clipPolygon (both distance paths)
// to give exactly the reference polygons.
func TestClipPolygonMatchesReference(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	const tol = 1e-10
	var buf [][3]float64
	for trial := 0; trial < 20000; trial++ {
		n := unit([3]float64{rng.NormFloat64(), rng.NormFloat64(), rng.NormFloat64()})
		poly := [][3]float64{}
		for len(poly) < 3 {
			p := [3]float64{rng.Float64()*1.4 - 0.2, rng.Float64()*1.4 - 0.2, rng.Float64()*1.4 - 0.2}
			if len(poly) > 0 && p == poly[len(poly)-1] {
				continue
			}
			poly = append(poly, p)
		}
		for step := 0; step < 6 && len(poly) >= 3; step++ {
			h := randomPlane(rng)
			if h.axis >= 0 && rng.IntN(3) == 0 {
				// Put a vertex on the plane, or within the tolerance of it.
				v := &poly[rng.IntN(len(poly))]
				v[h.axis] = h.c / h.m[h.axis]
				if rng.IntN(2) == 0 {
					v[h.axis] += tol / 2
				}
			}
			want := clipReference(poly, &h, n, tol)
			for _, finite := range []bool{true, false} {
				got, clipped := clipPolygon(poly, &h, n, tol, finite, buf)
				if !clipped && &got[0] != &poly[0] {
					t.Fatalf("trial %d: unchanged polygon not returned as is", trial)
				}
				if len(got) != len(want) {
					t.Fatalf("trial %d step %d finite %v: %d vertices, want %d", trial, step, finite, len(got), len(want))
				}
				for i := range got {
					if got[i] != want[i] {
						t.Fatalf("trial %d step %d finite %v: vertex %d %v, want %v", trial, step, finite, i, got[i], want[i])
					}
				}
			}
			poly = append([][3]float64(nil), want...)
		}
	}
}

// TestScalarFormulas checks the by-component formulas against the vector
// expressions they spell out, bit for bit, on random data.
func TestScalarFormulas(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	r3 := func() [3]float64 {
		return [3]float64{rng.NormFloat64(), rng.NormFloat64() * 1e3, rng.NormFloat64() * 1e-3}
	}
	same := func(what string, a, b float64) {
		t.Helper()
		if math.Float64bits(a) != math.Float64bits(b) {
			t.Fatalf("%s: %v, want %v", what, a, b)
		}
	}
	for trial := 0; trial < 5000; trial++ {
		poly := [][3]float64{r3(), r3(), r3(), r3(), r3()}
		n := unit(r3())
		var area float64
		for k := 1; k+1 < len(poly); k++ {
			want := dot(cross(sub(poly[k], poly[0]), sub(poly[k+1], poly[0])), n) / 2
			same("fanArea", fanArea(poly, k, n), want)
			area += dot(cross(sub(poly[k], poly[0]), sub(poly[k+1], poly[0])), n)
		}
		same("polygonArea", polygonArea(poly, n), area/2)

		v := r3()
		x, y, z := unit3(v[0], v[1], v[2])
		u := unit(v)
		same("unit3 x", x, u[0])
		same("unit3 y", y, u[1])
		same("unit3 z", z, u[2])

		var pts [len(triRule)]QuadPoint
		radonPoints(pts[:], poly[0], poly[1], poly[2], 0.5, n)
		for i, q := range triRule {
			want := add(add(scale(poly[0], q.l[0]), scale(poly[1], q.l[1])), scale(poly[2], q.l[2]))
			for k := 0; k < 3; k++ {
				same("radonPoints", pts[i].X[k], want[k])
			}
			same("radonPoints weight", pts[i].W, q.w*0.5)
		}

		o := r3()
		d := n[0]*(poly[3][0]-o[0]) + n[1]*(poly[3][1]-o[1]) + n[2]*(poly[3][2]-o[2])
		same("oneSide distance", d, dot(n, sub(poly[3], o)))
		m := 1e-3 * math.Abs(d)
		if got, want := oneSide(poly, n, o, m), oneSideReference(poly, n, o, m); got != want {
			t.Fatalf("oneSide %v, want %v", got, want)
		}
	}
}

// oneSideReference is oneSide without its early exit.
func oneSideReference(x [][3]float64, n, o [3]float64, margin float64) bool {
	above, below := true, true
	for _, p := range x {
		d := dot(n, sub(p, o))
		above = above && d > margin
		below = below && d < -margin
	}
	return above || below
}

// TestChunkShares takes the chunks from several goroutines at once and
// requires each chunk to be taken exactly once.
func TestChunkShares(t *testing.T) {
	for _, n := range []int{0, 1, 7, 100, 1001} {
		for _, workers := range []int{1, 2, 3, 8} {
			taken := make([]int, n)
			var mu sync.Mutex
			eachChunk(n, workers, func() func(int) {
				return func(ci int) {
					mu.Lock()
					taken[ci]++
					mu.Unlock()
				}
			})
			for ci, k := range taken {
				if k != 1 {
					t.Fatalf("n %d workers %d: chunk %d taken %d times", n, workers, ci, k)
				}
			}
		}
	}
}
