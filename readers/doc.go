// Package readers loads flow solutions into field.Field values and writes
// zones back out. The supported formats are legacy VTK ("# vtk DataFile
// Version x.y"), versions 1.0 to 5.x, ASCII and BINARY, and ffcg, a plain-
// text format of our own that follows the CGNS data model (first line
// "ffcg 1"; specified in docs/cgns-text-format.md). ReadFile and ReadFiles
// recognise either from the bytes, whatever the file name.
//
// # ffcg
//
// ReadFFCG reads an ffcg stream and ReadCase a file of either format with
// its CaseInfo: the ReferenceState of the first base (Density, VelocityX/Y/Z,
// Pressure, Mach, Reynolds, LengthReference, ...) and the BC patches (name,
// BCType, zone, vertices and faces; Patch.IsWall tells the BCWall types).
// Structured zones become hexahedra, quadrilaterals or segments in VTK node
// order; conservative variables (MomentumX/Y/Z with Density) give
// VelocityX/Y/Z, and EnergyStagnationDensity gives Pressure; CellCenter
// data with rind is trimmed to the core. WriteFFCG writes a field and its
// CaseInfo back. The reading rules, limits and positioned errors are those
// of the VTK reader below (docs/cgns-text-format.md §3). The cmd/farforce
// commands use the CaseInfo: the ReferenceState fills the freestream and
// references that no flag sets, and the wall patches are the near field.
//
// # Legacy VTK: supported content
//
// Datasets: STRUCTURED_POINTS (SPACING or ASPECT_RATIO, ORIGIN),
// STRUCTURED_GRID, RECTILINEAR_GRID, UNSTRUCTURED_GRID (classic "CELLS n
// size" lists and the 5.x OFFSETS/CONNECTIVITY layout) and POLYDATA
// (VERTICES, LINES, POLYGONS, TRIANGLE_STRIPS). Structured grids become
// hexahedra (3D), quads (2D) or lines (1D) in VTK node order; VTK pixels
// and voxels are reordered to quads [0,1,3,2] and hexahedra
// [0,1,3,2,4,5,7,6]; poly-vertices, polylines and triangle strips are
// split into vertices, lines and triangles (cell arrays are repeated for
// the pieces); polygons of 3 and 4 nodes become triangles and quads, larger
// ones field.Polygon. Quadratic and other higher-order Lagrange cells of
// types 21-37 are reduced to their corner nodes, with one warning per type
// in Field.Warnings; EMPTY_CELL is dropped with a warning. Polyhedra (42),
// prisms (15, 16) and the other types give ErrUnsupported naming the cell.
//
// Attributes under POINT_DATA and CELL_DATA: SCALARS (1-4 components, the
// LOOKUP_TABLE line), VECTORS, NORMALS, TENSORS (9 components, row-major),
// TENSORS6 (6 components kept in file order XX, YY, ZZ, XY, YZ, XZ),
// TEXTURE_COORDINATES, COLOR_SCALARS (scaled to [0,1]), GLOBAL_IDS,
// PEDIGREE_IDS, EDGE_FLAGS and FIELD blocks (NULL_ARRAY entries allowed;
// arrays whose tuple count differs from the section's are skipped with a
// warning). A dataset-level FIELD block, standalone LOOKUP_TABLE blocks and
// METADATA/INFORMATION blocks are skipped. Array names are %-decoded.
// Every VTK data type name is accepted (bit, char, unsigned_char, short,
// int, long, vtktypeint64, float, double, vtkIdType, ...); string arrays
// are skipped with a warning. ASCII values of type float are rounded to
// float32, as VTK stores them. ASCII numbers may be nan, inf or infinity
// in any case with a sign (also -nan); these values are kept. CRLF line
// ends are accepted. The ghost arrays vtkGhostType and vtkGhostLevels are
// not kept as arrays: at cells they set Zone.Blank (value != 0); at
// points they are dropped. BINARY data is big-endian; a file whose first
// cell integers are impossible big-endian but plausible little-endian is
// read as little-endian with a warning (FORMATS.md §1.9). A keyword the reader does not know ends the
// parse with a warning.
//
// Input may be compressed with gzip or zstd, recognised by magic bytes
// (1f 8b, 28 b5 2f fd), not by file name. ReadFiles loads several files
// as the zones of one field (a partitioned solution).
//
// # Errors and limits
//
// Every reading error is an *Error carrying the file name, the 1-based
// line (ASCII) or the byte offset in the decompressed stream (BINARY),
// the block being read and what was expected and found, for example
//
//	case.vtk:12: POINTS: expected 300 coordinates, found 297 before EOF
//	case.vtk: byte 4096: CELLS: expected cell 7: node indices in [0,100), found 131
//
// It wraps ErrUnknownFormat, ErrTooLarge, ErrUnsupported, ErrTruncated,
// an I/O or decompression error, or (for malformed content) an internal
// marker. The reader never panics on input. Every declared count is
// checked before anything is allocated from it: against the bytes left in
// the file when its size is known, else against Options.MaxBytes, and
// destination slices of streams of unknown size grow only as data
// arrives. A stream longer than Options.MaxBytes (default 64 GiB) after
// decompression fails with ErrTooLarge. Points, cells and connectivity
// entries are limited to 2^31-1 (int32 indices); implicit structured
// geometry is limited to 65536 points plus 8 per byte read.
//
// # Speed
//
// Input is read through one reusable buffer that starts at 64 KiB and
// grows to 4 MiB for big blocks (on streams of unknown size, at most to 8
// times what has been read); the file is never held whole. ASCII number
// blocks are cut at whitespace into parts (up to four per worker) that
// Options.Workers goroutines parse into per-part buffers; the values are
// copied out in part order, so results are identical for every worker
// count. Binary blocks are converted in disjoint ranges. Numbers of up to
// 19 significant digits are converted without strconv (Clinger's exact
// fast path, else the Eisel-Lemire method); the rest go to
// strconv.ParseFloat, and every value has the bits strconv would give.
// Compressed input is decompressed one buffer ahead of the parser in a
// goroutine. Slices are allocated once from validated counts when the
// input size is known. For gzip or zstd input of known compressed size,
// the size the container records (gzip ISIZE, zstd Frame_Content_Size),
// capped at 1032 bytes per compressed byte and at Options.MaxBytes, sizes
// a block in one piece when it covers it; it never decides an error. Else
// slices grow in steps of an eighth of the declared block as data arrives
// (at most 8/7 of the block in all), so a compressed read allocates about
// 1.2-1.5 times the arrays it keeps.
//
// WriteVTK writes a zone as a legacy VTK UNSTRUCTURED_GRID or POLYDATA
// file, version 4.2 or 5.1, ASCII or BINARY, that reads back exactly.
//
// All functions are safe for concurrent use on different inputs.
package readers
