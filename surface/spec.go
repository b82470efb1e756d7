package surface

import (
	"fmt"
	"maps"
	"math"
	"slices"
	"strconv"
	"strings"
)

// SpecError is a problem with a surface spec: the spec, the key at fault
// (empty for the shape word) and what was wrong.
type SpecError struct {
	Spec string
	Key  string
	Msg  string
}

// Error returns "surface spec "...": key: message".
func (e *SpecError) Error() string {
	if e.Key == "" {
		return fmt.Sprintf("surface spec %q: %s", e.Spec, e.Msg)
	}
	return fmt.Sprintf("surface spec %q: %s: %s", e.Spec, e.Key, e.Msg)
}

// shapeKeys lists the required and optional keys of each shape word.
var shapeKeys = map[string]struct{ required, optional []string }{
	"sphere":   {[]string{"center", "radius"}, nil},
	"box":      {[]string{"min", "max"}, []string{"rotate"}},
	"cylinder": {[]string{"center", "axis", "radius", "length"}, nil},
	"circle":   {[]string{"center", "radius"}, nil},
	"rect":     {[]string{"min", "max"}, nil},
	"polygon":  {[]string{"points"}, nil},
	"file":     {[]string{"path"}, []string{"scale"}},
}

// ParseSpec reads a shape from a one-line spec: a shape word, then
// key=value fields separated by spaces, vectors written as comma-separated
// numbers (polygon points separated by semicolons):
//
//	sphere center=X,Y,Z radius=R
//	box min=X,Y,Z max=X,Y,Z [rotate=AX,AY,AZ]   (degrees, about x then y then z)
//	cylinder center=X,Y,Z axis=X,Y,Z radius=R length=L
//	circle center=X,Y radius=R
//	rect min=X,Y max=X,Y
//	polygon points=X,Y;X,Y;X,Y[;...]
//	file path=P [scale=K]
//
// Any shape may add facets=N (approximate total facet count) or size=H
// (facet edge length), not both. A file spec returns an unloaded
// *FileSurface value: the caller reads P and calls its Load method.
// Lengths are in metres. Errors are *SpecError values naming the key and
// what was expected: unknown shape word, unknown, repeated or missing key,
// a bad number or a wrong vector length, a non-positive size.
func ParseSpec(spec string) (Shape, error) {
	fields := strings.Fields(spec)
	if len(fields) == 0 {
		return nil, &SpecError{spec, "", "empty spec; expected a shape word (" + shapeWords() + ")"}
	}
	word := strings.ToLower(fields[0])
	keys, ok := shapeKeys[word]
	if !ok {
		return nil, &SpecError{spec, "", fmt.Sprintf("unknown shape %q; expected one of %s", fields[0], shapeWords())}
	}
	allowed := append(append(append([]string(nil), keys.required...), keys.optional...), "facets", "size")
	vals := make(map[string]string)
	for _, f := range fields[1:] {
		k, v, ok := strings.Cut(f, "=")
		if !ok || k == "" {
			return nil, &SpecError{spec, "", fmt.Sprintf("field %q is not key=value", f)}
		}
		k = strings.ToLower(k)
		if !contains(allowed, k) {
			return nil, &SpecError{spec, k, fmt.Sprintf("unknown key for %s; expected one of %s", word, strings.Join(allowed, ", "))}
		}
		if _, dup := vals[k]; dup {
			return nil, &SpecError{spec, k, "given twice"}
		}
		vals[k] = v
	}
	for _, k := range keys.required {
		if _, ok := vals[k]; !ok {
			return nil, &SpecError{spec, k, "missing; " + word + " needs " + strings.Join(keys.required, ", ")}
		}
	}
	p := parser{spec: spec, vals: vals}
	res := p.resolution()
	var s Shape
	switch word {
	case "sphere":
		s = Sphere{Center: p.vec3("center"), Radius: p.positive("radius"), Res: res}
	case "box":
		b := Box{Min: p.vec3("min"), Max: p.vec3("max"), Res: res}
		if _, ok := vals["rotate"]; ok {
			b.Rotate = p.vec3("rotate")
		}
		for i := 0; i < 3 && p.err == nil; i++ {
			if !(b.Max[i] > b.Min[i]) {
				p.fail("max", fmt.Sprintf("coordinate %d (%g) must exceed min's (%g)", i+1, b.Max[i], b.Min[i]))
			}
		}
		s = b
	case "cylinder":
		c := Cylinder{Center: p.vec3("center"), Axis: p.vec3("axis"), Radius: p.positive("radius"), Length: p.positive("length"), Res: res}
		if p.err == nil && c.Axis == [3]float64{} {
			p.fail("axis", "must not be the zero vector")
		}
		s = c
	case "circle":
		s = Circle{Center: p.vec2("center"), Radius: p.positive("radius"), Res: res}
	case "rect":
		r := Rect{Min: p.vec2("min"), Max: p.vec2("max"), Res: res}
		for i := 0; i < 2 && p.err == nil; i++ {
			if !(r.Max[i] > r.Min[i]) {
				p.fail("max", fmt.Sprintf("coordinate %d (%g) must exceed min's (%g)", i+1, r.Max[i], r.Min[i]))
			}
		}
		s = r
	case "polygon":
		pts := p.points("points")
		if p.err == nil {
			poly, err := NewPolygon(pts, res)
			if err != nil {
				p.fail("points", err.Error())
			}
			s = poly
		}
	case "file":
		f := FileSurface{Path: vals["path"], Res: res}
		if f.Path == "" {
			p.fail("path", "empty; expected a file name")
		}
		if _, ok := vals["scale"]; ok {
			f.Scale = p.positive("scale")
		}
		s = f
	}
	if p.err != nil {
		return nil, p.err
	}
	return s, nil
}

// shapeWords lists the shape keywords in sorted order, for messages.
func shapeWords() string {
	return strings.Join(slices.Sorted(maps.Keys(shapeKeys)), ", ")
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

// parser converts the values of a spec, keeping the first error.
type parser struct {
	spec string
	vals map[string]string
	err  *SpecError
}

func (p *parser) fail(key, msg string) {
	if p.err == nil {
		p.err = &SpecError{p.spec, key, msg}
	}
}

// numbers parses a comma-separated list of want finite numbers.
func (p *parser) numbers(key, text string, want int, what string) []float64 {
	parts := strings.Split(text, ",")
	if len(parts) != want {
		p.fail(key, fmt.Sprintf("%q has %d numbers; expected %s", text, len(parts), what))
		return make([]float64, want)
	}
	out := make([]float64, want)
	for i, s := range parts {
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			p.fail(key, fmt.Sprintf("%q is not a finite number; expected %s", s, what))
			return out
		}
		out[i] = v
	}
	return out
}

func (p *parser) vec3(key string) [3]float64 {
	v := p.numbers(key, p.vals[key], 3, "3 numbers X,Y,Z")
	return [3]float64{v[0], v[1], v[2]}
}

func (p *parser) vec2(key string) [2]float64 {
	v := p.numbers(key, p.vals[key], 2, "2 numbers X,Y")
	return [2]float64{v[0], v[1]}
}

func (p *parser) positive(key string) float64 {
	v := p.numbers(key, p.vals[key], 1, "a positive number")[0]
	if p.err == nil && !(v > 0) {
		p.fail(key, fmt.Sprintf("%g is not positive; expected a positive number", v))
	}
	return v
}

func (p *parser) points(key string) [][2]float64 {
	var pts [][2]float64
	for _, s := range strings.Split(strings.TrimSuffix(p.vals[key], ";"), ";") {
		v := p.numbers(key, s, 2, "points X,Y separated by ';'")
		pts = append(pts, [2]float64{v[0], v[1]})
	}
	return pts
}

func (p *parser) resolution() Resolution {
	var r Resolution
	fs, hasF := p.vals["facets"]
	_, hasS := p.vals["size"]
	if hasF && hasS {
		p.fail("facets", "give facets= or size=, not both")
		return r
	}
	if hasF {
		n, err := strconv.Atoi(fs)
		if err != nil || n < 1 || n > MaxFacets {
			p.fail("facets", fmt.Sprintf("%q is not a whole number from 1 to %d", fs, MaxFacets))
		}
		r.Facets = n
	}
	if hasS {
		r.Size = p.positive("size")
	}
	return r
}
