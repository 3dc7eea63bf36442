//go:build js && wasm

package view

import (
	"fmt"
	"syscall/js"

	"honnef.co/go/js/dom/v2"
)

// Root keeps a container element in step with the trees that a render
// function returns.
//
// The window-level services (timers) go through honnef.co/go/js/dom; the
// nodes it creates and patches are plain js.Values. dom's element wrappers
// switch over every HTML element type on each call, which both slows a
// table re-rendered on each keystroke and links every element type's
// methods into app.wasm (about a seventh of its code).
type Root struct {
	doc       js.Value
	container js.Value
	render    func() *Node
	top       *mounted
	pending   bool
	flushing  bool
	// OnPanic, if set, is called with the value of a panic recovered in
	// an event handler or a render.
	OnPanic func(v any)
	// AfterRender, if set, runs after every render (for focus moves).
	AfterRender func()
}

// mounted is a node of the live document together with the Node it was
// last patched from.
type mounted struct {
	n     *Node
	ns    string
	el    js.Value
	kids  []*mounted
	funcs map[string]js.Func
}

// Mount renders into container, after the children it already has, and
// returns the Root; call Update to render again. OnPanic and AfterRender
// may be set before the first render through opts.
func Mount(container js.Value, render func() *Node, opts ...func(*Root)) *Root {
	r := &Root{doc: js.Global().Get("document"), container: container, render: render}
	for _, o := range opts {
		o(r)
	}
	r.Flush()
	return r
}

// Update schedules a render on a fresh turn of the event loop; several
// calls before it runs give one render. It may be called from any
// goroutine.
func (r *Root) Update() {
	if r.pending {
		return
	}
	r.pending = true
	dom.GetWindow().SetTimeout(r.Flush, 0)
}

// Flush renders now.
func (r *Root) Flush() {
	if r.flushing {
		// An event fired by the render itself (a focus move): render
		// again afterwards.
		r.Update()
		return
	}
	r.pending = false
	r.flushing = true
	defer func() { r.flushing = false }()
	defer r.recover("render")
	n := r.render()
	if r.top == nil {
		r.top = r.create(n, "")
		r.container.Call("appendChild", r.top.el)
	} else if !r.sameKind(r.top, n, "") {
		old := r.top
		r.top = r.create(n, "")
		r.container.Call("replaceChild", r.top.el, old.el)
		r.release(old)
	} else {
		r.patch(r.top, n)
	}
	if r.AfterRender != nil {
		r.AfterRender()
	}
}

// Focus moves the keyboard focus to the element with the given id and
// selects its text, if it is an input.
func (r *Root) Focus(id string) {
	v := r.doc.Call("getElementById", id)
	if !v.Truthy() {
		return
	}
	v.Call("focus")
	if v.Get("select").Type() == js.TypeFunction {
		v.Call("select")
	}
}

func (r *Root) recover(where string) {
	if v := recover(); v != nil {
		if r.OnPanic != nil {
			r.OnPanic(fmt.Sprintf("%s: %v", where, v))
		} else {
			js.Global().Get("console").Call("error", fmt.Sprintf("fieldfit %s: %v", where, v))
		}
	}
}

func nsFor(n *Node, parentNS string) string {
	switch {
	case n.NS != "":
		return n.NS
	case n.Tag == "svg" || parentNS == SVGNS:
		return SVGNS
	}
	return ""
}

func (r *Root) sameKind(m *mounted, n *Node, parentNS string) bool {
	return m.n.Tag == n.Tag && m.ns == nsFor(n, parentNS) && m.n.Key == n.Key
}

func (r *Root) create(n *Node, parentNS string) *mounted {
	m := &mounted{n: &Node{Tag: n.Tag, Key: n.Key}}
	if n.Tag == "" {
		m.el = r.doc.Call("createTextNode", n.Text)
		m.n = n
		return m
	}
	m.ns = nsFor(n, parentNS)
	if m.ns == "" {
		m.el = r.doc.Call("createElement", n.Tag)
	} else {
		m.el = r.doc.Call("createElementNS", m.ns, n.Tag)
	}
	r.patch(m, n)
	return m
}

// patch brings m (an element of the same tag, namespace and key as n)
// in line with n.
func (r *Root) patch(m *mounted, n *Node) {
	old := m.n
	m.n = n
	if n.Tag == "" {
		if old.Text != n.Text {
			m.el.Set("textContent", n.Text)
		}
		return
	}
	el := m.el
	for k := range old.Attrs {
		if _, ok := n.Attrs[k]; !ok {
			switch k {
			case "value":
				// leave the control's value as the user has it
			case "checked":
				el.Set("checked", false)
			default:
				el.Call("removeAttribute", k)
			}
		}
	}
	for k, v := range n.Attrs {
		if k == "value" || k == "checked" {
			continue
		}
		if ov, ok := old.Attrs[k]; !ok || ov != v {
			el.Call("setAttribute", k, v)
		}
	}
	// Children.
	if len(n.Children) == 0 {
		if len(m.kids) > 0 {
			for _, k := range m.kids {
				r.release(k)
			}
			m.kids = nil
			el.Set("textContent", n.Text)
		} else if old.Text != n.Text {
			el.Set("textContent", n.Text)
		}
	} else {
		if len(m.kids) == 0 && old.Text != "" {
			el.Set("textContent", "")
		}
		r.patchChildren(m, n.Children)
	}
	// Properties after children, so that a select has its options.
	u := el
	if v, ok := n.Attrs["value"]; ok {
		if u.Get("value").String() != v {
			u.Set("value", v)
		}
	}
	if v, ok := n.Attrs["checked"]; ok {
		want := v == "true"
		if u.Get("checked").Bool() != want {
			u.Set("checked", want)
		}
	}
	// Listeners: one js.Func per event type, looking up the current
	// handler when it fires.
	for typ, f := range m.funcs {
		if n.On[typ] == nil {
			m.el.Call("removeEventListener", typ, f)
			f.Release()
			delete(m.funcs, typ)
		}
	}
	for typ := range n.On {
		if _, ok := m.funcs[typ]; ok {
			continue
		}
		if m.funcs == nil {
			m.funcs = map[string]js.Func{}
		}
		f := r.listener(m, typ)
		m.el.Call("addEventListener", typ, f)
		m.funcs[typ] = f
	}
}

func keyOf(n *Node, i int) string {
	if n.Key != "" {
		return "k:" + n.Key
	}
	return fmt.Sprintf("i:%d:%s", i, n.Tag)
}

func (r *Root) patchChildren(m *mounted, kids []*Node) {
	parent := m.el
	old := make(map[string]*mounted, len(m.kids))
	for i, k := range m.kids {
		old[keyOf(k.n, i)] = k
	}
	next := make([]*mounted, len(kids))
	for i, c := range kids {
		k := keyOf(c, i)
		if om, ok := old[k]; ok && r.sameKind(om, c, m.ns) {
			delete(old, k)
			r.patch(om, c)
			next[i] = om
		} else {
			next[i] = r.create(c, m.ns)
		}
	}
	for _, om := range old {
		parent.Call("removeChild", om.el)
		r.release(om)
	}
	// Put the children in order, from the end, unless they already are:
	// the same elements in the same order as before.
	same := len(next) == len(m.kids)
	for i := 0; same && i < len(next); i++ {
		same = next[i] == m.kids[i]
	}
	if !same {
		pv := parent
		after := js.Null()
		for i := len(next) - 1; i >= 0; i-- {
			el := next[i].el
			if !el.Get("parentNode").Equal(pv) || !el.Get("nextSibling").Equal(after) {
				pv.Call("insertBefore", el, after)
			}
			after = el
		}
	}
	m.kids = next
}

// release frees the listeners of m and its descendants.
func (r *Root) release(m *mounted) {
	for typ, f := range m.funcs {
		m.el.Call("removeEventListener", typ, f)
		f.Release()
	}
	m.funcs = nil
	for _, k := range m.kids {
		r.release(k)
	}
}

// listener returns the js.Func that m holds for events of type typ: it
// does quick work only (the handler and a render); handlers start
// goroutines for anything slow.
func (r *Root) listener(m *mounted, typ string) js.Func {
	return js.FuncOf(func(_ js.Value, args []js.Value) any {
		defer r.recover(typ)
		h := m.n.On[typ]
		if h == nil || len(args) == 0 {
			return nil
		}
		ev := args[0]
		e := readEvent(ev, typ)
		h(e)
		if e.Prevent {
			ev.Call("preventDefault")
		}
		r.Flush()
		return nil
	})
}

func readEvent(v js.Value, typ string) *Event {
	e := &Event{Type: typ}
	if t := v.Get("target"); t.Truthy() {
		if val := t.Get("value"); val.Type() == js.TypeString {
			e.Value = val.String()
		}
		if c := t.Get("checked"); c.Type() == js.TypeBoolean {
			e.Checked = c.Bool()
		}
	}
	if k := v.Get("key"); k.Type() == js.TypeString {
		e.Key = k.String()
	}
	if s := v.Get("shiftKey"); s.Type() == js.TypeBoolean {
		e.Shift = s.Bool()
	}
	if cx := v.Get("clientX"); cx.Type() == js.TypeNumber {
		if ct := v.Get("currentTarget"); ct.Truthy() {
			rect := ct.Call("getBoundingClientRect")
			e.X = cx.Float() - rect.Get("left").Float()
			e.Y = v.Get("clientY").Float() - rect.Get("top").Float()
			e.Width = rect.Get("width").Float()
			e.Height = rect.Get("height").Float()
			if typ == "pointerdown" && ct.Get("setPointerCapture").Type() == js.TypeFunction {
				if id := v.Get("pointerId"); id.Type() == js.TypeNumber {
					ct.Call("setPointerCapture", id)
				}
			}
		}
	}
	if typ == "change" {
		if t := v.Get("target"); t.Truthy() && t.Get("type").String() == "file" {
			if fs := t.Get("files"); fs.Truthy() {
				for i := 0; i < fs.Get("length").Int(); i++ {
					e.Files = append(e.Files, jsFile{fs.Index(i)})
				}
			}
		}
	}
	if typ == "paste" {
		if cd := v.Get("clipboardData"); cd.Truthy() {
			e.Pasted = cd.Call("getData", "text/plain").String()
		}
	}
	return e
}
