package main

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"farforce/integrate"
)

// sweepSchema versions the JSON report of sweep; see inspectSchema.
const sweepSchema = "farforce.sweep/1"

// sweepReport is what sweep prints: the setup, the near field (if any),
// the members with the verdict (members, plateau, drift, verdict,
// near_far) and the notice.
type sweepReport struct {
	Schema string      `json:"schema"`
	Setup  setupReport `json:"setup"`
	Near   *nearReport `json:"near,omitempty"`
	*sweepResult
	Notice string `json:"notice"`
}

// writeSweepText prints the setup, the near field, the members and the
// verdict.
func writeSweepText(w io.Writer, r *sweepReport) {
	var first *integrate.Result
	if len(r.Members) > 0 {
		first = &r.Members[0].Result
	}
	writeSetupOf(w, &r.Setup, first)
	if r.Near != nil {
		fmt.Fprintln(w)
		writeNearText(w, r.Near)
	}
	fmt.Fprintln(w)
	writeSweepBody(w, r.sweepResult, r.Near)
	fmt.Fprintf(w, "\n%s\n", notice)
}

// writeSweepBody prints the member table and the verdict of one sweep.
func writeSweepBody(w io.Writer, s *sweepResult, near *nearReport) {
	title := "Sweep"
	if s.Name != "" {
		title += " " + s.Name
	}
	fmt.Fprintf(w, "%s: %s scaled about %s, %d members\n", title, s.Base, vec(s.Pivot), len(s.Members))
	coef := s.coefficients()
	fu, _, _ := units(dimOf(s))
	dname, lname := "drag ("+fu+")", "lift ("+fu+")"
	if coef {
		dname, lname = "C_D", "C_L"
	}
	t := &table{header: []string{"scale", "facets", "mass imbalance", dname, lname}}
	if coef {
		t.header = append(t.header, "counts")
	}
	if near != nil {
		t.header = append(t.header, "far - near (%)")
		if coef {
			t.header = append(t.header, "far - near (counts)")
		}
	}
	var vals []float64
	for _, m := range s.Members {
		d, l := memberValues(s, &m)
		vals = append(vals, d, l)
	}
	f := fixedFormatter(vals...)
	for i, m := range s.Members {
		d, l := memberValues(s, &m)
		mark := " "
		if i >= s.Plateau.First && i <= s.Plateau.Last && s.Plateau.First <= s.Plateau.Last {
			mark = "*"
		}
		row := []string{num(m.Scale) + mark, strconv.Itoa(m.Facets), fmt.Sprintf("%.2e", m.MassImbalance), f(d), f(l)}
		if coef {
			row = append(row, fixed(m.DragCounts, 1))
		}
		if m.NearFar != nil {
			row = append(row, pct(m.NearFar.DragPercent, near))
			if coef {
				row = append(row, fixed(m.NearFar.DragCounts, 1))
			}
		}
		t.add(row...)
	}
	t.write(w)
	fmt.Fprintln(w, "  (* plateau members)")
	writeVerdictText(w, s, near, f)
}

// dimOf returns the dimension of the sweep's surfaces.
func dimOf(s *sweepResult) int {
	if len(s.Members) == 0 {
		return 3
	}
	return s.Members[0].Dim
}

// memberValues returns the drag and lift of m in the verdict's quantity.
func memberValues(s *sweepResult, m *sweepMember) (drag, lift float64) {
	if s.coefficients() {
		return m.Coefficients.Drag, m.Coefficients.Lift
	}
	return m.Wind.Drag, m.Wind.Lift
}

// writeVerdictText prints the plateau, drift, mass trend, near-field
// comparison with near (nil: none) and the notes of a sweep; f formats
// drag and lift values.
func writeVerdictText(w io.Writer, s *sweepResult, near *nearReport, f func(float64) string) {
	v, p, d := &s.Verdict, &s.Plateau, &s.Drift
	what := "drag"
	if s.coefficients() {
		what = "C_D"
	}
	fmt.Fprintln(w, "\nVerdict")
	t := &table{header: []string{"agreement band", "±" + num(v.Band) + " (members agree when drag and lift each span at most this)"}, align: "ll"}
	t.add("plateau", fmt.Sprintf("members %d to %d of %d (scale %s to %s)", p.First+1, p.Last+1, v.Members, num(p.FirstScale), num(p.LastScale)))
	dl, ll := "drag", "lift"
	if s.coefficients() {
		dl, ll = "C_D", "C_L"
	}
	t.add("  "+dl, f(p.Drag)+" ± "+f(p.DragSpread)+countsText(s, p.DragSpread))
	t.add("  "+ll, f(p.Lift)+" ± "+f(p.LiftSpread))
	flag := "not flagged"
	if d.Flagged {
		flag = "FLAGGED"
		if d.Settling {
			flag = "flagged, settling with size"
		}
	}
	t.add("drift of "+what, fmt.Sprintf("%.4g per unit scale (± %.2g), change %.4g across the sweep, scatter %.3g: %s",
		d.DragSlope, d.DragSlopeErr, d.Change, d.Scatter, flag))
	t.add("mass closure", fmt.Sprintf("imbalance trend %.3g per unit scale; correlation with drag %.2f", v.MassTrend, v.MassDragCorrelation))
	if s.NearFar != nil {
		if s.coefficients() {
			t.add("plateau - near field", fmt.Sprintf("ΔC_D %s (%s counts, %s %%), ΔC_L %s",
				fixed(s.NearFar.Drag, 6), fixed(s.NearFar.DragCounts, 1), pctOf(s.NearFar.DragPercent), fixed(s.NearFar.Lift, 6)))
		} else {
			t.add("plateau - near field", fmt.Sprintf("Δdrag %s (%s %%), Δlift %s", num(s.NearFar.Drag), pctOf(s.NearFar.DragPercent), num(s.NearFar.Lift)))
		}
	}
	t.write(w)
	for _, n := range v.Notes {
		fmt.Fprintln(w)
		fmt.Fprint(w, wrap(n, 76, "  "))
	}
}

// countsText returns " (N counts)" for a coefficient spread.
func countsText(s *sweepResult, spread float64) string {
	if !s.coefficients() {
		return ""
	}
	return " (" + fixed(1e4*spread, 1) + " counts)"
}

// wrap breaks text into lines of at most width runes (words are never
// split), each starting with indent.
func wrap(text string, width int, indent string) string {
	var b strings.Builder
	line := indent
	for _, word := range strings.Fields(text) {
		if len([]rune(line))+1+len([]rune(word)) > width && line != indent {
			b.WriteString(line + "\n")
			line = indent
		}
		if line != indent {
			line += " "
		}
		line += word
	}
	if line != indent {
		b.WriteString(line + "\n")
	}
	return b.String()
}

// writeSweepCSV prints the CSV of forces (see writeForcesCSV) with the
// scale factor as first column and, with a near field, far − near columns.
func writeSweepCSV(w io.Writer, r *sweepReport) error {
	fr := &forcesReport{Setup: r.Setup}
	for _, m := range r.Members {
		fr.Surfaces = append(fr.Surfaces, m.Result)
	}
	scale := func(i int) []string { return []string{strconv.FormatFloat(r.Members[i].Scale, 'g', -1, 64)} }
	if r.Near == nil {
		return writeForcesCSVWith(w, fr, []string{"scale"}, scale, nil, nil)
	}
	return writeForcesCSVWith(w, fr, []string{"scale"}, scale, nearDiffHeader, func(i int) []string { return nearDiffCells(r.Members[i].NearFar) })
}
