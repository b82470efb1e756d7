package field_test

import (
	"math"
	"runtime"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// benchmarkFlowSphere times FlowSampler.EvalFlow (velocity value and
// recovered gradient, pressure value) at 2¹⁸ points along a fine spiral on
// the sphere of radius 0.3 about the centre of a perturbed 100³ hexahedral
// box (10⁶ cells), as a surface cut through a large mesh queries it: cold
// (a new Sampler per pass, so every nodal gradient the points need is
// recovered once, the first integration of a cut) or warm (gradients
// already recovered). The velocity and pressure are invented smooth demo
// fields. Figures are per point, in wall and in thread CPU time.
func benchmarkFlowSphere(b *testing.B, cold bool) {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{100, 100, 100})
	fieldtest.Perturb(z, 0.1/100, 7)
	fieldtest.SampleBenchFlow(z)
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	locs := make([]field.Location, 1<<18)
	for i := range locs {
		u := (float64(i) + 0.5) / float64(len(locs))
		th, ph := math.Acos(1-2*u), 600*math.Pi*u
		x := [3]float64{0.5 + 0.3*math.Sin(th)*math.Cos(ph), 0.5 + 0.3*math.Sin(th)*math.Sin(ph), 0.5 + 0.3*math.Cos(th)}
		loc, ok := l.Locate(x)
		if !ok {
			b.Fatalf("point %v not located", x)
		}
		locs[i] = loc
	}
	fm := field.FlowMap{Velocity: []string{"velocity"}, Pressure: "pressure", Density: field.Quantity{Value: 1.2}}
	newEval := func() *field.FlowSampler {
		ev, err := field.NewFlowSampler(field.NewSampler(l), fm)
		if err != nil {
			b.Fatal(err)
		}
		return ev
	}
	ev := newEval()
	var st field.FlowState
	for _, loc := range locs {
		ev.EvalFlow(loc, [3]float64{}, &st)
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	b.ReportAllocs()
	var cpu int64
	b.ResetTimer()
	for b.Loop() {
		if cold {
			b.StopTimer()
			ev = newEval()
			b.StartTimer()
		}
		c0 := fieldtest.ThreadCPU()
		for _, loc := range locs {
			ev.EvalFlow(loc, [3]float64{}, &st)
		}
		cpu += int64(fieldtest.ThreadCPU() - c0)
	}
	n := float64(b.N * len(locs))
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/n, "ns/point")
	b.ReportMetric(float64(cpu)/n, "cpu-ns/point")
}

func BenchmarkFlowSphereCold(b *testing.B) { benchmarkFlowSphere(b, true) }
func BenchmarkFlowSphereWarm(b *testing.B) { benchmarkFlowSphere(b, false) }
