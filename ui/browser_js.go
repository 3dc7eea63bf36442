//go:build js && wasm

package ui

import (
	"sync/atomic"
	"syscall/js"

	"honnef.co/go/js/dom/v2"

	"fieldfit/ui/store"
	"fieldfit/ui/view"
)

// RunBrowser starts the app in the page: it renders into container, saves
// to st (problem, if not nil, says why st is only a memory fallback), and
// saves at once when the page is hidden. It returns at once; the app lives
// on in the page's callbacks.
func RunBrowser(container js.Value, st store.Store, problem error) *App {
	var root atomic.Pointer[view.Root]
	app := NewApp(Options{
		Store:        st,
		StoreProblem: problem,
		Changed: func() {
			if r := root.Load(); r != nil {
				r.Update()
			}
		},
		Download:  share,
		Print:     printPage,
		RasterPNG: rasterPNG,
		Saved:     otherTabs.post,
		Journal:   localJournal{},
	})
	otherTabs.listen(app)
	r := view.Mount(container, app.Render, func(r *view.Root) {
		r.OnPanic = app.Recovered
		r.AfterRender = func() {
			if id := app.TakeFocus(); id != "" {
				r.Focus(id)
			}
		}
	})
	root.Store(r)
	doc := dom.GetWindow().Document()
	doc.AddEventListener("visibilitychange", false, func(dom.Event) {
		defer recoverTo(app)
		if doc.Underlying().Get("visibilityState").String() == "hidden" {
			app.FlushSave()
		}
	})
	dom.GetWindow().AddEventListener("pagehide", false, func(dom.Event) {
		defer recoverTo(app)
		app.FlushSave()
	})
	// The shell announces a downloaded release; save before the reload.
	dom.GetWindow().AddEventListener("fieldfit:update-ready", false, func(dom.Event) {
		defer recoverTo(app)
		app.FlushSave()
	})
	app.Start()
	return app
}

// tabs tells the other Fieldfit tabs and windows of this device which
// project was saved, over a BroadcastChannel (where the browser has one).
var otherTabs = newTabChannel()

type tabChannel struct{ ch js.Value }

func newTabChannel() *tabChannel {
	c := &tabChannel{}
	if bc := js.Global().Get("BroadcastChannel"); bc.Truthy() {
		c.ch = bc.New("fieldfit-projects")
	}
	return c
}

func (c *tabChannel) post(id string, rev int64) {
	if !c.ch.Truthy() {
		return
	}
	c.ch.Call("postMessage", map[string]any{"id": id, "rev": float64(rev)})
}

func (c *tabChannel) listen(app *App) {
	if !c.ch.Truthy() {
		return
	}
	c.ch.Call("addEventListener", "message", js.FuncOf(func(_ js.Value, args []js.Value) any {
		defer recoverTo(app)
		d := args[0].Get("data")
		if d.Type() == js.TypeObject && d.Get("id").Type() == js.TypeString && d.Get("rev").Type() == js.TypeNumber {
			app.OtherTabSaved(d.Get("id").String(), int64(d.Get("rev").Float()))
		}
		return nil
	}))
}

// localJournal is the Journal in window.localStorage (synchronous, so
// that it is written before a closing page goes).
type localJournal struct{}

func (localJournal) storage() (v js.Value) {
	defer func() {
		if recover() != nil {
			v = js.Undefined()
		}
	}()
	return js.Global().Get("localStorage")
}

func (j localJournal) Write(key, data string) (ok bool) {
	defer func() {
		if recover() != nil { // QuotaExceededError, or storage turned off
			ok = false
		}
	}()
	ls := j.storage()
	if !ls.Truthy() {
		return false
	}
	ls.Call("setItem", key, data)
	return true
}

func (j localJournal) Keys() (keys []string) {
	defer func() { _ = recover() }()
	ls := j.storage()
	if !ls.Truthy() {
		return nil
	}
	for i := 0; i < ls.Get("length").Int(); i++ {
		keys = append(keys, ls.Call("key", i).String())
	}
	return keys
}

func (j localJournal) Read(key string) (s string) {
	defer func() { _ = recover() }()
	ls := j.storage()
	if !ls.Truthy() {
		return ""
	}
	v := ls.Call("getItem", key)
	if v.Type() != js.TypeString {
		return ""
	}
	return v.String()
}

func (j localJournal) Remove(key string) {
	defer func() { _ = recover() }()
	if ls := j.storage(); ls.Truthy() {
		ls.Call("removeItem", key)
	}
}

func recoverTo(a *App) {
	if v := recover(); v != nil {
		a.Recovered(v)
	}
}

// share offers data as a file through the Web Share API where the
// browser can share files (tablets: navigator.canShare({files})), so that
// it can go straight to mail or a file app; elsewhere, or when sharing is
// refused, as a download. A user who cancels the share sheet gets
// nothing (AbortError), as asked.
func share(filename, mime string, data []byte) {
	nav := js.Global().Get("navigator")
	if !nav.Get("canShare").Truthy() || !nav.Get("share").Truthy() {
		download(filename, mime, data)
		return
	}
	arr := js.Global().Get("Uint8Array").New(len(data))
	js.CopyBytesToJS(arr, data)
	opts := js.Global().Get("Object").New()
	opts.Set("type", mime)
	file := js.Global().Get("File").New(js.Global().Get("Array").New(arr), filename, opts)
	what := js.Global().Get("Object").New()
	what.Set("files", js.Global().Get("Array").New(file))
	what.Set("title", filename)
	if !nav.Call("canShare", what).Truthy() {
		download(filename, mime, data)
		return
	}
	var then, fail js.Func
	release := func() { then.Release(); fail.Release() }
	then = js.FuncOf(func(js.Value, []js.Value) any { release(); return nil })
	fail = js.FuncOf(func(_ js.Value, args []js.Value) any {
		release()
		if len(args) > 0 && args[0].Truthy() && args[0].Get("name").String() == "AbortError" {
			return nil
		}
		download(filename, mime, data)
		return nil
	})
	nav.Call("share", what).Call("then", then, fail)
}

// download offers data as a file through a temporary object URL and an
// <a download> link (dom offers no Blob, so syscall/js is used here, and
// for the link too: see view.Root on dom's element wrappers).
func download(filename, mime string, data []byte) {
	arr := js.Global().Get("Uint8Array").New(len(data))
	js.CopyBytesToJS(arr, data)
	parts := js.Global().Get("Array").New(arr)
	blob := js.Global().Get("Blob").New(parts, map[string]any{"type": mime})
	url := js.Global().Get("URL").Call("createObjectURL", blob).String()
	doc := js.Global().Get("document")
	a := doc.Call("createElement", "a")
	a.Call("setAttribute", "href", url)
	a.Call("setAttribute", "download", filename)
	a.Call("setAttribute", "hidden", "")
	doc.Get("body").Call("appendChild", a)
	a.Call("click")
	a.Call("remove")
	dom.GetWindow().SetTimeout(func() { js.Global().Get("URL").Call("revokeObjectURL", url) }, 60000)
}
