package fielddata

import (
	"io"
	"unicode/utf16"
	"unicode/utf8"
)

// The decoders of UTF-16 and of the single-byte encodings are written out
// here rather than taken from golang.org/x/text: only these four are
// needed, and x/text's encoding packages add about 20 kB gzipped to the
// browser app. text_test.go checks them against x/text byte for byte.

// win1252 maps the bytes 0x80–0x9F of Windows-1252 to runes; the other
// bytes are the same as in Latin-1 (ISO 8859-1). The five bytes that
// Windows-1252 leaves undefined (0x81, 0x8D, 0x8F, 0x90, 0x9D) become
// U+FFFD, as with x/text. Source: the Unicode Consortium's mapping file
// CP1252.TXT (from memory; checked against x/text in the tests).
var win1252 = [32]rune{
	0x20AC, 0xFFFD, 0x201A, 0x0192, 0x201E, 0x2026, 0x2020, 0x2021,
	0x02C6, 0x2030, 0x0160, 0x2039, 0x0152, 0xFFFD, 0x017D, 0xFFFD,
	0xFFFD, 0x2018, 0x2019, 0x201C, 0x201D, 0x2022, 0x2013, 0x2014,
	0x02DC, 0x2122, 0x0161, 0x203A, 0x0153, 0xFFFD, 0x017E, 0x0178,
}

// decodeChunk appends the UTF-8 of src in enc (not UTF-8) to dst and
// returns it with the bytes left over at the end of src: for UTF-16 an
// odd byte or a high surrogate whose partner is still to come. With
// atEOF nothing is left over (an incomplete last unit becomes U+FFFD).
// first marks the start of the text, where a UTF-16 byte order mark
// chooses the byte order (le) and is dropped.
func decodeChunk(dst, src []byte, enc Encoding, atEOF bool, first *bool, le *bool) ([]byte, []byte) {
	switch enc {
	case Latin1:
		for _, c := range src {
			dst = utf8.AppendRune(dst, rune(c))
		}
		return dst, nil
	case Windows1252:
		for _, c := range src {
			r := rune(c)
			if c >= 0x80 && c <= 0x9F {
				r = win1252[c-0x80]
			}
			dst = utf8.AppendRune(dst, r)
		}
		return dst, nil
	}
	if *first {
		if len(src) < 2 && !atEOF {
			return dst, src
		}
		*first = false
		if len(src) >= 2 {
			switch {
			case src[0] == 0xFF && src[1] == 0xFE:
				*le, src = true, src[2:]
			case src[0] == 0xFE && src[1] == 0xFF:
				*le, src = false, src[2:]
			}
		}
	}
	unit := func(b []byte) rune {
		if *le {
			return rune(b[0]) | rune(b[1])<<8
		}
		return rune(b[1]) | rune(b[0])<<8
	}
	// As x/text does: a surrogate with a low surrogate after it is
	// decoded as a pair (U+FFFD when the first is not a high one), and
	// any other surrogate is U+FFFD.
	for len(src) >= 2 {
		r, n := unit(src), 2
		if r >= 0xD800 && r < 0xE000 {
			if len(src) < 4 && !atEOF {
				return dst, src
			}
			if len(src) >= 4 {
				if r2 := unit(src[2:]); r2 >= 0xDC00 && r2 < 0xE000 {
					r, n = utf16.DecodeRune(r, r2), 4
				}
			}
			if r >= 0xD800 && r < 0xE000 {
				r = utf8.RuneError
			}
		}
		dst = utf8.AppendRune(dst, r)
		src = src[n:]
	}
	if atEOF && len(src) > 0 {
		return utf8.AppendRune(dst, utf8.RuneError), nil
	}
	return dst, src
}

// textReader decodes a reader in UTF-16 or a single-byte encoding to
// UTF-8, 64 kB at a time.
type textReader struct {
	r         io.Reader
	enc       Encoding
	raw       []byte
	carry     []byte
	out       []byte
	pos       int
	first, le bool
	err       error
}

func newTextReader(r io.Reader, enc Encoding) *textReader {
	return &textReader{r: r, enc: enc, raw: make([]byte, 64<<10), first: true, le: enc == UTF16LE}
}

func (d *textReader) Read(p []byte) (int, error) {
	for d.pos == len(d.out) {
		if d.err != nil {
			return 0, d.err
		}
		n := copy(d.raw, d.carry)
		m, err := d.r.Read(d.raw[n:])
		d.out, d.carry = decodeChunk(d.out[:0], d.raw[:n+m], d.enc, err != nil, &d.first, &d.le)
		d.carry = append([]byte(nil), d.carry...)
		d.pos = 0
		d.err = err
	}
	n := copy(p, d.out[d.pos:])
	d.pos += n
	return n, nil
}
