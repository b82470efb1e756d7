package readers

import (
	"bytes"
	"errors"
	"fmt"
	"io"
)

// bufSize is the default size of the scanner buffer: big enough to cut
// into one chunk per worker, small enough to stay in the last-level cache.
const bufSize = 4 << 20

// maxLine bounds a keyword line; longer lines are an error.
const maxLine = 1 << 16

// scanner is a buffered byte source over the (decompressed) input that
// tracks the stream offset and, for ASCII files, the line number. Keyword
// lines, ASCII number blocks and binary blocks are all read from buf.
type scanner struct {
	name     string
	r        io.Reader
	buf      []byte
	maxBuf   int   // the buffer grows up to this size for big blocks
	pos, end int   // unread bytes are buf[pos:end]
	base     int64 // stream offset of buf[0]
	line     int   // 1-based line of buf[pos]
	ascii    bool  // positions are reported as lines
	eof      bool
	size     int64 // exact stream size when known, else -1
	hint     int64 // untrusted estimate of the stream size, else -1 (sizeHint)
	max      int64 // Options.MaxBytes
	workers  int
	le       bool // binary data found to be little-endian
	warnings []string

	tokBytes, tokCount int64       // running bytes-per-number estimate
	parts              []asciiPart // reused ASCII work areas
}

func newScanner(r io.Reader, name string, size int64, opt Options) *scanner {
	n := bufSize
	if w := opt.workers(); w > 4 {
		n = w << 20
	}
	start := 64 << 10
	if size >= 0 && size < int64(start) {
		start = int(size) + 64
	}
	return &scanner{name: name, r: r, buf: make([]byte, start), maxBuf: n, line: 1, size: size, hint: -1, max: opt.maxBytes(), workers: opt.workers()}
}

// want enlarges the buffer, up to maxBuf, for a block of about n bytes.
// The buffer starts small so that small files cost little. In a stream of
// unknown size it grows with the data, to at most 8 times the bytes read
// so far (at least 64 KiB), so that a declared block the data does not
// back cannot reserve the whole buffer.
func (s *scanner) want(n int) {
	if s.size < 0 {
		n = int(min(int64(n), max(8*(s.base+int64(s.end)), 64<<10)))
	}
	if n <= len(s.buf) || len(s.buf) >= s.maxBuf {
		return
	}
	if n > s.maxBuf || n < 0 {
		n = s.maxBuf
	}
	s.moveUnread(make([]byte, max(n, 2*len(s.buf))))
}

// moveUnread moves the unread bytes to the start of nb, a new larger
// buffer or s.buf itself, and makes nb the buffer.
func (s *scanner) moveUnread(nb []byte) {
	copy(nb, s.buf[s.pos:s.end])
	s.base += int64(s.pos)
	s.end -= s.pos
	s.pos = 0
	s.buf = nb
}

// offset returns the stream offset of the next unread byte.
func (s *scanner) offset() int64 { return s.base + int64(s.pos) }

// remaining returns an upper bound on the bytes left in the stream: the
// exact file size when known, else what Options.MaxBytes still allows.
func (s *scanner) remaining() int64 {
	if s.size >= 0 {
		return s.size - s.offset()
	}
	return s.max - s.offset()
}

// sized reports whether the stream size is known exactly, so that
// destination slices may be allocated in one piece after the budget check.
func (s *scanner) sized() bool { return s.size >= 0 }

// hinted reports whether a block of need bytes fits in what the size hint
// says is left of the stream. The hint is untrusted but capped (sizeHint),
// so it may size an allocation, never decide an error.
func (s *scanner) hinted(need int64) bool {
	return s.hint >= 0 && need >= 0 && need <= s.hint-s.offset()
}

// errAt returns a positioned error at the current position.
func (s *scanner) errAt(sec, expected, found string, err error) *Error {
	e := &Error{File: s.name, Section: sec, Expected: expected, Found: found, Err: err}
	if s.ascii {
		e.Line = s.line
	} else {
		e.Offset = s.offset()
	}
	return e
}

// fill makes at least n unread bytes available unless the stream ends
// first. It returns a non-nil error only for read failures and for
// streams exceeding Options.MaxBytes.
func (s *scanner) fill(n int) error {
	if s.end-s.pos >= n || s.eof {
		return nil
	}
	if n > len(s.buf) {
		s.moveUnread(make([]byte, max(n, 2*len(s.buf))))
	} else if s.pos > 0 {
		s.moveUnread(s.buf)
	}
	for s.end-s.pos < n && !s.eof {
		k, err := s.r.Read(s.buf[s.end:])
		s.end += k
		if s.base+int64(s.end) > s.max {
			return &Error{File: s.name, Offset: s.max, Expected: fmt.Sprintf("at most %d bytes (Options.MaxBytes)", s.max), Found: "more", Err: ErrTooLarge}
		}
		if err == io.EOF {
			s.eof = true
		} else if err != nil {
			s.eof = true
			e := &Error{File: s.name, Offset: s.base + int64(s.end), Expected: "more data", Found: "a read error", Err: err}
			if errors.Is(err, io.ErrUnexpectedEOF) {
				e.Found, e.Err = "the compressed stream cut short (unexpected EOF)", ErrTruncated
			}
			return e
		}
	}
	return nil
}

// advance consumes n buffered bytes, counting lines in ASCII mode.
func (s *scanner) advance(n int) {
	if s.ascii {
		s.line += bytes.Count(s.buf[s.pos:s.pos+n], nl)
	}
	s.pos += n
}

var nl = []byte{'\n'}

// isSpace reports whether c separates tokens.
func isSpace(c byte) bool {
	return c == ' ' || c == '\n' || c == '\t' || c == '\r' || c == '\v' || c == '\f'
}

// skipSpace consumes whitespace (including blank lines).
func (s *scanner) skipSpace() error {
	for {
		for s.pos < s.end {
			c := s.buf[s.pos]
			if !isSpace(c) {
				return nil
			}
			if c == '\n' {
				s.line++
			}
			s.pos++
		}
		if s.eof {
			return nil
		}
		if err := s.fill(1); err != nil {
			return err
		}
	}
}

// atEOF reports whether no bytes are left.
func (s *scanner) atEOF() (bool, error) {
	if err := s.fill(1); err != nil {
		return false, err
	}
	return s.pos == s.end, nil
}

// rawLine consumes one line (through '\n', or to EOF) without skipping
// leading whitespace, and returns it without the line end. The slice
// aliases the buffer and is valid until the next read.
func (s *scanner) rawLine() ([]byte, error) {
	for {
		if i := bytes.IndexByte(s.buf[s.pos:s.end], '\n'); i >= 0 {
			l := s.buf[s.pos : s.pos+i]
			s.pos += i + 1
			s.line++
			return bytes.TrimSuffix(l, []byte{'\r'}), nil
		}
		if s.eof {
			l := s.buf[s.pos:s.end]
			s.pos = s.end
			return bytes.TrimSuffix(l, []byte{'\r'}), nil
		}
		if s.end-s.pos >= maxLine {
			return nil, s.errAt("", "a line of at most 64 KiB", "a longer line", errSyntax)
		}
		if err := s.fill(s.end - s.pos + 1); err != nil {
			return nil, err
		}
	}
}

// keyLine is a keyword line split into whitespace-separated fields, with
// its position for error messages.
type keyLine struct {
	f    []string
	line int
	off  int64
}

// key returns the lower-cased first field.
func (k keyLine) key() string { return lower(k.f[0]) }

// nextKeyLine skips blank space and returns the next line split into
// fields; ok is false at end of input.
func (s *scanner) nextKeyLine() (keyLine, bool, error) {
	if err := s.skipSpace(); err != nil {
		return keyLine{}, false, err
	}
	if s.pos == s.end {
		return keyLine{}, false, nil
	}
	k := keyLine{line: s.line, off: s.offset()}
	l, err := s.rawLine()
	if err != nil {
		return k, false, err
	}
	k.f = fields(l)
	return k, true, nil
}

// peekKey returns the lower-cased first word at the current position
// without consuming it (empty at EOF). In ASCII mode leading whitespace is
// skipped first; in BINARY mode the word must start right here, since the
// bytes that follow could be raw data.
func (s *scanner) peekKey() (string, error) {
	if s.ascii {
		if err := s.skipSpace(); err != nil {
			return "", err
		}
	}
	if err := s.fill(64); err != nil {
		return "", err
	}
	b := s.buf[s.pos:s.end]
	i := 0
	for i < len(b) && i < 64 && !isSpace(b[i]) {
		i++
	}
	return lower(string(b[:i])), nil
}

// peekKeyAfterSpace is peekKey that always skips whitespace first; used
// where no raw data can follow (after a complete binary block).
func (s *scanner) peekKeyAfterSpace() (string, error) {
	if err := s.skipSpace(); err != nil {
		return "", err
	}
	a := s.ascii
	s.ascii = true
	k, err := s.peekKey()
	s.ascii = a
	return k, err
}

// fields splits a line at whitespace.
func fields(l []byte) []string {
	var f []string
	for i := 0; i < len(l); {
		for i < len(l) && isSpace(l[i]) {
			i++
		}
		j := i
		for j < len(l) && !isSpace(l[j]) {
			j++
		}
		if j > i {
			f = append(f, string(l[i:j]))
		}
		i = j
	}
	return f
}

// lower returns s in ASCII lower case.
func lower(s string) string {
	for i := 0; i < len(s); i++ {
		if c := s[i]; c >= 'A' && c <= 'Z' {
			b := []byte(s)
			for j := i; j < len(b); j++ {
				if c := b[j]; c >= 'A' && c <= 'Z' {
					b[j] = c + 'a' - 'A'
				}
			}
			return string(b)
		}
	}
	return s
}

// discard consumes n bytes, reading through the stream as needed.
func (s *scanner) discard(n int64, sec, what string) error {
	if n > s.remaining() {
		return s.tooBig(sec, what, n)
	}
	for n > 0 {
		if s.pos == s.end {
			if err := s.fill(1); err != nil {
				return err
			}
			if s.pos == s.end {
				return s.errAt(sec, what, fmt.Sprintf("%d bytes missing at EOF", n), ErrTruncated)
			}
		}
		k := int64(s.end - s.pos)
		if k > n {
			k = n
		}
		s.advance(int(k))
		n -= k
	}
	return nil
}

// tooBig returns the error for a block of need bytes that cannot fit in
// the rest of the stream: ErrTruncated for files of known size,
// ErrTooLarge when only Options.MaxBytes bounds the stream.
func (s *scanner) tooBig(sec, what string, need int64) *Error {
	if s.sized() {
		return s.errAt(sec, what, fmt.Sprintf("only %d bytes left in the file", s.remaining()), ErrTruncated)
	}
	return s.errAt(sec, what, fmt.Sprintf("a block of at least %d bytes, beyond the %d-byte limit (Options.MaxBytes)", need, s.max), ErrTooLarge)
}

// warn records a non-fatal remark.
func (s *scanner) warn(format string, a ...any) {
	s.warnings = append(s.warnings, s.name+": "+fmt.Sprintf(format, a...))
}

var errStop = errors.New("stop")
