package store_test

import (
	"context"
	"errors"
	"strings"
	"sync"
	"testing"
	"time"

	"fieldfit/ui/store"
	"fieldfit/ui/store/storetest"
)

func TestMemoryConformance(t *testing.T) {
	ctx := context.Background()
	s := store.NewMemory()
	if err := storetest.Check(ctx, s); err != nil {
		t.Fatal(err)
	}
	if err := s.Close(); err != nil {
		t.Fatal(err)
	}
	if err := storetest.CheckClosed(ctx, s); err != nil {
		t.Fatal(err)
	}
}

func TestMemoryCanceledContext(t *testing.T) {
	s := store.NewMemory()
	defer s.Close()
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if err := s.Put(ctx, store.Record{ID: "a"}); !errors.Is(err, context.Canceled) {
		t.Errorf("Put with a canceled context: got %v, want context.Canceled", err)
	}
	if _, err := s.List(ctx); !errors.Is(err, context.Canceled) {
		t.Errorf("List with a canceled context: got %v, want context.Canceled", err)
	}
	if _, err := s.Get(ctx, "a"); !errors.Is(err, context.Canceled) {
		t.Errorf("Get with a canceled context: got %v, want context.Canceled", err)
	}
	if err := s.Delete(ctx, "a"); !errors.Is(err, context.Canceled) {
		t.Errorf("Delete with a canceled context: got %v, want context.Canceled", err)
	}
	if rs, _ := s.List(context.Background()); len(rs) != 0 {
		t.Errorf("a Put with a canceled context stored %d records", len(rs))
	}
}

// TestMemoryConcurrent runs Puts, Gets and Lists from several goroutines;
// with -race it finds unguarded access.
func TestMemoryConcurrent(t *testing.T) {
	s := store.NewMemory()
	defer s.Close()
	ctx := context.Background()
	var wg sync.WaitGroup
	for g := range 4 {
		wg.Go(func() {
			for i := range 50 {
				id := string(rune('a'+g)) + "-" + string(rune('0'+i%10))
				if err := s.Put(ctx, store.Record{ID: id, Name: id, Rev: int64(i), Data: []byte{byte(i)}}); err != nil {
					t.Error(err)
					return
				}
				if _, err := s.Get(ctx, id); err != nil {
					t.Error(err)
					return
				}
				if _, err := s.List(ctx); err != nil {
					t.Error(err)
					return
				}
			}
		})
	}
	wg.Wait()
	rs, err := s.List(ctx)
	if err != nil {
		t.Fatal(err)
	}
	if len(rs) != 40 {
		t.Errorf("got %d records, want 40 (4 goroutines × 10 IDs)", len(rs))
	}
}

func TestValidate(t *testing.T) {
	ok := store.Record{ID: "p", Name: "Name", Rev: 3, Changed: time.Now()}
	tests := []struct {
		name  string
		edit  func(*store.Record)
		field string // "" means valid
	}{
		{"valid", func(*store.Record) {}, ""},
		{"zero time", func(r *store.Record) { r.Changed = time.Time{} }, ""},
		{"max rev", func(r *store.Record) { r.Rev = store.MaxRev }, ""},
		{"longest ID", func(r *store.Record) { r.ID = strings.Repeat("x", store.MaxIDLen) }, ""},
		{"invalid UTF-8 in Data", func(r *store.Record) { r.Data = []byte{0xff, 0xfe} }, ""},
		{"empty ID", func(r *store.Record) { r.ID = "" }, "ID"},
		{"long ID", func(r *store.Record) { r.ID = strings.Repeat("x", store.MaxIDLen+1) }, "ID"},
		{"tab in ID", func(r *store.Record) { r.ID = "a\tb" }, "ID"},
		{"DEL in ID", func(r *store.Record) { r.ID = "a\x7fb" }, "ID"},
		{"bad UTF-8 ID", func(r *store.Record) { r.ID = "a\xc3" }, "ID"},
		{"bad UTF-8 Name", func(r *store.Record) { r.Name = "\xed\xa0\x80" }, "Name"},
		{"negative Rev", func(r *store.Record) { r.Rev = -1 }, "Rev"},
		{"Rev past 2^53-1", func(r *store.Record) { r.Rev = store.MaxRev + 1 }, "Rev"},
		{"year 10000", func(r *store.Record) { r.Changed = time.Date(10000, 1, 1, 0, 0, 0, 0, time.UTC) }, "Changed"},
		{"year -1", func(r *store.Record) { r.Changed = time.Date(-1, 12, 31, 0, 0, 0, 0, time.UTC) }, "Changed"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := ok
			tt.edit(&r)
			err := r.Validate()
			if tt.field == "" {
				if err != nil {
					t.Fatalf("Validate: %v, want nil", err)
				}
				return
			}
			if !errors.Is(err, store.ErrInvalid) {
				t.Fatalf("Validate: %v, want ErrInvalid", err)
			}
			var se *store.Error
			if !errors.As(err, &se) || se.Field != tt.field || se.Op != "put" {
				t.Fatalf("Validate: %#v, want op put, field %s", err, tt.field)
			}
		})
	}
}

func TestErrorMessage(t *testing.T) {
	tests := []struct {
		err  *store.Error
		want string
	}{
		{&store.Error{Op: "get", ID: "p7", Err: store.ErrNotFound}, `store: get "p7": no such project in the store`},
		{&store.Error{Op: "put", ID: "p7", Field: "Rev", Err: errors.New("x")}, `store: put "p7", field Rev: x`},
		{&store.Error{Op: "open", Err: store.ErrBlocked}, `store: open: ` + store.ErrBlocked.Error()},
		{&store.Error{Op: "list"}, `store: list: unknown error`},
	}
	for _, tt := range tests {
		if got := tt.err.Error(); got != tt.want {
			t.Errorf("got %q, want %q", got, tt.want)
		}
	}
}

func TestSortRecords(t *testing.T) {
	rs := []store.Record{
		{ID: "z", Name: "Éclair"},
		{ID: "y", Name: "éclair"},
		{ID: "x", Name: "eclair"},
		{ID: "w", Name: "ECLAIR"},
		{ID: "v", Name: "Kelvin"},
		{ID: "u", Name: "\u212aelvin"}, // KELVIN SIGN folds with k
		{ID: "t", Name: "kelvin"},
	}
	store.SortRecords(rs)
	var got []string
	for _, r := range rs {
		got = append(got, r.ID)
	}
	// Folded code points decide first: e (U+0065) < k (U+006B) < é
	// (U+00E9), so the accented group comes last; within a fold group the
	// bytes decide ("ECLAIR" < "eclair", "K" < "k" < KELVIN SIGN).
	want := "w x v t u z y"
	if strings.Join(got, " ") != want {
		t.Errorf("got %v, want %v", got, want)
	}
}

// FuzzSortOrder checks that the List order is a strict total order on
// (Name, ID): antisymmetric, and equal only for equal keys.
func FuzzSortOrder(f *testing.F) {
	f.Add("Alpha", "1", "alpha", "2")
	f.Add("", "a", "", "b")
	f.Add("\u212a", "k", "k", "k")
	f.Add("a\xff", "1", "a\xfe", "1")
	f.Fuzz(func(t *testing.T, n1, id1, n2, id2 string) {
		a := store.Record{ID: id1, Name: n1}
		b := store.Record{ID: id2, Name: n2}
		ab := []store.Record{a, b}
		ba := []store.Record{b, a}
		store.SortRecords(ab)
		store.SortRecords(ba)
		if ab[0].ID != ba[0].ID || ab[0].Name != ba[0].Name {
			if !(n1 == n2 && id1 == id2) {
				t.Fatalf("order depends on input order: %q/%q vs %q/%q", ab[0].Name, ab[0].ID, ba[0].Name, ba[0].ID)
			}
		}
	})
}

func TestMemoryPutIfRev(t *testing.T) {
	ctx := context.Background()
	s := store.NewMemory()
	c := s.(store.Conditional)
	r := store.Record{ID: "p1", Name: "Ruff Point", Rev: 1, Data: []byte("a")}
	if err := c.PutIfRev(ctx, r, 0); err != nil {
		t.Fatal(err)
	}
	r.Rev, r.Data = 2, []byte("b")
	if err := c.PutIfRev(ctx, r, 0); !errors.Is(err, store.ErrConflict) {
		t.Errorf("stale write: err = %v, want store.ErrConflict", err)
	}
	if got, _ := s.Get(ctx, "p1"); string(got.Data) != "a" {
		t.Errorf("a refused write changed the record to %q", got.Data)
	}
	if err := c.PutIfRev(ctx, r, 1); err != nil {
		t.Errorf("write on the revision read: %v", err)
	}
}
