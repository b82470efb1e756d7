package main

import (
	"fmt"
	"math"

	"github.com/spf13/pflag"

	"farforce/field"
	"farforce/integrate"
	"farforce/surface"
)

// setupReport echoes every input and constant a force computation used, so
// nobody has to guess units or conventions (DESIGN §2).
type setupReport struct {
	Files        []string       `json:"files"`
	Dimension    int            `json:"dimension"`
	Mapping      mappingReport  `json:"mapping"`
	Freestream   freestreamEcho `json:"freestream"`
	Up           [3]float64     `json:"up"`
	RefArea      float64        `json:"ref_area"`
	RefLength    float64        `json:"ref_length"`
	MomentCenter [3]float64     `json:"moment_center"`
	Form         string         `json:"form"`
	Workers      int            `json:"workers"`
	// Warnings are the reader's remarks on the field and the cells the
	// mask blanked.
	Warnings []string `json:"warnings"`
	// Case is what the files' case information (ffcg ReferenceState and
	// BC patches) supplied; absent for files without it.
	Case *caseEcho `json:"case,omitempty"`
}

type freestreamEcho struct {
	Velocity [3]float64 `json:"velocity"`
	Speed    float64    `json:"speed"`
	Density  float64    `json:"density"`
	Pressure float64    `json:"pressure"`
}

// preparedFlow is a loaded field ready for cutting and integrating.
type preparedFlow struct {
	loc   *field.Locator
	flow  *field.FlowSampler
	opt   integrate.Options
	setup setupReport
	// info is the case information of the files (nil or empty for legacy
	// VTK).
	info *caseData
}

// prepare builds the locator, the sampler and the integration options of
// field f from the flags (already checked), for files without case
// information. Errors are bad input.
func (fl *flowFlags) prepare(fs *pflag.FlagSet, files []string, f *field.Field) (*preparedFlow, error) {
	return fl.prepareCase(fs, files, f, nil)
}

// prepareCase is prepare for files with case information cd (nil: none):
// the ReferenceState supplies what the flags leave unset (see
// fl.caseOptions and fl.flowMapCase), and its wall patches become the
// default near field.
func (fl *flowFlags) prepareCase(fs *pflag.FlagSet, files []string, f *field.Field, cd *caseData) (*preparedFlow, error) {
	var echo *caseEcho
	if cd.hasInfo() {
		echo = &caseEcho{Sources: map[string]string{}, Patches: describePatches(cd)}
	}
	m, err := fl.flowMapCase(f, cd, echo)
	if err != nil {
		return nil, inputErr(err)
	}
	warnings := append([]string{}, f.Warnings...)
	if cd != nil {
		warnings = append(warnings, cd.Warnings...)
	}
	if m.Mask != "" {
		n, err := field.ApplyMask(f, m.Mask)
		if err != nil {
			return nil, inputErr(err)
		}
		warnings = append(warnings, fmt.Sprintf("mask %q blanked %d cells (not fluid)", m.Mask, n))
	}
	loc, err := field.NewLocator(f)
	if err != nil {
		return nil, inputErr(err)
	}
	flow, err := field.NewFlowSampler(field.NewSampler(loc), m)
	if err != nil {
		return nil, inputErr(fmt.Errorf("flow mapping: %w (see 'farforce inspect' for the arrays)", err))
	}
	dim := loc.Dim()
	opt, err := fl.caseOptions(fs, dim, m.Density, cd, echo)
	if err != nil {
		return nil, inputErr(err)
	}
	if dim == 3 && fs.Changed("ref-length") && !fs.Changed("ref-area") && opt.RefArea == 0 {
		return nil, inputErr(fmt.Errorf("3D field: coefficients need --ref-area (--ref-length only scales moments)"))
	}
	speed := math.Sqrt(opt.Free.V[0]*opt.Free.V[0] + opt.Free.V[1]*opt.Free.V[1] + opt.Free.V[2]*opt.Free.V[2])
	form := fl.form
	if fl.noConvection {
		form = "no-convection"
	}
	return &preparedFlow{
		loc:  loc,
		flow: flow,
		opt:  opt,
		info: cd,
		setup: setupReport{
			Files:     files,
			Dimension: dim,
			Mapping:   describeMapping(m),
			Freestream: freestreamEcho{
				Velocity: opt.Free.V, Speed: speed, Density: opt.Free.Rho, Pressure: opt.Free.P,
			},
			Up:           opt.Up,
			RefArea:      opt.RefArea,
			RefLength:    opt.RefLength,
			MomentCenter: opt.MomentCenter,
			Form:         form,
			Workers:      fl.workers,
			Warnings:     warnings,
			Case:         echo,
		},
	}, nil
}

// forces cuts shape s through the mesh and integrates over it. A surface
// that leaves the mesh or enters the body is bad input (exit code 2).
func (p *preparedFlow) forces(s surface.Shape) (integrate.Result, *surface.Cut, error) {
	cut, err := surface.CutSurface(p.loc, s, surface.CutOptions{Workers: p.opt.Workers})
	if err != nil {
		return integrate.Result{}, nil, inputErr(err)
	}
	res, err := integrate.Forces(cut, p.flow, p.opt)
	if err != nil {
		return integrate.Result{}, nil, inputErr(err)
	}
	return res, cut, nil
}
