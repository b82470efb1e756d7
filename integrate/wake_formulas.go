package integrate

import "math"

// Point-by-point formulas of the wake-plane analyses (VALIDATION §2.1–2.6).
// All pressures are in Pa, densities in kg/m³, speeds in m/s; the
// compressible ones need absolute pressures.

// EntropyRise returns Δs/R = s/R − s∞/R of a perfect gas with ratio of
// specific heats gamma:
//
//	Δs/R = ln(p/p∞)/(γ − 1) − γ ln(ρ/ρ∞)/(γ − 1)
//
// (the Gibbs relation for a perfect gas; e.g. Anderson, Modern Compressible
// Flow, eq. 1.34, from memory). All arguments must be positive.
func EntropyRise(p, rho, pInf, rhoInf, gamma float64) float64 {
	return (math.Log(p/pInf) - gamma*math.Log(rho/rhoInf)) / (gamma - 1)
}

// TotalPressureCompressible returns the isentropic total pressure
// p₀ = p (1 + (γ−1)/2 M²)^(γ/(γ−1)) with M² = ρ|V|²/(γ p), |V|² = speed2.
func TotalPressureCompressible(p, rho, speed2, gamma float64) float64 {
	m2 := rho * speed2 / (gamma * p)
	return p * math.Pow(1+(gamma-1)/2*m2, gamma/(gamma-1))
}

// BetzVelocity returns Betz's artificial velocity
// u* = √(u² + 2(p₀∞ − p₀)/ρ) (Betz 1925; VALIDATION §2.4), equal to u where
// the total pressure is the freestream's. ok is false (and u* = 0) when
// the radicand is negative: total pressure above the freestream's by more
// than ½ρu² (a jet, or numerical error).
func BetzVelocity(u, p0, p0Inf, rho float64) (ustar float64, ok bool) {
	r := u*u + 2*(p0Inf-p0)/rho
	if r < 0 {
		return 0, false
	}
	return math.Sqrt(r), true
}

// BetzProfile returns the integrand of Betz's profile drag,
//
//	(p₀∞ − p₀) + ½ρ (u* − u)(u* + u − 2U∞),
//
// which vanishes outside the wake (u* = u, p₀ = p₀∞) (VALIDATION §2.4).
func BetzProfile(u, ustar, p0, p0Inf, rho, uInf float64) float64 {
	return (p0Inf - p0) + 0.5*rho*(ustar-u)*(ustar+u-2*uInf)
}

// Jones returns the integrand of Jones's (1936) formula for a total-
// pressure survey, the drag per unit area of the survey plane:
//
//	2 √(p₀ − p) (√(p₀∞ − p∞) − √(p₀ − p∞))
//
// (Jones 1936, ARC R&M 1688; VALIDATION §2.3). Each stream tube keeps its
// total pressure and expands to p∞ downstream. ok is false (integrand 0)
// where p₀ < p or p₀ < p∞: the tube cannot reach p∞ with positive speed.
func Jones(p0, p, p0Inf, pInf float64) (float64, bool) {
	if p0 < p || p0 < pInf || p0Inf < pInf {
		return 0, false
	}
	return 2 * math.Sqrt(p0-p) * (math.Sqrt(p0Inf-pInf) - math.Sqrt(p0-pInf)), true
}

// JonesCompressible returns the integrand of the exact point-by-point
// compressible survey formula (adiabatic wake, isentropic expansion of
// each tube to p∞; VALIDATION §2.3, the approach of Young 1939 and Block &
// Katzoff 1945), the drag per unit area:
//
//	ρ∞U∞² (ρ/ρ∞)(u/U∞)(1 − u₁/U∞),
//	ρ/ρ∞ = (p/p∞)^(1/γ) (p₀/p₀∞)^((γ−1)/γ),
//	u/U∞ = √[(1 − (p/p₀)^((γ−1)/γ)) / (1 − (p∞/p₀∞)^((γ−1)/γ))],
//	u₁/U∞ = √[(1 − (p∞/p₀)^((γ−1)/γ)) / (1 − (p∞/p₀∞)^((γ−1)/γ))].
//
// rhoU2 is ρ∞U∞². ok is false (integrand 0) where p₀ < p or p₀ < p∞.
func JonesCompressible(p0, p, p0Inf, pInf, rhoU2, gamma float64) (float64, bool) {
	if p0 < p || p0 < pInf || !(p0Inf > pInf) {
		return 0, false
	}
	e := (gamma - 1) / gamma
	den := 1 - math.Pow(pInf/p0Inf, e)
	rr := math.Pow(p/pInf, 1/gamma) * math.Pow(p0/p0Inf, e)
	uU := math.Sqrt((1 - math.Pow(p/p0, e)) / den)
	u1U := math.Sqrt((1 - math.Pow(pInf/p0, e)) / den)
	return rhoU2 * rr * uU * (1 - u1U), true
}
