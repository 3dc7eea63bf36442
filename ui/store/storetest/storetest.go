// Package storetest checks that a store.Store keeps the rules of the store
// package, so that the memory store (in native tests) and the IndexedDB
// store (in Chromium, by the web tests) are held to the same suite.
//
// The functions return errors instead of taking a *testing.T, so that a
// js/wasm program in the browser can run them and report the result.
package storetest

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"time"

	"fieldfit/ui/store"
)

// Check runs the conformance suite on s, which must be open and empty. It
// leaves s open and empty again, and returns every failure found, joined,
// or nil.
func Check(ctx context.Context, s store.Store) error {
	c := &checker{ctx: ctx, s: s}
	c.empty()
	c.notFound("never-stored")
	c.roundTrip()
	c.order()
	c.replace()
	c.copies()
	c.invalid()
	c.deleteAll()
	return errors.Join(c.errs...)
}

// CheckClosed checks that every method of a closed store fails with an
// error wrapping store.ErrClosed. Pass a store that Close was called on.
func CheckClosed(ctx context.Context, s store.Store) error {
	var errs []error
	want := func(op string, err error) {
		if !errors.Is(err, store.ErrClosed) {
			errs = append(errs, fmt.Errorf("%s after Close: got %v, want an error wrapping ErrClosed", op, err))
		}
	}
	_, err := s.List(ctx)
	want("List", err)
	_, err = s.Get(ctx, "a")
	want("Get", err)
	want("Put", s.Put(ctx, store.Record{ID: "a"}))
	want("Delete", s.Delete(ctx, "a"))
	return errors.Join(errs...)
}

type checker struct {
	ctx  context.Context
	s    store.Store
	errs []error
}

func (c *checker) fail(format string, args ...any) {
	c.errs = append(c.errs, fmt.Errorf(format, args...))
}

// base is a fixed time of our own choosing, in a zone east of UTC, with
// nanoseconds, so that zone and precision handling both show.
var base = time.Date(2031, time.March, 14, 9, 26, 53, 589793238, time.FixedZone("UTC+5:30", 5*3600+1800))

func (c *checker) put(r store.Record) bool {
	if err := c.s.Put(c.ctx, r); err != nil {
		c.fail("Put(%q): %v", r.ID, err)
		return false
	}
	return true
}

func (c *checker) list() []store.Record {
	rs, err := c.s.List(c.ctx)
	if err != nil {
		c.fail("List: %v", err)
	}
	return rs
}

func (c *checker) empty() {
	if rs := c.list(); len(rs) != 0 {
		c.fail("List of a new store: got %d records, want 0", len(rs))
	}
}

func (c *checker) notFound(id string) {
	_, err := c.s.Get(c.ctx, id)
	if !errors.Is(err, store.ErrNotFound) {
		c.fail("Get(%q) of a missing record: got %v, want ErrNotFound", id, err)
		return
	}
	var se *store.Error
	if !errors.As(err, &se) || se.Op != "get" || se.ID != id {
		c.fail("Get(%q) of a missing record: error %#v does not name op \"get\" and the ID", id, err)
	}
}

// same compares two records the way a store must keep them.
func same(got, want store.Record) error {
	switch {
	case got.ID != want.ID:
		return fmt.Errorf("ID %q, want %q", got.ID, want.ID)
	case got.Name != want.Name:
		return fmt.Errorf("Name %q, want %q", got.Name, want.Name)
	case got.Rev != want.Rev:
		return fmt.Errorf("Rev %d, want %d", got.Rev, want.Rev)
	case !got.Changed.Equal(want.Changed):
		return fmt.Errorf("Changed %s, want %s", got.Changed.Format(time.RFC3339Nano), want.Changed.Format(time.RFC3339Nano))
	case got.Changed.Location() != time.UTC:
		return fmt.Errorf("Changed is in zone %s, want UTC", got.Changed.Location())
	case !bytes.Equal(got.Data, want.Data):
		return fmt.Errorf("Data of %d bytes differs from the %d bytes stored", len(got.Data), len(want.Data))
	}
	return nil
}

func (c *checker) get(id string, want store.Record) {
	got, err := c.s.Get(c.ctx, id)
	if err != nil {
		c.fail("Get(%q): %v", id, err)
		return
	}
	if err := same(got, want); err != nil {
		c.fail("Get(%q): %v", id, err)
	}
}

func (c *checker) roundTrip() {
	every := make([]byte, 256) // every byte value, so invalid UTF-8 too
	for i := range every {
		every[i] = byte(i)
	}
	big := bytes.Repeat([]byte(`{"t":12.5,"level":3.217},`), 1<<16) // 1.6 MB
	recs := []store.Record{
		{ID: "p-bytes", Name: "Every byte", Rev: 1, Changed: base, Data: every},
		{ID: "p-json", Name: "Ridgeway farm – obs. well Ø 150 mm", Rev: store.MaxRev, Changed: base.Add(time.Nanosecond),
			Data: []byte(`{"format":"fieldfit-project","version":1}`)},
		{ID: "p-empty", Name: "", Rev: 0, Changed: time.Time{}, Data: nil},
		{ID: "p-big", Name: "Logger file", Rev: 7, Changed: base.Add(-400 * 24 * time.Hour), Data: big},
		{ID: "ütf-8 ✓ id/with:odd chars", Name: "Odd ID", Rev: 2, Changed: base, Data: []byte{}},
	}
	for _, r := range recs {
		if !c.put(r) {
			continue
		}
		want := r
		want.Changed = r.Changed.UTC()
		if len(want.Data) == 0 {
			want.Data = nil
		}
		c.get(r.ID, want)
	}
	if got, err := c.s.Get(c.ctx, "p-empty"); err == nil && got.Data != nil {
		c.fail("Get(%q): empty Data came back as %#v, want nil", "p-empty", got.Data)
	}
	for _, r := range recs {
		if err := c.s.Delete(c.ctx, r.ID); err != nil {
			c.fail("Delete(%q): %v", r.ID, err)
		}
		c.notFound(r.ID)
	}
	if err := c.s.Delete(c.ctx, "p-bytes"); err != nil {
		c.fail("Delete of an ID no longer stored: %v, want nil", err)
	}
}

func (c *checker) order() {
	// Put in an order unlike the sorted one.
	in := []store.Record{
		{ID: "4", Name: "charlie"},
		{ID: "2", Name: "alpha"},
		{ID: "3", Name: "Bravo"},
		{ID: "1", Name: "Alpha"},
		{ID: "0", Name: "alpha"},
		{ID: "5", Name: ""},
	}
	for _, r := range in {
		r.Changed = base
		c.put(r)
	}
	// Case-folded name, then byte order of the name ("A" < "a"), then ID.
	want := []string{"5", "1", "0", "2", "3", "4"}
	rs := c.list()
	var got []string
	for _, r := range rs {
		got = append(got, r.ID)
	}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		c.fail("List order: got IDs %v, want %v", got, want)
	}
	for _, r := range in {
		if err := c.s.Delete(c.ctx, r.ID); err != nil {
			c.fail("Delete(%q): %v", r.ID, err)
		}
	}
}

func (c *checker) replace() {
	old := store.Record{ID: "p1", Name: "First name", Rev: 1, Changed: base, Data: []byte("old")}
	c.put(old)
	nw := store.Record{ID: "p1", Name: "Second name", Rev: 2, Changed: base.Add(time.Hour), Data: []byte("new")}
	c.put(nw)
	want := nw
	want.Changed = nw.Changed.UTC()
	c.get("p1", want)
	if rs := c.list(); len(rs) != 1 {
		c.fail("List after replacing one record: got %d records, want 1", len(rs))
	} else if err := same(rs[0], want); err != nil {
		c.fail("List after replace: %v", err)
	}
}

func (c *checker) copies() {
	data := []byte("original")
	r := store.Record{ID: "p2", Name: "Copies", Rev: 1, Changed: base, Data: data}
	c.put(r)
	data[0] = 'X' // the caller changes its slice after Put
	got, err := c.s.Get(c.ctx, "p2")
	if err != nil {
		c.fail("Get(%q): %v", "p2", err)
		return
	}
	if string(got.Data) != "original" {
		c.fail("Put kept the caller's slice: Data is %q after the caller changed it, want %q", got.Data, "original")
	}
	got.Data[0] = 'Y' // the caller changes what Get returned
	again, err := c.s.Get(c.ctx, "p2")
	if err != nil {
		c.fail("Get(%q): %v", "p2", err)
		return
	}
	if string(again.Data) != "original" {
		c.fail("Get returned the stored slice: Data is %q after the caller changed it, want %q", again.Data, "original")
	}
}

func (c *checker) invalid() {
	before := len(c.list())
	bad := []struct {
		r     store.Record
		field string
	}{
		{store.Record{ID: ""}, "ID"},
		{store.Record{ID: "bad\x00id"}, "ID"},
		{store.Record{ID: "bad\xffid"}, "ID"},
		{store.Record{ID: "p1", Name: "bad \xfe name"}, "Name"},
		{store.Record{ID: "p1", Rev: -1}, "Rev"},
		{store.Record{ID: "p1", Rev: store.MaxRev + 1}, "Rev"},
		{store.Record{ID: "p1", Changed: time.Date(10000, 1, 1, 0, 0, 0, 0, time.UTC)}, "Changed"},
	}
	for _, b := range bad {
		err := c.s.Put(c.ctx, b.r)
		var se *store.Error
		switch {
		case !errors.Is(err, store.ErrInvalid):
			c.fail("Put(%q, field %s bad): got %v, want ErrInvalid", b.r.ID, b.field, err)
		case !errors.As(err, &se) || se.Field != b.field:
			c.fail("Put(%q): error %v does not name field %s", b.r.ID, err, b.field)
		}
	}
	if after := len(c.list()); after != before {
		c.fail("refused Puts changed the store: %d records before, %d after", before, after)
	}
	// p1 must still hold what replace() stored.
	if got, err := c.s.Get(c.ctx, "p1"); err != nil || string(got.Data) != "new" {
		c.fail("a refused Put changed record p1: got %q, %v", got.Data, err)
	}
}

func (c *checker) deleteAll() {
	for _, r := range c.list() {
		if err := c.s.Delete(c.ctx, r.ID); err != nil {
			c.fail("Delete(%q): %v", r.ID, err)
		}
	}
	c.empty()
}
