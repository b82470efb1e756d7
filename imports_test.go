package farforce_test

import (
	"go/parser"
	"go/token"
	"io/fs"
	"path/filepath"
	"slices"
	"strconv"
	"strings"
	"testing"
)

// module is the module path of this repository (go.mod).
const module = "farforce"

// layerDeps lists, for each top-level package folder (a layer), the other
// layers its code may import (STYLE.md point 1). Subpackages belong to the
// layer of their top folder and may import within it.
var layerDeps = map[string][]string{
	"cmd":       {"integrate", "surface", "readers", "field"},
	"integrate": {"surface", "field"},
	"surface":   {"field"},
	"readers":   {"field"},
	"field":     {},
	"internal":  {},
}

// testExtraDeps are the layers every test file may import besides those of
// its package: the test fixtures of field/fieldtest and readers, to load
// fixture files.
var testExtraDeps = []string{"field", "readers"}

// thirdParty says which layers may import each allowed third-party module;
// "*" means every layer. Anything else outside the standard library is
// forbidden (rules.md point 9).
var thirdParty = map[string][]string{
	"gonum.org/v1/gonum":            {"*"},
	"github.com/spf13/pflag":        {"cmd"},
	"github.com/BurntSushi/toml":    {"cmd"},
	"github.com/klauspost/compress": {"readers"},
	"github.com/paulmach/orb":       {"surface"},
}

// layerOf returns the layer of a package folder relative to the module root
// ("" for the root itself).
func layerOf(dir string) string {
	dir = filepath.ToSlash(dir)
	if dir == "." {
		return ""
	}
	return strings.SplitN(dir, "/", 2)[0]
}

// checkImport returns "" when a file in layer from may import path, or the
// reason it may not.
func checkImport(from, path string, isTest bool) string {
	if path == module || strings.HasPrefix(path, module+"/") {
		if from == "" {
			return "the module root holds only this test: no project imports"
		}
		to := layerOf(strings.TrimPrefix(strings.TrimPrefix(path, module), "/"))
		if to == from {
			return ""
		}
		if to == "cmd" {
			return "nothing may import cmd"
		}
		if slices.Contains(layerDeps[from], to) {
			return ""
		}
		if isTest && slices.Contains(testExtraDeps, to) && !slices.Contains(layerDeps[to], from) {
			return ""
		}
		return from + " may import only " + strings.Join(layerDeps[from], ", ") + " of the project"
	}
	first := strings.SplitN(path, "/", 2)[0]
	if !strings.Contains(first, ".") {
		return "" // standard library
	}
	for mod, layers := range thirdParty {
		if path == mod || strings.HasPrefix(path, mod+"/") {
			if slices.Contains(layers, "*") || slices.Contains(layers, from) {
				return ""
			}
			return mod + " is allowed only in " + strings.Join(layers, ", ")
		}
	}
	return "third-party module not allowed (rules.md point 9)"
}

// TestImportDirection parses the imports of every Go file of the module and
// fails on an edge the layering of STYLE.md point 1 forbids.
func TestImportDirection(t *testing.T) {
	fset := token.NewFileSet()
	files := 0
	err := filepath.WalkDir(".", func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			return err
		}
		name := d.Name()
		if d.IsDir() {
			if path != "." && (name == "testdata" || name == "vendor" || strings.HasPrefix(name, ".") || strings.HasPrefix(name, "_")) {
				return filepath.SkipDir
			}
			return nil
		}
		if !strings.HasSuffix(name, ".go") {
			return nil
		}
		f, err := parser.ParseFile(fset, path, nil, parser.ImportsOnly)
		if err != nil {
			return err
		}
		files++
		from := layerOf(filepath.Dir(path))
		if _, ok := layerDeps[from]; !ok && from != "" {
			t.Errorf("%s: folder %q has no import rule: add it to layerDeps (and STYLE.md)", path, from)
			return nil
		}
		for _, imp := range f.Imports {
			p, _ := strconv.Unquote(imp.Path.Value)
			if why := checkImport(from, p, strings.HasSuffix(name, "_test.go")); why != "" {
				t.Errorf("%s imports %q: %s", fset.Position(imp.Pos()), p, why)
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if files < 5 {
		t.Fatalf("found only %d Go files: is the test running at the module root?", files)
	}
}

// TestCheckImportRejects makes sure the rules can fail: each edge below
// breaks STYLE.md point 1 or rules.md point 9.
func TestCheckImportRejects(t *testing.T) {
	bad := []struct {
		from, path string
		test       bool
	}{
		{"field", "farforce/surface", false},
		{"field", "farforce/readers", false},
		{"surface", "farforce/integrate", false},
		{"readers", "farforce/surface", false},
		{"integrate", "farforce/readers", false},
		{"integrate", "farforce/cmd/farforce", true},
		{"field", "github.com/paulmach/orb", false},
		{"surface", "github.com/spf13/pflag", false},
		{"integrate", "github.com/klauspost/compress/zstd", false},
		{"readers", "github.com/BurntSushi/toml", false},
		{"cmd", "github.com/example/other", false},
		{"field", "farforce/readers", true}, // readers imports field: a test of field cannot use it
	}
	for _, b := range bad {
		if checkImport(b.from, b.path, b.test) == "" {
			t.Errorf("%s -> %s (test %v) was allowed", b.from, b.path, b.test)
		}
	}
	good := []struct {
		from, path string
		test       bool
	}{
		{"cmd", "farforce/integrate", false},
		{"cmd", "github.com/spf13/pflag", false},
		{"integrate", "farforce/field/fieldtest", true},
		{"integrate", "farforce/readers", true},
		{"field", "gonum.org/v1/gonum/mat", false},
		{"readers", "github.com/klauspost/compress/zstd", false},
		{"surface", "github.com/paulmach/orb/planar", false},
		{"field", "math", false},
	}
	for _, g := range good {
		if why := checkImport(g.from, g.path, g.test); why != "" {
			t.Errorf("%s -> %s (test %v) was refused: %s", g.from, g.path, g.test, why)
		}
	}
}
