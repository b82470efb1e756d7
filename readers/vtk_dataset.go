package readers

import (
	"fmt"
	"math"
)

// geometry handles the keywords that declare points and cells.
func (f *vtkFile) geometry(k keyLine) error {
	switch key := k.key(); key {
	case "points":
		return f.pointsBlock(k)
	case "dimensions":
		return f.dimensions(k)
	case "origin", "spacing", "aspect_ratio":
		if f.dataset != "structured_points" {
			return f.errKey(k, "ORIGIN/SPACING only in STRUCTURED_POINTS", f.dataset, errSyntax)
		}
		if err := f.argc(k, 3, "three numbers"); err != nil {
			return err
		}
		var v [3]float64
		for i := range v {
			x, err := f.real(k, i+1)
			if err != nil {
				return err
			}
			v[i] = x
		}
		if key == "origin" {
			f.origin = v
		} else {
			f.spacing = v
		}
		return nil
	case "x_coordinates", "y_coordinates", "z_coordinates":
		return f.axis(k, int(key[0]-'x'))
	case "cells":
		if f.dataset != "unstructured_grid" {
			return f.errKey(k, "CELLS only in UNSTRUCTURED_GRID", f.dataset, errSyntax)
		}
		if f.cells != nil {
			return f.errKey(k, "one CELLS block", "a second one", errSyntax)
		}
		b, err := f.cellBlock(k)
		f.cells = b
		return err
	case "cell_types":
		return f.cellTypesBlock(k)
	default: // vertices, lines, polygons, triangle_strips
		if f.dataset != "polydata" {
			return f.errKey(k, "VERTICES/LINES/POLYGONS/TRIANGLE_STRIPS only in POLYDATA", f.dataset, errSyntax)
		}
		i := map[string]int{"vertices": 0, "lines": 1, "polygons": 2, "triangle_strips": 3}[key]
		if f.poly[i] != nil {
			return f.errKey(k, "one "+k.f[0]+" block", "a second one", errSyntax)
		}
		b, err := f.cellBlock(k)
		if b != nil {
			b.fixed = [4]int32{vtkPolyVertex, vtkPolyLine, vtkPolygon, vtkTriangleStrip}[i]
		}
		f.poly[i] = b
		return err
	}
}

// pointsBlock reads "POINTS n type" and 3n coordinates.
func (f *vtkFile) pointsBlock(k keyLine) error {
	if f.dataset == "structured_points" || f.dataset == "rectilinear_grid" {
		return f.errKey(k, "no POINTS in "+f.dataset, "POINTS", errSyntax)
	}
	if f.havePoints {
		return f.errKey(k, "one POINTS block", "a second one", errSyntax)
	}
	if err := f.argc(k, 2, "POINTS n dataType"); err != nil {
		return err
	}
	n, err := f.count(k, 1)
	if err != nil {
		return err
	}
	if _, err := f.checkInt32(k, n, "points"); err != nil {
		return err
	}
	t, err := f.dtype(k, 2)
	if err != nil {
		return err
	}
	f.pointsType = t
	p, err := f.s.readFloats(3*n, t, "POINTS", "coordinates")
	if err != nil {
		return err
	}
	f.points, f.havePoints = p, true
	return f.afterArray()
}

// dimensions reads "DIMENSIONS nx ny nz".
func (f *vtkFile) dimensions(k keyLine) error {
	switch f.dataset {
	case "structured_points", "structured_grid", "rectilinear_grid":
	default:
		return f.errKey(k, "DIMENSIONS only in structured datasets", f.dataset, errSyntax)
	}
	if err := f.argc(k, 3, "DIMENSIONS nx ny nz"); err != nil {
		return err
	}
	total := int64(1)
	for i := 0; i < 3; i++ {
		n, err := f.count(k, i+1)
		if err != nil {
			return err
		}
		if n < 1 {
			return f.errKey(k, "dimensions of at least 1", fmt.Sprint(n), errSyntax)
		}
		if n > math.MaxInt32 {
			return f.errKey(k, "at most 2^31-1 points", fmt.Sprint(n), ErrTooLarge)
		}
		total *= n
		if total > math.MaxInt32 {
			return f.errKey(k, "at most 2^31-1 points", "more", ErrTooLarge)
		}
		f.dims[i] = int(n)
	}
	f.haveDims = true
	return nil
}

// axis reads "X_COORDINATES n type" (or Y, Z) of a RECTILINEAR_GRID.
func (f *vtkFile) axis(k keyLine, i int) error {
	if f.dataset != "rectilinear_grid" {
		return f.errKey(k, "coordinates only in RECTILINEAR_GRID", f.dataset, errSyntax)
	}
	if err := f.argc(k, 2, k.f[0]+" n dataType"); err != nil {
		return err
	}
	n, err := f.count(k, 1)
	if err != nil {
		return err
	}
	if f.haveDims && n != int64(f.dims[i]) {
		return f.errKey(k, fmt.Sprintf("%d coordinates (DIMENSIONS)", f.dims[i]), fmt.Sprint(n), errSyntax)
	}
	t, err := f.dtype(k, 2)
	if err != nil {
		return err
	}
	if f.pointsType.size != 0 && f.pointsType != t {
		f.endianChecked = true // mixed axis types: do not guess
	}
	f.pointsType = t
	c, err := f.s.readFloats(n, t, k.f[0], "coordinates")
	if err != nil {
		return err
	}
	f.coords[i], f.haveCoord[i] = c, true
	return f.afterArray()
}

// numPoints returns the number of points the geometry declares.
func (f *vtkFile) numPoints() int {
	switch f.dataset {
	case "structured_points", "rectilinear_grid":
		return f.dims[0] * f.dims[1] * f.dims[2]
	}
	return len(f.points) / 3
}

// numCells returns the number of cells as the file counts them (before
// splitting strips and polylines).
func (f *vtkFile) numCells() int {
	switch f.dataset {
	case "structured_points", "structured_grid", "rectilinear_grid":
		n := 1
		for _, d := range f.dims {
			n *= max(d-1, 1)
		}
		return n
	case "unstructured_grid":
		return len(f.cellTypes)
	}
	n := 0
	for _, b := range f.poly {
		if b != nil {
			n += b.n
		}
	}
	return n
}

// checkGeometry verifies that the geometry is complete before attributes
// or at the end of the file; k is the line that prompts the check.
func (f *vtkFile) checkGeometry(k keyLine) error {
	switch f.dataset {
	case "":
		return f.errKey(k, "DATASET", "no DATASET line", errSyntax)
	case "structured_points":
		if !f.haveDims {
			return f.errKey(k, "DIMENSIONS", "none", errSyntax)
		}
	case "structured_grid":
		if !f.haveDims || !f.havePoints {
			return f.errKey(k, "DIMENSIONS and POINTS", "not both", errSyntax)
		}
		if n := f.dims[0] * f.dims[1] * f.dims[2]; n != len(f.points)/3 {
			return f.errKey(k, fmt.Sprintf("%d points (DIMENSIONS)", n), fmt.Sprintf("%d points", len(f.points)/3), errSyntax)
		}
	case "rectilinear_grid":
		if !f.haveDims || !f.haveCoord[0] || !f.haveCoord[1] || !f.haveCoord[2] {
			return f.errKey(k, "DIMENSIONS and X/Y/Z_COORDINATES", "an incomplete grid", errSyntax)
		}
		for i, c := range f.coords {
			if len(c) != f.dims[i] {
				return f.errKey(k, fmt.Sprintf("%d %c coordinates (DIMENSIONS)", f.dims[i], 'X'+i), fmt.Sprint(len(c)), errSyntax)
			}
		}
	case "unstructured_grid":
		if !f.havePoints {
			return f.errKey(k, "POINTS", "none", errSyntax)
		}
		if f.cells != nil && f.cellTypes == nil {
			return f.errKey(k, "CELL_TYPES after CELLS", "none", errSyntax)
		}
		if f.cells == nil && len(f.cellTypes) > 0 {
			return f.errKey(k, "CELLS before CELL_TYPES", "none", errSyntax)
		}
	case "polydata":
		if !f.havePoints {
			return f.errKey(k, "POINTS", "none", errSyntax)
		}
	}
	return nil
}
