package main

import (
	"fmt"
	"io"
	"maps"
	"math"
	"slices"
	"sort"
	"strings"

	"farforce/field"
	"farforce/readers"
)

// caseData is the case information that came with the solution files:
// what ffcg files carry besides the mesh and the arrays (docs/cgns-text-
// format.md). Legacy VTK files carry none, so for them it is empty.
type caseData struct {
	// Reference holds the ReferenceState quantities (SIDS names) of the
	// first file that has one; RefFile names that file.
	Reference map[string]float64
	RefFile   string
	// Patches are the BC patches of every file, their Zone fields
	// renumbered to index the merged field.
	Patches []readers.Patch
	// Warnings are remarks on the case information (a second file with
	// another reference state, units that are not SI).
	Warnings []string
}

// loadWithCase reads the solution files of a command like loadField (several
// files are the zones of one partitioned solution) and also returns their
// case information (readers.ReadCase). Errors are bad input.
func loadWithCase(paths []string, opt readers.Options) (*field.Field, *caseData, error) {
	out := &field.Field{}
	cd := &caseData{}
	for _, p := range paths {
		f, info, err := readers.ReadCase(p, opt)
		if err != nil {
			return nil, nil, inputErr(err)
		}
		for _, pt := range info.Patches {
			pt.Zone += len(out.Zones)
			cd.Patches = append(cd.Patches, pt)
		}
		out.Zones = append(out.Zones, f.Zones...)
		out.Warnings = append(out.Warnings, f.Warnings...)
		if len(info.Reference) == 0 {
			continue
		}
		if cd.Reference == nil {
			cd.Reference, cd.RefFile = info.Reference, p
			if u := nonSI(info.Units); u != "" {
				cd.Warnings = append(cd.Warnings, fmt.Sprintf("%s: DimensionalUnits %s: farforce takes the ReferenceState values as SI", p, u))
			}
		} else if !sameReference(cd.Reference, info.Reference) {
			cd.Warnings = append(cd.Warnings, fmt.Sprintf("%s: its ReferenceState differs from that of %s, which is used", p, cd.RefFile))
		}
	}
	return out, cd, nil
}

// nonSI returns the DimensionalUnits u as text when they are given and not
// SI (Kilogram Meter Second, any temperature and angle), else "".
func nonSI(u [5]string) string {
	if u[0] == "" || (u[0] == "Kilogram" && u[1] == "Meter" && u[2] == "Second") {
		return ""
	}
	return strings.Join(u[:], " ")
}

// sameReference reports whether two reference states hold the same values.
func sameReference(a, b map[string]float64) bool {
	if len(a) != len(b) {
		return false
	}
	for k, v := range a {
		if w, ok := b[k]; !ok || w != v {
			return false
		}
	}
	return true
}

// ref returns the ReferenceState quantity name and whether it is given (a
// nil *caseData has none).
func (cd *caseData) ref(name string) (float64, bool) {
	if cd == nil {
		return 0, false
	}
	v, ok := cd.Reference[name]
	return v, ok
}

// refVelocity returns the ReferenceState velocity (VelocityX, VelocityY,
// VelocityZ; a missing component is 0) and whether any component is given.
func (cd *caseData) refVelocity() ([3]float64, bool) {
	var v [3]float64
	any := false
	for k, n := range []string{"VelocityX", "VelocityY", "VelocityZ"} {
		if x, ok := cd.ref(n); ok {
			v[k], any = x, true
		}
	}
	return v, any
}

// walls returns the wall patches (readers.Patch.IsWall) that have faces.
func (cd *caseData) walls() []readers.Patch {
	if cd == nil {
		return nil
	}
	var w []readers.Patch
	for _, p := range cd.Patches {
		if p.IsWall() && p.Faces != nil && p.Faces.NumCells() > 0 {
			w = append(w, p)
		}
	}
	return w
}

// fromFile begins the setup echo of a constant taken from the files.
const fromFile = "from the file's ReferenceState"

// caseEcho is the part of a setup report that comes from the case
// information: where each freestream and reference constant came from,
// and the BC patches with their role.
type caseEcho struct {
	// Sources maps a constant (freestream_velocity, freestream_density,
	// freestream_pressure, ref_length, ref_area, density, viscosity) to
	// "from the file's ReferenceState (NAME)" or "from --flag".
	Sources map[string]string `json:"sources"`
	Patches []patchEcho       `json:"patches"`
}

// patchEcho describes one BC patch: its name, BC type, zone, face and
// point counts and its role ("near field" for wall patches, "far field",
// "symmetry", "inflow", "outflow" or "other").
type patchEcho struct {
	Name   string `json:"name"`
	Type   string `json:"type"`
	Zone   int    `json:"zone"`
	Faces  int    `json:"faces"`
	Points int    `json:"points"`
	Role   string `json:"role"`
}

// patchRole names what farforce does with or thinks of a patch of BC type
// t (wall says whether it is a wall type).
func patchRole(t string, wall bool) string {
	switch {
	case wall:
		return "near field (body surface)"
	case strings.HasPrefix(t, "BCFarfield"), strings.HasPrefix(t, "BCTunnel"):
		return "far field"
	case strings.HasPrefix(t, "BCSymmetry"):
		return "symmetry"
	case strings.HasPrefix(t, "BCInflow"):
		return "inflow"
	case strings.HasPrefix(t, "BCOutflow"):
		return "outflow"
	}
	return "other"
}

// describePatches returns the echo of every patch of cd, in file order.
func describePatches(cd *caseData) []patchEcho {
	if cd == nil {
		return nil
	}
	var out []patchEcho
	for _, p := range cd.Patches {
		e := patchEcho{Name: p.Name, Type: p.Type, Zone: p.Zone, Points: len(p.Points), Role: patchRole(p.Type, p.IsWall())}
		if p.Faces != nil {
			e.Faces = p.Faces.NumCells()
		}
		out = append(out, e)
	}
	return out
}

// hasInfo reports whether the files carried any case information.
func (cd *caseData) hasInfo() bool {
	return cd != nil && (len(cd.Reference) > 0 || len(cd.Patches) > 0)
}

// writeCaseText prints the case part of a setup report (nothing when the
// files carried no case information).
func writeCaseText(w io.Writer, c *caseEcho) {
	if c == nil {
		return
	}
	fmt.Fprintln(w, "\nCase information of the files (flags override it)")
	for _, k := range slices.Sorted(maps.Keys(c.Sources)) {
		fmt.Fprintf(w, "  %s: %s\n", strings.ReplaceAll(k, "_", " "), c.Sources[k])
	}
	for _, p := range c.Patches {
		fmt.Fprintf(w, "  BC patch %s: %s, zone %d, %d faces: %s\n", p.Name, p.Type, p.Zone, p.Faces, p.Role)
	}
}

// patchFaces returns the boundary faces of the field f that belong to the
// patches ps (matched by zone and node set), sorted as field.BoundaryFaces
// sorts them, and the number of patch faces that are not boundary faces
// of a fluid cell (blanked neighbours, or faces inside the mesh).
func patchFaces(f *field.Field, ps []readers.Patch) ([]field.BoundaryFace, int, error) {
	type key struct {
		zone  int
		nodes [4]int32
	}
	mk := func(zone int, nodes []int32) (key, bool) {
		k := key{zone: zone, nodes: [4]int32{-1, -1, -1, -1}}
		if len(nodes) > 4 {
			return k, false
		}
		copy(k.nodes[:], nodes)
		s := k.nodes[:len(nodes)]
		sort.Slice(s, func(i, j int) bool { return s[i] < s[j] })
		return k, true
	}
	want := map[key]bool{}
	for _, p := range ps {
		for c := 0; c < p.Faces.NumCells(); c++ {
			if k, ok := mk(p.Zone, p.Faces.CellNodes(c)); ok {
				want[k] = true
			}
		}
	}
	all, err := field.BoundaryFaces(f, nil)
	if err != nil {
		return nil, 0, err
	}
	var faces []field.BoundaryFace
	found := map[key]bool{}
	for _, fc := range all {
		k, ok := mk(int(fc.Cell.Zone), fc.Nodes)
		if ok && want[k] && !found[k] {
			found[k] = true
			faces = append(faces, fc)
		}
	}
	return faces, len(want) - len(found), nil
}

// patchNames lists the names of ps, comma-separated.
func patchNames(ps []readers.Patch) string {
	names := make([]string, len(ps))
	for i, p := range ps {
		names[i] = p.Name + " (" + p.Type + ")"
	}
	return strings.Join(names, ", ")
}

// finiteRef reports whether v is usable as a reference value.
func finiteRef(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
