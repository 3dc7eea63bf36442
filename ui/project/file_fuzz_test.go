package project

import (
	"context"
	"os"
	"testing"
	"time"

	"fieldfit/ui/store"
)

// FuzzUnmarshalFile feeds the decoder of imported project files
// (UnmarshalFile) anything: it never panics, and a file it accepts always
// loads: every project in it writes, is taken by the store, reads back,
// opens, and merges with itself to no change.
func FuzzUnmarshalFile(f *testing.F) {
	for _, name := range []string{"v1-kestrel-flats.fieldfit.json", "v2-kestrel-flats-logger.fieldfit.json"} {
		data, err := os.ReadFile("../../testdata/project/" + name)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
	p := New("Redshank Lea <b>&", SI, t0)
	p.Wells = append(p.Wells, Well{ID: "w1", Name: "OW-1", Kind: Observation})
	Touch(p, nil, "s1", t0)
	one, _ := Marshal(p)
	all, _ := MarshalAll([]*Project{p})
	f.Add(one)
	f.Add(all)
	f.Add([]byte(`{"format":"fieldfit-project","version":3,"projects":[{"id":"a"},{"id":"b","changed":"9999-12-31T23:59:59-23:00"}]}`))
	f.Fuzz(func(t *testing.T, data []byte) {
		ps, err := UnmarshalFile(data)
		if err != nil {
			return
		}
		ctx := context.Background()
		st := store.NewMemory()
		for _, p := range ps {
			file, err := Marshal(p)
			if err != nil {
				t.Fatalf("accepted project %q does not write: %v", p.ID, err)
			}
			rec := store.Record{ID: p.ID, Name: p.Name, Rev: p.Rev, Changed: p.Changed, Data: file, Exported: p.Rev}
			if err := st.Put(ctx, rec); err != nil {
				t.Fatalf("accepted project %q is refused by the store: %v", p.ID, err)
			}
			got, err := st.Get(ctx, p.ID)
			if err != nil {
				t.Fatal(err)
			}
			q, err := Unmarshal(got.Data)
			if err != nil {
				t.Fatalf("accepted project %q does not open after storing: %v", p.ID, err)
			}
			m := NewMerge(q, p)
			if len(m.Conflicts()) > 0 || !m.Unchanged() {
				t.Fatalf("project %q differs from itself after storing", p.ID)
			}
			if _, err := m.Apply(nil, "s1", time.Unix(0, 0)); err != nil {
				t.Fatalf("merging project %q with itself: %v", p.ID, err)
			}
		}
	})
}
