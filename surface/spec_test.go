package surface

import (
	"errors"
	"reflect"
	"strings"
	"testing"

	"farforce/field"
)

// TestParseSpec checks every shape word, the optional keys and the
// round trip String → ParseSpec.
func TestParseSpec(t *testing.T) {
	cases := []struct {
		spec string
		want Shape
	}{
		{"sphere center=1,2,3 radius=0.5", Sphere{Center: [3]float64{1, 2, 3}, Radius: 0.5}},
		{"Sphere  radius=2e-1   center=0,0,-1.5 facets=5000", Sphere{Center: [3]float64{0, 0, -1.5}, Radius: 0.2, Res: Resolution{Facets: 5000}}},
		{"box min=-1,-2,-3 max=1,2,3", Box{Min: [3]float64{-1, -2, -3}, Max: [3]float64{1, 2, 3}}},
		{"box min=-1,-2,-3 max=1,2,3 rotate=0,0,30 size=0.1", Box{Min: [3]float64{-1, -2, -3}, Max: [3]float64{1, 2, 3}, Rotate: [3]float64{0, 0, 30}, Res: Resolution{Size: 0.1}}},
		{"cylinder center=0,0,0 axis=0,1,0 radius=1 length=4", Cylinder{Axis: [3]float64{0, 1, 0}, Radius: 1, Length: 4}},
		{"circle center=0.5,0 radius=3", Circle{Center: [2]float64{0.5, 0}, Radius: 3}},
		{"rect min=-1,-1 max=2,1 facets=40", Rect{Min: [2]float64{-1, -1}, Max: [2]float64{2, 1}, Res: Resolution{Facets: 40}}},
		// Clockwise input becomes counter-clockwise; the closing point is dropped.
		{"polygon points=0,0;0,1;1,1;1,0;0,0", PolygonShape{Points: [][2]float64{{0, 0}, {1, 0}, {1, 1}, {0, 1}}}},
		{"file path=wing.vtk scale=2", FileSurface{Path: "wing.vtk", Scale: 2}},
	}
	for _, tc := range cases {
		got, err := ParseSpec(tc.spec)
		if err != nil {
			t.Errorf("%q: %v", tc.spec, err)
			continue
		}
		if !reflect.DeepEqual(got, tc.want) {
			t.Errorf("%q: got %#v, want %#v", tc.spec, got, tc.want)
		}
		back, err := ParseSpec(got.String())
		if err != nil || !reflect.DeepEqual(back, got) {
			t.Errorf("%q: String %q does not round-trip: %v, %#v", tc.spec, got.String(), err, back)
		}
	}
}

// TestParseSpecErrors checks that every kind of mistake gets a
// *SpecError naming the key and what was expected.
func TestParseSpecErrors(t *testing.T) {
	cases := []struct{ spec, key, msg string }{
		{"", "", "empty spec"},
		{"ball center=0,0,0 radius=1", "", `unknown shape "ball"`},
		{"sphere center=0,0,0", "radius", "missing"},
		{"sphere center=0,0 radius=1", "center", "expected 3 numbers"},
		{"sphere center=0,0,x radius=1", "center", `"x" is not a finite number`},
		{"sphere center=0,0,0 radius=-1", "radius", "not positive"},
		{"sphere center=0,0,0 radius=NaN", "radius", "not a finite number"},
		{"sphere center=0,0,0 radius=1 colour=red", "colour", "unknown key"},
		{"sphere center=0,0,0 radius=1 radius=2", "radius", "given twice"},
		{"sphere center=0,0,0 radius=1 facets=10 size=0.1", "facets", "not both"},
		{"sphere center=0,0,0 radius=1 facets=1.5", "facets", "whole number"},
		{"sphere center=0,0,0 radius", "", "not key=value"},
		{"box min=0,0,0 max=1,0,1", "max", "must exceed"},
		{"cylinder center=0,0,0 axis=0,0,0 radius=1 length=1", "axis", "zero vector"},
		{"rect min=0,0 max=1,1,1", "max", "expected 2 numbers"},
		{"polygon points=0,0;1,0", "points", "at least 3"},
		{"polygon points=0,0;1,1;1,0;0,1", "points", "intersect"},
		{"polygon points=0,0;1,0;2,0", "points", "must be simple"}, // folds back on itself
		{"file path=", "path", "empty"},
		{"file path=a.vtk scale=0", "scale", "not positive"},
	}
	for _, tc := range cases {
		_, err := ParseSpec(tc.spec)
		var se *SpecError
		if !errors.As(err, &se) {
			t.Errorf("%q: got %v, want a *SpecError", tc.spec, err)
			continue
		}
		if se.Key != tc.key || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("%q: got key %q, error %q; want key %q containing %q", tc.spec, se.Key, err, tc.key, tc.msg)
		}
	}
}

// TestScale checks Scaled on every shape: areas scale by k² (k in 2D) and
// the pivot stays put.
func TestScale(t *testing.T) {
	for _, s := range allShapes(t) {
		k := 1.7
		s2 := Scale(s, k)
		want := s.ExactArea() * k * k
		if s.Dim() == 2 {
			want = s.ExactArea() * k
		}
		if d := s2.ExactArea() - want; d*d > 1e-24*want*want {
			t.Errorf("%s scaled by %g: area %g, want %g", s, k, s2.ExactArea(), want)
		}
		if p, q := s.Pivot(), s2.Pivot(); norm(sub(p, q)) > 1e-12 {
			t.Errorf("%s: pivot moved from %v to %v", s, p, q)
		}
	}
}

// TestFileSurfaceErrors checks that open, non-manifold and mixed surfaces
// are refused with the point numbers at fault.
func TestFileSurfaceErrors(t *testing.T) {
	open := cubeZone()
	open.Types, open.Offsets, open.Conn = open.Types[:6], open.Offsets[:7], open.Conn[:open.Offsets[6]]
	mixed := cubeZone()
	mixed.AddCell(field.Line, 0, 1)
	vol := &field.Zone{Points: []float64{0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0, 1}}
	vol.AddCell(field.Tetra, 0, 1, 2, 3)
	nonManifold := cubeZone()
	nonManifold.AddCell(field.Triangle, 0, 1, 2) // a third facet on edge 0-1
	cases := []struct {
		z   *field.Zone
		msg string
	}{
		{open, "used by 1 facets"},
		{mixed, "either lines (2D) or polygons (3D)"},
		{vol, "a surface needs triangles"},
		{nonManifold, "used by 3 facets"},
		{&field.Zone{}, "no line or polygon cells"},
	}
	for _, tc := range cases {
		_, err := FileSurface{Path: "x.vtk"}.Load(tc.z)
		if err == nil || !strings.Contains(err.Error(), tc.msg) || !strings.Contains(err.Error(), "x.vtk") {
			t.Errorf("got %v, want an error about x.vtk containing %q", err, tc.msg)
		}
	}
	if _, err := (FileSurface{Path: "y.vtk"}).Tessellate(nil, 0); !errors.Is(err, ErrNotLoaded) {
		t.Errorf("unloaded file surface: got %v, want ErrNotLoaded", err)
	}
}
