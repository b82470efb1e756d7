package integrate

import (
	"fmt"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
	"farforce/surface"
)

// BenchmarkForces integrates over a polyhedral sphere of 100 352 facets
// (702 464 quadrature points) with an exact flow, for 1 and 2 workers, and
// reports quadrature points and facets per second. The baseline
// "evaluate-only" loop calls the flow at every point and nothing else: the
// floor set by the flow evaluation.
func BenchmarkForces(b *testing.B) {
	c := sphere(Vec3{}, 1.5, 112)
	flow := fieldtest.SpherePotential{Rho: 1.2, A: 0.6, U: [3]float64{1.5, 0, 0}}
	opt := Options{Free: Freestream{V: Vec3{1.5, 0, 0}, Rho: 1.2}, RefArea: 1}
	for _, w := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", w), func(b *testing.B) {
			opt.Workers = w
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Forces(c, flow, opt); err != nil {
					b.Fatal(err)
				}
			}
			s := b.Elapsed().Seconds()
			b.ReportMetric(float64(len(c.Points))*float64(b.N)/s, "points/s")
			b.ReportMetric(float64(c.Facets)*float64(b.N)/s, "facets/s")
		})
	}
	b.Run("evaluate-only", func(b *testing.B) {
		var st field.FlowState
		var sink float64
		for b.Loop() {
			for i := range c.Points {
				flow.EvalFlow(c.Points[i].At, c.Points[i].X, &st)
				sink += st.P
			}
		}
		b.ReportMetric(float64(len(c.Points))*float64(b.N)/b.Elapsed().Seconds(), "points/s")
		_ = sink
	})
}

// BenchmarkForcesSampled integrates a Stokes field sampled at the points of
// a hexahedral mesh (h = 0.1) over a box cut through it, after one warm-up
// call that builds the sampler's lazily recovered gradients: the cost of
// the integration with a real interpolating evaluator.
func BenchmarkForcesSampled(b *testing.B) {
	L := [3]float64{2, 1.5, 1.5}
	loc, ev := sampledFlow(b, boxMesh(fieldtest.BoxHex, L, 0.1, [3]float64{}), stokesFlow(), field.AtPoints)
	c, err := surface.CutSurface(loc, surface.Box{Min: sub(Vec3{}, L), Max: L}, surface.CutOptions{})
	if err != nil {
		b.Fatal(err)
	}
	opt := stokesOpt()
	if _, err := Forces(c, ev, opt); err != nil {
		b.Fatal(err)
	}
	for _, w := range []int{1, 2} {
		b.Run(fmt.Sprintf("workers=%d", w), func(b *testing.B) {
			opt.Workers = w
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Forces(c, ev, opt); err != nil {
					b.Fatal(err)
				}
			}
			s := b.Elapsed().Seconds()
			b.ReportMetric(float64(len(c.Points))*float64(b.N)/s, "points/s")
			b.ReportMetric(float64(c.Facets)*float64(b.N)/s, "facets/s")
			b.ReportMetric(float64(c.Facets), "facets")
		})
	}
}
