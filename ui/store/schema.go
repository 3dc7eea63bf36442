package store

import (
	"errors"
	"fmt"
)

// SchemaVersion is the record layout that this build of Fieldfit writes.
// Version 1 is the first layout: one object per project with the fields of
// Record, and a meta object that holds this number.
const SchemaVersion = 1

// Migration turns a record of schema version From into one of version
// From+1. Apply must not change the ID and must not keep a reference to the
// Data it gets or returns beyond the call.
type Migration struct {
	From  int                          // the version that Apply reads; ≥ 1
	Note  string                       // what the step changes, for error messages
	Apply func(Record) (Record, error) // the step; must not be nil
}

// Schema is a record layout version together with the chain of migrations
// that brings any older database up to it.
type Schema struct {
	// Version is the layout that the store writes. If Version is 0, it is
	// defaulted to SchemaVersion.
	Version int
	// Migrations holds exactly one step for each From in 1 … Version-1, in
	// any order. It is nil for version 1.
	Migrations []Migration
}

// Current is the schema of this build: SchemaVersion, and no migrations yet.
var Current = Schema{Version: SchemaVersion}

// Target returns the version the schema writes (Version, or SchemaVersion
// when Version is 0).
func (s Schema) Target() int {
	if s.Version == 0 {
		return SchemaVersion
	}
	return s.Version
}

// Check reports whether the migration chain is complete: Target is at least
// 1, and every step from 1 to Target-1 is there once, with an Apply func.
func (s Schema) Check() error {
	v := s.Target()
	if v < 1 {
		return fmt.Errorf("store: schema version %d is below 1", v)
	}
	seen := make(map[int]bool, len(s.Migrations))
	for i, m := range s.Migrations {
		switch {
		case m.From < 1 || m.From >= v:
			return fmt.Errorf("store: migration %d (%q) reads version %d, outside 1…%d", i, m.Note, m.From, v-1)
		case seen[m.From]:
			return fmt.Errorf("store: two migrations read version %d", m.From)
		case m.Apply == nil:
			return fmt.Errorf("store: migration %d (%q) from version %d has no Apply func", i, m.Note, m.From)
		}
		seen[m.From] = true
	}
	for k := 1; k < v; k++ {
		if !seen[k] {
			return fmt.Errorf("store: no migration from version %d to %d", k, k+1)
		}
	}
	return nil
}

// steps returns the migrations that lead from version from to Target, in
// order.
func (s Schema) steps(from int) ([]Migration, error) {
	if err := s.Check(); err != nil {
		return nil, err
	}
	v := s.Target()
	switch {
	case from > v:
		return nil, fmt.Errorf("%w (stored version %d, this build reads up to %d)", ErrSchemaTooNew, from, v)
	case from < 1:
		return nil, fmt.Errorf("stored schema version %d is below 1", from)
	}
	byFrom := make(map[int]Migration, len(s.Migrations))
	for _, m := range s.Migrations {
		byFrom[m.From] = m
	}
	out := make([]Migration, 0, v-from)
	for k := from; k < v; k++ {
		out = append(out, byFrom[k])
	}
	return out, nil
}

// MigrateRecord brings one record of version from up to Target. The result
// has the same ID and passes Validate. An error names the record and step.
func (s Schema) MigrateRecord(from int, r Record) (Record, error) {
	steps, err := s.steps(from)
	if err != nil {
		return Record{}, &Error{Op: "migrate", ID: r.ID, Err: err}
	}
	return applySteps(steps, r)
}

func applySteps(steps []Migration, r Record) (Record, error) {
	id := r.ID
	cur := clone(r)
	for _, m := range steps {
		next, err := m.Apply(clone(cur))
		if err != nil {
			return Record{}, &Error{Op: "migrate", ID: id,
				Err: fmt.Errorf("step %d→%d (%s): %w", m.From, m.From+1, m.Note, err)}
		}
		if next.ID != id {
			return Record{}, &Error{Op: "migrate", ID: id, Field: "ID",
				Err: fmt.Errorf("step %d→%d (%s) changed the ID to %q", m.From, m.From+1, m.Note, next.ID)}
		}
		if err := next.Validate(); err != nil {
			var se *Error
			field := ""
			if errors.As(err, &se) {
				field = se.Field
				err = se.Err
			}
			return Record{}, &Error{Op: "migrate", ID: id, Field: field,
				Err: fmt.Errorf("step %d→%d (%s) made an invalid record: %w", m.From, m.From+1, m.Note, err)}
		}
		cur = clone(next)
	}
	return cur, nil
}

// Migrate brings every record of rs, stored under version from, up to
// Target. It is all or nothing: on the first failing record it returns nil
// and an error that names that record and step; rs is never modified.
func (s Schema) Migrate(from int, rs []Record) ([]Record, error) {
	steps, err := s.steps(from)
	if err != nil {
		return nil, &Error{Op: "migrate", Err: err}
	}
	out := make([]Record, len(rs))
	for i, r := range rs {
		m, err := applySteps(steps, r)
		if err != nil {
			return nil, err
		}
		out[i] = m
	}
	return out, nil
}
