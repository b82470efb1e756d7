package surface_test

import (
	"fmt"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// Cut a box control surface through a hexahedral mesh and sum the
// quadrature weights: the pieces cover the whole surface.
func ExampleCutSurface() {
	zone := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{8, 8, 8})
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{zone}})
	if err != nil {
		fmt.Println(err)
		return
	}
	shape, err := surface.ParseSpec("box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5")
	if err != nil {
		fmt.Println(err)
		return
	}
	cut, err := surface.CutSurface(loc, shape, surface.CutOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	var area float64
	for _, q := range cut.Points {
		area += q.W
	}
	fmt.Printf("%s: area %.6f, covered %.6f\n", cut.Spec, cut.Area, area)
	// Output: box min=-0.5,-0.5,-0.5 max=0.5,0.5,0.5: area 6.000000, covered 6.000000
}

// A box that leaves the mesh is refused with a CoverageError: 3 m² of
// its 10 m² (half of four 2×1 sides and the 1×1 end) lie beyond x = 1.
func ExampleCoverageError() {
	zone := fieldtest.BoxHex([3]float64{-1, -1, -1}, [3]float64{1, 1, 1}, [3]int{4, 4, 4})
	loc, _ := field.NewLocator(&field.Field{Zones: []*field.Zone{zone}})
	shape, _ := surface.ParseSpec("box min=-0.5,-0.5,-0.5 max=1.5,0.5,0.5")
	_, err := surface.CutSurface(loc, shape, surface.CutOptions{})
	fmt.Println(err)
	// Output: surface "box min=-0.5,-0.5,-0.5 max=1.5,0.5,0.5": 3 m² (30 %) of the surface lies outside every fluid cell, near (1.5, 0.1667, -0.1667): the surface leaves the mesh or crosses the body
}
