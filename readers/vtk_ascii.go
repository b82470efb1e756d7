package readers

import (
	"bytes"
	"fmt"
	"sync"
	"sync/atomic"
)

// spaceTab marks the bytes that separate ASCII tokens.
var spaceTab = [256]bool{' ': true, '\n': true, '\t': true, '\r': true, '\v': true, '\f': true}

// minPart is the smallest share of an ASCII chunk worth a goroutine.
const minPart = 64 << 10

// asciiPart is one worker's share of an ASCII chunk: the bytes, the
// values parsed from them, the byte index just past the last parsed token
// and the byte index of the first token that is not a number (-1 if none).
type asciiPart struct {
	data []byte
	vals []float64
	end  int
	bad  int
}

// parse parses at most limit tokens of p.data into p.vals, stopping at the
// first token that is not a number. p.vals holds the most tokens the bytes
// can (one byte and one separator each), so that appending never
// reallocates: growing by append (1.25x steps for large slices) cost a
// third of the zone's size on connectivity of small integers. A new p.vals
// has a quarter more room, as the parts of one buffer differ by a token.
func (p *asciiPart) parse(limit int, f32 bool) {
	b := p.data
	if c := len(b)/2 + 1; cap(p.vals) < min(c, limit) {
		p.vals = make([]float64, 0, min(c+c/4, limit))
	}
	v := p.vals[:0]
	bad, end := -1, 0
	i := 0
	for len(v) < limit {
		for i < len(b) && spaceTab[b[i]] {
			i++
		}
		if i == len(b) {
			break
		}
		j := i + 1
		for j < len(b) && !spaceTab[b[j]] {
			j++
		}
		x, ok := parseNumber(b[i:j], f32)
		if !ok {
			bad = i
			break
		}
		v = append(v, x)
		i, end = j, j
	}
	// Fields are written once: parts sit side by side in memory and are
	// parsed by different goroutines.
	p.vals, p.bad, p.end = v, bad, end
}

// tokenEnd returns the byte index just past the k-th token (1-based) of b.
func tokenEnd(b []byte, k int) int {
	i := 0
	for ; k > 0; k-- {
		for i < len(b) && spaceTab[b[i]] {
			i++
		}
		for i < len(b) && !spaceTab[b[i]] {
			i++
		}
	}
	return i
}

// tokenStart returns the byte index of the k-th token (0-based) of b.
func tokenStart(b []byte, k int) int {
	i := tokenEnd(b, k)
	for i < len(b) && spaceTab[b[i]] {
		i++
	}
	return i
}

// tokenAt returns the token starting at byte i of b, shortened for
// messages.
func tokenAt(b []byte, i int) string {
	j := i
	for j < len(b) && !spaceTab[b[j]] && j-i < 40 {
		j++
	}
	return fmt.Sprintf("%q", b[i:j])
}

// readASCII parses n whitespace-separated numbers and hands them, in
// order, to sink.putFloats. Each chunk of the buffer is cut at whitespace
// into one part per worker; parts are parsed concurrently and delivered by
// part index, so the result does not depend on the worker count.
func (s *scanner) readASCII(n int, f32 bool, sec, what string, dst sink) error {
	got := 0
	for got < n {
		need := n - got
		est := min(need*s.bytesPerToken()+64, s.maxASCIIChunk())
		s.want(est)
		if est > len(s.buf) || est < 0 {
			est = len(s.buf)
		}
		if err := s.fill(est); err != nil {
			return err
		}
		chunk, err := s.asciiChunk(est)
		if err != nil {
			return err
		}
		if chunk == nil {
			return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", got), ErrTruncated)
		}
		got0 := got
		parts := s.split(chunk)
		if w := min(s.workers, len(parts)); w <= 1 {
			for i := range parts {
				parts[i].parse(need, f32)
			}
		} else {
			// Workers take parts in turn, so a worker slowed down by
			// other load does not hold up the chunk.
			var wg sync.WaitGroup
			var next atomic.Int32
			for range w {
				wg.Add(1)
				go func() {
					defer wg.Done()
					for i := int(next.Add(1)) - 1; i < len(parts); i = int(next.Add(1)) - 1 {
						parts[i].parse(need, f32)
					}
				}()
			}
			wg.Wait()
		}
		dst.grow(got + min(need, totalVals(parts)))
		start := 0
		for k := range parts {
			p := &parts[k]
			take := min(len(p.vals), need)
			if take > 0 {
				if bad, e := dst.putFloats(got, p.vals[:take]); e != nil {
					e.File, e.Section = s.name, sec
					e.Line = s.line + bytes.Count(chunk[:start+tokenStart(p.data, bad)], nl)
					return e
				}
			}
			got += take
			need -= take
			if need == 0 {
				end := p.end
				if take < len(p.vals) {
					end = tokenEnd(p.data, take)
				}
				s.noteTokens(start+end, got-got0)
				s.advance(start + end)
				return nil
			}
			if p.bad >= 0 {
				s.advance(start + p.bad)
				return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%s after %d", tokenAt(p.data, p.bad), got), errSyntax)
			}
			start += len(p.data)
		}
		s.noteTokens(len(chunk), got-got0)
		s.advance(len(chunk))
	}
	return nil
}

// maxASCIIChunk returns the most bytes parsed at a time: 1 MiB, or 256 KiB
// per worker when there are more than four. The parts' value buffers take
// up to 5 bytes per chunk byte (a number per 2 bytes, 8 bytes each, a
// quarter spare), so bigger chunks cost memory and gain nothing once each
// worker has a few parts of at least minPart bytes.
func (s *scanner) maxASCIIChunk() int { return max(1<<20, s.workers<<18) }

func totalVals(parts []asciiPart) int {
	t := 0
	for i := range parts {
		t += len(parts[i].vals)
	}
	return t
}

// bytesPerToken returns the running estimate of bytes per ASCII number.
func (s *scanner) bytesPerToken() int {
	if s.tokBytes == 0 || s.tokCount == 0 {
		return 24
	}
	return int(s.tokBytes/s.tokCount) + 2
}

// noteTokens updates the estimate with a chunk of b bytes that held n
// numbers.
func (s *scanner) noteTokens(b, n int) {
	s.tokBytes += int64(b)
	s.tokCount += int64(n)
	if s.tokCount > 1<<20 {
		s.tokBytes /= 2
		s.tokCount /= 2
	}
}

// asciiChunk returns a prefix of the unread buffer of about est bytes
// that ends at a token boundary, reading more if a token is cut; nil at
// EOF.
func (s *scanner) asciiChunk(est int) ([]byte, error) {
	for {
		avail := s.buf[s.pos:s.end]
		if len(avail) == 0 {
			return nil, nil
		}
		if len(avail) > est {
			// Extend to the end of the token that straddles est.
			i := est
			for i < len(avail) && !spaceTab[avail[i]] {
				i++
			}
			if i < len(avail) {
				return avail[:i], nil
			}
		}
		if s.eof {
			return avail, nil
		}
		i := len(avail) - 1
		for i >= 0 && !spaceTab[avail[i]] {
			i--
		}
		if i >= 0 {
			return avail[:i+1], nil
		}
		if len(avail) >= maxLine {
			return nil, s.errAt("", "a number", "a token longer than 64 KiB", errSyntax)
		}
		if err := s.fill(len(avail) + 1); err != nil {
			return nil, err
		}
	}
}

// split cuts chunk at whitespace into parts of at least minPart bytes,
// up to four per worker.
func (s *scanner) split(chunk []byte) []asciiPart {
	w := 1
	if s.workers > 1 {
		w = min(4*s.workers, len(chunk)/minPart)
	}
	if w < 1 {
		w = 1
	}
	if cap(s.parts) < w {
		s.parts = append(s.parts[:cap(s.parts)], make([]asciiPart, w-cap(s.parts))...)
	}
	parts := s.parts[:0]
	lo := 0
	for k := 1; k <= w && lo < len(chunk); k++ {
		hi := len(chunk) * k / w
		if hi < lo {
			hi = lo
		}
		for hi < len(chunk) && !spaceTab[chunk[hi]] {
			hi++
		}
		parts = parts[:len(parts)+1]
		parts[len(parts)-1].data = chunk[lo:hi]
		lo = hi
	}
	s.parts = parts[:cap(parts)]
	return parts
}

// skipASCII consumes n tokens without converting them.
func (s *scanner) skipASCII(n int64, sec, what string) error {
	got := int64(0)
	for got < n {
		if err := s.fill(1); err != nil {
			return err
		}
		b := s.buf[s.pos:s.end]
		if len(b) == 0 {
			return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", got), ErrTruncated)
		}
		i := 0
		for got < n {
			for i < len(b) && spaceTab[b[i]] {
				i++
			}
			if i == len(b) {
				break
			}
			j := i
			for j < len(b) && !spaceTab[b[j]] {
				j++
			}
			if j == len(b) && !s.eof {
				break // token may continue in the next read
			}
			got++
			i = j
		}
		if i == 0 {
			if err := s.fill(s.end - s.pos + 1); err != nil {
				return err
			}
			if s.end-s.pos >= maxLine && !s.eof {
				return s.errAt(sec, "a number", "a token longer than 64 KiB", errSyntax)
			}
			if s.eof {
				b = s.buf[s.pos:s.end]
				if len(bytes.TrimSpace(b)) == 0 {
					return s.errAt(sec, fmt.Sprintf("%d %s", n, what), fmt.Sprintf("%d before EOF", got), ErrTruncated)
				}
			}
			continue
		}
		s.advance(i)
	}
	return nil
}
