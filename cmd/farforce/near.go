package main

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/pflag"

	"farforce/field"
	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// nearFlags select the near-field (body surface) force that wall, forces,
// sweep and check compare against: a wall surface file, or the boundary of
// the volume mesh inside a given surface.
type nearFlags struct {
	wall         string // wall surface file
	pressure     string // its pressure array
	pressureCoef bool   // the pressure array holds C_p
	shear        string // its wall-shear traction array
	skinFriction string // or its skin-friction coefficient array
	insidePoint  string // a point inside the body, for open walls
	inside       string // surface spec enclosing the body's boundary faces
	noBCWall     bool   // ignore the wall patches of ffcg files
}

// define registers the near-field flags on fs.
func (n *nearFlags) define(fs *pflag.FlagSet) {
	fs.StringVar(&n.wall, "wall", "", "near field from the wall surface `FILE` (VTK POLYDATA: polygons in 3D, lines in 2D)")
	fs.StringVar(&n.pressure, "wall-pressure", "", "pressure array `NAME` of the wall file (Pa; default: guessed)")
	fs.BoolVar(&n.pressureCoef, "wall-pressure-coefficient", false, "the wall pressure array holds C_p = (p - p∞)/q∞")
	fs.StringVar(&n.shear, "wall-shear", "", "wall shear traction array `NAME` τ·n, n out of the body (Pa; default: guessed)")
	fs.StringVar(&n.skinFriction, "skin-friction", "", "skin-friction coefficient vector array `NAME` (τ·n/q∞) instead of --wall-shear")
	fs.StringVar(&n.insidePoint, "wall-inside-point", "", "a point `X,Y,Z` inside the body, to orient a wall that is not closed")
	fs.StringVar(&n.inside, "inside", "", "near field from the volume mesh: its boundary faces enclosed by the surface `SPEC`")
	fs.BoolVar(&n.noBCWall, "no-bc-wall", false, "do not take the near field from the BCWall patches of an ffcg file")
}

// given reports whether a near-field source was selected by flag.
func (n *nearFlags) given() bool { return n.wall != "" || n.inside != "" }

// active reports whether a near field is to be computed for the prepared
// field p: a source was selected by flag, or p's files carry wall patches
// (BCWall and its variants) and --no-bc-wall is not given.
func (n *nearFlags) active(p *preparedFlow) bool {
	return n.given() || (!n.noBCWall && len(p.info.walls()) > 0)
}

// check validates the near-field flags that need no data.
func (n *nearFlags) check() error {
	if n.wall != "" && n.inside != "" {
		return errors.New("give either --wall FILE or --inside SPEC for the near field, not both")
	}
	if n.wall == "" && (n.pressure != "" || n.shear != "" || n.skinFriction != "" || n.pressureCoef || n.insidePoint != "") {
		return errors.New("--wall-pressure, --wall-shear, --skin-friction, --wall-pressure-coefficient and --wall-inside-point need --wall FILE")
	}
	if n.shear != "" && n.skinFriction != "" {
		return errors.New("give either --wall-shear or --skin-friction, not both")
	}
	if n.insidePoint != "" {
		if _, err := parseVector("wall-inside-point", n.insidePoint, true); err != nil {
			return err
		}
	}
	return nil
}

// nearReport is a near-field force with where it came from. The embedded
// integrate.NearResult gives the numbers (pressure, friction, force,
// coefficients, ...).
type nearReport struct {
	// Source is "wall file", "volume mesh" or "wall patches".
	Source string `json:"source"`
	File   string `json:"file,omitempty"`
	Inside string `json:"inside,omitempty"`
	// Patches names the BC patches of the files used as the wall (source
	// "wall patches").
	Patches []string `json:"patches,omitempty"`
	// Arrays are the wall file's arrays used (pressure, shear or
	// skin_friction).
	Arrays map[string]string `json:"arrays,omitempty"`
	Notes  []string          `json:"notes"`
	integrate.NearResult
}

// Array names tried, in order, when the wall arrays are not given
// (case-insensitive).
var (
	wallPressureNames = []string{"pressure", "p", "static_pressure"}
	wallCpNames       = []string{"cp", "pressure_coefficient"}
	wallShearNames    = []string{"wall_shear_stress", "wallshearstress", "wall_shear", "tau_w", "wss", "traction"}
	wallCfNames       = []string{"cf", "skin_friction", "skin_friction_coefficient", "skinfriction"}
)

// findArray returns the name of the first array of z matching one of
// names, case-insensitively.
func findArray(z *field.Zone, names []string) string {
	for _, want := range names {
		for _, a := range z.Arrays {
			if strings.EqualFold(a.Name, want) {
				return a.Name
			}
		}
	}
	return ""
}

// wallOptions returns the wall arrays to integrate from the flags, guessing
// the ones not given from the array names of z; notes say what was
// guessed.
func (n *nearFlags) wallOptions(z *field.Zone) (integrate.WallOptions, []string, error) {
	w := integrate.WallOptions{Pressure: n.pressure, PressureCoefficient: n.pressureCoef, Traction: n.shear, SkinFriction: n.skinFriction}
	var notes []string
	if n.insidePoint != "" {
		p, _ := parseVector("wall-inside-point", n.insidePoint, true)
		w.Inside = &p
	}
	if w.Pressure == "" {
		if w.Pressure = findArray(z, wallPressureNames); w.Pressure == "" {
			if w.Pressure = findArray(z, wallCpNames); w.Pressure != "" {
				w.PressureCoefficient = true
			}
		}
		if w.Pressure != "" {
			what := "pressure"
			if w.PressureCoefficient {
				what = "pressure coefficient"
			}
			notes = append(notes, fmt.Sprintf("wall %s: array %q (guessed; --wall-pressure overrides)", what, w.Pressure))
		}
	}
	if w.Traction == "" && w.SkinFriction == "" {
		if w.Traction = findArray(z, wallShearNames); w.Traction != "" {
			notes = append(notes, fmt.Sprintf("wall shear traction: array %q (guessed; --wall-shear overrides)", w.Traction))
		} else if w.SkinFriction = findArray(z, wallCfNames); w.SkinFriction != "" {
			notes = append(notes, fmt.Sprintf("skin friction coefficient: array %q (guessed; --skin-friction overrides)", w.SkinFriction))
		}
	}
	if w.Pressure == "" && w.Traction == "" && w.SkinFriction == "" {
		var names []string
		for _, a := range z.Arrays {
			names = append(names, a.Name)
		}
		return w, nil, fmt.Errorf("wall file: no pressure or wall-shear array found among [%s]: name them with --wall-pressure and --wall-shear (or --skin-friction)", strings.Join(names, ", "))
	}
	if w.Pressure == "" {
		notes = append(notes, "no pressure array: the near field holds friction only")
	}
	if w.Traction == "" && w.SkinFriction == "" {
		notes = append(notes, "no wall-shear or skin-friction array: the near field holds pressure only")
	}
	return w, notes, nil
}

// fromWall integrates the wall file with the integration options opt.
func (n *nearFlags) fromWall(opt integrate.Options) (*nearReport, error) {
	f, err := loadField([]string{n.wall}, readers.Options{Workers: opt.Workers})
	if err != nil {
		return nil, err
	}
	return n.fromWallField(f, opt)
}

// fromWallField integrates f, the field read from the wall file, with the
// integration options opt.
func (n *nearFlags) fromWallField(f *field.Field, opt integrate.Options) (*nearReport, error) {
	if len(f.Zones) != 1 {
		return nil, inputErr(fmt.Errorf("wall file %s holds %d zones, want one surface", n.wall, len(f.Zones)))
	}
	z := f.Zones[0]
	w, notes, err := n.wallOptions(z)
	if err != nil {
		return nil, inputErr(fmt.Errorf("%s: %w", n.wall, err))
	}
	res, err := integrate.NearField(z, w, opt)
	if err != nil {
		return nil, inputErr(fmt.Errorf("wall file %s: %w", n.wall, err))
	}
	arrays := map[string]string{}
	for k, v := range map[string]string{"pressure": w.Pressure, "shear": w.Traction, "skin_friction": w.SkinFriction} {
		if v != "" {
			arrays[k] = v
		}
	}
	if res.Open > 0 {
		notes = append(notes, fmt.Sprintf("%d of %d wall parts are not closed: oriented away from %s", res.Open, res.Parts, insideText(w.Inside)))
	}
	return &nearReport{Source: "wall file", File: n.wall, Arrays: arrays, Notes: notes, NearResult: res}, nil
}

func insideText(p *[3]float64) string {
	if p == nil {
		return "each open part's centroid (give --wall-inside-point to choose)"
	}
	return vec(*p)
}

// fromVolume integrates p and τ of the prepared volume field over its
// boundary faces enclosed by the --inside surface.
func (n *nearFlags) fromVolume(p *preparedFlow) (*nearReport, error) {
	if _, err := surface.ParseSpec(n.inside); err != nil {
		return nil, usageErr("farforce", "--inside %q: %v", n.inside, err)
	}
	s, err := parseShape("farforce", n.inside) // loads a file surface
	if err != nil {
		return nil, err
	}
	f := p.loc.Field()
	in, err := newInsideTest(s, p.loc.Dim())
	if err != nil {
		return nil, inputErr(fmt.Errorf("--inside %q: %w", n.inside, err))
	}
	faces, err := field.BoundaryFaces(f, in)
	if err != nil {
		return nil, inputErr(err)
	}
	if len(faces) == 0 {
		return nil, inputErr(fmt.Errorf("--inside %q encloses no boundary face of the mesh: it must surround the body's wall and no other boundary", n.inside))
	}
	res, err := integrate.NearFieldVolume(p.loc, p.flow, faces, p.opt)
	if err != nil {
		return nil, inputErr(fmt.Errorf("near field on the mesh boundary inside %q: %w", n.inside, err))
	}
	notes := []string{fmt.Sprintf("%d boundary faces inside %s; p and τ from the adjacent cells (one-sided gradients)", len(faces), s)}
	return &nearReport{Source: "volume mesh", Inside: s.String(), Notes: notes, NearResult: res}, nil
}

// compute returns the selected near field for the prepared volume field p
// (nil when none was selected).
func (n *nearFlags) compute(p *preparedFlow) (*nearReport, error) {
	switch {
	case n.wall != "":
		return n.fromWall(p.opt)
	case n.inside != "":
		return n.fromVolume(p)
	case n.active(p):
		return n.fromPatches(p)
	}
	return nil, nil
}

// fromPatches integrates p and τ of the prepared volume field over the
// faces of its files' wall patches, taken from the adjacent cells as
// fromVolume does.
func (n *nearFlags) fromPatches(p *preparedFlow) (*nearReport, error) {
	walls := p.info.walls()
	faces, missing, err := patchFaces(p.loc.Field(), walls)
	if err != nil {
		return nil, inputErr(err)
	}
	if len(faces) == 0 {
		return nil, inputErr(fmt.Errorf("wall patches %s: none of their faces is a boundary face of a fluid cell (--no-bc-wall skips the near field)", patchNames(walls)))
	}
	res, err := integrate.NearFieldVolume(p.loc, p.flow, faces, p.opt)
	if err != nil {
		return nil, inputErr(fmt.Errorf("near field on the wall patches %s: %w (--no-bc-wall skips it)", patchNames(walls), err))
	}
	names := make([]string, len(walls))
	for i, w := range walls {
		names[i] = w.Name
	}
	notes := []string{fmt.Sprintf("%d faces of the wall patches %s; p and τ from the adjacent cells (one-sided gradients); --wall, --inside or --no-bc-wall choose otherwise", len(faces), patchNames(walls))}
	if missing > 0 {
		notes = append(notes, fmt.Sprintf("%d patch faces are not boundary faces of a fluid cell (blanked or interior) and were left out", missing))
	}
	return &nearReport{Source: "wall patches", Patches: names, Notes: notes, NearResult: res}, nil
}

// newInsideTest returns the inside test of shape s (its Contains method)
// for a field of dimension dim.
func newInsideTest(s surface.Shape, dim int) (func(p [3]float64) bool, error) {
	if s.Dim() != dim {
		return nil, fmt.Errorf("the shape is %dD but the field is %dD", s.Dim(), dim)
	}
	c, ok := s.(interface{ Contains(p [3]float64) bool })
	if !ok {
		return nil, fmt.Errorf("shape %s has no inside test", s)
	}
	return c.Contains, nil
}
