package integrate_test

import (
	"fmt"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/integrate"
	"farforce/surface"
)

// ExampleForces computes the lift of a cylinder with circulation from a
// field sampled on a polar mesh around it: the exact answer is ρUΓ = 8.06
// per unit span (Kutta–Joukowski), with no drag.
func ExampleForces() {
	const rho, u, a, gamma = 1.3, 2.0, 0.7, 3.1
	z := fieldtest.Annulus(0, 0, a, 3, 48, 192)
	fieldtest.SampleFlow(z, fieldtest.Cylinder(rho, u, a, gamma), field.AtPoints)
	loc, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		fmt.Println(err)
		return
	}
	flow, err := field.NewFlowSampler(field.NewSampler(loc), fieldtest.FlowMap())
	if err != nil {
		fmt.Println(err)
		return
	}
	cut, err := surface.CutSurface(loc, surface.Circle{Radius: 1.5}, surface.CutOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	v, err := integrate.FreestreamFromAngles(u, 0, 0, 2)
	if err != nil {
		fmt.Println(err)
		return
	}
	r, err := integrate.Forces(cut, flow, integrate.Options{Free: integrate.Freestream{V: v, Rho: rho}, RefLength: 2 * a})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("lift %.2f N/m, drag %.2f N/m, c_l %.3f, mass imbalance below 1e-3: %v\n",
		r.Wind.Lift, r.Wind.Drag, r.Coefficients.Lift, r.MassImbalance < 1e-3 && r.MassImbalance > -1e-3)
	fmt.Printf("axes: drag %v, lift %v\n", r.Axes.Drag, r.Axes.Lift)
	// Output:
	// lift 8.06 N/m, drag 0.00 N/m, c_l 2.214, mass imbalance below 1e-3: true
	// axes: drag [1 0 0], lift [0 1 0]
}
