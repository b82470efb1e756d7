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
}

// prepare builds the locator, the sampler and the integration options of
// field f from the flags (already checked). Errors are bad input.
func (fl *flowFlags) prepare(fs *pflag.FlagSet, files []string, f *field.Field) (*preparedFlow, error) {
	m, err := fl.flowMap(f)
	if err != nil {
		return nil, inputErr(err)
	}
	warnings := append([]string{}, f.Warnings...)
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
	opt := integrate.Options{
		RefArea:      fl.refArea,
		RefLength:    fl.refLength,
		Plain:        fl.form == "plain",
		NoConvection: fl.noConvection,
		Workers:      fl.workers,
	}
	opt.Free.P = fl.freePressure
	if fl.freeVelocity != "" {
		opt.Free.V = fl.freeV
	} else if opt.Free.V, err = integrate.FreestreamFromAngles(fl.speed, fl.alpha, fl.beta, dim); err != nil {
		return nil, inputErr(err)
	}
	switch {
	case fs.Changed("freestream-density"):
		opt.Free.Rho = fl.freeDensity
	case m.Density.Name == "":
		opt.Free.Rho = m.Density.Value
	case fl.refArea > 0 || fl.refLength > 0:
		return nil, inputErr(fmt.Errorf("density is the array %q: give --freestream-density for the coefficients", m.Density.Name))
	}
	if fl.up != "" {
		opt.Up = fl.upV
	} else if dim == 2 {
		opt.Up = [3]float64{0, 1, 0}
	} else {
		opt.Up = [3]float64{0, 0, 1}
	}
	opt.MomentCenter = fl.centerV
	if dim == 3 && fs.Changed("ref-length") && !fs.Changed("ref-area") {
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
