package integrate_test

import (
	"fmt"
	"math"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/surface"
)

// ExampleCrossflow finds the induced drag, lift and span efficiency of an
// elliptically loaded wing (span 10 m, Γ₀ = 12 m²/s, U∞ = 50 m/s) from its
// exact Trefftz-plane crossflow on a 160 × 160 grid (spacing 0.25 m),
// as ratios to the exact D_i = πρΓ₀²/8, L = (π/4)ρU∞bΓ₀ and e = 1; the
// grid error falls at first order as the grid is refined.
func ExampleCrossflow() {
	wing := fieldtest.EllipticWake{Rho: 1.225, U: 50, B: 10, Gamma0: 12, PInf: 1e5}
	slab := fieldtest.BoxHex([3]float64{-0.5, -20, -20}, [3]float64{0.5, 20, 20}, [3]int{1, 4, 4})
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{slab}})
	if err != nil {
		fmt.Println(err)
		return
	}
	plane, err := surface.ParsePlane("x=0")
	if err != nil {
		fmt.Println(err)
		return
	}
	grid, err := surface.PlaneGridOf(loc, plane, 160, 160)
	if err != nil {
		fmt.Println(err)
		return
	}
	cf, err := integrate.Crossflow(grid, wing, integrate.WakeOptions{
		Options: integrate.Options{Free: integrate.Freestream{V: integrate.Vec3{50, 0, 0}, Rho: 1.225}},
		Span:    10,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	di := math.Pi * 1.225 * 12 * 12 / 8
	lift := math.Pi / 4 * 1.225 * 50 * 10 * 12
	fmt.Printf("Maskell D_i/exact %.2f, lift/exact %.3f, e %.2f\n", cf.Maskell/di, cf.Lift/lift, cf.SpanEfficiency)
	// Output: Maskell D_i/exact 0.96, lift/exact 1.000, e 1.04
}
