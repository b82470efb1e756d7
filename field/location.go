package field

// CellRef names one cell of a field: its zone and its index in the zone.
type CellRef struct{ Zone, Cell int32 }

// Location is a point located in a cell: the cell and the point's
// parametric (local) coordinates in it. For triangles and tetrahedra Local
// holds barycentric coordinates of nodes 1..3 (node 0 takes the rest); for
// quads and hexahedra the bilinear/trilinear coordinates in [0,1]; for
// wedges (r, s) in the triangle and t in [0,1]; for pyramids the
// coordinates of the VTK pyramid in [0,1]^3.
type Location struct {
	Zone, Cell int32
	Local      [3]float64
}

// Ref returns the cell of l.
func (l Location) Ref() CellRef { return CellRef{l.Zone, l.Cell} }
