//go:build js && wasm

package store

import (
	"context"
	"errors"
	"fmt"
	"math"
	"sync"
	"syscall/js"
	"time"

	"github.com/hack-pad/go-indexeddb/idb"
)

// The database layout of schema version 1.
const (
	projectsStore = "projects" // one object per Record, key path "id"
	metaStore     = "meta"     // out-of-line keys; schemaKey holds {version: n}
	schemaKey     = "schema"
)

// OpenIndexedDB opens the browser's IndexedDB database dbName as a Store,
// creating it when it does not exist and migrating it to the current
// schema (see Current) when it is older. It fails with an error wrapping
// ErrUnavailable when the browser offers no IndexedDB (private browsing),
// ErrBlocked when an upgrade waits for another tab to close the database,
// ErrSchemaTooNew when a newer Fieldfit wrote it, and the migration error
// (which names the record) when a record cannot be migrated; in that case
// nothing was changed.
//
// It waits for the browser, so call it from a goroutine, never from inside
// a js.FuncOf callback.
func OpenIndexedDB(ctx context.Context, dbName string) (Store, error) {
	return OpenIndexedDBSchema(ctx, dbName, Current)
}

// OpenIndexedDBSchema is OpenIndexedDB with the schema s in place of
// Current, so that tests can exercise a migration to a later version. The
// IndexedDB version of the database equals the schema version.
func OpenIndexedDBSchema(ctx context.Context, dbName string, s Schema) (st Store, err error) {
	if err := s.Check(); err != nil {
		return nil, &Error{Op: "open", Err: err}
	}
	if dbName == "" {
		return nil, &Error{Op: "open", Err: errors.New("the database name is empty")}
	}
	defer recoverJS(&err, "open", "")
	factory := js.Global().Get("indexedDB")
	if !factory.Truthy() {
		return nil, &Error{Op: "open", Err: fmt.Errorf("%w: window.indexedDB is missing", ErrUnavailable)}
	}
	target := s.Target()

	o := newOpener(factory)
	var upgradeErr error
	upgrader := func(db *idb.Database, oldVersion, newVersion uint) error {
		// This runs inside the browser's upgradeneeded event: it must not
		// wait, and an error or panic here must abort the upgrade
		// transaction rather than reach the library (which would panic).
		defer func() {
			if r := recover(); r != nil {
				upgradeErr = fmt.Errorf("upgrading the database layout from version %d: %v", oldVersion, r)
				o.abortUpgrade()
			}
		}()
		if err := upgradeLayout(db, oldVersion, target); err != nil {
			upgradeErr = fmt.Errorf("upgrading the database layout from version %d: %w", oldVersion, err)
			o.abortUpgrade()
		}
		return nil
	}
	wrapped, err := idb.WrapFactory(o.proxy)
	if err != nil {
		o.release()
		return nil, &Error{Op: "open", Err: fmt.Errorf("%w: %w", ErrUnavailable, err)}
	}
	req, err := wrapped.Open(context.Background(), dbName, uint(target), upgrader)
	if o.openErr != nil {
		o.release()
		return nil, &Error{Op: "open", Err: fmt.Errorf("%w: indexedDB.open failed: %w", ErrUnavailable, o.openErr)}
	}
	if err != nil {
		o.release()
		return nil, domError("open", "", err)
	}

	type opened struct {
		db  *idb.Database
		err error
	}
	done := make(chan opened, 1)
	go func() {
		db, err := req.Await(context.Background())
		done <- opened{db, err}
	}()
	// giveUp leaves a pending open behind: when it completes later, close
	// the connection it brings.
	giveUp := func() {
		go func() {
			if r := <-done; r.err == nil && r.db != nil {
				_ = r.db.Close()
			}
			o.release()
		}()
	}
	var res opened
	select {
	case res = <-done:
		o.release()
	case <-o.blocked:
		giveUp()
		return nil, &Error{Op: "open", Err: fmt.Errorf("%w (database %q, upgrade to version %d)", ErrBlocked, dbName, target)}
	case <-ctx.Done():
		giveUp()
		return nil, &Error{Op: "open", Err: ctx.Err()}
	}
	if upgradeErr != nil {
		return nil, &Error{Op: "open", Err: upgradeErr}
	}
	if res.err != nil {
		if domName(res.err) == domVersion {
			return nil, &Error{Op: "open", Err: fmt.Errorf("%w (database %q is newer than version %d): %w", ErrSchemaTooNew, dbName, target, res.err)}
		}
		return nil, domError("open", "", res.err)
	}
	db := res.db
	if err := migrateData(ctx, db, s); err != nil {
		_ = db.Close()
		return nil, err
	}
	return &indexedDB{db: db, name: dbName}, nil
}

// upgradeLayout creates the object stores of the layout. It runs in the
// versionchange transaction; data migrations run after the open, in
// migrateData, because they must wait for the records.
func upgradeLayout(db *idb.Database, oldVersion uint, target int) error {
	if oldVersion < 1 {
		if _, err := db.CreateObjectStore(projectsStore, idb.ObjectStoreOptions{KeyPath: js.ValueOf("id")}); err != nil {
			return fmt.Errorf("creating object store %q: %w", projectsStore, err)
		}
		meta, err := db.CreateObjectStore(metaStore, idb.ObjectStoreOptions{})
		if err != nil {
			return fmt.Errorf("creating object store %q: %w", metaStore, err)
		}
		// A new database has no records to migrate: it starts at target.
		if _, err := meta.PutKey(js.ValueOf(schemaKey), schemaValue(target)); err != nil {
			return fmt.Errorf("writing the schema version: %w", err)
		}
	}
	// A later layout that needs another object store or index adds it here,
	// under "if oldVersion < n".
	return nil
}

func schemaValue(v int) js.Value {
	o := jsObject.New()
	o.Set("version", v)
	o.Set("written", time.Now().UTC().Format(time.RFC3339))
	return o
}

// migrateData brings the records up to the schema version, in one
// readwrite transaction over both object stores: every record and the new
// version, or nothing.
func migrateData(ctx context.Context, db *idb.Database, s Schema) error {
	target := s.Target()
	txn, err := db.Transaction(idb.TransactionReadWrite, metaStore, projectsStore)
	if err != nil {
		return domError("open", "", err)
	}
	meta, err := txn.ObjectStore(metaStore)
	if err != nil {
		return domError("open", "", err)
	}
	req, err := meta.Get(js.ValueOf(schemaKey))
	if err != nil {
		return domError("open", "", err)
	}
	v, err := req.Await(ctx)
	if err != nil {
		return domError("open", "", err)
	}
	if v.Type() != js.TypeObject || v.Get("version").Type() != js.TypeNumber {
		_ = txn.Abort()
		return &Error{Op: "open", Err: fmt.Errorf("%w: the database has no schema record", ErrUnavailable)}
	}
	from := v.Get("version").Int()
	if from == target {
		return nil // the transaction commits by itself
	}
	steps, err := s.steps(from)
	if err != nil {
		_ = txn.Abort()
		return &Error{Op: "open", Err: err}
	}
	projects, err := txn.ObjectStore(projectsStore)
	if err != nil {
		return domError("open", "", err)
	}
	cursor, err := projects.OpenCursor(idb.CursorNext)
	if err != nil {
		return domError("open", "", err)
	}
	var stepErr error
	iterErr := cursor.Iter(ctx, func(c *idb.CursorWithValue) error {
		v, err := c.Value()
		if err != nil {
			stepErr = domError("migrate", "", err)
			return stepErr
		}
		r, err := decodeRecord("migrate", v)
		if err != nil {
			stepErr = err
			return err
		}
		m, err := applySteps(steps, r)
		if err != nil {
			stepErr = err
			return err
		}
		if _, err := c.Update(encodeRecord(m)); err != nil {
			stepErr = domError("migrate", r.ID, err)
			return stepErr
		}
		return nil
	})
	if stepErr != nil || iterErr != nil {
		_ = txn.Abort()
		if stepErr != nil {
			return stepErr
		}
		return domError("migrate", "", iterErr)
	}
	if _, err := meta.PutKey(js.ValueOf(schemaKey), schemaValue(target)); err != nil {
		_ = txn.Abort()
		return domError("migrate", "", err)
	}
	if err := txn.Await(ctx); err != nil {
		return domError("migrate", "", err)
	}
	return nil
}

// indexedDB is the Store on an open IndexedDB connection.
type indexedDB struct {
	db   *idb.Database
	name string

	mu     sync.Mutex
	closed bool
}

func (s *indexedDB) isClosed(op, id string) error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.closed {
		return &Error{Op: op, ID: id, Err: ErrClosed}
	}
	return nil
}

func (s *indexedDB) begin(ctx context.Context, op, id string, mode idb.TransactionMode) (*idb.Transaction, *idb.ObjectStore, error) {
	if err := ctxErr(ctx, op, id); err != nil {
		return nil, nil, err
	}
	if err := s.isClosed(op, id); err != nil {
		return nil, nil, err
	}
	opts := idb.TransactionOptions{Mode: mode}
	if mode == idb.TransactionReadWrite {
		// Confirm a write only once it is on the storage medium: a field
		// reading must survive a flat battery right after Save.
		opts.Durability = idb.DurabilityStrict
	}
	txn, err := s.db.TransactionWithOptions(opts, projectsStore)
	if err != nil {
		return nil, nil, domError(op, id, err)
	}
	st, err := txn.ObjectStore(projectsStore)
	if err != nil {
		return nil, nil, domError(op, id, err)
	}
	return txn, st, nil
}

func (s *indexedDB) List(ctx context.Context) (out []Record, err error) {
	defer recoverJS(&err, "list", "")
	_, st, err := s.begin(ctx, "list", "", idb.TransactionReadOnly)
	if err != nil {
		return nil, err
	}
	cursor, err := st.OpenCursor(idb.CursorNext)
	if err != nil {
		return nil, domError("list", "", err)
	}
	var bad []error
	err = cursor.Iter(ctx, func(c *idb.CursorWithValue) error {
		v, err := c.Value()
		if err != nil {
			return err
		}
		r, err := decodeRecord("list", v)
		if err != nil {
			bad = append(bad, err)
			return nil
		}
		out = append(out, r)
		return nil
	})
	if err != nil {
		return nil, domError("list", "", err)
	}
	SortRecords(out)
	return out, errors.Join(bad...)
}

func (s *indexedDB) Get(ctx context.Context, id string) (r Record, err error) {
	defer recoverJS(&err, "get", id)
	_, st, err := s.begin(ctx, "get", id, idb.TransactionReadOnly)
	if err != nil {
		return Record{}, err
	}
	req, err := st.Get(js.ValueOf(id))
	if err != nil {
		return Record{}, domError("get", id, err)
	}
	v, err := req.Await(ctx)
	if err != nil {
		return Record{}, domError("get", id, err)
	}
	if v.IsUndefined() {
		return Record{}, &Error{Op: "get", ID: id, Err: ErrNotFound}
	}
	return decodeRecord("get", v)
}

func (s *indexedDB) Put(ctx context.Context, r Record) (err error) {
	if err := r.Validate(); err != nil {
		return err
	}
	defer recoverJS(&err, "put", r.ID)
	txn, st, err := s.begin(ctx, "put", r.ID, idb.TransactionReadWrite)
	if err != nil {
		return err
	}
	if _, err := st.Put(encodeRecord(r)); err != nil {
		_ = txn.Abort()
		return domError("put", r.ID, err)
	}
	return s.finish(ctx, txn, "put", r.ID)
}

// PutIfRev reads the stored revision and writes r in one readwrite
// transaction: IndexedDB runs such transactions on one object store one
// after the other, also across tabs, so nothing can come between.
func (s *indexedDB) PutIfRev(ctx context.Context, r Record, rev int64) (err error) {
	if err := r.Validate(); err != nil {
		return err
	}
	defer recoverJS(&err, "put", r.ID)
	txn, st, err := s.begin(ctx, "put", r.ID, idb.TransactionReadWrite)
	if err != nil {
		return err
	}
	req, err := st.Get(js.ValueOf(r.ID))
	if err != nil {
		_ = txn.Abort()
		return domError("put", r.ID, err)
	}
	v, err := req.Await(ctx)
	if err != nil {
		_ = txn.Abort()
		return domError("put", r.ID, err)
	}
	var have int64
	if !v.IsUndefined() {
		if v.Type() != js.TypeObject || v.Get("rev").Type() != js.TypeNumber {
			_ = txn.Abort()
			return &Error{Op: "put", ID: r.ID, Field: "Rev", Err: errors.New("the stored record has no revision")}
		}
		have = int64(v.Get("rev").Float())
	}
	if have != rev {
		_ = txn.Abort()
		return &Error{Op: "put", ID: r.ID, Err: fmt.Errorf("%w (stored revision %d, read %d)", ErrConflict, have, rev)}
	}
	if _, err := st.Put(encodeRecord(r)); err != nil {
		_ = txn.Abort()
		return domError("put", r.ID, err)
	}
	return s.finish(ctx, txn, "put", r.ID)
}

func (s *indexedDB) Delete(ctx context.Context, id string) (err error) {
	defer recoverJS(&err, "delete", id)
	txn, st, err := s.begin(ctx, "delete", id, idb.TransactionReadWrite)
	if err != nil {
		return err
	}
	if _, err := st.Delete(js.ValueOf(id)); err != nil {
		_ = txn.Abort()
		return domError("delete", id, err)
	}
	return s.finish(ctx, txn, "delete", id)
}

// finish waits until the transaction has committed. If ctx ends first, it
// tries to abort the transaction, so that an abandoned write is undone
// where it has not committed yet.
func (s *indexedDB) finish(ctx context.Context, txn *idb.Transaction, op, id string) error {
	err := txn.Await(ctx)
	if err != nil && ctx.Err() != nil {
		_ = txn.Abort()
		return &Error{Op: op, ID: id, Err: ctx.Err()}
	}
	if err != nil {
		return domError(op, id, err)
	}
	return nil
}

func (s *indexedDB) Close() error {
	s.mu.Lock()
	defer s.mu.Unlock()
	if s.closed {
		return nil
	}
	s.closed = true
	if err := s.db.Close(); err != nil {
		return domError("close", "", err)
	}
	return nil
}

var (
	jsObject     = js.Global().Get("Object")
	jsUint8Array = js.Global().Get("Uint8Array")
)

// encodeRecord turns r into the object stored in IndexedDB:
// {id, name, rev, changed (RFC 3339 UTC with nanoseconds), data (Uint8Array)}.
func encodeRecord(r Record) js.Value {
	data := jsUint8Array.New(len(r.Data))
	js.CopyBytesToJS(data, r.Data)
	o := jsObject.New()
	o.Set("id", r.ID)
	o.Set("name", r.Name)
	o.Set("rev", float64(r.Rev))
	o.Set("changed", r.Changed.UTC().Format(time.RFC3339Nano))
	o.Set("data", data)
	if r.Exported != 0 {
		o.Set("exported", float64(r.Exported))
	}
	if !r.Unexported.IsZero() {
		o.Set("unexported", r.Unexported.UTC().Format(time.RFC3339Nano))
	}
	return o
}

// decodeRecord reads a stored object back. An error names the record and
// the field at fault.
func decodeRecord(op string, v js.Value) (Record, error) {
	if v.Type() != js.TypeObject {
		return Record{}, &Error{Op: op, Err: fmt.Errorf("a stored entry is a %s, not an object", v.Type())}
	}
	var r Record
	id := v.Get("id")
	if id.Type() != js.TypeString {
		return Record{}, &Error{Op: op, Field: "ID", Err: fmt.Errorf("a stored entry has an ID of type %s", id.Type())}
	}
	r.ID = id.String()
	bad := func(field, format string, args ...any) (Record, error) {
		return Record{}, &Error{Op: op, ID: r.ID, Field: field, Err: fmt.Errorf(format, args...)}
	}
	name := v.Get("name")
	if name.Type() != js.TypeString {
		return bad("Name", "stored as %s, not a string", name.Type())
	}
	r.Name = name.String()
	rev := v.Get("rev")
	if rev.Type() != js.TypeNumber {
		return bad("Rev", "stored as %s, not a number", rev.Type())
	}
	f := rev.Float()
	if f != math.Trunc(f) || f < 0 || f > MaxRev {
		return bad("Rev", "stored value %v is not a whole number in 0…%d", f, int64(MaxRev))
	}
	r.Rev = int64(f)
	changed := v.Get("changed")
	if changed.Type() != js.TypeString {
		return bad("Changed", "stored as %s, not a string", changed.Type())
	}
	t, err := time.Parse(time.RFC3339Nano, changed.String())
	if err != nil {
		return bad("Changed", "stored value %q is not an RFC 3339 time: %v", changed.String(), err)
	}
	r.Changed = t.UTC()
	data := v.Get("data")
	if !data.InstanceOf(jsUint8Array) {
		return bad("Data", "stored as %s, not a Uint8Array", data.Type())
	}
	if n := data.Length(); n > 0 {
		r.Data = make([]byte, n)
		js.CopyBytesToGo(r.Data, data)
	}
	// exported and unexported are optional (absent before the first
	// export): absent means zero.
	if ex := v.Get("exported"); !ex.IsUndefined() {
		if ex.Type() != js.TypeNumber {
			return bad("Exported", "stored as %s, not a number", ex.Type())
		}
		f := ex.Float()
		if f != math.Trunc(f) || f < 0 || f > MaxRev {
			return bad("Exported", "stored value %v is not a whole number in 0…%d", f, int64(MaxRev))
		}
		r.Exported = int64(f)
	}
	if un := v.Get("unexported"); !un.IsUndefined() {
		if un.Type() != js.TypeString {
			return bad("Unexported", "stored as %s, not a string", un.Type())
		}
		t, err := time.Parse(time.RFC3339Nano, un.String())
		if err != nil {
			return bad("Unexported", "stored value %q is not an RFC 3339 time: %v", un.String(), err)
		}
		r.Unexported = t.UTC()
	}
	return r, nil
}

// domName returns the DOMException name of err among those classify knows,
// or "".
func domName(err error) string {
	for _, n := range domNames {
		if errors.Is(err, idb.NewDOMException(n)) {
			return n
		}
	}
	// A DOMException thrown by a call (put may throw QuotaExceededError
	// at once) comes as a js.Error.
	var jsErr js.Error
	if errors.As(err, &jsErr) {
		if name := jsName(jsErr.Value); name != "" {
			for _, n := range domNames {
				if n == name {
					return n
				}
			}
		}
	}
	return ""
}

func jsName(v js.Value) (name string) {
	defer func() { _ = recover() }()
	if v.Type() == js.TypeObject {
		if n := v.Get("name"); n.Type() == js.TypeString {
			return n.String()
		}
	}
	return ""
}

// domError wraps an error of the idb library with the sentinel its
// DOMException name maps to.
func domError(op, id string, err error) error {
	var se *Error
	if errors.As(err, &se) {
		return err
	}
	return wrapDOM(op, id, domName(err), err)
}

// recoverJS turns a panic of syscall/js (a JavaScript exception thrown by
// a call) into an error, so that a browser quirk never stops the program.
func recoverJS(err *error, op, id string) {
	r := recover()
	if r == nil {
		return
	}
	if jsErr, ok := r.(js.Error); ok {
		if n := domName(jsErr); n != "" {
			*err = wrapDOM(op, id, n, jsErr)
			return
		}
		*err = &Error{Op: op, ID: id, Err: fmt.Errorf("%w: %v", ErrUnavailable, jsErr)}
		return
	}
	panic(r)
}

// opener stands between the idb library and window.indexedDB, to see what
// the library does not report: the raw open request, an exception thrown
// by indexedDB.open, and the "blocked" event.
type opener struct {
	proxy   js.Value
	req     js.Value      // the IDBOpenDBRequest, once open was called
	openErr error         // what indexedDB.open threw, if it did
	blocked chan struct{} // closed at the first "blocked" event
	funcs   []js.Func
	once    sync.Once
	rel     sync.Once
}

func newOpener(factory js.Value) *opener {
	o := &opener{blocked: make(chan struct{})}
	onBlocked := js.FuncOf(func(js.Value, []js.Value) any {
		o.once.Do(func() { close(o.blocked) })
		return nil
	})
	open := js.FuncOf(func(this js.Value, args []js.Value) (res any) {
		defer func() {
			if r := recover(); r != nil {
				o.openErr = fmt.Errorf("%v", r)
				res = js.Undefined()
			}
		}()
		a := make([]any, len(args))
		for i, v := range args {
			a[i] = v
		}
		o.req = factory.Call("open", a...)
		o.req.Call("addEventListener", "blocked", onBlocked)
		return o.req
	})
	o.funcs = []js.Func{onBlocked, open}
	o.proxy = jsObject.New()
	o.proxy.Set("open", open)
	return o
}

// abortUpgrade aborts the versionchange transaction of the open request.
func (o *opener) abortUpgrade() {
	defer func() { _ = recover() }()
	if !o.req.Truthy() {
		return
	}
	if tx := o.req.Get("transaction"); tx.Truthy() {
		tx.Call("abort")
	}
}

// release frees the Go funcs once the open request has settled.
func (o *opener) release() {
	o.rel.Do(func() {
		defer func() { _ = recover() }()
		if o.req.Truthy() {
			o.req.Call("removeEventListener", "blocked", o.funcs[0])
		}
		for _, f := range o.funcs {
			f.Release()
		}
	})
}
