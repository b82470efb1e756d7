package readers

import (
	"fmt"
	"slices"

	"farforce/field"
)

// ffcgBC is a BC node as read: type, location and one of a point range,
// an element range or a point list (1-based numbers).
type ffcgBC struct {
	k            keyLine
	name, typ    string
	family, loc  string
	pointRange   []int64
	elementRange []int64
	list         []int32
}

// zoneBC reads a ZoneBC block.
func (p *ffcgParser) zoneBC(z *ffcgZone, k keyLine) error {
	if len(k.f) > 1 {
		return p.errK(k, "ZoneBC", fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	for {
		k, end, err := p.blockStmt("ZoneBC", "ZoneBC")
		if end || err != nil {
			return err
		}
		if !keyword(k, "BC") {
			return p.errK(k, "BC or end", quote([]byte(k.f[0])), errSyntax)
		}
		if err := p.bc(z, k); err != nil {
			return err
		}
	}
}

// bc reads a BC block.
func (p *ffcgParser) bc(z *ffcgZone, k keyLine) error {
	const usage = "BC NAME BCTYPE [GridLocation=L] [PointRange=...|ElementRange=first,last] [FamilyName=F]"
	st, err := p.split(k, 2, 2, usage, "gridlocation", "pointrange", "elementrange", "familyname")
	if err != nil {
		return err
	}
	b := &ffcgBC{k: k, name: decodeName(st.pos[0]), loc: "Vertex", family: decodeName(st.attrs["familyname"])}
	t, ok := enum(st.pos[1], bcTypes)
	if !ok {
		return p.errK(k, "a BCType_t value (BCWall, BCFarfield, BCSymmetryPlane, ...)", quote([]byte(st.pos[1])), ErrUnknownFormat)
	}
	b.typ = t
	if v, ok := st.attrs["gridlocation"]; ok {
		if b.loc, ok = enum(v, gridLocations); !ok {
			return p.errK(k, "a GridLocation_t value", quote([]byte(v)), ErrUnknownFormat)
		}
	}
	idx := 1
	if z.structured {
		idx = len(z.dims)
	}
	if b.pointRange, err = p.ints(st, "pointrange", 2*idx, fmt.Sprintf("%d indices (begin and end)", 2*idx)); err != nil {
		return err
	}
	if b.elementRange, err = p.ints(st, "elementrange", 2, "first,last"); err != nil {
		return err
	}
	for {
		k, end, err := p.blockStmt("BC", "BC")
		if err != nil {
			return err
		}
		if end {
			break
		}
		switch {
		case keyword(k, "FamilyName") && len(k.f) == 2:
			b.family = decodeName(k.f[1])
		case keyword(k, "data"):
			h, err := p.dataHeader(k)
			if err != nil {
				return err
			}
			if h.name != "PointList" || b.list != nil {
				return p.errK(k, "one PointList", quote([]byte(h.name)), errSyntax)
			}
			if b.list, err = p.readIndices(h); err != nil {
				return err
			}
		default:
			return p.errK(k, "data PointList, FamilyName or end", quote([]byte(k.f[0])), errSyntax)
		}
	}
	n := 0
	for _, set := range []bool{b.pointRange != nil, b.elementRange != nil, b.list != nil} {
		if set {
			n++
		}
	}
	if n != 1 {
		return p.errK(k, "exactly one of PointRange, ElementRange and PointList", fmt.Sprint(n), errSyntax)
	}
	z.bcs = append(z.bcs, b)
	return nil
}

// patch resolves a BC of zone z (built as out) into vertices and faces.
func (p *ffcgParser) patch(z *ffcgZone, out *field.Zone, b *ffcgBC, faceSecs []*ffcgSection) (Patch, error) {
	pt := Patch{Name: b.name, Type: b.typ, Family: b.family, Location: b.loc}
	faces := &field.Zone{Name: b.name, Points: out.Points, Offsets: []int32{0}}
	switch {
	case b.pointRange != nil && z.structured:
		if err := p.structuredRange(z, b, &pt, faces); err != nil {
			return pt, err
		}
	case b.pointRange != nil || b.elementRange != nil:
		r := b.pointRange
		if r == nil {
			r = b.elementRange
		}
		if r[0] > r[1] || r[0] < 1 || r[1]-r[0] > int64(len(out.Conn)+z.nv) {
			return pt, p.errK(b.k, "a range first <= last", fmt.Sprintf("%d,%d", r[0], r[1]), errSyntax)
		}
		if b.loc == "Vertex" {
			if r[1] > int64(z.nv) {
				return pt, p.errK(b.k, fmt.Sprintf("vertex numbers in 1..%d", z.nv), fmt.Sprint(r[1]), errSyntax)
			}
			for v := r[0]; v <= r[1]; v++ {
				pt.Points = append(pt.Points, int32(v-1))
			}
			p.facesOnPoints(out, pt.Points, faces)
			break
		}
		for e := r[0]; e <= r[1]; e++ {
			if err := p.addElement(z, b, e, faceSecs, faces); err != nil {
				return pt, err
			}
		}
	default:
		if b.loc == "Vertex" {
			for _, v := range b.list {
				if v < 1 || int(v) > z.nv {
					return pt, p.errK(b.k, fmt.Sprintf("PointList vertex numbers in 1..%d", z.nv), fmt.Sprint(v), errSyntax)
				}
				pt.Points = append(pt.Points, v-1)
			}
			slices.Sort(pt.Points)
			pt.Points = slices.Compact(pt.Points)
			p.facesOnPoints(out, pt.Points, faces)
			break
		}
		if z.structured {
			return pt, p.errK(b.k, "GridLocation=Vertex for a structured PointList", b.loc, ErrUnsupported)
		}
		for _, e := range b.list {
			if err := p.addElement(z, b, int64(e), faceSecs, faces); err != nil {
				return pt, err
			}
		}
	}
	if pt.Points == nil {
		pt.Points = slices.Clone(faces.Conn)
		slices.Sort(pt.Points)
		pt.Points = slices.Compact(pt.Points)
	}
	if len(faces.Types) > 0 {
		pt.Faces = faces
	}
	return pt, nil
}

// addElement appends boundary element e (a number above CellSize) to faces.
func (p *ffcgParser) addElement(z *ffcgZone, b *ffcgBC, e int64, faceSecs []*ffcgSection, faces *field.Zone) error {
	for _, s := range faceSecs {
		if e >= s.first && e <= s.last {
			i := int(e - s.first)
			faces.AddCell(s.types[i], s.conn[s.offsets[i]:s.offsets[i+1]]...)
			return nil
		}
	}
	return p.errK(b.k, fmt.Sprintf("boundary element numbers (sections above CellSize=%d)", z.nc), fmt.Sprint(e), errSyntax)
}

// facesOnPoints adds to faces the boundary faces of out whose nodes are
// all in pts (sorted).
func (p *ffcgParser) facesOnPoints(out *field.Zone, pts []int32, faces *field.Zone) {
	bf, err := field.BoundaryFaces(&field.Field{Zones: []*field.Zone{out}}, nil)
	if err != nil {
		return // out was validated; cannot happen
	}
	for _, f := range bf {
		all := true
		for _, v := range f.Nodes {
			if _, ok := slices.BinarySearch(pts, v); !ok {
				all = false
				break
			}
		}
		if all {
			faces.AddCell(faceType(len(f.Nodes)), f.Nodes...)
		}
	}
}

// faceType is the cell type of a face of n nodes.
func faceType(n int) field.CellType {
	switch n {
	case 1:
		return field.Vertex
	case 2:
		return field.Line
	}
	return polygonType(n)
}

// structuredRange resolves a structured PointRange: the vertices of the
// index box, and its cell faces when one index is constant (quads in 3-D,
// segments in 2-D). For *FaceCenter locations the non-constant indices
// are cell indices.
func (p *ffcgParser) structuredRange(z *ffcgZone, b *ffcgBC, pt *Patch, faces *field.Zone) error {
	n := len(z.dims)
	var lo, hi [3]int
	for d := 0; d < n; d++ {
		lo[d], hi[d] = int(b.pointRange[d])-1, int(b.pointRange[n+d])-1
		if lo[d] > hi[d] {
			lo[d], hi[d] = hi[d], lo[d]
		}
	}
	// The constant direction: given by IFaceCenter..KFaceCenter, else the
	// first direction whose range is one index on the block boundary. For
	// face locations the other indices are cell indices, whose last cell
	// ends one vertex further.
	constant := -1
	switch b.loc {
	case "IFaceCenter", "JFaceCenter", "KFaceCenter":
		constant = int(b.loc[0] - 'I')
	default:
		for d := 0; d < n; d++ {
			if lo[d] == hi[d] && (lo[d] == 0 || lo[d] == z.dims[d]-1) && constant < 0 {
				constant = d
			}
		}
	}
	for d := 0; d < n; d++ {
		if b.loc != "Vertex" && d != constant {
			hi[d]++
		}
		if lo[d] < 0 || hi[d] >= z.dims[d] || (d == constant && lo[d] != hi[d]) {
			return p.errK(b.k, fmt.Sprintf("PointRange inside 1..%d in direction %d", z.dims[d], d+1), fmt.Sprintf("%d..%d", lo[d]+1, hi[d]+1), errSyntax)
		}
	}
	stride := [3]int{1, z.dims[0], 0}
	if n > 1 {
		stride[2] = z.dims[0] * z.dims[1]
	}
	for k := lo[2]; k <= hi[2]; k++ {
		for j := lo[1]; j <= hi[1]; j++ {
			for i := lo[0]; i <= hi[0]; i++ {
				pt.Points = append(pt.Points, int32(i*stride[0]+j*stride[1]+k*stride[2]))
			}
		}
	}
	if constant < 0 || n < 2 {
		return nil
	}
	var free []int
	for d := 0; d < n; d++ {
		if d != constant {
			free = append(free, d)
		}
	}
	at := func(c [3]int) int32 { return int32(c[0]*stride[0] + c[1]*stride[1] + c[2]*stride[2]) }
	if len(free) == 1 {
		a := free[0]
		for s := lo[a]; s < hi[a]; s++ {
			c := lo
			c[a] = s
			d := c
			d[a] = s + 1
			faces.AddCell(field.Line, at(c), at(d))
		}
		return nil
	}
	a, c2 := free[0], free[1]
	for t := lo[c2]; t < hi[c2]; t++ {
		for s := lo[a]; s < hi[a]; s++ {
			c := lo
			c[a], c[c2] = s, t
			q1, q2, q3 := c, c, c
			q1[a] = s + 1
			q2[a], q2[c2] = s+1, t+1
			q3[c2] = t + 1
			faces.AddCell(field.Quad, at(c), at(q1), at(q2), at(q3))
		}
	}
	return nil
}
