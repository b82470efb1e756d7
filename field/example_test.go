package field_test

import (
	"fmt"

	"farforce/field"
	"farforce/field/fieldtest"
)

// A field of 4×4×4 hexahedra carries u = x + 2y - z at its points; the
// sampler interpolates it and its gradient anywhere in the mesh.
func Example() {
	z := fieldtest.BoxHex([3]float64{0, 0, 0}, [3]float64{1, 1, 1}, [3]int{4, 4, 4})
	fieldtest.SamplePoints(z, "u", 1, func(x [3]float64, d []float64) { d[0] = x[0] + 2*x[1] - x[2] })
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		fmt.Println(err)
		return
	}
	s := field.NewSampler(l)
	u, err := s.Prepare("u")
	if err != nil {
		fmt.Println(err)
		return
	}
	at, ok := l.Locate([3]float64{0.3, 0.6, 0.1})
	fmt.Println("located:", ok, "zone", at.Zone, "cell", at.Cell)
	v, g := make([]float64, 1), make([]float64, 3)
	s.Value(u, at, v)
	s.Gradient(u, at, g)
	fmt.Printf("u = %.4f, grad u = (%.4f, %.4f, %.4f)\n", v[0], g[0], g[1], g[2])
	_, ok = l.Locate([3]float64{1.5, 0.5, 0.5})
	fmt.Println("outside located:", ok)
	// Output:
	// located: true zone 0 cell 9
	// u = 1.4000, grad u = (1.0000, 2.0000, -1.0000)
	// outside located: false
}

// Cell-centred data, as a finite-volume solver writes them, are
// reconstructed to second order; a quadratic is reproduced exactly.
func ExampleSampler_Prepare_cellData() {
	z := fieldtest.RectQuad([2]float64{0, 0}, [2]float64{1, 1}, [2]int{8, 8})
	fieldtest.SampleCells(z, "p", 1, func(x [3]float64, d []float64) { d[0] = x[0]*x[0] - x[0]*x[1] })
	l, _ := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	s := field.NewSampler(l)
	p, _ := s.Prepare("p")
	at, _ := l.Locate([3]float64{0.5, 0.25, 0})
	v, g := make([]float64, 1), make([]float64, 3)
	s.Value(p, at, v)
	s.Gradient(p, at, g)
	fmt.Printf("p = %.4f, grad p = (%.4f, %.4f, %.4f)\n", v[0], g[0], g[1], g[2]+0)
	// Output:
	// p = 0.1250, grad p = (0.7500, -0.5000, 0.0000)
}
