package main

import (
	"fmt"
	"io"
	"strings"
)

// writeCheckText prints the summary of a case run: the solution, the near
// field, one line per surface, the verdict of each sweep, and the gates.
func writeCheckText(w io.Writer, r *caseRun) {
	fmt.Fprintf(w, "Case %s\n", r.Case)
	fu, _, _ := units(r.Setup.Dimension)
	fmt.Fprintf(w, "Solution: %s (%dD)\n", strings.Join(r.Setup.Files, ", "), r.Setup.Dimension)
	coef := r.coefficients()
	if r.Near != nil {
		n := r.Near
		src := "wall file " + n.File
		switch n.Source {
		case "wall patches":
			src = "wall patches " + strings.Join(n.Patches, ", ")
		case "volume mesh":
			src = "mesh boundary inside " + n.Inside
		}
		if coef {
			fmt.Fprintf(w, "Near field (%s): C_D %s (pressure %s, friction %s), C_L %s\n", src,
				fixed(n.Coefficients.Drag, 6), fixed(n.PressureCoefficients.Drag, 6), fixed(n.FrictionCoefficients.Drag, 6), fixed(n.Coefficients.Lift, 6))
		} else {
			fmt.Fprintf(w, "Near field (%s): drag %s %s, lift %s %s\n", src, num(n.Wind.Drag), fu, num(n.Wind.Lift), fu)
		}
	}
	if len(r.Surfaces) > 0 {
		fmt.Fprintln(w, "\nSurfaces")
		t := &table{header: []string{"name", "spec", "drag (" + fu + ")", "lift (" + fu + ")", "mass imbalance"}, align: "ll"}
		if coef {
			t.header = []string{"name", "spec", "C_D", "C_L", "mass imbalance"}
		}
		if r.Near != nil {
			t.header = append(t.header, "far - near")
		}
		for _, s := range r.Surfaces {
			d, l := num(s.Wind.Drag), num(s.Wind.Lift)
			if coef {
				d, l = fixed(s.Coefficients.Drag, 6), fixed(s.Coefficients.Lift, 6)
			}
			row := []string{s.Name, s.Spec, d, l, fmt.Sprintf("%.2e", s.MassImbalance)}
			if s.NearFar != nil {
				if coef {
					row = append(row, fixed(s.NearFar.DragCounts, 1)+" counts")
				} else {
					row = append(row, pct(s.NearFar.DragPercent, r.Near)+" %")
				}
			}
			t.add(row...)
		}
		t.write(w)
	}
	for _, s := range r.Sweeps {
		fmt.Fprintln(w)
		writeSweepBody(w, s, r.Near)
	}
	fmt.Fprintln(w, "\nGates")
	if len(r.Gates) == 0 {
		fmt.Fprintln(w, "  (none: the case file has no [[gate]])")
	}
	for _, g := range r.Gates {
		status := "PASS"
		if !g.Passed {
			status = "FAIL"
		}
		fmt.Fprintf(w, "  %s  %s\n", status, g.Name)
		for _, ch := range g.Checks {
			mark := "ok  "
			if !ch.Passed {
				mark = "fail"
			}
			fmt.Fprintf(w, "        %s %s\n", mark, ch.Text)
		}
	}
	fmt.Fprintf(w, "\nResult: %d of %d gates passed\n", len(r.Gates)-r.Failed, len(r.Gates))
	fmt.Fprintf(w, "\n%s\n", notice)
}
