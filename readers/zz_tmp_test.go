package readers

import (
	"bytes"
	"math/rand"
	"os"
	"path/filepath"
	"testing"
	"time"
)

func TestSlowInputsTmp(t *testing.T) {
	var seeds [][]byte
	for _, pat := range []string{"../testdata/vtk/*.vtk*", "../testdata/malformed/*.vtk"} {
		m, _ := filepath.Glob(pat)
		for _, p := range m {
			b, _ := os.ReadFile(p)
			if len(b) < 16<<10 && len(b) > 0 {
				seeds = append(seeds, b)
			}
		}
	}
	rng := rand.New(rand.NewSource(1))
	deadline := time.Now().Add(60 * time.Second)
	n := 0
	var worst time.Duration
	for time.Now().Before(deadline) {
		b := append([]byte(nil), seeds[rng.Intn(len(seeds))]...)
		for k := rng.Intn(4) + 1; k > 0; k-- {
			i := rng.Intn(len(b))
			switch rng.Intn(4) {
			case 0:
				b[i] ^= 1 << uint(rng.Intn(8))
			case 1:
				b[i] = "0123456789 \n-e."[rng.Intn(15)]
			case 2:
				b = append(b[:i], append([]byte("9999"), b[i:]...)...)
			case 3:
				if i+8 < len(b) {
					b = append(b[:i], b[i+rng.Intn(8):]...)
				}
			}
		}
		t0 := time.Now()
		func() {
			defer func() {
				if p := recover(); p != nil {
					os.WriteFile("/tmp/panic_input", b, 0644)
					t.Fatalf("panic: %v", p)
				}
			}()
			for _, w := range []int{1, 2} {
				ReadVTK(bytes.NewReader(b), "x", Options{MaxBytes: 1 << 20, Workers: w})
			}
			ReadVTK(struct{ r *bytes.Reader }{bytes.NewReader(b)}.r, "x", Options{MaxBytes: 1 << 20})
		}()
		if d := time.Since(t0); d > worst {
			worst = d
			os.WriteFile("/tmp/slow_input", b, 0644)
			t.Logf("exec %d: %v", n, d)
		}
		n++
	}
	t.Logf("%d execs, worst %v", n, worst)
}
