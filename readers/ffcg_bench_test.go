package readers

import (
	"bytes"
	"io"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"farforce/field"
)

// benchFFCG returns an ffcg file of one structured n x n x n-cell zone
// (3-D, hexahedra) with a curvilinear grid and five Vertex arrays
// (Density, MomentumX/Y/Z, Pressure) of full-precision values, as a
// solver would write them: 8 (n+1)^3 numbers in all.
func benchFFCG(tb testing.TB, n int) []byte {
	tb.Helper()
	m := n + 1
	np := m * m * m
	var b bytes.Buffer
	b.WriteString("ffcg 1\n# benchmark block\nbase B CellDimension=3 PhysicalDimension=3\n")
	b.WriteString("zone Block Structured VertexSize=" + strconv.Itoa(m) + "," + strconv.Itoa(m) + "," + strconv.Itoa(m) + "\n")
	val := func(q, i int) float64 {
		x := float64(i) / float64(np)
		switch q {
		case 0, 1, 2:
			c := [3]int{i % m, (i / m) % m, i / (m * m)}
			return float64(c[q])/float64(n) + 0.01*math.Sin(7*x+float64(q))
		case 3:
			return 1.2 + 0.1*math.Sin(3*x)
		case 7:
			return 101325 + 500*math.Cos(5*x)
		}
		return 12*math.Cos(float64(q)*x) + 0.5
	}
	names := []string{"CoordinateX", "CoordinateY", "CoordinateZ", "Density", "MomentumX", "MomentumY", "MomentumZ", "Pressure"}
	line := make([]byte, 0, 256)
	for q, name := range names {
		switch q {
		case 0:
			b.WriteString("GridCoordinates\n")
		case 3:
			b.WriteString("end\nFlowSolution Nodes GridLocation=Vertex\n")
		}
		b.WriteString("data " + name + " R8 " + strconv.Itoa(np) + "\n")
		for i := 0; i < np; i++ {
			line = appendFloat(line, val(q, i))
			if i%6 == 5 || i == np-1 {
				line = append(line, '\n')
				b.Write(line)
				line = line[:0]
			} else {
				line = append(line, ' ')
			}
		}
	}
	b.WriteString("end\nend zone\nend base\n")
	return b.Bytes()
}

// BenchmarkReadFFCG reads a ~1M-cell (100^3 hexahedra, 1.03M points,
// 8.2M numbers) structured ffcg file from disk; MB/s is file bytes per
// second.
func BenchmarkReadFFCG(b *testing.B) {
	data := benchFFCG(b, 100)
	path := filepath.Join(b.TempDir(), "bench.ffcg")
	if err := os.WriteFile(path, data, 0o644); err != nil {
		b.Fatal(err)
	}
	for _, w := range []int{1, 0} {
		b.Run("workers="+strconv.Itoa(w), func(b *testing.B) {
			b.SetBytes(int64(len(data)))
			b.ReportAllocs()
			for range b.N {
				f, err := ReadFile(path, Options{Workers: w})
				if err != nil {
					b.Fatal(err)
				}
				if f.NumCells() != 100*100*100 {
					b.Fatal("cells")
				}
			}
		})
	}
}

// BenchmarkReadFFCGUnstructured reads ~1M-cell unstructured zones
// (benchZone: hexahedra or tetrahedra, a point vector, a point scalar, a
// cell scalar) written by WriteFFCG, and reads the same zone as legacy VTK
// ASCII for comparison. MB/s is file bytes per second.
func BenchmarkReadFFCGUnstructured(b *testing.B) {
	for _, kind := range []string{"hex", "tet"} {
		z := benchZone(kind, 1000000)
		f := &field.Field{Zones: []*field.Zone{z}}
		dir := b.TempDir()
		var fb, vb bytes.Buffer
		if err := WriteFFCG(&fb, f, nil); err != nil {
			b.Fatal(err)
		}
		if err := WriteVTK(&vb, z, WriteOptions{}); err != nil {
			b.Fatal(err)
		}
		for _, c := range []struct {
			name string
			data []byte
		}{{"ffcg", fb.Bytes()}, {"vtk-ascii", vb.Bytes()}} {
			path := filepath.Join(dir, kind+"."+c.name)
			if err := os.WriteFile(path, c.data, 0o644); err != nil {
				b.Fatal(err)
			}
			b.Run(kind+"/"+c.name, func(b *testing.B) {
				b.SetBytes(int64(len(c.data)))
				b.ReportAllocs()
				for range b.N {
					g, err := ReadFile(path, Options{})
					if err != nil {
						b.Fatal(err)
					}
					if g.NumCells() != z.NumCells() {
						b.Fatal("cells")
					}
				}
			})
		}
	}
}

// BenchmarkWriteFFCG writes a ~1M-hexahedra zone; MB/s is output bytes per
// second.
func BenchmarkWriteFFCG(b *testing.B) {
	f := &field.Field{Zones: []*field.Zone{benchZone("hex", 1000000)}}
	var n countWriter
	if err := WriteFFCG(&n, f, nil); err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(n))
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		if err := WriteFFCG(io.Discard, f, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// countWriter counts the bytes written to it.
type countWriter int

func (c *countWriter) Write(p []byte) (int, error) { *c += countWriter(len(p)); return len(p), nil }
