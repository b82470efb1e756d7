package svgplot

import (
	"bytes"
	"encoding/xml"
	"image/png"
	"strings"
	"testing"
)

func testChart() *Chart {
	return &Chart{
		Title:  "drag & lift",
		XLabel: "scale",
		Panels: []Panel{
			{YLabel: "C_D", Series: []Series{{Name: "far field", X: []float64{1, 1.5, 2}, Y: []float64{5.58, 5.59, 5.585}}},
				Lines: []HLine{{Y: 5.56, Label: "near field", Dashed: true}},
				Bands: []Band{{X0: 1, X1: 2, Y0: 5.58, Y1: 5.59, Label: "plateau"}}},
			{YLabel: "C_L", Series: []Series{{X: []float64{1, 1.5, 2}, Y: []float64{0.01, 0.011, 0.0105}}}},
		},
	}
}

// TestSVGWellFormed parses the SVG back with encoding/xml and counts the
// elements the chart must hold.
func TestSVGWellFormed(t *testing.T) {
	var b bytes.Buffer
	if err := testChart().WriteSVG(&b); err != nil {
		t.Fatal(err)
	}
	dec := xml.NewDecoder(&b)
	count := map[string]int{}
	for {
		tok, err := dec.Token()
		if err != nil {
			if err.Error() != "EOF" {
				t.Fatalf("SVG not well formed: %v", err)
			}
			break
		}
		if se, ok := tok.(xml.StartElement); ok {
			count[se.Name.Local]++
		}
	}
	if count["svg"] != 1 || count["circle"] < 6 || count["rect"] < 2 {
		t.Errorf("element counts %v: want one svg, ≥ 6 markers, a background and a band", count)
	}
}

func TestSVGEscapesText(t *testing.T) {
	var b bytes.Buffer
	if err := testChart().WriteSVG(&b); err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(b.String(), "drag &amp; lift") {
		t.Error("title not escaped")
	}
}

// TestPNG decodes the image and checks its size and that the series
// colour was painted.
func TestPNG(t *testing.T) {
	var b bytes.Buffer
	c := testChart()
	if err := c.WritePNG(&b); err != nil {
		t.Fatal(err)
	}
	img, err := png.Decode(&b)
	if err != nil {
		t.Fatal(err)
	}
	want := marginTop + marginBottom + 2*panelHeight + panelGap
	if r := img.Bounds(); r.Dx() != defaultWidth || r.Dy() != want {
		t.Errorf("size %v, want %d×%d", r, defaultWidth, want)
	}
	blue := 0
	for y := 0; y < img.Bounds().Dy(); y++ {
		for x := 0; x < img.Bounds().Dx(); x++ {
			r, g, bl, _ := img.At(x, y).RGBA()
			if r>>8 == 0x1f && g>>8 == 0x5f && bl>>8 == 0xa8 {
				blue++
			}
		}
	}
	if blue < 50 {
		t.Errorf("%d pixels of the series colour, want the line and markers", blue)
	}
}

func TestEmpty(t *testing.T) {
	var b bytes.Buffer
	if err := (&Chart{}).WriteSVG(&b); err == nil {
		t.Error("empty chart accepted")
	}
	if err := (&Chart{Panels: []Panel{{}}}).WritePNG(&b); err == nil {
		t.Error("panel without data accepted")
	}
}

func TestTicks(t *testing.T) {
	got := ticks(0.93, 2.07, 7)
	want := []float64{1, 1.2, 1.4, 1.6, 1.8, 2}
	if len(got) != len(want) {
		t.Fatalf("ticks %v, want %v", got, want)
	}
	f := tickFormat(got)
	for i := range want {
		if d := got[i] - want[i]; d > 1e-12 || d < -1e-12 {
			t.Errorf("tick %d = %g, want %g", i, got[i], want[i])
		}
	}
	if f(1.2) != "1.2" || f(2) != "2.0" {
		t.Errorf("format %q %q", f(1.2), f(2))
	}
}

// TestMinSpan: rounding noise plots flat when the panel sets a least span.
func TestMinSpan(t *testing.T) {
	c := &Chart{Panels: []Panel{{Series: []Series{{X: []float64{1, 2, 3}, Y: []float64{1e-17, -2e-17, 3e-17}}}, MinSpan: 1e-4}}}
	_, _, fr, err := c.frames()
	if err != nil {
		t.Fatal(err)
	}
	if d := fr[0].y1 - fr[0].y0; d < 1e-4 {
		t.Errorf("y range %g, want at least 1e-4", d)
	}
}
