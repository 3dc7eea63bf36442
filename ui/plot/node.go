package plot

import (
	"math"
	"strconv"
	"strings"
	"unicode/utf8"
)

// SVGNamespace is the namespace of every element of the tree, for
// createElementNS.
const SVGNamespace = "http://www.w3.org/2000/svg"

// Node is one SVG element. The browser layer creates it with
// createElementNS(SVGNamespace, Tag), calls setAttribute for each of Attrs
// in order (it may skip "xmlns", which createElementNS already implies and
// which is there for the serialised form), sets textContent to Text when it
// is not empty, then appends Children. Tags and attribute names are fixed
// by this package; user text reaches only Text and attribute values, and is
// already cleaned of characters that XML cannot carry, so neither form
// needs innerHTML.
type Node struct {
	Tag      string
	Attrs    []Attr
	Text     string
	Children []*Node
}

// Attr is one attribute of a Node.
type Attr struct{ Name, Value string }

// Attr returns the value of the attribute name, or "".
func (n *Node) Attr(name string) string {
	for _, a := range n.Attrs {
		if a.Name == name {
			return a.Value
		}
	}
	return ""
}

// Walk calls fn for n and every node below it, depth first, in document
// order.
func (n *Node) Walk(fn func(*Node)) {
	fn(n)
	for _, c := range n.Children {
		c.Walk(fn)
	}
}

// el makes an element with attributes as name, value pairs. el, add and
// num are kept out of line: inlined at their many call sites they made
// app.wasm about 9 kB (gzipped) larger, for no speed that matters here.
//
//go:noinline
func el(tag string, attrs ...string) *Node {
	n := &Node{Tag: tag, Attrs: make([]Attr, 0, len(attrs)/2)}
	for i := 0; i+1 < len(attrs); i += 2 {
		n.Attrs = append(n.Attrs, Attr{attrs[i], attrs[i+1]})
	}
	return n
}

// add appends children and returns n.
//
//go:noinline
func (n *Node) add(c ...*Node) *Node {
	n.Children = append(n.Children, c...)
	return n
}

// SVG returns the tree as SVG markup: text and attribute values are
// escaped, characters not allowed in XML 1.0 become U+FFFD. A root <svg>
// element (as Render returns) makes a stand-alone SVG document.
func (n *Node) SVG() string {
	var b strings.Builder
	n.write(&b, 0)
	return b.String()
}

func (n *Node) write(b *strings.Builder, depth int) {
	b.WriteByte('<')
	b.WriteString(n.Tag)
	for _, a := range n.Attrs {
		b.WriteByte(' ')
		b.WriteString(a.Name)
		b.WriteString(`="`)
		escape(b, a.Value, true)
		b.WriteByte('"')
	}
	if n.Text == "" && len(n.Children) == 0 {
		b.WriteString("/>")
		if depth <= 1 {
			b.WriteByte('\n')
		}
		return
	}
	b.WriteByte('>')
	escape(b, n.Text, false)
	if len(n.Children) > 0 {
		b.WriteByte('\n')
		for _, c := range n.Children {
			c.write(b, depth+1)
		}
	}
	b.WriteString("</")
	b.WriteString(n.Tag)
	b.WriteByte('>')
	if depth <= 1 || len(n.Children) > 0 {
		b.WriteByte('\n')
	}
}

func escape(b *strings.Builder, s string, attr bool) {
	for i := 0; i < len(s); {
		// Copy a run of plain ASCII at once.
		j := i
		for j < len(s) && plainASCII(s[j]) {
			j++
		}
		if j > i {
			b.WriteString(s[i:j])
			i = j
			continue
		}
		r, size := utf8.DecodeRuneInString(s[i:])
		if r == utf8.RuneError && size == 1 {
			b.WriteString("\uFFFD")
			i++
			continue
		}
		i += size
		switch r {
		case '&':
			b.WriteString("&amp;")
		case '<':
			b.WriteString("&lt;")
		case '>':
			b.WriteString("&gt;")
		case '"':
			if attr {
				b.WriteString("&quot;")
			} else {
				b.WriteByte('"')
			}
		case '\'':
			if attr {
				b.WriteString("&#39;")
			} else {
				b.WriteByte('\'')
			}
		case '\t', '\n', '\r':
			if attr {
				b.WriteString("&#" + strconv.Itoa(int(r)) + ";")
			} else {
				b.WriteRune(r)
			}
		default:
			if !xmlChar(r) {
				r = '\uFFFD'
			}
			b.WriteRune(r)
		}
	}
}

// plainASCII reports whether c is printable ASCII that needs no escaping.
func plainASCII(c byte) bool {
	return c >= 0x20 && c < 0x7F && c != '&' && c != '<' && c != '>' && c != '"' && c != '\''
}

// xmlChar reports whether r may appear in XML 1.0 (the Char production).
func xmlChar(r rune) bool {
	return r == 0x9 || r == 0xA || r == 0xD ||
		(r >= 0x20 && r <= 0xD7FF) || (r >= 0xE000 && r <= 0xFFFD) || (r >= 0x10000 && r <= 0x10FFFF)
}

// cleanText makes user text safe for one line of a chart: invalid UTF-8 and
// characters XML cannot carry become U+FFFD, and line breaks and tabs become
// spaces. It keeps everything else, so no user text is lost.
func cleanText(s string) string {
	var b strings.Builder
	for i := 0; i < len(s); {
		r, size := utf8.DecodeRuneInString(s[i:])
		i += size
		switch {
		case r == utf8.RuneError && size == 1:
			r = '\uFFFD'
		case r == '\t' || r == '\n' || r == '\r':
			r = ' '
		case !xmlChar(r):
			r = '\uFFFD'
		}
		b.WriteRune(r)
	}
	return b.String()
}

// num formats a pixel coordinate with at most one decimal.
//
//go:noinline
func num(v float64) string { return string(appendNum(nil, v)) }

// appendNum appends v rounded to one decimal, without a trailing ".0"
// ("12.5", "100", "-3.2"). Values beyond ±1e12 are written in full by
// strconv; drawing coordinates are held within ±1e9 (farPixel).
func appendNum(b []byte, v float64) []byte {
	if !(math.Abs(v) < 1e12) {
		return strconv.AppendFloat(b, math.Round(v*10)/10, 'f', -1, 64)
	}
	n := int64(math.Round(v * 10))
	if n == 0 {
		return append(b, '0')
	}
	if n < 0 {
		b = append(b, '-')
		n = -n
	}
	b = strconv.AppendInt(b, n/10, 10)
	if d := n % 10; d != 0 {
		b = append(b, '.', byte('0'+d))
	}
	return b
}
