package view

import (
	"context"
	"sort"
	"strings"
)

// SVGNS is the namespace of SVG elements.
const SVGNS = "http://www.w3.org/2000/svg"

// Node is an element or, when Tag is empty, a text node.
type Node struct {
	// Tag is the element name ("div", "input", "svg"); empty for a text
	// node.
	Tag string
	// NS is the namespace URI; empty means HTML. Children of an SVG node
	// inherit SVGNS when their NS is empty.
	NS string
	// Key tells siblings apart across renders so that an element (and
	// the focus and caret in it) is kept when rows are inserted. Siblings
	// without a key are matched by position and tag.
	Key string
	// Attrs are set with setAttribute. The attributes "value" and
	// "checked" are applied as properties of form controls instead, and
	// only when they differ from the control's current state, so that
	// typing is never disturbed.
	Attrs map[string]string
	// Text is the content of a text node, or of an element that has no
	// Children (set with textContent).
	Text string
	// Children are the child nodes, in order.
	Children []*Node
	// On maps event types ("click", "input", "keydown", "paste",
	// "pointerdown", …) to handlers.
	On map[string]Handler
}

// Handler handles one event. It must do quick work only and set
// e.Prevent to cancel the browser's default action.
type Handler func(e *Event)

// Event is what a handler learns of a browser event.
type Event struct {
	// Type is the event type, e.g. "input".
	Type string
	// Value is the value of the event's target form control, and
	// Checked its checked state.
	Value   string
	Checked bool
	// Key is KeyboardEvent.key, e.g. "Enter"; Shift tells whether Shift
	// was held.
	Key   string
	Shift bool
	// X and Y are the pointer position relative to the top-left corner of
	// the element the handler is on, in CSS pixels; Width and Height are
	// that element's size in CSS pixels.
	X, Y, Width, Height float64
	// Pasted is the plain text of a paste event.
	Pasted string
	// Files are the files chosen in an <input type="file"> (change
	// event).
	Files []File
	// Prevent, set by the handler, cancels the default action.
	Prevent bool
}

// File is a file the user chose in an <input type="file">.
type File interface {
	// Name is the file's name, without a folder.
	Name() string
	// Size is its length in bytes.
	Size() int64
	// Read returns the file's bytes, calling progress (if not nil) with
	// the number of bytes read so far. It waits for the browser, so it
	// must be called from a goroutine, never from a Handler.
	Read(ctx context.Context, progress func(done int64)) ([]byte, error)
}

// El returns an element node with the given tag, attributes as
// alternating name, value pairs, and children.
//
// El, T, TextEl and the builder methods are kept out of line
// (go:noinline): the screens call them thousands of times, and inlined
// copies made app.wasm about 70 kB (gzipped) larger.
//
//go:noinline
func El(tag string, attrs []string, children ...*Node) *Node {
	n := &Node{Tag: tag, Children: children}
	if len(attrs) > 0 {
		n.Attrs = make(map[string]string, len(attrs)/2)
		for i := 0; i+1 < len(attrs); i += 2 {
			n.Attrs[attrs[i]] = attrs[i+1]
		}
	}
	return n
}

// A is shorthand for an attribute list: A("id", "x", "class", "y").
func A(kv ...string) []string { return kv }

// T returns a text node.
//
//go:noinline
func T(s string) *Node { return &Node{Text: s} }

// TextEl returns an element holding only the text s.
//
//go:noinline
func TextEl(tag string, attrs []string, s string) *Node {
	n := El(tag, attrs)
	n.Text = s
	return n
}

// Handle sets the handler of event type typ and returns n.
//
//go:noinline
func (n *Node) Handle(typ string, h Handler) *Node {
	if n.On == nil {
		n.On = map[string]Handler{}
	}
	n.On[typ] = h
	return n
}

// Set sets attribute name and returns n.
//
//go:noinline
func (n *Node) Set(name, value string) *Node {
	if n.Attrs == nil {
		n.Attrs = map[string]string{}
	}
	n.Attrs[name] = value
	return n
}

// WithKey sets the key and returns n.
//
//go:noinline
func (n *Node) WithKey(k string) *Node { n.Key = k; return n }

// Add appends children that are not nil and returns n.
//
//go:noinline
func (n *Node) Add(children ...*Node) *Node {
	for _, c := range children {
		if c != nil {
			n.Children = append(n.Children, c)
		}
	}
	return n
}

// Walk calls f for n and every node below it, depth first, until f
// returns false.
func (n *Node) Walk(f func(*Node) bool) bool {
	if n == nil {
		return true
	}
	if !f(n) {
		return false
	}
	for _, c := range n.Children {
		if !c.Walk(f) {
			return false
		}
	}
	return true
}

// Find returns the first node for which match is true, or nil.
func (n *Node) Find(match func(*Node) bool) *Node {
	var found *Node
	n.Walk(func(m *Node) bool {
		if match(m) {
			found = m
			return false
		}
		return true
	})
	return found
}

// FindAll returns every node for which match is true.
func (n *Node) FindAll(match func(*Node) bool) []*Node {
	var all []*Node
	n.Walk(func(m *Node) bool {
		if match(m) {
			all = append(all, m)
		}
		return true
	})
	return all
}

// ByID returns the element with the given id attribute, or nil.
func (n *Node) ByID(id string) *Node {
	return n.Find(func(m *Node) bool { return m.Attrs["id"] == id })
}

// TextContent returns the text of n and its descendants, as the DOM's
// textContent would.
func (n *Node) TextContent() string {
	var b strings.Builder
	n.Walk(func(m *Node) bool {
		if m.Tag == "" || len(m.Children) == 0 {
			b.WriteString(m.Text)
		}
		return true
	})
	return b.String()
}

// Fire calls the handler of event type typ with e, if n has one, and
// reports whether it had.
func (n *Node) Fire(typ string, e *Event) bool {
	if n == nil || n.On[typ] == nil {
		return false
	}
	if e == nil {
		e = &Event{}
	}
	e.Type = typ
	n.On[typ](e)
	return true
}

// String renders the tree as indented text for test failure messages.
// It is not HTML and is never put into a page.
func (n *Node) String() string {
	var b strings.Builder
	var rec func(m *Node, depth int)
	rec = func(m *Node, depth int) {
		b.WriteString(strings.Repeat("  ", depth))
		if m.Tag == "" {
			b.WriteString("\"" + m.Text + "\"\n")
			return
		}
		b.WriteString(m.Tag)
		keys := make([]string, 0, len(m.Attrs))
		for k := range m.Attrs {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			b.WriteString(" " + k + "=" + m.Attrs[k])
		}
		if m.Text != "" && len(m.Children) == 0 {
			b.WriteString(" \"" + m.Text + "\"")
		}
		b.WriteString("\n")
		for _, c := range m.Children {
			rec(c, depth+1)
		}
	}
	rec(n, 0)
	return b.String()
}
