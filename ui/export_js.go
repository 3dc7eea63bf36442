//go:build js && wasm

package ui

import (
	"context"
	"encoding/base64"
	"errors"
	"strings"
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
// with canvas.toDataURL. It waits for the browser: call it from a
// goroutine.
func rasterPNG(ctx context.Context, svg []byte, w, h float64) (png []byte, err error) {
	defer func() {
		if recover() != nil { // a JavaScript exception (a canvas the browser refuses to read)
			png, err = nil, errors.New("the browser refused to draw the plot")
		}
	}()
	g := js.Global()
	url := g.Get("URL").Call("createObjectURL", g.Get("Blob").New([]any{string(svg)}, map[string]any{"type": "image/svg+xml"}))
	defer g.Get("URL").Call("revokeObjectURL", url)
	img := g.Get("Image").New()
	img.Set("src", url)
	if _, err := view.Await(ctx, img.Call("decode")); err != nil {
		return nil, errors.New("the browser could not read the plot as an image")
	}
	canvas := g.Get("document").Call("createElement", "canvas")
	canvas.Set("width", w)
	canvas.Set("height", h)
	c := canvas.Call("getContext", "2d")
	c.Set("fillStyle", "#fff")
	c.Call("fillRect", 0, 0, w, h)
	c.Call("drawImage", img, 0, 0, w, h)
	_, data, _ := strings.Cut(canvas.Call("toDataURL", "image/png").String(), ",")
	return base64.StdEncoding.DecodeString(data)
}
