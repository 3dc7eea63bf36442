package project

import (
	"encoding/base64"
	"errors"
	"fmt"
	"strconv"

	"fieldfit/ui/project/jsonc"
)

// Format is the value of the "format" field of every project file.
const Format = "fieldfit-project"

// Version is the version of the project file format this package writes.
//
// Version 2 added the logger records of a test (Test.Logger)
// and the choice of the readings fitted (Test.Source).
const Version = 2

// Sentinel errors wrapped by *DecodeError.
var (
	// ErrNotProject: the data is not a Fieldfit project file.
	ErrNotProject = errors.New("not a Fieldfit project file")
	// ErrNewerVersion: the file was written by a newer Fieldfit.
	ErrNewerVersion = errors.New("project file is from a newer version of Fieldfit")
	// ErrMigration: upgrading the file to the current version failed.
	ErrMigration = errors.New("cannot upgrade the project file")
	// ErrInvalid: the file decodes but its content is inconsistent.
	ErrInvalid = errors.New("invalid project")
)

// DecodeError says why project data could not be read.
type DecodeError struct {
	// Version is the version found in the file (0 when unknown).
	Version int
	// Field names the part of the file concerned, when known.
	Field string
	Err   error
}

func (e *DecodeError) Error() string {
	msg := "project file"
	if e.Version > 0 {
		msg += fmt.Sprintf(" (version %d)", e.Version)
	}
	if e.Field != "" {
		msg += ", " + e.Field
	}
	return msg + ": " + e.Err.Error()
}

func (e *DecodeError) Unwrap() error { return e.Err }

// envelope is the outer object of the file.
type envelope struct {
	Format  string    `json:"format"`
	Version int       `json:"version"`
	Project jsonc.Raw `json:"project"`
}

// A Migration upgrades the "project" object of a file of version From to
// version From+1, in place. It works on the generic JSON tree so that it
// does not depend on the Go types of either version.
type Migration struct {
	From    int
	Upgrade func(project map[string]any) error
}

// migrations upgrade old files, one version at a time.
var migrations = []Migration{
	{From: 1, Upgrade: upgrade1},
}

// upgrade1 upgrades a version 1 project: its tests had only the readings
// table, so each is marked as fitting the tape readings ("source":
// "tape"); they have no logger records.
func upgrade1(p map[string]any) error {
	tests, ok := p["tests"]
	if !ok || tests == nil {
		return nil
	}
	list, ok := tests.([]any)
	if !ok {
		return fmt.Errorf("tests is not a list")
	}
	for i, t := range list {
		m, ok := t.(map[string]any)
		if !ok {
			return fmt.Errorf("test %d is not an object", i+1)
		}
		if _, has := m["logger"]; has {
			return fmt.Errorf("test %d has logger records, which version 1 did not know", i+1)
		}
		m["source"] = string(FromTape)
	}
	return nil
}

// Marshal encodes p as a project file of the current Version.
//
// The readings of logger records are written as base64 text (see
// Samples), appended straight into the output.
func Marshal(p *Project) ([]byte, error) {
	out := make([]byte, 0, 1<<16+p.samplesSize())
	out = append(out, "{\n \"format\": \""+Format+"\",\n \"version\": "+strconv.Itoa(Version)+",\n \"project\": "...)
	out, err := jsonc.Append(out, p, " ", " ")
	if err != nil {
		return nil, fmt.Errorf("project %q: %w", p.ID, err)
	}
	return append(out, "\n}"...), nil
}

// samplesSize is the length of the base64 text of p's logger readings.
func (p *Project) samplesSize() int {
	n := 0
	for i := range p.Tests {
		if lg := p.Tests[i].Logger; lg != nil {
			for _, r := range []*LoggerRecord{lg.Water, lg.Baro} {
				if r != nil {
					n += base64.StdEncoding.EncodedLen(8*len(r.Time)) + base64.StdEncoding.EncodedLen(8*len(r.Value)) + 4
				}
			}
		}
	}
	return n
}

// Unmarshal decodes a project file of this or an older version.
func Unmarshal(data []byte) (*Project, error) {
	return decode(data, Version, migrations)
}

// decode reads a file, upgrading it with chain up to version current.
func decode(data []byte, current int, chain []Migration) (*Project, error) {
	var env envelope
	if err := jsonc.Unmarshal(data, &env); err != nil {
		return nil, &DecodeError{Err: fmt.Errorf("%w: %v", ErrNotProject, err)}
	}
	if env.Format != Format {
		return nil, &DecodeError{Field: "format", Err: fmt.Errorf("%w: format is %q", ErrNotProject, env.Format)}
	}
	if env.Version < 1 {
		return nil, &DecodeError{Field: "version", Err: fmt.Errorf("%w: version %d", ErrNotProject, env.Version)}
	}
	if env.Version > current {
		return nil, &DecodeError{Version: env.Version, Err: fmt.Errorf("%w (this one reads up to version %d)", ErrNewerVersion, current)}
	}
	body := []byte(env.Project)
	if env.Version < current {
		var tree map[string]any
		if err := jsonc.Unmarshal(body, &tree); err != nil || tree == nil {
			return nil, &DecodeError{Version: env.Version, Field: "project", Err: fmt.Errorf("%w: not an object", ErrInvalid)}
		}
		for v := env.Version; v < current; v++ {
			m := findMigration(chain, v)
			if m == nil {
				return nil, &DecodeError{Version: env.Version, Err: fmt.Errorf("%w: no upgrade from version %d", ErrMigration, v)}
			}
			if err := m.Upgrade(tree); err != nil {
				return nil, &DecodeError{Version: env.Version, Err: fmt.Errorf("%w from version %d: %w", ErrMigration, v, err)}
			}
		}
		var err error
		if body, err = jsonc.Marshal(tree); err != nil {
			return nil, &DecodeError{Version: env.Version, Err: fmt.Errorf("%w: %v", ErrMigration, err)}
		}
	}
	var p Project
	if err := jsonc.Unmarshal(body, &p); err != nil {
		return nil, &DecodeError{Version: env.Version, Field: "project", Err: fmt.Errorf("%w: %v", ErrInvalid, err)}
	}
	if err := p.check(); err != nil {
		return nil, &DecodeError{Version: env.Version, Err: err}
	}
	return &p, nil
}

func findMigration(chain []Migration, from int) *Migration {
	for i := range chain {
		if chain[i].From == from {
			return &chain[i]
		}
	}
	return nil
}

// check verifies what the screens rely on and fills in nil slices.
func (p *Project) check() error {
	if p.ID == "" {
		return fmt.Errorf("%w: project has no id", ErrInvalid)
	}
	if p.Units == "" {
		p.Units = SI
	}
	if !p.Units.Valid() {
		return fmt.Errorf("%w: units %q is neither %q nor %q", ErrInvalid, p.Units, SI, USCustomary)
	}
	if p.Wells == nil {
		p.Wells = []Well{}
	}
	if p.Tests == nil {
		p.Tests = []Test{}
	}
	seen := map[string]bool{}
	for i, w := range p.Wells {
		if w.ID == "" || seen[w.ID] {
			return fmt.Errorf("%w: well %d has a missing or repeated id %q", ErrInvalid, i+1, w.ID)
		}
		seen[w.ID] = true
		if w.Kind != Pumping && w.Kind != Observation {
			return fmt.Errorf("%w: well %d (%q) has kind %q", ErrInvalid, i+1, w.Name, w.Kind)
		}
	}
	for i := range p.Tests {
		t := &p.Tests[i]
		if t.ID == "" || seen[t.ID] {
			return fmt.Errorf("%w: test %d has a missing or repeated id %q", ErrInvalid, i+1, t.ID)
		}
		seen[t.ID] = true
		for _, ref := range []string{t.PumpingWell, t.ObservationWell} {
			if ref != "" && p.Well(ref) == nil {
				return fmt.Errorf("%w: test %d (%q) refers to well %q, which does not exist", ErrInvalid, i+1, t.Name, ref)
			}
		}
		if t.Readings == nil {
			t.Readings = []Reading{}
		}
		switch t.Source {
		case "", FromTape, FromLogger:
		default:
			return fmt.Errorf("%w: test %d (%q) fits readings from %q, neither %q nor %q", ErrInvalid, i+1, t.Name, t.Source, FromTape, FromLogger)
		}
		if lg := t.Logger; lg != nil {
			if lg.Water != nil {
				if err := lg.Water.check("water-level"); err != nil {
					return fmt.Errorf("test %d (%q): %w", i+1, t.Name, err)
				}
			}
			if lg.Baro != nil {
				if err := lg.Baro.check("barometric"); err != nil {
					return fmt.Errorf("test %d (%q): %w", i+1, t.Name, err)
				}
			}
		}
	}
	return nil
}
