package fielddata

import (
	"bytes"
	"io"
)

// MaxLine is the longest line, in bytes of UTF-8, that Import reads; a
// longer one ends the import with ErrLineTooLong.
const MaxLine = 1 << 20

const readChunk = 256 << 10

// lineReader returns the lines of UTF-8 text one at a time, without their
// ends. A line ends at LF, CR LF or a lone CR. The returned slice is valid
// until the next call.
type lineReader struct {
	r      io.Reader
	buf    []byte
	r0, w  int // unread bytes are buf[r0:w]
	eof    bool
	err    error
	row    int  // 1-based number of the last line returned
	start  bool // the byte order mark has been looked for
	ended  bool // the last line returned ended with a line end
	lf, cr int  // next LF and CR at or after r0, -1: none before w; valid when known
	known  bool
	// read counts the bytes read from r; consumed the bytes of the
	// lines returned, with their ends.
	read, consumed int64
}

func newLineReader(r io.Reader) *lineReader {
	return &lineReader{r: r, buf: make([]byte, readChunk)}
}

// next returns the next line. ok is false at the end of the text; err is
// a read error or ErrLineTooLong.
func (lr *lineReader) next() (line []byte, ok bool, err error) {
	for {
		if !lr.start && (lr.w-lr.r0 >= 3 || lr.eof) {
			lr.start = true
			if bytes.HasPrefix(lr.buf[lr.r0:lr.w], []byte{0xEF, 0xBB, 0xBF}) {
				lr.r0 += 3
				lr.known = false
			}
		}
		if lr.start {
			if !lr.known {
				lr.lf = index(lr.buf, lr.r0, lr.w, '\n')
				lr.cr = index(lr.buf, lr.r0, lr.w, '\r')
				lr.known = true
			}
			if lr.lf >= 0 && lr.lf < lr.r0 {
				lr.lf = index(lr.buf, lr.r0, lr.w, '\n')
			}
			if lr.cr >= 0 && lr.cr < lr.r0 {
				lr.cr = index(lr.buf, lr.r0, lr.w, '\r')
			}
			switch {
			case lr.cr >= 0 && (lr.lf < 0 || lr.cr < lr.lf):
				// A CR: with an LF right after it, a CR LF end; else a
				// lone CR, unless more text may bring the LF.
				if lr.cr+1 < lr.w || lr.eof {
					line = lr.buf[lr.r0:lr.cr]
					if lr.cr+1 < lr.w && lr.buf[lr.cr+1] == '\n' {
						lr.r0 = lr.cr + 2
					} else {
						lr.r0 = lr.cr + 1
					}
					return lr.emit(line, true)
				}
			case lr.lf >= 0:
				line = lr.buf[lr.r0:lr.lf]
				lr.r0 = lr.lf + 1
				return lr.emit(line, true)
			case lr.eof:
				if lr.r0 == lr.w {
					return nil, false, lr.err
				}
				line = lr.buf[lr.r0:lr.w]
				lr.r0 = lr.w
				return lr.emit(line, false)
			}
		}
		if lr.eof {
			// Only reachable before the start check passed on a short text.
			continue
		}
		if err := lr.fill(); err != nil {
			return nil, false, err
		}
	}
}

func (lr *lineReader) emit(line []byte, ended bool) ([]byte, bool, error) {
	lr.consumed = lr.read - int64(lr.w-lr.r0)
	lr.row++
	lr.ended = ended
	return line, true, nil
}

func index(b []byte, from, to int, c byte) int {
	if i := bytes.IndexByte(b[from:to], c); i >= 0 {
		return from + i
	}
	return -1
}

func (lr *lineReader) fill() error {
	if lr.r0 > 0 {
		n := copy(lr.buf, lr.buf[lr.r0:lr.w])
		lr.w = n
		lr.r0 = 0
	}
	lr.known = false
	if lr.w == len(lr.buf) {
		if len(lr.buf) >= MaxLine+2 {
			lr.row++
			return &RowError{Row: lr.row, Column: -1, Err: ErrLineTooLong}
		}
		nb := make([]byte, min(2*len(lr.buf), MaxLine+2))
		copy(nb, lr.buf[:lr.w])
		lr.buf = nb
	}
	for tries := 0; tries < 100; tries++ {
		n, err := lr.r.Read(lr.buf[lr.w:])
		lr.w += n
		lr.read += int64(n)
		if err != nil {
			lr.eof = true
			if err != io.EOF {
				lr.err = err
			}
			return nil
		}
		if n > 0 {
			return nil
		}
	}
	lr.eof = true
	lr.err = io.ErrNoProgress
	return nil
}

// splitter cuts lines into fields. The fields point into the line or into
// its scratch buffer and are valid until the next split.
type splitter struct {
	delim   byte // ',', ';', '\t', or ' ' for runs of blanks
	fields  [][]byte
	scratch []byte
}

func newSplitter(d Delimiter) *splitter {
	return &splitter{delim: d.byte(), fields: make([][]byte, 0, 16)}
}

func isBlank(c byte) bool { return c == ' ' || c == '\t' }

func trimBlank(b []byte) []byte {
	i, j := 0, len(b)
	for i < j && isBlank(b[i]) {
		i++
	}
	for j > i && isBlank(b[j-1]) {
		j--
	}
	return b[i:j]
}

// split returns the fields of line, each trimmed of surrounding blanks and
// unquoted. A line of blanks only has no fields.
func (s *splitter) split(line []byte) ([][]byte, error) {
	s.fields = s.fields[:0]
	if cap(s.scratch) < len(line) {
		s.scratch = make([]byte, 0, len(line)+64)
	}
	s.scratch = s.scratch[:0]
	if len(trimBlank(line)) == 0 {
		return s.fields, nil
	}
	i := 0
	if s.delim == ' ' {
		for {
			for i < len(line) && isBlank(line[i]) {
				i++
			}
			if i >= len(line) {
				return s.fields, nil
			}
			if line[i] == '"' {
				f, n, err := s.quoted(line, i)
				if err != nil {
					return s.fields, err
				}
				s.fields = append(s.fields, f)
				i = n
				for i < len(line) && !isBlank(line[i]) {
					i++ // text glued to the closing quote is dropped with it
				}
				continue
			}
			j := i
			for j < len(line) && !isBlank(line[j]) {
				j++
			}
			s.fields = append(s.fields, line[i:j])
			i = j
		}
	}
	for {
		j := i
		for j < len(line) && line[j] == ' ' {
			j++
		}
		if j < len(line) && line[j] == '"' {
			f, n, err := s.quoted(line, j)
			if err != nil {
				return s.fields, err
			}
			// Anything between the closing quote and the delimiter is
			// kept after the quoted text.
			k := bytes.IndexByte(line[n:], s.delim)
			rest := line[n:]
			if k >= 0 {
				rest = line[n : n+k]
			}
			if r := trimBlank(rest); len(r) > 0 {
				start := len(s.scratch)
				s.scratch = append(s.scratch, f...)
				s.scratch = append(s.scratch, r...)
				f = s.scratch[start:]
			}
			s.fields = append(s.fields, f)
			if k < 0 {
				return s.fields, nil
			}
			i = n + k + 1
			continue
		}
		k := bytes.IndexByte(line[i:], s.delim)
		if k < 0 {
			s.fields = append(s.fields, trimBlank(line[i:]))
			return s.fields, nil
		}
		s.fields = append(s.fields, trimBlank(line[i:i+k]))
		i += k + 1
	}
}

// quoted reads the quoted field that starts at line[i] == '"' and returns
// its text and the index just past the closing quote.
func (s *splitter) quoted(line []byte, i int) ([]byte, int, error) {
	i++
	k := bytes.IndexByte(line[i:], '"')
	if k < 0 {
		return nil, 0, ErrQuote
	}
	if i+k+1 >= len(line) || line[i+k+1] != '"' {
		return trimBlank(line[i : i+k]), i + k + 1, nil
	}
	// Escaped quotes: unquote into the scratch buffer.
	start := len(s.scratch)
	for {
		k = bytes.IndexByte(line[i:], '"')
		if k < 0 {
			return nil, 0, ErrQuote
		}
		s.scratch = append(s.scratch, line[i:i+k]...)
		i += k + 1
		if i < len(line) && line[i] == '"' {
			s.scratch = append(s.scratch, '"')
			i++
			continue
		}
		return trimBlank(s.scratch[start:]), i, nil
	}
}
