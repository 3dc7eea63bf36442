//go:build js && wasm

// Command storeprobe runs the checks of the store package against the
// browser's real IndexedDB and writes the outcome into the page, for the
// web tests: one <li data-check="name" data-ok="true|false"> per check in
// <ul id="probe-results">, then data-probe="done" on <html>.
package main

import (
	"context"
	"errors"
	"fmt"
	"strconv"
	"strings"
	"syscall/js"
	"time"

	"fieldfit/ui/store"
	"fieldfit/ui/store/storetest"
)

type result struct {
	name, detail string
	ok           bool
}

var results []result

func pass(name, format string, args ...any) {
	results = append(results, result{name: name, ok: true, detail: fmt.Sprintf(format, args...)})
}

func fail(name, format string, args ...any) {
	results = append(results, result{name: name, ok: false, detail: fmt.Sprintf(format, args...)})
}

func main() {
	go run()
	select {}
}

func run() {
	defer report()
	defer func() {
		if r := recover(); r != nil {
			fail("panic", "%v", r)
		}
	}()
	ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
	defer cancel()
	stamp := strconv.FormatInt(time.Now().UnixNano(), 36)

	conformance(ctx, "probe-conformance-"+stamp)
	persist(ctx, "probe-persist")
	migrate(ctx, "probe-migrate-"+stamp)
	migrateAtomic(ctx, "probe-atomic-"+stamp)
	tooNew(ctx, "probe-toonew-"+stamp)
	badRecord(ctx, "probe-bad-"+stamp)
	blocked(ctx, "probe-blocked-"+stamp)
	unavailable(ctx)
}

func conformance(ctx context.Context, db string) {
	s, err := store.OpenIndexedDB(ctx, db)
	if err != nil {
		fail("conformance", "open: %v", err)
		return
	}
	if err := storetest.Check(ctx, s); err != nil {
		fail("conformance", "%v", err)
		s.Close()
		return
	}
	if err := s.Close(); err != nil {
		fail("conformance", "close: %v", err)
		return
	}
	if err := storetest.CheckClosed(ctx, s); err != nil {
		fail("conformance", "%v", err)
		return
	}
	pass("conformance", "storetest.Check and CheckClosed passed on IndexedDB %q", db)
}

// persist keeps one record across page loads: the first load writes it,
// every later load finds it and counts up.
func persist(ctx context.Context, db string) {
	s, err := store.OpenIndexedDB(ctx, db)
	if err != nil {
		fail("persist", "open: %v", err)
		return
	}
	defer s.Close()
	r, err := s.Get(ctx, "kept")
	switch {
	case errors.Is(err, store.ErrNotFound):
		r = store.Record{ID: "kept", Name: "Kept across loads", Rev: 1, Changed: time.Now(), Data: []byte(`{"loads":1}`)}
		if err := s.Put(ctx, r); err != nil {
			fail("persist", "put: %v", err)
			return
		}
		pass("persist", "written rev 1")
	case err != nil:
		fail("persist", "get: %v", err)
	default:
		r.Rev++
		r.Changed = time.Now()
		if err := s.Put(ctx, r); err != nil {
			fail("persist", "put: %v", err)
			return
		}
		pass("persist", "found, now rev %d", r.Rev)
	}
}

// next is a made-up schema version 2: names are trimmed and get a "+".
func next(failOn string) store.Schema {
	return store.Schema{Version: store.SchemaVersion + 1, Migrations: []store.Migration{{
		From: 1,
		Note: "trim names and mark them",
		Apply: func(r store.Record) (store.Record, error) {
			if r.ID == failOn {
				return r, errors.New("this record cannot be migrated")
			}
			r.Name = strings.TrimSpace(r.Name) + "+"
			return r, nil
		},
	}}}
}

func seed(ctx context.Context, db string, recs ...store.Record) error {
	s, err := store.OpenIndexedDB(ctx, db)
	if err != nil {
		return fmt.Errorf("open v1: %w", err)
	}
	defer s.Close()
	for _, r := range recs {
		if err := s.Put(ctx, r); err != nil {
			return err
		}
	}
	return nil
}

func names(ctx context.Context, s store.Store) (string, error) {
	rs, err := s.List(ctx)
	if err != nil {
		return "", err
	}
	var out []string
	for _, r := range rs {
		out = append(out, r.ID+"="+r.Name)
	}
	return strings.Join(out, ","), nil
}

func migrate(ctx context.Context, db string) {
	if err := seed(ctx, db,
		store.Record{ID: "a", Name: "  North paddock  ", Rev: 3, Data: []byte("A")},
		store.Record{ID: "b", Name: "South paddock", Rev: 1, Data: []byte("B")},
	); err != nil {
		fail("migrate", "%v", err)
		return
	}
	s, err := store.OpenIndexedDBSchema(ctx, db, next(""))
	if err != nil {
		fail("migrate", "open v2: %v", err)
		return
	}
	got, err := names(ctx, s)
	s.Close()
	if err != nil {
		fail("migrate", "list: %v", err)
		return
	}
	if want := "a=North paddock+,b=South paddock+"; got != want {
		fail("migrate", "after 1→2: %s, want %s", got, want)
		return
	}
	// Opening again at version 2 must not migrate twice.
	s, err = store.OpenIndexedDBSchema(ctx, db, next(""))
	if err != nil {
		fail("migrate", "reopen v2: %v", err)
		return
	}
	got, err = names(ctx, s)
	s.Close()
	if want := "a=North paddock+,b=South paddock+"; err != nil || got != want {
		fail("migrate", "after reopening: %s, %v, want %s", got, err, want)
		return
	}
	pass("migrate", "%s", got)
}

func migrateAtomic(ctx context.Context, db string) {
	if err := seed(ctx, db,
		store.Record{ID: "a", Name: "one"},
		store.Record{ID: "b", Name: "two"},
		store.Record{ID: "c", Name: "three"},
	); err != nil {
		fail("migrate-atomic", "%v", err)
		return
	}
	_, err := store.OpenIndexedDBSchema(ctx, db, next("b"))
	var se *store.Error
	if err == nil || !errors.As(err, &se) || se.ID != "b" || se.Op != "migrate" {
		fail("migrate-atomic", "open with a failing step: %v, want a migrate error naming record b", err)
		return
	}
	s, err := store.OpenIndexedDBSchema(ctx, db, next(""))
	if err != nil {
		fail("migrate-atomic", "open with a working step: %v", err)
		return
	}
	got, err := names(ctx, s)
	s.Close()
	// One "+" each: the failed attempt left nothing half-migrated.
	if want := "a=one+,c=three+,b=two+"; err != nil || got != want {
		fail("migrate-atomic", "after retry: %s, %v, want %s", got, err, want)
		return
	}
	pass("migrate-atomic", "failed step reported %q; retry gave %s", se.Error(), got)
}

func tooNew(ctx context.Context, db string) {
	s, err := store.OpenIndexedDBSchema(ctx, db, next(""))
	if err != nil {
		fail("too-new", "open v2: %v", err)
		return
	}
	s.Close()
	_, err = store.OpenIndexedDB(ctx, db)
	if !errors.Is(err, store.ErrSchemaTooNew) {
		fail("too-new", "open v1 of a v2 database: %v, want ErrSchemaTooNew", err)
		return
	}
	pass("too-new", "%v", err)
}

// await waits for the success or error event of an IndexedDB request.
func await(ctx context.Context, req js.Value, okEvent string) (js.Value, error) {
	type out struct {
		v   js.Value
		err error
	}
	ch := make(chan out, 1)
	ok := js.FuncOf(func(js.Value, []js.Value) any {
		ch <- out{v: req.Get("result")}
		return nil
	})
	bad := js.FuncOf(func(js.Value, []js.Value) any {
		ch <- out{err: fmt.Errorf("%s", req.Get("error").Call("toString").String())}
		return nil
	})
	defer ok.Release()
	defer bad.Release()
	req.Call("addEventListener", okEvent, ok)
	req.Call("addEventListener", "error", bad)
	req.Call("addEventListener", "abort", bad)
	select {
	case o := <-ch:
		return o.v, o.err
	case <-ctx.Done():
		return js.Undefined(), ctx.Err()
	}
}

// badRecord writes an entry that is not a valid record straight into the
// object store, and checks that List returns the good ones and names the
// bad one instead of dropping it.
func badRecord(ctx context.Context, db string) {
	if err := seed(ctx, db, store.Record{ID: "good", Name: "Good"}); err != nil {
		fail("bad-record", "%v", err)
		return
	}
	conn, err := await(ctx, js.Global().Get("indexedDB").Call("open", db), "success")
	if err != nil {
		fail("bad-record", "raw open: %v", err)
		return
	}
	tx := conn.Call("transaction", "projects", "readwrite")
	entry := js.Global().Get("Object").New()
	entry.Set("id", "broken")
	entry.Set("name", 42)
	tx.Call("objectStore", "projects").Call("put", entry)
	_, err = await(ctx, tx, "complete")
	conn.Call("close")
	if err != nil {
		fail("bad-record", "raw put: %v", err)
		return
	}
	s, err := store.OpenIndexedDB(ctx, db)
	if err != nil {
		fail("bad-record", "open: %v", err)
		return
	}
	defer s.Close()
	rs, err := s.List(ctx)
	var se *store.Error
	if len(rs) != 1 || rs[0].ID != "good" || !errors.As(err, &se) || se.ID != "broken" || se.Field != "Name" {
		fail("bad-record", "List: %d records, error %v; want the good record and an error naming broken, field Name", len(rs), err)
		return
	}
	pass("bad-record", "%v", err)
}

// blocked holds a connection open that ignores versionchange, as an old
// tab might, and checks that an upgrade reports ErrBlocked.
func blocked(ctx context.Context, db string) {
	if err := seed(ctx, db, store.Record{ID: "x", Name: "x"}); err != nil {
		fail("blocked", "%v", err)
		return
	}
	conn, err := await(ctx, js.Global().Get("indexedDB").Call("open", db, store.SchemaVersion), "success")
	if err != nil {
		fail("blocked", "raw open: %v", err)
		return
	}
	_, err = store.OpenIndexedDBSchema(ctx, db, next(""))
	conn.Call("close")
	if !errors.Is(err, store.ErrBlocked) {
		fail("blocked", "upgrade while another connection is open: %v, want ErrBlocked", err)
		return
	}
	pass("blocked", "%v", err)
}

// unavailable hides window.indexedDB, as some private modes do.
func unavailable(ctx context.Context) {
	global := js.Global()
	object := global.Get("Object")
	// Chrome keeps the accessor on window itself, others on the prototype.
	orig := object.Call("getOwnPropertyDescriptor", global, "indexedDB")
	desc := object.New()
	desc.Set("value", js.Undefined())
	desc.Set("configurable", true)
	object.Call("defineProperty", global, "indexedDB", desc)
	_, err := store.OpenIndexedDB(ctx, "probe-unavailable")
	if orig.Truthy() {
		object.Call("defineProperty", global, "indexedDB", orig)
	} else {
		global.Get("Reflect").Call("deleteProperty", global, "indexedDB")
	}
	if !errors.Is(err, store.ErrUnavailable) {
		fail("unavailable", "open without indexedDB: %v, want ErrUnavailable", err)
		return
	}
	if !global.Get("indexedDB").Truthy() {
		fail("unavailable", "could not restore window.indexedDB")
		return
	}
	pass("unavailable", "%v", err)
}

// report writes the results into the page (as text, never as HTML).
func report() {
	doc := js.Global().Get("document")
	list := doc.Call("createElement", "ul")
	list.Set("id", "probe-results")
	for _, r := range results {
		li := doc.Call("createElement", "li")
		li.Call("setAttribute", "data-check", r.name)
		li.Call("setAttribute", "data-ok", strconv.FormatBool(r.ok))
		li.Set("textContent", r.name+": "+r.detail)
		list.Call("appendChild", li)
	}
	app := doc.Call("getElementById", "app")
	if !app.Truthy() {
		app = doc.Get("body")
	}
	app.Call("appendChild", list)
	doc.Get("documentElement").Call("setAttribute", "data-probe", "done")
}
