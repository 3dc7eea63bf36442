//go:build js && wasm

package ui

import (
	"context"
	"errors"
	"syscall/js"

	"honnef.co/go/js/dom/v2"

	"fieldfit/ui/view"
)

// printPage opens the browser's print dialog on a fresh turn of the event
// loop, after the click that asked for it has been handled.
func printPage() {
	dom.GetWindow().SetTimeout(func() { js.Global().Call("print") }, 0)
}

// rasterPNG draws an SVG document into a canvas of w × h pixels on white
// and returns it as PNG: the SVG is loaded as an <img> from a blob: URL
// (the page's CSP allows img-src blob:), decoded, drawn, and read back
// with canvas.toBlob. It waits for the browser: call it from a goroutine.
func rasterPNG(ctx context.Context, svg []byte, w, h float64) ([]byte, error) {
	g := js.Global()
	arr := g.Get("Uint8Array").New(len(svg))
	js.CopyBytesToJS(arr, svg)
	blob := g.Get("Blob").New(g.Get("Array").New(arr), map[string]any{"type": "image/svg+xml"})
	url := g.Get("URL").Call("createObjectURL", blob)
	defer g.Get("URL").Call("revokeObjectURL", url)
	img := g.Get("Image").New()
	img.Set("src", url)
	if _, err := view.Await(ctx, img.Call("decode")); err != nil {
		return nil, errors.New("the browser could not read the plot as an image")
	}
	canvas := g.Get("document").Call("createElement", "canvas")
	canvas.Set("width", int(w))
	canvas.Set("height", int(h))
	c2d := canvas.Call("getContext", "2d")
	if !c2d.Truthy() {
		return nil, errors.New("this browser has no 2D canvas")
	}
	c2d.Set("fillStyle", "#ffffff")
	c2d.Call("fillRect", 0, 0, int(w), int(h))
	c2d.Call("drawImage", img, 0, 0, int(w), int(h))
	ch := make(chan js.Value, 1)
	cb := js.FuncOf(func(_ js.Value, args []js.Value) any {
		v := js.Null()
		if len(args) > 0 {
			v = args[0]
		}
		ch <- v
		return nil
	})
	canvas.Call("toBlob", cb, "image/png")
	var png js.Value
	select {
	case png = <-ch:
		cb.Release()
	case <-ctx.Done():
		// cb stays alive for the browser's late call.
		return nil, ctx.Err()
	}
	if !png.Truthy() {
		return nil, errors.New("the browser could not make the PNG")
	}
	buf, err := view.Await(ctx, png.Call("arrayBuffer"))
	if err != nil {
		return nil, err
	}
	out := make([]byte, png.Get("size").Int())
	js.CopyBytesToGo(out, g.Get("Uint8Array").New(buf))
	return out, nil
}
