package project

import (
	"errors"
	"strings"
	"testing"
	"time"
)

// parted returns a project stamped in session "dev" and a copy of it as
// exported to the office: the two sides of a merge before either changes.
func parted(t *testing.T) (device, office *Project) {
	t.Helper()
	p := sample()
	p.Tests = append(p.Tests, Test{ID: NewID(), Name: "Recovery", Readings: []Reading{}, PumpingWell: p.Wells[0].ID})
	Touch(p, nil, "dev", t0)
	return p, p.Clone()
}

// edit changes a project in session by, as the app does on save.
func edit(p *Project, by string, f func(p *Project)) {
	fp := Fingerprints(p)
	f(p)
	Touch(p, fp, by, t0.Add(time.Hour))
}

func TestMerge(t *testing.T) {
	type side func(p *Project)
	well := func(name string) side { return func(p *Project) { p.Wells[1].Name = name } }
	notes := func(s string) side { return func(p *Project) { p.Notes = s } }
	reading := func(d string) side { return func(p *Project) { p.Tests[0].Readings[0].DepthText = d } }
	addWell := func(name string) side {
		return func(p *Project) { p.Wells = append(p.Wells, Well{ID: "w-" + name, Name: name, Kind: Observation}) }
	}
	tests := []struct {
		name           string
		device, office []side
		choices        map[string]Choice // by part What
		want           map[string]State  // by part name (after the edits)
		check          func(t *testing.T, m *Project)
	}{
		{name: "nothing changed", want: map[string]State{"OW-2": Equal, "Recovery": Equal}},
		{name: "office changed a well", office: []side{well("OW-2b")},
			want: map[string]State{"OW-2": TakeIncoming, "PW-1": Equal},
			check: func(t *testing.T, m *Project) {
				if m.Wells[1].Name != "OW-2b" {
					t.Errorf("well name %q, want the office's", m.Wells[1].Name)
				}
			}},
		{name: "device changed a well", device: []side{well("OW-2d")},
			want: map[string]State{"OW-2d": KeepLocal},
			check: func(t *testing.T, m *Project) {
				if m.Wells[1].Name != "OW-2d" {
					t.Errorf("well name %q, want the device's", m.Wells[1].Name)
				}
			}},
		{name: "each side changed another object", device: []side{notes("device notes")}, office: []side{reading("25.1")},
			want: map[string]State{"Kestrel Flats well field": KeepLocal, "24 h constant rate": TakeIncoming},
			check: func(t *testing.T, m *Project) {
				if m.Notes != "device notes" || m.Tests[0].Readings[0].DepthText != "25.1" {
					t.Errorf("notes %q reading %q: want both sides' changes", m.Notes, m.Tests[0].Readings[0].DepthText)
				}
			}},
		{name: "both changed a reading, keep the device's", device: []side{reading("25.0")}, office: []side{reading("25.1")},
			choices: map[string]Choice{"test": ChooseLocal}, want: map[string]State{"24 h constant rate": Conflict},
			check: func(t *testing.T, m *Project) {
				if m.Tests[0].Readings[0].DepthText != "25.0" {
					t.Errorf("reading %q, want the device's", m.Tests[0].Readings[0].DepthText)
				}
			}},
		{name: "both changed a reading, take the office's", device: []side{reading("25.0")}, office: []side{reading("25.1")},
			choices: map[string]Choice{"test": ChooseIncoming}, want: map[string]State{"24 h constant rate": Conflict},
			check: func(t *testing.T, m *Project) {
				if m.Tests[0].Readings[0].DepthText != "25.1" {
					t.Errorf("reading %q, want the office's", m.Tests[0].Readings[0].DepthText)
				}
			}},
		{name: "both changed a reading, keep both", device: []side{reading("25.0")}, office: []side{reading("25.1")},
			choices: map[string]Choice{"test": ChooseBoth}, want: map[string]State{"24 h constant rate": Conflict},
			check: func(t *testing.T, m *Project) {
				if len(m.Tests) != 3 || m.Tests[0].Readings[0].DepthText != "25.0" || m.Tests[2].Readings[0].DepthText != "25.1" ||
					!strings.HasSuffix(m.Tests[2].Name, FromFileSuffix) || m.Tests[2].ID == m.Tests[0].ID {
					t.Errorf("keep both: %d tests", len(m.Tests))
				}
			}},
		{name: "both changed the same way", device: []side{reading("25.0")}, office: []side{reading("25.0")},
			want: map[string]State{"24 h constant rate": Equal}},
		{name: "both changed a well, keep both, tests follow", device: []side{well("OW-2d")},
			office:  []side{well("OW-2o"), func(p *Project) { p.Tests[1].ObservationWell = p.Wells[1].ID }},
			choices: map[string]Choice{"well": ChooseBoth},
			want:    map[string]State{"OW-2d": Conflict, "Recovery": TakeIncoming},
			check: func(t *testing.T, m *Project) {
				if len(m.Wells) != 3 || m.Wells[2].Name != "OW-2o"+FromFileSuffix {
					t.Fatalf("wells %+v", m.Wells)
				}
				if m.Tests[1].ObservationWell != m.Wells[2].ID {
					t.Errorf("the office's test refers to %q, want its own copy of the well %q", m.Tests[1].ObservationWell, m.Wells[2].ID)
				}
				if m.Tests[0].ObservationWell != m.Wells[1].ID {
					t.Error("the device's test lost its well")
				}
			}},
		{name: "added on each side", device: []side{addWell("OW-3")}, office: []side{addWell("OW-4")},
			want: map[string]State{"OW-3": OnlyLocal, "OW-4": OnlyIncoming},
			check: func(t *testing.T, m *Project) {
				if len(m.Wells) != 4 {
					t.Errorf("%d wells, want 4", len(m.Wells))
				}
			}},
		{name: "both renamed the project", device: []side{func(p *Project) { p.Name = "Device name" }}, office: []side{func(p *Project) { p.Name = "Office name" }},
			choices: map[string]Choice{"details": ChooseIncoming}, want: map[string]State{"Office name": Conflict},
			check: func(t *testing.T, m *Project) {
				if m.Name != "Office name" || len(m.Wells) != 2 {
					t.Errorf("name %q, %d wells", m.Name, len(m.Wells))
				}
			}},
		{name: "device edited twice, office once: still both", device: []side{reading("25.0"), reading("25.2")}, office: []side{reading("25.1")},
			choices: map[string]Choice{"test": ChooseLocal}, want: map[string]State{"24 h constant rate": Conflict}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			dev, off := parted(t)
			for _, f := range tt.device {
				edit(dev, "dev", f)
			}
			for _, f := range tt.office {
				edit(off, "office", f)
			}
			devBefore := dev.Clone()
			m := NewMerge(dev, off)
			got := map[string]State{}
			choices := map[string]Choice{}
			for _, p := range m.Parts {
				got[p.Name] = p.State
				if p.State == Conflict {
					choices[p.Key] = tt.choices[p.What]
				}
			}
			for name, want := range tt.want {
				if got[name] != want {
					t.Errorf("%q: state %d, want %d (all: %v)", name, got[name], want, got)
				}
			}
			if len(m.Conflicts()) > 0 {
				if _, err := m.Apply(nil, "dev", t0); !errors.Is(err, ErrUndecided) {
					t.Errorf("Apply without decisions: err = %v, want ErrUndecided", err)
				}
			}
			res, err := m.Apply(choices, "dev", t0.Add(2*time.Hour))
			if err != nil {
				t.Fatal(err)
			}
			if tt.check != nil {
				tt.check(t, res)
			}
			if !equalJSON(dev, devBefore) {
				t.Error("Apply changed the local project")
			}
			// The result is a later state of both sides: merging either
			// side into it again asks nothing and changes nothing.
			for _, side := range []*Project{dev, off} {
				again := NewMerge(res, side)
				if len(again.Conflicts()) > 0 || !again.Unchanged() {
					for _, p := range again.Parts {
						t.Logf("%s %q: %d", p.What, p.Name, p.State)
					}
					t.Error("merging a side into the result again would change it")
				}
			}
			if data, err := Marshal(res); err != nil {
				t.Error(err)
			} else if _, err := Unmarshal(data); err != nil {
				t.Errorf("the merged project does not read back: %v", err)
			}
		})
	}
}

func equalJSON(a, b *Project) bool {
	x, _ := Marshal(a)
	y, _ := Marshal(b)
	return string(x) == string(y)
}

func TestMergeChooseBothNotForDetails(t *testing.T) {
	dev, off := parted(t)
	edit(dev, "dev", func(p *Project) { p.Name = "A" })
	edit(off, "office", func(p *Project) { p.Name = "B" })
	m := NewMerge(dev, off)
	if _, err := m.Apply(map[string]Choice{DetailsKey: ChooseBoth}, "dev", t0); !errors.Is(err, ErrUndecided) {
		t.Errorf("keep both for the details: err = %v, want ErrUndecided", err)
	}
}
