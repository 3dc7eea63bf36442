package project

import (
	"errors"
	"fmt"
	"os"
	"reflect"
	"strconv"
	"strings"
	"testing"
	"time"
)

// TestVersion2File reads the version 2 fixture
// (testdata/project/v2-kestrel-flats-logger.fieldfit.json, written by
// Marshal at format version 2, commit fafb490, from withLogger() with
// fixed IDs plus sample()'s tape test): everything comes through, and
// the details, each well and each test get a revision record of one
// change at the project's last-changed time.
func TestVersion2File(t *testing.T) {
	data, err := os.ReadFile("../../testdata/project/v2-kestrel-flats-logger.fieldfit.json")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(data), `"version": 2`) || strings.Contains(string(data), `"stamp"`) {
		t.Fatal("the fixture is not a version 2 file")
	}
	p, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	want := withLogger()
	if len(p.Tests) != 2 || len(p.Wells) != 2 {
		t.Fatalf("project after migration: %d wells, %d tests", len(p.Wells), len(p.Tests))
	}
	if !reflect.DeepEqual(p.Tests[0].Logger, want.Tests[0].Logger) || p.Tests[0].Source != FromLogger {
		t.Errorf("logger records after migration:\n got %+v\nwant %+v", p.Tests[0].Logger, want.Tests[0].Logger)
	}
	if !reflect.DeepEqual(p.Tests[1].Readings, want.Tests[0].Readings) {
		t.Errorf("tape readings after migration: %+v", p.Tests[1].Readings)
	}
	one := Stamp{Rev: 1, Changed: t0}
	if !reflect.DeepEqual(p.Details, one) {
		t.Errorf("details stamp %+v, want %+v", p.Details, one)
	}
	for i := range p.Wells {
		if !reflect.DeepEqual(p.Wells[i].Stamp, one) {
			t.Errorf("well %d stamp %+v, want %+v", i+1, p.Wells[i].Stamp, one)
		}
	}
	for i := range p.Tests {
		if !reflect.DeepEqual(p.Tests[i].Stamp, one) {
			t.Errorf("test %d stamp %+v, want %+v", i+1, p.Tests[i].Stamp, one)
		}
	}
	again, err := Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(again), fmt.Sprintf(`"version": %d`, Version)) {
		t.Errorf("a migrated project is not written as version %d", Version)
	}
	if q, err := Unmarshal(again); err != nil || !reflect.DeepEqual(p, q) {
		t.Errorf("the migrated project does not read back the same: %v", err)
	}
	// A version 2 file cannot hold revision records.
	bad := strings.Replace(string(data), `"kind": "pumping",`, `"kind": "pumping", "stamp": {"rev": 4},`, 1)
	if _, err := Unmarshal([]byte(bad)); !errors.Is(err, ErrMigration) {
		t.Errorf("version 2 file with a stamp: err = %v, want ErrMigration", err)
	}
}

func TestUnmarshalFile(t *testing.T) {
	a, b := sample(), withLogger()
	b.ID = NewID()
	all, err := MarshalAll([]*Project{a, b})
	if err != nil {
		t.Fatal(err)
	}
	ps, err := UnmarshalFile(all)
	if err != nil {
		t.Fatal(err)
	}
	if len(ps) != 2 || !reflect.DeepEqual(ps[0], a) || !reflect.DeepEqual(ps[1], b) {
		t.Errorf("UnmarshalFile of two projects: %d projects, first equal %v", len(ps), len(ps) > 0 && reflect.DeepEqual(ps[0], a))
	}
	one, _ := Marshal(a)
	if ps, err := UnmarshalFile(one); err != nil || len(ps) != 1 || !reflect.DeepEqual(ps[0], a) {
		t.Errorf("UnmarshalFile of one project: %v", err)
	}
	if _, err := Unmarshal(all); !errors.Is(err, ErrInvalid) {
		t.Errorf("Unmarshal of a file of two projects: err = %v, want ErrInvalid", err)
	}
	twice, _ := MarshalAll([]*Project{a, a})
	big := make([]byte, MaxFileSize+1)
	for _, tt := range []struct {
		name, data string
		want       error
		says       string
	}{
		{"twice", string(twice), ErrInvalid, "appears twice"},
		{"too large", string(big), ErrTooLarge, "200 MB"},
		{"both", `{"format":"fieldfit-project","version":3,"project":{"id":"a"},"projects":[{"id":"b"}]}`, ErrInvalid, "both"},
		{"none", `{"format":"fieldfit-project","version":3}`, ErrInvalid, "no project"},
		{"list in v2", `{"format":"fieldfit-project","version":2,"projects":[{"id":"b"}]}`, ErrInvalid, "version 3"},
		{"bad second", `{"format":"fieldfit-project","version":3,"projects":[{"id":"a"},{"id":"b","units":"cubits"}]}`, ErrInvalid, "projects[1]"},
		{"newer", `{"format":"fieldfit-project","version":4,"projects":[{"id":"b"}]}`, ErrNewerVersion, "reads up to version 3"},
		{"long name", `{"format":"fieldfit-project","version":3,"project":{"id":"a","name":"` + strings.Repeat("x", MaxNameLen+1) + `"}}`, ErrInvalid, "characters long"},
		{"control in id", `{"format":"fieldfit-project","version":3,"project":{"id":"a\u0007"}}`, ErrInvalid, "control character"},
		{"negative stamp", `{"format":"fieldfit-project","version":3,"project":{"id":"a","wells":[{"id":"w","kind":"pumping","stamp":{"rev":-1,"changed":"2026-01-01T00:00:00Z"}}]}}`, ErrInvalid, "well 1"},
		{"count too large", `{"format":"fieldfit-project","version":3,"project":{"id":"a","details":{"rev":1,"changed":"2026-01-01T00:00:00Z","by":{"s1":9007199254740992}}}}`, ErrInvalid, "change count"},
		{"year past 9999 in UTC", `{"format":"fieldfit-project","version":3,"project":{"id":"a","changed":"9999-12-31T23:59:59-23:00"}}`, ErrInvalid, "years 0–9999"},
		{"unknown kind", `{"format":"fieldfit-project","version":3,"project":{"id":"a","tests":[{"id":"t","kind":"dowsing"}]}}`, ErrInvalid, "dowsing"},
	} {
		t.Run(tt.name, func(t *testing.T) {
			_, err := UnmarshalFile([]byte(tt.data))
			if !errors.Is(err, tt.want) || !strings.Contains(err.Error(), tt.says) {
				t.Errorf("err = %v, want %v saying %q", err, tt.want, tt.says)
			}
		})
	}
}

func TestStampCompare(t *testing.T) {
	s := func(kv ...any) Stamp {
		st := Stamp{By: map[string]int64{}}
		for i := 0; i < len(kv); i += 2 {
			st.By[kv[i].(string)] = int64(kv[i+1].(int))
		}
		return st
	}
	for _, tt := range []struct {
		name string
		a, b Stamp
		want Order
	}{
		{"both empty", Stamp{}, Stamp{}, Same},
		{"equal", s("x", 2, "y", 1), s("y", 1, "x", 2), Same},
		{"older by count", s("x", 1), s("x", 2), Older},
		{"older by session", s("x", 1), s("x", 1, "y", 1), Older},
		{"newer", s("x", 3, "y", 1), s("x", 2), Newer},
		{"newer than unstamped", s("x", 1), Stamp{}, Newer},
		{"both sides", s("x", 2, "y", 1), s("x", 2, "z", 1), Both},
		{"both by counts", s("x", 3, "y", 1), s("x", 2, "y", 2), Both},
		{"zero count is absent", s("x", 1, "y", 0), s("x", 1), Same},
	} {
		t.Run(tt.name, func(t *testing.T) {
			if got := tt.a.Compare(tt.b); got != tt.want {
				t.Errorf("Compare = %d, want %d", got, tt.want)
			}
		})
	}
}

func TestTouch(t *testing.T) {
	p := withLogger()
	now := t0.Add(time.Hour)
	fp := Touch(p, nil, "s1", now)
	if p.Details.Rev != 1 || p.Wells[0].Stamp.By["s1"] != 1 || p.Tests[0].Stamp.Rev != 1 {
		t.Fatalf("a new project's objects are not all stamped: %+v %+v", p.Details, p.Wells[0].Stamp)
	}
	// Nothing changed: no stamp moves.
	before := p.Clone()
	fp = Touch(p, fp, "s1", now.Add(time.Minute))
	if !reflect.DeepEqual(before, p) {
		t.Error("Touch without a change moved a stamp")
	}
	// One reading of the test changed: only the test's stamp moves, in
	// the session that changed it.
	p.Tests[0].Readings[0].DepthText = "25.0"
	fp = Touch(p, fp, "s2", now.Add(2*time.Minute))
	if st := p.Tests[0].Stamp; st.Rev != 2 || st.By["s2"] != 1 || !st.Changed.Equal(now.Add(2*time.Minute)) {
		t.Errorf("test stamp after an edit: %+v", st)
	}
	if p.Wells[0].Stamp.Rev != 1 || p.Wells[1].Stamp.Rev != 1 || p.Details.Rev != 1 {
		t.Error("an edit of a test moved the stamp of another object")
	}
	// The clone taken before shares no stamp map that the edit changed.
	if before.Tests[0].Stamp.By["s2"] != 0 {
		t.Error("bump changed a stamp map shared with a clone")
	}
	// A notes edit moves the details; the project's own Rev does not count.
	p.Notes = "moved the pump"
	p.Rev += 5
	Touch(p, fp, "s2", now)
	if p.Details.Rev != 2 || p.Tests[0].Stamp.Rev != 2 {
		t.Errorf("details %+v test %+v", p.Details, p.Tests[0].Stamp)
	}
}

// BenchmarkTouchLogger1M stamps a project holding a logger record of a
// million readings after a change of one tape reading: the work each
// autosave adds to writing the file.
func BenchmarkTouchLogger1M(b *testing.B) {
	p := bigProject()
	fp := Touch(p, nil, "s1", t0)
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		p.Tests[0].Readings[0].DepthText = strconv.Itoa(i)
		fp = Touch(p, fp, "s1", t0)
	}
}
