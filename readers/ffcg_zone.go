package readers

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"farforce/field"
)

// ffcgZone is a zone being read: sizes from its header, then the raw
// content of its blocks until "end zone".
type ffcgZone struct {
	k          keyLine
	name       string
	structured bool
	dims       []int // structured vertex sizes (IndexDimension = CellDimension)
	nv, nc     int   // vertices, cells
	coords     [3][]float64
	haveGrid   bool
	sections   []*ffcgSection
	arrays     []field.Array
	arrayLines []int // line of each array's data statement
	blank      []bool
	bcs        []*ffcgBC
	// sawEnergy and sawPressure record data statements whether or not
	// Options.Arrays keeps them, so that warnings do not depend on it.
	sawEnergy, sawPressure bool
}

// parseZone reads a zone block opened by k and appends its field.Zone.
func (p *ffcgParser) parseZone(k keyLine) error {
	const usage = "zone NAME Structured VertexSize=ni,nj[,nk] or zone NAME Unstructured VertexSize=nv CellSize=nc"
	st, err := p.split(k, 2, 2, usage, "vertexsize", "cellsize")
	if err != nil {
		return err
	}
	z := &ffcgZone{k: k, name: decodeName(st.pos[0])}
	cd := p.base.cellDim
	switch {
	case strings.EqualFold(st.pos[1], "Structured"):
		z.structured = true
		vs, err := p.ints(st, "vertexsize", cd, fmt.Sprintf("%d sizes (CellDimension)", cd))
		if err != nil {
			return err
		}
		if vs == nil || st.attrs["cellsize"] != "" {
			return p.errK(k, usage, "VertexSize missing or CellSize given", errSyntax)
		}
		n := int64(1)
		for _, v := range vs {
			if v < 2 || v > math.MaxInt32 {
				return p.errK(k, "vertex sizes of at least 2", fmt.Sprint(v), errSyntax)
			}
			n *= v
			if n > math.MaxInt32 {
				return p.errK(k, "at most 2^31-1 vertices", "VertexSize="+st.attrs["vertexsize"], ErrTooLarge)
			}
			z.dims = append(z.dims, int(v))
		}
		z.nv = int(n)
		z.nc = 1
		for _, v := range z.dims {
			z.nc *= v - 1
		}
	case strings.EqualFold(st.pos[1], "Unstructured"):
		vs, err := p.ints(st, "vertexsize", 1, "the vertex count")
		if err != nil {
			return err
		}
		cs, err := p.ints(st, "cellsize", 1, "the cell count")
		if err != nil {
			return err
		}
		if vs == nil || cs == nil {
			return p.errK(k, usage, "VertexSize or CellSize missing", errSyntax)
		}
		if vs[0] < 0 || cs[0] < 0 {
			return p.errK(k, "non-negative sizes", fmt.Sprintf("VertexSize=%d CellSize=%d", vs[0], cs[0]), errSyntax)
		}
		if vs[0] > math.MaxInt32 || cs[0] > math.MaxInt32 {
			return p.errK(k, "at most 2^31-1 vertices and cells", fmt.Sprintf("VertexSize=%d CellSize=%d", vs[0], cs[0]), ErrTooLarge)
		}
		z.nv, z.nc = int(vs[0]), int(cs[0])
	default:
		return p.errK(k, "Structured or Unstructured", quote([]byte(st.pos[1])), ErrUnknownFormat)
	}
	for {
		k, end, err := p.blockStmt("zone "+z.name, "zone")
		if err != nil {
			return err
		}
		if end {
			return p.finishZone(z, k)
		}
		switch {
		case keyword(k, "GridCoordinates"):
			err = p.grid(z, k)
		case keyword(k, "Elements"):
			err = p.elements(z, k)
		case keyword(k, "FlowSolution"):
			err = p.solution(z, k)
		case keyword(k, "ZoneBC"):
			err = p.zoneBC(z, k)
		case keyword(k, "DataClass"):
			_, err = p.dataClass(k)
		case keyword(k, "DimensionalUnits"):
			_, err = p.units(k)
		case keyword(k, "ReferenceState"):
			_, err = p.referenceState(k)
		default:
			err = p.errK(k, "GridCoordinates, Elements, FlowSolution, ZoneBC, DataClass, DimensionalUnits, ReferenceState or end", quote([]byte(k.f[0])), ErrUnknownFormat)
		}
		if err != nil {
			return err
		}
	}
}

var coordNames = [3]string{"CoordinateX", "CoordinateY", "CoordinateZ"}

// grid reads a GridCoordinates block.
func (p *ffcgParser) grid(z *ffcgZone, k keyLine) error {
	if len(k.f) > 2 {
		return p.errK(k, "GridCoordinates [NAME]", fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	if z.haveGrid {
		return p.errK(k, "one GridCoordinates per zone", "a second one", ErrUnsupported)
	}
	z.haveGrid = true
	for {
		h, end, err := p.dataStmt("GridCoordinates")
		if end || err != nil {
			return err
		}
		k := h.k
		ax := -1
		for i, n := range coordNames {
			if h.name == n {
				ax = i
			}
		}
		if ax < 0 {
			return p.errK(k, "CoordinateX, CoordinateY or CoordinateZ", quote([]byte(h.name)), ErrUnsupported)
		}
		if z.coords[ax] != nil {
			return p.errK(k, "each coordinate once", h.name+" twice", errSyntax)
		}
		if err := p.wantCount(h, int64(z.nv), "VertexSize"); err != nil {
			return err
		}
		if h.comps != 1 {
			return p.errK(k, "Components=1", fmt.Sprint(h.comps), errSyntax)
		}
		if z.coords[ax], err = p.readData(h); err != nil {
			return err
		}
	}
}

// solution reads a FlowSolution block.
func (p *ffcgParser) solution(z *ffcgZone, k keyLine) error {
	const usage = "FlowSolution NAME [GridLocation=Vertex|CellCenter] [Rind=a1,b1,...]"
	st, err := p.split(k, 1, 1, usage, "gridlocation", "rind")
	if err != nil {
		return err
	}
	loc := field.AtPoints
	if v, ok := st.attrs["gridlocation"]; ok {
		l, ok := enum(v, gridLocations)
		switch {
		case !ok:
			return p.errK(k, "a GridLocation_t value", quote([]byte(v)), ErrUnknownFormat)
		case l == "CellCenter":
			loc = field.AtCells
		case l != "Vertex":
			return p.errK(k, "GridLocation Vertex or CellCenter", l, ErrUnsupported)
		}
	}
	core := p.coreDims(z, loc)
	rind, err := p.ints(st, "rind", 2*len(core), fmt.Sprintf("%d rind plane counts", 2*len(core)))
	if err != nil {
		return err
	}
	full := make([]int, len(core))
	total := int64(1)
	for i, c := range core {
		a, b := int64(0), int64(0)
		if rind != nil {
			a, b = rind[2*i], rind[2*i+1]
		}
		if a < 0 || b < 0 || a > 1<<20 || b > 1<<20 {
			return p.errK(k, "rind plane counts from 0 to 2^20", st.attrs["rind"], errSyntax)
		}
		full[i] = c + int(a+b)
		total *= int64(full[i])
	}
	for {
		h, end, err := p.dataStmt("FlowSolution")
		if end || err != nil {
			return err
		}
		k := h.k
		if h.typ.name == "C1" {
			p.s.warn("line %d: character array %q skipped", k.line, h.name)
			if err := p.skipData(h); err != nil {
				return err
			}
			continue
		}
		if total > math.MaxInt64/int64(h.comps) {
			return p.errK(k, "a size that fits the field model", "more", ErrTooLarge)
		}
		if err := p.wantCount(h, total*int64(h.comps), fmt.Sprintf("%d %s entries with rind x %d components", total, loc, h.comps)); err != nil {
			return err
		}
		z.sawEnergy = z.sawEnergy || h.name == "EnergyStagnationDensity"
		z.sawPressure = z.sawPressure || h.name == "Pressure"
		isBlank := h.name == "Iblank" && loc == field.AtCells
		if !isBlank && !p.keepArray(h.name) {
			if err := p.skipData(h); err != nil {
				return err
			}
			continue
		}
		for _, a := range z.arrays {
			if a.Name == h.name {
				return p.errK(k, "each array name once per zone", quote([]byte(h.name))+" again", errSyntax)
			}
		}
		d, err := p.readData(h)
		if err != nil {
			return err
		}
		if rind != nil {
			d = stripRind(d, h.comps, full, core, rind)
		}
		if isBlank {
			z.blank = make([]bool, len(d))
			for i, v := range d {
				z.blank[i] = v == 0
			}
			continue
		}
		z.arrays = append(z.arrays, field.Array{Name: h.name, Location: loc, Components: h.comps, Data: d})
		z.arrayLines = append(z.arrayLines, k.line)
	}
}

// coreDims returns the index sizes of data at loc without rind: vertex or
// cell sizes per direction (structured), or the vertex or cell count.
func (p *ffcgParser) coreDims(z *ffcgZone, loc field.Centering) []int {
	if !z.structured {
		if loc == field.AtCells {
			return []int{z.nc}
		}
		return []int{z.nv}
	}
	out := make([]int, len(z.dims))
	for i, d := range z.dims {
		out[i] = d
		if loc == field.AtCells {
			out[i] = d - 1
		}
	}
	return out
}

// stripRind keeps the core of d, an array of full[0]×full[1]×... entries
// of comps values (first index fastest) with rind[2i] leading planes in
// direction i.
func stripRind(d []float64, comps int, full, core []int, rind []int64) []float64 {
	n := comps
	for _, c := range core {
		n *= c
	}
	out := make([]float64, 0, n)
	var walk func(dir, off int)
	walk = func(dir, off int) {
		if dir < 0 {
			out = append(out, d[off*comps:(off+1)*comps]...)
			return
		}
		stride := 1
		for i := 0; i < dir; i++ {
			stride *= full[i]
		}
		for c := 0; c < core[dir]; c++ {
			walk(dir-1, off+(c+int(rind[2*dir]))*stride)
		}
	}
	walk(len(full)-1, 0)
	return out
}

// derivedFrom lists, for each quantity a reader may derive (docs §2.7),
// the arrays it is derived from.
var derivedFrom = map[string][]string{
	"VelocityX": {"MomentumX", "Density"},
	"VelocityY": {"MomentumY", "Density"},
	"VelocityZ": {"MomentumZ", "Density"},
	"Pressure": {"EnergyStagnationDensity", "Density", "MomentumX", "MomentumY", "MomentumZ",
		"VelocityX", "VelocityY", "VelocityZ"},
}

// keepArray reports whether a flow array is read: it is wanted, or it is
// needed to derive a wanted quantity.
func (p *ffcgParser) keepArray(name string) bool {
	if p.opt.wants(name) {
		return true
	}
	for q, from := range derivedFrom {
		if p.opt.wants(q) && slices.Contains(from, name) {
			return true
		}
	}
	return false
}
