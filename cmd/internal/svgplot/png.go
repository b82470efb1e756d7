package svgplot

import (
	"image"
	"image/color"
	"image/png"
	"io"
	"math"
	"strconv"
)

// WritePNG writes the chart as a PNG image drawn by a simple rasteriser:
// lines are stamped with round pens, bands are blended, markers filled.
// Tick numbers are written with a small built-in bitmap font; titles,
// axis labels and the legend are left out (use SVG for a labelled figure).
// Errors as WriteSVG.
func (c *Chart) WritePNG(w io.Writer) error {
	width, height, fr, err := c.frames()
	if err != nil {
		return err
	}
	cv := &pngCanvas{img: image.NewRGBA(image.Rect(0, 0, width, height))}
	c.draw(cv, width, height, fr)
	return png.Encode(w, cv.img)
}

// pngCanvas rasterises onto an RGBA image.
type pngCanvas struct{ img *image.RGBA }

// parseColor reads "#rrggbb"; anything else is black.
func parseColor(s string) color.RGBA {
	if len(s) == 7 && s[0] == '#' {
		if v, err := strconv.ParseUint(s[1:], 16, 32); err == nil {
			return color.RGBA{uint8(v >> 16), uint8(v >> 8), uint8(v), 255}
		}
	}
	return color.RGBA{0, 0, 0, 255}
}

// blend paints pixel (x, y) with c at opacity a.
func (p *pngCanvas) blend(x, y int, c color.RGBA, a float64) {
	if !(image.Point{x, y}.In(p.img.Rect)) {
		return
	}
	o := p.img.RGBAAt(x, y)
	mix := func(f, b uint8) uint8 { return uint8(math.Round(a*float64(f) + (1-a)*float64(b))) }
	p.img.SetRGBA(x, y, color.RGBA{mix(c.R, o.R), mix(c.G, o.G), mix(c.B, o.B), 255})
}

func (p *pngCanvas) rect(x, y, w, h float64, fill string, opacity float64) {
	c := parseColor(fill)
	for j := int(math.Round(y)); j < int(math.Round(y+h)); j++ {
		for i := int(math.Round(x)); i < int(math.Round(x+w)); i++ {
			p.blend(i, j, c, opacity)
		}
	}
}

// disc fills a disc of radius r about (x, y).
func (p *pngCanvas) disc(x, y, r float64, c color.RGBA) {
	for j := int(math.Floor(y - r)); j <= int(math.Ceil(y+r)); j++ {
		for i := int(math.Floor(x - r)); i <= int(math.Ceil(x+r)); i++ {
			dx, dy := float64(i)+0.5-x, float64(j)+0.5-y
			if dx*dx+dy*dy <= r*r {
				p.blend(i, j, c, 1)
			}
		}
	}
}

// line stamps a pen of the given width every half pixel along the
// segment; dashed lines draw 6 px and skip 4.
func (p *pngCanvas) line(x0, y0, x1, y1 float64, stroke string, width float64, dashed bool) {
	c := parseColor(stroke)
	n := int(math.Ceil(2*math.Hypot(x1-x0, y1-y0))) + 1
	r := math.Max(width/2, 0.75) // at least one pixel wide whatever the position
	for k := 0; k <= n; k++ {
		t := float64(k) / float64(n)
		if dashed && math.Mod(t*math.Hypot(x1-x0, y1-y0), 10) >= 6 {
			continue
		}
		p.disc(x0+t*(x1-x0), y0+t*(y1-y0), r, c)
	}
}

func (p *pngCanvas) circle(x, y, r float64, fill string) { p.disc(x, y, r, parseColor(fill)) }

// labels is false: the PNG canvas writes numbers only.
func (p *pngCanvas) labels() bool { return false }

// text writes tick numbers with the 3×5 font at twice its size; other
// text is skipped.
func (p *pngCanvas) text(x, y float64, s, anchor string, _ float64, vertical, number bool) {
	if !number || vertical {
		return
	}
	const px, adv = 2, 8 // pixel size, advance per glyph
	wdt := float64(len(s)*adv - 2)
	switch anchor {
	case "middle":
		x -= wdt / 2
	case "end":
		x -= wdt
	}
	ink := color.RGBA{0x33, 0x33, 0x33, 255}
	top := int(math.Round(y)) - 5*px
	for k, r := range s {
		g, ok := glyphs[r]
		if !ok {
			continue
		}
		left := int(math.Round(x)) + k*adv
		for row := 0; row < 5; row++ {
			for col := 0; col < 3; col++ {
				if g[row]&(4>>col) == 0 {
					continue
				}
				for dy := 0; dy < px; dy++ {
					for dx := 0; dx < px; dx++ {
						p.blend(left+col*px+dx, top+row*px+dy, ink, 1)
					}
				}
			}
		}
	}
}

// glyphs is a 3×5 bitmap font for numbers: five rows of three bits, the
// high bit on the left.
var glyphs = map[rune][5]uint8{
	'0': {7, 5, 5, 5, 7}, '1': {2, 6, 2, 2, 7}, '2': {7, 1, 7, 4, 7}, '3': {7, 1, 7, 1, 7},
	'4': {5, 5, 7, 1, 1}, '5': {7, 4, 7, 1, 7}, '6': {7, 4, 7, 5, 7}, '7': {7, 1, 1, 1, 1},
	'8': {7, 5, 7, 5, 7}, '9': {7, 5, 7, 1, 7}, '.': {0, 0, 0, 0, 2}, '-': {0, 0, 7, 0, 0},
	'+': {0, 2, 7, 2, 0}, 'e': {0, 7, 7, 4, 7},
}
