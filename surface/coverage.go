package surface

import "fmt"

// CoverageTol is the relative tolerance on the area of each facet: the
// pieces cut from a facet must add up to its area within CoverageTol
// times that area.
const CoverageTol = 1e-9

// CoverageError reports that part of a surface lies in no fluid cell
// (outside the domain, inside a carved-out body, or in blank cells), or in
// more than one cell (overlapping zones). The integral over such a surface
// would be a silent partial sum, so CutSurface refuses it.
type CoverageError struct {
	// Spec is the surface spec.
	Spec string
	// Dim is 3 for a surface (areas in m²), 2 for a contour (lengths in m).
	Dim int
	// Uncovered is the area (length) of the surface in no cell, Overlap
	// the area (length) counted in more than one cell.
	Uncovered, Overlap float64
	// Fraction is Uncovered (or Overlap when Uncovered is 0) divided by
	// the surface area (length).
	Fraction float64
	// Near is the centroid of the largest uncovered (or doubly covered)
	// part of one facet.
	Near [3]float64
	// Facets is the number of facets with a gap (or an overlap).
	Facets int
}

// Error describes the gap: how much, what fraction, where, and the likely
// cause.
func (e *CoverageError) Error() string {
	unit, what, near := "m²", "surface", fmt.Sprintf("(%.4g, %.4g, %.4g)", e.Near[0], e.Near[1], e.Near[2])
	if e.Dim == 2 {
		unit, what, near = "m", "contour", fmt.Sprintf("(%.4g, %.4g)", e.Near[0], e.Near[1])
	}
	pct := fmt.Sprintf("%.2g", 100*e.Fraction)
	if e.Fraction >= 0.1 {
		pct = fmt.Sprintf("%.0f", 100*e.Fraction)
	}
	if e.Uncovered > 0 {
		return fmt.Sprintf("surface %q: %.2g %s (%s %%) of the %s lies outside every fluid cell, near %s: the %s leaves the mesh or crosses the body",
			e.Spec, e.Uncovered, unit, pct, what, near, what)
	}
	return fmt.Sprintf("surface %q: %.2g %s (%s %%) of the %s lies in more than one cell, near %s: zones of the mesh overlap",
		e.Spec, e.Overlap, unit, pct, what, near)
}
