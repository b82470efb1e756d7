package main

import (
	"errors"
	"fmt"
	"strings"

	"github.com/spf13/pflag"

	"farforce/field"
)

// flowFlags are the flow-mapping and reference flags shared by every
// command that integrates.
type flowFlags struct {
	velocity, pressure               string
	density, viscosity, kinViscosity string
	eddy, kinEddy, reynolds, mask    string
	freeVelocity                     string
	speed, alpha, beta               float64
	freeDensity, freePressure        float64
	up, momentCenter                 string
	refArea, refLength               float64
	form                             string
	noConvection                     bool
	workers                          int

	// Set by check from the vector flags.
	freeV, upV, centerV [3]float64
}

// arrays returns the names of the arrays a flow computation may use: every
// name the mapping guess may pick and every array named by a flag (numbers
// given as constants are left out). Readers skip all other arrays without
// converting them, which keeps memory to what the command needs.
func (fl *flowFlags) arrays() []string {
	names := field.FlowArrayCandidates()
	for _, s := range []string{fl.pressure, fl.density, fl.viscosity, fl.kinViscosity, fl.eddy, fl.kinEddy, fl.reynolds, fl.mask} {
		if q, err := parseQuantity("", s); s != "" && err == nil && q.Name != "" {
			names = append(names, q.Name)
		}
	}
	for _, v := range strings.Split(fl.velocity, ",") {
		if v = strings.TrimSpace(v); v != "" {
			names = append(names, v)
		}
	}
	return names
}

// define registers the flow-mapping and reference flags on fs.
func (fl *flowFlags) define(fs *pflag.FlagSet) {
	fs.StringVar(&fl.velocity, "velocity", "", "velocity array: one vector `NAME`, or NAMEX,NAMEY[,NAMEZ] scalars")
	fs.StringVar(&fl.pressure, "pressure", "", "static pressure array `NAME` (Pa)")
	fs.StringVar(&fl.density, "density", "", "density array or constant `NAME|VALUE` (kg/m³)")
	fs.StringVar(&fl.viscosity, "viscosity", "", "dynamic viscosity μ, array or constant `NAME|VALUE` (Pa·s)")
	fs.StringVar(&fl.kinViscosity, "kinematic-viscosity", "", "kinematic viscosity ν instead, `NAME|VALUE` (m²/s; μ = ρν)")
	fs.StringVar(&fl.eddy, "eddy-viscosity", "", "dynamic eddy viscosity μ_t, `NAME|VALUE` (Pa·s)")
	fs.StringVar(&fl.kinEddy, "kinematic-eddy-viscosity", "", "kinematic eddy viscosity ν_t instead, `NAME|VALUE` (m²/s; μ_t = ρν_t)")
	fs.StringVar(&fl.reynolds, "reynolds-stress", "", "Reynolds stress ρ<v'v'> array `NAME` (6 or 9 components)")
	fs.StringVar(&fl.mask, "mask", "", "array `NAME` marking non-fluid cells (non-zero); 'none' ignores a guessed mask")
	fs.StringVar(&fl.freeVelocity, "freestream-velocity", "", "freestream velocity `X,Y,Z` (m/s)")
	fs.Float64Var(&fl.speed, "speed", 0, "freestream speed `S` (m/s), with --alpha and --beta instead of --freestream-velocity")
	fs.Float64Var(&fl.alpha, "alpha", 0, "angle of attack `DEG`: the stream tilts towards +z (+y in 2D)")
	fs.Float64Var(&fl.beta, "beta", 0, "sideslip angle `DEG` (3D): the stream arrives from +y")
	fs.Float64Var(&fl.freeDensity, "freestream-density", 0, "freestream density `RHO` for q∞ (default: the --density constant)")
	fs.Float64Var(&fl.freePressure, "freestream-pressure", 0, "reference pressure p∞ `P` subtracted from p (Pa)")
	fs.StringVar(&fl.up, "up", "", "up axis `X,Y,Z` that defines lift (default +z in 3D, +y in 2D)")
	fs.Float64Var(&fl.refArea, "ref-area", 0, "reference area `A` for 3D coefficients (m²)")
	fs.Float64Var(&fl.refLength, "ref-length", 0, "reference length `L`: 2D coefficients, and moment coefficients (m)")
	fs.StringVar(&fl.momentCenter, "moment-center", "0,0,0", "moment reference point `X,Y,Z`")
	fs.StringVar(&fl.form, "form", "deficit", "momentum flux `FORM`: deficit ρ(V-V∞)(V·n), or plain ρV(V·n) when mass is created inside")
	fs.BoolVar(&fl.noConvection, "no-convection", false, "drop the momentum flux (creeping-flow fields)")
	fs.IntVar(&fl.workers, "workers", 0, "parallel workers `N` (0 = number of CPUs); results do not depend on it")
}

// check validates the flags that need no field and parses the vector
// flags. A missing freestream is found later (fl.freestream), since an
// ffcg file's ReferenceState may give it.
func (fl *flowFlags) check(fs *pflag.FlagSet) error {
	if fl.freeVelocity != "" && fs.Changed("speed") {
		return errors.New("give either --freestream-velocity or --speed/--alpha/--beta, not both")
	}
	if fl.viscosity != "" && fl.kinViscosity != "" {
		return errors.New("give either --viscosity or --kinematic-viscosity, not both")
	}
	if fl.eddy != "" && fl.kinEddy != "" {
		return errors.New("give either --eddy-viscosity or --kinematic-eddy-viscosity, not both")
	}
	if fl.form != "deficit" && fl.form != "plain" {
		return fmt.Errorf("--form %q: want deficit or plain", fl.form)
	}
	if fl.workers < 0 {
		return fmt.Errorf("--workers %d: want >= 0", fl.workers)
	}
	for _, n := range []struct {
		name string
		v    float64
		neg  bool
	}{{"speed", fl.speed, false}, {"alpha", fl.alpha, true}, {"beta", fl.beta, true},
		{"freestream-density", fl.freeDensity, false}, {"freestream-pressure", fl.freePressure, true},
		{"ref-area", fl.refArea, false}, {"ref-length", fl.refLength, false}} {
		if err := checkNumber(n.name, n.v, n.neg); err != nil {
			return err
		}
	}
	for _, v := range []struct {
		name, s string
		dst     *[3]float64
	}{{"freestream-velocity", fl.freeVelocity, &fl.freeV}, {"up", fl.up, &fl.upV}, {"moment-center", fl.momentCenter, &fl.centerV}} {
		if v.s == "" {
			continue
		}
		x, err := parseVector(v.name, v.s, false)
		if err != nil {
			return err
		}
		*v.dst = x
	}
	return nil
}

// flowMap returns the mapping guessed from the array names of f with the
// flags applied over it.
func (fl *flowFlags) flowMap(f *field.Field) (field.FlowMap, error) {
	m, _ := field.GuessFlowMap(f)
	if fl.velocity != "" {
		m.Velocity = strings.Split(fl.velocity, ",")
		for i := range m.Velocity {
			m.Velocity[i] = strings.TrimSpace(m.Velocity[i])
		}
		if len(m.Velocity) > 3 {
			return m, fmt.Errorf("--velocity %q: want one vector array or 2-3 scalar arrays", fl.velocity)
		}
	}
	if fl.pressure != "" {
		m.Pressure = fl.pressure
	}
	set := func(flag, s string, q *field.Quantity) error {
		if s == "" {
			return nil
		}
		v, err := parseQuantity(flag, s)
		*q = v
		return err
	}
	if err := set("density", fl.density, &m.Density); err != nil {
		return m, err
	}
	if fl.viscosity != "" {
		m.KinematicViscosity = false
		if err := set("viscosity", fl.viscosity, &m.Viscosity); err != nil {
			return m, err
		}
	}
	if fl.kinViscosity != "" {
		m.KinematicViscosity = true
		if err := set("kinematic-viscosity", fl.kinViscosity, &m.Viscosity); err != nil {
			return m, err
		}
	}
	if fl.eddy != "" {
		m.EddyKinematic = false
		if err := set("eddy-viscosity", fl.eddy, &m.EddyViscosity); err != nil {
			return m, err
		}
	}
	if fl.kinEddy != "" {
		m.EddyKinematic = true
		if err := set("kinematic-eddy-viscosity", fl.kinEddy, &m.EddyViscosity); err != nil {
			return m, err
		}
	}
	if fl.reynolds != "" {
		m.ReynoldsStress = fl.reynolds
	}
	switch fl.mask {
	case "":
	case "none":
		m.Mask = ""
	default:
		m.Mask = fl.mask
	}
	return m, nil
}
