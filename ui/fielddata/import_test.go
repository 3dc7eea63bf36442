package fielddata

import (
	"bufio"
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// Reference §9 (NIST SP 811 (2008) App. B, CGPM 1901): the factors the
// expected values below are computed with, written out here rather than
// taken from package units.
const (
	refPsi  = 6894.757293 // Pa
	refFoot = 0.3048      // m
	refInch = 0.0254      // m
	refMbar = 100.0       // Pa
	refRho  = 999.97      // kg/m³, water at 4 °C
	refG    = 9.80665     // m/s², standard gravity
)

func TestImportFixtures(t *testing.T) {
	type want struct {
		n            int
		firstRow     int
		first, last  float64 // times
		v0, vLast    float64 // first value column
		clock        bool
		preamble     int
		header0      string
		unit, column string
	}
	for _, tc := range []struct {
		file string
		zone string
		w    want
	}{
		{"semicolon-comma.csv", "", want{11, 6, unix(2024, 5, 14, 23, 55, 0), unix(2024, 5, 15, 0, 5, 0), 12.300, 12.350, true, 4, "Date", "m", "Depth to water (m)"}},
		{"semicolon-comma.csv", "+02:00", want{11, 6, unix(2024, 5, 14, 21, 55, 0), unix(2024, 5, 14, 22, 5, 0), 12.300, 12.350, true, 4, "Date", "m", "Depth to water (m)"}},
		{"utf16le-preamble.txt", "", want{40, 8, unix(2024, 5, 14, 6, 0, 0), unix(2024, 5, 14, 6, 0, 0) + 39*30.25, 101.250, 101.250 - 0.004*39, true, 6, "Date and time", "m", "Level"}},
		{"utf16be-nobom.csv", "", want{10, 2, unix(2024, 5, 14, 6, 0, 0), unix(2024, 5, 14, 6, 9, 0), 14.5 * refPsi / (refRho * refG), 15.4 * refPsi / (refRho * refG), true, 0, "Timestamp", "psi", "Pressure (psi)"}},
		{"month-first.csv", "", want{13, 2, unix(2024, 5, 14, 11, 55, 0), unix(2024, 5, 15, 0, 30, 0), 40.00 * refFoot, 40.12 * refFoot, true, 0, "Date and time", "ft", "Depth to water (ft)"}},
		{"elapsed-seconds.csv", "", want{37, 3, -120, 3600, 8.0, 8.0 + 0.45*math.Log10(1+3600.0/30), false, 1, "Elapsed time (s)", "m", "Depth to water (m)"}},
		{"latin1.csv", "", want{10, 4, unix(2024, 5, 14, 8, 0, 0), unix(2024, 5, 14, 8, 9, 0), 101.25, 101.16, true, 2, "Date/heure", "m", "Water level (m)"}},
		{"spaces.txt", "", want{12, 3, unix(2024, 5, 14, 8, 0, 0), unix(2024, 5, 14, 8, 55, 0), 98.412, 98.192, true, 1, "Date", "m", "Level(m)"}},
		{"baro-mbar.csv", "", want{65, 4, unix(2024, 5, 14, 6, 50, 0), unix(2024, 5, 14, 12, 10, 0), 1012.0 * refMbar / (refRho * refG), 1011.1 * refMbar / (refRho * refG), true, 2, "Date time", "mbar", "Barometric pressure (mbar)"}},
	} {
		t.Run(tc.file+tc.zone, func(t *testing.T) {
			d, b := sniffed(t, tc.file)
			m := d.Mapping
			m.Time.Zone = tc.zone
			rec, err := importBytes(b, d.Options, m, &ImportSettings{Size: int64(len(b))})
			if err != nil {
				t.Fatal(err)
			}
			w := tc.w
			if rec.Len() != w.n || len(rec.Row) != w.n || len(rec.Columns[0].Values) != w.n {
				t.Fatalf("%d readings (%d rows, %d values), want %d", rec.Len(), len(rec.Row), len(rec.Columns[0].Values), w.n)
			}
			if int(rec.Row[0]) != w.firstRow {
				t.Errorf("first row %d, want %d", rec.Row[0], w.firstRow)
			}
			if !closeTo(rec.Time[0], w.first, 1e-12) || !closeTo(rec.Time[w.n-1], w.last, 1e-12) {
				t.Errorf("times %s … %s, want %s … %s", FormatTime(rec.Time[0], rec.Clock), FormatTime(rec.Time[w.n-1], rec.Clock),
					FormatTime(w.first, rec.Clock), FormatTime(w.last, rec.Clock))
			}
			v := rec.Columns[0].Values
			if !closeTo(v[0], w.v0, 1e-4/w.v0) || !closeTo(v[w.n-1], w.vLast, 1e-4/w.vLast) {
				t.Errorf("values %.6f … %.6f, want %.6f … %.6f", v[0], v[w.n-1], w.v0, w.vLast)
			}
			if rec.Clock != w.clock || len(rec.Preamble) != w.preamble || rec.Header[0] != w.header0 {
				t.Errorf("clock %v, preamble %d, header %q", rec.Clock, len(rec.Preamble), rec.Header)
			}
			if c := rec.Columns[0]; c.Unit != w.unit || c.Name != w.column {
				t.Errorf("column %+v", c)
			}
			gaps := 0
			if tc.file == "month-first.csv" {
				gaps = 1 // 13:30 to 00:30 after half-hour readings
			}
			if !rec.Complete || rec.BadCount != 0 || rec.Checks.GapCount != gaps || rec.Checks.DuplicateCount+rec.Checks.BackwardCount != 0 {
				t.Errorf("complete %v, bad %d, checks %+v", rec.Complete, rec.BadCount, rec.Checks)
			}
		})
	}
}

func TestConversions(t *testing.T) {
	// One reading per unit; expected metres from the reference §9
	// factors above.
	head := func(pa, rho float64) float64 { return pa / (rho * refG) }
	for _, tc := range []struct {
		kind    ValueKind
		unit    string
		density float64
		value   string
		want    float64
	}{
		{Pressure, "Pa", 0, "9806.3558005", 1},
		{Pressure, "kPa", 0, "100", head(100e3, refRho)},                // 10.1974680538209 m (mpmath)
		{Pressure, "kPa", 998.2, "100", head(100e3, 998.2)},             // 10.2155501199953 m (mpmath)
		{Pressure, "mbar", 0, "1013.25", head(1013.25*refMbar, refRho)}, // 10.3325845055340 m (mpmath)
		{Pressure, "hPa", 0, "1013.25", head(1013.25*refMbar, refRho)},
		{Pressure, "psi", 0, "10", head(10*refPsi, refRho)}, // 7.03090672342161 m (mpmath)
		{Pressure, "m H₂O", 0, "1", 1},
		{Pressure, "m H₂O", 998.2, "1", refRho / 998.2}, // 1.00177319174514 (mpmath)
		{Pressure, "m", 0, "2.5", 2.5},                  // a length for a pressure: a water column
		{Pressure, "cm H₂O", 0, "250", 2.5},
		{Pressure, "ft H₂O", 0, "10", 10 * refFoot},
		{Pressure, "in H₂O", 0, "10", 10 * refInch},
		{Depth, "ft", 0, "12.5", 12.5 * refFoot},
		{Depth, "in", 0, "12.5", 12.5 * refInch},
		{Level, "cm", 998.2, "1234.5", 12.345}, // density does not touch lengths
		{Level, "m", 0, "-3.25", -3.25},
	} {
		m := Mapping{Time: TimeColumns{Format: Elapsed}, Values: []ValueColumn{{Column: 1, Kind: tc.kind, Unit: tc.unit}}, Density: tc.density}
		rec, err := importBytes([]byte("0,"+tc.value+"\n"), Options{}, m, nil)
		if err != nil {
			t.Errorf("%s %s: %v", tc.kind, tc.unit, err)
			continue
		}
		if got := rec.Columns[0].Values[0]; !closeTo(got, tc.want, 1e-10) {
			t.Errorf("%s %s %s (ρ %g): %.12g m, want %.12g", tc.value, tc.unit, tc.kind, tc.density, got, tc.want)
		}
		if tc.kind == Pressure && rec.Columns[0].Density != m.density() {
			t.Errorf("density %g not recorded", rec.Columns[0].Density)
		}
	}
}

func TestBadRows(t *testing.T) {
	b := fixture(t, "garbage-rows.csv")
	d, _ := sniffed(t, "garbage-rows.csv")
	wantBad := []struct {
		row  int
		col  int
		err  error
		text string
	}{
		{4, 1, ErrNotNumber, `row 4, column "Depth to water (m)": "n/a" is not a number`},
		{7, 1, ErrMissing, `row 7, column "Depth to water (m)": the cell is empty`},
		{8, -1, ErrFields, `row 8: "2024-05-14 08:05:00" too few fields: 1 of the 2 needed`},
		{9, 0, ErrTime, `row 9, column "Time": "2024-13-01 08:06:00" is not a time (month 13)`},
		{11, 0, ErrTime, `row 11, column "Time": "ERR" is not a time`},
		{13, 1, ErrNotNumber, `row 13, column "Depth to water (m)": "5.1.65" is not a number`},
		{14, 0, ErrTime, `row 14, column "Time": "2024-05-14 25:10:00" is not a time (25:10:00 is not a time of day)`},
		{17, -1, ErrFields, `row 17: "END OF DATA" too few fields: 1 of the 2 needed`},
	}
	goodRows := []int32{2, 3, 5, 10, 12, 15, 16}

	t.Run("collect", func(t *testing.T) {
		rec, err := importBytes(b, d.Options, d.Mapping, nil)
		var bre *BadRowsError
		if !errors.As(err, &bre) || !errors.Is(err, ErrBadRows) || bre.Count != len(wantBad) {
			t.Fatalf("err = %v, want a *BadRowsError of %d rows", err, len(wantBad))
		}
		var re *RowError
		if !errors.As(err, &re) || re.Row != 4 {
			t.Errorf("errors.As RowError: %v", re)
		}
		if rec == nil || rec.BadCount != len(wantBad) || len(rec.Bad) != len(wantBad) {
			t.Fatalf("record %+v", rec)
		}
		for i, w := range wantBad {
			e := rec.Bad[i]
			if e.Row != w.row || e.Column != w.col || !errors.Is(e, w.err) || e.Error() != w.text {
				t.Errorf("Bad[%d] = %v (row %d, column %d), want %s", i, e, e.Row, e.Column, w.text)
			}
		}
		if fmt.Sprint(rec.Row) != fmt.Sprint(goodRows) || rec.Blank != 1 {
			t.Errorf("rows read %v, blank %d; want %v, 1", rec.Row, rec.Blank, goodRows)
		}
		// The quoted value "5.175" of row 15 is read.
		if v := rec.Columns[0].Values[5]; v != 5.175 {
			t.Errorf("row 15: %v", v)
		}
	})
	t.Run("skip", func(t *testing.T) {
		rec, err := importBytes(b, d.Options, d.Mapping, &ImportSettings{BadRows: SkipBadRows})
		if err != nil || rec.BadCount != len(wantBad) || rec.Len() != len(goodRows) {
			t.Errorf("err %v, bad %d, readings %d", err, rec.BadCount, rec.Len())
		}
	})
	t.Run("stop", func(t *testing.T) {
		rec, err := importBytes(b, d.Options, d.Mapping, &ImportSettings{BadRows: StopAtBadRow})
		var re *RowError
		if !errors.As(err, &re) || re.Row != 4 || !errors.Is(err, ErrNotNumber) {
			t.Fatalf("err = %v", err)
		}
		if rec.Len() != 2 || rec.Complete || rec.BadCount != 1 {
			t.Errorf("readings %d, complete %v, bad %d", rec.Len(), rec.Complete, rec.BadCount)
		}
	})
	t.Run("listed and counted", func(t *testing.T) {
		rec, _ := importBytes(b, d.Options, d.Mapping, &ImportSettings{MaxListed: 3})
		if len(rec.Bad) != 3 || rec.BadCount != len(wantBad) {
			t.Errorf("listed %d, counted %d", len(rec.Bad), rec.BadCount)
		}
	})
	t.Run("wrong decimal mark named", func(t *testing.T) {
		m := Mapping{Time: TimeColumns{Format: Elapsed}, Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}}}
		rec, _ := importBytes([]byte("0;1.5\n"), Options{Delimiter: Semicolon, Decimal: CommaMark}, m, &ImportSettings{BadRows: SkipBadRows})
		if len(rec.Bad) != 1 || !strings.HasSuffix(rec.Bad[0].Error(), `"1.5" is not a number with a decimal comma`) {
			t.Errorf("%v", rec.Bad)
		}
	})
	t.Run("nothing readable", func(t *testing.T) {
		m := Mapping{Time: TimeColumns{Format: Elapsed}, Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}}}
		if _, err := importBytes([]byte("\n\n"), Options{}, m, nil); !errors.Is(err, ErrNoData) {
			t.Errorf("blank file: %v", err)
		}
		if _, err := importBytes([]byte("a,b\n"), Options{}, m, &ImportSettings{BadRows: SkipBadRows}); !errors.Is(err, ErrBadRows) {
			t.Errorf("only bad rows: %v", err)
		}
	})
}

func TestChecks(t *testing.T) {
	d, b := sniffed(t, "gaps-duplicates.csv")
	rec, err := importBytes(b, d.Options, d.Mapping, nil)
	if err != nil {
		t.Fatal(err)
	}
	c := rec.Checks
	wantDup := []Duplicate{
		{Row: 13, PrevRow: 12, Time: unix(2024, 5, 14, 8, 10, 0), Same: true},
		{Row: 24, PrevRow: 23, Time: unix(2024, 5, 14, 8, 20, 0), Same: false},
	}
	if c.DuplicateCount != 2 || fmt.Sprint(c.Duplicates) != fmt.Sprint(wantDup) {
		t.Errorf("duplicates %+v", c.Duplicates)
	}
	wantGap := []Gap{{PrevRow: 34, Row: 35, From: unix(2024, 5, 14, 8, 30, 0), To: unix(2024, 5, 14, 9, 15, 0), Around: 60}}
	if c.GapCount != 1 || fmt.Sprint(c.Gaps) != fmt.Sprint(wantGap) {
		t.Errorf("gaps %+v", c.Gaps)
	}
	wantBack := []Backward{{Row: 41, PrevRow: 40, Time: unix(2024, 5, 14, 9, 19, 30), Prev: unix(2024, 5, 14, 9, 20, 0)}}
	if c.BackwardCount != 1 || fmt.Sprint(c.Backward) != fmt.Sprint(wantBack) {
		t.Errorf("backward %+v", c.Backward)
	}
	if c.Interval != 60 {
		t.Errorf("interval %v", c.Interval)
	}
	// Log-spaced readings (intervals growing steadily) have no gap.
	d, b = sniffed(t, "elapsed-seconds.csv")
	rec, _ = importBytes(b, d.Options, d.Mapping, nil)
	if rec.Checks.GapCount != 0 {
		t.Errorf("log-spaced readings: gaps %+v", rec.Checks.Gaps)
	}
}

func TestDateOrder(t *testing.T) {
	d, b := sniffed(t, "ambiguous-dates.csv")
	_, err := importBytes(b, d.Options, d.Mapping, nil)
	var re *RowError
	if !errors.As(err, &re) || !errors.Is(err, ErrDateOrder) || re.Row != 2 || re.Name != "Date" {
		t.Fatalf("unset order: %v", err)
	}
	for _, tc := range []struct {
		order DateOrder
		last  float64
	}{
		{DayFirst, unix(2024, 6, 5, 20, 0, 0)},   // 05/06/2024 20:00 is 5 June
		{MonthFirst, unix(2024, 5, 6, 20, 0, 0)}, // or 6 May
	} {
		m := d.Mapping
		m.Time.Order = tc.order
		rec, err := importBytes(b, d.Options, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		if rec.Time[3] != tc.last {
			t.Errorf("%s: row 5 at %s", tc.order, FormatTime(rec.Time[3], true))
		}
	}
	// A file whose first SampleSize bytes are ambiguous but which has a
	// day 13 further down: Sniff asks, ScanDateOrder settles it.
	var buf bytes.Buffer
	buf.WriteString("Date,Time,Level (m)\n")
	row := 1
	for day := 1; day <= 13; day++ {
		for m := 0; m < 24*60; m += 5 {
			fmt.Fprintf(&buf, "%02d/06/2024,%02d:%02d,%.3f\n", day, m/60, m%60, 45.0)
			row++
		}
	}
	dayRow := row - 24*12 + 1
	full := buf.Bytes()
	ds, err := Sniff(full[:SampleSize])
	if err != nil {
		t.Fatal(err)
	}
	if ds.Mapping.Time.Order != "" || ds.Why.DateOrder.Confidence != Unsure {
		t.Fatalf("sample: %+v", ds.Why.DateOrder)
	}
	scan, err := ScanDateOrder(context.Background(), bytes.NewReader(full), ds.Options, ds.Mapping)
	if err != nil {
		t.Fatal(err)
	}
	if scan.Order != DayFirst || scan.DayFirstRow != dayRow || scan.MonthFirstRow != 0 || scan.Why.Confidence != Sure {
		t.Errorf("scan %+v, want day-first from row %d", scan, dayRow)
	}
	scan, _ = ScanDateOrder(context.Background(), bytes.NewReader(full[:SampleSize]), ds.Options, ds.Mapping)
	if scan.Order != "" || scan.Why.Confidence != Unsure {
		t.Errorf("scan of the ambiguous part: %+v", scan)
	}
}

func TestPreview(t *testing.T) {
	b := fixture(t, "garbage-rows.csv")
	d, _ := sniffed(t, "garbage-rows.csv")
	rec, err := Preview(b, d.Options, d.Mapping, 5)
	if err != nil {
		t.Fatal(err)
	}
	// Five data rows: 2, 3, 4 (bad), 5, 7 (bad) — the blank row 6 is not one.
	if rec.Len() != 3 || rec.BadCount != 2 || rec.Bad[1].Row != 7 {
		t.Errorf("readings %d, bad %v", rec.Len(), rec.Bad)
	}
	// A sample cut in the middle of a line: the piece is left out.
	cut := fixture(t, "pressure-kpa.csv")[:1000]
	ds, err := Sniff(cut)
	if err != nil {
		t.Fatal(err)
	}
	rec, err = Preview(cut, ds.Options, ds.Mapping, 0)
	if err != nil || rec.BadCount != 0 || rec.Len() != len(ds.Rows) {
		t.Errorf("cut sample: err %v, bad %v, %d readings, %d preview rows", err, rec.Bad, rec.Len(), len(ds.Rows))
	}
	u16, _ := sniffed(t, "utf16le-preamble.txt")
	rec, err = Preview(fixture(t, "utf16le-preamble.txt"), u16.Options, u16.Mapping, 3)
	if err != nil || rec.Len() != 3 || rec.Options.Encoding != UTF16LE {
		t.Errorf("utf-16 preview: %v %d", err, rec.Len())
	}
	if _, err := Preview(b, d.Options, Mapping{}, 0); !errors.Is(err, ErrMapping) {
		t.Errorf("empty mapping: %v", err)
	}
}

func TestMappingCheck(t *testing.T) {
	good := Mapping{Time: TimeColumns{Format: DateAndClock, Column: 0, ClockColumn: 1}, Values: []ValueColumn{{Column: 2, Kind: Depth, Unit: "m"}}}
	if err := good.Check(3); err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		field string
		edit  func(m *Mapping)
	}{
		{"time.column", func(m *Mapping) { m.Time.Column = -1 }},
		{"time.column", func(m *Mapping) { m.Time.Column = 1 }}, // the clock's column
		{"values[0].column", func(m *Mapping) { m.Values[0].Column = 3 }},
		{"values[0].unit", func(m *Mapping) { m.Values[0].Unit = "" }},
		{"values[0].unit", func(m *Mapping) { m.Values[0].Unit = "furlong" }},
		{"values[0].unit", func(m *Mapping) { m.Values[0].Unit = "kPa" }}, // a depth in kPa
		{"values[0].unit", func(m *Mapping) { m.Values[0].Kind, m.Values[0].Unit = Pressure, "L/s" }},
		{"values[0].kind", func(m *Mapping) { m.Values[0].Kind = "salinity" }},
		{"values", func(m *Mapping) { m.Values = nil }},
		{"time.zone", func(m *Mapping) { m.Time.Zone = "Nowhere/Special" }},
		{"time.order", func(m *Mapping) { m.Time.Order = "year-first" }},
		{"time.format", func(m *Mapping) { m.Time.Format = "julian" }},
		{"time.unit", func(m *Mapping) { m.Time.Format, m.Time.Unit = Elapsed, "m" }},
		{"density", func(m *Mapping) { m.Density = 13.6 }},
		{"density", func(m *Mapping) { m.Density = math.NaN() }},
	} {
		m := good
		m.Values = append([]ValueColumn(nil), good.Values...)
		tc.edit(&m)
		err := m.Check(3)
		var se *SettingError
		if !errors.As(err, &se) || se.Field != tc.field || !errors.Is(err, ErrMapping) {
			t.Errorf("%s: %v", tc.field, err)
		}
	}
	for _, o := range []Options{{Encoding: "ebcdic"}, {Delimiter: "pipe"}, {Decimal: "dot"}, {HeaderRow: -1},
		{HeaderRow: 3, DataRow: 2}, {UnitsRow: 2, HeaderRow: 2}, {Decimal: CommaMark}} {
		if err := o.Check(); !errors.Is(err, ErrOption) {
			t.Errorf("Options %+v: %v", o, err)
		}
	}
}

// bigFile writes about size bytes of a logger file: ISO times with
// fractions and two value columns.
func bigFile(w *bufio.Writer, size int) (rows int) {
	n := 0
	for i := 0; n < size; i++ {
		sec := i % 60
		min := (i / 60) % 60
		hour := (i / 3600) % 24
		day := 1 + i/86400
		k, _ := fmt.Fprintf(w, "2024-05-%02dT%02d:%02d:%02d.500Z,%.4f,%.3f\n", day, hour, min, sec, 12+float64(i%1000)*1e-4, 101.325)
		n += k
		rows++
	}
	return rows
}

func TestImportLargeFile(t *testing.T) {
	if testing.Short() {
		t.Skip("20 MB file")
	}
	path := filepath.Join(t.TempDir(), "large.csv")
	f, err := os.Create(path)
	if err != nil {
		t.Fatal(err)
	}
	w := bufio.NewWriter(f)
	w.WriteString("Time,Pressure (kPa),Barometer (kPa)\n")
	rows := bigFile(w, 20<<20)
	w.Flush()
	f.Close()
	st, _ := os.Stat(path)
	f, _ = os.Open(path)
	defer f.Close()
	var calls []float64
	m := Mapping{Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}, {Column: 2, Kind: Pressure, Unit: "kPa"}}}
	rec, err := Import(context.Background(), f, Options{HeaderRow: 1}, m, &ImportSettings{Size: st.Size(), Progress: func(x float64) { calls = append(calls, x) }})
	if err != nil {
		t.Fatal(err)
	}
	if rec.Len() != rows || !rec.Complete || !rec.Checks.OK() {
		t.Fatalf("%d readings of %d, checks %+v", rec.Len(), rows, rec.Checks)
	}
	last := rows - 1
	if want := unix(2024, 5, 1+last/86400, last/3600%24, last/60%60, last%60) + 0.5; rec.Time[last] != want {
		t.Errorf("last time %s, want %s", FormatTime(rec.Time[last], true), FormatTime(want, true))
	}
	if v := rec.Columns[0].Values[last]; !closeTo(v, 12+float64(last%1000)*1e-4, 1e-12) {
		t.Errorf("last value %v", v)
	}
	if len(calls) < 50 || calls[len(calls)-1] != 1 {
		t.Errorf("progress called %d times, last %v", len(calls), calls[len(calls)-1])
	}
	for i := 1; i < len(calls); i++ {
		if calls[i] < calls[i-1] {
			t.Errorf("progress went back: %v after %v", calls[i], calls[i-1])
		}
	}
}

func TestImportCancel(t *testing.T) {
	var buf bytes.Buffer
	w := bufio.NewWriter(&buf)
	bigFile(w, 4<<20)
	w.Flush()
	ctx, cancel := context.WithCancel(context.Background())
	defer cancel()
	m := Mapping{Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}}}
	rec, err := Import(ctx, bytes.NewReader(buf.Bytes()), Options{}, m, &ImportSettings{Size: int64(buf.Len()), Progress: func(x float64) {
		if x > 0.2 {
			cancel()
		}
	}})
	if !errors.Is(err, context.Canceled) || !strings.Contains(err.Error(), "row ") {
		t.Fatalf("err = %v", err)
	}
	if rec == nil || rec.Complete || rec.Len() == 0 {
		t.Errorf("partial record %+v", rec)
	}
}

func TestLineEnds(t *testing.T) {
	m := Mapping{Time: TimeColumns{Format: Elapsed}, Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}}}
	for _, text := range []string{"0,1\n1,2\n2,3\n", "0,1\r\n1,2\r\n2,3\r\n", "0,1\r1,2\r2,3\r", "0,1\n1,2\r\n2,3", "\xef\xbb\xbf0,1\n1,2\n2,3\n"} {
		rec, err := importBytes([]byte(text), Options{}, m, nil)
		if err != nil || fmt.Sprint(rec.Time, rec.Columns[0].Values, rec.Row) != "[0 1 2] [1 2 3] [1 2 3]" {
			t.Errorf("%q: %v %v", text, err, rec)
		}
	}
	// A line end split across reads (CR at the end of one read, LF at the
	// start of the next) is one line end.
	r := &oneByteReader{data: []byte("0,1\r\n1,2\r\n")}
	rec, err := Import(context.Background(), r, Options{}, m, nil)
	if err != nil || rec.Len() != 2 || rec.Blank != 0 || rec.Row[1] != 2 {
		t.Errorf("one byte at a time: %v %+v", err, rec)
	}
	// An overlong line stops the import, naming it.
	long := append([]byte("0,1\n"), bytes.Repeat([]byte("9"), MaxLine+10)...)
	_, err = importBytes(long, Options{}, m, nil)
	var re *RowError
	if !errors.As(err, &re) || re.Row != 2 || !errors.Is(err, ErrLineTooLong) {
		t.Errorf("long line: %v", err)
	}
}

type oneByteReader struct{ data []byte }

func (r *oneByteReader) Read(p []byte) (int, error) {
	if len(r.data) == 0 {
		return 0, io.EOF
	}
	p[0] = r.data[0]
	r.data = r.data[1:]
	return 1, nil
}
