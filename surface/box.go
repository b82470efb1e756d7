package surface

import (
	"fmt"
	"math"
)

// Box is the rectangular box with corners Min and Max (metres), rotated by
// Rotate (degrees) about its centre: first about x, then y, then z, each
// about the fixed axes through the centre (p' = c + Rz Ry Rx (p - c)). Its
// six faces are exact; they are split into triangles of edge about h.
type Box struct {
	Min, Max [3]float64
	Rotate   [3]float64
	Res      Resolution
}

// Dim returns 3.
func (b Box) Dim() int { return 3 }

// String returns the spec "box min=X,Y,Z max=X,Y,Z [rotate=AX,AY,AZ] [facets=N|size=H]".
func (b Box) String() string {
	s := "box min=" + fvec(b.Min[:]...) + " max=" + fvec(b.Max[:]...)
	if b.Rotate != [3]float64{} {
		s += " rotate=" + fvec(b.Rotate[:]...)
	}
	return s + b.Res.specFields()
}

// Pivot returns the centre of the box.
func (b Box) Pivot() [3]float64 { return scale(add(b.Min, b.Max), 0.5) }

// Scaled returns the box scaled by k about its centre, same rotation.
func (b Box) Scaled(k float64) Shape {
	checkScale(k)
	c := b.Pivot()
	for i := 0; i < 3; i++ {
		h := (b.Max[i] - b.Min[i]) / 2 * k
		b.Min[i], b.Max[i] = c[i]-h, c[i]+h
	}
	return b
}

// ExactArea returns 2(ab + bc + ca) for edges a, b, c.
func (b Box) ExactArea() float64 {
	d := sub(b.Max, b.Min)
	return 2 * (d[0]*d[1] + d[1]*d[2] + d[2]*d[0])
}

// Resolution returns the facets=/size= setting.
func (b Box) Resolution() Resolution { return b.Res }

// rotation returns the matrix Rz Ry Rx of the box.
func (b Box) rotation() [3][3]float64 {
	var c, s [3]float64
	for i, deg := range b.Rotate {
		r := deg * math.Pi / 180
		c[i], s[i] = math.Cos(r), math.Sin(r)
	}
	rx := [3][3]float64{{1, 0, 0}, {0, c[0], -s[0]}, {0, s[0], c[0]}}
	ry := [3][3]float64{{c[1], 0, s[1]}, {0, 1, 0}, {-s[1], 0, c[1]}}
	rz := [3][3]float64{{c[2], -s[2], 0}, {s[2], c[2], 0}, {0, 0, 1}}
	return matMul(rz, matMul(ry, rx))
}

func matMul(a, b [3][3]float64) (m [3][3]float64) {
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			for k := 0; k < 3; k++ {
				m[i][j] += a[i][k] * b[k][j]
			}
		}
	}
	return m
}

func matVec(a [3][3]float64, v [3]float64) [3]float64 {
	return [3]float64{dot(a[0], v), dot(a[1], v), dot(a[2], v)}
}

// faces returns origin and edge vectors (o, u, v) of the six faces, each
// with u × v pointing out of the box.
func (b Box) faces() [6][3][3]float64 {
	c := b.Pivot()
	h := scale(sub(b.Max, b.Min), 0.5)
	rot := b.rotation()
	noRot := b.Rotate == [3]float64{}
	pt := func(x, y, z float64) [3]float64 {
		if noRot { // keep the exact corner coordinates of an unrotated box
			return [3]float64{pick(x, b.Min[0], b.Max[0]), pick(y, b.Min[1], b.Max[1]), pick(z, b.Min[2], b.Max[2])}
		}
		return add(c, matVec(rot, [3]float64{x * h[0], y * h[1], z * h[2]}))
	}
	face := func(o, pu, pv [3]float64) [3][3]float64 { return [3][3]float64{o, sub(pu, o), sub(pv, o)} }
	return [6][3][3]float64{
		face(pt(1, -1, -1), pt(1, 1, -1), pt(1, -1, 1)),    // +x: u along y, v along z
		face(pt(-1, -1, -1), pt(-1, -1, 1), pt(-1, 1, -1)), // -x
		face(pt(-1, 1, -1), pt(-1, 1, 1), pt(1, 1, -1)),    // +y: u along z, v along x
		face(pt(-1, -1, -1), pt(1, -1, -1), pt(-1, -1, 1)), // -y
		face(pt(-1, -1, 1), pt(1, -1, 1), pt(-1, 1, 1)),    // +z: u along x, v along y
		face(pt(-1, -1, -1), pt(-1, 1, -1), pt(1, -1, -1)), // -z
	}
}

// pick returns lo for s < 0, hi otherwise.
func pick(s, lo, hi float64) float64 {
	if s < 0 {
		return lo
	}
	return hi
}

// Tessellate returns the six faces split into triangles. z is ignored.
func (b Box) Tessellate(size SizeFunc, _ float64) (*Facets, error) {
	spec := b.String()
	if !finite(b.Min[:]...) || !finite(b.Max[:]...) || !finite(b.Rotate[:]...) {
		return nil, fmt.Errorf("surface %q: corners and rotation must be finite", spec)
	}
	for i := 0; i < 3; i++ {
		if !(b.Max[i] > b.Min[i]) {
			return nil, fmt.Errorf("surface %q: max must exceed min in every coordinate", spec)
		}
	}
	faces := b.faces()
	h, err := flatSize(spec, b.Res, size, b.ExactArea(), 0.5, func(yield func(p [3]float64) bool) {
		for _, fc := range faces {
			for j := 0; j <= flatSamples; j++ {
				for i := 0; i <= flatSamples; i++ {
					p := add(fc[0], add(scale(fc[1], float64(i)/flatSamples), scale(fc[2], float64(j)/flatSamples)))
					if !yield(p) {
						return
					}
				}
			}
		}
	})
	if err != nil {
		return nil, err
	}
	f := &Facets{Dim: 3}
	var m [6][2]int
	total := 0
	for i, fc := range faces {
		for k := 0; k < 2; k++ {
			if m[i][k], err = divisions(spec, norm(fc[1+k]), h); err != nil {
				return nil, err
			}
		}
		total += 2 * m[i][0] * m[i][1]
		if total > MaxFacets {
			return nil, fmt.Errorf("surface %q: more than %d facets; give a larger size= or fewer facets=", spec, MaxFacets)
		}
	}
	for i, fc := range faces {
		appendGrid(f, fc[0], fc[1], fc[2], m[i][0], m[i][1])
	}
	return f, nil
}
