//go:build ignore

// gendemo writes the two small files embedded in the farforce demo:
//
//   - testdata/strut.vtk.gz: the flow field (legacy VTK, ASCII, gzip);
//   - testdata/strut_wall.vtk: the body surface with its loads (legacy VTK
//     POLYDATA, ASCII), the near field the far-field numbers are checked
//     against.
//
// Run it from this folder with "go generate" (or "go run gendemo.go").
//
// The scenario is invented for the demo and is not a solver result: a
// streamlined instrument strut (elliptic section, chord 0.1 m, thickness
// 0.024 m) held across a water channel running at 1.5 m/s, seen in a plane
// cut. The field is the exact potential flow past the ellipse (Milne-Thomson,
// Theoretical Hydrodynamics, 1968, §6.41: W = U c e^ξ0 cosh(ζ − ξ0) with
// z = c cosh ζ) plus an invented, divergence-free Gaussian wake whose volume
// deficit Q = D′/(ρU) stands for the design drag D′ = C_D ½ρU² c with
// C_D = 0.012 on the chord, a plausible value for such a fairing ("from
// memory", not a measurement). Pressure follows Bernoulli from the potential
// part (gauge, p∞ = 0); nut is an invented wake eddy viscosity. The mesh is
// an O-grid of quads in elliptic coordinates, its cells packed towards the
// wake (η = s − α sin s) so that the wake is resolved where the control
// surfaces cross it.
//
// The wall file holds the exact potential-flow wall pressure (same gauge)
// and an invented wall shear traction along the local surface flow, of
// magnitude k|V_s|^1.5 (V_s the potential-flow surface speed). Potential
// flow has no pressure drag, so all of the design drag is friction here: k
// is chosen so that the drag of the wall file, integrated exactly as
// integrate.NearField does (trapezoidal on each segment, flat segment
// normals), equals D′ to rounding. Near and far field are therefore
// consistent by construction; the demo says so.
package main

import (
	"bufio"
	"bytes"
	"compress/gzip"
	"fmt"
	"math"
	"math/cmplx"
	"os"
	"strconv"
)

const (
	chord      = 0.1    // m
	thickness  = 0.024  // m
	speed      = 1.5    // m/s, channel speed
	rho        = 998.2  // kg/m^3, water at 20 °C (common practice)
	outer      = 1.0    // m, semi-major axis of the outer boundary
	nRadial    = 30     // cells from the wall to the outer boundary
	nAround    = 96     // cells around the strut
	cluster    = 0.65   // α of η = s − α sin s: cells around η = 0 are 1−α times the mean
	dragCoef   = 0.012  // invented design drag coefficient on the chord
	wakeB0     = 0.008  // m, wake half-width at the trailing edge
	wakeGrow   = 0.0026 // m, growth: b^2 = b0^2 + wakeGrow*(x - x_te)
	wakeStart  = 0.02   // m, length over which the width starts growing
	wakeSwitch = 0.03   // m, length over which the wake deficit switches on at the trailing edge
	nutPeak    = 4e-4   // m^2/s, invented eddy viscosity on the wake axis
	nWall      = 200    // segments of the wall polyline
)

// geometry of the section: semi-axes a, b, focal distance c, and the
// elliptic coordinate ξ0 of the wall.
var (
	semiA = chord / 2
	semiB = thickness / 2
	focal = math.Sqrt(semiA*semiA - semiB*semiB)
	xi0   = math.Atanh(semiB / semiA)
	// design drag per unit span D′ = C_D ½ρU² c (N/m) and the wake's
	// volume deficit Q = D′/(ρU) (m²/s).
	dragDesign = dragCoef * 0.5 * rho * speed * speed * chord
	deficit    = dragDesign / (rho * speed)
)

func main() {
	if err := writeField("testdata/strut.vtk.gz"); err != nil {
		fail(err)
	}
	if err := writeWall("testdata/strut_wall.vtk"); err != nil {
		fail(err)
	}
}

func fail(err error) {
	fmt.Fprintln(os.Stderr, "gendemo:", err)
	os.Exit(1)
}

// potential returns the potential-flow velocity at elliptic coordinates
// (ξ, η): u − i v = dW/dz = U e^ξ0 sinh(ζ−ξ0)/sinh ζ, zero at the wall's
// stagnation points (0/0 there).
func potential(xi, eta float64, onWall bool) (u, v float64) {
	if onWall && (math.Abs(math.Sin(eta)) < 1e-12) {
		return 0, 0
	}
	zeta := complex(xi, eta)
	dw := complex(speed*math.Exp(xi0), 0) * cmplx.Sinh(zeta-complex(xi0, 0)) / cmplx.Sinh(zeta)
	return real(dw), -imag(dw)
}

// bernoulli is the gauge pressure p − p∞ of the potential flow.
func bernoulli(u, v float64) float64 { return 0.5 * rho * (speed*speed - u*u - v*v) }

// writeField writes the O-grid with U, p and nut at the points,
// gzip-compressed.
func writeField(name string) error {
	xi1 := math.Acosh(outer / focal)
	var buf bytes.Buffer
	w := bufio.NewWriter(&buf)
	np := (nRadial + 1) * nAround
	fmt.Fprintln(w, "# vtk DataFile Version 4.2")
	fmt.Fprintln(w, "farforce demo: invented flow past a streamlined instrument strut in a water channel")
	fmt.Fprintln(w, "ASCII")
	fmt.Fprintln(w, "DATASET UNSTRUCTURED_GRID")
	fmt.Fprintf(w, "POINTS %d float\n", np)
	type state struct{ u, v, p, nut float64 }
	states := make([]state, 0, np)
	for i := 0; i <= nRadial; i++ {
		xi := xi0 + (xi1-xi0)*float64(i)/nRadial
		for j := 0; j < nAround; j++ {
			s := 2 * math.Pi * float64(j) / nAround
			eta := s - cluster*math.Sin(s)
			x, y := focal*math.Cosh(xi)*math.Cos(eta), focal*math.Sinh(xi)*math.Sin(eta)
			if i == 0 { // exactly on the ellipse
				x, y = semiA*math.Cos(eta), semiB*math.Sin(eta)
			}
			fmt.Fprintf(w, "%.6g %.6g 0\n", x, y)
			up, vp := potential(xi, eta, i == 0)
			uw, vw, nut := wake(x, y)
			states = append(states, state{up + uw, vp + vw, bernoulli(up, vp), nut})
		}
	}
	nc := nRadial * nAround
	fmt.Fprintf(w, "CELLS %d %d\n", nc, 5*nc)
	id := func(i, j int) int { return i*nAround + j%nAround }
	for i := 0; i < nRadial; i++ {
		for j := 0; j < nAround; j++ {
			fmt.Fprintf(w, "4 %d %d %d %d\n", id(i, j), id(i+1, j), id(i+1, j+1), id(i, j+1))
		}
	}
	fmt.Fprintf(w, "CELL_TYPES %d\n", nc)
	for k := 0; k < nc; k++ {
		fmt.Fprintln(w, 9)
	}
	fmt.Fprintf(w, "POINT_DATA %d\nVECTORS U float\n", np)
	for _, s := range states {
		fmt.Fprintf(w, "%.6g %.6g 0\n", s.u, s.v)
	}
	fmt.Fprintln(w, "SCALARS p float 1\nLOOKUP_TABLE default")
	for _, s := range states {
		fmt.Fprintf(w, "%.6g\n", s.p)
	}
	fmt.Fprintln(w, "SCALARS nut float 1\nLOOKUP_TABLE default")
	for _, s := range states {
		fmt.Fprintf(w, "%.4g\n", s.nut)
	}
	if err := w.Flush(); err != nil {
		return err
	}
	var gz bytes.Buffer
	zw, err := gzip.NewWriterLevel(&gz, gzip.BestCompression)
	if err != nil {
		return err
	}
	zw.Name = "strut.vtk" // no ModTime: the bytes depend on the content only
	if _, err := zw.Write(buf.Bytes()); err != nil {
		return err
	}
	if err := zw.Close(); err != nil {
		return err
	}
	return os.WriteFile(name, gz.Bytes(), 0o644)
}

// wake returns the velocity of the invented wake, the curl of the stream
// function ψ = -(Q/2) s(x) erf(y/b(x)), so it is divergence free and carries
// the volume deficit Q downstream of the trailing edge, and the invented
// eddy viscosity. The volume deficit leaves sideways where s(x) rises, a
// thin sheet of cross flow v = (Q/2) s′(x) erf(y/b) at the trailing edge.
func wake(x, y float64) (u, v, nut float64) {
	t := (x - semiA) / wakeStart
	sp := wakeStart * softplus(t) // smooth max(x - x_te, 0)
	dsp := 1 / (1 + math.Exp(-t))
	b := math.Sqrt(wakeB0*wakeB0 + wakeGrow*sp)
	db := wakeGrow * dsp / (2 * b)
	th := math.Tanh((x - semiA) / wakeSwitch)
	s := 0.5 * (1 + th)
	ds := 0.5 * (1 - th*th) / wakeSwitch
	g := math.Exp(-(y / b) * (y / b))
	u = -deficit * s * g / (math.Sqrt(math.Pi) * b)
	v = 0.5 * deficit * (ds*math.Erf(y/b) - s*2/math.Sqrt(math.Pi)*g*y*db/(b*b))
	nut = nutPeak * s * g * math.Sqrt(b/wakeB0)
	return u, v, nut
}

func softplus(t float64) float64 {
	if t > 30 {
		return t
	}
	return math.Log1p(math.Exp(t))
}

// writeWall writes the wall polyline (nWall segments, equal steps in η,
// symmetric fore and aft and top and bottom) with the potential-flow
// pressure and the invented wall shear traction scaled to the design drag.
func writeWall(name string) error {
	type node struct{ x, y, p, gx, gy float64 }
	nodes := make([]node, nWall)
	for j := range nodes {
		eta := 2 * math.Pi * float64(j) / nWall
		u, v := potential(xi0, eta, true)
		vs := math.Hypot(u, v)
		nodes[j] = node{x: semiA * math.Cos(eta), y: semiB * math.Sin(eta), p: bernoulli(u, v),
			gx: math.Sqrt(vs) * u, gy: math.Sqrt(vs) * v} // |V_s|^1.5 along V_s
		// Round the coordinates as written, so the integral below is the
		// one the reader's data give.
		nodes[j].x, _ = strconv.ParseFloat(g17(nodes[j].x), 64)
		nodes[j].y, _ = strconv.ParseFloat(g17(nodes[j].y), 64)
	}
	// Drag of each load with the quadrature of integrate.NearField: per
	// segment L (f0+f1)/2 with the flat outward normal n = (dy, −dx)/L for
	// counter-clockwise nodes. Force = −p n L + τ L.
	pressureDrag, shapeDrag := 0.0, 0.0
	for j := range nodes {
		a, b := nodes[j], nodes[(j+1)%nWall]
		dx, dy := b.x-a.x, b.y-a.y
		pressureDrag += -(a.p + b.p) / 2 * dy
		shapeDrag += (a.gx + b.gx) / 2 * math.Hypot(dx, dy)
	}
	k := (dragDesign - pressureDrag) / shapeDrag
	fmt.Fprintf(os.Stderr, "gendemo: design drag %.9g N/m, discrete pressure drag %.3g N/m, friction scale k = %.9g Pa/(m/s)^1.5\n", dragDesign, pressureDrag, k)

	var buf bytes.Buffer
	w := bufio.NewWriter(&buf)
	fmt.Fprintln(w, "# vtk DataFile Version 4.2")
	fmt.Fprintln(w, "farforce demo: wall of the invented strut; potential-flow pressure, invented shear scaled to C_D 0.012")
	fmt.Fprintln(w, "ASCII")
	fmt.Fprintln(w, "DATASET POLYDATA")
	fmt.Fprintf(w, "POINTS %d double\n", nWall)
	for _, n := range nodes {
		fmt.Fprintf(w, "%s %s 0\n", g17(n.x), g17(n.y))
	}
	fmt.Fprintf(w, "LINES 1 %d\n%d", nWall+2, nWall+1)
	for j := 0; j <= nWall; j++ {
		fmt.Fprintf(w, " %d", j%nWall)
	}
	fmt.Fprintf(w, "\nPOINT_DATA %d\nSCALARS pressure double 1\nLOOKUP_TABLE default\n", nWall)
	for _, n := range nodes {
		fmt.Fprintln(w, g17(n.p))
	}
	fmt.Fprintln(w, "VECTORS wall_shear_stress double")
	for _, n := range nodes {
		fmt.Fprintf(w, "%s %s 0\n", g17(k*n.gx), g17(k*n.gy))
	}
	if err := w.Flush(); err != nil {
		return err
	}
	return os.WriteFile(name, buf.Bytes(), 0o644)
}

// g17 formats x with the shortest representation that reads back exactly.
func g17(x float64) string { return strconv.FormatFloat(x, 'g', -1, 64) }
