package surface

import (
	"fmt"

	"farforce/field"
)

// MaxGridPoints bounds the number of points of a plane grid.
const MaxGridPoints = 16_000_000

// PlaneGrid is a regular N1 × N2 grid of cell-centred sample points on a
// rectangular wake plane, for the crossflow (Poisson) solves: point (i, j),
// i < N1 along E1 and j < N2 along E2, is at plane coordinates
//
//	s1 = Plane.Min[0] + (i + ½) H1,  s2 = Plane.Min[1] + (j + ½) H2,
//
// with H1 = (Max[0] − Min[0])/N1 and H2 = (Max[1] − Min[1])/N2, so the grid
// nodes (cell corners) lie on the plane's edges. X and At are indexed
// j·N1 + i. A PlaneGrid is read-only after PlaneGridOf returns.
type PlaneGrid struct {
	Plane  Plane
	N1, N2 int
	H1, H2 float64
	X      [][3]float64
	At     []field.Location
}

// GridError reports grid points of a wake plane that lie in no fluid
// cell.
type GridError struct {
	Spec    string
	Missing int        // number of points in no cell
	First   [3]float64 // the first one, in grid order
}

// Error implements error.
func (e *GridError) Error() string {
	return fmt.Sprintf("wake plane %q: %d grid point(s) lie in no fluid cell, the first at (%.4g, %.4g, %.4g): the plane leaves the mesh or crosses the body",
		e.Spec, e.Missing, e.First[0], e.First[1], e.First[2])
}

// PlaneGridOf fits p to the field of l (see Plane.Fit) and returns its
// n1 × n2 grid with every point located in a cell. Errors: a disc or a 2D
// plane (the grid needs a rectangle in a 3D field), n1 or n2 below 2, more
// than MaxGridPoints points, and a *GridError when points lie in no cell.
func PlaneGridOf(l *field.Locator, p Plane, n1, n2 int) (*PlaneGrid, error) {
	p, err := p.Fit(l)
	if err != nil {
		return nil, err
	}
	spec := p.String()
	if p.Dim2 || p.Radius > 0 {
		return nil, fmt.Errorf("wake plane %q: the crossflow grid needs a rectangular plane in a 3D field", spec)
	}
	if n1 < 2 || n2 < 2 || float64(n1)*float64(n2) > MaxGridPoints {
		return nil, fmt.Errorf("wake plane %q: grid %d×%d: want at least 2×2 and at most %d points", spec, n1, n2, MaxGridPoints)
	}
	g := &PlaneGrid{Plane: p, N1: n1, N2: n2,
		H1: (p.Max[0] - p.Min[0]) / float64(n1), H2: (p.Max[1] - p.Min[1]) / float64(n2),
		X: make([][3]float64, n1*n2), At: make([]field.Location, n1*n2)}
	var gerr *GridError
	for j := 0; j < n2; j++ {
		for i := 0; i < n1; i++ {
			k := j*n1 + i
			g.X[k] = p.At(g.S1(i), g.S2(j))
			loc, ok := l.Locate(g.X[k])
			if !ok {
				if gerr == nil {
					gerr = &GridError{Spec: spec, First: g.X[k]}
				}
				gerr.Missing++
				continue
			}
			g.At[k] = loc
		}
	}
	if gerr != nil {
		return nil, gerr
	}
	return g, nil
}

// S1 returns the plane coordinate s1 of grid column i.
func (g *PlaneGrid) S1(i int) float64 { return g.Plane.Min[0] + (float64(i)+0.5)*g.H1 }

// S2 returns the plane coordinate s2 of grid row j.
func (g *PlaneGrid) S2(j int) float64 { return g.Plane.Min[1] + (float64(j)+0.5)*g.H2 }
