package readers

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime"
	"strings"

	"github.com/klauspost/compress/gzip"
	"github.com/klauspost/compress/zstd"

	"farforce/field"
)

// DefaultMaxBytes is the decompressed size limit used when
// Options.MaxBytes is zero: 64 GiB.
const DefaultMaxBytes int64 = 64 << 30

// Options control reading.
type Options struct {
	// Arrays lists the array names to keep; nil keeps all. Arrays not
	// listed are skipped without being converted. Ghost arrays
	// (vtkGhostType, vtkGhostLevels) are always read; they become
	// Zone.Blank.
	Arrays []string
	// MaxBytes limits the size of the input after decompression; zero
	// means DefaultMaxBytes. Exceeding it gives ErrTooLarge.
	MaxBytes int64
	// Workers is the number of goroutines that parse ASCII numbers and
	// convert binary blocks; zero means GOMAXPROCS. Results are identical
	// for every value.
	Workers int

	ffcg *ffcgHook // set by ReadCase and ReadFFCG (ffcg.go)
}

func (o Options) workers() int {
	if o.Workers > 0 {
		return o.Workers
	}
	return runtime.GOMAXPROCS(0)
}

func (o Options) maxBytes() int64 {
	if o.MaxBytes > 0 {
		return o.MaxBytes
	}
	return DefaultMaxBytes
}

// wants reports whether the array called name is to be kept.
func (o Options) wants(name string) bool {
	if o.Arrays == nil {
		return true
	}
	for _, a := range o.Arrays {
		if a == name {
			return true
		}
	}
	return false
}

// Magic bytes of the compressed containers recognised by ReadFile and
// ReadVTK.
var (
	magicGzip = []byte{0x1f, 0x8b}
	magicZstd = []byte{0x28, 0xb5, 0x2f, 0xfd}
)

// ReadFile reads one legacy VTK file, plain or compressed with gzip or
// zstd (recognised by magic bytes, not by name), into a field of one zone
// named after the file's base name. Failing to open the file returns the
// *fs.PathError of os.Open; every reading error is an *Error.
func ReadFile(path string, opt Options) (*field.Field, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	size := int64(-1)
	if st, err := f.Stat(); err == nil && st.Mode().IsRegular() {
		size = st.Size()
	}
	return read(f, filepath.Base(path), size, opt)
}

// ReadFiles reads several files as the zones of one field, in the order
// given (a partitioned solution); each zone is named after its file's base
// name. The first error stops reading.
func ReadFiles(paths []string, opt Options) (*field.Field, error) {
	out := &field.Field{}
	for _, p := range paths {
		f, err := ReadFile(p, opt)
		if err != nil {
			return nil, err
		}
		out.Zones = append(out.Zones, f.Zones...)
		out.Warnings = append(out.Warnings, f.Warnings...)
	}
	return out, nil
}

// ReadVTK reads a legacy VTK stream, plain or compressed, into a field of
// one zone named filepath.Base(name); name is also used in error
// messages. The stream size is known for *bytes.Reader, *strings.Reader
// and regular *os.File; otherwise declared counts are checked against
// Options.MaxBytes and destination slices grow as data arrives. For gzip
// and zstd input of known compressed size, the decompressed size the
// container records (gzip ISIZE, zstd Frame_Content_Size), capped at 1032
// bytes per compressed byte and Options.MaxBytes, lets slices that fit in
// it be allocated in one piece; it never decides an error.
func ReadVTK(r io.Reader, name string, opt Options) (*field.Field, error) {
	size := int64(-1)
	switch v := r.(type) {
	case *bytes.Reader:
		size = int64(v.Len())
	case *strings.Reader:
		size = int64(v.Len())
	case *os.File:
		if st, err := v.Stat(); err == nil && st.Mode().IsRegular() {
			if cur, err := v.Seek(0, io.SeekCurrent); err == nil {
				size = st.Size() - cur
			}
		}
	}
	return read(r, filepath.Base(name), size, opt)
}

// read sniffs the container and parses the VTK stream inside it.
func read(r io.Reader, name string, size int64, opt Options) (*field.Field, error) {
	br := bufio.NewReaderSize(r, 64<<10)
	head, _ := br.Peek(zstd.HeaderMaxSize)
	var src io.Reader = br
	hint := int64(-1)
	switch {
	case bytes.HasPrefix(head, magicGzip):
		hint = sizeHint(r, head, size, true, opt.maxBytes())
		zr, err := gzip.NewReader(br)
		if err != nil {
			return nil, &Error{File: name, Expected: "a gzip stream", Found: "a corrupt gzip header", Err: err}
		}
		defer zr.Close()
		ra := newReadahead(zr)
		defer ra.Close()
		src, size = ra, -1
	case bytes.HasPrefix(head, magicZstd):
		hint = sizeHint(r, head, size, false, opt.maxBytes())
		zr, err := zstd.NewReader(br, zstd.WithDecoderConcurrency(1), zstd.WithDecoderMaxMemory(uint64(opt.maxBytes())))
		if err != nil {
			return nil, &Error{File: name, Expected: "a zstd stream", Found: "a corrupt zstd header", Err: err}
		}
		defer zr.Close()
		ra := newReadahead(zr)
		defer ra.Close()
		src, size = ra, -1
	}
	if size >= 0 && size > opt.maxBytes() {
		return nil, &Error{File: name, Expected: fmt.Sprintf("at most %d bytes (Options.MaxBytes)", opt.maxBytes()), Found: fmt.Sprintf("%d bytes", size), Err: ErrTooLarge}
	}
	s := newScanner(src, name, size, opt)
	s.hint = hint
	if f, ok, err := readFFCGIf(s, opt); ok {
		return f, err
	}
	z, err := parseVTK(s, opt)
	if err != nil {
		return nil, err
	}
	z.Name = name
	return &field.Field{Zones: []*field.Zone{z}, Warnings: s.warnings}, nil
}

// readahead decompresses ahead of the parser in its own goroutine, into a
// few recycled buffers, so that decompression and parsing overlap.
type readahead struct {
	full   chan aheadChunk
	free   chan []byte
	done   chan struct{}
	exited chan struct{}
	cur    aheadChunk
	off    int
}

type aheadChunk struct {
	b   []byte
	err error
}

const (
	aheadBuffers = 4
	aheadSize    = 1 << 20
	aheadMin     = 64 << 10
)

// newReadahead starts decompressing r into aheadBuffers recycled buffers
// of up to aheadSize bytes. Buffers are made as they are first needed, at
// most 8 times the bytes decompressed so far (at least aheadMin), so that a
// short stream costs little.
func newReadahead(r io.Reader) *readahead {
	ra := &readahead{
		full:   make(chan aheadChunk, aheadBuffers),
		free:   make(chan []byte, aheadBuffers),
		done:   make(chan struct{}),
		exited: make(chan struct{}),
	}
	for range aheadBuffers {
		ra.free <- nil
	}
	go func() {
		defer close(ra.exited)
		total := 0
		for {
			var b []byte
			select {
			case b = <-ra.free:
			case <-ra.done:
				return
			}
			if size := min(aheadSize, max(aheadMin, 8*total)); cap(b) < size {
				b = make([]byte, size)
			}
			b = b[:cap(b)]
			n := 0
			var err error
			for n < len(b) && err == nil {
				var k int
				k, err = r.Read(b[n:])
				n += k
			}
			total += n
			ra.full <- aheadChunk{b[:n], err}
			if err != nil {
				return
			}
		}
	}()
	return ra
}

// Read implements io.Reader.
func (ra *readahead) Read(p []byte) (int, error) {
	for ra.off == len(ra.cur.b) {
		if ra.cur.err != nil {
			return 0, ra.cur.err
		}
		if ra.cur.b != nil {
			ra.free <- ra.cur.b[:cap(ra.cur.b)]
		}
		ra.cur, ra.off = <-ra.full, 0
	}
	n := copy(p, ra.cur.b[ra.off:])
	ra.off += n
	return n, nil
}

// Close stops the goroutine and waits for it, so that the underlying
// reader may be closed afterwards.
func (ra *readahead) Close() {
	close(ra.done)
	<-ra.exited
}
