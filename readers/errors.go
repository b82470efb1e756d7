package readers

import (
	"errors"
	"fmt"
	"strconv"
	"strings"
)

// Sentinel errors wrapped by *Error; test for them with errors.Is.
var (
	// ErrUnknownFormat reports input that is not a supported file format
	// (bad magic bytes or version line, unknown keyword or data type).
	ErrUnknownFormat = errors.New("unknown format")
	// ErrTooLarge reports a declared count or a stream that exceeds a
	// limit: Options.MaxBytes, or the int32 indices of the field model.
	ErrTooLarge = errors.New("too large")
	// ErrUnsupported reports valid input that the reader does not handle
	// (polyhedra, higher-order cells, bare FIELD files, ...).
	ErrUnsupported = errors.New("unsupported")
	// ErrTruncated reports input that ends before a declared block does,
	// or a declared count larger than the bytes left in the file.
	ErrTruncated = errors.New("truncated")
	// errSyntax is wrapped by errors that carry no sentinel of their own
	// (a malformed number, an index out of range, a count mismatch).
	errSyntax = errors.New("malformed input")
)

// Error is a positioned reading error. Line (1-based) is set for ASCII
// files; otherwise Offset is the byte offset in the (decompressed) stream.
// Section names the keyword block being read, Expected and Found say what
// the reader wanted and what it got. Err is one of the sentinels above, an
// I/O error, or an internal syntax marker; Unwrap returns it.
type Error struct {
	File     string
	Line     int
	Offset   int64
	Section  string
	Expected string
	Found    string
	Err      error
}

// Error formats e as "file:line: SECTION: expected X, found Y" or
// "file: byte N: SECTION: expected X, found Y".
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		b.WriteString(":")
		b.WriteString(strconv.Itoa(e.Line))
	} else {
		fmt.Fprintf(&b, ": byte %d", e.Offset)
	}
	b.WriteString(": ")
	if e.Section != "" {
		b.WriteString(e.Section)
		b.WriteString(": ")
	}
	switch {
	case e.Expected != "" && e.Found != "":
		fmt.Fprintf(&b, "expected %s, found %s", e.Expected, e.Found)
	case e.Expected != "":
		fmt.Fprintf(&b, "expected %s", e.Expected)
	default:
		b.WriteString(e.Found)
	}
	if e.Err != nil && e.Err != errSyntax && e.Err != ErrTruncated && e.Err != ErrUnknownFormat {
		b.WriteString(" (")
		b.WriteString(e.Err.Error())
		b.WriteString(")")
	}
	return b.String()
}

// Unwrap returns the wrapped sentinel or I/O error.
func (e *Error) Unwrap() error { return e.Err }
