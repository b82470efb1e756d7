//go:build ignore

// gendemo writes testdata/strut.vtk, the small solution embedded in the
// farforce demo. Run it from this folder with "go generate" (or
// "go run gendemo.go").
//
// The scenario is invented for the demo and is not a solver result: a
// streamlined instrument strut (elliptic section, chord 0.1 m, thickness
// 0.024 m) held across a water channel running at 1.5 m/s, seen in a plane
// cut. The field is the exact potential flow past the ellipse (Milne-Thomson,
// Theoretical Hydrodynamics, 1968, §6.41: W = U c e^ξ0 cosh(ζ − ξ0) with
// z = c cosh ζ) plus an invented, divergence-free Gaussian wake whose volume
// deficit Q stands for a drag coefficient near 0.012 on the chord, a
// plausible value for such a fairing ("from memory", not a measurement).
// Pressure follows Bernoulli from the potential part (gauge, p∞ = 0); nut
// is an invented wake eddy viscosity. The mesh is a coarse O-grid of quads
// in elliptic coordinates.
package main

import (
	"bufio"
	"fmt"
	"math"
	"math/cmplx"
	"os"
)

const (
	chord     = 0.1    // m
	thickness = 0.024  // m
	speed     = 1.5    // m/s, channel speed
	rho       = 998.2  // kg/m^3, water at 20 °C (common practice)
	outer     = 1.0    // m, semi-major axis of the outer boundary
	nRadial   = 24     // cells from the wall to the outer boundary
	nAround   = 64     // cells around the strut
	dragCoef  = 0.012  // invented wake strength, as a drag coefficient on the chord
	wakeB0    = 0.008  // m, wake half-width at the trailing edge
	wakeGrow  = 0.0026 // m, growth: b^2 = b0^2 + wakeGrow*(x - x_te)
	wakeStart = 0.02   // m, length over which the wake switches on
	nutPeak   = 4e-4   // m^2/s, invented eddy viscosity on the wake axis
)

func main() {
	a, b := chord/2, thickness/2
	c := math.Sqrt(a*a - b*b)
	xi0 := math.Atanh(b / a)
	xi1 := math.Acosh(outer / c)
	q := dragCoef * 0.5 * speed * chord // Q = D/(rho U) with D = Cd q_inf chord

	out, err := os.Create("testdata/strut.vtk")
	if err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	w := bufio.NewWriter(out)
	np := (nRadial + 1) * nAround
	fmt.Fprintln(w, "# vtk DataFile Version 4.2")
	fmt.Fprintln(w, "farforce demo: invented flow past a streamlined instrument strut in a water channel")
	fmt.Fprintln(w, "ASCII")
	fmt.Fprintln(w, "DATASET UNSTRUCTURED_GRID")
	fmt.Fprintf(w, "POINTS %d double\n", np)
	type state struct{ u, v, p, nut float64 }
	states := make([]state, 0, np)
	for i := 0; i <= nRadial; i++ {
		xi := xi0 + (xi1-xi0)*float64(i)/nRadial
		for j := 0; j < nAround; j++ {
			eta := 2 * math.Pi * float64(j) / nAround
			x, y := c*math.Cosh(xi)*math.Cos(eta), c*math.Sinh(xi)*math.Sin(eta)
			if i == 0 { // exactly on the ellipse
				x, y = a*math.Cos(eta), b*math.Sin(eta)
			}
			fmt.Fprintf(w, "%.6g %.6g 0\n", x, y)
			// Potential flow: u - i v = dW/dz = U e^ξ0 sinh(ζ-ξ0)/sinh ζ.
			zeta := complex(xi, eta)
			dw := complex(speed*math.Exp(xi0), 0) * cmplx.Sinh(zeta-complex(xi0, 0)) / cmplx.Sinh(zeta)
			if i == 0 && (j == 0 || 2*j == nAround) {
				dw = 0 // stagnation points at the nose and tail (0/0 above)
			}
			up, vp := real(dw), -imag(dw)
			p := 0.5 * rho * (speed*speed - up*up - vp*vp)
			uw, vw, nut := wake(x, y, a, q)
			states = append(states, state{up + uw, vp + vw, p, nut})
		}
	}
	nc := nRadial * nAround
	fmt.Fprintf(w, "CELLS %d %d\n", nc, 5*nc)
	for i := 0; i < nRadial; i++ {
		for j := 0; j < nAround; j++ {
			id := func(i, j int) int { return i*nAround + j%nAround }
			fmt.Fprintf(w, "4 %d %d %d %d\n", id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1))
		}
	}
	fmt.Fprintf(w, "CELL_TYPES %d\n", nc)
	for k := 0; k < nc; k++ {
		fmt.Fprintln(w, 9)
	}
	fmt.Fprintf(w, "POINT_DATA %d\nVECTORS U double\n", np)
	for _, s := range states {
		fmt.Fprintf(w, "%.6g %.6g 0\n", s.u, s.v)
	}
	fmt.Fprintln(w, "SCALARS p double 1\nLOOKUP_TABLE default")
	for _, s := range states {
		fmt.Fprintf(w, "%.6g\n", s.p)
	}
	fmt.Fprintln(w, "SCALARS nut double 1\nLOOKUP_TABLE default")
	for _, s := range states {
		fmt.Fprintf(w, "%.6g\n", s.nut)
	}
	if err := w.Flush(); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
	if err := out.Close(); err != nil {
		fmt.Fprintln(os.Stderr, err)
		os.Exit(1)
	}
}

// wake returns the velocity of the invented wake, the curl of the stream
// function ψ = -(Q/2) s(x) erf(y/b(x)), so it is divergence free and carries
// the volume deficit Q downstream, and the invented eddy viscosity.
func wake(x, y, a, q float64) (u, v, nut float64) {
	t := (x - a) / wakeStart
	sp := wakeStart * softplus(t) // smooth max(x - x_te, 0)
	dsp := 1 / (1 + math.Exp(-t))
	b := math.Sqrt(wakeB0*wakeB0 + wakeGrow*sp)
	db := wakeGrow * dsp / (2 * b)
	th := math.Tanh(x / wakeStart)
	s := 0.5 * (1 + th)
	ds := 0.5 * (1 - th*th) / wakeStart
	g := math.Exp(-(y / b) * (y / b))
	u = -q * s * g / (math.Sqrt(math.Pi) * b)
	v = 0.5 * q * (ds*math.Erf(y/b) - s*2/math.Sqrt(math.Pi)*g*y*db/(b*b))
	nut = nutPeak * s * g * math.Sqrt(b/wakeB0)
	return u, v, nut
}

func softplus(t float64) float64 {
	if t > 30 {
		return t
	}
	return math.Log1p(math.Exp(t))
}
