package field

// Hooks into unexported parts of the package for the external benchmarks,
// which use the fieldtest meshes and timers (internal tests cannot import
// fieldtest, which imports field).

// IndexBytes exposes Locator.indexBytes.
var IndexBytes = (*Locator).indexBytes

// BuildNodeOp builds (or fetches) the gradient-recovery operator of node n
// of zone zi of s.
func BuildNodeOp(s *Sampler, zi int, n int32) { s.nodeOp(zi, n) }
