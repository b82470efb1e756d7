package main

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"farforce/readers"
	"farforce/surface"
)

// caseFile is a TOML case file: one simulation output, how to read it and
// what to check. Keys mirror the command-line flags (see caseHelp). Paths
// are resolved against the folder of the case file when loaded.
type caseFile struct {
	path string // as given
	dir  string // folder relative paths resolve against

	Files      []string       `toml:"files"`
	Flow       caseFlow       `toml:"flow"`
	Freestream caseFreestream `toml:"freestream"`
	Reference  caseReference  `toml:"reference"`
	Options    caseOptions    `toml:"options"`
	Surfaces   []caseSurface  `toml:"surface"`
	Sweeps     []caseSweep    `toml:"sweep"`
	Near       *caseNear      `toml:"near"`
	Gates      []caseGate     `toml:"gate"`
}

type caseFlow struct {
	Velocity               nameList    `toml:"velocity"`
	Pressure               string      `toml:"pressure"`
	Density                nameOrValue `toml:"density"`
	Viscosity              nameOrValue `toml:"viscosity"`
	KinematicViscosity     nameOrValue `toml:"kinematic_viscosity"`
	EddyViscosity          nameOrValue `toml:"eddy_viscosity"`
	KinematicEddyViscosity nameOrValue `toml:"kinematic_eddy_viscosity"`
	ReynoldsStress         string      `toml:"reynolds_stress"`
	Mask                   string      `toml:"mask"`
}

type caseFreestream struct {
	Velocity []float64 `toml:"velocity"`
	Speed    *float64  `toml:"speed"`
	Alpha    *float64  `toml:"alpha"`
	Beta     *float64  `toml:"beta"`
	Density  *float64  `toml:"density"`
	Pressure *float64  `toml:"pressure"`
}

type caseReference struct {
	Length       *float64  `toml:"length"`
	Area         *float64  `toml:"area"`
	MomentCenter []float64 `toml:"moment_center"`
	Up           []float64 `toml:"up"`
}

type caseOptions struct {
	Form         string `toml:"form"`
	NoConvection bool   `toml:"no_convection"`
	Workers      int    `toml:"workers"`
}

type caseSurface struct {
	Name string `toml:"name"`
	Spec string `toml:"spec"`
}

type caseSweep struct {
	Name     string    `toml:"name"`
	Surface  string    `toml:"surface"`
	Scales   scaleList `toml:"scales"`
	AgreeRel float64   `toml:"agree_rel"`
	AgreeAbs float64   `toml:"agree_abs"`
}

type caseNear struct {
	Wall                string    `toml:"wall"`
	Pressure            string    `toml:"pressure"`
	PressureCoefficient bool      `toml:"pressure_coefficient"`
	Shear               string    `toml:"shear"`
	SkinFriction        string    `toml:"skin_friction"`
	InsidePoint         []float64 `toml:"inside_point"`
	Inside              string    `toml:"inside"`
}

// caseGate is one pass/fail gate; see gateKinds for the kinds and the
// fields each needs.
type caseGate struct {
	Name      string   `toml:"name"`
	Kind      string   `toml:"kind"`
	Max       *float64 `toml:"max"`
	Expected  *float64 `toml:"expected"`
	Tolerance *float64 `toml:"tolerance"`
	On        string   `toml:"on"`
}

// nameList is an array name, or a list of 2-3 scalar array names.
type nameList []string

// UnmarshalTOML accepts a string or an array of strings.
func (n *nameList) UnmarshalTOML(v any) error {
	switch x := v.(type) {
	case string:
		*n = nameList{x}
		return nil
	case []any:
		for _, e := range x {
			s, ok := e.(string)
			if !ok {
				return fmt.Errorf("velocity: want array names (strings), found %v", e)
			}
			*n = append(*n, s)
		}
		return nil
	}
	return fmt.Errorf("velocity: want an array name or a list of names, found %v", v)
}

// nameOrValue is an array name or a constant, kept as the flag text.
type nameOrValue string

// UnmarshalTOML accepts a string (array name) or a number (constant).
func (q *nameOrValue) UnmarshalTOML(v any) error {
	switch x := v.(type) {
	case string:
		*q = nameOrValue(x)
	case int64:
		*q = nameOrValue(strconv.FormatInt(x, 10))
	case float64:
		*q = nameOrValue(strconv.FormatFloat(x, 'g', -1, 64))
	default:
		return fmt.Errorf("want an array name or a number, found %v", v)
	}
	return nil
}

// scaleList is the scale factors of a sweep: "A:B:N", "1,1.5,2" or an
// array of numbers.
type scaleList []float64

// UnmarshalTOML accepts a string (parsed as --scales) or an array of
// numbers.
func (s *scaleList) UnmarshalTOML(v any) error {
	switch x := v.(type) {
	case string:
		f, err := parseScales(x)
		*s = f
		return err
	case []any:
		var parts []string
		for _, e := range x {
			switch n := e.(type) {
			case int64:
				parts = append(parts, strconv.FormatInt(n, 10))
			case float64:
				parts = append(parts, strconv.FormatFloat(n, 'g', -1, 64))
			default:
				return fmt.Errorf("scales: want numbers, found %v", e)
			}
		}
		f, err := parseScales(strings.Join(parts, ","))
		*s = f
		return err
	}
	return fmt.Errorf("scales: want \"A:B:N\", \"1,1.5,2\" or an array of numbers, found %v", v)
}

// caseError is a problem with a case file: the file, the line (0 when
// unknown) and what is wrong.
type caseError struct {
	File string
	Line int
	Msg  string
}

func (e *caseError) Error() string {
	if e.Line > 0 {
		return fmt.Sprintf("case file %s, line %d: %s", e.File, e.Line, e.Msg)
	}
	return fmt.Sprintf("case file %s: %s", e.File, e.Msg)
}

// maxCaseBytes bounds the size of a case file.
const maxCaseBytes = 4 << 20

// loadCase reads and checks a case file: TOML syntax, known keys only,
// required fields, valid gates; relative paths are resolved against the
// file's folder. Errors are *caseError values (bad input).
func loadCase(path string) (*caseFile, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, &caseError{File: path, Msg: err.Error()}
	}
	if len(src) > maxCaseBytes {
		return nil, &caseError{File: path, Msg: fmt.Sprintf("%d bytes; a case file is at most %d", len(src), maxCaseBytes)}
	}
	c := &caseFile{path: path, dir: filepath.Dir(path)}
	md, err := toml.Decode(string(src), c)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			return nil, &caseError{File: path, Line: pe.Position.Line, Msg: strings.TrimPrefix(pe.Message, "toml: ")}
		}
		// Type mismatches come as "toml: line N (last key ...): ...".
		msg := strings.TrimPrefix(err.Error(), "toml: ")
		line := 0
		if m := decodeLineRE.FindStringSubmatch(msg); m != nil {
			line, _ = strconv.Atoi(m[1])
			msg = m[2]
		}
		return nil, &caseError{File: path, Line: line, Msg: msg}
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0]
		return nil, &caseError{File: path, Line: keyLine(src, k), Msg: fmt.Sprintf("unknown key %q%s", k.String(), knownKeysHint(k))}
	}
	if err := c.validate(); err != nil {
		return nil, &caseError{File: path, Line: err.line(src), Msg: err.msg}
	}
	return c, nil
}

// knownKeysHint names the tables a case file may hold, for a misplaced
// top-level key.
func knownKeysHint(k toml.Key) string {
	if len(k) == 1 {
		return " (top-level keys: files, and the tables [flow], [freestream], [reference], [options], [near], [[surface]], [[sweep]], [[gate]])"
	}
	return ""
}

// tableLine and keyLineRE recognise a table header and a key/value line.
var (
	tableLineRE = regexp.MustCompile(`^\s*\[\[?\s*([^\]]+?)\s*\]\]?\s*(#.*)?$`)
	keyLineRE   = regexp.MustCompile(`^\s*([A-Za-z0-9_\-."' ]+?)\s*=`)
	// decodeLineRE splits a decoding error of the toml package.
	decodeLineRE = regexp.MustCompile(`(?s)^line (\d+) (.*)$`)
)

// splitKey splits a dotted TOML key, dropping quotes and spaces.
func splitKey(s string) []string {
	parts := strings.Split(s, ".")
	for i, p := range parts {
		parts[i] = strings.Trim(strings.TrimSpace(p), `"'`)
	}
	return parts
}

// keyLine returns the 1-based line where key k is set in src, or 0. TOML
// libraries do not report the position of a decoded key, so the file is
// scanned: table headers set the current table, and a key line matches
// when table + key equals k.
func keyLine(src []byte, k toml.Key) int { return keyLineN(src, k, 0) }

// keyLineN returns the line of the (n+1)-th setting of key k (the n-th
// table of an array of tables), or 0.
func keyLineN(src []byte, k toml.Key, n int) int {
	want := strings.Join(k, ".")
	var table []string
	sc := bufio.NewScanner(bytes.NewReader(src))
	sc.Buffer(make([]byte, 64<<10), maxCaseBytes)
	for line := 1; sc.Scan(); line++ {
		text := sc.Text()
		if m := tableLineRE.FindStringSubmatch(text); m != nil {
			table = splitKey(m[1])
			if strings.Join(table, ".") == want {
				if n == 0 {
					return line
				}
				n--
			}
			continue
		}
		if m := keyLineRE.FindStringSubmatch(text); m != nil {
			full := append(append([]string{}, table...), splitKey(m[1])...)
			if strings.Join(full, ".") == want {
				if n == 0 {
					return line
				}
				n--
			}
		}
	}
	return 0
}

// fieldError is a validation problem located by a key (the line of its
// first setting, found by keyLine) or by nothing.
type fieldError struct {
	key []string
	nth int // which setting of key (the table of an array of tables)
	msg string
}

func (e *fieldError) line(src []byte) int {
	if len(e.key) == 0 {
		return 0
	}
	return keyLineN(src, e.key, e.nth)
}

func bad(key []string, format string, a ...any) *fieldError {
	return &fieldError{key: key, msg: fmt.Sprintf(format, a...)}
}

// badAt is a problem with table i of the array of tables named table; it
// is reported at that table's header line.
func badAt(table string, i int, format string, a ...any) *fieldError {
	return &fieldError{key: []string{table}, nth: i, msg: fmt.Sprintf(format, a...)}
}

// ffcgFiles reports whether every solution file of the case is named as
// an ffcg file (extension .ffcg, possibly followed by a compression
// extension), whose BCWall patches can give the near field without a
// [near] table; runCase checks that they do.
func (c *caseFile) ffcgFiles() bool {
	for _, f := range c.Files {
		if !strings.Contains(strings.ToLower(filepath.Base(f)), readers.FFCGExt) {
			return false
		}
	}
	return len(c.Files) > 0
}

// resolve returns p relative to the case file's folder unless absolute.
func (c *caseFile) resolve(p string) string {
	if p == "" || filepath.IsAbs(p) {
		return p
	}
	return filepath.Join(c.dir, p)
}

// resolveSpec resolves the path of a "file path=P" surface spec; other
// specs are returned unchanged.
func (c *caseFile) resolveSpec(spec string) (string, error) {
	s, err := surface.ParseSpec(spec)
	if err != nil {
		return spec, err
	}
	if fs, ok := s.(surface.FileSurface); ok && !filepath.IsAbs(fs.Path) {
		fs.Path = c.resolve(fs.Path)
		return fs.String(), nil
	}
	return spec, nil
}

// validate checks the required fields and the gates, names the unnamed
// surfaces and sweeps, and resolves paths.
func (c *caseFile) validate() *fieldError {
	if len(c.Files) == 0 {
		return bad(nil, "no solution files: add files = [\"solution.vtk\"]")
	}
	for i, f := range c.Files {
		c.Files[i] = c.resolve(f)
	}
	if len(c.Surfaces) == 0 && len(c.Sweeps) == 0 {
		return bad(nil, "nothing to compute: add a [[surface]] or a [[sweep]] table")
	}
	names := map[string]bool{}
	for i := range c.Surfaces {
		s := &c.Surfaces[i]
		if s.Name == "" {
			s.Name = fmt.Sprintf("surface %d", i+1)
		}
		if s.Spec == "" {
			return badAt("surface", i, "surface %q has no spec", s.Name)
		}
		spec, err := c.resolveSpec(s.Spec)
		if err != nil {
			return badAt("surface", i, "surface %q: %v", s.Name, err)
		}
		s.Spec = spec
		if names[s.Name] {
			return badAt("surface", i, "name %q used twice", s.Name)
		}
		names[s.Name] = true
	}
	for i := range c.Sweeps {
		s := &c.Sweeps[i]
		if s.Name == "" {
			s.Name = fmt.Sprintf("sweep %d", i+1)
		}
		if s.Surface == "" || len(s.Scales) == 0 {
			return badAt("sweep", i, "sweep %q needs surface = \"SPEC\" and scales", s.Name)
		}
		spec, err := c.resolveSpec(s.Surface)
		if err != nil {
			return badAt("sweep", i, "sweep %q: %v", s.Name, err)
		}
		s.Surface = spec
		if s.AgreeRel < 0 || s.AgreeAbs < 0 {
			return badAt("sweep", i, "sweep %q: agree_rel and agree_abs must be ≥ 0", s.Name)
		}
		if names[s.Name] {
			return badAt("sweep", i, "name %q used twice", s.Name)
		}
		names[s.Name] = true
	}
	if n := c.Near; n != nil {
		if (n.Wall == "") == (n.Inside == "") {
			return bad([]string{"near"}, "[near] needs exactly one of wall = \"FILE\" or inside = \"SPEC\"")
		}
		n.Wall = c.resolve(n.Wall)
		if n.Inside != "" {
			spec, err := c.resolveSpec(n.Inside)
			if err != nil {
				return bad([]string{"near", "inside"}, "%v", err)
			}
			n.Inside = spec
		}
	}
	for i := range c.Gates {
		if err := c.checkGate(i, names); err != nil {
			return err
		}
	}
	return nil
}
