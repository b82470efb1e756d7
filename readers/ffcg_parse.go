package readers

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"farforce/field"
)

// ffcgParser is the state of one ffcg parse: statements are read one by
// one, value blocks are parsed in parallel chunks by the scanner, and each
// zone is converted to a field.Zone when its block closes, so that only
// one zone's raw data is held at a time.
type ffcgParser struct {
	s    *scanner
	opt  Options
	out  *field.Field
	info *CaseInfo

	base      *ffcgBase
	bases     int
	zoneBases []string // base name of each zone, for naming
	unitsWarn bool
}

// ffcgBase is the open base: its dimensions and base-level settings.
type ffcgBase struct {
	name             string
	cellDim, physDim int
	ref              map[string]float64 // base-level ReferenceState
}

// stmtLine returns the next statement line with its comment removed;
// ok is false at end of input.
func (p *ffcgParser) stmtLine() (keyLine, bool, error) {
	for {
		k, ok, err := p.s.nextKeyLine()
		if err != nil || !ok {
			return k, ok, err
		}
		for i, t := range k.f {
			if strings.HasPrefix(t, "#") {
				k.f = k.f[:i]
				break
			}
		}
		if len(k.f) > 0 {
			return k, true, nil
		}
	}
}

// errK returns an error positioned at statement k.
func (p *ffcgParser) errK(k keyLine, expected, found string, err error) *Error {
	sec := ""
	if len(k.f) > 0 {
		if _, num := parseNumber([]byte(k.f[0]), false); num {
			// A value where a statement should be: the block before it
			// holds more values than its data statement declares.
			found += " (more values than the data statement declares?)"
		} else {
			sec = k.f[0]
			if len(k.f) > 1 && !strings.Contains(k.f[1], "=") {
				sec += " " + k.f[1]
			}
		}
	}
	return &Error{File: p.s.name, Line: k.line, Section: sec, Expected: expected, Found: found, Err: err}
}

// errEOF returns the error for input that ends inside block what.
func (p *ffcgParser) errEOF(what string) *Error {
	return &Error{File: p.s.name, Line: p.s.line, Expected: "end of " + what, Found: "end of file", Err: ErrTruncated}
}

// stmt is a statement split into positional tokens and Key=value
// attributes (keys lower-cased).
type stmt struct {
	k     keyLine
	pos   []string
	attrs map[string]string
	keys  map[string]string // lower-case key -> key as written
}

// split parses statement k; allowed lists the attribute keys it may have
// (lower case); it needs at least minPos and at most maxPos positional
// tokens besides the keyword.
func (p *ffcgParser) split(k keyLine, minPos, maxPos int, usage string, allowed ...string) (stmt, error) {
	st := stmt{k: k, attrs: map[string]string{}, keys: map[string]string{}}
	for _, t := range k.f[1:] {
		key, val, ok := strings.Cut(t, "=")
		if !ok {
			st.pos = append(st.pos, t)
			continue
		}
		lk := lower(key)
		known := false
		for _, a := range allowed {
			known = known || a == lk
		}
		if !known {
			return st, p.errK(k, usage, quote([]byte(t)), errSyntax)
		}
		if _, dup := st.attrs[lk]; dup {
			return st, p.errK(k, "each attribute once", quote([]byte(key))+" twice", errSyntax)
		}
		st.attrs[lk], st.keys[lk] = val, key
	}
	if len(st.pos) < minPos || len(st.pos) > maxPos {
		return st, p.errK(k, usage, fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	return st, nil
}

// ints parses attribute key of st as a comma-separated list of n integers
// (n < 0: any number, at least one); absent gives nil.
func (p *ffcgParser) ints(st stmt, key string, n int, what string) ([]int64, error) {
	v, ok := st.attrs[key]
	if !ok {
		return nil, nil
	}
	parts := strings.Split(v, ",")
	if n >= 0 && len(parts) != n {
		return nil, p.errK(st.k, fmt.Sprintf("%s=%s", st.keys[key], what), quote([]byte(v)), errSyntax)
	}
	out := make([]int64, len(parts))
	for i, s := range parts {
		x, err := strconv.ParseInt(s, 10, 64)
		if err != nil {
			return nil, p.errK(st.k, fmt.Sprintf("%s=%s", st.keys[key], what), quote([]byte(v)), errSyntax)
		}
		out[i] = x
	}
	return out, nil
}

// enum matches word against the SIDS spellings in names, ignoring case,
// and returns the canonical spelling.
func enum(word string, names []string) (string, bool) {
	for _, n := range names {
		if strings.EqualFold(word, n) {
			return n, true
		}
	}
	return "", false
}

// keyword reports whether the statement's keyword is kw (any case).
func keyword(k keyLine, kw string) bool { return strings.EqualFold(k.f[0], kw) }

// endOf checks a closing line "end [KEYWORD]" of block kw; isEnd is false
// when k is not an end line.
func (p *ffcgParser) endOf(k keyLine, kw string) (isEnd bool, err error) {
	if !keyword(k, "end") {
		return false, nil
	}
	if len(k.f) > 2 || (len(k.f) == 2 && !strings.EqualFold(k.f[1], kw)) {
		return true, p.errK(k, "end or end "+kw, quote([]byte(strings.Join(k.f, " "))), errSyntax)
	}
	return true, nil
}

// blockStmt returns the next statement inside a block opened by keyword
// kw; what names the block in the error for a file that ends inside it.
// end reports that the statement is the block's end line.
func (p *ffcgParser) blockStmt(what, kw string) (k keyLine, end bool, err error) {
	k, ok, err := p.stmtLine()
	if err != nil {
		return k, false, err
	}
	if !ok {
		return k, false, p.errEOF(what)
	}
	end, err = p.endOf(k, kw)
	return k, end, err
}

// dataStmt is blockStmt for a block that holds only data statements: it
// returns the next statement's data header (h.k is the statement).
func (p *ffcgParser) dataStmt(kw string) (h dataHdr, end bool, err error) {
	k, end, err := p.blockStmt(kw, kw)
	if end || err != nil {
		return dataHdr{}, end, err
	}
	if !keyword(k, "data") {
		return dataHdr{}, false, p.errK(k, "data or end", quote([]byte(k.f[0])), errSyntax)
	}
	h, err = p.dataHeader(k)
	return h, false, err
}

// parse reads the whole stream.
func (p *ffcgParser) parse() (*field.Field, *CaseInfo, error) {
	if _, err := p.s.rawLine(); err != nil { // the magic line, checked by readFFCGIf
		return nil, nil, err
	}
	p.out = &field.Field{}
	p.info = &CaseInfo{}
	for {
		k, ok, err := p.stmtLine()
		if err != nil {
			return nil, nil, err
		}
		if !ok {
			break
		}
		if !keyword(k, "base") {
			return nil, nil, p.errK(k, "base", quote([]byte(k.f[0])), ErrUnknownFormat)
		}
		if err := p.parseBase(k); err != nil {
			return nil, nil, err
		}
	}
	if p.bases == 0 {
		return nil, nil, &Error{File: p.s.name, Line: p.s.line, Expected: "a base", Found: "end of file", Err: ErrTruncated}
	}
	if p.bases > 1 {
		for i, z := range p.out.Zones {
			z.Name = p.zoneBases[i] + "/" + z.Name
		}
	}
	return p.out, p.info, nil
}

// SIDS enumerations (FORMATS.md §2.2).
var (
	dataClasses = []string{"Null", "UserDefined", "Dimensional", "NormalizedByDimensional",
		"NormalizedByUnknownDimensional", "NondimensionalParameter", "DimensionlessConstant"}
	unitNames = [5][]string{
		{"Null", "UserDefined", "Kilogram", "Gram", "Slug", "PoundMass"},
		{"Null", "UserDefined", "Meter", "Centimeter", "Millimeter", "Foot", "Inch"},
		{"Null", "UserDefined", "Second"},
		{"Null", "UserDefined", "Kelvin", "Celsius", "Rankine", "Fahrenheit"},
		{"Null", "UserDefined", "Degree", "Radian"},
	}
	bcTypes = []string{"BCWall", "BCWallViscous", "BCWallViscousHeatFlux", "BCWallViscousIsothermal",
		"BCWallInviscid", "BCFarfield", "BCInflow", "BCInflowSubsonic", "BCInflowSupersonic",
		"BCOutflow", "BCOutflowSubsonic", "BCOutflowSupersonic", "BCSymmetryPlane", "BCSymmetryPolar",
		"BCExtrapolate", "BCDirichlet", "BCNeumann", "BCGeneral", "BCTunnelInflow", "BCTunnelOutflow",
		"BCAxisymmetricWedge", "BCDegenerateLine", "BCDegeneratePoint", "FamilySpecified", "UserDefined", "Null"}
	gridLocations = []string{"Vertex", "CellCenter", "FaceCenter", "IFaceCenter", "JFaceCenter", "KFaceCenter", "EdgeCenter"}
)

// parseBase reads a base block opened by k.
func (p *ffcgParser) parseBase(k keyLine) error {
	const usage = "base NAME CellDimension=c PhysicalDimension=p"
	st, err := p.split(k, 1, 1, usage, "celldimension", "physicaldimension")
	if err != nil {
		return err
	}
	cd, err := p.ints(st, "celldimension", 1, "1, 2 or 3")
	if err != nil {
		return err
	}
	pd, err := p.ints(st, "physicaldimension", 1, "CellDimension to 3")
	if err != nil {
		return err
	}
	if cd == nil || pd == nil {
		return p.errK(k, usage, "a missing dimension", errSyntax)
	}
	if cd[0] < 1 || cd[0] > 3 || pd[0] < cd[0] || pd[0] > 3 {
		return p.errK(k, "1 <= CellDimension <= PhysicalDimension <= 3", fmt.Sprintf("%d and %d", cd[0], pd[0]), errSyntax)
	}
	p.base = &ffcgBase{name: decodeName(st.pos[0]), cellDim: int(cd[0]), physDim: int(pd[0])}
	p.bases++
	first := p.bases == 1
	for {
		k, end, err := p.blockStmt("base "+p.base.name, "base")
		if end || err != nil {
			return err
		}
		switch {
		case keyword(k, "zone"):
			err = p.parseZone(k)
		case keyword(k, "DataClass"):
			var c string
			c, err = p.dataClass(k)
			if first {
				p.info.DataClass = c
			}
		case keyword(k, "DimensionalUnits"):
			var u [5]string
			u, err = p.units(k)
			if first {
				p.info.Units = u
			}
		case keyword(k, "ReferenceState"):
			var ref map[string]float64
			ref, err = p.referenceState(k)
			p.base.ref = ref
			if first {
				p.info.Reference = ref
			}
		default:
			err = p.errK(k, "zone, DataClass, DimensionalUnits, ReferenceState or end", quote([]byte(k.f[0])), ErrUnknownFormat)
		}
		if err != nil {
			return err
		}
	}
}

// dataClass reads "DataClass CLASS".
func (p *ffcgParser) dataClass(k keyLine) (string, error) {
	if len(k.f) != 2 {
		return "", p.errK(k, "DataClass CLASS", fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	c, ok := enum(k.f[1], dataClasses)
	if !ok {
		return "", p.errK(k, "a DataClass_t value", quote([]byte(k.f[1])), ErrUnknownFormat)
	}
	return c, nil
}

// units reads "DimensionalUnits MASS LENGTH TIME TEMPERATURE ANGLE" and
// warns (once) about units other than SI.
func (p *ffcgParser) units(k keyLine) ([5]string, error) {
	var u [5]string
	if len(k.f) != 6 {
		return u, p.errK(k, "DimensionalUnits MASS LENGTH TIME TEMPERATURE ANGLE", fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	if err := p.unitList(k, k.f[1:], &u); err != nil {
		return u, err
	}
	return u, nil
}

// unitList resolves five unit names into u.
func (p *ffcgParser) unitList(k keyLine, words []string, u *[5]string) error {
	for i, w := range words {
		n, ok := enum(w, unitNames[i])
		if !ok {
			return p.errK(k, "one of "+strings.Join(unitNames[i], ", "), quote([]byte(w)), ErrUnknownFormat)
		}
		u[i] = n
	}
	si := [5]string{"Kilogram", "Meter", "Second", "Kelvin", ""}
	for i := 0; i < 4; i++ {
		if u[i] != si[i] && u[i] != "Null" && !p.unitsWarn {
			p.unitsWarn = true
			p.s.warn("line %d: units %s are not converted; farforce assumes SI values", k.line, strings.Join(u[:], " "))
		}
	}
	return nil
}

// referenceState reads a ReferenceState block opened by k: lines
// "NAME = VALUE" or one-value data statements.
func (p *ffcgParser) referenceState(k keyLine) (map[string]float64, error) {
	if len(k.f) > 2 {
		return nil, p.errK(k, "ReferenceState [NAME]", fmt.Sprintf("%d fields", len(k.f)), errSyntax)
	}
	ref := map[string]float64{}
	for {
		k, end, err := p.blockStmt("ReferenceState", "ReferenceState")
		if err != nil {
			return nil, err
		}
		if end {
			return ref, nil
		}
		var name string
		var v float64
		switch {
		case keyword(k, "data"):
			h, err := p.dataHeader(k)
			if err != nil {
				return nil, err
			}
			if err := p.wantCount(h, 1, "one value"); err != nil {
				return nil, err
			}
			d, err := p.readData(h)
			if err != nil {
				return nil, err
			}
			name, v = h.name, d[0]
		case len(k.f) == 3 && k.f[1] == "=":
			x, ok := parseNumber([]byte(k.f[2]), false)
			if !ok {
				return nil, p.errK(k, "NAME = NUMBER", quote([]byte(k.f[2])), errSyntax)
			}
			name, v = decodeName(k.f[0]), x
		case keyword(k, "DataClass"):
			if _, err := p.dataClass(k); err != nil {
				return nil, err
			}
			continue
		case keyword(k, "DimensionalUnits"):
			if _, err := p.units(k); err != nil {
				return nil, err
			}
			continue
		default:
			return nil, p.errK(k, "NAME = VALUE, data or end", quote([]byte(strings.Join(k.f, " "))), errSyntax)
		}
		if _, dup := ref[name]; dup {
			return nil, p.errK(k, "each quantity once", quote([]byte(name))+" twice", errSyntax)
		}
		ref[name] = v
	}
}

// ffcgType is a SIDS data type of a data statement.
type ffcgType struct {
	name string
	t    dtype // the scanner's layout, for number parsing
	int  bool
}

var ffcgTypes = []ffcgType{
	{"R4", dtypes["float"], false},
	{"R8", dtypes["double"], false},
	{"I4", dtypes["int"], true},
	{"I8", dtypes["long"], true},
	{"C1", dtypes["string"], false},
}

// dataHdr is a parsed data statement.
type dataHdr struct {
	k             keyLine
	name          string
	typ           ffcgType
	count         int64
	comps         int
	scale, offset float64
	conv          bool
}

// dataHeader parses "data NAME TYPE COUNT [attributes]".
func (p *ffcgParser) dataHeader(k keyLine) (dataHdr, error) {
	const usage = "data NAME TYPE COUNT [Components=k] [DataConversion=scale,offset] [DataClass=C] [DimensionalUnits=...]"
	st, err := p.split(k, 3, 3, usage, "components", "dataconversion", "dataclass", "dimensionalunits")
	if err != nil {
		return dataHdr{}, err
	}
	h := dataHdr{k: k, name: decodeName(st.pos[0]), comps: 1, scale: 1}
	found := false
	for _, t := range ffcgTypes {
		if strings.EqualFold(st.pos[1], t.name) {
			h.typ, found = t, true
		}
	}
	if !found {
		return h, p.errK(k, "a data type R4, R8, I4, I8 or C1", quote([]byte(st.pos[1])), ErrUnknownFormat)
	}
	h.count, err = strconv.ParseInt(st.pos[2], 10, 64)
	if err != nil || h.count < 0 {
		return h, p.errK(k, "a non-negative integer count", quote([]byte(st.pos[2])), errSyntax)
	}
	if c, err := p.ints(st, "components", 1, "a component count 1 to 64"); err != nil {
		return h, err
	} else if c != nil {
		if c[0] < 1 || c[0] > 64 {
			return h, p.errK(k, "Components from 1 to 64", fmt.Sprint(c[0]), errSyntax)
		}
		h.comps = int(c[0])
	}
	if v, ok := st.attrs["dataconversion"]; ok {
		a, b, ok2 := strings.Cut(v, ",")
		s, ok3 := parseNumber([]byte(a), false)
		o, ok4 := parseNumber([]byte(b), false)
		if !ok2 || !ok3 || !ok4 {
			return h, p.errK(k, "DataConversion=scale,offset", quote([]byte(v)), errSyntax)
		}
		h.scale, h.offset, h.conv = s, o, true
	}
	if v, ok := st.attrs["dataclass"]; ok {
		if _, ok := enum(v, dataClasses); !ok {
			return h, p.errK(k, "a DataClass_t value", quote([]byte(v)), ErrUnknownFormat)
		}
	}
	if v, ok := st.attrs["dimensionalunits"]; ok {
		w := strings.Split(v, ",")
		if len(w) != 5 {
			return h, p.errK(k, "DimensionalUnits=mass,length,time,temperature,angle", quote([]byte(v)), errSyntax)
		}
		var u [5]string
		if err := p.unitList(k, w, &u); err != nil {
			return h, err
		}
	}
	return h, nil
}

// wantCount checks the declared count of h against the expected one.
func (p *ffcgParser) wantCount(h dataHdr, n int64, what string) error {
	if h.count != n {
		return p.errK(h.k, fmt.Sprintf("%d values (%s)", n, what), fmt.Sprint(h.count), errSyntax)
	}
	return nil
}

// readData reads the value block of h as float64, DataConversion applied.
func (p *ffcgParser) readData(h dataHdr) ([]float64, error) {
	if h.typ.name == "C1" {
		return nil, p.errK(h.k, "a numeric data type", "C1", errSyntax)
	}
	d, err := p.s.readFloats(h.count, h.typ.t, "data "+h.name, "values")
	if err != nil {
		return nil, err
	}
	if h.conv {
		for i := range d {
			d[i] = d[i]*h.scale + h.offset
		}
	}
	return d, nil
}

// readIndices reads the value block of h as int32 (an integer type is
// required).
func (p *ffcgParser) readIndices(h dataHdr) ([]int32, error) {
	if !h.typ.int {
		return nil, p.errK(h.k, "an integer data type I4 or I8", h.typ.name, errSyntax)
	}
	if h.count > math.MaxInt32 {
		return nil, p.errK(h.k, "at most 2^31-1 values", fmt.Sprint(h.count), ErrTooLarge)
	}
	return p.s.readInts(h.count, h.typ.t, "data "+h.name, "values")
}

// skipData consumes the value block of h.
func (p *ffcgParser) skipData(h dataHdr) error {
	if h.typ.name == "C1" {
		return p.s.skipASCII(1, "data "+h.name, "string")
	}
	return p.s.skipBlock(h.count, h.typ.t, "data "+h.name, "values")
}
