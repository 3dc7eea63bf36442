package jsonc_test

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"reflect"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/project/jsonc"
)

// The reference for every check here is encoding/json of the Go standard
// library: jsonc must write the same bytes and, where it accepts a
// document, read the same value.

type inner struct {
	A float64 `json:"a"`
	B string  `json:"b,omitempty"`
}

type kinds struct {
	S    string            `json:"s"`
	SO   string            `json:"so,omitempty"`
	B    bool              `json:"b"`
	BO   bool              `json:"bo,omitempty"`
	I    int               `json:"i"`
	I8   int8              `json:"i8,omitempty"`
	I64  int64             `json:"i64,omitempty"`
	U16  uint16            `json:"u16,omitempty"`
	F    float64           `json:"f"`
	F32  float32           `json:"f32,omitempty"`
	P    *float64          `json:"p,omitempty"`
	PS   *inner            `json:"ps"`
	In   inner             `json:"in,omitempty"`
	L    []inner           `json:"l"`
	LO   []int             `json:"lo,omitempty"`
	M    map[string]int    `json:"m,omitempty"`
	Arr  [2]int            `json:"arr"`
	T    time.Time         `json:"t"`
	TP   *time.Time        `json:"tp,omitempty"`
	Any  any               `json:"any,omitempty"`
	Kind named             `json:"kind,omitempty"`
	NoT  int               //
	Skip int               `json:"-"`
	MS   map[string]string `json:"ms"`
	priv int
}

type named string

func ptr[T any](v T) *T { return &v }

func sample() kinds {
	return kinds{
		S: "<b>&\"quoted\"\\ \u2028 \x01\t\n ümlaut 💧", B: true, I: -42, I8: -8, I64: math.MaxInt64, U16: 65535,
		F: 1.0 / 3, F32: 0.1, P: ptr(1e-7), PS: &inner{A: 2.5e21}, In: inner{A: 1e-6, B: "x"},
		L: []inner{{A: 0}, {A: -0.0001, B: "y"}}, M: map[string]int{"z": 1, "a": 2, "é": 3},
		Arr: [2]int{1, 2}, T: time.Date(2024, 5, 14, 8, 0, 0, 123, time.UTC),
		TP:  ptr(time.Date(2023, 1, 2, 3, 4, 5, 0, time.FixedZone("", -5*3600))),
		Any: map[string]any{"k": []any{1.5, "s", true, nil}}, Kind: "pumping", NoT: 7,
		MS: map[string]string{},
	}
}

func TestMarshalMatchesEncodingJSON(t *testing.T) {
	for _, tc := range []struct {
		name string
		v    any
	}{
		{"kinds", sample()},
		{"zero", kinds{}},
		{"pointer", ptr(sample())},
		{"nil", nil},
		{"floats", []float64{0, -0.0, 1, 1e20, 1e21, 1e-6, 9.99e-7, 123456789.125, math.MaxFloat64, math.SmallestNonzeroFloat64, -2.5e-300}},
		{"float32", []float32{0.1, 1e21, 1e-7, 3.4e38}},
		{"strings", []string{"", "a\"b", "\x00\x1f\x7f", "\xff\xfe invalid", "<script>alert(1)</script>", "\u2029"}},
		{"map any", map[string]any{"b": 1.0, "a": []any{}, "c": map[string]any{}}},
		{"empty list", []int{}},
		{"nil list", []int(nil)},
	} {
		t.Run(tc.name, func(t *testing.T) {
			want, err := json.Marshal(tc.v)
			if err != nil {
				t.Fatal(err)
			}
			got, err := jsonc.Marshal(tc.v)
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.Equal(got, want) {
				t.Errorf("Marshal\n got %s\nwant %s", got, want)
			}
			want, _ = json.MarshalIndent(tc.v, " ", "  ")
			got, err = jsonc.MarshalIndent(tc.v, " ", "  ")
			if err != nil {
				t.Fatal(err)
			}
			if !bytes.Equal(got, want) {
				t.Errorf("MarshalIndent\n got %s\nwant %s", got, want)
			}
		})
	}
}

func TestRoundTrip(t *testing.T) {
	in := sample()
	data, err := jsonc.Marshal(in)
	if err != nil {
		t.Fatal(err)
	}
	var got, ref kinds
	if err := jsonc.Unmarshal(data, &got); err != nil {
		t.Fatal(err)
	}
	if err := json.Unmarshal(data, &ref); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(got, ref) {
		t.Errorf("jsonc read %+v\nencoding/json read %+v", got, ref)
	}
	again, _ := jsonc.Marshal(got)
	if !bytes.Equal(again, data) {
		t.Errorf("second round trip differs:\n%s\n%s", again, data)
	}
}

func TestMarshalRefuses(t *testing.T) {
	for _, tc := range []struct {
		name, want string
		v          any
	}{
		{"NaN", "l[1].a: NaN cannot be written", kinds{L: []inner{{}, {A: math.NaN()}}}},
		{"Inf", "f: +Inf cannot be written", kinds{F: math.Inf(1)}},
		{"chan", "not supported", make(chan int)},
		{"bytes", "byte slices", []byte("x")},
		{"embedded", "embedded field", struct{ inner }{}},
		{"year", "t: ", kinds{T: time.Date(10000, 1, 1, 0, 0, 0, 0, time.UTC)}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := jsonc.Marshal(tc.v)
			if err == nil || !strings.Contains(err.Error(), tc.want) || !errors.Is(err, jsonc.ErrUnsupported) {
				t.Errorf("got %v, want an error containing %q", err, tc.want)
			}
		})
	}
}

// decodeCases are documents read into kinds. ok is whether jsonc accepts;
// json says what encoding/json (with DisallowUnknownFields) does: "same"
// when it decides alike, "accepts" when it is more lenient.
var decodeCases = []struct {
	name, in string
	ok       bool
	json     string
	want     string // part of jsonc's error message
}{
	{"empty object", `{}`, true, "same", ""},
	{"all", `{"s":"a\u00e9\ud83d\udca7\n","b":true,"i":-3,"i8":127,"u16":0,"f":-1.5e-3,"f32":1e38,"p":2,"ps":{"a":1},"in":{"a":0,"b":""},"l":[],"lo":[1,2],"m":{"x":1},"arr":[5],"t":"2024-05-14T08:00:00+02:00","tp":null,"any":[{"a":null}],"kind":"k","NoT":3,"ms":null}`, true, "same", ""},
	{"space", " \t\n\r{ \"i\" : 1 , \"l\" : [ { \"a\" : 2 } ] }\n", true, "same", ""},
	{"lone surrogate", `{"s":"\ud800x\udc00"}`, true, "same", ""},
	{"invalid utf8", "{\"s\":\"\xff\xc3\"}", true, "same", ""},
	{"string for number", `{"l":[{"a":1},{"a":"2"}]}`, false, "same", `l[1].a: want a number, got a string`},
	{"number for string", `{"s":1}`, false, "same", `s: want a string, got a number`},
	{"object for list", `{"l":{}}`, false, "same", `l: want a list, got an object`},
	{"fraction for int", `{"i":1.5}`, false, "same", `i: want a whole number`},
	{"int8 overflow", `{"i8":128}`, false, "same", `i8: want a whole number that fits int8`},
	{"negative uint", `{"u16":-1}`, false, "same", `u16: want a whole number of zero or more`},
	{"float range", `{"f":1e400}`, false, "same", `f: the number 1e400 is out of range`},
	{"float32 range", `{"f32":1e39}`, false, "same", `f32: the number 1e39 is out of range`},
	{"bad time", `{"t":"14/05/2024"}`, false, "same", `t: want a date and time as RFC 3339 text`},
	{"truncated", `{"l":[{"a":1}`, false, "same", `line 1, column 14: the data ends inside a list`},
	{"truncated string", `{"s":"abc`, false, "same", `the data ends inside a string`},
	{"trailing comma", `{"i":1,}`, false, "same", `want the name of a member in quotes, got '}'`},
	{"trailing data", `{} x`, false, "same", `want the end of the data, got 'x'`},
	{"two documents", `{} {}`, false, "same", `want the end of the data`},
	{"NaN literal", `{"f":NaN}`, false, "same", `f: line 1, column 6: want a value, got 'N'`},
	{"leading zero", `{"i":01}`, false, "same", `want ',' or '}' after a member`},
	{"plus sign", `{"i":+1}`, false, "same", `want a value`},
	{"control char", "{\"s\":\"a\x01\"}", false, "same", `control character`},
	{"bad escape", `{"s":"\x"}`, false, "same", `the escape \x is not JSON`},
	{"short unicode", `{"s":"\u12"}`, false, "same", `four hexadecimal digits`},
	{"line and column", "{\n  \"i\": 1,\n  \"s\": tru\n}", false, "same", `s: line 3, column 11: want true, got the end of a line`},
	{"too many elements", `{"arr":[1,2,3]}`, false, "accepts", `arr: want at most 2 elements`},
	{"unknown field", `{"in":{"a":1,"c":2}}`, false, "same", `in: unknown field "c"`},
	{"case differs", `{"S":"x"}`, false, "accepts", `unknown field "S"`},
	{"repeated field", `{"i":1,"i":2}`, false, "accepts", `the field "i" appears twice`},
	{"repeated map key", `{"m":{"a":1,"a":2}}`, false, "accepts", `m: the member "a" appears twice`},
	{"null string", `{"s":null}`, false, "accepts", `s: want a string, got null`},
	{"null struct", `{"in":null}`, false, "accepts", `in: want an object, got null`},
	{"null time", `{"t":null}`, false, "accepts", `t: want a date and time`},
	{"null top", `null`, false, "accepts", `want an object, got null`},
	{"deep any", `{"any":` + strings.Repeat("[", 10001) + strings.Repeat("]", 10001) + `}`, false, "same", `nested too deeply`},
	{"empty", ``, false, "same", `the data ends where a value should be`},
	{"skip tag", `{"Skip":1}`, false, "same", `unknown field "Skip"`},
	{"private", `{"priv":1}`, false, "same", `unknown field "priv"`},
}

func TestUnmarshalAgainstEncodingJSON(t *testing.T) {
	for _, tc := range decodeCases {
		t.Run(tc.name, func(t *testing.T) {
			var got, ref kinds
			err := jsonc.Unmarshal([]byte(tc.in), &got)
			dec := json.NewDecoder(strings.NewReader(tc.in))
			dec.DisallowUnknownFields()
			rerr := dec.Decode(&ref)
			if rerr == nil && dec.More() {
				rerr = errors.New("more data")
			}
			if rerr == nil {
				// Decoder accepts trailing data after the value; Unmarshal does not.
				rerr = json.Unmarshal([]byte(tc.in), &ref)
			}
			if (err == nil) != tc.ok {
				t.Fatalf("jsonc: %v, want ok=%v", err, tc.ok)
			}
			if err != nil && !strings.Contains(err.Error(), tc.want) {
				t.Errorf("jsonc error %q, want it to contain %q", err, tc.want)
			}
			var e *jsonc.Error
			if err != nil && !errors.As(err, &e) {
				t.Errorf("error %T is not a *jsonc.Error", err)
			}
			switch tc.json {
			case "same":
				if (rerr == nil) != (err == nil) {
					t.Fatalf("encoding/json: %v; jsonc: %v", rerr, err)
				}
			case "accepts":
				if rerr != nil {
					t.Fatalf("encoding/json refuses (%v), the table says it accepts", rerr)
				}
			}
			if err == nil && !reflect.DeepEqual(got, ref) {
				t.Errorf("jsonc read %+v\nencoding/json read %+v", got, ref)
			}
		})
	}
}

func TestErrorKinds(t *testing.T) {
	var v kinds
	err := jsonc.Unmarshal([]byte(`{"i":`), &v)
	if !errors.Is(err, jsonc.ErrSyntax) {
		t.Errorf("%v is not ErrSyntax", err)
	}
	err = jsonc.Unmarshal([]byte(`{"i":"x"}`), &v)
	if !errors.Is(err, jsonc.ErrValue) {
		t.Errorf("%v is not ErrValue", err)
	}
	if err := jsonc.Unmarshal([]byte(`{}`), v); !errors.Is(err, jsonc.ErrUnsupported) {
		t.Errorf("non-pointer: %v", err)
	}
	if jsonc.Valid([]byte(`{"a":[1,2,{"b":null}]}`)) != true || jsonc.Valid([]byte(`{"a":}`)) != false {
		t.Error("Valid")
	}
}

// FuzzUnmarshal checks, on any input, that jsonc does not panic, that
// what it accepts encoding/json accepts with the same value, that both
// write the value back identically, and that when only encoding/json
// accepts, the reason is one of jsonc's documented strictnesses.
func FuzzUnmarshal(f *testing.F) {
	for _, tc := range decodeCases {
		if len(tc.in) < 1000 {
			f.Add([]byte(tc.in))
		}
	}
	b, _ := json.Marshal(sample())
	f.Add(b)
	f.Fuzz(func(t *testing.T, data []byte) {
		var got, ref kinds
		err := jsonc.Unmarshal(data, &got)
		dec := json.NewDecoder(bytes.NewReader(data))
		dec.DisallowUnknownFields()
		rerr := dec.Decode(&ref)
		if rerr == nil {
			var again kinds
			rerr = json.Unmarshal(data, &again)
		}
		if err == nil {
			if rerr != nil {
				t.Fatalf("jsonc accepts what encoding/json refuses (%v): %q", rerr, data)
			}
			if !reflect.DeepEqual(got, ref) {
				t.Fatalf("values differ for %q:\n%+v\n%+v", data, got, ref)
			}
			w1, e1 := jsonc.Marshal(got)
			w2, e2 := json.Marshal(ref)
			if (e1 == nil) != (e2 == nil) || !bytes.Equal(w1, w2) {
				t.Fatalf("written differently: %s (%v)\n%s (%v)", w1, e1, w2, e2)
			}
			return
		}
		var e *jsonc.Error
		if !errors.As(err, &e) {
			t.Fatalf("error %T", err)
		}
		if rerr == nil {
			strict := []string{"unknown field", "appears twice", "got null", "want at most"}
			for _, s := range strict {
				if strings.Contains(e.Msg, s) {
					return
				}
			}
			t.Fatalf("jsonc refuses (%v) what encoding/json accepts: %q", err, data)
		}
	})
}
