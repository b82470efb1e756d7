package main

import (
	"compress/gzip"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/pflag"

	"farforce/field"
	"farforce/readers"
)

var convertCommand = &command{
	name:    "convert",
	summary: "convert a solution between legacy VTK and the ffcg text format",
	usage:   "[FLAGS] IN OUT",
	about: `Reads IN (legacy VTK or ffcg, plain or gzip/zstd compressed, recognised
from the bytes) and writes OUT in the format named by its extension: .ffcg
for the ffcg text format (the CGNS data model in plain text, see
docs/cgns-text-format.md) or .vtk for legacy VTK; a further .gz compresses
the output with gzip. Geometry and every array are kept bit for bit; an ffcg
file's reference state and boundary patches are carried to ffcg output.

Legacy VTK holds one zone: a multi-zone input is merged into one zone
(points are not joined; arrays missing from a zone are dropped with a
note), or pick one zone with --zone.`,
	examples: []example{
		{"farforce convert solution.vtk solution.ffcg", "legacy VTK to ffcg"},
		{"farforce convert case.ffcg.zst case.vtk --binary --vtk-version 5.1", "ffcg (compressed) to binary VTK 5.1"},
		{"farforce convert blocks.ffcg block2.vtk --zone 2", "one zone of a multi-block file"},
	},
	newImpl: func() commandImpl { return &convertImpl{} },
}

type convertImpl struct {
	binary  bool
	version string
	zone    string
	workers int
}

func (c *convertImpl) define(fs *pflag.FlagSet) {
	fs.BoolVar(&c.binary, "binary", false, "write VTK output as BINARY instead of ASCII")
	fs.StringVar(&c.version, "vtk-version", "4.2", "legacy VTK file `VERSION` of VTK output: 4.2 or 5.1")
	fs.StringVar(&c.zone, "zone", "", "convert only zone `Z` (1-based number or name)")
	fs.IntVar(&c.workers, "workers", 0, "parallel workers `N` for reading (0 = number of CPUs)")
}

func (c *convertImpl) run(e *env, args []string) error {
	const cmd = "farforce convert"
	if len(args) != 2 {
		return usageErr(cmd, "convert needs an input and an output file, got %d arguments", len(args))
	}
	in, out := args[0], args[1]
	base := strings.TrimSuffix(out, ".gz")
	var kind string
	switch {
	case strings.HasSuffix(base, readers.FFCGExt):
		kind = "ffcg"
	case strings.HasSuffix(base, ".vtk"):
		kind = "vtk"
	default:
		return usageErr(cmd, "convert: output %q: name it .ffcg or .vtk (optionally + .gz)", out)
	}
	if c.version != "4.2" && c.version != "5.1" {
		return usageErr(cmd, "convert: --vtk-version must be 4.2 or 5.1, got %q", c.version)
	}
	if c.workers < 0 {
		return usageErr(cmd, "convert: --workers must be >= 0, got %d", c.workers)
	}
	f, info, err := readers.ReadCase(in, readers.Options{Workers: c.workers})
	if err != nil {
		return inputErr(err)
	}
	if c.zone != "" {
		if f, info, err = pickZone(f, info, c.zone); err != nil {
			return usageErr(cmd, "convert: %v", err)
		}
	}
	var notes []string
	write := func(w io.Writer) error { return readers.WriteFFCG(w, f, info) }
	if kind == "vtk" {
		z, n, err := mergeZones(f)
		if err != nil {
			return inputErr(err)
		}
		notes = n
		opt := readers.WriteOptions{Binary: c.binary, Version: c.version, Title: "converted by farforce from " + in}
		write = func(w io.Writer) error { return readers.WriteVTK(w, z, opt) }
	}
	if base != out {
		inner := write
		write = func(w io.Writer) error {
			zw := gzip.NewWriter(w)
			if err := inner(zw); err != nil {
				return err
			}
			return zw.Close()
		}
	}
	if err := writeFileAtomic(out, write); err != nil {
		return err
	}
	for _, w := range append(f.Warnings, notes...) {
		fmt.Fprintln(e.stderr, "note:", w)
	}
	arrays := 0
	for _, z := range f.Zones {
		arrays += len(z.Arrays)
	}
	fmt.Fprintf(e.stdout, "wrote %s (%s): %d zone(s), %d points, %d cells, %d arrays, %d patches\n",
		out, kind, len(f.Zones), f.NumPoints(), f.NumCells(), arrays, len(info.Patches))
	return nil
}

// pickZone keeps the zone named or numbered (1-based) sel and its patches.
func pickZone(f *field.Field, info *readers.CaseInfo, sel string) (*field.Field, *readers.CaseInfo, error) {
	idx := -1
	for i, z := range f.Zones {
		if z.Name == sel || fmt.Sprint(i+1) == sel {
			idx = i
			break
		}
	}
	if idx < 0 {
		return nil, nil, fmt.Errorf("--zone %q: no such zone (the input has %d)", sel, len(f.Zones))
	}
	ni := *info
	ni.Patches = nil
	for _, p := range info.Patches {
		if p.Zone == idx {
			p.Zone = 0
			ni.Patches = append(ni.Patches, p)
		}
	}
	return &field.Field{Zones: []*field.Zone{f.Zones[idx]}, Warnings: f.Warnings}, &ni, nil
}

// mergeZones joins the zones of f into one (points appended, cell node
// indices shifted). Arrays are kept when every zone has one of that name,
// location and component count; the notes name the others.
func mergeZones(f *field.Field) (*field.Zone, []string, error) {
	if len(f.Zones) == 0 {
		return nil, nil, fmt.Errorf("the input has no zones")
	}
	if len(f.Zones) == 1 {
		return f.Zones[0], nil, nil
	}
	out := &field.Zone{Name: "merged", Offsets: []int32{0}}
	var notes []string
	blank := false
	for _, z := range f.Zones {
		blank = blank || z.Blank != nil
	}
	for _, z := range f.Zones {
		if len(out.Points)/3+z.NumPoints() > 1<<31-1 || len(out.Conn)+len(z.Conn) > 1<<31-1 {
			return nil, nil, fmt.Errorf("merging %d zones: more than 2^31-1 points or nodes", len(f.Zones))
		}
		shift := int32(len(out.Points) / 3)
		cbase := int32(len(out.Conn))
		out.Points = append(out.Points, z.Points...)
		out.Types = append(out.Types, z.Types...)
		for _, v := range z.Conn {
			out.Conn = append(out.Conn, v+shift)
		}
		for _, o := range z.Offsets[min(1, len(z.Offsets)):] {
			out.Offsets = append(out.Offsets, cbase+o)
		}
		if blank {
			b := z.Blank
			if b == nil {
				b = make([]bool, z.NumCells())
			}
			out.Blank = append(out.Blank, b...)
		}
	}
	for _, a := range f.Zones[0].Arrays {
		merged := field.Array{Name: a.Name, Location: a.Location, Components: a.Components}
		ok := true
		for _, z := range f.Zones {
			b := z.Array(a.Name)
			if b == nil || b.Location != a.Location || b.Components != a.Components {
				ok = false
				break
			}
			merged.Data = append(merged.Data, b.Data...)
		}
		if ok {
			out.Arrays = append(out.Arrays, merged)
		} else {
			notes = append(notes, fmt.Sprintf("array %q is not in every zone alike: dropped from the merged zone", a.Name))
		}
	}
	notes = append(notes, fmt.Sprintf("%d zones merged into one VTK zone (points on zone interfaces are duplicated)", len(f.Zones)))
	return out, notes, nil
}
