package store

import (
	"context"
	"fmt"
	"sync"
)

// NewMemory returns an empty Store that keeps its records in memory until
// it is closed. It follows the same rules as the IndexedDB store (copies in
// and out, Validate on Put, the List order), so code tested against it
// behaves the same in the browser.
func NewMemory() Store {
	return &memory{recs: make(map[string]Record)}
}

type memory struct {
	mu     sync.Mutex
	recs   map[string]Record
	closed bool
}

func (m *memory) check(ctx context.Context, op, id string) error {
	if err := ctxErr(ctx, op, id); err != nil {
		return err
	}
	if m.closed {
		return &Error{Op: op, ID: id, Err: ErrClosed}
	}
	return nil
}

func (m *memory) List(ctx context.Context) ([]Record, error) {
	m.mu.Lock()
	defer m.mu.Unlock()
	if err := m.check(ctx, "list", ""); err != nil {
		return nil, err
	}
	out := make([]Record, 0, len(m.recs))
	for _, r := range m.recs {
		out = append(out, clone(r))
	}
	SortRecords(out)
	return out, nil
}

func (m *memory) Get(ctx context.Context, id string) (Record, error) {
	m.mu.Lock()
	defer m.mu.Unlock()
	if err := m.check(ctx, "get", id); err != nil {
		return Record{}, err
	}
	r, ok := m.recs[id]
	if !ok {
		return Record{}, &Error{Op: "get", ID: id, Err: ErrNotFound}
	}
	return clone(r), nil
}

func (m *memory) Put(ctx context.Context, r Record) error {
	if err := r.Validate(); err != nil {
		return err
	}
	m.mu.Lock()
	defer m.mu.Unlock()
	if err := m.check(ctx, "put", r.ID); err != nil {
		return err
	}
	m.recs[r.ID] = clone(r)
	return nil
}

func (m *memory) PutIfRev(ctx context.Context, r Record, rev int64) error {
	if err := r.Validate(); err != nil {
		return err
	}
	m.mu.Lock()
	defer m.mu.Unlock()
	if err := m.check(ctx, "put", r.ID); err != nil {
		return err
	}
	if cur := m.recs[r.ID]; cur.Rev != rev {
		return &Error{Op: "put", ID: r.ID, Err: fmt.Errorf("%w (stored revision %d, read %d)", ErrConflict, cur.Rev, rev)}
	}
	m.recs[r.ID] = clone(r)
	return nil
}

func (m *memory) Delete(ctx context.Context, id string) error {
	m.mu.Lock()
	defer m.mu.Unlock()
	if err := m.check(ctx, "delete", id); err != nil {
		return err
	}
	delete(m.recs, id)
	return nil
}

func (m *memory) Close() error {
	m.mu.Lock()
	defer m.mu.Unlock()
	m.closed = true
	m.recs = nil
	return nil
}
