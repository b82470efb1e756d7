package main

import (
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"farforce/field"
	"farforce/integrate"
	"farforce/readers"
	"farforce/surface"
)

// surfaceFileName returns the --write-surface file of surface i (0-based):
// the name itself for the first, "name-2.vtk" and so on for the others.
func surfaceFileName(name string, i int) string {
	if i == 0 {
		return name
	}
	ext := filepath.Ext(name)
	return fmt.Sprintf("%s-%d%s", strings.TrimSuffix(name, ext), i+1, ext)
}

// cutZone turns a cut into a zone of polygons (3D) or lines (2D), one per
// piece, with cell arrays: the unit normal, the area (length), and the
// force per unit area (length) of each term on the piece, from integrating
// over that piece alone with the options of the whole surface. The sum of
// each density times the area over the pieces is the term of the report.
func cutZone(c *surface.Cut, flow field.FlowEvaluator, opt integrate.Options) (*field.Zone, error) {
	z := &field.Zone{Name: c.Spec}
	n := len(c.Pieces)
	arrays := []string{"normal", "area", "momentum_flux", "pressure", "viscous", "reynolds_stress", "total", "mass_flux"}
	comps := []int{3, 1, 3, 3, 3, 3, 3, 1}
	data := make([][]float64, len(arrays))
	for i := range data {
		data[i] = make([]float64, 0, n*comps[i])
	}
	opt.Workers = 1
	for _, p := range c.Pieces {
		first := int32(z.NumPoints())
		nodes := make([]int32, len(p.Verts))
		for k, v := range p.Verts {
			z.Points = append(z.Points, v[0], v[1], v[2])
			nodes[k] = first + int32(k)
		}
		t := field.Polygon
		if c.Dim == 2 {
			t = field.Line
		}
		z.AddCell(t, nodes...)
		one := &surface.Cut{Spec: c.Spec, Dim: c.Dim, Facets: 1, Area: p.Area, ExactArea: p.Area,
			Pieces: []surface.Piece{p}, Points: c.Points[p.First : p.First+p.Count]}
		one.Pieces[0].First = 0
		r, err := integrate.Forces(one, flow, opt)
		if err != nil {
			return nil, err
		}
		inv := 0.0
		if p.Area > 0 {
			inv = 1 / p.Area
		}
		per := func(v [3]float64) []float64 { return []float64{v[0] * inv, v[1] * inv, v[2] * inv} }
		data[0] = append(data[0], p.N[:]...)
		data[1] = append(data[1], p.Area)
		data[2] = append(data[2], per(r.Terms.Momentum)...)
		data[3] = append(data[3], per(r.Terms.Pressure)...)
		data[4] = append(data[4], per(r.Terms.Viscous)...)
		data[5] = append(data[5], per(r.Terms.Reynolds)...)
		data[6] = append(data[6], per(r.Force)...)
		data[7] = append(data[7], r.MassFlux*inv)
	}
	for i, name := range arrays {
		z.Arrays = append(z.Arrays, field.Array{Name: name, Location: field.AtCells, Components: comps[i], Data: data[i]})
	}
	return z, nil
}

// writeCutFile writes the cut of one surface, with its force densities, as
// a legacy VTK POLYDATA file, atomically.
func (p *preparedFlow) writeCutFile(path string, c *surface.Cut) error {
	z, err := cutZone(c, p.flow, p.opt)
	if err != nil {
		return inputErr(err)
	}
	title := "farforce cut surface " + c.Spec + ": cell arrays are force per unit area (length in 2D) of each term"
	return writeFileAtomic(path, func(w io.Writer) error {
		return readers.WriteVTK(w, z, readers.WriteOptions{PolyData: true, Binary: true, Title: title})
	})
}
