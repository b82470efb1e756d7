package surface

import (
	"fmt"
	"math"
)

// axisFrame holds an orthonormal frame (e1, e2, a) about an axis a.
type axisFrame struct{ e1, e2, a [3]float64 }

// newAxisFrame returns a right-handed frame whose third vector is the unit
// vector along axis (which must be non-zero).
func newAxisFrame(axis [3]float64) axisFrame {
	a := unit(axis)
	// Pick the coordinate axis least aligned with a as a helper.
	h := [3]float64{1, 0, 0}
	if math.Abs(a[0]) > math.Abs(a[1]) || math.Abs(a[0]) > math.Abs(a[2]) {
		if math.Abs(a[1]) <= math.Abs(a[2]) {
			h = [3]float64{0, 1, 0}
		} else {
			h = [3]float64{0, 0, 1}
		}
	}
	e1 := unit(cross(h, a))
	e2 := cross(a, e1)
	return axisFrame{e1, e2, a}
}

// at returns the point c + r (cos φ e1 + sin φ e2) + s a.
func (f axisFrame) at(c [3]float64, r, phi, s float64) [3]float64 {
	cs, sn := math.Cos(phi), math.Sin(phi)
	var p [3]float64
	for k := 0; k < 3; k++ {
		p[k] = c[k] + r*(cs*f.e1[k]+sn*f.e2[k]) + s*f.a[k]
	}
	return p
}

// ring is one ring of a surface of revolution: radius r at axial
// position s, with n vertices (n = 1 when r = 0).
type ring struct {
	r, s float64
	n    int
}

// ringSize returns the smallest size function value around the ring of
// radius r at axial position s.
func ringSize(spec string, size SizeFunc, fr axisFrame, c [3]float64, r, s float64) (float64, error) {
	m := ringSamples
	if r == 0 {
		m = 1
	}
	h := math.Inf(1)
	for j := 0; j < m; j++ {
		v, err := sizeAt(size, spec, fr.at(c, r, 2*math.Pi*float64(j)/float64(m), s))
		if err != nil {
			return 0, err
		}
		h = math.Min(h, v)
	}
	return h, nil
}

// revolve builds the closed surface of revolution through the given rings
// (the first and last of radius 0), joining consecutive rings with a band
// of triangles that merges their vertex angles in order, so that any two
// vertex counts are joined without gaps. The result is oriented outward.
func revolve(spec string, fr axisFrame, c [3]float64, rings []ring) (*Facets, error) {
	nf := 0
	nv := 0
	for i, rg := range rings {
		nv += rg.n
		if i > 0 {
			nf += rings[i-1].n + rg.n
		}
	}
	if nf > MaxFacets {
		return nil, fmt.Errorf("surface %q: %d facets exceeds the limit of %d; give a larger size= or fewer facets=", spec, nf, MaxFacets)
	}
	f := &Facets{Dim: 3, Verts: make([][3]float64, 0, nv), Index: make([]int32, 0, 3*nf)}
	first := make([]int32, len(rings))
	for i, rg := range rings {
		first[i] = int32(len(f.Verts))
		for j := 0; j < rg.n; j++ {
			f.Verts = append(f.Verts, fr.at(c, rg.r, 2*math.Pi*float64(j)/float64(rg.n), rg.s))
		}
	}
	for i := 1; i < len(rings); i++ {
		zipRings(f, first[i-1], rings[i-1].n, first[i], rings[i].n)
	}
	f.orientOutward()
	return f, nil
}

// zipRings appends the triangles joining ring A (na vertices from index
// a0) and ring B (nb vertices from b0), whose vertex j sits at angle
// 2πj/n. Walking both rings by increasing angle, it always advances the
// ring whose next vertex comes first (B on ties), comparing angles exactly
// as i·nb versus j·na. Each step emits one triangle; rings of one vertex
// (poles) give fans.
func zipRings(f *Facets, a0 int32, na int, b0 int32, nb int) {
	switch {
	case na == 1 && nb == 1:
	case na == 1:
		for j := 0; j < nb; j++ {
			f.Index = append(f.Index, a0, b0+int32(j), b0+int32((j+1)%nb))
		}
	case nb == 1:
		for i := 0; i < na; i++ {
			f.Index = append(f.Index, a0+int32(i), b0, a0+int32((i+1)%na))
		}
	default:
		i, j := 0, 0
		for i < na || j < nb {
			ai, bj := a0+int32(i%na), b0+int32(j%nb)
			if i == na || (j < nb && int64(j+1)*int64(na) <= int64(i+1)*int64(nb)) {
				f.Index = append(f.Index, ai, bj, b0+int32((j+1)%nb))
				j++
			} else {
				f.Index = append(f.Index, ai, bj, a0+int32((i+1)%na))
				i++
			}
		}
	}
}
