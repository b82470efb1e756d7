package main

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io"
	"strconv"
	"strings"

	"farforce/integrate"
)

// forcesNearReport is the JSON of forces with a near field: the forces
// report plus the near field and, per surface, far − near.
type forcesNearReport struct {
	*forcesReport
	Near    *nearReport                   `json:"near"`
	NearFar []integrate.NearFarDifference `json:"near_far"`
}

// printForcesWithNear computes the near field selected by n for the
// prepared field p and prints the forces report rep with it: the near
// field block and far − near per surface (text), the near and near_far
// fields (JSON), or four far − near columns (CSV). The forces command
// calls it instead of its own printing when --wall or --inside is given.
func (n *nearFlags) printForcesWithNear(e *env, p *preparedFlow, rep *forcesReport, asJSON, asCSV bool) error {
	near, err := n.compute(p)
	if err != nil {
		return err
	}
	full := &forcesNearReport{forcesReport: rep, Near: near}
	for _, s := range rep.Surfaces {
		full.NearFar = append(full.NearFar, integrate.CompareNearFar(s, near.NearResult))
	}
	return writeReport(e, full, asJSON, asCSV,
		func(w io.Writer) error { return writeForcesNearCSV(w, full) },
		func(w io.Writer) { writeForcesNearText(w, full) })
}

// writeForcesNearText prints the forces report of r, then its near field
// and far − near per surface, then the notice.
func writeForcesNearText(w io.Writer, r *forcesNearReport) {
	var buf bytes.Buffer
	writeForcesText(&buf, r.forcesReport)
	fmt.Fprint(w, strings.TrimSuffix(buf.String(), "\n"+notice+"\n"))
	fmt.Fprintln(w)
	writeNearText(w, r.Near)
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Far field against near field")
	for i, d := range r.NearFar {
		writeNearFarText(w, fmt.Sprintf("surface %d", i+1), d, r.Near, r.Surfaces[i].HasCoefficients && r.Near.HasCoefficients)
	}
	fmt.Fprintf(w, "\n%s\n", notice)
}

// nearDiffHeader names the far − near CSV columns.
var nearDiffHeader = []string{"near_diff_drag", "near_diff_lift", "near_diff_counts", "near_diff_percent"}

// nearDiffCells returns the far − near CSV cells of d.
func nearDiffCells(d *integrate.NearFarDifference) []string {
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	percent := "" // undefined: see integrate.DragPercentDefined
	if d.HasDragPercent {
		percent = g(d.DragPercent)
	}
	return []string{g(d.Wind.Drag), g(d.Wind.Lift), g(d.DragCounts), percent}
}

// writeForcesNearCSV prints the forces CSV with the far − near columns.
func writeForcesNearCSV(w io.Writer, r *forcesNearReport) error {
	return writeForcesCSVWith(w, r.forcesReport, nil, nil, nearDiffHeader, func(i int) []string { return nearDiffCells(&r.NearFar[i]) })
}

// writeForcesCSVWith prints the forces CSV of rep (writeForcesCSV) with
// extra columns: lead before and tail after its own, the cells of surface
// i given by leadRow(i) and tailRow(i) (nil: none).
func writeForcesCSVWith(w io.Writer, rep *forcesReport, lead []string, leadRow func(int) []string, tail []string, tailRow func(int) []string) error {
	var buf bytes.Buffer
	writeForcesCSV(&buf, rep)
	rows, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		return err
	}
	cw := csv.NewWriter(w)
	for i, row := range rows {
		var out []string
		if i == 0 {
			out = append(append(append(out, lead...), row...), tail...)
		} else {
			if leadRow != nil {
				out = append(out, leadRow(i-1)...)
			}
			out = append(out, row...)
			if tailRow != nil {
				out = append(out, tailRow(i-1)...)
			}
		}
		if err := cw.Write(out); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
