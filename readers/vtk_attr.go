package readers

import (
	"fmt"
	"strconv"
	"strings"

	"farforce/field"
)

// section handles "POINT_DATA n" and "CELL_DATA n": the count must equal
// the number of points or (file) cells.
func (f *vtkFile) section(k keyLine) error {
	if !f.inAttr {
		if err := f.checkGeometry(k); err != nil {
			return err
		}
	}
	if err := f.argc(k, 1, k.f[0]+" n"); err != nil {
		return err
	}
	n, err := f.count(k, 1)
	if err != nil {
		return err
	}
	want, loc := f.numPoints(), field.AtPoints
	if k.key() == "cell_data" {
		want, loc = f.numCells(), field.AtCells
	}
	if n != int64(want) {
		return f.errKey(k, fmt.Sprintf("%d (the number of %ss)", want, loc), fmt.Sprint(n), errSyntax)
	}
	f.inAttr, f.loc, f.locN = true, loc, want
	return nil
}

// attribute reads one attribute block (SCALARS, VECTORS, NORMALS,
// TENSORS, TENSORS6, TEXTURE_COORDINATES, COLOR_SCALARS, GLOBAL_IDS,
// PEDIGREE_IDS, EDGE_FLAGS) (VTK legacy file format document, "Dataset
// attribute format"; TENSORS6 from vtkDataReader).
func (f *vtkFile) attribute(k keyLine) error {
	key := k.key()
	if err := f.argc(k, 2, k.f[0]+" name ..."); err != nil {
		return err
	}
	name := decodeName(k.f[1])
	comps, ti := 0, 2
	switch key {
	case "scalars":
		comps = 1
		if len(k.f) > 3 {
			c, err := strconv.Atoi(k.f[3])
			if err != nil || c < 1 || c > 4 {
				return f.errKey(k, "1 to 4 components", quote([]byte(k.f[3])), errSyntax)
			}
			comps = c
		}
	case "vectors", "normals":
		comps = 3
	case "tensors":
		comps = 9
	case "tensors6":
		comps = 6
	case "global_ids", "pedigree_ids", "edge_flags":
		comps = 1
	case "texture_coordinates":
		if err := f.argc(k, 3, "TEXTURE_COORDINATES name dim dataType"); err != nil {
			return err
		}
		c, err := strconv.Atoi(k.f[2])
		if err != nil || c < 1 || c > 3 {
			return f.errKey(k, "dimension 1 to 3", quote([]byte(k.f[2])), errSyntax)
		}
		comps, ti = c, 3
	case "color_scalars":
		c, err := strconv.Atoi(k.f[2])
		if err != nil || c < 1 || c > 4 {
			return f.errKey(k, "1 to 4 colour components", quote([]byte(k.f[2])), errSyntax)
		}
		return f.colorScalars(k, name, c)
	}
	t, err := f.dtype(k, ti)
	if err != nil {
		return err
	}
	if key == "scalars" {
		// LOOKUP_TABLE tableName must follow; tolerate its absence.
		next, err := f.s.peekKey()
		if err != nil {
			return err
		}
		if next == "lookup_table" {
			if _, err := f.s.rawLine(); err != nil {
				return err
			}
		}
	}
	return f.array(k.f[0], name, comps, int64(f.locN), t)
}

// array reads (or skips, when not wanted) one array of n tuples of comps
// values of type t at the current location, then any METADATA block.
func (f *vtkFile) array(sec, name string, comps int, n int64, t dtype) error {
	total := n * int64(comps)
	// Whatever happens to the values (read, skipped), the stream must hold
	// them, so they back an implicit grid of up to 8n points (see build).
	f.backed = max(f.backed, n)
	what := fmt.Sprintf("values of %q (%d × %d)", name, n, comps)
	if t.kind == kString {
		f.s.warn("string array %q skipped", name)
		if err := f.s.skipBlock(total, t, sec, what); err != nil {
			return err
		}
		return f.afterArray()
	}
	if !f.opt.wants(name) && !isGhost(name) {
		if err := f.s.skipBlock(total, t, sec, what); err != nil {
			return err
		}
		return f.afterArray()
	}
	d, err := f.s.readFloats(total, t, sec, what)
	if err != nil {
		return err
	}
	f.add(name, comps, d)
	return f.afterArray()
}

// add stores an array at the current location; ghost arrays become the
// blank mask (cells) or are dropped (points).
func (f *vtkFile) add(name string, comps int, d []float64) {
	if isGhost(name) {
		if f.loc == field.AtCells && comps == 1 {
			f.ghost = d
		}
		return
	}
	a := field.Array{Name: name, Location: f.loc, Components: comps, Data: d}
	if f.loc == field.AtCells {
		f.cellArrays = append(f.cellArrays, a)
	} else {
		f.pointArrays = append(f.pointArrays, a)
	}
}

// colorScalars reads "COLOR_SCALARS name nValues": floats in [0,1] in
// ASCII, unsigned chars (scaled by 1/255) in BINARY.
func (f *vtkFile) colorScalars(k keyLine, name string, comps int) error {
	t := dtypes["float"]
	if !f.s.ascii {
		t = dtypes["unsigned_char"]
	}
	before := len(f.pointArrays) + len(f.cellArrays)
	if err := f.array(k.f[0], name, comps, int64(f.locN), t); err != nil {
		return err
	}
	if !f.s.ascii && len(f.pointArrays)+len(f.cellArrays) > before {
		if a := f.last(name); a != nil {
			for i := range a.Data {
				a.Data[i] /= 255
			}
		}
	}
	return nil
}

// last returns the most recently added array called name at the current
// location, or nil.
func (f *vtkFile) last(name string) *field.Array {
	l := f.pointArrays
	if f.loc == field.AtCells {
		l = f.cellArrays
	}
	if len(l) > 0 && l[len(l)-1].Name == name {
		return &l[len(l)-1]
	}
	return nil
}

// lookupTable skips a standalone "LOOKUP_TABLE name size": size RGBA
// tuples, floats in ASCII, unsigned chars in BINARY.
func (f *vtkFile) lookupTable(k keyLine) error {
	if len(k.f) < 3 {
		f.s.warn("LOOKUP_TABLE %q without a size ignored", strings.Join(k.f[1:], " "))
		return nil
	}
	n, err := f.count(k, 2)
	if err != nil {
		return err
	}
	t := dtypes["float"]
	if !f.s.ascii {
		t = dtypes["unsigned_char"]
	}
	if err := f.s.skipBlock(4*n, t, "LOOKUP_TABLE", "colour values"); err != nil {
		return err
	}
	return f.afterArray()
}

// fieldBlock reads "FIELD name k" and its k arrays "name comps tuples
// type" (or NULL_ARRAY). Inside POINT_DATA/CELL_DATA (attr) arrays with
// one tuple per point/cell are kept; others, and every array of a
// dataset-level FIELD block, are skipped and noted in the warnings.
func (f *vtkFile) fieldBlock(k keyLine, attr bool) error {
	if err := f.argc(k, 2, "FIELD name numArrays"); err != nil {
		return err
	}
	na, err := f.count(k, 2)
	if err != nil {
		return err
	}
	var skipped []string
	for i := int64(0); i < na; i++ {
		ak, ok, err := f.s.nextKeyLine()
		if err != nil {
			return err
		}
		if !ok {
			return f.errKey(k, fmt.Sprintf("%d arrays", na), fmt.Sprintf("%d before EOF", i), ErrTruncated)
		}
		if ak.key() == "null_array" {
			continue
		}
		if len(ak.f) < 4 {
			return f.errKey(ak, "arrayName numComponents numTuples dataType", strings.Join(ak.f, " "), errSyntax)
		}
		name := decodeName(ak.f[0])
		comps, err := f.count(ak, 1)
		if err != nil {
			return err
		}
		tuples, err := f.count(ak, 2)
		if err != nil {
			return err
		}
		t, err := f.dtype(ak, 3)
		if err != nil {
			return err
		}
		if comps < 1 || comps > 1<<20 {
			return f.errKey(ak, "1 or more components", fmt.Sprint(comps), errSyntax)
		}
		if tuples > 1<<40 {
			return f.errKey(ak, "a plausible tuple count", fmt.Sprint(tuples), ErrTooLarge)
		}
		if !attr || tuples != int64(f.locN) {
			skipped = append(skipped, name)
			if err := f.s.skipBlock(comps*tuples, t, name, "values"); err != nil {
				return err
			}
			if err := f.afterArray(); err != nil {
				return err
			}
			continue
		}
		if err := f.array(name, name, int(comps), tuples, t); err != nil {
			return err
		}
	}
	if len(skipped) > 0 {
		where := "dataset-level"
		if attr {
			where = f.loc.String() + " data, tuple count not matching,"
		}
		f.s.warn("%s FIELD %q arrays skipped: %s", where, decodeName(k.f[1]), strings.Join(skipped, ", "))
	}
	return nil
}
