// Package integrate computes the force and moment of a fluid on a body from
// the steady momentum balance over a closed control surface cut through a
// flow solution.
//
// # Formulas
//
// With n the unit normal pointing out of the control volume (away from the
// body) and p_ref = Options.Free.P, the force of the fluid on the body is
//
//	F = −∮ [ ρ V (V·n) + (p − p_ref) n − τ·n + R·n ] dA
//	τ = μ_eff (∇V + ∇Vᵀ) − ⅔ μ_eff (∇·V) I,   μ_eff = μ + μ_t
//
// where R = ρ<v'v'> is the Reynolds stress of a time-averaged field, used
// only where the flow supplies it (field.FlowState.HasR). The four parts
// are reported separately (Terms): momentum −∮ρV(V·n), pressure
// −∮(p − p_ref)n, viscous +∮τ·n and Reynolds −∮R·n. The moment about
// x_ref = Options.MomentCenter is the same integral of r × (…),
// r = x − x_ref. (DESIGN.md §1; VALIDATION.md §1.2, §1.5, §1.7.)
//
// # Deficit and plain forms
//
// By default the momentum flux of the force uses the deficit form
// ρ(V − V∞)(V·n): it differs from the plain form by ṁV∞, where
// ṁ = ∮ρV·n dA, which is exactly zero when no mass is created inside the
// surface, so the deficit form removes the effect of interpolation mass
// errors (a relative mass error ε on an inflow face of area A_in shifts C_D
// by about 2εA_in/S_ref in the plain form; VALIDATION.md §1.4). When mass
// really enters or leaves inside the surface (engine exhaust, suction or
// blowing, porous bodies, sources), the deficit form is wrong and
// Options.Plain must be set: for a plane source of flux m in a stream U the
// plain form gives the correct (Lagally) force −ρUm and the deficit form 0.
// The moment always uses the plain flux r × ρV(V·n): replacing V by V − V∞
// there would change it by ∫ρV × V∞ dV over the control volume (divergence
// theorem, steady mass conservation), which does not vanish in general.
//
// Options.NoConvection drops the momentum flux altogether, for creeping
// (Stokes) fields that do not satisfy the Navier–Stokes equations.
//
// # Mass closure
//
// Every result carries ṁ = ∮ρV·n dA (MassFlux), ∮ρ|V·n| dA (MassAbs) and
// MassImbalance = ṁ / ∮ρ|V·n| dA, a signed fraction between −1 and 1 (0
// when MassAbs is 0). VALIDATION.md §1.4 writes the quality figure as
// ε_m = |ṁ| / (½∮ρ|V·n| dA) = 2|MassImbalance|.
//
// # Wind axes and coefficients
//
// Drag is along ê_D = V∞/|V∞|, lift along the unit vector ê_L ⊥ ê_D in the
// plane of ê_D and Options.Up (default +z in 3D, +y in 2D), side along
// ê_S = ê_L × ê_D, so that (ê_D, ê_S, ê_L) is right-handed; the triad is
// returned in Result.Axes for reports to print. FreestreamFromAngles
// builds V∞ from speed, angle of attack and sideslip. Coefficients are
// C = F/(q∞ S_ref) with q∞ = ½ρ∞|V∞|² and S_ref = RefArea (3D) or
// RefLength (2D, per unit span); moment coefficients divide by
// q∞ S_ref L_ref; drag counts are 1e4·C_D. Missing (zero) reference
// quantities are not an error: the coefficients are then zero and
// Result.HasCoefficients / HasMomentCoefficients say so. Negative or
// non-finite ones are errors (ErrOption).
//
// # Two dimensions
//
// For a contour (Cut.Dim == 2) the weights are lengths and every force,
// moment and flux is per unit span; moments are taken about the centre
// projected into the plane, so only M_z is non-zero.
//
// # Summation and determinism
//
// Quadrature points are processed in fixed chunks of ChunkSize points;
// each chunk is summed with Neumaier's compensated summation, and the chunk
// sums (with their compensations) are combined in chunk order. The result
// is bit-identical for any Options.Workers and GOMAXPROCS.
package integrate
