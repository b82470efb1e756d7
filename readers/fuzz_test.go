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
	"sort"
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
			// Small files only; the compression bombs are checked by
			// TestMalformedHugeCountsBoundedMemory.
			if st, err := os.Stat(p); err == nil && st.Size() <= 16<<10 && !strings.Contains(p, "bomb") {
				out = append(out, p)
			}
		}
	}
	if len(out) < 20 {
		f.Fatalf("only %d seed files found", len(out))
	}
	return out
}

// fuzzUnsized hides the concrete type of a reader, so that ReadVTK cannot
// learn the stream size and must take its streaming path.
type fuzzUnsized struct{ io.Reader }

// failOnPanic, deferred by a reading function, turns a panic into a test
// failure (house rule 6: never panic on data). It must be the deferred
// function itself, so that its recover stops the panic.
func failOnPanic(t *testing.T) {
	if p := recover(); p != nil {
		t.Helper()
		t.Fatalf("panic on data (house rule 6): %v", p)
	}
}

// fuzzAgreeErrors checks the errors of one input read with 1 worker
// (err1), 2 workers (err2) and 2 workers streaming (errs): each is nil or
// an *Error, err1 and err2 are identical (house rule 7), and the sized and
// streaming reads agree on success.
func fuzzAgreeErrors(t *testing.T, err1, err2, errs error) {
	t.Helper()
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
}

// fuzzRead reads data with opt, turning a panic into a test failure.
func fuzzRead(t *testing.T, r io.Reader, opt Options) (f *field.Field, err error) {
	t.Helper()
	defer failOnPanic(t)
	return ReadVTK(r, "fuzz.vtk", opt)
}

// FuzzReadVTK feeds arbitrary bytes to ReadVTK and checks, for every input:
// no panic; every error is an *Error; every successful read gives zones
// that pass field.Zone.Validate; 1 and 2 workers give bit-identical fields
// or identical errors (house rule 7); the sized (bytes.Reader) and
// streaming (size unknown) paths agree on success and on the field; a read
// keeping only one array (Options.Arrays) gives the same zone restricted to
// it. Run with a short minimisation time, e.g.
//
//	go test -run XXX -fuzz '^FuzzReadVTK$' -fuzztime 300s -fuzzminimizetime 2s ./readers/
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
		fs, errs := fuzzRead(t, fuzzUnsized{bytes.NewReader(data)}, opt2)
		fuzzAgreeErrors(t, err1, err2, errs)
		if err1 != nil {
			return
		}
		for _, z := range f1.Zones {
			if err := z.Validate(); err != nil {
				t.Fatalf("read succeeded with an invalid zone: %v", err)
			}
		}
		if d := fuzzDiffFields(f1, f2); d != "" {
			t.Fatalf("1 vs 2 workers: %s", d)
		}
		if d := fuzzDiffFields(f1, fs); d != "" {
			t.Fatalf("sized vs streaming: %s", d)
		}
		// WriteVTK round trip: BINARY 5.1 must give back the zone bit for
		// bit, ASCII 4.2 the same values (NaN payloads may be normalised).
		// Skipped for big zones (implicit structured grids) to keep each
		// execution cheap.
		if z := f1.Zones[0]; z.NumPoints()+z.NumCells() > 1<<16 {
			return
		}
		for _, wo := range []WriteOptions{{Binary: true, Version: "5.1"}, {Version: "4.2"}} {
			var buf bytes.Buffer
			if err := WriteVTK(&buf, f1.Zones[0], wo); err != nil {
				t.Fatalf("WriteVTK(%+v) of a zone read successfully: %v", wo, err)
			}
			back, err := fuzzRead(t, bytes.NewReader(buf.Bytes()), Options{Workers: 1})
			if err != nil {
				t.Fatalf("WriteVTK(%+v) output does not read back: %v", wo, err)
			}
			bz := *back.Zones[0]
			bz.Name = f1.Zones[0].Name
			orig := *f1.Zones[0]
			// WriteVTK groups arrays by kind (SCALARS, VECTORS, FIELD), so
			// compare them in (location, name) order.
			fuzzSortArrays(&bz)
			fuzzSortArrays(&orig)
			if !wo.Binary {
				fuzzNormaliseNaN(&bz)
				fuzzNormaliseNaN(&orig)
				if d := fuzzDiffFields(&field.Field{Zones: []*field.Zone{&orig}}, &field.Field{Zones: []*field.Zone{&bz}}); d != "" {
					t.Fatalf("WriteVTK(%+v) round trip: %s", wo, d)
				}
				continue
			}
			if d := fuzzDiffFields(&field.Field{Zones: []*field.Zone{&orig}}, &field.Field{Zones: []*field.Zone{&bz}}); d != "" {
				t.Fatalf("WriteVTK(%+v) round trip: %s", wo, d)
			}
		}
		// Options.Arrays: keeping only the first array goes through the
		// skip paths for the others and must give the same zone restricted
		// to that array.
		z := f1.Zones[0]
		if len(z.Arrays) == 0 {
			return
		}
		keep := z.Arrays[0].Name
		ff, err := fuzzRead(t, bytes.NewReader(data), Options{MaxBytes: fuzzMaxBytes, Workers: 1, Arrays: []string{keep}})
		if err != nil {
			t.Fatalf("full read succeeds, read keeping only %q fails: %v", keep, err)
		}
		want := *z
		want.Arrays = nil
		for _, a := range z.Arrays {
			if a.Name == keep {
				want.Arrays = append(want.Arrays, a)
			}
		}
		if d := fuzzDiffFields(&field.Field{Zones: []*field.Zone{&want}, Warnings: f1.Warnings}, ff); d != "" {
			t.Fatalf("keeping only %q: %s", keep, d)
		}
	})
}

// fuzzDiffFields describes the first difference between a and b, comparing
// floating-point data bit for bit (so NaN equals the same NaN); "" if equal.
func fuzzDiffFields(a, b *field.Field) string {
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
		case !fuzzSameBits(za.Points, zb.Points):
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
			if x.Name != y.Name || x.Location != y.Location || x.Components != y.Components || !fuzzSameBits(x.Data, y.Data) {
				return fmt.Sprintf("array %d (%q) differs", k, x.Name)
			}
		}
	}
	return ""
}

// fuzzSortArrays replaces z.Arrays by a copy stably sorted by location, name.
func fuzzSortArrays(z *field.Zone) {
	a := append([]field.Array(nil), z.Arrays...)
	sort.SliceStable(a, func(i, j int) bool {
		if a[i].Location != a[j].Location {
			return a[i].Location < a[j].Location
		}
		return a[i].Name < a[j].Name
	})
	z.Arrays = a
}

// fuzzNormaliseNaN replaces every NaN of z (a copy's slices are replaced, not
// modified) by the canonical math.NaN().
func fuzzNormaliseNaN(z *field.Zone) {
	fix := func(d []float64) []float64 {
		out := append([]float64(nil), d...)
		for i, v := range out {
			if math.IsNaN(v) {
				out[i] = math.NaN()
			}
		}
		return out
	}
	z.Points = fix(z.Points)
	arrs := make([]field.Array, len(z.Arrays))
	for i, a := range z.Arrays {
		a.Data = fix(a.Data)
		arrs[i] = a
	}
	z.Arrays = arrs
}

func fuzzSameBits(a, b []float64) bool {
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

// fuzzDecimalToken is the number grammar of parseNumber's doc comment (legacy
// VTK ASCII numbers): optional sign, digits with an optional fraction (at
// least one digit), optional exponent. Hex floats and underscores, which
// strconv accepts, are outside it (FORMATS.md §1.9).
var fuzzDecimalToken = regexp.MustCompile(`^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$`)

// fuzzSpecialToken is nan, inf or infinity in any case with an optional sign
// (VTK TestLegacyArrayInfNan accepts "-inf -nan", rejects "nan5", "infini").
var fuzzSpecialToken = regexp.MustCompile(`^[+-]?(?i:nan|inf|infinity)$`)

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
		case fuzzSpecialToken.MatchString(s):
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
		case fuzzDecimalToken.MatchString(s):
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
