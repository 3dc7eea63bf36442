package project

import (
	"errors"
	"fmt"
	"reflect"
	"regexp"
	"strings"
	"testing"
	"time"
)

var t0 = time.Date(2026, 4, 7, 8, 30, 0, 0, time.UTC)

// sample builds a project with every field set (an invented site).
func sample() *Project {
	p := New("Kestrel Flats well field", USCustomary, t0)
	p.Site = "Kestrel Flats, north paddock"
	p.Thickness = Entry{Text: "40", Unit: "ft", SI: 12.192, OK: true}
	pw := Well{ID: NewID(), Name: "PW-1", Kind: Pumping, Radius: Entry{Text: "0.5", Unit: "ft", SI: 0.1524, OK: true}}
	ow := Well{ID: NewID(), Name: "OW-2", Kind: Observation, Distance: Entry{Text: "82", Unit: "ft", SI: 24.9936, OK: true},
		ScreenTop: Entry{Text: "3O", Unit: "ft"}} // a typo kept as typed
	p.Wells = []Well{pw, ow}
	p.Tests = []Test{{
		ID: NewID(), Name: "24 h constant rate", Start: t0, StartText: "2026-04-07T08:30",
		Rate:        Entry{Text: "190", Unit: "gal/min", SI: 0.011987, OK: true},
		StaticLevel: Entry{Text: "24.3", Unit: "ft", SI: 7.40664, OK: true},
		PumpingWell: pw.ID, ObservationWell: ow.ID, TimeMode: ElapsedMinutes,
		Readings: []Reading{
			{TimeText: "1", DepthText: "24.9", Elapsed: 60, Depth: 7.5895, TimeOK: true, DepthOK: true},
			{TimeText: "2", DepthText: "n/a", Elapsed: 120, TimeOK: true},
		},
		Fit: FitSettings{Model: CooperJacob, WindowStart: 600, WindowStartText: "10"},
		Result: &FitResult{Model: CooperJacob, T: Estimate{4e-3, 3.5e-3, 4.5e-3}, S: Estimate{2e-4, 1e-4, 3e-4},
			RMSE: 0.004, Iterations: 7, N: 20, Warnings: []string{"w"}, At: t0},
	}}
	p.Notes = "Pump set at 30 m."
	p.Rev = 12
	return p
}

func TestRoundTrip(t *testing.T) {
	p := sample()
	data, err := Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	q, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project:\n got %+v\nwant %+v", q, p)
	}
	if !strings.Contains(string(data), `"format": "fieldfit-project"`) || !strings.Contains(string(data), fmt.Sprintf(`"version": %d`, Version)) {
		t.Errorf("envelope missing format or version:\n%s", data)
	}
}

func TestNewID(t *testing.T) {
	re := regexp.MustCompile(`^[0-9a-f]{16}$`)
	seen := map[string]bool{}
	for range 1000 {
		id := NewID()
		if !re.MatchString(id) {
			t.Fatalf("NewID() = %q, want 16 hex digits", id)
		}
		if seen[id] {
			t.Fatalf("NewID repeated %q", id)
		}
		seen[id] = true
	}
}

func TestDuplicate(t *testing.T) {
	p := sample()
	q := p.Duplicate("Copy", t0.Add(time.Hour))
	if q.ID == p.ID || q.Name != "Copy" || q.Rev != 0 {
		t.Errorf("duplicate id/name/rev = %q %q %d", q.ID, q.Name, q.Rev)
	}
	for i := range q.Wells {
		if q.Wells[i].ID == p.Wells[i].ID {
			t.Errorf("well %d kept its id", i)
		}
	}
	qt := q.Tests[0]
	if qt.ID == p.Tests[0].ID {
		t.Error("test kept its id")
	}
	if w := q.Well(qt.ObservationWell); w == nil || w.Name != "OW-2" {
		t.Errorf("observation well reference not remapped: %v", w)
	}
	if w := q.Well(qt.PumpingWell); w == nil || w.Name != "PW-1" {
		t.Errorf("pumping well reference not remapped: %v", w)
	}
	// The copy is deep: editing it leaves the original alone.
	q.Tests[0].Readings[0].DepthText = "99"
	q.Tests[0].Result.Warnings[0] = "changed"
	if p.Tests[0].Readings[0].DepthText != "24.9" || p.Tests[0].Result.Warnings[0] != "w" {
		t.Error("duplicate shares readings or result with the original")
	}
}

func TestRemoveWell(t *testing.T) {
	p := sample()
	ow := p.Wells[1].ID
	if !p.RemoveWell(ow) {
		t.Fatal("RemoveWell returned false")
	}
	if p.Well(ow) != nil || p.Tests[0].ObservationWell != "" {
		t.Error("well or reference still there")
	}
	if p.RemoveWell("nope") {
		t.Error("RemoveWell of an unknown id returned true")
	}
}

func TestUnmarshalErrors(t *testing.T) {
	good, _ := Marshal(sample())
	tests := []struct {
		name string
		data string
		want error
	}{
		{"not json", "hello", ErrNotProject},
		{"other format", `{"format":"something-else","version":1,"project":{}}`, ErrNotProject},
		{"version zero", `{"format":"fieldfit-project","version":0,"project":{}}`, ErrNotProject},
		{"newer", `{"format":"fieldfit-project","version":99,"project":{"id":"a"}}`, ErrNewerVersion},
		{"no id", `{"format":"fieldfit-project","version":1,"project":{"name":"x"}}`, ErrInvalid},
		{"bad units", `{"format":"fieldfit-project","version":1,"project":{"id":"a","units":"cubits"}}`, ErrInvalid},
		{"bad kind", `{"format":"fieldfit-project","version":1,"project":{"id":"a","wells":[{"id":"w","kind":"dry"}]}}`, ErrInvalid},
		{"dangling well", `{"format":"fieldfit-project","version":1,"project":{"id":"a","tests":[{"id":"t","observationWell":"zz"}]}}`, ErrInvalid},
		{"wrong type", `{"format":"fieldfit-project","version":1,"project":{"id":5}}`, ErrInvalid},
		{"truncated", string(good[:len(good)/2]), ErrNotProject},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Unmarshal([]byte(tt.data))
			if !errors.Is(err, tt.want) {
				t.Fatalf("Unmarshal error = %v, want %v", err, tt.want)
			}
			var de *DecodeError
			if !errors.As(err, &de) {
				t.Errorf("error %T is not a *DecodeError", err)
			}
		})
	}
}

func TestUnmarshalFillsDefaults(t *testing.T) {
	p, err := Unmarshal([]byte(`{"format":"fieldfit-project","version":1,"project":{"id":"a","tests":[{"id":"t"}]}}`))
	if err != nil {
		t.Fatal(err)
	}
	if p.Units != SI || p.Wells == nil || p.Tests[0].Readings == nil {
		t.Errorf("defaults not filled: %+v", p)
	}
}

// TestMigrationPath runs the upgrade machinery with a made-up version 2
// that renames "notes" to "remarks" (a format change of the kind the next
// version may bring), both through a single step and a chain of two.
func TestMigrationPath(t *testing.T) {
	v1 := `{"format":"fieldfit-project","version":1,"project":{"id":"a","name":"Old","notes":"kept"}}`
	toV2 := Migration{From: 1, Upgrade: func(p map[string]any) error {
		p["remarks"] = p["notes"]
		delete(p, "notes")
		return nil
	}}
	// Version 2 reads "remarks" back into Notes in this test's world by a
	// second step that undoes the rename, so the Go type stays the same.
	toV3 := Migration{From: 2, Upgrade: func(p map[string]any) error {
		p["notes"] = p["remarks"]
		delete(p, "remarks")
		return nil
	}}
	p, err := decode([]byte(v1), 3, []Migration{toV3, toV2})
	if err != nil {
		t.Fatal(err)
	}
	if p.Notes != "kept" || p.Name != "Old" {
		t.Errorf("after migration notes=%q name=%q", p.Notes, p.Name)
	}
	// A missing step is an error, not a silent skip.
	if _, err := decode([]byte(v1), 3, []Migration{toV2}); !errors.Is(err, ErrMigration) {
		t.Errorf("missing step: err = %v, want ErrMigration", err)
	}
	// A failing step names itself.
	bad := Migration{From: 1, Upgrade: func(map[string]any) error { return errors.New("boom") }}
	if _, err := decode([]byte(v1), 2, []Migration{bad}); !errors.Is(err, ErrMigration) || !strings.Contains(err.Error(), "boom") {
		t.Errorf("failing step: err = %v", err)
	}
	// The shipped chain upgrades every older version to Version.
	for v := 1; v < Version; v++ {
		if findMigration(migrations, v) == nil {
			t.Errorf("no migration from version %d", v)
		}
	}
}

func FuzzUnmarshal(f *testing.F) {
	good, _ := Marshal(sample())
	f.Add(good)
	f.Add([]byte(`{"format":"fieldfit-project","version":1,"project":{"id":"a"}}`))
	f.Add([]byte(`{}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Unmarshal(data)
		if err != nil {
			return
		}
		// Whatever decodes must encode and decode to the same project.
		again, err := Marshal(p)
		if err != nil {
			t.Fatalf("Marshal after Unmarshal: %v", err)
		}
		q, err := Unmarshal(again)
		if err != nil {
			t.Fatalf("second Unmarshal: %v", err)
		}
		if !reflect.DeepEqual(p, q) {
			t.Fatalf("not stable:\n%+v\n%+v", p, q)
		}
	})
}
