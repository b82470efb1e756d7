package main

import (
	"fmt"
	"io"
	"maps"
	"slices"
	"strings"
	"text/tabwriter"

	"farforce/field"
)

// writeInspectText prints the inspect report as aligned plain-text tables.
func writeInspectText(w io.Writer, r *inspectReport) {
	fmt.Fprintf(w, "Solution: %s\n\n", strings.Join(r.Files, ", "))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	dim := "3D"
	if r.Dimension == 2 {
		dim = "2D (all points share one z: forces are per unit span)"
	}
	fmt.Fprintf(tw, "  dimension\t%s\n", dim)
	fmt.Fprintf(tw, "  zones\t%d\n", len(r.Zones))
	fmt.Fprintf(tw, "  points\t%d\n", r.Points)
	fmt.Fprintf(tw, "  cells\t%d\t%s\n", r.Cells, cellTypeList(r.CellTypes))
	if r.Blanked > 0 {
		fmt.Fprintf(tw, "  blanked cells\t%d\t(not fluid)\n", r.Blanked)
	}
	if b := r.Bounds; b != nil {
		for k, axis := range []string{"x", "y", "z"} {
			fmt.Fprintf(tw, "  %s range\t%s .. %s\n", axis, num(b.Min[k]), num(b.Max[k]))
		}
	}
	tw.Flush()

	if len(r.Zones) > 1 {
		fmt.Fprintln(w, "\nZones")
		t := &table{header: []string{"#", "name", "points", "cells", "blanked", "cell types"}, align: "rlrrrl"}
		for i, z := range r.Zones {
			t.add(fmt.Sprint(i), z.Name, fmt.Sprint(z.Points), fmt.Sprint(z.Cells), fmt.Sprint(z.Blanked), cellTypeList(z.CellTypes))
		}
		t.write(w)
	}

	fmt.Fprintln(w, "\nArrays")
	if len(r.Arrays) == 0 {
		fmt.Fprintln(w, "  (none)")
	} else {
		t := &table{header: []string{"name", "at", "components", "min", "max", "NaN", "Inf"}, align: "llrrrrr"}
		for _, a := range r.Arrays {
			t.add(a.Name, a.Location, fmt.Sprint(a.Components), numPtr(a.Min), numPtr(a.Max), fmt.Sprint(a.NaN), fmt.Sprint(a.Inf))
			for k := range a.ComponentMin {
				t.add(fmt.Sprintf("  %s[%d]", a.Name, k), "", "", numPtr(a.ComponentMin[k]), numPtr(a.ComponentMax[k]))
			}
		}
		t.write(w)
	}

	fmt.Fprintln(w, "\nFlow mapping guessed from the array names (the forces flags override it)")
	for _, n := range r.Notes {
		fmt.Fprintf(w, "  %s\n", n)
	}

	writeInspectCase(w, r)

	fmt.Fprintln(w, "\nWarnings")
	if len(r.Warnings) == 0 {
		fmt.Fprintln(w, "  none")
	}
	for _, s := range r.Warnings {
		fmt.Fprintf(w, "  %s\n", s)
	}
}

// cellTypeList formats counts by cell type in the field's type order, e.g.
// "quad 1536, triangle 12".
func cellTypeList(counts map[string]int) string {
	var parts []string
	for t := field.Vertex; t <= field.Pyramid; t++ {
		if n := counts[t.String()]; n > 0 {
			parts = append(parts, fmt.Sprintf("%s %d", t, n))
		}
	}
	return strings.Join(parts, ", ")
}

// num formats a number for tables: up to 6 significant digits.
func num(v float64) string { return fmt.Sprintf("%.6g", v) }

func numPtr(v *float64) string {
	if v == nil {
		return "-"
	}
	return num(*v)
}

// writeInspectCase prints the ReferenceState and BC patches of ffcg files
// (nothing for files without them).
func writeInspectCase(w io.Writer, r *inspectReport) {
	if len(r.Reference) > 0 {
		fmt.Fprintln(w, "\nReferenceState (fills the freestream and references no flag sets)")
		t := &table{header: []string{"quantity", "value"}, align: "lr"}
		for _, k := range slices.Sorted(maps.Keys(r.Reference)) {
			t.add(k, num(r.Reference[k]))
		}
		t.write(w)
	}
	if len(r.Patches) > 0 {
		fmt.Fprintln(w, "\nBC patches")
		t := &table{header: []string{"name", "type", "zone", "faces", "points", "role"}, align: "llrrrl"}
		for _, p := range r.Patches {
			t.add(p.Name, p.Type, fmt.Sprint(p.Zone), fmt.Sprint(p.Faces), fmt.Sprint(p.Points), p.Role)
		}
		t.write(w)
	}
}
