package svgplot

import (
	"bufio"
	"encoding/xml"
	"fmt"
	"io"
	"strings"
)

// WriteSVG writes the chart as a standalone SVG 1.1 document. Errors: an
// empty chart (ErrEmpty), a size too small for the panels, or the
// writer's error.
func (c *Chart) WriteSVG(w io.Writer) error {
	width, height, fr, err := c.frames()
	if err != nil {
		return err
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, `<?xml version="1.0" encoding="UTF-8"?>
<svg xmlns="http://www.w3.org/2000/svg" version="1.1" width="%d" height="%d" viewBox="0 0 %d %d" font-family="sans-serif">
`, width, height, width, height)
	if c.Title != "" {
		fmt.Fprintf(bw, "<title>%s</title>\n", esc(c.Title))
	}
	c.draw(&svgCanvas{w: bw}, width, height, fr)
	fmt.Fprintln(bw, "</svg>")
	return bw.Flush()
}

// svgCanvas writes SVG elements, coordinates rounded to 0.1 px.
type svgCanvas struct{ w io.Writer }

func (s *svgCanvas) rect(x, y, w, h float64, fill string, opacity float64) {
	op := ""
	if opacity < 1 {
		op = fmt.Sprintf(` fill-opacity="%.2f"`, opacity)
	}
	fmt.Fprintf(s.w, "<rect x=\"%.1f\" y=\"%.1f\" width=\"%.1f\" height=\"%.1f\" fill=\"%s\"%s/>\n", x, y, w, h, fill, op)
}

func (s *svgCanvas) line(x0, y0, x1, y1 float64, stroke string, width float64, dashed bool) {
	dash := ""
	if dashed {
		dash = ` stroke-dasharray="6 4"`
	}
	fmt.Fprintf(s.w, "<line x1=\"%.1f\" y1=\"%.1f\" x2=\"%.1f\" y2=\"%.1f\" stroke=\"%s\" stroke-width=\"%.1f\"%s/>\n", x0, y0, x1, y1, stroke, width, dash)
}

func (s *svgCanvas) circle(x, y, r float64, fill string) {
	fmt.Fprintf(s.w, "<circle cx=\"%.1f\" cy=\"%.1f\" r=\"%.1f\" fill=\"%s\"/>\n", x, y, r, fill)
}

// labels is true: SVG carries all text.
func (s *svgCanvas) labels() bool { return true }

func (s *svgCanvas) text(x, y float64, t, anchor string, size float64, vertical, _ bool) {
	rot := ""
	if vertical {
		rot = fmt.Sprintf(` transform="rotate(-90 %.1f %.1f)"`, x, y)
	}
	fmt.Fprintf(s.w, "<text x=\"%.1f\" y=\"%.1f\" font-size=\"%.0f\" text-anchor=\"%s\"%s>%s</text>\n", x, y, size, anchor, rot, esc(t))
}

// esc escapes text for XML character data and attributes.
func esc(s string) string {
	var b strings.Builder
	xml.EscapeText(&b, []byte(s))
	return b.String()
}
