package main

import (
	"errors"
	"fmt"

	"github.com/spf13/pflag"

	"farforce/field"
	"farforce/integrate"
)

// errNoFreestream is the error when neither the flags nor the files give
// the freestream velocity.
var errNoFreestream = errors.New("no freestream: give --freestream-velocity X,Y,Z or --speed S [--alpha DEG] [--beta DEG] (or use an ffcg file whose ReferenceState has VelocityX/Y/Z)")

// refSource is the echo text of a constant taken from ReferenceState
// quantity name.
func refSource(name string) string { return fromFile + " (" + name + ")" }

// freestream returns the freestream velocity of a field of dimension dim:
// from --freestream-velocity or --speed/--alpha/--beta when given, else
// from the ReferenceState VelocityX/Y/Z of cd; echo (when not nil)
// records which.
func (fl *flowFlags) freestream(fs *pflag.FlagSet, dim int, cd *caseData, echo *caseEcho) ([3]float64, error) {
	note := func(s string) {
		if echo != nil {
			echo.Sources["freestream_velocity"] = s
		}
	}
	switch {
	case fl.freeVelocity != "":
		note("from --freestream-velocity")
		return fl.freeV, nil
	case fs.Changed("speed"):
		note("from --speed/--alpha/--beta")
		return integrate.FreestreamFromAngles(fl.speed, fl.alpha, fl.beta, dim)
	}
	if v, ok := cd.refVelocity(); ok {
		for _, x := range v {
			if !finiteRef(x) {
				return v, fmt.Errorf("%s: ReferenceState velocity %v is not finite", cd.RefFile, v)
			}
		}
		note(refSource("VelocityX/Y/Z"))
		return v, nil
	}
	return [3]float64{}, errNoFreestream
}

// refValue returns the value of a reference constant: the flag's value
// when it was given, else ReferenceState quantity name when present, else
// def; echo records the source under key.
func (fl *flowFlags) refValue(fs *pflag.FlagSet, flag string, v float64, cd *caseData, name string, def float64, echo *caseEcho, key string) (float64, error) {
	if fs.Changed(flag) {
		if echo != nil {
			echo.Sources[key] = "from --" + flag
		}
		return v, nil
	}
	if x, ok := cd.ref(name); ok {
		if !finiteRef(x) || (key != "freestream_pressure" && x < 0) {
			return 0, fmt.Errorf("%s: ReferenceState %s = %g, want a finite value ≥ 0", cd.RefFile, name, x)
		}
		if echo != nil {
			echo.Sources[key] = refSource(name)
		}
		return x, nil
	}
	return def, nil
}

// caseOptions builds the integration options of a field of dimension dim
// from the flags (already checked) and, for what they leave unset, the
// ReferenceState of cd: freestream velocity (VelocityX/Y/Z), density for
// q∞ (Density), reference pressure p∞ (Pressure), reference length
// (LengthReference) and reference area (AreaReference, an ffcg extension:
// the SIDS define no reference area). Flags always win. density is the
// mapped flow density: a constant one serves for q∞ when neither
// --freestream-density nor the ReferenceState gives it. echo (not nil when
// the files carried case information) records each source.
func (fl *flowFlags) caseOptions(fs *pflag.FlagSet, dim int, density field.Quantity, cd *caseData, echo *caseEcho) (integrate.Options, error) {
	opt := integrate.Options{
		Plain:        fl.form == "plain",
		NoConvection: fl.noConvection,
		Workers:      fl.workers,
	}
	var err error
	if opt.Free.V, err = fl.freestream(fs, dim, cd, echo); err != nil {
		return opt, err
	}
	if opt.Free.P, err = fl.refValue(fs, "freestream-pressure", fl.freePressure, cd, "Pressure", fl.freePressure, echo, "freestream_pressure"); err != nil {
		return opt, err
	}
	if opt.RefLength, err = fl.refValue(fs, "ref-length", fl.refLength, cd, "LengthReference", fl.refLength, echo, "ref_length"); err != nil {
		return opt, err
	}
	if opt.RefArea, err = fl.refValue(fs, "ref-area", fl.refArea, cd, "AreaReference", fl.refArea, echo, "ref_area"); err != nil {
		return opt, err
	}
	if dim == 2 && !fs.Changed("ref-area") && opt.RefArea != 0 {
		// A reference area means nothing per unit span.
		opt.RefArea = 0
		if echo != nil {
			delete(echo.Sources, "ref_area")
		}
	}
	_, refRho := cd.ref("Density")
	switch {
	case fs.Changed("freestream-density"):
		opt.Free.Rho = fl.freeDensity
		if echo != nil {
			echo.Sources["freestream_density"] = "from --freestream-density"
		}
	case density.Name == "" && fl.density != "":
		opt.Free.Rho = density.Value
		if echo != nil {
			echo.Sources["freestream_density"] = "from --density"
		}
	case refRho:
		if opt.Free.Rho, err = fl.refValue(fs, "freestream-density", 0, cd, "Density", 0, echo, "freestream_density"); err != nil {
			return opt, err
		}
	case density.Name == "":
		opt.Free.Rho = density.Value
	case opt.RefArea > 0 || opt.RefLength > 0:
		return opt, fmt.Errorf("density is the array %q: give --freestream-density for the coefficients", density.Name)
	}
	if fl.up != "" {
		opt.Up = fl.upV
	} else if dim == 2 {
		opt.Up = [3]float64{0, 1, 0}
	} else {
		opt.Up = [3]float64{0, 0, 1}
	}
	opt.MomentCenter = fl.centerV
	return opt, nil
}

// SIDS names of the ReferenceState constants used here (FORMATS.md §2,
// transport properties).
const (
	sidsKinViscosity = "ViscosityKinematic"
	sidsDynViscosity = "ViscosityMolecular"
	sidsDensity      = "Density"
)

// flowMapCase returns the flow mapping of f: the guess with the flags over
// it (fl.flowMap), then, for quantities that neither gave and when the
// files carried case information, the ReferenceState constants Density,
// ViscosityMolecular or ViscosityKinematic (a constant
// fluid property, as an incompressible solver writes it). echo records the
// sources taken from the file; it must not be nil when cd has information
// (prepareCase makes it so).
func (fl *flowFlags) flowMapCase(f *field.Field, cd *caseData, echo *caseEcho) (field.FlowMap, error) {
	m, err := fl.flowMap(f)
	if err != nil || !cd.hasInfo() || len(f.Zones) == 0 {
		return m, err
	}
	unset := func(q field.Quantity) bool { return q.Name == "" && q.Value == 0 }
	if unset(m.Viscosity) && fl.viscosity == "" && fl.kinViscosity == "" {
		switch {
		case hasRef(cd, sidsDynViscosity):
			v, _ := cd.ref(sidsDynViscosity)
			m.Viscosity, m.KinematicViscosity = field.Quantity{Value: v}, false
			echo.Sources["viscosity"] = refSource(sidsDynViscosity)
		case hasRef(cd, sidsKinViscosity):
			v, _ := cd.ref(sidsKinViscosity)
			m.Viscosity, m.KinematicViscosity = field.Quantity{Value: v}, true
			echo.Sources["viscosity"] = refSource(sidsKinViscosity)
		}
	}
	if unset(m.Density) && fl.density == "" && hasRef(cd, sidsDensity) {
		v, _ := cd.ref(sidsDensity)
		m.Density = field.Quantity{Value: v}
		echo.Sources["density"] = refSource(sidsDensity)
	}
	for _, q := range []field.Quantity{m.Density, m.Viscosity} {
		if q.Name == "" && (!finiteRef(q.Value) || q.Value < 0) {
			return m, fmt.Errorf("%s: ReferenceState constant %g: want finite and ≥ 0", cd.RefFile, q.Value)
		}
	}
	return m, nil
}

// hasRef reports whether cd's ReferenceState holds name.
func hasRef(cd *caseData, name string) bool {
	_, ok := cd.ref(name)
	return ok
}
