package readers

import (
	"fmt"
	"slices"

	"farforce/field"
)

// finishZone assembles the field.Zone of z at its "end zone" line and
// records its BC patches.
func (p *ffcgParser) finishZone(z *ffcgZone, end keyLine) error {
	k := z.k
	out := &field.Zone{Name: z.name}
	for ax := 0; ax < p.base.physDim; ax++ {
		if z.coords[ax] == nil {
			return p.errK(k, fmt.Sprintf("%s in GridCoordinates (PhysicalDimension %d)", coordNames[ax], p.base.physDim), "none", errSyntax)
		}
	}
	out.Points = make([]float64, 3*z.nv)
	for ax := 0; ax < 3; ax++ {
		if c := z.coords[ax]; c != nil {
			for i, v := range c {
				out.Points[3*i+ax] = v
			}
		}
	}
	var cellSecs, faceSecs []*ffcgSection
	if z.structured {
		dims := [3]int{1, 1, 1}
		copy(dims[:], z.dims)
		c := structuredCells(dims)
		out.Types, out.Offsets, out.Conn = c.types, c.offsets, c.conn
	} else {
		var err error
		if cellSecs, faceSecs, err = p.splitSections(z); err != nil {
			return err
		}
		out.Offsets = []int32{0}
		if len(cellSecs) == 1 {
			s := cellSecs[0]
			out.Types, out.Offsets, out.Conn = s.types, s.offsets, s.conn
			cellSecs = nil
		}
		for _, s := range cellSecs {
			base := int32(len(out.Conn))
			out.Types = append(out.Types, s.types...)
			out.Conn = append(out.Conn, s.conn...)
			for _, o := range s.offsets[1:] {
				out.Offsets = append(out.Offsets, base+o)
			}
		}
	}
	if z.blank != nil {
		out.Blank = z.blank
	}
	out.Arrays = z.arrays
	if err := p.deriveVelocity(z, out); err != nil {
		return err
	}
	gamma, ok := p.base.ref["SpecificHeatRatio"]
	if !ok || !(gamma > 1) {
		gamma = 1.4
		if z.sawEnergy && !z.sawPressure {
			p.s.warn("zone %s: EnergyStagnationDensity without Pressure: SpecificHeatRatio 1.4 assumed (none in the ReferenceState)", z.name)
		}
	}
	p.derivePressure(out, gamma)
	// Point arrays first, then cell arrays, each in file order followed by
	// the derived velocities: the order WriteFFCG writes them in.
	slices.SortStableFunc(out.Arrays, func(a, b field.Array) int { return int(a.Location) - int(b.Location) })
	if p.opt.Arrays != nil {
		kept := out.Arrays[:0]
		for _, a := range out.Arrays {
			if p.opt.wants(a.Name) {
				kept = append(kept, a)
			}
		}
		out.Arrays = kept
	}
	if err := out.Validate(); err != nil {
		return p.errK(end, "a consistent zone", err.Error(), errSyntax)
	}
	zi := len(p.out.Zones)
	for _, bc := range z.bcs {
		pt, err := p.patch(z, out, bc, faceSecs)
		if err != nil {
			return err
		}
		pt.Zone = zi
		p.info.Patches = append(p.info.Patches, pt)
	}
	p.out.Zones = append(p.out.Zones, out)
	p.zoneBases = append(p.zoneBases, p.base.name)
	return nil
}

// splitSections orders the sections of an unstructured zone by element
// number and splits them into the cell sections (elements 1..CellSize,
// which must be covered exactly) and the boundary sections above.
func (p *ffcgParser) splitSections(z *ffcgZone) (cells, faces []*ffcgSection, err error) {
	secs := slices.Clone(z.sections)
	slices.SortStableFunc(secs, func(a, b *ffcgSection) int {
		switch {
		case a.first < b.first:
			return -1
		case a.first > b.first:
			return 1
		}
		return 0
	})
	next := int64(1)
	for i, s := range secs {
		if i > 0 && s.first <= secs[i-1].last {
			return nil, nil, p.errK(s.k, fmt.Sprintf("an ElementRange after %d (sections may not overlap)", secs[i-1].last), fmt.Sprintf("%d,%d", s.first, s.last), errSyntax)
		}
		switch {
		case s.last <= int64(z.nc):
			if s.first != next {
				return nil, nil, p.errK(s.k, fmt.Sprintf("elements from %d (cells 1..CellSize=%d without gaps)", next, z.nc), fmt.Sprintf("%d,%d", s.first, s.last), errSyntax)
			}
			next = s.last + 1
			cells = append(cells, s)
		case s.first <= int64(z.nc):
			return nil, nil, p.errK(s.k, fmt.Sprintf("a section inside 1..CellSize=%d or above it", z.nc), fmt.Sprintf("%d,%d", s.first, s.last), errSyntax)
		default:
			faces = append(faces, s)
		}
	}
	if next != int64(z.nc)+1 {
		return nil, nil, p.errK(z.k, fmt.Sprintf("Elements numbered 1..%d (CellSize)", z.nc), fmt.Sprintf("cells up to %d", next-1), errSyntax)
	}
	return cells, faces, nil
}

// deriveVelocity adds VelocityX/Y/Z = MomentumX/Y/Z / Density where a
// solution has conservative variables but no velocity (docs §2.7).
func (p *ffcgParser) deriveVelocity(z *ffcgZone, out *field.Zone) error {
	axes := []string{"X", "Y", "Z"}
	for _, loc := range []field.Centering{field.AtPoints, field.AtCells} {
		rho := findArray(out, "Density", loc)
		if rho == nil || rho.Components != 1 {
			continue
		}
		at := z.k // the Density data statement, for errors
		for i, a := range z.arrays {
			if a.Name == "Density" && a.Location == loc {
				at = keyLine{f: []string{"data", "Density"}, line: z.arrayLines[i]}
			}
		}
		for _, a := range axes {
			m := findArray(out, "Momentum"+a, loc)
			if m == nil || m.Components != 1 || out.Array("Velocity"+a) != nil {
				continue
			}
			v := make([]float64, len(m.Data))
			for i, x := range m.Data {
				r := rho.Data[i]
				if !(r > 0) {
					return p.errK(at, fmt.Sprintf("a positive Density to derive Velocity%s from Momentum%s", a, a), fmt.Sprintf("%g at %s %d", r, loc, i), errSyntax)
				}
				v[i] = x / r
			}
			out.Arrays = append(out.Arrays, field.Array{Name: "Velocity" + a, Location: loc, Components: 1, Data: v})
		}
	}
	return nil
}

// findArray returns the array called name at loc, or nil.
func findArray(z *field.Zone, name string, loc field.Centering) *field.Array {
	for i := range z.Arrays {
		if a := &z.Arrays[i]; a.Name == name && a.Location == loc {
			return a
		}
	}
	return nil
}

// derivePressure adds Pressure = (γ − 1)(ρE − ½ρ|V|²) where a solution has
// EnergyStagnationDensity (ρE), Density and velocity (given or derived)
// but no Pressure: the perfect-gas relation (SIDS FlowEquationSet,
// GasModel Ideal); gamma is γ: the base's ReferenceState
// SpecificHeatRatio, else 1.4 (air, common practice; finishZone warns).
func (p *ffcgParser) derivePressure(out *field.Zone, gamma float64) {
	for _, loc := range []field.Centering{field.AtPoints, field.AtCells} {
		e := findArray(out, "EnergyStagnationDensity", loc)
		rho := findArray(out, "Density", loc)
		if e == nil || rho == nil || e.Components != 1 || rho.Components != 1 || out.Array("Pressure") != nil {
			continue
		}
		var vel []*field.Array
		for _, a := range []string{"VelocityX", "VelocityY", "VelocityZ"} {
			if v := findArray(out, a, loc); v != nil && v.Components == 1 {
				vel = append(vel, v)
			}
		}
		if len(vel) == 0 {
			continue
		}
		d := make([]float64, len(e.Data))
		for i := range d {
			q := 0.0
			for _, v := range vel {
				q += v.Data[i] * v.Data[i]
			}
			d[i] = (gamma - 1) * (e.Data[i] - 0.5*rho.Data[i]*q)
		}
		out.Arrays = append(out.Arrays, field.Array{Name: "Pressure", Location: loc, Components: 1, Data: d})
	}
}
