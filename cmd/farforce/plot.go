package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"farforce/cmd/internal/svgplot"
)

// checkPlotName accepts an empty name or one ending in .svg or .png.
func checkPlotName(name string) error {
	if name == "" {
		return nil
	}
	switch strings.ToLower(filepath.Ext(name)) {
	case ".svg", ".png":
		return nil
	}
	return fmt.Errorf("--plot %q: the file name must end in .svg or .png", name)
}

// writePlot writes chart to path atomically, as SVG or PNG by the
// extension. Errors (an unwritable folder) are bad input.
func writePlot(path string, chart *svgplot.Chart) error {
	write := chart.WriteSVG
	if strings.EqualFold(filepath.Ext(path), ".png") {
		write = chart.WritePNG
	}
	return inputErr(writeFileAtomic(path, func(w io.Writer) error { return write(w) }))
}

// sweepChart draws drag and lift of a sweep against the scale factor: the
// members, the plateau band (mean ± half-range over the plateau's scales)
// and, when near is given, the near-field value as a dashed line.
func sweepChart(s *sweepResult, near *nearReport, dim int) *svgplot.Chart {
	fu, _, _ := units(dim)
	dl, ll := "drag ("+fu+")", "lift ("+fu+")"
	if s.coefficients() {
		dl, ll = "drag coefficient C_D", "lift coefficient C_L"
	}
	var xs, ds, ls []float64
	for i := range s.Members {
		d, l := memberValues(s, &s.Members[i])
		xs, ds, ls = append(xs, s.Members[i].Scale), append(ds, d), append(ls, l)
	}
	p := s.Plateau
	drag := svgplot.Panel{YLabel: dl,
		Series: []svgplot.Series{{Name: "far field, per member", X: xs, Y: ds}},
		Bands:  []svgplot.Band{{X0: p.FirstScale, X1: p.LastScale, Y0: p.Drag - p.DragSpread, Y1: p.Drag + p.DragSpread, Label: fmt.Sprintf("plateau (%d members)", p.Members)}},
	}
	lift := svgplot.Panel{YLabel: ll,
		Series: []svgplot.Series{{Name: "far field, per member", X: xs, Y: ls}},
		Bands:  []svgplot.Band{{X0: p.FirstScale, X1: p.LastScale, Y0: p.Lift - p.LiftSpread, Y1: p.Lift + p.LiftSpread, Label: "plateau"}},
	}
	// Show at least the agreement band of the verdict, so that drag or
	// lift equal to rounding (a non-lifting body) plots flat.
	drag.MinSpan, lift.MinSpan = 2*s.Verdict.Band, 2*s.Verdict.Band
	if near != nil {
		nd, nl := near.Wind.Drag, near.Wind.Lift
		if s.coefficients() {
			nd, nl = near.Coefficients.Drag, near.Coefficients.Lift
		}
		drag.Lines = []svgplot.HLine{{Y: nd, Label: "near field", Dashed: true}}
		lift.Lines = []svgplot.HLine{{Y: nl, Label: "near field", Dashed: true}}
	}
	title := "Force against control-surface size: " + s.Base
	if s.Name != "" {
		title = s.Name + ": " + s.Base
	}
	return &svgplot.Chart{Title: title, XLabel: "scale factor of the control surface", Panels: []svgplot.Panel{drag, lift}}
}
