//go:build js && wasm

// Command wasm is the Fieldfit program for the browser (GOOS=js
// GOARCH=wasm): it opens the project store in IndexedDB, falling back to
// memory with a clear message when the browser refuses, and starts the
// screens in the page's <main id="app">.
package main

import (
	"context"
	"syscall/js"
	"time"

	"fieldfit/ui"
	"fieldfit/ui/store"
)

// dbName is the IndexedDB database of the app's projects.
const dbName = "fieldfit"

func main() {
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	st, err := store.OpenIndexedDB(ctx, dbName)
	cancel()
	if err != nil {
		st = store.NewMemory()
	}
	container := js.Global().Get("document").Call("getElementById", "app")
	if !container.Truthy() {
		panic("fieldfit: the page has no element with id \"app\"")
	}
	ui.RunBrowser(container, st, err)
	select {} // the app lives on in the page's callbacks
}
