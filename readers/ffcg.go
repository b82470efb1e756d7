package readers

import (
	"bytes"
	"io"

	"farforce/field"
)

// ffcgMagic is the first line of an ffcg file (docs/cgns-text-format.md §1).
const ffcgMagic = "ffcg 1"

// FFCGExt is the file name extension of the ffcg text format.
const FFCGExt = ".ffcg"

// CaseInfo is what an ffcg file carries besides the mesh and the arrays:
// the reference state and the boundary-condition patches. For a legacy VTK
// file it is empty.
type CaseInfo struct {
	// Reference holds the ReferenceState quantities of the first base by
	// SIDS name (Density, VelocityX, Pressure, Mach, Reynolds,
	// LengthReference, ...), DataConversion applied, in the file's units.
	Reference map[string]float64
	// DataClass and Units are the base-level DataClass and the five
	// DimensionalUnits (mass, length, time, temperature, angle) of the
	// first base; empty when absent.
	DataClass string
	Units     [5]string
	// Patches are the BC_t nodes of every zone, in file order.
	Patches []Patch
}

// Patch is one boundary condition: a named set of vertices and faces of a
// zone.
type Patch struct {
	Name   string // BC name
	Type   string // BCType, SIDS spelling (BCWall, BCFarfield, ...)
	Family string // FamilyName, if given
	Zone   int    // index of the zone in Field.Zones
	// Location is the GridLocation as written (Vertex, FaceCenter, ...).
	Location string
	// Points are the 0-based indices of the zone's points on the patch,
	// sorted and unique.
	Points []int32
	// Faces holds the patch faces as cells (quads and triangles of a 3-D
	// zone, segments of a 2-D zone) whose Points slice is the zone's own
	// (shared, not copied); nil when the patch has no faces.
	Faces *field.Zone
}

// IsWall reports whether the patch is a solid wall (BCWall and its
// viscous and inviscid variants).
func (p *Patch) IsWall() bool {
	switch p.Type {
	case "BCWall", "BCWallViscous", "BCWallViscousHeatFlux", "BCWallViscousIsothermal", "BCWallInviscid":
		return true
	}
	return false
}

// ffcgHook is carried by Options (unexported) from the public entry points
// of this file to read (open.go), which hands it to readFFCGIf.
type ffcgHook struct {
	info *CaseInfo // receives the case information when not nil
	only bool      // the input must be ffcg (ReadFFCG)
}

// ReadCase reads a solution file like ReadFile and also returns what the
// file carries besides the field: for an ffcg file its reference state and
// BC patches; for other formats an empty CaseInfo.
func ReadCase(path string, opt Options) (*field.Field, *CaseInfo, error) {
	info := &CaseInfo{}
	opt.ffcg = &ffcgHook{info: info}
	f, err := ReadFile(path, opt)
	if err != nil {
		return nil, nil, err
	}
	return f, info, nil
}

// ReadFFCG reads an ffcg stream (docs/cgns-text-format.md), plain or
// compressed with gzip or zstd, into a field with one zone per ffcg zone,
// and its case information. name is used in error messages; the stream
// size is known for *bytes.Reader, *strings.Reader and regular *os.File,
// as for ReadVTK. Input that is not ffcg (legacy VTK included) gives an
// *Error wrapping ErrUnknownFormat. Safe for concurrent use on different
// inputs.
func ReadFFCG(r io.Reader, name string, opt Options) (*field.Field, *CaseInfo, error) {
	info := &CaseInfo{}
	opt.ffcg = &ffcgHook{info: info, only: true}
	f, err := ReadVTK(r, name, opt)
	if err != nil {
		return nil, nil, err
	}
	return f, info, nil
}

// readFFCGIf parses s as ffcg when the stream starts with the ffcg magic
// line (handled is then true), or fails with ErrUnknownFormat when
// ReadFFCG asked for ffcg and the magic is missing. It is called by read
// (open.go) once the container has been unpacked.
func readFFCGIf(s *scanner, opt Options) (f *field.Field, handled bool, err error) {
	if err := s.fill(len(ffcgMagic) + 2); err != nil {
		return nil, true, err
	}
	b := s.buf[s.pos:s.end]
	ok := bytes.HasPrefix(b, []byte(ffcgMagic)) && (len(b) == len(ffcgMagic) || isSpace(b[len(ffcgMagic)]))
	only := opt.ffcg != nil && opt.ffcg.only
	if !ok && !only {
		return nil, false, nil
	}
	s.ascii = true
	if !ok {
		l, err := s.rawLine()
		if err != nil {
			return nil, true, err
		}
		return nil, true, &Error{File: s.name, Line: 1, Expected: quote([]byte(ffcgMagic)), Found: quote(l), Err: ErrUnknownFormat}
	}
	p := &ffcgParser{s: s, opt: opt}
	f, info, err := p.parse()
	if err != nil {
		return nil, true, err
	}
	f.Warnings = append(f.Warnings, s.warnings...)
	if opt.ffcg != nil && opt.ffcg.info != nil {
		*opt.ffcg.info = *info
	}
	return f, true, nil
}
