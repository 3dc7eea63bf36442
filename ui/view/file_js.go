//go:build js && wasm

package view

import (
	"context"
	"errors"
	"syscall/js"
)

// readChunk is how much of a file is read into Go at a time: small
// enough for frequent progress, large enough for few round trips.
const readChunk = 4 << 20

// jsFile is a File of the page's File API.
type jsFile struct{ v js.Value }

func (f jsFile) Name() string { return f.v.Get("name").String() }

func (f jsFile) Size() int64 { return int64(f.v.Get("size").Float()) }

// Read reads the file slice by slice with Blob.arrayBuffer(), awaiting
// each promise, and copies the bytes into Go.
func (f jsFile) Read(ctx context.Context, progress func(done int64)) ([]byte, error) {
	size := f.Size()
	out := make([]byte, size)
	u8 := js.Global().Get("Uint8Array")
	for off := int64(0); off < size; off += readChunk {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		end := min(off+readChunk, size)
		buf, err := await(ctx, f.v.Call("slice", float64(off), float64(end)).Call("arrayBuffer"))
		if err != nil {
			return nil, err
		}
		if n := js.CopyBytesToGo(out[off:end], u8.New(buf)); int64(n) != end-off {
			return nil, errors.New("the browser gave fewer bytes than the file's size")
		}
		if progress != nil {
			progress(end)
		}
	}
	return out, nil
}

// await waits for a promise to settle.
func await(ctx context.Context, p js.Value) (js.Value, error) {
	type result struct {
		v   js.Value
		err error
	}
	ch := make(chan result, 1)
	ok := js.FuncOf(func(_ js.Value, args []js.Value) any {
		var v js.Value
		if len(args) > 0 {
			v = args[0]
		}
		ch <- result{v: v}
		return nil
	})
	fail := js.FuncOf(func(_ js.Value, args []js.Value) any {
		msg := "the browser could not read the file"
		if len(args) > 0 && args[0].Truthy() {
			msg += ": " + args[0].Call("toString").String()
		}
		ch <- result{err: errors.New(msg)}
		return nil
	})
	p.Call("then", ok, fail)
	select {
	case r := <-ch:
		ok.Release()
		fail.Release()
		return r.v, r.err
	case <-ctx.Done():
		// The callbacks stay alive for the promise's late settling.
		return js.Undefined(), ctx.Err()
	}
}

// Await waits for the promise p to settle and returns its value, or an
// error when it is rejected or ctx ends first. It blocks: call it from a
// goroutine, never from a Handler.
func Await(ctx context.Context, p js.Value) (js.Value, error) { return await(ctx, p) }
