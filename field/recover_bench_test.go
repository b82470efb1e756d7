package field

import (
	"math"
	"math/rand/v2"
	"runtime"
	"testing"
)

// perturbedHexBox returns a zone of n³ hexahedra filling the unit cube,
// interior points moved randomly by up to amp per coordinate (demo
// geometry), with a point array "f" of invented smooth values.
func perturbedHexBox(n int, amp float64) *Zone {
	z := &Zone{Name: "box"}
	rng := rand.New(rand.NewPCG(5, 6))
	for k := 0; k <= n; k++ {
		for j := 0; j <= n; j++ {
			for i := 0; i <= n; i++ {
				x := [3]float64{float64(i) / float64(n), float64(j) / float64(n), float64(k) / float64(n)}
				if i > 0 && i < n && j > 0 && j < n && k > 0 && k < n {
					for a := range x {
						x[a] += amp * (2*rng.Float64() - 1)
					}
				}
				z.Points = append(z.Points, x[:]...)
			}
		}
	}
	id := func(i, j, k int) int32 { return int32((k*(n+1)+j)*(n+1) + i) }
	for k := 0; k < n; k++ {
		for j := 0; j < n; j++ {
			for i := 0; i < n; i++ {
				z.AddCell(Hexa, id(i, j, k), id(i+1, j, k), id(i+1, j+1, k), id(i, j+1, k),
					id(i, j, k+1), id(i+1, j, k+1), id(i+1, j+1, k+1), id(i, j+1, k+1))
			}
		}
	}
	a := Array{Name: "f", Location: AtPoints, Components: 1, Data: make([]float64, z.NumPoints())}
	for p := range a.Data {
		x := z.Point(int32(p))
		a.Data[p] = x[0]*x[1] + x[2]*x[2]
	}
	z.Arrays = append(z.Arrays, a)
	return z
}

// BenchmarkBuildNodeOps times building the recovery operators of every
// node of a perturbed 30³ hexahedral box (a fresh Sampler per pass, so
// each operator is built once per pass), per node, in wall and in thread
// CPU time.
func BenchmarkBuildNodeOps(b *testing.B) {
	z := perturbedHexBox(30, 0.1/30)
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
	z := perturbedHexBox(100, 0.1/100)
	l, err := NewLocator(&Field{Zones: []*Zone{z}})
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
func benchmarkNodeOps(b *testing.B, z *Zone, nodes []int32) {
	l, err := NewLocator(&Field{Zones: []*Zone{z}})
	if err != nil {
		b.Fatal(err)
	}
	runtime.LockOSThread()
	defer runtime.UnlockOSThread()
	b.ReportAllocs()
	var cpu int64
	for b.Loop() {
		b.StopTimer()
		s := NewSampler(l)
		if _, err := s.Prepare("f"); err != nil {
			b.Fatal(err)
		}
		b.StartTimer()
		c0 := threadCPU()
		for _, n := range nodes {
			s.nodeOp(0, n)
		}
		cpu += threadCPU() - c0
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*len(nodes)), "ns/node")
	b.ReportMetric(float64(cpu)/float64(b.N*len(nodes)), "cpu-ns/node")
}
