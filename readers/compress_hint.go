package readers

import (
	"bytes"
	"encoding/binary"
	"io"
	"os"
	"strings"

	"github.com/klauspost/compress/zstd"
)

// maxInflate bounds the decompressed bytes a size hint may claim per
// compressed byte. It is deflate's largest expansion, 1032:1 (zlib
// technical details, Gailly & Adler, "Maximum Compression Factor"; from
// memory, and it follows from RFC 1951: a 258-byte match can cost no less
// than 2 bits, a 1-bit length code and a 1-bit distance code), so for gzip
// it can never cut an honest hint. zstd can expand
// further (RLE blocks, RFC 8878 §3.1.1.2); a zstd hint beyond this factor
// is clipped, and the arrays of such a file grow as data arrives instead.
const maxInflate = 1032

// sizeHint returns an untrusted estimate of the decompressed size of a
// gzip (isGzip) or zstd stream whose compressed bytes start at head and
// number size (-1: unknown, no hint), or -1 when there is none. For gzip it
// is the trailer's ISIZE (RFC 1952 §2.3.1: the last 4 bytes, little-endian,
// size modulo 2^32 of the last member), read from r when r can be read at
// an offset (*os.File, *bytes.Reader, *strings.Reader); for zstd the first
// frame's Frame_Content_Size (RFC 8878 §3.1.1.1.4), from head.
//
// Both fields are written by whoever made the file: the hint only sizes
// the first allocation of a block that it covers (scanner.initialCap),
// never decides an error, and is capped here by maxBytes and by
// maxInflate × size, so that a few hundred lying bytes cannot claim more
// than a few hundred kilobytes of data (a block allocates 8 bytes per
// value, and a value takes at least one byte, two in ASCII; bit arrays
// ignore the hint). A hint that is too small (a gzip file of
// several members or of 4 GiB or more, a zstd file of several frames)
// only makes arrays grow as they do without one.
func sizeHint(r io.Reader, head []byte, size int64, isGzip bool, maxBytes int64) int64 {
	if size < 0 {
		return -1
	}
	var h int64 = -1
	if isGzip {
		if t, ok := lastBytes(r, size, 4); ok {
			h = int64(binary.LittleEndian.Uint32(t))
		}
	} else {
		var zh zstd.Header
		if zh.Decode(head) == nil && zh.HasFCS && !zh.Skippable && zh.FrameContentSize <= 1<<62 {
			h = int64(zh.FrameContentSize)
		}
	}
	if h < 0 {
		return -1
	}
	if size <= (1<<62)/maxInflate {
		h = min(h, size*maxInflate)
	}
	return min(h, maxBytes)
}

// lastBytes returns the last n bytes of a stream of size bytes that r
// yields, read at their offset without moving r; ok is false when r
// cannot be read at an offset or the read fails.
func lastBytes(r io.Reader, size int64, n int) ([]byte, bool) {
	if size < int64(n) {
		return nil, false
	}
	var at io.ReaderAt
	var end int64
	switch v := r.(type) {
	case *os.File:
		st, err := v.Stat()
		if err != nil {
			return nil, false
		}
		at, end = v, st.Size()
	case *bytes.Reader:
		at, end = v, v.Size()
	case *strings.Reader:
		at, end = v, v.Size()
	default:
		return nil, false
	}
	b := make([]byte, n)
	if _, err := at.ReadAt(b, end-int64(n)); err != nil {
		return nil, false
	}
	return b, true
}
