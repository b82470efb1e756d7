package integrate

// Terms are the parts of a force (N, or N/m in 2D) or moment (N·m, or N
// in 2D) of the momentum balance, each with the sign of its contribution to
// the force on the body:
//
//	Momentum = −∮ ρ(V − V∞)(V·n) dA   (deficit form; −∮ρV(V·n) with Plain; 0 with NoConvection)
//	Pressure = −∮ (p − p_ref) n dA
//	Viscous  = +∮ τ·n dA
//	Reynolds = −∮ R·n dA              (0 where the flow carries no Reynolds stress)
//
// For moments each integrand is preceded by r×, and the momentum part uses
// the plain flux (see the package documentation).
type Terms struct {
	Momentum Vec3 `json:"momentum"`
	Pressure Vec3 `json:"pressure"`
	Viscous  Vec3 `json:"viscous"`
	Reynolds Vec3 `json:"reynolds"`
}

// Sum returns Momentum + Pressure + Viscous + Reynolds, added in that order.
func (t Terms) Sum() Vec3 {
	var s Vec3
	for k := range s {
		s[k] = t.Momentum[k] + t.Pressure[k] + t.Viscous[k] + t.Reynolds[k]
	}
	return s
}

// Wind holds drag, lift and side components (of a force, or of its
// coefficients) along the wind axes of Axes.
type Wind struct {
	Drag float64 `json:"drag"`
	Lift float64 `json:"lift"`
	Side float64 `json:"side"`
}

// Axes is the wind-axis triad, unit vectors in body (mesh) axes:
//
//	Drag = V∞/|V∞|
//	Lift = the unit vector ⊥ Drag in the plane of Drag and Up, on Up's side
//	Side = Lift × Drag
//
// so (Drag, Side, Lift) is right-handed. With V∞ along +x and Up = +z,
// Drag = +x, Side = +y, Lift = +z; in 2D with Up = +y, Lift = +y and
// Side = −z (side force is then always zero).
type Axes struct {
	Drag Vec3 `json:"drag"`
	Lift Vec3 `json:"lift"`
	Side Vec3 `json:"side"`
}

// Result is the outcome of Forces for one surface, ready for JSON. Forces
// are those of the fluid on the body in body (mesh) axes; per unit span in
// 2D. Every number is finite.
type Result struct {
	Spec string `json:"spec"`
	Dim  int    `json:"dim"`
	// Form is "deficit", "plain" or "no-convection": which momentum flux
	// the force uses.
	Form  string `json:"form"`
	Force Vec3   `json:"force"`
	Terms Terms  `json:"terms"`
	// Moment is about MomentCenter; MomentTerms are its parts.
	Moment       Vec3  `json:"moment"`
	MomentTerms  Terms `json:"moment_terms"`
	MomentCenter Vec3  `json:"moment_center"`

	// HasWind is false when |V∞| = 0: the wind axes are then undefined and
	// Axes, Wind and every coefficient are zero.
	HasWind bool `json:"has_wind"`
	Axes    Axes `json:"axes"`
	Wind    Wind `json:"wind"`

	// DynamicPressure is q∞ = ½ρ∞|V∞|² (Pa).
	DynamicPressure float64 `json:"dynamic_pressure"`
	// HasCoefficients is true when q∞ > 0, the wind axes are defined, the
	// reference area (3D) or length (2D) is given and the coefficients are
	// finite; otherwise Coefficients and DragCounts are zero (never NaN).
	HasCoefficients bool `json:"has_coefficients"`
	// Coefficients are Wind/(q∞ S_ref), with S_ref = RefArea in 3D and
	// RefLength in 2D. DragCounts = 1e4·C_D (one count is ΔC_D = 1e-4,
	// common practice).
	Coefficients Wind    `json:"coefficients"`
	DragCounts   float64 `json:"drag_counts"`
	// HasMomentCoefficients is true when, in addition, RefLength is given
	// (3D); MomentCoefficients = Moment/(q∞ S_ref L_ref), body axes.
	HasMomentCoefficients bool `json:"has_moment_coefficients"`
	MomentCoefficients    Vec3 `json:"moment_coefficients"`

	// MassFlux is ṁ = ∮ρV·n dA (kg/s, or kg/(s·m) in 2D), MassAbs is
	// ∮ρ|V·n| dA and MassImbalance = ṁ/MassAbs (0 when MassAbs = 0).
	MassFlux      float64 `json:"mass_flux"`
	MassAbs       float64 `json:"mass_abs"`
	MassImbalance float64 `json:"mass_imbalance"`

	// Geometry of the cut, copied from it: facet, piece and quadrature
	// point counts, tessellated and exact area (length in 2D), relative
	// area error (Area − ExactArea)/ExactArea (0 if ExactArea is 0), and
	// the closure Σ A n, which must be ≈ 0.
	Facets    int     `json:"facets"`
	Pieces    int     `json:"pieces"`
	Points    int     `json:"points"`
	Area      float64 `json:"area"`
	ExactArea float64 `json:"exact_area"`
	AreaError float64 `json:"area_error"`
	Closure   Vec3    `json:"closure"`
}
