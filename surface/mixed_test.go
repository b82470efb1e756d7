package surface

import (
	"math"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// wedgeZone extrudes the triangles of fieldtest.RectTri over [-1,1]² into
// nz layers of wedges spanning z in [-1,1].
func wedgeZone(n, nz int) *field.Zone {
	tri := fieldtest.RectTri([2]float64{-1, -1}, [2]float64{1, 1}, [2]int{n, n})
	np := int32(tri.NumPoints())
	z := &field.Zone{Name: "wedges"}
	for k := 0; k <= nz; k++ {
		for i := 0; i < int(np); i++ {
			p := tri.Point(int32(i))
			z.Points = append(z.Points, p[0], p[1], -1+2*float64(k)/float64(nz))
		}
	}
	for k := int32(0); k < int32(nz); k++ {
		for c := 0; c < tri.NumCells(); c++ {
			t := tri.CellNodes(c)
			z.AddCell(field.Wedge, k*np+t[0], k*np+t[1], k*np+t[2], (k+1)*np+t[0], (k+1)*np+t[1], (k+1)*np+t[2])
		}
	}
	return z
}

// pyramidZone splits each hexahedron of a BoxHex mesh into six pyramids
// with their apex at the hexahedron's centre.
func pyramidZone(n int) *field.Zone {
	hex := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{n, n, n})
	z := &field.Zone{Name: "pyramids", Points: append([]float64(nil), hex.Points...)}
	for c := 0; c < hex.NumCells(); c++ {
		nodes := hex.CellNodes(c)
		cen := hex.Centroid(c)
		apex := int32(z.NumPoints())
		z.Points = append(z.Points, cen[:]...)
		for _, f := range field.Hexa.Faces() {
			z.AddCell(field.Pyramid, nodes[f[0]], nodes[f[1]], nodes[f[2]], nodes[f[3]], apex)
		}
	}
	return z
}

// TestCoverageMixed cuts surfaces through wedge and pyramid meshes (cells
// clipped against their own planar faces) with faces on grid planes.
func TestCoverageMixed(t *testing.T) {
	for _, z := range []*field.Zone{wedgeZone(6, 5), pyramidZone(5)} {
		l := locator(t, z)
		for _, spec := range []string{
			"sphere center=0.02,0,0 radius=0.7 facets=800",
			"box min=-0.6,-0.6,-0.6 max=0.6,0.6,0.6",
			"box min=-1,-1,-1 max=1,1,1",
			"cylinder center=0,0,0 axis=1,0,1 radius=0.4 length=1",
		} {
			c, err := CutSurface(l, mustParse(t, spec), CutOptions{})
			if err != nil {
				t.Errorf("%s: %s: %v", z.Name, spec, err)
				continue
			}
			checkCut(t, l, c, false)
			checkOwner(t, l, c)
		}
	}
}

// TestCutConvergence integrates ∮ x n_x dA over the cut sphere: by the
// Gauss divergence theorem it equals the volume of the inscribed
// polyhedron, which converges to 4πR³/3 at second order in the facet edge
// (same chord argument as TestAreaConvergence). The fitted order must be
// within ±0.15 of 2.
func TestCutConvergence(t *testing.T) {
	l := locator(t, fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{12, 12, 12}))
	R := 0.7
	var hs, es []float64
	for _, h := range []float64{0.2, 0.1, 0.05} {
		c, err := CutSurface(l, Sphere{Center: [3]float64{0.01, 0.02, -0.03}, Radius: R, Res: Resolution{Size: h}}, CutOptions{})
		if err != nil {
			t.Fatal(err)
		}
		var v field.CompensatedSum
		for _, q := range c.Points {
			v.Add(q.W * (q.X[0] - 0.01) * q.N[0])
		}
		want := 4 * math.Pi * R * R * R / 3
		hs, es = append(hs, h), append(es, math.Abs(v.Value()-want)/want)
	}
	p := fitOrder(hs, es)
	t.Logf("relative volume errors %.3g, order %.3f", es, p)
	if math.Abs(p-2) > 0.15 {
		t.Errorf("volume converges at order %.3f, want 2", p)
	}
}

// TestFollowsCellSize checks that the default tessellation follows the
// local cell size: in a mesh whose upper half (z > 0) has cells 3 times
// smaller, the sphere's facet edges there are about 3 times shorter, and
// about the cell size on both sides (within a factor 1.6: the rings are
// sized by the smallest cell around them and rounded up to whole counts).
func TestFollowsCellSize(t *testing.T) {
	coarse := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 0}, [3]int{8, 8, 4})
	fine := fieldtest.BoxHex([3]float64{-1, -1, 0}, [3]float64{1, 1, 1}, [3]int{24, 24, 12})
	l := locator(t, coarse, fine)
	c, err := CutSurface(l, Sphere{Radius: 0.8}, CutOptions{})
	if err != nil {
		t.Fatal(err)
	}
	f, _ := Sphere{Radius: 0.8}.Tessellate(func(p [3]float64) float64 { return l.CellSize(p) }, 0)
	var top, bottom, nt, nb float64
	for i := 0; i < f.Len(); i++ {
		v := f.Facet(i)
		e := (norm(sub(v[1], v[0])) + norm(sub(v[2], v[1])) + norm(sub(v[0], v[2]))) / 3
		switch z := (v[0][2] + v[1][2] + v[2][2]) / 3; {
		case z > 0.3:
			top, nt = top+e, nt+1
		case z < -0.3:
			bottom, nb = bottom+e, nb+1
		}
	}
	top, bottom = top/nt, bottom/nb
	hf, hc := 2.0/24, 2.0/8
	t.Logf("%d facets; mean edge %.4g above (cells %.4g), %.4g below (cells %.4g)", c.Facets, top, hf, bottom, hc)
	if top > 1.6*hf || top < hf/1.6 || bottom > 1.6*hc || bottom < hc/1.6 {
		t.Errorf("facet edges %.4g above and %.4g below do not follow cells %.4g and %.4g", top, bottom, hf, hc)
	}
}
