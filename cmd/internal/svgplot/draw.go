package svgplot

import "math"

// canvas is what a chart is drawn on: pixel coordinates, y down.
type canvas interface {
	rect(x, y, w, h float64, fill string, opacity float64)
	line(x0, y0, x1, y1 float64, stroke string, width float64, dashed bool)
	circle(x, y, r float64, fill string)
	// text writes s at (x, y) (baseline); anchor is "start", "middle" or
	// "end"; vertical turns it 90° counter-clockwise; number says s is a
	// tick value (the PNG canvas writes only those).
	text(x, y float64, s, anchor string, size float64, vertical, number bool)
	// labels reports whether the canvas writes text other than numbers
	// (without it the legend is left out).
	labels() bool
}

// draw paints the chart on cv.
func (c *Chart) draw(cv canvas, w, h int, fr []frame) {
	cv.rect(0, 0, float64(w), float64(h), "#ffffff", 1)
	if c.Title != "" {
		cv.text(float64(w)/2, 24, c.Title, "middle", 15, false, false)
	}
	for i := range fr {
		f := &fr[i]
		p := f.panel
		// Bands under everything else.
		for k, b := range p.Bands {
			x0, x1 := f.px(math.Max(b.X0, f.x0)), f.px(math.Min(b.X1, f.x1))
			y0, y1 := f.py(math.Min(b.Y1, f.y1)), f.py(math.Max(b.Y0, f.y0))
			if y1-y0 < 2 { // keep a band of zero height visible
				m := (y0 + y1) / 2
				y0, y1 = m-1, m+1
			}
			if x1-x0 < 8 { // and one of zero width (a single member)
				m := (x0 + x1) / 2
				x0, x1 = m-4, m+4
			}
			cv.rect(x0, y0, x1-x0, y1-y0, pick(b.Color, k+2), 0.25)
		}
		// Grid and ticks.
		for _, t := range f.yticks {
			y := f.py(t)
			cv.line(f.left, y, f.left+f.w, y, "#e4e4e4", 1, false)
			cv.text(f.left-6, y+4, f.yfmt(t), "end", fontSize, false, true)
		}
		for _, t := range f.xticks {
			x := f.px(t)
			cv.line(x, f.top, x, f.top+f.h, "#e4e4e4", 1, false)
			if f.last == 1 {
				cv.text(x, f.top+f.h+16, f.xfmt(t), "middle", fontSize, false, true)
			}
		}
		// Reference lines.
		for k, l := range p.Lines {
			y := f.py(l.Y)
			col := pick(l.Color, k+1)
			cv.line(f.left, y, f.left+f.w, y, col, 1.5, l.Dashed)
			if l.Label != "" {
				cv.text(f.left+f.w-4, y-5, l.Label, "end", fontSize, false, false)
			}
		}
		// Data.
		for k, s := range p.Series {
			col := pick(s.Color, k)
			prev := false
			var px, py float64
			for j := range s.X {
				if j >= len(s.Y) || !finite(s.X[j]) || !finite(s.Y[j]) {
					prev = false
					continue
				}
				x, y := f.px(s.X[j]), f.py(s.Y[j])
				if prev {
					cv.line(px, py, x, y, col, 2, false)
				}
				px, py, prev = x, y, true
			}
			for j := range s.X {
				if j < len(s.Y) && finite(s.X[j]) && finite(s.Y[j]) {
					cv.circle(f.px(s.X[j]), f.py(s.Y[j]), markerRadius, col)
				}
			}
		}
		// Frame and labels.
		cv.line(f.left, f.top, f.left+f.w, f.top, "#444444", 1, false)
		cv.line(f.left, f.top+f.h, f.left+f.w, f.top+f.h, "#444444", 1, false)
		cv.line(f.left, f.top, f.left, f.top+f.h, "#444444", 1, false)
		cv.line(f.left+f.w, f.top, f.left+f.w, f.top+f.h, "#444444", 1, false)
		if p.YLabel != "" {
			cv.text(18, f.top+f.h/2, p.YLabel, "middle", 13, true, false)
		}
		if cv.labels() {
			c.legend(cv, f)
		}
		if f.last == 1 && c.XLabel != "" {
			cv.text(f.left+f.w/2, f.top+f.h+40, c.XLabel, "middle", 13, false, false)
		}
	}
}

// legend lists the series, lines and bands of a panel in its top-left
// corner.
func (c *Chart) legend(cv canvas, f *frame) {
	p := f.panel
	x, y := f.left+10, f.top+18
	entry := func(col, label string, kind int) {
		switch kind {
		case 0:
			cv.line(x, y-4, x+18, y-4, col, 2, false)
			cv.circle(x+9, y-4, markerRadius, col)
		case 1:
			cv.line(x, y-4, x+18, y-4, col, 1.5, true)
		default:
			cv.rect(x, y-9, 18, 10, col, 0.25)
		}
		cv.text(x+24, y, label, "start", fontSize, false, false)
		y += 16
	}
	for k, s := range p.Series {
		if s.Name != "" {
			entry(pick(s.Color, k), s.Name, 0)
		}
	}
	for k, l := range p.Lines {
		if l.Label != "" {
			entry(pick(l.Color, k+1), l.Label, 1)
		}
	}
	for k, b := range p.Bands {
		if b.Label != "" {
			entry(pick(b.Color, k+2), b.Label, 2)
		}
	}
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
