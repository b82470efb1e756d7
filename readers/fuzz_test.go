package readers

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"farforce/field"
)

// fuzzMaxBytes keeps every fuzz input's decompressed size small, so that
// a compressed seed cannot blow up memory (STYLE point 9).
const fuzzMaxBytes = 1 << 20

// fuzzSeedFiles lists the small files under testdata whose bytes seed
// FuzzReadVTK: the VTK-written fixtures (ASCII and BINARY, 4.2 and 5.1,
// every dataset kind, .gz and .zst copies) and the malformed corpus.
func fuzzSeedFiles(f *testing.F) []string {
	f.Helper()
	var out []string
	for _, pat := range []string{"../testdata/vtk/*.vtk*", "../testdata/malformed/*"} {
		m, err := filepath.Glob(pat)
		if err != nil {
			f.Fatal(err)
		}
		for _, p := range m {
			if st, err := os.Stat(p); err == nil && st.Size() <= 16<<10 {
				out = append(out, p)
			}
		}
	}
	if len(out) < 20 {
		f.Fatalf("only %d seed files found", len(out))
	}
	return out
}

// unsized hides the concrete type of a reader, so that ReadVTK cannot
// learn the stream size and must take its streaming path.
type unsized struct{ io.Reader }

// fuzzRead reads data with opt, turning a panic into a test failure.
func fuzzRead(t *testing.T, r io.Reader, opt Options) (f *field.Field, err error) {
	t.Helper()
	defer func() {
		if p := recover(); p != nil {
			t.Fatalf("panic on data (house rule 6): %v", p)
		}
	}()
	return ReadVTK(r, "fuzz.vtk", opt)
}

// FuzzReadVTK feeds arbitrary bytes to ReadVTK and checks, for every input:
// no panic; every error is an *Error; every successful read gives zones
// that pass field.Zone.Validate; 1 and 2 workers give bit-identical fields
// or identical errors (house rule 7); the sized (bytes.Reader) and
// streaming (size unknown) paths agree on success and on the field.
func FuzzReadVTK(f *testing.F) {
	for _, p := range fuzzSeedFiles(f) {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(b)
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		opt1 := Options{MaxBytes: fuzzMaxBytes, Workers: 1}
		opt2 := Options{MaxBytes: fuzzMaxBytes, Workers: 2}
		f1, err1 := fuzzRead(t, bytes.NewReader(data), opt1)
		f2, err2 := fuzzRead(t, bytes.NewReader(data), opt2)
		fs, errs := fuzzRead(t, unsized{bytes.NewReader(data)}, opt2)
		for _, err := range []error{err1, err2, errs} {
			var e *Error
			if err != nil && !errors.As(err, &e) {
				t.Fatalf("error is %T, not *Error: %v", err, err)
			}
		}
		if (err1 == nil) != (err2 == nil) || (err1 != nil && err1.Error() != err2.Error()) {
			t.Fatalf("1 vs 2 workers: errors differ:\n%v\n%v", err1, err2)
		}
		if (err1 == nil) != (errs == nil) {
			t.Fatalf("sized vs streaming: %v\n%v", err1, errs)
		}
		if err1 != nil {
			return
		}
		for _, z := range f1.Zones {
			if err := z.Validate(); err != nil {
				t.Fatalf("read succeeded with an invalid zone: %v", err)
			}
		}
		if d := diffFields(f1, f2); d != "" {
			t.Fatalf("1 vs 2 workers: %s", d)
		}
		if d := diffFields(f1, fs); d != "" {
			t.Fatalf("sized vs streaming: %s", d)
		}
	})
}

// diffFields describes the first difference between a and b, comparing
// floating-point data bit for bit (so NaN equals the same NaN); "" if equal.
func diffFields(a, b *field.Field) string {
	if len(a.Zones) != len(b.Zones) {
		return fmt.Sprintf("%d vs %d zones", len(a.Zones), len(b.Zones))
	}
	if fmt.Sprint(a.Warnings) != fmt.Sprint(b.Warnings) {
		return fmt.Sprintf("warnings %q vs %q", a.Warnings, b.Warnings)
	}
	for i := range a.Zones {
		za, zb := a.Zones[i], b.Zones[i]
		switch {
		case za.Name != zb.Name:
			return "zone names differ"
		case !sameBits(za.Points, zb.Points):
			return "points differ"
		case fmt.Sprint(za.Types) != fmt.Sprint(zb.Types):
			return "cell types differ"
		case fmt.Sprint(za.Offsets) != fmt.Sprint(zb.Offsets), fmt.Sprint(za.Conn) != fmt.Sprint(zb.Conn):
			return "connectivity differs"
		case fmt.Sprint(za.Blank) != fmt.Sprint(zb.Blank):
			return "blank masks differ"
		case len(za.Arrays) != len(zb.Arrays):
			return "array counts differ"
		}
		for k := range za.Arrays {
			x, y := &za.Arrays[k], &zb.Arrays[k]
			if x.Name != y.Name || x.Location != y.Location || x.Components != y.Components || !sameBits(x.Data, y.Data) {
				return fmt.Sprintf("array %d (%q) differs", k, x.Name)
			}
		}
	}
	return ""
}

func sameBits(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
			return false
		}
	}
	return true
}

// decimalToken is the number grammar of parseNumber's doc comment (legacy
// VTK ASCII numbers): optional sign, digits with an optional fraction (at
// least one digit), optional exponent. Hex floats and underscores, which
// strconv accepts, are outside it (FORMATS.md §1.9).
var decimalToken = regexp.MustCompile(`^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$`)

// specialToken is nan, inf or infinity in any case with an optional sign
// (VTK TestLegacyArrayInfNan accepts "-inf -nan", rejects "nan5", "infini").
var specialToken = regexp.MustCompile(`^[+-]?(?i:nan|inf|infinity)$`)

// FuzzParseNumber is a differential test of the reader's float parser
// against strconv.ParseFloat: for every token of the grammar the bits must
// equal strconv's (bitSize 64, or 32 when rounding to float32), and every
// token outside the grammar must be rejected.
func FuzzParseNumber(f *testing.F) {
	for _, s := range []string{
		"0", "-0", "1.5", "300.992", "-2.5e-05", "1e+20", "1e400", "-1e-400", "4.9e-324",
		"3.4028235e38", "3.4028236e38", "1.00000005960464477539062500", // float32 halfway case
		"123456789012345678901234567890", "0.000000000000000000000000001234", "9007199254740993",
		".5", "5.", "+7", "1e", "1e+", ".", "-", "e5", "0x1p-2", "1_000", "nan", "-nan", "+NaN",
		"Inf", "-inf", "Infinity", "nan5", "infini", "1.0.0", "1e5x", "0.1e-22", "1e22", "1e23",
		"-0.33333333333", "101325.87422", "2.2250738585072011e-308", "1.17549435e-38", "7e-46",
	} {
		f.Add([]byte(s), false)
		f.Add([]byte(s), true)
	}
	f.Fuzz(func(t *testing.T, tok []byte, f32 bool) {
		got, ok := parseNumber(tok, f32)
		s := string(tok)
		switch {
		case specialToken.MatchString(s):
			if !ok {
				t.Fatalf("%q rejected", s)
			}
			want := math.Inf(1)
			if strings.HasSuffix(lower(s), "nan") {
				if !math.IsNaN(got) {
					t.Fatalf("%q = %v, want NaN", s, got)
				}
				return
			}
			if s[0] == '-' {
				want = math.Inf(-1)
			}
			if got != want {
				t.Fatalf("%q = %v, want %v", s, got, want)
			}
		case decimalToken.MatchString(s):
			bits := 64
			if f32 {
				bits = 32
			}
			want, err := strconv.ParseFloat(s, bits)
			if err != nil && !errors.Is(err, strconv.ErrRange) {
				t.Fatalf("strconv rejects grammar token %q: %v", s, err)
			}
			if !ok {
				t.Fatalf("%q rejected, strconv gives %v", s, want)
			}
			if math.Float64bits(got) != math.Float64bits(want) {
				t.Fatalf("parseNumber(%q, f32=%v) = %v (%#x), strconv %v (%#x)", s, f32, got, math.Float64bits(got), want, math.Float64bits(want))
			}
		default:
			if ok {
				t.Fatalf("%q accepted (= %v), outside the number grammar", s, got)
			}
		}
	})
}
