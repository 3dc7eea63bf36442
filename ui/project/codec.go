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
// and the choice of the readings fitted (Test.Source). Version 3 added
// the revision record of each object (Project.Details, Well.Stamp,
// Test.Stamp) and files holding several projects ("projects").
const Version = 3

// MaxFileSize is the largest project file Fieldfit reads (200 MiB): a
// project with a few million logger readings fits well under it.
const MaxFileSize = 200 << 20

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
	// ErrTooLarge: the file is larger than MaxFileSize.
	ErrTooLarge = errors.New("project file is too large")
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

// envelope is the outer object of the file: one project ("project") or,
// from version 3 on, several ("projects"), never both.
type envelope struct {
	Format   string      `json:"format"`
	Version  int         `json:"version"`
	Project  jsonc.Raw   `json:"project,omitempty"`
	Projects []jsonc.Raw `json:"projects,omitempty"`
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
	{From: 2, Upgrade: upgrade2},
}

// upgrade2 upgrades a version 2 project: it gives the details, each well
// and each test a revision record of one change at the project's
// "changed" time (the file does not tell more).
func upgrade2(p map[string]any) error {
	changed, _ := p["changed"].(string)
	if changed == "" {
		changed = "0001-01-01T00:00:00Z"
	}
	stamp := func() map[string]any { return map[string]any{"rev": float64(1), "changed": changed} }
	if _, has := p["details"]; has {
		return fmt.Errorf("the project has a revision record, which version 2 did not know")
	}
	p["details"] = stamp()
	for _, key := range []string{"wells", "tests"} {
		v, ok := p[key]
		if !ok || v == nil {
			continue
		}
		list, ok := v.([]any)
		if !ok {
			return fmt.Errorf("%s is not a list", key)
		}
		for i, o := range list {
			m, ok := o.(map[string]any)
			if !ok {
				return fmt.Errorf("%s[%d] is not an object", key, i)
			}
			if _, has := m["stamp"]; has {
				return fmt.Errorf("%s[%d] has a revision record, which version 2 did not know", key, i)
			}
			m["stamp"] = stamp()
		}
	}
	return nil
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

// MarshalAll encodes ps as one project file of the current Version with
// a "projects" list (the export of every project of a device).
func MarshalAll(ps []*Project) ([]byte, error) {
	n := 1 << 16
	for _, p := range ps {
		n += p.samplesSize()
	}
	out := make([]byte, 0, n)
	out = append(out, "{\n \"format\": \""+Format+"\",\n \"version\": "+strconv.Itoa(Version)+",\n \"projects\": ["...)
	for i, p := range ps {
		if i > 0 {
			out = append(out, ',')
		}
		out = append(out, "\n  "...)
		var err error
		if out, err = jsonc.Append(out, p, "  ", " "); err != nil {
			return nil, fmt.Errorf("project %q: %w", p.ID, err)
		}
	}
	return append(out, "\n ]\n}"...), nil
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

// Unmarshal decodes a project file of this or an older version that
// holds one project.
func Unmarshal(data []byte) (*Project, error) {
	return decode(data, Version, migrations)
}

// UnmarshalFile decodes a project file holding one project or several
// (see MarshalAll), refusing one larger than MaxFileSize. Every project is
// checked; the first error is returned, naming the project concerned.
func UnmarshalFile(data []byte) ([]*Project, error) {
	if len(data) > MaxFileSize {
		return nil, &DecodeError{Err: fmt.Errorf("%w: %d bytes, more than the %d MB Fieldfit reads", ErrTooLarge, len(data), MaxFileSize>>20)}
	}
	env, err := readEnvelope(data, Version)
	if err != nil {
		return nil, err
	}
	if len(env.Projects) == 0 {
		p, err := decodeBody(env.Project, env.Version, Version, migrations)
		if err != nil {
			return nil, err
		}
		return []*Project{p}, nil
	}
	if env.Version < 3 {
		return nil, &DecodeError{Version: env.Version, Field: "projects", Err: fmt.Errorf("%w: a list of projects needs version 3 or later", ErrInvalid)}
	}
	out := make([]*Project, len(env.Projects))
	seen := map[string]bool{}
	for i, body := range env.Projects {
		p, err := decodeBody(body, env.Version, Version, migrations)
		if err != nil {
			var de *DecodeError
			if errors.As(err, &de) {
				de.Field = "projects[" + strconv.Itoa(i) + "]" + prefixed(de.Field)
			}
			return nil, err
		}
		if seen[p.ID] {
			return nil, &DecodeError{Version: env.Version, Field: "projects[" + strconv.Itoa(i) + "]", Err: fmt.Errorf("%w: project %q appears twice", ErrInvalid, p.ID)}
		}
		seen[p.ID] = true
		out[i] = p
	}
	return out, nil
}

func prefixed(s string) string {
	if s == "" {
		return ""
	}
	return "." + s
}

// decode reads a file of one project, upgrading it with chain up to
// version current.
func decode(data []byte, current int, chain []Migration) (*Project, error) {
	env, err := readEnvelope(data, current)
	if err != nil {
		return nil, err
	}
	if len(env.Projects) > 0 {
		return nil, &DecodeError{Version: env.Version, Field: "projects", Err: fmt.Errorf("%w: the file holds %d projects, not one", ErrInvalid, len(env.Projects))}
	}
	return decodeBody(env.Project, env.Version, current, chain)
}

// readEnvelope reads and checks the outer object of a file.
func readEnvelope(data []byte, current int) (*envelope, error) {
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
	if len(env.Project) > 0 && len(env.Projects) > 0 {
		return nil, &DecodeError{Version: env.Version, Err: fmt.Errorf("%w: the file has both \"project\" and \"projects\"", ErrInvalid)}
	}
	if len(env.Project) == 0 && len(env.Projects) == 0 {
		return nil, &DecodeError{Version: env.Version, Field: "project", Err: fmt.Errorf("%w: the file holds no project", ErrInvalid)}
	}
	return &env, nil
}

// decodeBody reads one "project" object of a file of version version,
// upgrading it with chain up to version current.
func decodeBody(raw jsonc.Raw, version, current int, chain []Migration) (*Project, error) {
	env := envelope{Version: version}
	body := []byte(raw)
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
	if err := p.checkLimits(); err != nil {
		return err
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
