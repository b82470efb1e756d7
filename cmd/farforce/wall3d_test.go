package main

import (
	"math"
	"path/filepath"
	"strings"
	"testing"

	"farforce/field"
	"farforce/field/fieldtest"
)

// Stokes flow past a sphere (Stokes 1851; VALIDATION.md §3.3): radius a,
// viscosity μ, stream U along x. On the body the pressure gives 2πμaU and
// the friction 4πμaU; every closed surface around it gives 6πμaU.
const (
	stkMu, stkA, stkU = 2.0, 0.5, 1.0
	stkPInf           = 3.0
)

func stokesFlow() fieldtest.StokesSphere {
	return fieldtest.StokesSphere{Mu: stkMu, PInf: stkPInf, A: stkA, U: [3]float64{stkU, 0, 0}}
}

// writeStokesFiles writes the sphere's wall (a cube sphere of 6·16² quads
// with the exact pressure and traction τ·n, n = x/r out of the body) and a
// body-fitted shell a ≤ r ≤ 4a of 6·8²·8 hexahedra with the flow sampled
// at the nodes.
func writeStokesFiles(t *testing.T, dir string) (vol, wall string) {
	t.Helper()
	flow := stokesFlow()
	w := fieldtest.WallSphere([3]float64{}, stkA, 16)
	fieldtest.SamplePoints(w, "p", 1, func(x [3]float64, d []float64) { d[0] = flow.State(x).P })
	fieldtest.SamplePoints(w, "tau", 3, func(x [3]float64, d []float64) {
		s := flow.State(x)
		r := math.Sqrt(dot(x, x))
		for i := 0; i < 3; i++ {
			d[i] = 0
			for j := 0; j < 3; j++ {
				d[i] += stkMu * (s.GradV[i][j] + s.GradV[j][i]) * x[j] / r
			}
		}
	})
	v := fieldtest.WallShell([3]float64{}, stkA, 4*stkA, 8, 8)
	fieldtest.SampleFlow(v, flow, field.AtPoints)
	vol, wall = filepath.Join(dir, "stokes.vtk"), filepath.Join(dir, "sphere_wall.vtk")
	writeVTKFile(t, vol, v, false)
	writeVTKFile(t, wall, w, true)
	return vol, wall
}

// TestWallStokesSphere: the near field of the Stokes sphere from a 3D wall
// file (arrays named by flag) and from the volume mesh's boundary, and a
// sweep of spheres around it, all against 6πμaU. Tolerances: the wall
// file's exact loads on a faceted sphere of edge ≈ πa/32 err by O(h²),
// about 0.4 %: 1 % allowed. The volume mesh samples the flow on a coarse
// shell (8 × 8 cells per cube face, 8 layers): its pressure is second
// order (1.7 % off here, 3 % allowed) but its wall friction, from
// gradients recovered at the wall, only first order (the integrate
// package fits both orders): 22 % off here, 25 % allowed. The far field
// on boxes inside the shell is 2.3 % off: 3 % allowed.
func TestWallStokesSphere(t *testing.T) {
	dir := t.TempDir()
	vol, wall := writeStokesFiles(t, dir)
	ref := []string{"--freestream-velocity", "1,0,0", "--freestream-pressure", "3", "--ref-area", "0.7853981633974483"} // π a²
	exactP, exactF := 2*math.Pi*stkMu*stkA*stkU, 4*math.Pi*stkMu*stkA*stkU
	r := runWallJSON(t, append([]string{"--wall", wall, "--wall-pressure", "p", "--wall-shear", "tau", "--freestream-density", "1"}, ref...)...)
	if math.Abs(r.Near.Pressure[0]-exactP) > 0.01*exactP || math.Abs(r.Near.Friction[0]-exactF) > 0.01*exactF {
		t.Errorf("wall file: pressure %.5f friction %.5f, want %.5f %.5f", r.Near.Pressure[0], r.Near.Friction[0], exactP, exactF)
	}
	vflags := append([]string{"--density", "1", "--viscosity", "2", "--no-convection"}, ref...)
	v := runWallJSON(t, append([]string{vol, "--inside", "sphere center=0,0,0 radius=0.55"}, vflags...)...)
	if v.Near.Facets != 6*8*8 || math.Abs(v.Near.Pressure[0]-exactP) > 0.03*exactP || math.Abs(v.Near.Friction[0]-exactF) > 0.25*exactF {
		t.Errorf("volume: %d faces, pressure %.5f friction %.5f, want %d and %.5f %.5f", v.Near.Facets, v.Near.Pressure[0], v.Near.Friction[0], 6*8*8, exactP, exactF)
	}
	s := runSweepJSON(t, append([]string{vol, "--surface", "box min=-0.9,-0.9,-0.9 max=0.9,0.9,0.9 facets=600", "--scales", "0.8:1.2:3", "--wall", wall}, vflags...)...)
	q := 0.5 * 1 * stkU * stkU * 0.7853981633974483
	for _, m := range s.Members {
		if cd := m.Coefficients.Drag * q; math.Abs(cd-(exactP+exactF)) > 0.03*(exactP+exactF) {
			t.Errorf("sweep scale %g: drag %.5f, want %.5f", m.Scale, cd, exactP+exactF)
		}
	}
	code, out, errs := runCmd(t, append([]string{"wall", "--wall", wall, "--wall-pressure", "p", "--wall-shear", "tau", "--freestream-density", "1"}, ref...)...)
	for _, want := range []string{"3D: forces in N", "C_S", "friction", "z"} {
		if code != exitOK || !strings.Contains(out, want) {
			t.Errorf("3D text output lacks %q (exit %d, %s)", want, code, errs)
		}
	}
}
