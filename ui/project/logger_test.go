package project

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"os"
	"reflect"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/fielddata"
)

// withLogger returns sample() with logger records of our own invention on
// its first test.
func withLogger() *Project {
	p := sample()
	start, stop := 1715666400.0, 1715677200.0
	p.Tests[0].Source = FromLogger
	p.Tests[0].Logger = &LoggerData{
		Water: &LoggerRecord{ID: "a1", File: "LF-OB1 pressure.csv", Size: 12345, Imported: t0,
			Options: fielddata.Options{Delimiter: fielddata.Comma, HeaderRow: 4},
			Mapping: fielddata.Mapping{Time: fielddata.TimeColumns{Zone: "+02:00"},
				Values: []fielddata.ValueColumn{{Column: 1, Kind: fielddata.Pressure, Unit: "kPa"}}},
			Name: "Pressure (kPa)", Kind: fielddata.Pressure, Unit: "kPa", Density: 999.97, Clock: true,
			Time:     Samples{1715662800, 1715662860.25, 1715662920},
			Value:    Samples{16.8230001, math.Copysign(0, -1), 5e-324},
			Preamble: []fielddata.MetaLine{{Row: 1, Text: "Logger FX-20417"}},
			Lines:    7,
			Bad:      BadRows{Count: 1, Listed: []BadRow{{Row: 6, Column: "Pressure (kPa)", Value: "n/a", Why: "is not a number"}}, Skipped: true},
			Checks:   TimeChecks{Duplicates: 1, Interval: 60}},
		Baro: &LoggerRecord{ID: "b2", File: "baro.csv", Kind: fielddata.Pressure, Unit: "mbar", Clock: true,
			Time: Samples{1715662200}, Value: Samples{10.32}},
		Conditioning: fielddata.Conditioning{Start: &start, Stop: &stop,
			Baro: &fielddata.BaroCompensation{Record: "baro.csv"}, Trend: &fielddata.Trend{},
			Static: &fielddata.Static{}, Thin: &fielddata.Thinning{PerCycle: 15},
			Rates: fielddata.Schedule{{Start: 0, Rate: 0.0075, Unit: "L/s"}}},
		Texts: LoggerTexts{Start: "2024-05-14 08:00", Stop: "2024-05-14 11:00", PerCycle: "15", BE: "0,4x"},
		Rates: []RateRow{{Start: "0", Rate: "7.5", Unit: "L/s"}},
	}
	return p
}

func TestLoggerRoundTrip(t *testing.T) {
	p := withLogger()
	data, err := Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	q, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(p, q) {
		t.Errorf("round trip changed the project:\n got %+v\nwant %+v", q.Tests[0].Logger, p.Tests[0].Logger)
	}
	// -0 and the smallest subnormal come back bit for bit.
	v := q.Tests[0].Logger.Water.Value
	if math.Float64bits(v[1]) != math.Float64bits(math.Copysign(0, -1)) || v[2] != 5e-324 {
		t.Errorf("values after the round trip: %v", v)
	}
	// The columns are stored as base64 strings, not number arrays.
	if !strings.Contains(string(data), `"time": "`) {
		t.Errorf("the time column is not a base64 string:\n%s", data)
	}
}

func TestSamplesJSON(t *testing.T) {
	for _, tc := range []struct {
		name, in string
		want     Samples
		err      bool
	}{
		{"empty string", `""`, Samples{}, false},
		{"one value", `"AAAAAAAA8D8="`, Samples{1}, false}, // 1.0 = 0x3FF0000000000000, little-endian
		{"array", `[1, 2.5, -3]`, Samples{1, 2.5, -3}, false},
		{"null", `null`, nil, false},
		{"not base64", `"@@@@"`, nil, true},
		{"not whole values", `"AAAA"`, nil, true},
		{"a number", `12`, nil, true},
		{"array of text", `["a"]`, nil, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			var s Samples
			err := json.Unmarshal([]byte(tc.in), &s)
			if (err != nil) != tc.err {
				t.Fatalf("err = %v, want error %v", err, tc.err)
			}
			if err == nil && !reflect.DeepEqual(s, tc.want) {
				t.Errorf("got %v, want %v", s, tc.want)
			}
		})
	}
	b, _ := json.Marshal(Samples{1})
	if string(b) != `"AAAAAAAA8D8="` {
		t.Errorf("Samples{1} marshals to %s", b)
	}
}

func TestLoggerInvalid(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(p *Project)
	}{
		{"lengths differ", func(p *Project) { p.Tests[0].Logger.Water.Value = Samples{1} }},
		{"unknown kind", func(p *Project) { p.Tests[0].Logger.Baro.Kind = "salinity" }},
		{"no id", func(p *Project) { p.Tests[0].Logger.Water.ID = "" }},
		{"infinite value", func(p *Project) { p.Tests[0].Logger.Water.Value[0] = math.Inf(1) }},
		{"unknown source", func(p *Project) { p.Tests[0].Source = "satellite" }},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := withLogger()
			tc.edit(p)
			data, err := Marshal(p)
			if err != nil {
				// +Inf cannot be written as JSON numbers, but Samples
				// writes bits: it must be caught on reading.
				t.Fatal(err)
			}
			if _, err := Unmarshal(data); !errors.Is(err, ErrInvalid) {
				t.Errorf("err = %v, want ErrInvalid", err)
			}
		})
	}
}

func TestLoggerClone(t *testing.T) {
	p := withLogger()
	q := p.Clone()
	lq := q.Tests[0].Logger
	*lq.Conditioning.Start = 1
	lq.Conditioning.Thin.PerCycle = 3
	lq.Conditioning.Rates[0].Rate = 9
	lq.Rates[0].Rate = "9"
	lq.Water.Bad.Listed[0].Row = 99
	lq.Water.Mapping.Values[0].Unit = "psi"
	lp := p.Tests[0].Logger
	if *lp.Conditioning.Start == 1 || lp.Conditioning.Thin.PerCycle == 3 || lp.Conditioning.Rates[0].Rate == 9 ||
		lp.Rates[0].Rate == "9" || lp.Water.Bad.Listed[0].Row == 99 || lp.Water.Mapping.Values[0].Unit == "psi" {
		t.Errorf("changing the clone changed the original: %+v", lp)
	}
	if &lq.Water.Time[0] != &lp.Water.Time[0] {
		t.Error("the clone copied the readings instead of sharing them")
	}
}

// TestVersion1File reads a project file written by the version 1 codec
// (testdata/project/v1-kestrel-flats.fieldfit.json, made by Marshal before
// version 2 existed, from sample() plus a second test with clock times):
// everything comes through, and each test is marked as fitting its tape
// readings.
func TestVersion1File(t *testing.T) {
	data, err := os.ReadFile("../../testdata/project/v1-kestrel-flats.fieldfit.json")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(data), `"version": 1`) {
		t.Fatal("the fixture is not a version 1 file")
	}
	p, err := Unmarshal(data)
	if err != nil {
		t.Fatal(err)
	}
	want := sample()
	if p.Name != want.Name || p.Units != USCustomary || len(p.Wells) != 2 || len(p.Tests) != 2 || p.Rev != 12 {
		t.Fatalf("project after migration: %+v", p)
	}
	t0 := p.Tests[0]
	if !reflect.DeepEqual(t0.Readings, want.Tests[0].Readings) || t0.Fit != want.Tests[0].Fit ||
		t0.Result == nil || t0.Result.T != want.Tests[0].Result.T || p.Wells[1].ScreenTop.Text != "3O" {
		t.Errorf("first test after migration: %+v", t0)
	}
	if t1 := p.Tests[1]; t1.TimeMode != ClockTime || t1.Readings[0].TimeText != "09:16" || !t1.Start.Equal(time.Date(2026, 4, 8, 9, 15, 0, 0, time.UTC)) {
		t.Errorf("second test after migration: %+v", t1)
	}
	for i, tt := range p.Tests {
		if tt.Source != FromTape || tt.Logger != nil || tt.FitsLogger() {
			t.Errorf("test %d: source %q, logger %v", i+1, tt.Source, tt.Logger)
		}
	}
	// Written again, it is a file of the current version that reads back
	// the same.
	again, err := Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(again), fmt.Sprintf(`"version": %d`, Version)) {
		t.Errorf("a migrated project is not written as version %d", Version)
	}
	q, err := Unmarshal(again)
	if err != nil || !reflect.DeepEqual(p, q) {
		t.Errorf("the migrated project does not read back the same: %v", err)
	}
	// A version 1 file cannot hold logger records.
	bad := strings.Replace(string(data), `"source"`, `"x"`, 1)
	bad = strings.Replace(bad, `"readings": [`, `"logger": {}, "readings": [`, 1)
	if _, err := Unmarshal([]byte(bad)); !errors.Is(err, ErrMigration) {
		t.Errorf("version 1 file with logger records: err = %v, want ErrMigration", err)
	}
}

// bigProject is withLogger with a water record of a million readings.
func bigProject() *Project {
	p := withLogger()
	w := p.Tests[0].Logger.Water
	w.Time, w.Value = make(Samples, 1_000_000), make(Samples, 1_000_000)
	for i := range w.Time {
		w.Time[i] = 1715662800 + float64(i)
		w.Value[i] = 16.8 + 1e-6*float64(i%1000)
	}
	return p
}

// BenchmarkMarshalLogger1M writes a project holding a logger record of a
// million readings (each autosave after a big import does).
func BenchmarkMarshalLogger1M(b *testing.B) {
	p := bigProject()
	b.ReportAllocs()
	var n int
	for b.Loop() {
		data, err := Marshal(p)
		if err != nil {
			b.Fatal(err)
		}
		n = len(data)
	}
	b.ReportMetric(float64(n)/1e6, "MB")
}

// BenchmarkUnmarshalLogger1M reads it back (opening the project).
func BenchmarkUnmarshalLogger1M(b *testing.B) {
	data, err := Marshal(bigProject())
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Unmarshal(data); err != nil {
			b.Fatal(err)
		}
	}
}
