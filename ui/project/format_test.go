package project

import (
	"os"
	"reflect"
	"regexp"
	"sort"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/project/jsonc"
)

// formatField is one JSON member reached from the project document: the
// Go type of the object it belongs to (as FORMAT.md's headings name it,
// for example "Test" or "fielddata.Options"), its JSON name and Go type.
type formatField struct {
	object, name, goType string
}

// walkFormat lists every JSON member of the struct types reachable
// from t.
func walkFormat(t reflect.Type, seen map[string]bool, out *[]formatField) {
	for t.Kind() == reflect.Pointer {
		t = t.Elem()
	}
	leaf := t == reflect.TypeFor[time.Time]() || t == reflect.TypeFor[Samples]() ||
		reflect.PointerTo(t).Implements(reflect.TypeFor[jsonc.Unmarshaler]())
	if leaf {
		return
	}
	switch t.Kind() {
	case reflect.Slice, reflect.Array:
		walkFormat(t.Elem(), seen, out)
		return
	case reflect.Map:
		walkFormat(t.Elem(), seen, out)
		return
	case reflect.Struct:
	default:
		return
	}
	at := strings.TrimPrefix(t.String(), "project.")
	if seen[at] {
		return
	}
	seen[at] = true
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		tag := f.Tag.Get("json")
		if !f.IsExported() || tag == "-" {
			continue
		}
		name, _, _ := strings.Cut(tag, ",")
		if name == "" {
			name = f.Name
		}
		*out = append(*out, formatField{at, name, f.Type.String()})
		walkFormat(f.Type, seen, out)
	}
}

// documented reads FORMAT.md: for each section whose heading holds a Go
// type name in backquotes, the field names in backquotes that begin
// the rows of its tables.
func documented(t *testing.T) map[string]map[string]bool {
	data, err := os.ReadFile("FORMAT.md")
	if err != nil {
		t.Fatal(err)
	}
	heading := regexp.MustCompile("^#+ .*`([a-zA-Z][^`]*)`")
	row := regexp.MustCompile("^\\| *`([^`]+)`")
	docs := map[string]map[string]bool{}
	var cur map[string]bool
	for _, line := range strings.Split(string(data), "\n") {
		if m := heading.FindStringSubmatch(line); m != nil {
			cur = map[string]bool{}
			docs[m[1]] = cur
			continue
		}
		if m := row.FindStringSubmatch(line); m != nil && cur != nil {
			cur[m[1]] = true
		}
	}
	return docs
}

// TestFormatDocumented fails when a JSON field of the project document is
// not described in ui/project/FORMAT.md, and names what to add.
func TestFormatDocumented(t *testing.T) {
	var fields []formatField
	seen := map[string]bool{}
	walkFormat(reflect.TypeFor[envelope](), seen, &fields)
	walkFormat(reflect.TypeFor[Project](), seen, &fields)
	docs := documented(t)
	var missing []string
	for _, f := range fields {
		sec, ok := docs[f.object]
		if !ok {
			missing = append(missing, "no section for the type `"+f.object+"`: add a heading like \"### What it is (`"+f.object+"`)\" and a table of its fields")
			continue
		}
		if !sec[f.name] {
			missing = append(missing, "field `"+f.name+"` ("+f.goType+") of `"+f.object+"`: add a row \"| `"+f.name+"` | type | unit | meaning |\" to its table")
		}
	}
	sort.Strings(missing)
	missing = compactStrings(missing)
	if len(missing) > 0 {
		t.Errorf("ui/project/FORMAT.md does not describe every field of the project file. Add (field, type, unit, meaning):\n  %s", strings.Join(missing, "\n  "))
	}
	// And nothing documented is gone from the Go types.
	known := map[string]map[string]bool{}
	for _, f := range fields {
		if known[f.object] == nil {
			known[f.object] = map[string]bool{}
		}
		known[f.object][f.name] = true
	}
	for obj, names := range docs {
		for n := range names {
			if known[obj] != nil && !known[obj][n] {
				t.Errorf("FORMAT.md describes `%s` of `%s`, which the project file no longer has", n, obj)
			}
		}
	}
}

func compactStrings(s []string) []string {
	out := s[:0]
	for i, v := range s {
		if i == 0 || v != s[i-1] {
			out = append(out, v)
		}
	}
	return out
}

// TestFormatExample reads the example of FORMAT.md as a project file.
func TestFormatExample(t *testing.T) {
	data, err := os.ReadFile("FORMAT.md")
	if err != nil {
		t.Fatal(err)
	}
	_, rest, ok := strings.Cut(string(data), "```json\n")
	example, _, ok2 := strings.Cut(rest, "```")
	if !ok || !ok2 {
		t.Fatal("FORMAT.md has no ```json example")
	}
	ps, err := UnmarshalFile([]byte(example))
	if err != nil {
		t.Fatalf("the example of FORMAT.md does not read: %v", err)
	}
	if p := ps[0]; len(p.Wells) != 2 || len(p.Tests) != 1 || len(p.Tests[0].Readings) != 2 || p.Tests[0].Stamp.Rev != 5 {
		t.Errorf("the example read as %+v", p)
	}
}
