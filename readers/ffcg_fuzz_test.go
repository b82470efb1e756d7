package readers

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"testing"

	"farforce/field"
)

// ffcgFuzzRead reads data with opt through ReadFFCG, turning a panic into
// a test failure.
func ffcgFuzzRead(t *testing.T, r io.Reader, opt Options) (f *field.Field, info *CaseInfo, err error) {
	t.Helper()
	defer failOnPanic(t)
	return ReadFFCG(r, "fuzz.ffcg", opt)
}

// FuzzReadFFCG feeds arbitrary bytes to ReadFFCG and checks, for every
// input: no panic; every error is an *Error; 1 and 2 workers give
// bit-identical fields and case information or identical errors (house
// rule 7); the sized and streaming paths agree; every zone and every
// patch's faces pass field.Zone.Validate and patch vertices are in range;
// and a field that reads is written by WriteFFCG and read back unchanged.
// Seeds: the files of testdata/ffcg (the specification's example and the
// malformed corpus) and testdata/fuzz/FuzzReadFFCG. Run e.g.
//
//	go test -run XXX -fuzz '^FuzzReadFFCG$' -fuzztime 60s ./readers/
func FuzzReadFFCG(f *testing.F) {
	seeds, _ := filepath.Glob("../testdata/ffcg/*.ffcg")
	more, _ := filepath.Glob("../testdata/ffcg/malformed/*")
	for _, p := range append(seeds, more...) {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		if len(b) <= 16<<10 {
			f.Add(b)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		opt1 := Options{MaxBytes: fuzzMaxBytes, Workers: 1}
		opt2 := Options{MaxBytes: fuzzMaxBytes, Workers: 2}
		f1, i1, err1 := ffcgFuzzRead(t, bytes.NewReader(data), opt1)
		f2, i2, err2 := ffcgFuzzRead(t, bytes.NewReader(data), opt2)
		fs, _, errs := ffcgFuzzRead(t, fuzzUnsized{bytes.NewReader(data)}, opt2)
		fuzzAgreeErrors(t, err1, err2, errs)
		if err1 != nil {
			return
		}
		if d := fuzzDiffFields(f1, f2); d != "" {
			t.Fatalf("1 vs 2 workers: %s", d)
		}
		if d := fuzzDiffFields(f1, fs); d != "" {
			t.Fatalf("sized vs streaming: %s", d)
		}
		if d := ffcgDiffInfo(i1, i2); d != "" {
			t.Fatalf("1 vs 2 workers: %s", d)
		}
		for _, z := range f1.Zones {
			if err := z.Validate(); err != nil {
				t.Fatalf("invalid zone: %v", err)
			}
		}
		for _, p := range i1.Patches {
			if p.Zone < 0 || p.Zone >= len(f1.Zones) {
				t.Fatalf("patch %q: zone %d", p.Name, p.Zone)
			}
			np := f1.Zones[p.Zone].NumPoints()
			for _, v := range p.Points {
				if v < 0 || int(v) >= np {
					t.Fatalf("patch %q: point %d of %d", p.Name, v, np)
				}
			}
			if p.Faces != nil {
				if err := p.Faces.Validate(); err != nil {
					t.Fatalf("patch %q: %v", p.Name, err)
				}
			}
		}
		ffcgCheckRewrite(t, f1, i1)
	})
}

// ffcgCheckRewrite writes f with WriteFFCG, reads it back and compares
// (zone names aside: the writer makes them unique), NaN payloads aside.
func ffcgCheckRewrite(t *testing.T, f *field.Field, info *CaseInfo) {
	var buf bytes.Buffer
	if err := WriteFFCG(&buf, f, info); err != nil {
		t.Fatalf("WriteFFCG: %v", err)
	}
	g, gi, err := ReadFFCG(bytes.NewReader(buf.Bytes()), "rewrite.ffcg", Options{})
	if err != nil {
		t.Fatalf("reading WriteFFCG output: %v\n%s", err, buf.Bytes())
	}
	norm := func(fl *field.Field) *field.Field {
		out := &field.Field{}
		for _, z := range fl.Zones {
			c := *z
			c.Name = ""
			fuzzNormaliseNaN(&c)
			out.Zones = append(out.Zones, &c)
		}
		return out
	}
	if d := fuzzDiffFields(norm(f), norm(g)); d != "" {
		t.Fatalf("rewrite: %s\n%s", d, buf.Bytes())
	}
	if d := ffcgDiffInfo(info, gi); d != "" {
		t.Fatalf("rewrite: %s\n%s", d, buf.Bytes())
	}
}

// ffcgDiffInfo describes the first difference between two case
// informations (patch faces compared by their cells), "" if equal.
func ffcgDiffInfo(a, b *CaseInfo) string {
	if fmt.Sprint(a.Reference) != fmt.Sprint(b.Reference) || a.DataClass != b.DataClass || a.Units != b.Units {
		return fmt.Sprintf("reference state %v %q %v vs %v %q %v", a.Reference, a.DataClass, a.Units, b.Reference, b.DataClass, b.Units)
	}
	if len(a.Patches) != len(b.Patches) {
		return fmt.Sprintf("%d vs %d patches", len(a.Patches), len(b.Patches))
	}
	for i := range a.Patches {
		p, q := a.Patches[i], b.Patches[i]
		cells := func(z *field.Zone) string {
			if z == nil {
				return "none"
			}
			return fmt.Sprint(z.Types, z.Offsets, z.Conn)
		}
		if p.Name != q.Name || p.Type != q.Type || p.Family != q.Family || p.Zone != q.Zone ||
			fmt.Sprint(p.Points) != fmt.Sprint(q.Points) || cells(p.Faces) != cells(q.Faces) {
			return fmt.Sprintf("patch %d differs: %q %s %v %s vs %q %s %v %s", i, p.Name, p.Type, p.Points, cells(p.Faces), q.Name, q.Type, q.Points, cells(q.Faces))
		}
	}
	return ""
}
