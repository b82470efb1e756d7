package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"

	"farforce/integrate"
)

// forcesSchema versions the JSON report of forces; see inspectSchema.
const forcesSchema = "farforce.forces/1"

// notice ends every report.
const notice = "These figures depend on the mesh and the solver that produced the field; engineering decisions rest with qualified engineers and the applicable codes."

// forcesReport is what forces prints. Each surface is an integrate.Result
// with its own JSON field names (spec, force, terms, moment, wind,
// coefficients, mass_imbalance, facets, ...).
type forcesReport struct {
	Schema   string             `json:"schema"`
	Setup    setupReport        `json:"setup"`
	Surfaces []integrate.Result `json:"surfaces"`
	Notice   string             `json:"notice"`
}

// units returns the units of force and moment for a field of dimension dim.
func units(dim int) (force, moment, area string) {
	if dim == 2 {
		return "N/m", "N", "length (m)"
	}
	return "N", "N·m", "area (m²)"
}

// writeSetupOf is writeSetupText with the dynamic pressure and wind axes
// of res, the first result of a report (nil when there is none).
func writeSetupOf(w io.Writer, s *setupReport, res *integrate.Result) {
	if res == nil {
		writeSetupText(w, s, 0, nil)
		return
	}
	writeSetupText(w, s, res.DynamicPressure, windAxes(res.HasWind, &res.Axes))
}

// writeSetupText echoes the constants and conventions of a computation.
func writeSetupText(w io.Writer, s *setupReport, q float64, axes *integrate.Axes) {
	fmt.Fprintf(w, "Solution: %s\n", strings.Join(s.Files, ", "))
	fu, mu, _ := units(s.Dimension)
	if s.Dimension == 2 {
		fmt.Fprintf(w, "2D field: forces per unit span (%s), moments M_z per unit span (%s)\n\n", fu, mu)
	} else {
		fmt.Fprintf(w, "3D field: forces in %s, moments in %s\n\n", fu, mu)
	}
	fmt.Fprintln(w, "Inputs and constants used")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	m := s.Mapping
	fmt.Fprintf(tw, "  velocity\t%s\n", orNone(strings.Join(m.Velocity, ", ")))
	fmt.Fprintf(tw, "  pressure\t%s\n", orNone(m.Pressure))
	fmt.Fprintf(tw, "  density\t%s\n", quantityText(m.Density, "", "kg/m³"))
	fmt.Fprintf(tw, "  viscosity\t%s\n", quantityText(m.Viscosity, m.ViscosityKind, viscUnit(m.ViscosityKind)))
	fmt.Fprintf(tw, "  eddy viscosity\t%s\n", quantityText(m.EddyViscosity, m.EddyKind, viscUnit(m.EddyKind)))
	if m.ReynoldsStress != "" {
		fmt.Fprintf(tw, "  Reynolds stress\tarray %s\n", m.ReynoldsStress)
	}
	if m.Mask != "" {
		fmt.Fprintf(tw, "  mask\tarray %s (non-zero = not fluid)\n", m.Mask)
	}
	fs := s.Freestream
	fmt.Fprintf(tw, "  freestream velocity\t%s m/s (speed %s m/s)\n", vec(fs.Velocity), num(fs.Speed))
	fmt.Fprintf(tw, "  freestream density\t%s\n", refText(fs.Density, "kg/m³"))
	fmt.Fprintf(tw, "  reference pressure p∞\t%s Pa\n", num(fs.Pressure))
	fmt.Fprintf(tw, "  dynamic pressure q∞\t%s Pa\n", num(q))
	fmt.Fprintf(tw, "  up axis\t%s\n", vec(s.Up))
	if s.Dimension == 2 {
		fmt.Fprintf(tw, "  reference length\t%s\n", refText(s.RefLength, "m"))
	} else {
		fmt.Fprintf(tw, "  reference area\t%s\n", refText(s.RefArea, "m²"))
		fmt.Fprintf(tw, "  reference length\t%s\n", refText(s.RefLength, "m (moment coefficients)"))
	}
	fmt.Fprintf(tw, "  moment centre\t%s m\n", vec(s.MomentCenter))
	fmt.Fprintf(tw, "  momentum flux\t%s\n", formText(s.Form))
	if a := axes; a != nil {
		fmt.Fprintf(tw, "  wind axes (in mesh axes)\tdrag %s, lift %s, side %s\n", vec(a.Drag), vec(a.Lift), vec(a.Side))
	}
	tw.Flush()
	for _, warn := range s.Warnings {
		fmt.Fprintf(w, "  warning: %s\n", warn)
	}
	writeCaseText(w, s.Case)
}

func orNone(s string) string {
	if s == "" {
		return "(none)"
	}
	return "array " + s
}

func quantityText(v, kind, unit string) string {
	if v == "" {
		return "0 (not given)"
	}
	k := ""
	if kind != "" {
		k = " (" + kind + ")"
	}
	if _, err := strconv.ParseFloat(v, 64); err == nil {
		return v + " " + unit + k
	}
	return "array " + v + k
}

func viscUnit(kind string) string {
	if kind == "kinematic" {
		return "m²/s"
	}
	return "Pa·s"
}

// refText formats a reference quantity; zero means not given.
func refText(v float64, unit string) string {
	if v == 0 {
		return "not given (no coefficients)"
	}
	return num(v) + " " + unit
}

func formText(form string) string {
	switch form {
	case "plain":
		return "plain, ρV(V·n)"
	case "no-convection":
		return "none (--no-convection)"
	}
	return "deficit, ρ(V-V∞)(V·n)"
}

// vec formats a 3-vector as (x, y, z).
func vec(v [3]float64) string {
	return "(" + num(v[0]) + ", " + num(v[1]) + ", " + num(v[2]) + ")"
}

// writeForcesText prints the setup, then one block per surface, then the
// notice.
func writeForcesText(w io.Writer, r *forcesReport) {
	var first *integrate.Result
	if len(r.Surfaces) > 0 {
		first = &r.Surfaces[0]
	}
	writeSetupOf(w, &r.Setup, first)
	for i := range r.Surfaces {
		fmt.Fprintln(w)
		writeSurfaceText(w, i+1, &r.Surfaces[i])
	}
	fmt.Fprintf(w, "\n%s\n", notice)
}

// writeSurfaceText prints the block of one surface. In 2D the z and side
// columns (always zero there) are left out and the moment is M_z alone.
func writeSurfaceText(w io.Writer, k int, s *integrate.Result) {
	fu, mu, measure := units(s.Dim)
	fmt.Fprintf(w, "Surface %d: %s\n", k, s.Spec)
	fmt.Fprintf(w, "  facets %d, pieces %d, quadrature points %d\n", s.Facets, s.Pieces, s.Points)
	fmt.Fprintf(w, "  %s %s (exact shape %s, error %.3g %%), closure Σ A n = %s\n",
		measure, num(s.Area), num(s.ExactArea), 100*s.AreaError, vecE(s.Closure))
	massUnit := "kg/s"
	if s.Dim == 2 {
		massUnit = "kg/(s·m)"
	}
	fmt.Fprintf(w, "  mass closure ∮ρV·n / ∮ρ|V·n| = %.3g (net %.4g %s of %.4g through the surface)\n\n",
		s.MassImbalance, s.MassFlux, massUnit, s.MassAbs)

	largest := writeForceTable(w, fu, s.Dim, windAxes(s.HasWind, &s.Axes), []namedForce{
		{"momentum flux", s.Terms.Momentum}, {"pressure", s.Terms.Pressure}, {"viscous", s.Terms.Viscous},
		{"Reynolds stress", s.Terms.Reynolds}, {"total", s.Force}})
	// Moments are rounded on the scale of the largest force times the size
	// of the surface, so that a moment that is zero up to rounding shows as
	// zero.
	size := s.Area / (2 * math.Pi) // radius of a circle of that length
	if s.Dim == 3 {
		size = math.Sqrt(s.Area / (4 * math.Pi)) // radius of a sphere of that area
	}
	fm := fixedFormatter(append(s.Moment[:], largest*size)...)
	if s.Dim == 2 {
		fmt.Fprintf(w, "  moment M_z about %s: %s %s\n", vec(s.MomentCenter), fm(s.Moment[2]), mu)
	} else {
		fmt.Fprintf(w, "  moment about %s: (%s, %s, %s) %s\n", vec(s.MomentCenter), fm(s.Moment[0]), fm(s.Moment[1]), fm(s.Moment[2]), mu)
	}
	switch {
	case s.HasCoefficients:
		c := s.Coefficients
		if s.Dim == 2 {
			fmt.Fprintf(w, "  coefficients: C_D %s (%s counts), C_L %s\n", fixed(c.Drag, 6), fixed(s.DragCounts, 1), fixed(c.Lift, 6))
		} else {
			fmt.Fprintf(w, "  coefficients: C_D %s (%s counts), C_L %s, C_S %s\n", fixed(c.Drag, 6), fixed(s.DragCounts, 1), fixed(c.Lift, 6), fixed(c.Side, 6))
		}
		if s.HasMomentCoefficients {
			cm := s.MomentCoefficients
			if s.Dim == 2 {
				fmt.Fprintf(w, "  moment coefficient: C_Mz %s\n", fixed(cm[2], 6))
			} else {
				fmt.Fprintf(w, "  moment coefficients (mesh axes): (%s, %s, %s)\n", fixed(cm[0], 6), fixed(cm[1], 6), fixed(cm[2], 6))
			}
		}
	case !s.HasWind:
		fmt.Fprintln(w, "  coefficients: none, the freestream speed is zero")
	default:
		fmt.Fprintln(w, "  coefficients: none, give --ref-area (3D) or --ref-length (2D) and a freestream density")
	}
}

// namedForce is one row of a force table.
type namedForce struct {
	name string
	v    [3]float64
}

// writeForceTable prints rows as a table of mesh components (x, y and, in
// 3D, z) followed, when axes is not nil, by wind components (drag, lift
// and, in 3D, side), all rounded by one fixedFormatter; fu is the force
// unit. It returns the largest magnitude of any mesh component.
func writeForceTable(w io.Writer, fu string, dim int, axes *integrate.Axes, rows []namedForce) float64 {
	var all []float64
	for _, r := range rows {
		all = append(all, r.v[:]...)
	}
	f := fixedFormatter(all...)
	t := &table{header: []string{"force (" + fu + ")", "x", "y", "z", "drag", "lift", "side"}}
	if dim == 2 {
		t.header = []string{"force (" + fu + ")", "x", "y", "drag", "lift"}
	}
	for _, r := range rows {
		cells := []string{r.name, f(r.v[0]), f(r.v[1])}
		if dim == 3 {
			cells = append(cells, f(r.v[2]))
		}
		if axes != nil {
			cells = append(cells, f(dot(r.v, axes.Drag)), f(dot(r.v, axes.Lift)))
			if dim == 3 {
				cells = append(cells, f(dot(r.v, axes.Side)))
			}
		}
		t.add(cells...)
	}
	t.write(w)
	return maxAbs(all)
}

// windAxes returns a when hasWind, else nil: the wind axes exist only for
// a non-zero freestream.
func windAxes(hasWind bool, a *integrate.Axes) *integrate.Axes {
	if !hasWind {
		return nil
	}
	return a
}

// maxAbs returns the largest |x| over v (0 for an empty v).
func maxAbs(v []float64) float64 {
	m := 0.0
	for _, x := range v {
		m = math.Max(m, math.Abs(x))
	}
	return m
}

func dot(a, b [3]float64) float64 { return a[0]*b[0] + a[1]*b[1] + a[2]*b[2] }

// vecE formats a small vector in exponent notation.
func vecE(v [3]float64) string { return fmt.Sprintf("(%.2g, %.2g, %.2g)", v[0], v[1], v[2]) }

// csvHeader lists the columns of the forces CSV, one row per surface.
var csvHeader = []string{
	"spec", "dim", "form", "facets", "pieces", "area", "exact_area", "area_error", "mass_imbalance",
	"force_x", "force_y", "force_z", "momentum_x", "momentum_y", "momentum_z",
	"pressure_x", "pressure_y", "pressure_z", "viscous_x", "viscous_y", "viscous_z",
	"reynolds_x", "reynolds_y", "reynolds_z", "moment_x", "moment_y", "moment_z",
	"drag", "lift", "side", "cd", "cl", "cs", "drag_counts",
}

// writeForcesCSV prints a header and one row per surface, numbers in full
// precision.
func writeForcesCSV(w io.Writer, r *forcesReport) {
	cw := csv.NewWriter(w)
	cw.Write(csvHeader)
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, s := range r.Surfaces {
		row := []string{s.Spec, strconv.Itoa(s.Dim), s.Form, strconv.Itoa(s.Facets), strconv.Itoa(s.Pieces),
			g(s.Area), g(s.ExactArea), g(s.AreaError), g(s.MassImbalance)}
		for _, v := range [][3]float64{s.Force, s.Terms.Momentum, s.Terms.Pressure, s.Terms.Viscous, s.Terms.Reynolds, s.Moment} {
			row = append(row, g(v[0]), g(v[1]), g(v[2]))
		}
		// Blank cells where the quantity is undefined (no freestream speed,
		// or no reference length/area), not zeros.
		wind, coef := make([]string, 3), make([]string, 4)
		if s.HasWind {
			wind = []string{g(s.Wind.Drag), g(s.Wind.Lift), g(s.Wind.Side)}
		}
		if s.HasCoefficients {
			coef = []string{g(s.Coefficients.Drag), g(s.Coefficients.Lift), g(s.Coefficients.Side), g(s.DragCounts)}
		}
		row = append(append(row, wind...), coef...)
		cw.Write(row)
	}
	cw.Flush()
}
