package storetest_test

import (
	"context"
	"slices"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/store"
	"fieldfit/ui/store/storetest"
)

// broken wraps the memory store and breaks one rule, to show that Check
// notices each kind of fault.
type broken struct {
	store.Store
	list         func([]store.Record) []store.Record
	put          func(store.Record) store.Record
	skipValidate bool
	alias        map[string][]byte
}

func (b *broken) List(ctx context.Context) ([]store.Record, error) {
	rs, err := b.Store.List(ctx)
	if b.list != nil {
		rs = b.list(rs)
	}
	return rs, err
}

func (b *broken) Put(ctx context.Context, r store.Record) error {
	if b.put != nil {
		r = b.put(r)
	}
	if b.skipValidate && r.Validate() != nil {
		return nil // silently accepts and drops
	}
	if b.alias != nil {
		b.alias[r.ID] = r.Data
	}
	return b.Store.Put(ctx, r)
}

func (b *broken) Get(ctx context.Context, id string) (store.Record, error) {
	r, err := b.Store.Get(ctx, id)
	if d, ok := b.alias[id]; ok && err == nil {
		r.Data = d // hands out the caller's own slice
	}
	return r, err
}

func TestCheckFindsFaults(t *testing.T) {
	tests := []struct {
		name string
		s    func() store.Store
		want string
	}{
		{"unsorted list", func() store.Store {
			return &broken{Store: store.NewMemory(), list: func(rs []store.Record) []store.Record { slices.Reverse(rs); return rs }}
		}, "List order"},
		{"milliseconds only", func() store.Store {
			return &broken{Store: store.NewMemory(), put: func(r store.Record) store.Record { r.Changed = r.Changed.Truncate(time.Millisecond); return r }}
		}, "Changed"},
		{"truncated data", func() store.Store {
			return &broken{Store: store.NewMemory(), put: func(r store.Record) store.Record {
				if len(r.Data) > 100 {
					r.Data = r.Data[:100]
				}
				return r
			}}
		}, "Data of 100 bytes"},
		{"no validation", func() store.Store { return &broken{Store: store.NewMemory(), skipValidate: true} }, "want ErrInvalid"},
		{"aliased data", func() store.Store { return &broken{Store: store.NewMemory(), alias: map[string][]byte{}} }, "Put kept the caller's slice"},
		{"lost name", func() store.Store {
			return &broken{Store: store.NewMemory(), put: func(r store.Record) store.Record { r.Name = strings.ToLower(r.Name); return r }}
		}, "Name"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := storetest.Check(context.Background(), tt.s())
			if err == nil || !strings.Contains(err.Error(), tt.want) {
				t.Fatalf("Check: %v, want an error mentioning %q", err, tt.want)
			}
		})
	}
}

func TestCheckClosedFindsOpenStore(t *testing.T) {
	s := store.NewMemory() // not closed
	if err := storetest.CheckClosed(context.Background(), s); err == nil {
		t.Fatal("CheckClosed passed a store that was never closed")
	}
}
