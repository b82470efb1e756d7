package surface

import "farforce/field"

// QuadPoint is one quadrature point of a cut surface: its position X, its
// weight W (an area in 3D, a length in 2D), the unit normal N pointing out
// of the control volume (away from the enclosed body), and the cell that
// holds it.
type QuadPoint struct {
	X  [3]float64
	W  float64
	N  [3]float64
	At field.Location
}

// Piece is the part of one surface facet that lies inside one cell: a
// convex polygon (a segment in 2D) with its unit outward normal N, its area
// (length in 2D), the cell, and the range Points[First:First+Count] of its
// quadrature points in the owning Cut.
type Piece struct {
	Verts        [][3]float64
	N            [3]float64
	Area         float64
	Cell         field.CellRef
	First, Count int32
}

// Cut is a closed control surface cut through a mesh.
type Cut struct {
	// Spec is the surface specification the cut was made from.
	Spec string
	// Dim is 2 for a contour in the plane z = const, 3 for a surface.
	Dim int
	// Facets is the number of facets (segments in 2D) of the tessellation.
	Facets int
	// Area is the area (length in 2D) of the tessellated surface and
	// ExactArea that of the exact shape; their difference is the
	// tessellation error reported to the user.
	Area, ExactArea float64
	// Closure is the sum over facets of area times unit normal; for a closed
	// surface it vanishes to rounding.
	Closure [3]float64
	// Pieces are the facet pieces, each inside one cell, in a fixed order.
	Pieces []Piece
	// Points are the quadrature points of all pieces, piece by piece.
	Points []QuadPoint
}
