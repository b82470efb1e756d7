package main

import (
	"fmt"
	"io"
	"sort"
	"strings"

	"farforce/integrate"
)

// writeWallText prints the setup and the near-field block.
func writeWallText(w io.Writer, r *wallReport) {
	n := r.Near
	axes := windAxes(n.HasWind, &n.Axes)
	if n.Source == "wall file" {
		writeWallSetupText(w, &r.Setup, n.DynamicPressure, axes)
	} else {
		writeSetupText(w, &r.Setup, n.DynamicPressure, axes)
	}
	fmt.Fprintln(w)
	writeNearText(w, n)
	fmt.Fprintf(w, "\n%s\n", notice)
}

// writeWallSetupText echoes the constants used for a wall file integrated
// without a volume field.
func writeWallSetupText(w io.Writer, s *setupReport, q float64, axes *integrate.Axes) {
	fu, mu, _ := units(s.Dimension)
	fmt.Fprintf(w, "Wall surface: %s (%dD: forces in %s, moments in %s)\n\n", strings.Join(s.Files, ", "), s.Dimension, fu, mu)
	t := &table{header: []string{"Constants used", ""}, align: "ll"}
	fs := s.Freestream
	t.add("freestream velocity", vec(fs.Velocity)+" m/s (speed "+num(fs.Speed)+" m/s)")
	t.add("freestream density", refText(fs.Density, "kg/m³"))
	t.add("reference pressure p∞", num(fs.Pressure)+" Pa")
	t.add("dynamic pressure q∞", num(q)+" Pa")
	if s.Dimension == 2 {
		t.add("reference length", refText(s.RefLength, "m"))
	} else {
		t.add("reference area", refText(s.RefArea, "m²"))
		t.add("reference length", refText(s.RefLength, "m (moment coefficients)"))
	}
	t.add("moment centre", vec(s.MomentCenter)+" m")
	if axes != nil {
		t.add("wind axes (in mesh axes)", "drag "+vec(axes.Drag)+", lift "+vec(axes.Lift)+", side "+vec(axes.Side))
	}
	t.write(w)
}

// writeNearText prints the block of a near-field result: where it came
// from, the pressure, friction and total force in mesh and wind axes, the
// moment and the coefficients by part.
func writeNearText(w io.Writer, n *nearReport) {
	fu, mu, measure := units(n.Dim)
	switch n.Source {
	case "wall file":
		var keys []string
		for k, v := range n.Arrays {
			keys = append(keys, k+" "+v)
		}
		sort.Strings(keys)
		fmt.Fprintf(w, "Near field: wall file %s (arrays: %s)\n", n.File, strings.Join(keys, ", "))
		fmt.Fprintf(w, "  %s %s, %d facets, %d part(s) (%d open), %d facets turned to point out of the body\n",
			measure, num(n.Area), n.Facets, n.Parts, n.Open, n.Flipped)
	case "wall patches":
		fmt.Fprintf(w, "Near field: wall patches %s of the volume mesh\n", strings.Join(n.Patches, ", "))
		fmt.Fprintf(w, "  %s %s, %d faces\n", measure, num(n.Area), n.Facets)
	default:
		fmt.Fprintf(w, "Near field: boundary of the volume mesh inside %s\n", n.Inside)
		fmt.Fprintf(w, "  %s %s, %d faces\n", measure, num(n.Area), n.Facets)
	}
	for _, note := range n.Notes {
		fmt.Fprintf(w, "  note: %s\n", note)
	}
	fmt.Fprintln(w)
	writeForceTable(w, fu, n.Dim, windAxes(n.HasWind, &n.Axes), []namedForce{
		{"pressure", n.Pressure}, {"friction", n.Friction}, {"total", n.Force}})
	if n.Dim == 2 {
		fmt.Fprintf(w, "  moment M_z about %s: %s %s\n", vec(n.MomentCenter), num(n.Moment[2]), mu)
	} else {
		fmt.Fprintf(w, "  moment about %s: %s %s\n", vec(n.MomentCenter), vec(n.Moment), mu)
	}
	if !n.HasCoefficients {
		fmt.Fprintln(w, "  coefficients: none (give the freestream density and --ref-length in 2D or --ref-area in 3D)")
		return
	}
	c := &table{header: []string{"coefficient", "pressure", "friction", "total"}}
	pc, fc, tc := n.PressureCoefficients, n.FrictionCoefficients, n.Coefficients
	c.add("C_D", fixed(pc.Drag, 6), fixed(fc.Drag, 6), fixed(tc.Drag, 6))
	c.add("C_L", fixed(pc.Lift, 6), fixed(fc.Lift, 6), fixed(tc.Lift, 6))
	if n.Dim == 3 {
		c.add("C_S", fixed(pc.Side, 6), fixed(fc.Side, 6), fixed(tc.Side, 6))
	}
	fmt.Fprintln(w)
	c.write(w)
	fmt.Fprintf(w, "  drag counts %s\n", fixed(n.DragCounts, 1))
}

// pct formats a drag difference in percent of the near-field drag, or
// "n/a" when there is no percentage to give (see percentMeaningful).
func pct(p float64, near *nearReport) string {
	if !percentMeaningful(near) {
		return "n/a"
	}
	return fixed(p, 2)
}

// percentMeaningful reports whether a percentage of the near-field drag
// means something: not when the drag is zero to rounding (below 1e-9 of
// the force: a body whose force is all lift).
func percentMeaningful(near *nearReport) bool {
	return near != nil && integrate.DragPercentDefined(near.NearResult)
}

// pctOf formats an optional percentage: "n/a" when nil.
func pctOf(p *float64) string {
	if p == nil {
		return "n/a"
	}
	return fixed(*p, 2)
}

// writeNearFarText prints far minus near for one far-field value.
func writeNearFarText(w io.Writer, label string, d integrate.NearFarDifference, near *nearReport, coef bool) {
	if coef {
		fmt.Fprintf(w, "  far - near (%s): ΔC_D %s (%s counts, %s %% of the near-field drag), ΔC_L %s\n",
			label, fixed(d.Coefficients.Drag, 6), fixed(d.DragCounts, 1), pct(d.DragPercent, near), fixed(d.Coefficients.Lift, 6))
		return
	}
	fmt.Fprintf(w, "  far - near (%s): Δdrag %s, Δlift %s (%s %% of the near-field drag)\n",
		label, num(d.Wind.Drag), num(d.Wind.Lift), pct(d.DragPercent, near))
}
