package main

import (
	"fmt"
	"math"
	"strings"

	"farforce/integrate"
)

// gateKind describes one kind of gate: what it checks and which fields
// of [[gate]] it needs.
type gateKind struct {
	what     string // for help and default names
	max      bool   // needs max
	expected bool   // needs expected and tolerance
	near     bool   // needs a [near] table
	sweeps   bool   // applies to sweeps only
}

// gateKinds lists the gate kinds of a case file.
var gateKinds = map[string]gateKind{
	"near-far":       {what: "|far - near| drag in counts at most max", max: true, near: true},
	"plateau-spread": {what: "plateau drag spread (half-range) in counts at most max", max: true, sweeps: true},
	"mass-imbalance": {what: "|mass imbalance| of every surface and sweep member at most max", max: true},
	"drag":           {what: "drag (C_D, or N without references) within tolerance of expected", expected: true},
	"lift":           {what: "lift (C_L, or N without references) within tolerance of expected", expected: true},
	"no-drift":       {what: "no drift of drag with surface size flagged", sweeps: true},
}

// gateKindList returns the kinds for messages.
func gateKindList() string {
	return "near-far, plateau-spread, mass-imbalance, drag, lift, no-drift"
}

// checkGate validates gate i of the case; names are the surface and
// sweep names.
func (c *caseFile) checkGate(i int, names map[string]bool) *fieldError {
	g := &c.Gates[i]
	at := func(format string, a ...any) *fieldError {
		e := bad([]string{"gate"}, "gate %d: %s", i+1, fmt.Sprintf(format, a...))
		e.nth = i
		return e
	}
	k, ok := gateKinds[g.Kind]
	if !ok {
		return at("kind %q: want one of %s", g.Kind, gateKindList())
	}
	if g.Name == "" {
		g.Name = g.Kind
		if g.On != "" {
			g.Name += " on " + g.On
		}
	}
	for _, v := range []*float64{g.Max, g.Expected, g.Tolerance} {
		if v != nil && (math.IsNaN(*v) || math.IsInf(*v, 0)) {
			return at("numbers must be finite")
		}
	}
	switch {
	case k.max && (g.Max == nil || *g.Max < 0):
		return at("kind %s needs max = N ≥ 0", g.Kind)
	case !k.max && g.Max != nil:
		return at("kind %s takes no max", g.Kind)
	case k.expected && (g.Expected == nil || g.Tolerance == nil || *g.Tolerance < 0):
		return at("kind %s needs expected = X and tolerance = T ≥ 0", g.Kind)
	case !k.expected && (g.Expected != nil || g.Tolerance != nil):
		return at("kind %s takes no expected or tolerance", g.Kind)
	case k.near && c.Near == nil && !c.ffcgFiles():
		return at("kind %s needs a [near] table (wall file or inside spec), or ffcg files with BCWall patches", g.Kind)
	case k.sweeps && len(c.Sweeps) == 0:
		return at("kind %s needs a [[sweep]]", g.Kind)
	case g.On != "" && !names[g.On]:
		return at("on = %q names no surface or sweep", g.On)
	}
	if k.sweeps && g.On != "" {
		found := false
		for _, s := range c.Sweeps {
			found = found || s.Name == g.On
		}
		if !found {
			return at("kind %s applies to sweeps; %q is a surface", g.Kind, g.On)
		}
	}
	return nil
}

// gateCheck is the outcome of a gate on one subject (a surface, a sweep
// plateau, or a sweep member).
type gateCheck struct {
	Subject string  `json:"subject"`
	Value   float64 `json:"value"`
	Limit   float64 `json:"limit"`
	Passed  bool    `json:"passed"`
	Text    string  `json:"text"`
}

// gateResult is the outcome of one gate: passed when every check passed.
type gateResult struct {
	Name    string      `json:"name"`
	Kind    string      `json:"kind"`
	Passed  bool        `json:"passed"`
	Message string      `json:"message"`
	Checks  []gateCheck `json:"checks"`
}

// evalGates evaluates every gate of c on the computed run r. A gate that
// needs coefficients the run does not have is bad input.
func evalGates(c *caseFile, r *caseRun) ([]gateResult, error) {
	var out []gateResult
	for _, g := range c.Gates {
		res, err := evalGate(&g, r)
		if err != nil {
			return nil, inputErr(fmt.Errorf("case file %s: gate %q: %w", c.path, g.Name, err))
		}
		out = append(out, res)
	}
	return out, nil
}

// counts converts a coefficient difference to drag counts.
const counts = 1e4

func evalGate(g *caseGate, r *caseRun) (gateResult, error) {
	res := gateResult{Name: g.Name, Kind: g.Kind, Passed: true}
	add := func(subject string, value, limit float64, pass bool, text string) {
		res.Checks = append(res.Checks, gateCheck{Subject: subject, Value: value, Limit: limit, Passed: pass, Text: text})
		res.Passed = res.Passed && pass
	}
	on := func(name string) bool { return g.On == "" || g.On == name }
	coef := r.coefficients()
	switch g.Kind {
	case "near-far":
		if !coef {
			return res, fmt.Errorf("near-far counts need coefficients: give [reference] length (2D) or area (3D) and the freestream density")
		}
		for _, s := range r.Surfaces {
			if on(s.Name) && s.NearFar != nil {
				v := math.Abs(s.NearFar.DragCounts)
				add(s.Name, v, *g.Max, v <= *g.Max, fmt.Sprintf("%s: far - near = %s counts (%s %%), limit %s", s.Name, fixed(s.NearFar.DragCounts, 1), pct(s.NearFar.DragPercent, r.Near), num(*g.Max)))
			}
		}
		for _, s := range r.Sweeps {
			if on(s.Name) && s.NearFar != nil {
				v := math.Abs(s.NearFar.DragCounts)
				add(s.Name, v, *g.Max, v <= *g.Max, fmt.Sprintf("%s: plateau - near = %s counts (%s %%), limit %s", s.Name, fixed(s.NearFar.DragCounts, 1), pctOf(s.NearFar.DragPercent), num(*g.Max)))
			}
		}
	case "plateau-spread":
		if !coef {
			return res, fmt.Errorf("spreads in counts need coefficients: give [reference] length (2D) or area (3D) and the freestream density")
		}
		for _, s := range r.Sweeps {
			if on(s.Name) {
				v := counts * s.Plateau.DragSpread
				add(s.Name, v, *g.Max, v <= *g.Max, fmt.Sprintf("%s: plateau of %d of %d members, C_D %s ± %s counts, limit %s",
					s.Name, s.Plateau.Members, len(s.Members), fixed(s.Plateau.Drag, 6), fixed(v, 1), num(*g.Max)))
			}
		}
	case "mass-imbalance":
		for _, s := range r.Surfaces {
			if on(s.Name) {
				v := math.Abs(s.MassImbalance)
				add(s.Name, v, *g.Max, v <= *g.Max, fmt.Sprintf("%s: mass imbalance %.3g, limit %s", s.Name, s.MassImbalance, num(*g.Max)))
			}
		}
		for _, s := range r.Sweeps {
			if !on(s.Name) {
				continue
			}
			worst, at := 0.0, 0
			for i, m := range s.Members {
				if v := math.Abs(m.MassImbalance); v >= worst {
					worst, at = v, i
				}
			}
			add(s.Name, worst, *g.Max, worst <= *g.Max, fmt.Sprintf("%s: largest mass imbalance %.3g (member %d, scale %s), limit %s",
				s.Name, s.Members[at].MassImbalance, at+1, num(s.Members[at].Scale), num(*g.Max)))
		}
	case "drag", "lift":
		sym, unit := "C_D", ""
		if g.Kind == "lift" {
			sym = "C_L"
		}
		if !coef {
			sym, unit = g.Kind, " "+r.forceUnit()
		}
		check := func(subject, what string, v float64) {
			off := v - *g.Expected
			add(subject, v, *g.Tolerance, math.Abs(off) <= *g.Tolerance, fmt.Sprintf("%s: %s %s %s%s, expected %s ± %s (off by %s)",
				subject, what, sym, num(v), unit, num(*g.Expected), num(*g.Tolerance), num(off)))
		}
		for _, s := range r.Surfaces {
			if on(s.Name) {
				d, l := s.Wind.Drag, s.Wind.Lift
				if coef {
					d, l = s.Coefficients.Drag, s.Coefficients.Lift
				}
				check(s.Name, "far field", pickDL(g.Kind, d, l))
			}
		}
		for _, s := range r.Sweeps {
			if on(s.Name) {
				check(s.Name, "plateau", pickDL(g.Kind, s.Plateau.Drag, s.Plateau.Lift))
			}
		}
	case "no-drift":
		for _, s := range r.Sweeps {
			if on(s.Name) {
				d := s.Drift
				add(s.Name, d.Change, s.Verdict.DriftTol, !d.Flagged, fmt.Sprintf("%s: drag change across the sweep %.4g (slope %.4g ± %.2g per unit scale), drift tolerance %.3g: %s",
					s.Name, d.Change, d.DragSlope, d.DragSlopeErr, s.Verdict.DriftTol, map[bool]string{true: "flagged", false: "not flagged"}[d.Flagged]))
			}
		}
	}
	if len(res.Checks) == 0 {
		return res, fmt.Errorf("nothing to check (no surface or sweep it applies to%s)", map[bool]string{true: ", or no near field", false: ""}[g.Kind == "near-far"])
	}
	var lines []string
	failed := 0
	for _, ch := range res.Checks {
		if !ch.Passed {
			failed++
			lines = append(lines, ch.Text)
		}
	}
	if failed == 0 {
		for _, ch := range res.Checks {
			lines = append(lines, ch.Text)
		}
	}
	res.Message = strings.Join(lines, "; ")
	return res, nil
}

// pickDL returns d for a drag gate, l for a lift gate.
func pickDL(kind string, d, l float64) float64 {
	if kind == "lift" {
		return l
	}
	return d
}

// gateSummary counts the failed gates.
func gateSummary(gates []gateResult) (failed int) {
	for _, g := range gates {
		if !g.Passed {
			failed++
		}
	}
	return failed
}

// nearFarOf returns far − near for a surface result.
func nearFarOf(res integrate.Result, near *nearReport) *integrate.NearFarDifference {
	if near == nil {
		return nil
	}
	d := integrate.CompareNearFar(res, near.NearResult)
	return &d
}
