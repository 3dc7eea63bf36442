package fielddata

import (
	"bytes"
	"fmt"
	"io"
	"unicode/utf8"
)

// magic lists the starts of common files that are not text, with what to
// call them in the one-sentence message.
var magic = []struct {
	prefix string
	kind   string
}{
	{"PK\x03\x04", "a ZIP archive (spreadsheet workbooks such as .xlsx files are ZIP archives)"},
	{"PK\x05\x06", "an empty ZIP archive"},
	{"\x89PNG\r\n\x1a\n", "a PNG image"},
	{"\xff\xd8\xff", "a JPEG image"},
	{"GIF87a", "a GIF image"},
	{"GIF89a", "a GIF image"},
	{"II*\x00", "a TIFF image"},
	{"MM\x00*", "a TIFF image"},
	{"%PDF-", "a PDF document"},
	{"\x1f\x8b", "a gzip-compressed file"},
	{"\xd0\xcf\x11\xe0\xa1\xb1\x1a\xe1", "a binary office document (such as an older .xls workbook)"},
	{"7z\xbc\xaf\x27\x1c", "a 7-Zip archive"},
	{"Rar!\x1a\x07", "a RAR archive"},
	{"SQLite format 3\x00", "an SQLite database"},
	{"\x7fELF", "a program file"},
}

// sniffEncoding finds the encoding of the start of a file. It fails with
// a *NotTextError when the bytes are not text.
func sniffEncoding(sample []byte) (Encoding, Guess, error) {
	for _, m := range magic {
		if bytes.HasPrefix(sample, []byte(m.prefix)) {
			return "", Guess{}, &NotTextError{Kind: m.kind}
		}
	}
	switch {
	case bytes.HasPrefix(sample, []byte{0xEF, 0xBB, 0xBF}):
		return UTF8, Guess{Sure, "the file starts with the UTF-8 byte order mark"}, checkText(sample, UTF8)
	case bytes.HasPrefix(sample, []byte{0xFF, 0xFE}):
		return UTF16LE, Guess{Sure, "the file starts with the UTF-16 little-endian byte order mark"}, checkText(sample, UTF16LE)
	case bytes.HasPrefix(sample, []byte{0xFE, 0xFF}):
		return UTF16BE, Guess{Sure, "the file starts with the UTF-16 big-endian byte order mark"}, checkText(sample, UTF16BE)
	}
	// UTF-16 without a byte order mark: text that is mostly ASCII has a
	// zero in every other byte.
	n := min(len(sample), 4096) &^ 1
	var z [2]int
	for i := 0; i < n; i++ {
		if sample[i] == 0 {
			z[i&1]++
		}
	}
	pairs := n / 2
	if pairs >= 2 {
		switch {
		case z[1]*10 >= pairs*3 && z[0]*20 <= pairs:
			return UTF16LE, Guess{Likely, "every other byte is zero, the second of each pair: UTF-16 little-endian without a byte order mark"}, checkText(sample, UTF16LE)
		case z[0]*10 >= pairs*3 && z[1]*20 <= pairs:
			return UTF16BE, Guess{Likely, "every other byte is zero, the first of each pair: UTF-16 big-endian without a byte order mark"}, checkText(sample, UTF16BE)
		}
	}
	if bytes.IndexByte(sample, 0) >= 0 {
		return "", Guess{}, &NotTextError{Kind: "binary data (it holds zero bytes)"}
	}
	body := cutIncompleteRune(sample)
	if bad := firstInvalidUTF8(body); bad < 0 {
		if i := firstNonASCII(body); i >= 0 {
			r, _ := utf8.DecodeRune(body[i:])
			return UTF8, Guess{Sure, fmt.Sprintf("valid UTF-8 with characters beyond ASCII (first: %q)", r)}, checkText(sample, UTF8)
		}
		return UTF8, Guess{Sure, "plain ASCII text, read the same in every encoding offered"}, checkText(sample, UTF8)
	} else {
		for _, c := range sample {
			if c >= 0x80 && c <= 0x9F {
				return Windows1252, Guess{Likely, fmt.Sprintf("bytes that are not UTF-8 (the first at byte %d), some in the range 0x80–0x9F that Windows-1252 uses for signs such as € and quotes", bad+1)}, checkText(sample, Windows1252)
			}
		}
		return Latin1, Guess{Likely, fmt.Sprintf("bytes that are not UTF-8 (the first at byte %d): read as Latin-1 (ISO 8859-1)", bad+1)}, checkText(sample, Latin1)
	}
}

// checkText decodes sample and fails when too many characters are control
// characters for it to be text.
func checkText(sample []byte, enc Encoding) error {
	text := decodeBytes(sample, enc)
	ctrl, total := 0, 0
	for _, r := range string(text) {
		total++
		switch {
		case r == '\t' || r == '\n' || r == '\r' || r == '\f' || r == '\v':
		case r < 0x20 || r == 0x7F || (r >= 0x80 && r <= 0x9F) || r == utf8.RuneError:
			ctrl++
		}
	}
	if total == 0 {
		return nil
	}
	if ctrl*100 > total {
		return &NotTextError{Kind: "binary data (many of its bytes are control characters)"}
	}
	return nil
}

// decodeBytes converts b from enc to UTF-8, dropping a byte order mark
// and an incomplete last character.
func decodeBytes(b []byte, enc Encoding) []byte {
	switch enc {
	case UTF16LE, UTF16BE:
		b = b[:len(b)&^1]
		first, le := true, enc == UTF16LE
		out, _ := decodeChunk(make([]byte, 0, len(b)+len(b)/2), b, enc, true, &first, &le)
		return bytes.TrimPrefix(out, []byte("\uFEFF"))
	case Latin1, Windows1252:
		first, le := false, false
		out, _ := decodeChunk(make([]byte, 0, len(b)+len(b)/4), b, enc, true, &first, &le)
		return out
	}
	return bytes.TrimPrefix(cutIncompleteRune(b), []byte{0xEF, 0xBB, 0xBF})
}

// decodeReader returns a reader of the UTF-8 text of r in enc. A UTF-8
// byte order mark is left for the line reader to drop; a UTF-16 one is
// dropped here.
func decodeReader(r io.Reader, enc Encoding) io.Reader {
	switch enc {
	case UTF16LE, UTF16BE, Latin1, Windows1252:
		return newTextReader(r, enc)
	}
	return r
}

// cutIncompleteRune drops a UTF-8 sequence cut off at the end of b.
func cutIncompleteRune(b []byte) []byte {
	for k := 1; k <= utf8.UTFMax && k <= len(b); k++ {
		c := b[len(b)-k]
		if c < 0x80 {
			return b
		}
		if utf8.RuneStart(c) {
			if !utf8.FullRune(b[len(b)-k:]) {
				return b[:len(b)-k]
			}
			return b
		}
	}
	return b
}

func firstInvalidUTF8(b []byte) int {
	for i := 0; i < len(b); {
		if b[i] < utf8.RuneSelf {
			i++
			continue
		}
		r, n := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && n == 1 {
			return i
		}
		i += n
	}
	return -1
}

func firstNonASCII(b []byte) int {
	for i, c := range b {
		if c >= utf8.RuneSelf {
			return i
		}
	}
	return -1
}

// countingReader counts the bytes read through it, for progress.
type countingReader struct {
	r io.Reader
	n int64
}

func (c *countingReader) Read(p []byte) (int, error) {
	n, err := c.r.Read(p)
	c.n += int64(n)
	return n, err
}
