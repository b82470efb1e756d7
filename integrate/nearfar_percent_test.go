package integrate

import (
	"encoding/json"
	"math"
	"strings"
	"testing"
)

// TestDragPercentUndefined checks that far − near in percent of a
// near-field drag that is zero to rounding (potential-flow pressure on a
// symmetric body: d'Alembert's paradox, zero drag) is reported as
// undefined, "drag_percent": null in JSON, instead of a huge number, and
// that a real drag gives 100·Δdrag/|drag|.
func TestDragPercentUndefined(t *testing.T) {
	axes, _, err := windAxes(Vec3{2, 0, 0}, Vec3{}, 2)
	if err != nil {
		t.Fatal(err)
	}
	near := NearResult{HasWind: true, Axes: axes, DynamicPressure: 2, Area: 0.2,
		Force: Vec3{3e-17, 1e-17, 0}, Wind: Wind{Drag: 3e-17, Lift: 1e-17}}
	far := Result{HasWind: true, Axes: axes, Force: Vec3{0.05, 0, 0}, Wind: Wind{Drag: 0.05}}
	d := CompareNearFar(far, near)
	if d.HasDragPercent || d.DragPercent != 0 {
		t.Errorf("near drag 3e-17 N with q∞·A = 0.4 N: percent %v (defined %v), want undefined", d.DragPercent, d.HasDragPercent)
	}
	b, err := json.Marshal(d)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"drag_percent":null`) || strings.Count(string(b), "drag_percent") != 1 {
		t.Errorf("JSON %s: want one \"drag_percent\":null", b)
	}

	near.Force, near.Wind = Vec3{0.04, 0, 0}, Wind{Drag: 0.04}
	d = CompareNearFar(far, near)
	if want := 100 * 0.01 / 0.04; !d.HasDragPercent || math.Abs(d.DragPercent-want) > 1e-12 {
		t.Errorf("near drag 0.04 N, far 0.05 N: percent %v (defined %v), want %v", d.DragPercent, d.HasDragPercent, want)
	}
	b, _ = json.Marshal(d)
	if !strings.Contains(string(b), `"drag_percent":25`) {
		t.Errorf("JSON %s: want \"drag_percent\":25", b)
	}
}
