package main

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"

	"farforce/integrate"
)

// wakeSchema versions the JSON report of wake; see inspectSchema.
const wakeSchema = "farforce.wake/1"

// wakeReport is what wake prints: the setup, then one integrate.WakeResult
// per plane (its drags, each with key, name, formula, value and
// coefficient; the momentum Result; flags; the crossflow analysis).
type wakeReport struct {
	Schema string                 `json:"schema"`
	Setup  setupReport            `json:"setup"`
	Gamma  float64                `json:"gamma"`
	Span   float64                `json:"span"`
	Planes []integrate.WakeResult `json:"planes"`
	Notice string                 `json:"notice"`
}

// writeWakeText prints the setup, one block per plane and the notice.
func writeWakeText(w io.Writer, r *wakeReport) {
	var first *integrate.Result
	if len(r.Planes) > 0 {
		first = &r.Planes[0].Momentum
	}
	writeSetupOf(w, &r.Setup, first)
	if r.Gamma > 0 {
		fmt.Fprintf(w, "  ratio of specific heats γ  %s (compressible analyses on; pressures taken as absolute)\n", num(r.Gamma))
	}
	for i := range r.Planes {
		fmt.Fprintln(w)
		writePlaneText(w, i+1, &r.Planes[i])
	}
	fmt.Fprintf(w, "\n%s\n", notice)
}

// writePlaneText prints the drag table of one plane, its crossflow
// figures and its flags.
func writePlaneText(w io.Writer, k int, p *integrate.WakeResult) {
	fu, _, measure := units(p.Dim)
	fmt.Fprintf(w, "Plane %d: %s\n", k, p.Spec)
	fmt.Fprintf(w, "  %s %s, quadrature points %d\n", measure, num(p.Area), p.Points)
	vals := make([]float64, len(p.Drags))
	for i, d := range p.Drags {
		vals[i] = d.Value
	}
	f := fixedFormatter(vals...)
	t := table{header: []string{"figure", "formula", "drag (" + fu + ")", "coefficient"}, align: "llrr"}
	for _, d := range p.Drags {
		c := ""
		if d.HasCoefficient {
			c = strconv.FormatFloat(d.Coefficient, 'g', 6, 64)
		}
		t.add(d.Name, d.Formula, f(d.Value), c)
	}
	t.write(w)
	if cf := p.Crossflow; cf != nil {
		fmt.Fprintf(w, "  Crossflow grid %d×%d (spacing %s × %s m)\n", cf.Grid[0], cf.Grid[1], num(cf.H[0]), num(cf.H[1]))
		fmt.Fprintf(w, "    Maskell parts: vorticity ½ρ∬ψξ %s, sources −½ρ∬φσ %s %s\n", num(cf.MaskellVortex), num(cf.MaskellSource), fu)
		fmt.Fprintf(w, "    dipole tail estimate %s %s, net circulation %s m²/s, net source %s m²/s\n", num(cf.Tail), fu, num(cf.NetCirculation), num(cf.NetSource))
		fmt.Fprintf(w, "    lift ρU∞∫Γdy %s %s, peak Γ %s m²/s\n", num(cf.Lift), fu, num(peakLoading(cf)))
		how := "given"
		if cf.SpanEstimated {
			how = "estimated from the loading"
		}
		fmt.Fprintf(w, "    span %s m (%s), span efficiency e = L²/(π q∞ b² Di) %s\n", num(cf.Span), how, num(cf.SpanEfficiency))
		if cf.HasCoefficients {
			fmt.Fprintf(w, "    C_L %s, C_Di %s, aspect ratio b²/S %s\n", num(cf.CL), num(cf.CDi), num(cf.AR))
		}
	}
	for _, fl := range p.Flags {
		fmt.Fprintf(w, "  warning: %s\n", fl)
	}
}

// peakLoading returns the largest |Γ| of the loading.
func peakLoading(cf *integrate.CrossflowResult) float64 {
	var m float64
	for _, l := range cf.Loading {
		m = math.Max(m, math.Abs(l.Gamma))
	}
	return m
}

// writeWakeCSV prints one row per figure of every plane, numbers in full
// precision, blank coefficients when there is no reference.
func writeWakeCSV(w io.Writer, r *wakeReport) {
	cw := csv.NewWriter(w)
	cw.Write([]string{"plane", "key", "name", "formula", "value", "coefficient"})
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, p := range r.Planes {
		for _, d := range p.Drags {
			c := ""
			if d.HasCoefficient {
				c = g(d.Coefficient)
			}
			cw.Write([]string{p.Spec, d.Key, d.Name, d.Formula, g(d.Value), c})
		}
		if cf := p.Crossflow; cf != nil {
			cw.Write([]string{p.Spec, "lift", "lift from the loading", "ρU∞∫Γdy", g(cf.Lift), ""})
			cw.Write([]string{p.Spec, "span_efficiency", "span efficiency", "L²/(π q∞ b² Di)", g(cf.SpanEfficiency), ""})
		}
	}
	cw.Flush()
}
