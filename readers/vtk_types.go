package readers

// kind is the storage class of a VTK data type.
type kind uint8

const (
	kInt    kind = iota // signed integer
	kUint               // unsigned integer
	kFloat              // IEEE float
	kBit                // packed bits
	kString             // length-prefixed or line-per-value strings
)

// dtype is a VTK data type name resolved to its binary layout
// (VTK legacy file format document; vtkDataReader::ReadArray).
type dtype struct {
	name string
	size int // bytes per value; 0 for bit and string
	kind kind
}

// f32 reports whether ASCII values of t are rounded to float32, as VTK
// stores them.
func (t dtype) f32() bool { return t.kind == kFloat && t.size == 4 }

// dtypes maps lower-case type names to layouts. `long` is taken as 8
// bytes (LP64, as FORMATS.md §1.3 advises; the byte budget is checked
// anyway); vtkIdType is written as a 4-byte int.
var dtypes = map[string]dtype{
	"bit":                {"bit", 0, kBit},
	"unsigned_char":      {"unsigned_char", 1, kUint},
	"char":               {"char", 1, kInt},
	"signed_char":        {"signed_char", 1, kInt},
	"unsigned_short":     {"unsigned_short", 2, kUint},
	"short":              {"short", 2, kInt},
	"unsigned_int":       {"unsigned_int", 4, kUint},
	"int":                {"int", 4, kInt},
	"unsigned_long":      {"unsigned_long", 8, kUint},
	"long":               {"long", 8, kInt},
	"unsigned_long_long": {"unsigned_long_long", 8, kUint},
	"long_long":          {"long_long", 8, kInt},
	"vtkidtype":          {"vtkIdType", 4, kInt},
	"vtktypeint8":        {"vtktypeint8", 1, kInt},
	"vtktypeuint8":       {"vtktypeuint8", 1, kUint},
	"vtktypeint16":       {"vtktypeint16", 2, kInt},
	"vtktypeuint16":      {"vtktypeuint16", 2, kUint},
	"vtktypeint32":       {"vtktypeint32", 4, kInt},
	"vtktypeuint32":      {"vtktypeuint32", 4, kUint},
	"vtktypeint64":       {"vtktypeint64", 8, kInt},
	"vtktypeuint64":      {"vtktypeuint64", 8, kUint},
	"vtktypefloat32":     {"vtktypefloat32", 4, kFloat},
	"vtktypefloat64":     {"vtktypefloat64", 8, kFloat},
	"float":              {"float", 4, kFloat},
	"double":             {"double", 8, kFloat},
	"string":             {"string", 0, kString},
	"utf8_string":        {"utf8_string", 0, kString},
}

// lookupType resolves a data type name (case-insensitive).
func lookupType(name string) (dtype, bool) {
	t, ok := dtypes[lower(name)]
	return t, ok
}

// byteLen returns the number of bytes of n binary values of t, or -1 on
// overflow or for strings.
func (t dtype) byteLen(n int64) int64 {
	switch t.kind {
	case kBit:
		return (n + 7) / 8
	case kString:
		return -1
	}
	if n > (1<<62)/int64(t.size) {
		return -1
	}
	return n * int64(t.size)
}
