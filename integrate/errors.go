package integrate

import (
	"errors"
	"fmt"

	"farforce/field"
)

// ErrOption is wrapped by errors about invalid Options (non-finite values,
// negative reference quantities, an up axis parallel to the stream).
var ErrOption = errors.New("invalid integration option")

// ErrCut is wrapped by errors about an unusable cut (nil, wrong dimension,
// non-finite quadrature data).
var ErrCut = errors.New("invalid cut")

// ErrOverflow is wrapped by the error returned when finite flow values
// are so large that an integral overflows to ±Inf or NaN.
var ErrOverflow = errors.New("force integral overflows")

// ValueError reports a NaN or infinite flow value met at a quadrature
// point: the surface, the point's index and position, the cell that holds
// it and which quantity was bad.
type ValueError struct {
	Spec     string
	Point    int // index in Cut.Points
	X        Vec3
	Cell     field.CellRef
	Quantity string // "density", "pressure", "velocity", ...
	Value    float64
}

// Error implements error.
func (e *ValueError) Error() string {
	return fmt.Sprintf("surface %q: %s = %g at quadrature point %d (%.9g, %.9g, %.9g) in zone %d cell %d",
		e.Spec, e.Quantity, e.Value, e.Point, e.X[0], e.X[1], e.X[2], e.Cell.Zone, e.Cell.Cell)
}
