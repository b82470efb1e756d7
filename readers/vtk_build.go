package readers

import (
	"fmt"

	"farforce/field"
)

// implicitLimit bounds the points a STRUCTURED_POINTS or RECTILINEAR_GRID
// dataset may declare beyond what its data can back (24 bytes of
// coordinates per point are synthesised from DIMENSIONS alone): 65536
// points plus 8 per tuple of the largest attribute array the stream held
// (a grid has at most 8 times as many points as cells). Bytes alone do not
// count: blank lines or comments cost nothing to compress.
const implicitLimit = 1 << 16

// build assembles the zone after the whole stream has been read.
func (f *vtkFile) build() (*field.Zone, error) {
	end := keyLine{f: []string{"EOF"}, line: f.s.line, off: f.s.offset()}
	if !f.inAttr {
		if err := f.checkGeometry(end); err != nil {
			return nil, err
		}
	}
	z := &field.Zone{}
	np := f.numPoints()
	var cells convertedCells
	var err error
	switch f.dataset {
	case "structured_points", "rectilinear_grid":
		if int64(np) > implicitLimit+8*f.backed {
			return nil, f.errKey(end, fmt.Sprintf("a grid backed by its data (at most %d points for arrays of %d tuples)", implicitLimit+8*f.backed, f.backed), fmt.Sprintf("DIMENSIONS of %d points", np), ErrTooLarge)
		}
		z.Points = f.implicitPoints()
		cells = structuredCells(f.dims)
	case "structured_grid":
		z.Points = f.points
		cells = structuredCells(f.dims)
	case "unstructured_grid":
		z.Points = f.points
		if f.cells != nil {
			cells, err = f.convert([]*cellBlock{f.cells}, np)
		}
	case "polydata":
		z.Points = f.points
		var bl []*cellBlock
		for _, b := range f.poly {
			if b != nil {
				bl = append(bl, b)
			}
		}
		if len(bl) > 0 {
			cells, err = f.convert(bl, np)
		}
	}
	if err != nil {
		return nil, err
	}
	if z.Points == nil {
		z.Points = []float64{}
	}
	z.Types, z.Offsets, z.Conn = cells.types, cells.offsets, cells.conn
	if z.Offsets == nil {
		z.Offsets = []int32{0}
	}
	z.Arrays = append(z.Arrays, f.pointArrays...)
	for _, a := range f.cellArrays {
		a.Data = expand(a.Data, a.Components, cells.orig)
		z.Arrays = append(z.Arrays, a)
	}
	if f.ghost != nil {
		g := expand(f.ghost, 1, cells.orig)
		z.Blank = make([]bool, len(g))
		for i, v := range g {
			z.Blank[i] = v != 0
		}
	}
	return z, nil
}

// expand repeats the tuples of d along orig (field cell -> file cell);
// nil orig returns d.
func expand(d []float64, comps int, orig []int32) []float64 {
	if orig == nil {
		return d
	}
	out := make([]float64, len(orig)*comps)
	for i, o := range orig {
		copy(out[i*comps:(i+1)*comps], d[int(o)*comps:])
	}
	return out
}

// implicitPoints synthesises the points of STRUCTURED_POINTS (origin +
// index × spacing) or RECTILINEAR_GRID (axis coordinates), x fastest.
func (f *vtkFile) implicitPoints() []float64 {
	nx, ny, nz := f.dims[0], f.dims[1], f.dims[2]
	p := make([]float64, 0, 3*nx*ny*nz)
	at := func(a, i int) float64 {
		if f.dataset == "rectilinear_grid" {
			return f.coords[a][i]
		}
		return f.origin[a] + float64(i)*f.spacing[a]
	}
	for k := 0; k < nz; k++ {
		z := at(2, k)
		for j := 0; j < ny; j++ {
			y := at(1, j)
			for i := 0; i < nx; i++ {
				p = append(p, at(0, i), y, z)
			}
		}
	}
	return p
}
