package field

// CellRef names one cell of a field: its zone and its index in the zone.
type CellRef struct{ Zone, Cell int32 }

// Location is a point located in a cell: the cell and the point's
// parametric (local) coordinates r = Local in it (see the package
// documentation for the shape functions):
//
//	triangle, tetra  barycentric coordinates of nodes 1..3 (node 0 takes
//	                 1 - their sum); Local[2] = 0 for triangles
//	quad, hexa       bilinear / trilinear coordinates in [0,1] (node 0 at
//	                 0, node 1 at r = 1, node 3 at s = 1, node 4 at t = 1)
//	wedge            (r, s) barycentric in the triangle, t in [0,1] along
//	                 the prism (nodes 3..5 at t = 1)
//	pyramid          (r, s) bilinear in the base, t in [0,1] toward the
//	                 apex (VTK pyramid; at t = 1 any r, s is the apex)
//
// A located point may lie up to 1e-9 (relative) outside the reference
// cell, so coordinates can be slightly below 0 or above 1.
type Location struct {
	Zone, Cell int32
	Local      [3]float64
}

// Ref returns the cell of l.
func (l Location) Ref() CellRef { return CellRef{l.Zone, l.Cell} }
