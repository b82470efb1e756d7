// Package surface builds closed control surfaces (sphere, box, cylinder;
// circle, rectangle and polygon contours in 2D; closed surfaces read from a
// file) and cuts them through a mesh so that every piece lies inside exactly
// one cell and carries its own quadrature rule.
//
// # Shapes and tessellation
//
// A Shape is an exact geometric description (ParseSpec reads it from a
// one-line spec such as "sphere center=0,0,0 radius=2"). Tessellate turns it
// into Facets: triangles in 3D, segments in the plane z = const in 2D, whose
// neighbours meet edge to edge (or along a common straight edge) so that the
// facet area vectors cancel, Σ A_f n_f = 0 to rounding (the discrete form of ∮ n dA = 0 on which
// the independence of the force from the reference pressure rests). Facet
// vertices are ordered counter-clockwise seen from outside: the unit normal
//
//	n = (b - a) × (c - a) / |(b - a) × (c - a)|   (3D triangle a, b, c)
//	n = (b_y - a_y, a_x - b_x, 0) / |b - a|        (2D segment a → b)
//
// points out of the enclosed region, i.e. out of the control volume.
//
// Curved shapes (sphere, cylinder, circle) are inscribed polyhedra (polygons)
// whose edge length h follows a size function: by default the local cell
// size of the mesh, or a fixed size=H, or the size giving about facets=N
// facets. Their area converges to the exact area as O(h²). Flat shapes (box,
// rectangle, polygon, file) are exact; size= or facets= only subdivides them.
//
// # Cutting
//
// CutSurface clips every facet against the cells its bounding box overlaps.
// A cell whose faces are planar and which is convex is clipped against its
// face planes; any other cell is decomposed into its conforming simplices
// (field.Zone.Simplices) and the facet is clipped against each simplex.
// Each resulting piece is a convex polygon (a segment in 2D) inside one cell;
// it carries the quadrature points of a degree-5 rule (Radon's 7-point rule
// on each triangle of a fan, 3-point Gauss–Legendre on segments), each
// located in the cell with field.Locator.InCell.
//
// A facet lying exactly in a plane shared by two cells (a box face on a grid
// plane) is given to exactly one of them: the facet is treated as if moved by
// an infinitesimal distance against its normal, into the control volume, so
// the cell on the inner side owns it. This also lets a surface lie exactly on
// the outer boundary of the domain; a surface lying exactly on a body wall
// (inner boundary) has no cell on its inner side and is refused.
//
// Every facet's pieces must add up to the facet area to 1e-9 relative;
// otherwise CutSurface returns a *CoverageError giving the missing area and
// where it is. There is never a silent partial sum.
//
// # Concurrency and determinism
//
// Shapes are immutable values, safe for concurrent use. CutSurface works
// over fixed chunks of facets on several goroutines in two passes: the
// pieces of each chunk first, then, at offsets fixed by the piece counts,
// their quadrature points written in place. Chunks land in facet order, so
// the Cut is bit-for-bit the same for any number of workers.
package surface
