// Package svgplot draws small line charts (stacked panels sharing an x
// axis, with reference lines and shaded bands) as SVG, or as PNG through a
// simple rasteriser, using the standard library only.
//
// It is hand-written rather than built on a plotting library to keep the
// dependency footprint of the command small: farforce needs one kind of
// chart (force against control-surface size), which a few hundred lines
// draw completely.
package svgplot

import (
	"errors"
	"fmt"
	"math"
	"strconv"
)

// Chart is a figure of one or more panels stacked vertically, sharing the
// x axis (labelled XLabel under the last panel). Width and Height are in
// pixels; zero takes 720 wide and 260 per panel plus the title.
type Chart struct {
	Title  string
	XLabel string
	Panels []Panel
	Width  int
	Height int
}

// Panel is one plot area: data series drawn as lines with markers,
// horizontal reference lines and shaded bands, with YLabel beside the y
// axis. MinSpan, when positive, is the least y range shown (centred on
// the data), so that values equal to rounding plot as a flat line rather
// than as magnified noise.
type Panel struct {
	YLabel  string
	Series  []Series
	Lines   []HLine
	Bands   []Band
	MinSpan float64
}

// Series is a sequence of points joined by straight lines, with a marker
// on each point. Color is an SVG colour "#rrggbb" (empty: the palette).
type Series struct {
	Name  string
	X, Y  []float64
	Color string
}

// HLine is a horizontal reference line at Y across the whole panel.
type HLine struct {
	Y      float64
	Label  string
	Color  string
	Dashed bool
}

// Band is a shaded rectangle [X0, X1] × [Y0, Y1] drawn under the data.
type Band struct {
	X0, X1, Y0, Y1 float64
	Label          string
	Color          string
}

// palette colours series and lines that do not name a colour.
var palette = []string{"#1f5fa8", "#c0392b", "#2e8b57", "#8e44ad", "#d35400"}

// ErrEmpty is returned for a chart with no panel or a panel without any
// finite value to draw.
var ErrEmpty = errors.New("svgplot: nothing to draw")

// layout fixes pixel sizes and margins.
const (
	marginLeft   = 86
	marginRight  = 24
	marginTop    = 40
	marginBottom = 52
	panelGap     = 34
	defaultWidth = 720
	panelHeight  = 260
	markerRadius = 3.5
	fontSize     = 12
)

// frame is a panel's data range mapped to its pixel rectangle.
type frame struct {
	x0, x1, y0, y1     float64 // data range
	left, top, w, h    float64 // pixels
	xticks, yticks     []float64
	xfmt, yfmt         func(float64) string
	panel              *Panel
	first, last, index int
}

func (f *frame) px(x float64) float64 { return f.left + (x-f.x0)/(f.x1-f.x0)*f.w }
func (f *frame) py(y float64) float64 { return f.top + f.h - (y-f.y0)/(f.y1-f.y0)*f.h }

// frames computes the data ranges and pixel rectangles of every panel.
func (c *Chart) frames() (w, h int, fr []frame, err error) {
	if len(c.Panels) == 0 {
		return 0, 0, nil, ErrEmpty
	}
	w, h = c.Width, c.Height
	if w <= 0 {
		w = defaultWidth
	}
	if h <= 0 {
		h = marginTop + marginBottom + len(c.Panels)*panelHeight + (len(c.Panels)-1)*panelGap
	}
	ph := float64(h-marginTop-marginBottom-(len(c.Panels)-1)*panelGap) / float64(len(c.Panels))
	if ph < 40 || w < marginLeft+marginRight+40 {
		return 0, 0, nil, fmt.Errorf("svgplot: size %d×%d too small for %d panels", w, h, len(c.Panels))
	}
	xlo, xhi := math.Inf(1), math.Inf(-1)
	for i := range c.Panels {
		p := &c.Panels[i]
		for _, s := range p.Series {
			for _, x := range s.X {
				xlo, xhi = extend(xlo, xhi, x)
			}
		}
		for _, b := range p.Bands {
			xlo, xhi = extend(xlo, xhi, b.X0)
			xlo, xhi = extend(xlo, xhi, b.X1)
		}
	}
	if xlo > xhi {
		return 0, 0, nil, ErrEmpty
	}
	xlo, xhi = pad(xlo, xhi)
	xt := ticks(xlo, xhi, 7)
	for i := range c.Panels {
		p := &c.Panels[i]
		ylo, yhi := math.Inf(1), math.Inf(-1)
		for _, s := range p.Series {
			for _, y := range s.Y {
				ylo, yhi = extend(ylo, yhi, y)
			}
		}
		for _, l := range p.Lines {
			ylo, yhi = extend(ylo, yhi, l.Y)
		}
		for _, b := range p.Bands {
			ylo, yhi = extend(ylo, yhi, b.Y0)
			ylo, yhi = extend(ylo, yhi, b.Y1)
		}
		if ylo > yhi {
			return 0, 0, nil, ErrEmpty
		}
		if d := p.MinSpan - (yhi - ylo); d > 0 {
			ylo, yhi = ylo-d/2, yhi+d/2
		}
		ylo, yhi = pad(ylo, yhi)
		yt := ticks(ylo, yhi, 6)
		fr = append(fr, frame{
			x0: xlo, x1: xhi, y0: ylo, y1: yhi,
			left: marginLeft, top: marginTop + float64(i)*(ph+panelGap), w: float64(w - marginLeft - marginRight), h: ph,
			xticks: xt, yticks: yt, xfmt: tickFormat(xt), yfmt: tickFormat(yt), panel: p,
			first: boolInt(i == 0), last: boolInt(i == len(c.Panels)-1), index: i,
		})
	}
	return w, h, fr, nil
}

func boolInt(b bool) int {
	if b {
		return 1
	}
	return 0
}

// extend widens [lo, hi] to hold v when v is finite.
func extend(lo, hi, v float64) (float64, float64) {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return lo, hi
	}
	return math.Min(lo, v), math.Max(hi, v)
}

// pad adds 8 % of the range on both sides; a zero range becomes ±5 % of
// the value (or ±1 around zero).
func pad(lo, hi float64) (float64, float64) {
	d := hi - lo
	if d <= 1e-12*math.Max(math.Abs(lo), math.Abs(hi)) {
		m := 0.05 * math.Max(math.Abs(lo), math.Abs(hi))
		if m == 0 {
			m = 1
		}
		return lo - m, hi + m
	}
	return lo - 0.08*d, hi + 0.08*d
}

// ticks returns about n round tick values (1, 2 or 5 times a power of ten
// apart) inside [lo, hi].
func ticks(lo, hi float64, n int) []float64 {
	raw := (hi - lo) / float64(n)
	p := math.Pow(10, math.Floor(math.Log10(raw)))
	step := p
	for _, m := range []float64{1, 2, 5, 10} {
		if m*p >= raw {
			step = m * p
			break
		}
	}
	var t []float64
	for k := math.Ceil(lo / step); k*step <= hi+1e-9*step; k++ {
		v := k * step
		if math.Abs(v) < 1e-9*step {
			v = 0
		}
		t = append(t, v)
	}
	return t
}

// tickFormat returns a formatter with just enough decimals to tell the
// ticks apart.
func tickFormat(t []float64) func(float64) string {
	if len(t) < 2 {
		return func(v float64) string { return strconv.FormatFloat(v, 'g', 4, 64) }
	}
	step := t[1] - t[0]
	big := math.Max(math.Abs(t[0]), math.Abs(t[len(t)-1]))
	if big >= 1e6 || big < 1e-4 {
		return func(v float64) string { return strconv.FormatFloat(v, 'g', 3, 64) }
	}
	dec := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	return func(v float64) string { return strconv.FormatFloat(v, 'f', dec, 64) }
}

// pick returns c or the palette colour k.
func pick(c string, k int) string {
	if c != "" {
		return c
	}
	return palette[k%len(palette)]
}
