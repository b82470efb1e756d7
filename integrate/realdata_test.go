package integrate_test

import (
	"testing"

	"farforce/field"
	"farforce/readers"
)

// dfgFlow reads file, a solution of the DFG 2D-1 cylinder benchmark in
// ../testdata/real (provenance in its README.md), and returns the field,
// its locator and its flow sampler: velocity and pressure from the arrays
// "velocity" and "pressure", ρ = 1 and μ = 10⁻³ (the benchmark's constants,
// Schäfer & Turek 1996).
func dfgFlow(t *testing.T, file string) (*field.Field, *field.Locator, *field.FlowSampler) {
	t.Helper()
	f, err := readers.ReadFile("../testdata/real/"+file, readers.Options{})
	if err != nil {
		t.Fatal(err)
	}
	loc, err := field.NewLocator(f)
	if err != nil {
		t.Fatal(err)
	}
	flow, err := field.NewFlowSampler(field.NewSampler(loc), field.FlowMap{
		Velocity: []string{"velocity"}, Pressure: "pressure",
		Density: field.Quantity{Value: 1}, Viscosity: field.Quantity{Value: 1e-3},
	})
	if err != nil {
		t.Fatal(err)
	}
	return f, loc, flow
}
