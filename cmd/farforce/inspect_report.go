package main

import (
	"fmt"
	"math"

	"farforce/field"
)

// inspectSchema versions the JSON report of inspect. Bump the number when a
// field changes meaning or disappears; adding fields keeps it.
const inspectSchema = "farforce.inspect/1"

// inspectReport is what inspect prints, as text or JSON.
type inspectReport struct {
	Schema    string         `json:"schema"`
	Files     []string       `json:"files"`
	Dimension int            `json:"dimension"`
	Points    int            `json:"points"`
	Cells     int            `json:"cells"`
	CellTypes map[string]int `json:"cell_types"`
	Blanked   int            `json:"blanked_cells"`
	Bounds    *boundsReport  `json:"bounds"`
	Zones     []zoneReport   `json:"zones"`
	Arrays    []arrayReport  `json:"arrays"`
	Mapping   mappingReport  `json:"mapping"`
	Notes     []string       `json:"mapping_notes"`
	Warnings  []string       `json:"warnings"`
	// Reference and Patches are the case information of ffcg files (the
	// ReferenceState quantities and the BC patches); absent otherwise.
	Reference map[string]float64 `json:"reference_state,omitempty"`
	Patches   []patchEcho        `json:"patches,omitempty"`
}

// addCase adds the case information cd of the files to the report.
func (r *inspectReport) addCase(cd *caseData) {
	if !cd.hasInfo() {
		return
	}
	r.Reference = cd.Reference
	r.Patches = describePatches(cd)
	r.Warnings = append(r.Warnings, cd.Warnings...)
}

type boundsReport struct {
	Min [3]float64 `json:"min"`
	Max [3]float64 `json:"max"`
}

type zoneReport struct {
	Name      string         `json:"name"`
	Points    int            `json:"points"`
	Cells     int            `json:"cells"`
	CellTypes map[string]int `json:"cell_types"`
	Blanked   int            `json:"blanked_cells"`
}

// arrayReport summarises one array over all zones that carry it. Min and
// Max skip NaN and Inf; they are null when no finite value exists.
// ComponentMin/Max are given for arrays of more than one component.
type arrayReport struct {
	Name         string     `json:"name"`
	Location     string     `json:"location"`
	Components   int        `json:"components"`
	Zones        int        `json:"zones"`
	Tuples       int        `json:"tuples"`
	Min          *float64   `json:"min"`
	Max          *float64   `json:"max"`
	ComponentMin []*float64 `json:"component_min,omitempty"`
	ComponentMax []*float64 `json:"component_max,omitempty"`
	NaN          int        `json:"nan"`
	Inf          int        `json:"inf"`
}

// mappingReport is a FlowMap in words: empty strings where nothing was
// found.
type mappingReport struct {
	Velocity       []string `json:"velocity"`
	Pressure       string   `json:"pressure"`
	Density        string   `json:"density"`
	Viscosity      string   `json:"viscosity"`
	ViscosityKind  string   `json:"viscosity_kind"`
	EddyViscosity  string   `json:"eddy_viscosity"`
	EddyKind       string   `json:"eddy_viscosity_kind"`
	ReynoldsStress string   `json:"reynolds_stress"`
	Mask           string   `json:"mask"`
}

func buildInspectReport(files []string, f *field.Field) *inspectReport {
	r := &inspectReport{
		Schema:    inspectSchema,
		Files:     files,
		Dimension: f.Dim(),
		Points:    f.NumPoints(),
		Cells:     f.NumCells(),
		CellTypes: map[string]int{},
		Zones:     []zoneReport{},
		Arrays:    []arrayReport{},
		Warnings:  append([]string{}, f.Warnings...),
	}
	if r.Points > 0 {
		lo, hi := f.Bounds()
		r.Bounds = &boundsReport{Min: lo, Max: hi}
	}
	for _, z := range f.Zones {
		zr := zoneReport{Name: z.Name, Points: z.NumPoints(), Cells: z.NumCells(), CellTypes: map[string]int{}}
		for _, t := range z.Types {
			zr.CellTypes[t.String()]++
			r.CellTypes[t.String()]++
		}
		for _, b := range z.Blank {
			if b {
				zr.Blanked++
			}
		}
		r.Blanked += zr.Blanked
		r.Zones = append(r.Zones, zr)
	}
	var warn []string
	r.Arrays, warn = summariseArrays(f)
	r.Warnings = append(r.Warnings, warn...)
	m, notes := field.GuessFlowMap(f)
	r.Mapping = describeMapping(m)
	r.Notes = notes
	return r
}

// summariseArrays merges the arrays of all zones by name and location, in
// order of first appearance. An array whose component count differs between
// zones is summarised from its first zone and named in a warning.
func summariseArrays(f *field.Field) ([]arrayReport, []string) {
	type acc struct {
		rep    arrayReport
		lo, hi []float64
	}
	var order, warn []string
	accs := map[string]*acc{}
	for _, z := range f.Zones {
		for i := range z.Arrays {
			a := &z.Arrays[i]
			key := a.Location.String() + "\x00" + a.Name
			ac := accs[key]
			if ac == nil {
				ac = &acc{rep: arrayReport{Name: a.Name, Location: a.Location.String(), Components: a.Components}}
				ac.lo, ac.hi = make([]float64, a.Components), make([]float64, a.Components)
				for k := range ac.lo {
					ac.lo[k], ac.hi[k] = math.Inf(1), math.Inf(-1)
				}
				accs[key] = ac
				order = append(order, key)
			}
			if a.Components != ac.rep.Components {
				warn = append(warn, fmt.Sprintf("array %q has %d components in zone %q but %d before: left out there", a.Name, a.Components, z.Name, ac.rep.Components))
				continue
			}
			ac.rep.Zones++
			ac.rep.Tuples += a.Len()
			for j, v := range a.Data {
				switch {
				case math.IsNaN(v):
					ac.rep.NaN++
				case math.IsInf(v, 0):
					ac.rep.Inf++
				default:
					k := j % a.Components
					ac.lo[k] = math.Min(ac.lo[k], v)
					ac.hi[k] = math.Max(ac.hi[k], v)
				}
			}
		}
	}
	out := make([]arrayReport, 0, len(order))
	for _, key := range order {
		ac := accs[key]
		lo, hi := math.Inf(1), math.Inf(-1)
		for k := range ac.lo {
			lo, hi = math.Min(lo, ac.lo[k]), math.Max(hi, ac.hi[k])
			if ac.rep.Components > 1 {
				ac.rep.ComponentMin = append(ac.rep.ComponentMin, finite(ac.lo[k]))
				ac.rep.ComponentMax = append(ac.rep.ComponentMax, finite(ac.hi[k]))
			}
		}
		ac.rep.Min, ac.rep.Max = finite(lo), finite(hi)
		out = append(out, ac.rep)
	}
	return out, warn
}

// finite returns a pointer to v, or nil when v is not finite (no value).
func finite(v float64) *float64 {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return nil
	}
	return &v
}

func describeMapping(m field.FlowMap) mappingReport {
	r := mappingReport{
		Velocity:       append([]string{}, m.Velocity...),
		Pressure:       m.Pressure,
		ReynoldsStress: m.ReynoldsStress,
		Mask:           m.Mask,
	}
	if m.Density.IsSet() {
		r.Density = m.Density.String()
	}
	if m.Viscosity.IsSet() {
		r.Viscosity, r.ViscosityKind = m.Viscosity.String(), kind(m.KinematicViscosity)
	}
	if m.EddyViscosity.IsSet() {
		r.EddyViscosity, r.EddyKind = m.EddyViscosity.String(), kind(m.EddyKinematic)
	}
	return r
}

func kind(kinematic bool) string {
	if kinematic {
		return "kinematic"
	}
	return "dynamic"
}
