package project

import (
	"bytes"
	"encoding/json"
	"reflect"
	"strconv"
	"testing"
)

// TestMarshalMatchesEncodingJSON checks the file written with jsonc
// against the same project written by encoding/json (the reference
// library), byte for byte, and that encoding/json reads it back to the
// same project.
func TestMarshalMatchesEncodingJSON(t *testing.T) {
	for _, tc := range []struct {
		name string
		p    *Project
	}{{"sample", sample()}, {"logger", withLogger()}, {"empty", New("Empty <b>&", SI, t0)}} {
		t.Run(tc.name, func(t *testing.T) {
			got, err := Marshal(tc.p)
			if err != nil {
				t.Fatal(err)
			}
			body, err := json.MarshalIndent(tc.p, " ", " ")
			if err != nil {
				t.Fatal(err)
			}
			want := []byte("{\n \"format\": \"" + Format + "\",\n \"version\": " + strconv.Itoa(Version) + ",\n \"project\": " + string(body) + "\n}")
			if !bytes.Equal(got, want) {
				t.Errorf("files differ:\n got %s\nwant %s", got, want)
			}
			var env struct {
				Project Project `json:"project"`
			}
			if err := json.Unmarshal(got, &env); err != nil {
				t.Fatal(err)
			}
			q, err := Unmarshal(got)
			if err != nil {
				t.Fatal(err)
			}
			if !reflect.DeepEqual(&env.Project, q) {
				t.Errorf("encoding/json read %+v\njsonc read %+v", env.Project, q)
			}
		})
	}
}
