package field

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
)

// Quantity is a flow quantity given either as the name of an array or as a
// constant: Name == "" means the constant Value (in SI units).
type Quantity struct {
	Name  string
	Value float64
}

// String returns the array name, or the constant formatted with %g.
func (q Quantity) String() string {
	if q.Name != "" {
		return q.Name
	}
	return strconv.FormatFloat(q.Value, 'g', -1, 64)
}

// IsSet reports whether q names an array or holds a non-zero constant.
func (q Quantity) IsSet() bool { return q.Name != "" || q.Value != 0 }

// FlowMap says which arrays of a field hold the flow variables. It is
// produced by GuessFlowMap and may be overridden field by field.
type FlowMap struct {
	// Velocity is one vector array (2 or 3 components) or 2-3 scalar
	// arrays holding the components in x, y, z order.
	Velocity []string
	// Pressure is the static pressure array (Pa).
	Pressure string
	// Density is the density array or constant (kg/m³).
	Density Quantity
	// Viscosity is the molecular viscosity array or constant: dynamic μ
	// (Pa·s), or kinematic ν (m²/s) when KinematicViscosity is set, in
	// which case μ = ρν.
	Viscosity          Quantity
	KinematicViscosity bool
	// EddyViscosity is the optional eddy viscosity: dynamic μ_t, or
	// kinematic ν_t when EddyKinematic is set (μ_t = ρν_t).
	EddyViscosity Quantity
	EddyKinematic bool
	// ReynoldsStress is an optional array of the Reynolds stress ρ<v'v'>
	// with 6 components (XX, YY, ZZ, XY, YZ, XZ) or 9 (row by row).
	ReynoldsStress string
	// Mask is an optional point or cell array marking non-fluid cells
	// (non-zero = not fluid).
	Mask string
}

// FlowState is the flow at one point: density ρ (kg/m³), pressure p (Pa),
// molecular and eddy dynamic viscosities μ and μ_t (Pa·s), velocity V
// (m/s) and its gradient GradV[i][j] = ∂V_i/∂x_j (1/s). R is the Reynolds
// stress ρ<v'v'> (Pa) when HasR is set.
type FlowState struct {
	Rho, P, Mu, MuT float64
	V               [3]float64
	GradV           [3][3]float64
	R               [3][3]float64
	HasR            bool
}

// FlowEvaluator evaluates the flow at a located point. at is the cell and
// local coordinates of x; implementations may use either. EvalFlow
// overwrites every field of *dst. Implementations must be safe for
// concurrent use.
type FlowEvaluator interface {
	EvalFlow(at Location, x [3]float64, dst *FlowState)
}

// Common array names, tried in order; the first present in the field wins.
var (
	guessVectorVelocity = []string{"U", "velocity", "Velocity", "VELOCITY", "vel", "Vel", "V", "UMean", "UAvg"}
	guessScalarVelocity = [][]string{
		{"VelocityX", "VelocityY", "VelocityZ"},
		{"Velocity_X", "Velocity_Y", "Velocity_Z"},
		{"velocity_x", "velocity_y", "velocity_z"},
		{"Ux", "Uy", "Uz"},
		{"u", "v", "w"},
		{"U", "V", "W"},
	}
	guessPressure    = []string{"p", "pressure", "Pressure", "PRESSURE", "P", "pMean", "static_pressure"}
	guessDensity     = []string{"rho", "density", "Density", "DENSITY", "Rho"}
	guessDynVisc     = []string{"mu", "ViscosityMolecular", "Laminar_Viscosity", "dynamic_viscosity", "viscosity", "Viscosity"}
	guessKinVisc     = []string{"nu", "ViscosityKinematic", "kinematic_viscosity"}
	guessEddyDyn     = []string{"mut", "ViscosityEddy", "Eddy_Viscosity", "eddy_viscosity", "mu_t"}
	guessEddyKin     = []string{"nut", "ViscosityEddyKinematic", "nu_t"}
	guessReynolds    = []string{"R", "ReynoldsStress", "Reynolds_Stress", "UPrime2Mean"}
	guessMask        = []string{"solid", "blank", "Blank", "vtkGhostType", "iblank", "IBLANK"}
	guessVectorComps = map[int]bool{2: true, 3: true}
)

// FlowArrayCandidates returns every array name GuessFlowMap may pick, in
// no particular order, without duplicates. A reader given this list (and
// the names a user set explicitly) can skip every other array unconverted.
func FlowArrayCandidates() []string {
	seen := map[string]bool{}
	var out []string
	add := func(names ...string) {
		for _, n := range names {
			if !seen[n] {
				seen[n] = true
				out = append(out, n)
			}
		}
	}
	add(guessVectorVelocity...)
	for _, set := range guessScalarVelocity {
		add(set...)
	}
	for _, l := range [][]string{guessPressure, guessDensity, guessDynVisc, guessKinVisc, guessEddyDyn, guessEddyKin, guessReynolds, guessMask} {
		add(l...)
	}
	return out
}

// GuessFlowMap guesses the flow mapping of f from common array names
// (velocity U, velocity, Velocity, VelocityX/Y/Z, u/v/w, vel; pressure p,
// pressure, Pressure; density rho, density, Density; viscosity mu,
// ViscosityMolecular or kinematic nu; eddy viscosity nut (kinematic), mut,
// ViscosityEddy (dynamic); mask solid, blank, vtkGhostType). Names are
// looked up in the first zone. The notes say, in plain words, what was
// guessed and what was not found; missing quantities are left empty for the
// caller to supply. The guess never fails.
func GuessFlowMap(f *Field) (FlowMap, []string) {
	var m FlowMap
	var notes []string
	if f == nil || len(f.Zones) == 0 {
		return m, []string{"no zones: nothing to guess from"}
	}
	z := f.Zones[0]
	has := func(name string, comps map[int]bool) bool {
		a := z.Array(name)
		return a != nil && (comps == nil || comps[a.Components])
	}
	scalar := map[int]bool{1: true}
	first := func(names []string, comps map[int]bool) string {
		for _, n := range names {
			if has(n, comps) {
				return n
			}
		}
		return ""
	}

	if v := first(guessVectorVelocity, guessVectorComps); v != "" {
		m.Velocity = []string{v}
		notes = append(notes, fmt.Sprintf("velocity: vector array %q", v))
	} else {
		for _, set := range guessScalarVelocity {
			if has(set[0], scalar) && has(set[1], scalar) {
				m.Velocity = []string{set[0], set[1]}
				if has(set[2], scalar) {
					m.Velocity = append(m.Velocity, set[2])
				}
				notes = append(notes, fmt.Sprintf("velocity: scalar arrays %s", strings.Join(quoteAll(m.Velocity), ", ")))
				break
			}
		}
		if m.Velocity == nil {
			notes = append(notes, "velocity: not found (give --velocity)")
		}
	}

	if p := first(guessPressure, scalar); p != "" {
		m.Pressure = p
		notes = append(notes, fmt.Sprintf("pressure: %q", p))
	} else {
		notes = append(notes, "pressure: not found (give --pressure)")
	}

	if d := first(guessDensity, scalar); d != "" {
		m.Density = Quantity{Name: d}
		notes = append(notes, fmt.Sprintf("density: %q", d))
	} else {
		notes = append(notes, "density: not found (give --density NAME or a constant)")
	}

	// A viscosity is an array of dynamic values, else of kinematic ones.
	viscosity := func(what string, dyn, kin []string, kinNote string) (q Quantity, kinematic, found bool) {
		if n := first(dyn, scalar); n != "" {
			notes = append(notes, fmt.Sprintf("%s: %q (dynamic)", what, n))
			return Quantity{Name: n}, false, true
		}
		if n := first(kin, scalar); n != "" {
			notes = append(notes, fmt.Sprintf("%s: %q (kinematic, %s)", what, n, kinNote))
			return Quantity{Name: n}, true, true
		}
		return Quantity{}, false, false
	}
	var found bool
	if m.Viscosity, m.KinematicViscosity, found = viscosity("viscosity", guessDynVisc, guessKinVisc, "mu = rho*nu"); !found {
		notes = append(notes, "viscosity: not found (give --viscosity NAME or a constant; inviscid otherwise)")
	}
	m.EddyViscosity, m.EddyKinematic, _ = viscosity("eddy viscosity", guessEddyDyn, guessEddyKin, "mu_t = rho*nut")

	if r := first(guessReynolds, map[int]bool{6: true, 9: true}); r != "" {
		m.ReynoldsStress = r
		notes = append(notes, fmt.Sprintf("Reynolds stress: %q", r))
	}

	if k := first(guessMask, scalar); k != "" {
		m.Mask = k
		notes = append(notes, fmt.Sprintf("mask: %q (non-zero marks non-fluid cells)", k))
	}
	return m, notes
}

func quoteAll(s []string) []string {
	q := make([]string, len(s))
	for i, v := range s {
		q[i] = strconv.Quote(v)
	}
	return q
}

// FlowSampler evaluates a FlowMap on a field through a Sampler: values by
// the sampler's interpolation, the velocity gradient by its gradient. It
// implements FlowEvaluator and is safe for concurrent use.
type FlowSampler struct {
	s        *Sampler
	vel      []ArrayID // one vector array, or one scalar array per component
	velComps int       // components of the velocity (2 or 3)
	p        ArrayID
	rho      quantitySource
	mu, muT  quantitySource
	kinMu    bool
	kinMuT   bool
	rs       ArrayID
	rsComps  int // 0 (none), 6 or 9
	// cached lists the point arrays whose node values a FlowCache
	// gathers once per cell; slot[id] is the per-node offset of array id
	// in that gather (-1: not cached), width the values per node.
	cached []ArrayID
	slot   []int
	width  int
}

// quantitySource is a Quantity resolved against a Sampler.
type quantitySource struct {
	id    ArrayID
	named bool
	value float64
}

// at returns the quantity at the site of c.
func (q quantitySource) at(fs *FlowSampler, c *FlowCache) float64 {
	if !q.named {
		return q.value
	}
	var v [1]float64
	fs.value(c, q.id, v[:])
	return v[0]
}

// NewFlowSampler prepares the arrays of m on s and returns an evaluator of
// the flow. Velocity and pressure must be mapped and the density must be an
// array or a positive constant; viscosities are optional (zero when unset)
// and must not be negative constants. A velocity of two components (one 2-
// vector, or two scalar arrays) has w = 0 and ∂w/∂x_j = 0. Errors name the
// quantity and the array; the Sampler's own errors (missing array, NaN
// values) are wrapped.
//
// Prepare is called on s here, so NewFlowSampler must not run concurrently
// with other Prepare calls or evaluations on s.
func NewFlowSampler(s *Sampler, m FlowMap) (*FlowSampler, error) {
	fs := &FlowSampler{s: s}
	switch n := len(m.Velocity); {
	case n == 1:
		id, err := prepareArray(s, "velocity", m.Velocity[0], 2, 3)
		if err != nil {
			return nil, err
		}
		fs.vel, fs.velComps = []ArrayID{id}, s.Components(id)
	case n == 2 || n == 3:
		for _, name := range m.Velocity {
			id, err := prepareArray(s, "velocity", name, 1)
			if err != nil {
				return nil, err
			}
			fs.vel = append(fs.vel, id)
		}
		fs.velComps = n
	case n == 0:
		return nil, errors.New("velocity: no array mapped")
	default:
		return nil, fmt.Errorf("velocity: %d arrays given, want one vector or 2-3 scalars", n)
	}
	if m.Pressure == "" {
		return nil, errors.New("pressure: no array mapped")
	}
	var err error
	if fs.p, err = prepareArray(s, "pressure", m.Pressure, 1); err != nil {
		return nil, err
	}
	if fs.rho, err = resolveQuantity(s, "density", m.Density, true); err != nil {
		return nil, err
	}
	if fs.mu, err = resolveQuantity(s, "viscosity", m.Viscosity, false); err != nil {
		return nil, err
	}
	fs.kinMu = m.KinematicViscosity
	if fs.muT, err = resolveQuantity(s, "eddy viscosity", m.EddyViscosity, false); err != nil {
		return nil, err
	}
	fs.kinMuT = m.EddyKinematic
	if m.ReynoldsStress != "" {
		if fs.rs, err = prepareArray(s, "Reynolds stress", m.ReynoldsStress, 6, 9); err != nil {
			return nil, err
		}
		fs.rsComps = s.Components(fs.rs)
	}
	fs.planCache()
	return fs, nil
}

// maxCachedWidth bounds the values per node a FlowCache holds.
const maxCachedWidth = 16

// planCache chooses the point arrays whose node values FlowCache keeps:
// every point array the flow reads, while they fit.
func (fs *FlowSampler) planCache() {
	s := fs.s
	ids := append([]ArrayID{}, fs.vel...)
	ids = append(ids, fs.p)
	for _, q := range []quantitySource{fs.rho, fs.mu, fs.muT} {
		if q.named {
			ids = append(ids, q.id)
		}
	}
	if fs.rsComps > 0 {
		ids = append(ids, fs.rs)
	}
	fs.slot = make([]int, len(s.arrays))
	for i := range fs.slot {
		fs.slot[i] = -1
	}
	for _, id := range ids {
		p := s.arrays[id]
		if p.at != AtPoints || fs.slot[id] >= 0 || fs.width+p.comps > maxCachedWidth {
			continue
		}
		fs.slot[id] = fs.width
		fs.cached = append(fs.cached, id)
		fs.width += p.comps
	}
}

// prepareArray prepares the array called name on s for the quantity what
// and checks that it has one of the given component counts (any if none).
func prepareArray(s *Sampler, what, name string, comps ...int) (ArrayID, error) {
	id, err := s.Prepare(name)
	if err != nil {
		return 0, fmt.Errorf("%s: %w", what, err)
	}
	if len(comps) > 0 && !slices.Contains(comps, s.Components(id)) {
		return 0, fmt.Errorf("%s: array %q has %d components, want %s", what, name, s.Components(id), joinInts(comps))
	}
	return id, nil
}

// resolveQuantity prepares a named quantity or checks a constant one.
func resolveQuantity(s *Sampler, what string, q Quantity, required bool) (quantitySource, error) {
	if q.Name != "" {
		id, err := prepareArray(s, what, q.Name, 1)
		if err != nil {
			return quantitySource{}, err
		}
		return quantitySource{id: id, named: true}, nil
	}
	switch {
	case math.IsNaN(q.Value) || math.IsInf(q.Value, 0) || q.Value < 0:
		return quantitySource{}, fmt.Errorf("%s: constant %g must be finite and not negative", what, q.Value)
	case required && q.Value == 0:
		return quantitySource{}, fmt.Errorf("%s: not mapped: give an array name or a positive constant", what)
	}
	return quantitySource{value: q.Value}, nil
}

// EvalFlow fills *dst with the flow at the location at (x is unused: the
// sampler interpolates from the cell and its local coordinates). Kinematic
// viscosities are turned into dynamic ones with the local density.
func (fs *FlowSampler) EvalFlow(at Location, x [3]float64, dst *FlowState) {
	var c FlowCache
	fs.EvalFlowCached(at, x, dst, &c)
}

// FlowCache holds what a FlowSampler gathers for one cell (node positions
// and numbers, the recovered nodal gradients of the velocity), so that
// consecutive evaluations in the same cell, such as the quadrature points
// of one cut piece, gather it once. The zero value is empty and ready; a
// cache belongs to one goroutine.
type FlowCache struct {
	fs      *FlowSampler // the sampler that gathered st (nil: nothing yet)
	st      site
	hasGrad bool // grad holds the nodal velocity gradients of that cell
	hasVals bool // vals holds the node values of the cached arrays
	grad    [maxCellNodes * 9]float64
	// vals holds, for each cached array of per-node offset o and comps
	// components, its node values at vals[nn*o+k*comps+c] (nn nodes).
	vals [maxCellNodes * maxCachedWidth]float64
}

// CachedFlowEvaluator is a FlowEvaluator that can reuse per-cell work
// across consecutive calls through a caller-owned FlowCache, with results
// bit-identical to EvalFlow.
type CachedFlowEvaluator interface {
	FlowEvaluator
	EvalFlowCached(at Location, x [3]float64, dst *FlowState, c *FlowCache)
}

// EvalFlowCached is EvalFlow reusing c: when at lies in the cell of the
// previous call made with c, the cell's nodes and nodal gradients are
// taken from c instead of gathered again. The result is the same bits.
func (fs *FlowSampler) EvalFlowCached(at Location, x [3]float64, dst *FlowState, c *FlowCache) {
	s := fs.s
	*dst = FlowState{}
	st := &c.st
	if c.fs != fs || st.at.Zone != at.Zone || st.at.Cell != at.Cell {
		s.site(at, st) // one gather for every array
		c.fs, c.hasGrad, c.hasVals = fs, false, false
	} else {
		st.at, st.hasN = at, false
	}
	var val [9]float64
	var grad [9]float64
	fs.velocityGradient(c, grad[:3*fs.velComps])
	if len(fs.vel) == 1 {
		fs.value(c, fs.vel[0], val[:fs.velComps])
	} else {
		for i, id := range fs.vel {
			fs.value(c, id, val[i:i+1])
		}
	}
	for i := 0; i < fs.velComps; i++ {
		dst.V[i] = val[i]
		dst.GradV[i] = [3]float64{grad[3*i], grad[3*i+1], grad[3*i+2]}
	}
	fs.value(c, fs.p, val[:1])
	dst.P = val[0]
	dst.Rho = fs.rho.at(fs, c)
	dst.Mu = fs.mu.at(fs, c)
	if fs.kinMu {
		dst.Mu *= dst.Rho
	}
	dst.MuT = fs.muT.at(fs, c)
	if fs.kinMuT {
		dst.MuT *= dst.Rho
	}
	if fs.rsComps > 0 {
		fs.value(c, fs.rs, val[:fs.rsComps])
		dst.HasR = true
		if fs.rsComps == 9 {
			for i := 0; i < 3; i++ {
				dst.R[i] = [3]float64{val[3*i], val[3*i+1], val[3*i+2]}
			}
		} else { // XX, YY, ZZ, XY, YZ, XZ
			dst.R = [3][3]float64{
				{val[0], val[3], val[5]},
				{val[3], val[1], val[4]},
				{val[5], val[4], val[2]},
			}
		}
	}
}

// value stores in dst the value of array id at the site of c: for a
// cached point array Σ_k N_k f_k from the node values gathered into c once
// per cell (the same bits as Sampler.valueAt), otherwise by valueAt.
func (fs *FlowSampler) value(c *FlowCache, id ArrayID, dst []float64) {
	s, st := fs.s, &c.st
	o := fs.slot[id]
	if o < 0 || !st.ok {
		s.valueAt(s.arrays[id], st, dst)
		return
	}
	nn := len(st.nodes)
	if !c.hasVals {
		for _, cid := range fs.cached {
			p := s.arrays[cid]
			data, w := p.data[st.at.Zone], p.comps
			blk := c.vals[nn*fs.slot[cid]:]
			for k, n := range st.nodes {
				copy(blk[k*w:(k+1)*w], data[int(n)*w:int(n)*w+w])
			}
		}
		c.hasVals = true
	}
	w := s.arrays[id].comps
	combineNodal(st.shape(), nn, c.vals[nn*o:nn*(o+w)], dst[:w])
}

// velocityGradient stores in dst[3i+j] = ∂V_i/∂x_j at the site of c: for
// point data Σ_k N_k G_k with the recovered nodal gradients G_k, gathered
// into c once per cell; for cell data the cell's reconstruction.
func (fs *FlowSampler) velocityGradient(c *FlowCache, dst []float64) {
	s, st := fs.s, &c.st
	atCells := false
	for _, id := range fs.vel {
		atCells = atCells || s.arrays[id].at == AtCells
	}
	if !st.ok || atCells {
		if len(fs.vel) == 1 {
			s.gradientAt(GradientRecovered, s.arrays[fs.vel[0]], st, dst)
			return
		}
		for i, id := range fs.vel {
			s.gradientAt(GradientRecovered, s.arrays[id], st, dst[3*i:3*i+3])
		}
		return
	}
	nn, w := len(st.nodes), len(dst)
	if !c.hasGrad {
		// Node-major over all velocity arrays: node k holds w values.
		var one [maxCellNodes * 9]float64
		for i, id := range fs.vel {
			p := s.arrays[id]
			pw := 3 * p.comps
			s.nodeGradients(p, st, one[:nn*pw])
			for k := 0; k < nn; k++ {
				copy(c.grad[k*w+i*pw:k*w+(i+1)*pw], one[k*pw:(k+1)*pw])
			}
		}
		c.hasGrad = true
	}
	combineNodal(st.shape(), nn, c.grad[:nn*w], dst)
}

func joinInts(v []int) string {
	s := make([]string, len(v))
	for i, n := range v {
		s[i] = strconv.Itoa(n)
	}
	return strings.Join(s, " or ")
}

// ApplyMask marks as blank (not fluid) the cells of f that the array called
// name flags with a non-zero value, and returns how many cells it newly
// blanked. A cell array flags its cell; a point array flags a cell when
// every node of the cell is flagged (so a fluid cell touching a solid
// node stays fluid). Cells already blank stay blank. The array must be a
// one-component array present in every zone; otherwise, or if it holds NaN,
// the error names the array and zone. ApplyMask mutates Zone.Blank, so call
// it before NewLocator.
func ApplyMask(f *Field, name string) (int, error) {
	n := 0
	for _, z := range f.Zones {
		a := z.Array(name)
		if a == nil {
			return n, fmt.Errorf("mask: zone %q has no array %q", z.Name, name)
		}
		if a.Components != 1 {
			return n, fmt.Errorf("mask: array %q in zone %q has %d components, want 1", name, z.Name, a.Components)
		}
		if err := z.Validate(); err != nil {
			return n, fmt.Errorf("mask: %w", err)
		}
		flagged := func(i int) (bool, error) {
			v := a.Data[i]
			if math.IsNaN(v) {
				return false, fmt.Errorf("mask: array %q in zone %q: NaN at %s %d", name, z.Name, a.Location, i)
			}
			return v != 0, nil
		}
		for c := 0; c < z.NumCells(); c++ {
			mark := true
			if a.Location == AtCells {
				var err error
				if mark, err = flagged(c); err != nil {
					return n, err
				}
			} else {
				for _, p := range z.CellNodes(c) {
					ok, err := flagged(int(p))
					if err != nil {
						return n, err
					}
					mark = mark && ok
				}
			}
			if !mark || (z.Blank != nil && z.Blank[c]) {
				continue
			}
			if z.Blank == nil {
				z.Blank = make([]bool, z.NumCells())
			}
			z.Blank[c] = true
			n++
		}
	}
	return n, nil
}
