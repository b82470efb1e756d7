package field

import (
	"fmt"
	"math"
	"sync/atomic"
)

// ArrayID names an array prepared in a Sampler.
type ArrayID int

// GradientMethod selects how Sampler.GradientWith differentiates point data.
type GradientMethod uint8

const (
	// GradientRecovered interpolates, with the shape functions, nodal
	// gradients recovered by a least-squares quadratic fit to the nodal
	// values around each node. Second order on smooth fields; the default.
	GradientRecovered GradientMethod = iota
	// GradientShape differentiates the shape-function interpolant itself:
	// exact for fields the cell represents exactly (linear, and bilinear /
	// trilinear on quads / hexahedra), first order otherwise, and
	// discontinuous across cell faces.
	GradientShape
)

// String returns "recovered" or "shape".
func (m GradientMethod) String() string {
	if m == GradientShape {
		return "shape"
	}
	return "recovered"
}

// Sampler evaluates arrays of a located field, and their gradients, at
// Locations. Point arrays are interpolated with the shape functions of the
// cell; cell arrays are reconstructed by a least-squares quadratic fit per
// cell (see the package documentation for formulas and measured orders).
//
// Prepare must not be called concurrently with anything else; after the
// Prepare calls are done, Value, Gradient and GradientWith are safe for
// concurrent use. Reconstructions and recovered gradients are computed on
// first use and cached with atomic stores; the cached values depend only on
// the field, so results are the same bits whatever the order or concurrency
// of the queries.
type Sampler struct {
	l      *Locator
	arrays []*prepared
	byName map[string]ArrayID
	used   [][]bool // per zone: points used by an indexed cell (built on demand)
	// Stencil operators and cell centroids, per zone and point or cell,
	// shared by all arrays of a centering; allocated by the first Prepare
	// of that centering, filled lazily.
	nodeOps, cellOps [][]atomic.Pointer[stencilOp]
	centroids        [][]atomic.Pointer[[3]float64]
	// cellsAt caches, per zone and point, the indexed cells having a node
	// at the point's position (see nodeCells); allocated by the first
	// Prepare, filled lazily.
	cellsAt [][]atomic.Pointer[[]CellRef]
}

// prepared is one array ready for sampling.
type prepared struct {
	name  string
	at    Centering
	comps int
	data  [][]float64 // per zone
	// cache holds, per zone, one lazily computed polyFit per cell (cell
	// data only).
	cache [][]atomic.Pointer[polyFit]
	// grads holds, per zone, the lazily recovered nodal gradients in
	// blocks of gradBlockSize nodes (point data only).
	grads [][]atomic.Pointer[gradBlock]
}

// NewSampler returns a Sampler over the field of l.
func NewSampler(l *Locator) *Sampler {
	return &Sampler{l: l, byName: map[string]ArrayID{}}
}

// Prepare makes the array called name ready for sampling and returns its
// id; preparing the same name again returns the same id. The array must
// exist in every zone with the same centering and number of components and
// the right length, and every value that sampling can reach must be finite:
// for point arrays the values at points used by indexed cells, for cell
// arrays the values of indexed (non-blank) cells. Otherwise the error names
// the array, the zone and the first bad index. Cost: one pass over the
// array; reconstructions are built lazily on first use.
func (s *Sampler) Prepare(name string) (ArrayID, error) {
	if id, ok := s.byName[name]; ok {
		return id, nil
	}
	p := &prepared{name: name}
	f := s.l.f
	for zi, z := range f.Zones {
		a := z.Array(name)
		if a == nil {
			return 0, fmt.Errorf("field: array %q: missing in zone %d (%q)", name, zi, z.Name)
		}
		if zi == 0 {
			p.at, p.comps = a.Location, a.Components
		} else if a.Location != p.at || a.Components != p.comps {
			return 0, fmt.Errorf("field: array %q: zone %d (%q) has %d components at %ss, zone 0 has %d at %ss",
				name, zi, z.Name, a.Components, a.Location, p.comps, p.at)
		}
		n := z.NumPoints()
		if a.Location == AtCells {
			n = z.NumCells()
		}
		if a.Components < 1 || len(a.Data) != n*a.Components {
			return 0, fmt.Errorf("field: array %q: zone %d (%q): %d values for %d %ss of %d components",
				name, zi, z.Name, len(a.Data), n, a.Location, a.Components)
		}
		if err := s.checkFinite(p, zi, a); err != nil {
			return 0, err
		}
		p.data = append(p.data, a.Data)
		if a.Location == AtCells {
			p.cache = append(p.cache, make([]atomic.Pointer[polyFit], n))
		} else {
			p.grads = append(p.grads, make([]atomic.Pointer[gradBlock], (n+gradBlockSize-1)/gradBlockSize))
		}
	}
	s.allocShared(p.at)
	id := ArrayID(len(s.arrays))
	s.arrays = append(s.arrays, p)
	s.byName[name] = id
	return id, nil
}

// allocShared allocates the shared operator caches of centering at, and
// the node-to-cells cache of every centering.
func (s *Sampler) allocShared(at Centering) {
	zones := s.l.f.Zones
	if s.cellsAt == nil {
		s.cellsAt = make([][]atomic.Pointer[[]CellRef], len(zones))
		for i, z := range zones {
			s.cellsAt[i] = make([]atomic.Pointer[[]CellRef], z.NumPoints())
		}
	}
	if at == AtPoints && s.nodeOps == nil {
		s.nodeOps = make([][]atomic.Pointer[stencilOp], len(zones))
		for i, z := range zones {
			s.nodeOps[i] = make([]atomic.Pointer[stencilOp], z.NumPoints())
		}
	}
	if at == AtCells && s.cellOps == nil {
		s.cellOps = make([][]atomic.Pointer[stencilOp], len(zones))
		s.centroids = make([][]atomic.Pointer[[3]float64], len(zones))
		for i, z := range zones {
			s.cellOps[i] = make([]atomic.Pointer[stencilOp], z.NumCells())
			s.centroids[i] = make([]atomic.Pointer[[3]float64], z.NumCells())
		}
	}
}

// checkFinite reports the first non-finite value of a that sampling can
// reach.
func (s *Sampler) checkFinite(p *prepared, zi int, a *Array) error {
	z := s.l.f.Zones[zi]
	var used []bool
	if a.Location == AtPoints {
		used = s.usedPoints(zi)
	}
	for i, v := range a.Data {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			continue
		}
		t := i / a.Components
		if a.Location == AtCells && !s.l.indexable(z, t) || a.Location == AtPoints && !used[t] {
			continue
		}
		return fmt.Errorf("field: array %q: zone %d (%q): %s %d component %d is %v",
			p.name, zi, z.Name, a.Location, t, i%a.Components, v)
	}
	return nil
}

// usedPoints returns the mask of points of zone zi used by indexed cells.
func (s *Sampler) usedPoints(zi int) []bool {
	if s.used == nil {
		s.used = make([][]bool, len(s.l.f.Zones))
	}
	if s.used[zi] == nil {
		z := s.l.f.Zones[zi]
		u := make([]bool, z.NumPoints())
		for c := range z.Types {
			if s.l.indexable(z, c) {
				for _, n := range z.CellNodes(c) {
					u[n] = true
				}
			}
		}
		s.used[zi] = u
	}
	return s.used[zi]
}

// Components returns the number of components of array id. It panics if id
// was not returned by Prepare.
func (s *Sampler) Components(id ArrayID) int { return s.arrays[id].comps }

// Centering returns whether array id is given at points or at cells.
func (s *Sampler) Centering(id ArrayID) Centering { return s.arrays[id].at }

// Value stores in dst[:comps] the value of array id at the located point.
// Point data: Σ_k N_k(r) f_k over the nodes k of the cell, with the shape
// functions N_k of the cell type at local coordinates r. Cell data: the
// cell's least-squares quadratic reconstruction at the point (for a blank
// cell, reached through InCell, the fit of its non-blank neighbours
// extrapolated into it). A cell without shape functions yields NaN.
//
// It panics (programmer error) if id is unknown, at names no cell of the
// field, or dst is shorter than the number of components.
func (s *Sampler) Value(id ArrayID, at Location, dst []float64) {
	p := s.arrays[id]
	_ = dst[p.comps-1]
	var st site
	s.site(at, &st)
	s.valueAt(p, &st, dst)
}

// site is one located point made ready for sampling several arrays there:
// the geometry and nodes of its cell, gathered once, and the shape function
// values at the point, computed on first need. Value and GradientWith build
// one per call; FlowSampler builds one per evaluation, with the same
// results.
type site struct {
	at    Location
	ok    bool // the cell type has shape functions
	g     cellGeom
	nodes []int32
	n     [maxCellNodes]float64
	hasN  bool
}

// site makes st ready for sampling at the located point at.
func (s *Sampler) site(at Location, st *site) {
	z := s.l.f.Zones[at.Zone]
	st.at, st.hasN = at, false
	st.ok = z.gather(int(at.Cell), &st.g)
	st.nodes = z.CellNodes(int(at.Cell))
}

// shape returns the shape function values N_k at the site.
func (st *site) shape() *[maxCellNodes]float64 {
	if !st.hasN {
		shapeValues(st.g.t, st.at.Local, &st.n)
		st.hasN = true
	}
	return &st.n
}

// valueAt is Value of array p at site st.
func (s *Sampler) valueAt(p *prepared, st *site, dst []float64) {
	if !st.ok {
		fillNaN(dst[:p.comps])
		return
	}
	if p.at == AtCells {
		fit := s.cellFit(p, int(st.at.Zone), int(st.at.Cell))
		fit.value(st.g.position(st.at.Local), dst)
		return
	}
	N := st.shape()
	data := p.data[st.at.Zone]
	for c := 0; c < p.comps; c++ {
		v := 0.0
		for k, n := range st.nodes {
			v += N[k] * data[int(n)*p.comps+c]
		}
		dst[c] = v
	}
}

// Gradient stores in dst[3*c+j] the derivative of component c of array id
// with respect to x_j at the located point, by the default method:
// GradientRecovered for point data, the gradient of the quadratic
// reconstruction for cell data. In 2D the z derivatives are zero. It
// panics like Value, or if len(dst) < 3*comps.
func (s *Sampler) Gradient(id ArrayID, at Location, dst []float64) {
	s.GradientWith(GradientRecovered, id, at, dst)
}

// GradientWith is Gradient with a chosen method for point data:
//
//	GradientShape:     ∇f = Σ_k f_k ∇N_k,  ∇N_k = J⁻ᵀ ∂N_k/∂r,  J = ∂x/∂r
//	GradientRecovered: ∇f = Σ_k N_k(r) G_k
//
// where G_k is the gradient at node k of a least-squares quadratic fitted to
// the nodal values of the cells around node k (more layers where fewer than
// 1.5 times as many nodes as coefficients are found). Cell data ignore m.
// A degenerate cell yields NaN.
func (s *Sampler) GradientWith(m GradientMethod, id ArrayID, at Location, dst []float64) {
	p := s.arrays[id]
	_ = dst[3*p.comps-1]
	var st site
	s.site(at, &st)
	s.gradientAt(m, p, &st, dst)
}

// gradientAt is GradientWith of array p at site st.
func (s *Sampler) gradientAt(m GradientMethod, p *prepared, st *site, dst []float64) {
	if !st.ok {
		fillNaN(dst[:3*p.comps])
		return
	}
	if p.at == AtCells {
		fit := s.cellFit(p, int(st.at.Zone), int(st.at.Cell))
		fit.gradient(st.g.position(st.at.Local), dst)
		return
	}
	for i := range dst[:3*p.comps] {
		dst[i] = 0
	}
	if m == GradientShape {
		var dNdx [maxCellNodes][3]float64
		if !st.g.gradientMap(st.at.Local, &dNdx) {
			fillNaN(dst[:3*p.comps])
			return
		}
		data := p.data[st.at.Zone]
		for k, n := range st.nodes {
			for c := 0; c < p.comps; c++ {
				v := data[int(n)*p.comps+c]
				for j := 0; j < 3; j++ {
					dst[3*c+j] += v * dNdx[k][j]
				}
			}
		}
		return
	}
	w := 3 * p.comps
	var G [maxCellNodes * 3 * maxInlineComps]float64
	buf := G[:]
	if len(st.nodes)*w > len(buf) {
		buf = make([]float64, len(st.nodes)*w)
	}
	s.nodeGradients(p, st, buf)
	combineNodal(st.shape(), len(st.nodes), buf, dst[:w])
}

// nodeGradients stores in G[k*w:(k+1)*w] (w = 3*comps) the recovered
// gradient of array p at node k of the cell of site st.
func (s *Sampler) nodeGradients(p *prepared, st *site, G []float64) {
	w := 3 * p.comps
	for k, n := range st.nodes {
		g := G[k*w : (k+1)*w]
		if src := s.nodeGradient(p, int(st.at.Zone), n, g); &src[0] != &g[0] {
			copy(g, src)
		}
	}
}

// combineNodal sets dst[i] = Σ_k N_k G[k*len(dst)+i] over the nn nodes,
// adding in node order (the same bits wherever it is called from).
func combineNodal(N *[maxCellNodes]float64, nn int, G, dst []float64) {
	w := len(dst)
	var acc [3 * maxInlineComps]float64
	if w > len(acc) {
		for i := range dst {
			v := 0.0
			for k := 0; k < nn; k++ {
				v += N[k] * G[k*w+i]
			}
			dst[i] = v
		}
		return
	}
	// Node by node over contiguous values: each output still adds its
	// terms in node order, so the bits are those of the loop above. The
	// common widths keep their sums in registers.
	G = G[:nn*w]
	switch w {
	case 1:
		a0 := 0.0
		for k, g := range G {
			a0 += N[k] * g
		}
		dst[0] = a0
		return
	case 3:
		var a0, a1, a2 float64
		for k := 0; k < nn; k++ {
			g, nk := G[3*k:3*k+3:3*k+3], N[k]
			a0 += nk * g[0]
			a1 += nk * g[1]
			a2 += nk * g[2]
		}
		dst[0], dst[1], dst[2] = a0, a1, a2
		return
	case 9:
		var a0, a1, a2, a3, a4, a5, a6, a7, a8 float64
		for k := 0; k < nn; k++ {
			g, nk := G[9*k:9*k+9:9*k+9], N[k]
			a0 += nk * g[0]
			a1 += nk * g[1]
			a2 += nk * g[2]
			a3 += nk * g[3]
			a4 += nk * g[4]
			a5 += nk * g[5]
			a6 += nk * g[6]
			a7 += nk * g[7]
			a8 += nk * g[8]
		}
		dst[0], dst[1], dst[2], dst[3], dst[4], dst[5], dst[6], dst[7], dst[8] = a0, a1, a2, a3, a4, a5, a6, a7, a8
		return
	}
	a := acc[:w]
	for k := 0; k < nn; k++ {
		nk := N[k]
		for i, v := range G[k*w : k*w+w] {
			a[i] += nk * v
		}
	}
	copy(dst, a)
}

// maxInlineComps is the component count up to which scratch space lives on
// the stack.
const maxInlineComps = 9

func fillNaN(d []float64) {
	for i := range d {
		d[i] = math.NaN()
	}
}
