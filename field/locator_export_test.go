package field

// IndexBytes exposes Locator.indexBytes to the external benchmarks.
var IndexBytes = (*Locator).indexBytes
