package surface

import (
	"fmt"

	"farforce/field"
)

// placer is the scratch state of one worker of CutSurface's second pass,
// which computes the quadrature points of the pieces and locates them in
// their cells.
type placer struct {
	l    *field.Locator
	spec string
	dim  int
	maps []cellMapEntry // direct-mapped cache of cell maps
	cm   *cellMapEntry  // the map of the current piece's cell
}

// cellMapEntry is one cached inverse map: cm maps cell ref when ok (see
// field.Locator.MapCell); set tells a used entry.
type cellMapEntry struct {
	ref     field.CellRef
	set, ok bool
	cm      field.CellMap
}

// cellMapCacheSize is the number of cell maps a worker keeps (a power of
// two): pieces of neighbouring facets share cells, and MapCell depends only
// on the cell, so the cache does not change any result.
const cellMapCacheSize = 2048

// mapCell points p.cm at the inverse map of cell ref.
func (p *placer) mapCell(ref field.CellRef) {
	if p.maps == nil {
		p.maps = make([]cellMapEntry, cellMapCacheSize)
	}
	e := &p.maps[cellHash(ref)&(cellMapCacheSize-1)]
	if !e.set || e.ref != ref {
		e.ref, e.set = ref, true
		e.ok = p.l.MapCell(ref, &e.cm)
	}
	p.cm = e
}

// chunk copies the pieces of r into pieces, shifting First by off (the
// chunk's first point in the cut), and writes their quadrature points
// into points (the chunk's part of the cut's points). It stops at the
// first point that lies in no cell.
func (p *placer) chunk(r *chunkResult, pieces []Piece, points []QuadPoint, off int) error {
	for k, pc := range r.pieces {
		if err := p.piece(int(r.facet[k]), &pc, points[pc.First:pc.First+pc.Count]); err != nil {
			return err
		}
		pc.First += int32(off)
		pieces[k] = pc
	}
	return nil
}

// piece writes the quadrature points of piece pc of facet i into dst:
// in 2D the Gauss rule on the segment, in 3D Radon's rule on each
// triangle of the fan from the first vertex (weights times the
// triangle's area, fanArea).
func (p *placer) piece(i int, pc *Piece, dst []QuadPoint) error {
	if p.cm == nil || p.cm.ref != pc.Cell {
		p.mapCell(pc.Cell)
	}
	poly, n := pc.Verts, pc.N
	j := 0
	if p.dim == 2 {
		d := sub(poly[1], poly[0])
		for _, q := range segRule {
			x := add(poly[0], scale(d, q.t))
			dst[j] = QuadPoint{X: x, W: q.w * pc.Area, N: n}
			if err := p.place(i, pc.Cell, &dst[j]); err != nil {
				return err
			}
			j++
		}
		return nil
	}
	v0 := poly[0]
	for k := 1; k+1 < len(poly); k++ {
		tri := dst[j : j+len(triRule) : j+len(triRule)]
		j += len(triRule)
		radonPoints(tri, v0, poly[k], poly[k+1], fanArea(poly, k, n), n)
		for t := range tri {
			if err := p.place(i, pc.Cell, &tri[t]); err != nil {
				return err
			}
		}
	}
	return nil
}

// radonPoints sets the positions, weights and normals of the points of
// triRule on triangle (v0, v1, v2) of area ta and unit normal n in dst:
// x = l0 v0 + l1 v1 + l2 v2 (summed in that order), w = weight × ta.
// Written out by component: the compiler keeps scalars, not arrays, in
// registers.
func radonPoints(dst []QuadPoint, v0, v1, v2 [3]float64, ta float64, n [3]float64) {
	for t := range dst {
		q := &triRule[t]
		l0, l1, l2 := q.l[0], q.l[1], q.l[2]
		d := &dst[t]
		d.X[0] = v0[0]*l0 + v1[0]*l1 + v2[0]*l2
		d.X[1] = v0[1]*l0 + v1[1]*l1 + v2[1]*l2
		d.X[2] = v0[2]*l0 + v1[2]*l1 + v2[2]*l2
		d.W, d.N = q.w*ta, n
	}
}

// fanArea returns the area of triangle (poly[0], poly[k], poly[k+1])
// projected on the unit normal n.
func fanArea(poly [][3]float64, k int, n [3]float64) float64 {
	// dot(cross(v1 - v0, v2 - v0), n) / 2 by component.
	v0, v1, v2 := &poly[0], &poly[k], &poly[k+1]
	ax, ay, az := v1[0]-v0[0], v1[1]-v0[1], v1[2]-v0[2]
	bx, by, bz := v2[0]-v0[0], v2[1]-v0[1], v2[2]-v0[2]
	return ((ay*bz-az*by)*n[0] + (az*bx-ax*bz)*n[1] + (ax*by-ay*bx)*n[2]) / 2
}

// place sets q.At to the location of q.X in cell ref or, failing that,
// wherever the locator finds it (see locate).
func (p *placer) place(i int, ref field.CellRef, q *QuadPoint) error {
	if p.cm.ok {
		var ok bool
		if q.At, ok = p.cm.cm.Local(q.X); ok {
			return nil
		}
	}
	return p.locate(i, ref, q)
}

// locate sets q.At to the cell holding q.X found by the locator, for a
// quadrature point of cell ref outside it by rounding (at the face of a
// warped cell).
func (p *placer) locate(i int, ref field.CellRef, q *QuadPoint) error {
	at, ok := p.l.Locate(q.X)
	if !ok {
		x := q.X
		return fmt.Errorf("surface %q: facet %d: quadrature point (%g, %g, %g) cut in cell %d of zone %d lies in no cell: %w", p.spec, i, x[0], x[1], x[2], ref.Cell, ref.Zone, errNoCell)
	}
	q.At = at
	return nil
}
