package field_test

import (
	"math"
	"runtime"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// recoveryBox returns a perturbed n³ hexahedral unit box (interior points
// moved by up to 0.1 cell) with a point array "f" of invented smooth values.
func recoveryBox(n int) *field.Zone {
	z := fieldtest.BoxHex(unitLo, unitHi, [3]int{n, n, n})
	fieldtest.Perturb(z, 0.1/float64(n), 5)
	fieldtest.SamplePoints(z, "f", 1, func(x [3]float64, d []float64) { d[0] = x[0]*x[1] + x[2]*x[2] })
	return z
}

// BenchmarkBuildNodeOps times building the recovery operators of every
// node of a perturbed 30³ hexahedral box (a fresh Sampler per pass, so
// each operator is built once per pass), per node, in wall and in thread
// CPU time.
func BenchmarkBuildNodeOps(b *testing.B) {
	z := recoveryBox(30)
	nodes := make([]int32, z.NumPoints())
	for n := range nodes {
		nodes[n] = int32(n)
	}
	benchmarkNodeOps(b, z, nodes)
}

// BenchmarkBuildNodeOpsSphere is BenchmarkBuildNodeOps for the nodes of
// the cells of a perturbed 100³ box (10⁶ cells) holding 2¹⁸ points along a
// spiral on the sphere of radius 0.3 about its centre, in the order the
// points first need them: the recovery work of BenchmarkFlowSphereCold
// alone.
func BenchmarkBuildNodeOpsSphere(b *testing.B) {
	z := recoveryBox(100)
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	seen := make([]bool, z.NumPoints())
	var nodes []int32
	const np = 1 << 18
	for i := 0; i < np; i++ {
		u := (float64(i) + 0.5) / np
		th, ph := math.Acos(1-2*u), 600*math.Pi*u
		x := [3]float64{0.5 + 0.3*math.Sin(th)*math.Cos(ph), 0.5 + 0.3*math.Sin(th)*math.Sin(ph), 0.5 + 0.3*math.Cos(th)}
		loc, ok := l.Locate(x)
		if !ok {
			b.Fatalf("point %v not located", x)
		}
		for _, n := range z.CellNodes(int(loc.Cell)) {
			if !seen[n] {
				seen[n] = true
				nodes = append(nodes, n)
			}
		}
	}
	benchmarkNodeOps(b, z, nodes)
}

// benchmarkNodeOps times building the operators of nodes of z in order,
// with a fresh Sampler per pass.
func benchmarkNodeOps(b *testing.B, z *field.Zone, nodes []int32) {
	l, err := field.NewLocator(&field.Field{Zones: []*field.Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	b.ReportAllocs()
	var cpu int64
	for b.Loop() {
		b.StopTimer()
		s := field.NewSampler(l)
		if _, err := s.Prepare("f"); err != nil {
			b.Fatal(err)
		}
		b.StartTimer()
		c0 := fieldtest.ThreadCPU()
		for _, n := range nodes {
			field.BuildNodeOp(s, 0, n)
		}
		cpu += int64(fieldtest.ThreadCPU() - c0)
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(nodes)), "ns/node")
	b.ReportMetric(float64(cpu)/float64(b.N*len(nodes)), "cpu-ns/node")
}
