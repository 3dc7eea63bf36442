package fielddata

import (
	"bytes"
	"io"
	"math/rand/v2"
	"testing"
	"testing/iotest"

	"golang.org/x/text/encoding/charmap"
	"golang.org/x/text/encoding/unicode"
	"golang.org/x/text/transform"
)

// reference decodes b with golang.org/x/text, the general-purpose
// library the decoders of text.go stand in for.
func reference(t testing.TB, b []byte, enc Encoding) []byte {
	var tr transform.Transformer
	switch enc {
	case UTF16LE:
		tr = unicode.UTF16(unicode.LittleEndian, unicode.UseBOM).NewDecoder()
	case UTF16BE:
		tr = unicode.UTF16(unicode.BigEndian, unicode.UseBOM).NewDecoder()
	case Latin1:
		tr = charmap.ISO8859_1.NewDecoder()
	case Windows1252:
		tr = charmap.Windows1252.NewDecoder()
	}
	out, _, err := transform.Bytes(tr, b)
	if err != nil {
		t.Fatalf("x/text %s: %v", enc, err)
	}
	return out
}

// decoded reads b through decodeReader, one byte at a time, as Import
// does with a file.
func decoded(t testing.TB, b []byte, enc Encoding) []byte {
	out, err := io.ReadAll(decodeReader(iotest.OneByteReader(bytes.NewReader(b)), enc))
	if err != nil {
		t.Fatal(err)
	}
	return out
}

func TestDecodersMatchXText(t *testing.T) {
	all := make([]byte, 256)
	for i := range all {
		all[i] = byte(i)
	}
	cases := map[string][]byte{
		"every byte":         all,
		"BOM LE":             {0xFF, 0xFE, 'a', 0, 'b', 0},
		"BOM BE":             {0xFE, 0xFF, 0, 'a', 0, 'b'},
		"odd length":         {'a', 0, 'b'},
		"surrogate pair LE":  {0x3D, 0xD8, 0x00, 0xDE, 'x', 0},
		"lone high":          {0x3D, 0xD8, 'x', 0},
		"lone low":           {0x00, 0xDE, 'x', 0},
		"high at the end":    {'x', 0, 0x3D, 0xD8},
		"empty":              {},
		"one byte":           {'a'},
		"BOM only":           {0xFF, 0xFE},
		"late BOM is a char": {'a', 0, 0xFF, 0xFE},
	}
	rng := rand.New(rand.NewPCG(1, 2))
	for k := 0; k < 50; k++ {
		b := make([]byte, rng.IntN(300))
		for i := range b {
			b[i] = byte(rng.IntN(256))
			if rng.IntN(3) == 0 {
				b[i] = []byte{0, 0xD8, 0xDC, 0xDF, 'a', '\n'}[rng.IntN(6)]
			}
		}
		cases["random "+string(rune('A'+k))] = b
	}
	for name, b := range cases {
		for _, enc := range []Encoding{UTF16LE, UTF16BE, Latin1, Windows1252} {
			want := reference(t, b, enc)
			if got := decoded(t, b, enc); !bytes.Equal(got, want) {
				t.Errorf("%s, %s, reader: got %q, x/text %q", name, enc, got, want)
			}
			even := b
			if enc == UTF16LE || enc == UTF16BE {
				even = b[:len(b)&^1]
			}
			want = bytes.TrimPrefix(reference(t, even, enc), []byte("\uFEFF"))
			if got := decodeBytes(b, enc); !bytes.Equal(got, want) {
				t.Errorf("%s, %s, bytes: got %q, x/text %q", name, enc, got, want)
			}
		}
	}
}

func FuzzDecoders(f *testing.F) {
	f.Add([]byte{0xFF, 0xFE, 'a', 0, 0x3D, 0xD8, 0x00, 0xDE})
	f.Add([]byte("Température;€"))
	f.Fuzz(func(t *testing.T, b []byte) {
		for _, enc := range []Encoding{UTF16LE, UTF16BE, Latin1, Windows1252} {
			if got, want := decoded(t, b, enc), reference(t, b, enc); !bytes.Equal(got, want) {
				t.Fatalf("%s: got %q, x/text %q", enc, got, want)
			}
		}
	})
}
