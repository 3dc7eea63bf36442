// Package jsonc reads and writes the JSON of Fieldfit's stored documents
// (the project file and the store's records) without encoding/json, which
// would add about 80 kB gzipped to app.wasm.
//
// It works by reflection on the same struct tags as encoding/json
// (`json:"name"`, `json:"name,omitempty"`, `json:"-"`) and on the kinds the
// documents use: structs, slices, arrays, maps with string keys, strings,
// booleans, integers, floating-point numbers, pointers, the empty
// interface (decoded as map[string]any, []any, float64, string, bool or
// nil), time.Time (RFC 3339 text) and types with their own MarshalJSON,
// AppendJSON or UnmarshalJSON methods. Other kinds, embedded struct fields
// and other tag options are refused with an error rather than handled
// differently.
//
// Marshal writes what encoding/json's Marshal writes, byte for byte
// (HTML-sensitive characters escaped, map keys sorted, the shortest
// float64 text), and MarshalIndent what its MarshalIndent writes. NaN and
// infinities are refused, as there.
//
// Unmarshal is stricter than encoding/json, on purpose: field names match
// exactly (not ignoring case), unknown fields, repeated fields, null for a
// value that cannot be null, and extra elements for an array are errors.
// Every error is an *Error naming the path of the value concerned
// ("tests[2].readings[14].elapsedS: want a number, got a string") and, for
// malformed JSON, the line and column. Whatever it accepts, encoding/json
// accepts too, with the same result (checked by tests and a fuzz target).
// It never panics on any input.
package jsonc
