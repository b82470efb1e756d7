// Package field is the data model of a flow solution and the only place
// that knows cell geometry and interpolation: zones of cells with arrays at
// points or cells, a spatial index (Locator), and a Sampler that evaluates
// any array and its gradient at a point.
//
// # Storage
//
// A Zone keeps its mesh in flat, pointer-free slices (xyz-interleaved
// points, int32 connectivity with offsets, one CellType per cell in the
// legacy VTK node order) and its arrays as interleaved float64 tuples. A
// Field is a list of zones sharing array names (multi-block or partitioned
// meshes). A field whose points all share one z is two-dimensional.
//
// # Shape functions and local coordinates
//
// Every supported cell is isoparametric, x(r) = Σ_k N_k(r) x_k, with local
// coordinates r = (r, s, t) (Location.Local):
//
//	triangle  N = 1-r-s, r, s                          r, s ≥ 0, r+s ≤ 1
//	tetra     N = 1-r-s-t, r, s, t                     barycentric
//	quad      N = (1-r)(1-s), r(1-s), rs, (1-r)s       [0,1]²
//	hexa      trilinear, N_0 = (1-r)(1-s)(1-t) ...     [0,1]³, VTK order
//	wedge     N = (1-r-s)(1-t), r(1-t), s(1-t),
//	              (1-r-s)t, rt, st                     triangle × [0,1]
//	pyramid   N_0..3 = bilinear base × (1-t), N_4 = t  [0,1]³
//
// The pyramid uses the VTK pyramid functions, a hexahedron collapsed onto
// its apex: x = (1-t)·bilinear_base(r, s) + t·apex. They reproduce linear
// fields exactly and are linear on the four triangular faces, so they
// conform with neighbouring tetrahedra; at the apex (t = 1) the map is
// singular, and gradients are evaluated at t ≤ 1-1e-7 there.
//
// The inverse map (point to r) is solved directly for simplices and for
// quads and hexahedra whose bilinear and trilinear coefficients are zero
// (parallelograms and parallelepipeds, as in structured boxes), and by
// Newton's method from the cell's centroid otherwise, on the map written as
// x = a + b r + c s + d t + e rs + f st + g tr + h rst (every non-simplex
// type has this form); steps are kept in [-1,2]³, and the iteration stops
// when the step is below 1e-9 (quadratic convergence leaves an error of
// about its square; 2-6 iterations inside a valid cell, also a strongly
// distorted one) or when it has nearly converged to a point clearly
// outside. CellMap gathers a cell once for many points (the cutter's
// quadrature points) and gives the same bits as InCell. A point is in a cell when its
// local coordinates lie in the reference cell within 1e-9 (relative to the
// cell's size). 2D cells use x and y only. Shape-function gradients are
// ∇_x N = J⁻ᵀ ∇_r N with J = ∂x/∂r.
//
// # Locator
//
// NewLocator indexes the non-blank cells of the field's dimension of all
// zones in one uniform grid of bins over their bounding boxes (padded by
// 1e-8 of their size), about 0.7 bins per cell and bins no smaller than
// 0.8 of the mean cell-box volume, filled by counting sort into compressed
// rows so that each bin lists its cells in (Zone, Cell) order. Each entry
// carries the cell's box clipped to the bin and quantized to 1/512 of the
// bin, rounded outward, as a filter that never rejects a cell whose padded
// box holds the point. Locate filters the point's bin by these boxes,
// gathers the survivors four at a time (their memory reads overlap) and
// returns the first whose padded box and inverse map contain the point:
// the lowest (Zone, Cell) among all cells containing it, so points on
// shared faces, edges and vertices resolve deterministically. CellsInBox
// reports each overlapping cell once (from the bin holding the low corner
// of the overlap) and sorts, unless the query box lies in one bin, whose
// list is already sorted. The build takes three parallel passes over
// contiguous chunks of cells: each cell's padded box straight from the
// points through the connectivity, the entry count per bin, then the
// entries with their quantized boxes (assembled from per-axis values
// computed once per cell); the grid size depends only on the boxes, so
// the index is the same for any number of workers. Everything is
// read-only after the build and safe for concurrent use.
//
// # Sampling point data
//
// Values are interpolated, f(x) = Σ_k N_k(r) f_k. Gradients, two methods:
//
//	GradientShape      ∇f = Σ_k f_k ∇N_k                      first order
//	GradientRecovered  ∇f = Σ_k N_k(r) G_k, G_k = ∇q_k(x_k)    second order (default)
//
// where q_k is the least-squares quadratic (10 terms in 3D, 6 in 2D, with
// coordinates centred on x_k and scaled per axis, columns equilibrated,
// Householder QR) through the nodal values of the cells around node k.
//
// Stencils are rings of cells linked by shared nodes: cells having a node at
// exactly the same position, found through the Locator, so they cross zone
// interfaces (each zone's copy of an interface point), never include blank
// cells, and never reach across a thin body. A stencil with fewer than 1.5
// times as many samples as terms, or too close to degenerate (smallest over
// largest diagonal of the QR factor below 0.05, e.g. two layers of nodes at
// a boundary), grows by the next ring, up to three times; one that still
// does not determine a quadratic gets a linear fit. The fit's operator
// (the matrix from sample values to coefficients, (AᵀA)⁻¹Aᵀ from the QR
// factor of A) depends only on the mesh and is shared by all arrays; both
// operators and per-array fits are built on first use and cached with
// atomic stores of values that depend only on the field, so results are
// the same bits under any concurrency and query order.
//
// # Sampling cell data
//
// Cell-centred values (what finite-volume solvers write) are read as values
// at the volume centroid of each cell (Zone.CellCentroid; a cell average
// equals it to O(h²)) and reconstructed cell by cell: q_c is the
// least-squares quadratic through the centroid values of c and of the cells
// sharing a node with it (its vertex neighbours), with the same stencil
// rules as above.
// Value and gradient at a point of c are q_c(x) and ∇q_c(x): exact for
// quadratic data, continuous to O(h³) across faces.
//
// # Measured orders
//
// Observed orders of the RMS error at 400 random points for
// f = sin(2x+0.5)·cos(1.5y-0.3)·exp(0.7z) on the unit box (3D: hexa 8-16-32
// cells per axis, tetra and wedge 6-12-24, pyramid 4-8-16; 2D: 8-16-32),
// least-squares slope of log error against log h (TestConvergenceOrders).
// First number on a uniform mesh, second with nodes moved randomly by up
// to 0.15 h:
//
//	              point value  grad shape  grad recovered  cell value  cell grad
//	hexa          1.99 2.02    1.01 0.97   2.05 2.08       3.24 3.29   2.25 2.26
//	tetra         1.98 1.99    1.00 1.01   1.96 1.98       2.81 3.00   1.90 2.00
//	wedge         1.98 2.01    0.99 0.99   1.98 2.08       3.39 3.42   2.28 2.27
//	pyramid       1.98 1.96    0.98 0.97   1.94 1.98       3.06 3.01   2.03 2.02
//	quad          2.00 1.98    1.01 1.00   1.98 2.00       3.20 3.31   2.21 2.25
//	triangle      1.98 1.99    1.02 1.00   1.96 1.95       3.48 3.38   2.34 2.25
//
// With true cell averages on a smoothly warped mesh (what a finite-volume
// solver converges to; TestConvergenceCellAverages) the value error mixes
// the O(h²) average-to-centroid term with the O(h³) fit error, and the
// observed orders are, value / gradient: hexa 2.38 / 2.18, tetra 2.10 /
// 1.90, wedge 2.70 / 2.33, pyramid 2.26 / 1.88, quad 2.17 / 2.09, triangle
// 2.13 / 2.17.
//
// On the finest hexahedral mesh (h = 1/32) the RMS gradient errors are
// 4.4e-2 (shape), 3.8e-3 (recovered) and 3.3e-3 (cell data), and the value
// errors 5.2e-4 (point data) and 5.6e-5 (cell data).
package field
