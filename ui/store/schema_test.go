package store_test

import (
	"errors"
	"fmt"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/store"
)

// nextSchema is a made-up version 2 that shows the migration path from the
// current layout to the next: version 2 requires a trimmed, non-empty Name.
var nextSchema = store.Schema{
	Version: store.SchemaVersion + 1,
	Migrations: []store.Migration{{
		From: 1,
		Note: "names are trimmed and never empty",
		Apply: func(r store.Record) (store.Record, error) {
			r.Name = strings.TrimSpace(r.Name)
			if r.Name == "" {
				r.Name = "Unnamed project " + r.ID
			}
			return r, nil
		},
	}},
}

func TestSchemaCheck(t *testing.T) {
	apply := func(r store.Record) (store.Record, error) { return r, nil }
	tests := []struct {
		name    string
		s       store.Schema
		wantErr string // "" means valid
	}{
		{"current", store.Current, ""},
		{"zero value", store.Schema{}, ""},
		{"next", nextSchema, ""},
		{"three steps any order", store.Schema{Version: 4, Migrations: []store.Migration{
			{From: 3, Apply: apply}, {From: 1, Apply: apply}, {From: 2, Apply: apply}}}, ""},
		{"negative version", store.Schema{Version: -1}, "below 1"},
		{"missing step", store.Schema{Version: 3, Migrations: []store.Migration{{From: 1, Apply: apply}}}, "no migration from version 2 to 3"},
		{"duplicate step", store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Apply: apply}, {From: 1, Apply: apply}}}, "two migrations read version 1"},
		{"step past target", store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Apply: apply}, {From: 2, Apply: apply}}}, "outside 1…1"},
		{"step from 0", store.Schema{Version: 2, Migrations: []store.Migration{{From: 0, Apply: apply}}}, "outside 1…1"},
		{"nil apply", store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Note: "x"}}}, "no Apply func"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			err := tt.s.Check()
			switch {
			case tt.wantErr == "" && err != nil:
				t.Fatalf("Check: %v, want nil", err)
			case tt.wantErr != "" && (err == nil || !strings.Contains(err.Error(), tt.wantErr)):
				t.Fatalf("Check: %v, want an error containing %q", err, tt.wantErr)
			}
		})
	}
}

func TestMigrateToNext(t *testing.T) {
	when := time.Date(2029, 6, 1, 12, 0, 0, 0, time.UTC)
	in := []store.Record{
		{ID: "a", Name: "  Lower meadow  ", Rev: 4, Changed: when, Data: []byte(`{"x":1}`)},
		{ID: "b", Name: "", Rev: 1, Changed: when, Data: nil},
	}
	orig := in[0].Name
	out, err := nextSchema.Migrate(1, in)
	if err != nil {
		t.Fatal(err)
	}
	if in[0].Name != orig {
		t.Errorf("Migrate changed its input: %q", in[0].Name)
	}
	want := []store.Record{
		{ID: "a", Name: "Lower meadow", Rev: 4, Changed: when, Data: []byte(`{"x":1}`)},
		{ID: "b", Name: "Unnamed project b", Rev: 1, Changed: when},
	}
	if fmt.Sprint(out) != fmt.Sprint(want) {
		t.Errorf("got %v, want %v", out, want)
	}
	// Already at the target: unchanged copies.
	same, err := nextSchema.Migrate(2, want)
	if err != nil || fmt.Sprint(same) != fmt.Sprint(want) {
		t.Errorf("Migrate from the target version: %v, %v", same, err)
	}
	// The current schema has nothing to do for version 1.
	if out, err := store.Current.Migrate(1, in); err != nil || fmt.Sprint(out) != fmt.Sprint(in) {
		t.Errorf("Current.Migrate(1): %v, %v", out, err)
	}
}

func TestMigrateChain(t *testing.T) {
	// Three steps, each appending its version to the data, must run in order.
	step := func(from int) store.Migration {
		return store.Migration{From: from, Note: fmt.Sprint("add ", from+1), Apply: func(r store.Record) (store.Record, error) {
			r.Data = append(r.Data, byte('0'+from+1))
			return r, nil
		}}
	}
	s := store.Schema{Version: 4, Migrations: []store.Migration{step(3), step(1), step(2)}}
	for from, want := range map[int]string{1: "1234", 2: "234", 3: "34", 4: "4"} {
		r, err := s.MigrateRecord(from, store.Record{ID: "x", Data: []byte{byte('0' + from)}})
		if err != nil {
			t.Fatalf("from %d: %v", from, err)
		}
		if string(r.Data) != want {
			t.Errorf("from %d: Data %q, want %q", from, r.Data, want)
		}
	}
}

func TestMigrateFailures(t *testing.T) {
	boom := errors.New("cannot read this project")
	failOn := func(id string) store.Schema {
		return store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Note: "picky", Apply: func(r store.Record) (store.Record, error) {
			if r.ID == id {
				return r, boom
			}
			return r, nil
		}}}}
	}
	in := []store.Record{{ID: "a"}, {ID: "b"}, {ID: "c"}}
	tests := []struct {
		name   string
		s      store.Schema
		from   int
		is     error
		id     string
		substr string
	}{
		{"step fails", failOn("b"), 1, boom, "b", "step 1→2 (picky)"},
		{"too new", nextSchema, 3, store.ErrSchemaTooNew, "", "stored version 3, this build reads up to 2"},
		{"below 1", nextSchema, 0, nil, "", "below 1"},
		{"ID changed", store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Note: "renames", Apply: func(r store.Record) (store.Record, error) {
			r.ID += "!"
			return r, nil
		}}}}, 1, nil, "a", `changed the ID to "a!"`},
		{"invalid result", store.Schema{Version: 2, Migrations: []store.Migration{{From: 1, Note: "negative", Apply: func(r store.Record) (store.Record, error) {
			r.Rev = -5
			return r, nil
		}}}}, 1, store.ErrInvalid, "a", "made an invalid record"},
		{"broken chain", store.Schema{Version: 3, Migrations: nextSchema.Migrations}, 1, nil, "", "no migration from version 2"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out, err := tt.s.Migrate(tt.from, in)
			if err == nil {
				t.Fatalf("Migrate: no error, got %v", out)
			}
			if out != nil {
				t.Errorf("Migrate returned records with an error: %v", out)
			}
			if tt.is != nil && !errors.Is(err, tt.is) {
				t.Errorf("error %v does not wrap %v", err, tt.is)
			}
			var se *store.Error
			if !errors.As(err, &se) || se.Op != "migrate" || se.ID != tt.id {
				t.Errorf("error %#v: want op migrate, ID %q", err, tt.id)
			}
			if !strings.Contains(err.Error(), tt.substr) {
				t.Errorf("error %q does not contain %q", err, tt.substr)
			}
		})
	}
}
