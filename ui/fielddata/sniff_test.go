package fielddata

import (
	"archive/zip"
	"bytes"
	"compress/gzip"
	"errors"
	"strings"
	"testing"
	"unicode/utf16"
)

func TestSniffFixtures(t *testing.T) {
	for _, tc := range []struct {
		file   string
		opt    Options
		time   TimeColumns
		values []ValueColumn
		// preamble keys and values expected in order ("" key: a line
		// without one)
		pre    [][2]string
		unsure []string // the Questions, by their first word(s)
		encWhy Confidence
	}{
		{
			file:   "semicolon-comma.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Semicolon, Decimal: CommaMark, HeaderRow: 5},
			time:   TimeColumns{Format: DateAndClock, Column: 0, ClockColumn: 1, Order: DayFirst},
			values: []ValueColumn{{Column: 2, Kind: Depth, Unit: "m"}},
			pre:    [][2]string{{"Site", "Larkspur Flats"}, {"Well", "LF-OB1"}, {"Logger serial", "FX-20417"}, {"Exported", "16.05.2024"}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
		{
			file: "utf16le-preamble.txt",
			opt:  Options{Encoding: UTF16LE, Delimiter: Tab, Decimal: Point, HeaderRow: 7},
			time: TimeColumns{Format: DateTime, Column: 0},
			// the unit comes from the preamble line "Units: m"
			values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}},
			pre:    [][2]string{{"", ""}, {"Serial number", "FX-20418"}, {"Site", "Larkspur Flats"}, {"Well", "LF-PW1"}, {"Units", "m"}, {"", ""}},
			encWhy: Sure,
		},
		{
			file:   "utf16be-nobom.csv",
			opt:    Options{Encoding: UTF16BE, Delimiter: Comma, Decimal: Point, HeaderRow: 1},
			time:   TimeColumns{Format: DateTime, Column: 0},
			values: []ValueColumn{{Column: 1, Kind: Pressure, Unit: "psi"}},
			encWhy: Likely,
		},
		{
			file:   "month-first.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 1},
			time:   TimeColumns{Format: DateTime, Column: 0, Order: MonthFirst},
			values: []ValueColumn{{Column: 1, Kind: Depth, Unit: "ft"}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
		{
			file:   "ambiguous-dates.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 1},
			time:   TimeColumns{Format: DateAndClock, Column: 0, ClockColumn: 1},
			values: []ValueColumn{{Column: 2, Kind: Level, Unit: "m"}},
			unsure: []string{"Date order", "Time zone"}, encWhy: Sure,
		},
		{
			file:   "elapsed-seconds.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 2},
			time:   TimeColumns{Format: Elapsed, Column: 0, Unit: "s"},
			values: []ValueColumn{{Column: 1, Kind: Depth, Unit: "m"}},
			pre:    [][2]string{{"", ""}},
			encWhy: Sure,
		},
		{
			file: "pressure-kpa.csv",
			opt:  Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 4},
			// the zone comes from the preamble line "Clock: UTC+02:00"
			time:   TimeColumns{Format: DateTime, Column: 0, Zone: "UTC+02:00"},
			values: []ValueColumn{{Column: 1, Kind: Pressure, Unit: "kPa"}},
			pre:    [][2]string{{"", ""}, {"Well", "LF-OB1"}, {"Clock", "UTC+02:00"}},
			encWhy: Sure,
		},
		{
			file:   "baro-mbar.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 3},
			time:   TimeColumns{Format: DateTime, Column: 0},
			values: []ValueColumn{{Column: 1, Kind: Pressure, Unit: "mbar"}},
			pre:    [][2]string{{"", ""}, {"Site", "Larkspur Flats"}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
		{
			file:   "gaps-duplicates.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 1},
			time:   TimeColumns{Format: DateTime, Column: 0},
			values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
		{
			file:   "garbage-rows.csv",
			opt:    Options{Encoding: UTF8, Delimiter: Comma, Decimal: Point, HeaderRow: 1},
			time:   TimeColumns{Format: DateTime, Column: 0},
			values: []ValueColumn{{Column: 1, Kind: Depth, Unit: "m"}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
		{
			file:   "latin1.csv",
			opt:    Options{Encoding: Latin1, Delimiter: Semicolon, Decimal: CommaMark, HeaderRow: 3},
			time:   TimeColumns{Format: DateTime, Column: 0},
			values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}},
			pre:    [][2]string{{"Site", "Larkspur Flats"}, {"Serial", "FX-20420"}},
			unsure: []string{"Time zone"}, encWhy: Likely,
		},
		{
			file:   "spaces.txt",
			opt:    Options{Encoding: UTF8, Delimiter: Spaces, Decimal: Point, HeaderRow: 2},
			time:   TimeColumns{Format: DateAndClock, Column: 0, ClockColumn: 1},
			values: []ValueColumn{{Column: 2, Kind: Level, Unit: "m"}},
			pre:    [][2]string{{"", ""}},
			unsure: []string{"Time zone"}, encWhy: Sure,
		},
	} {
		t.Run(tc.file, func(t *testing.T) {
			d, _ := sniffed(t, tc.file)
			if d.Options != tc.opt {
				t.Errorf("Options = %+v, want %+v", d.Options, tc.opt)
			}
			if d.Mapping.Time != tc.time {
				t.Errorf("Time = %+v, want %+v", d.Mapping.Time, tc.time)
			}
			if len(d.Mapping.Values) != len(tc.values) {
				t.Fatalf("Values = %+v, want %+v", d.Mapping.Values, tc.values)
			}
			for i, v := range tc.values {
				if d.Mapping.Values[i] != v {
					t.Errorf("Values[%d] = %+v, want %+v", i, d.Mapping.Values[i], v)
				}
			}
			if len(d.Preamble) != len(tc.pre) {
				t.Fatalf("Preamble = %+v, want %d lines", d.Preamble, len(tc.pre))
			}
			for i, p := range tc.pre {
				if d.Preamble[i].Key != p[0] || d.Preamble[i].Value != p[1] {
					t.Errorf("Preamble[%d] = %q: %q, want %q: %q", i, d.Preamble[i].Key, d.Preamble[i].Value, p[0], p[1])
				}
				if d.Preamble[i].Row != i+1 {
					t.Errorf("Preamble[%d].Row = %d", i, d.Preamble[i].Row)
				}
			}
			q := d.Questions()
			if len(q) != len(tc.unsure) {
				t.Fatalf("Questions = %q, want %q", q, tc.unsure)
			}
			for i, w := range tc.unsure {
				if !strings.HasPrefix(q[i], w+": ") {
					t.Errorf("Questions[%d] = %q, want it about %s", i, q[i], w)
				}
			}
			if d.Why.Encoding.Confidence != tc.encWhy {
				t.Errorf("encoding confidence %v (%s), want %v", d.Why.Encoding.Confidence, d.Why.Encoding.Reason, tc.encWhy)
			}
			for _, g := range []Guess{d.Why.Encoding, d.Why.Delimiter, d.Why.Decimal, d.Why.Layout, d.Why.Time, d.Why.DateOrder, d.Why.Zone} {
				if g.Reason == "" {
					t.Errorf("a choice has no reason: %+v", d.Why)
				}
			}
			if err := d.Mapping.Check(len(d.Header)); err != nil && tc.time.Order != "" {
				t.Errorf("Mapping.Check: %v", err)
			}
			if len(d.Rows) == 0 || len(d.Rows) != len(d.RowNumbers) {
				t.Errorf("Rows %d, RowNumbers %d", len(d.Rows), len(d.RowNumbers))
			}
		})
	}
}

func TestSniffDetails(t *testing.T) {
	t.Run("header names and units", func(t *testing.T) {
		d, _ := sniffed(t, "semicolon-comma.csv")
		want := []string{"Date", "Time", "Depth to water (m)", "Temperature (°C)"}
		if strings.Join(d.Header, "|") != strings.Join(want, "|") {
			t.Errorf("Header = %q", d.Header)
		}
		if d.Columns[3].Role != RoleNone || d.Columns[2].Role != RoleDepth || d.Columns[0].Role != RoleDate || d.Columns[1].Role != RoleClock {
			t.Errorf("roles %+v", d.Columns)
		}
		if d.Rows[0][2] != "12,300" || d.RowNumbers[0] != 6 {
			t.Errorf("first row %q at %d", d.Rows[0], d.RowNumbers[0])
		}
	})
	t.Run("latin-1 header decoded", func(t *testing.T) {
		d, _ := sniffed(t, "latin1.csv")
		if d.Header[2] != "Température (°C)" {
			t.Errorf("Header[2] = %q", d.Header[2])
		}
	})
	t.Run("windows-1252", func(t *testing.T) {
		// 0x80 is € in Windows-1252 and a control character in Latin-1.
		d, err := Sniff([]byte("Site;Cost \x80\nTime;Level (m)\n2024-05-14 08:00;1,5\n2024-05-14 08:01;1,6\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Options.Encoding != Windows1252 || d.Preamble[0].Value != "Cost €" {
			t.Errorf("encoding %s, preamble %+v", d.Options.Encoding, d.Preamble)
		}
	})
	t.Run("utf-8 bom", func(t *testing.T) {
		d, err := Sniff([]byte("\xef\xbb\xbfTime,Level (m)\n2024-05-14 08:00,1.5\n2024-05-14 08:01,1.6\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Options.Encoding != UTF8 || d.Why.Encoding.Confidence != Sure || d.Header[0] != "Time" {
			t.Errorf("%+v %q", d.Why.Encoding, d.Header)
		}
	})
	t.Run("utf-16le without bom", func(t *testing.T) {
		s := "Time\tLevel (m)\n2024-05-14 08:00\t1.5\n2024-05-14 08:01\t1.6\n"
		var b []byte
		for _, u := range utf16.Encode([]rune(s)) {
			b = append(b, byte(u), byte(u>>8))
		}
		d, err := Sniff(b)
		if err != nil {
			t.Fatal(err)
		}
		if d.Options.Encoding != UTF16LE || d.Options.Delimiter != Tab {
			t.Errorf("%+v", d.Options)
		}
	})
	t.Run("decimal point vs comma", func(t *testing.T) {
		for _, tc := range []struct {
			text string
			d    Delimiter
			m    DecimalMark
		}{
			{"1,5;2,3\n1,6;2,4\n1,7;2,5\n", Semicolon, CommaMark},
			{"1.5,2.3\n1.6,2.4\n1.7,2.5\n", Comma, Point},
			{"1,5\t2,3\n1,6\t2,4\n1,7\t2,5\n", Tab, CommaMark},
			{"1.5 2.3\n1.6  2.4\n 1.7 2.5\n", Spaces, Point},
			{"1;2\n3;4\n5;6\n", Semicolon, Point},
		} {
			d, err := Sniff([]byte(tc.text))
			if err != nil {
				t.Fatal(err)
			}
			if d.Options.Delimiter != tc.d || d.Options.Decimal != tc.m {
				t.Errorf("%q: %s %s, want %s %s", tc.text, d.Options.Delimiter, d.Options.Decimal, tc.d, tc.m)
			}
		}
	})
	t.Run("units row", func(t *testing.T) {
		d, err := Sniff([]byte("Date;Time;Level;Temperature\n;;m;°C\n14.05.2024;08:00;1,5;11\n14.05.2024;08:01;1,6;11\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Options.HeaderRow != 1 || d.Options.UnitsRow != 2 || d.Options.dataRow() != 3 {
			t.Errorf("%+v", d.Options)
		}
		if len(d.Mapping.Values) != 1 || d.Mapping.Values[0] != (ValueColumn{Column: 2, Kind: Level, Unit: "m"}) {
			t.Errorf("%+v", d.Mapping.Values)
		}
	})
	t.Run("no header", func(t *testing.T) {
		d, err := Sniff([]byte("2024-05-14T08:00:00Z,1.5\n2024-05-14T08:01:00Z,1.6\n2024-05-14T08:02:00Z,1.7\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Options.HeaderRow != 0 || d.Header[1] != "column 2" || d.HasHeader {
			t.Errorf("%+v %q", d.Options, d.Header)
		}
		// A number column without a name or unit is not mapped: the user
		// is asked.
		if len(d.Mapping.Values) != 0 || d.Columns[1].Why.Confidence != Unsure {
			t.Errorf("%+v %+v", d.Mapping.Values, d.Columns[1])
		}
	})
	t.Run("cut last line", func(t *testing.T) {
		d, err := Sniff([]byte("Time,Level (m)\n2024-05-14 08:00,1.5\n2024-05-14 08:01,1.6\n2024-05-14 08:0"))
		if err != nil {
			t.Fatal(err)
		}
		if !d.Cut || len(d.Rows) != 2 {
			t.Errorf("Cut %v, rows %q", d.Cut, d.Rows)
		}
	})
	t.Run("cr line ends", func(t *testing.T) {
		d, err := Sniff([]byte("Time,Level (m)\r2024-05-14 08:00,1.5\r2024-05-14 08:01,1.6\r"))
		if err != nil {
			t.Fatal(err)
		}
		if len(d.Rows) != 2 || d.RowNumbers[1] != 3 || d.Header[1] != "Level (m)" {
			t.Errorf("%q %v %q", d.Rows, d.RowNumbers, d.Header)
		}
	})
	t.Run("contradicting dates", func(t *testing.T) {
		d, err := Sniff([]byte("Date,Level (m)\n13/05/2024 08:00,1\n05/14/2024 08:00,2\n05/15/2024 08:00,3\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Mapping.Time.Order != "" || d.Why.DateOrder.Confidence != Unsure || !strings.Contains(d.Why.DateOrder.Reason, "row 2") {
			t.Errorf("%+v", d.Why.DateOrder)
		}
	})
	t.Run("elapsed without unit", func(t *testing.T) {
		d, err := Sniff([]byte("Time,Depth to water (m)\n0,5.1\n10,5.2\n20,5.3\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Mapping.Time != (TimeColumns{Format: Elapsed, Column: 0, Unit: "s"}) || d.Why.Time.Confidence != Unsure {
			t.Errorf("%+v %+v", d.Mapping.Time, d.Why.Time)
		}
	})
	t.Run("elapsed minutes", func(t *testing.T) {
		d, err := Sniff([]byte("t (min);Level (m)\n0;5,1\n0,5;5,2\n1;5,3\n"))
		if err != nil {
			t.Fatal(err)
		}
		if d.Mapping.Time != (TimeColumns{Format: Elapsed, Column: 0, Unit: "min"}) {
			t.Errorf("%+v", d.Mapping.Time)
		}
	})
}

func TestSniffNotText(t *testing.T) {
	var zb bytes.Buffer
	zw := zip.NewWriter(&zb)
	w, _ := zw.Create("sheet.csv")
	w.Write([]byte("Time,Level\n"))
	zw.Close()
	var gb bytes.Buffer
	gw := gzip.NewWriter(&gb)
	gw.Write([]byte("Time,Level\n2024-05-14 08:00,1\n"))
	gw.Close()
	bin := make([]byte, 512)
	for i := range bin {
		bin[i] = byte(i * 7)
	}
	ctrl := bytes.Repeat([]byte("a\x01\x02\x03,1\n"), 50)
	for _, tc := range []struct {
		name string
		data []byte
		kind string
	}{
		{"zip", zb.Bytes(), "ZIP archive"},
		{"png", []byte("\x89PNG\r\n\x1a\n\x00\x00\x00\rIHDR"), "PNG image"},
		{"jpeg", []byte("\xff\xd8\xff\xe0\x00\x10JFIF"), "JPEG image"},
		{"pdf", []byte("%PDF-1.7\n%\xe2\xe3\xcf\xd3\n"), "PDF document"},
		{"gzip", gb.Bytes(), "gzip"},
		{"binary", bin, "binary data"},
		{"control characters", ctrl, "control characters"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := Sniff(tc.data)
			var nt *NotTextError
			if !errors.As(err, &nt) || !errors.Is(err, ErrNotText) {
				t.Fatalf("err = %v, want a *NotTextError", err)
			}
			msg := err.Error()
			if !strings.Contains(msg, tc.kind) || strings.Count(msg, ". ") > 0 || !strings.HasSuffix(msg, ".") {
				t.Errorf("message %q: want one sentence naming %q", msg, tc.kind)
			}
		})
	}
	for _, empty := range [][]byte{nil, []byte(""), []byte("\n\n  \n")} {
		if _, err := Sniff(empty); !errors.Is(err, ErrEmpty) {
			t.Errorf("Sniff(%q) = %v, want ErrEmpty", empty, err)
		}
	}
}

func TestInspect(t *testing.T) {
	b := fixture(t, "semicolon-comma.csv")
	// The user says the header is on line 4 instead: line 5 becomes the
	// first data row, 1–3 the preamble.
	l, err := Inspect(b, Options{Delimiter: Semicolon, Decimal: CommaMark, HeaderRow: 4})
	if err != nil {
		t.Fatal(err)
	}
	if l.Header[0] != "Exported" || len(l.Preamble) != 3 || l.RowNumbers[0] != 5 || l.Rows[0][0] != "Date" {
		t.Errorf("header %q, preamble %d, first row %d %q", l.Header, len(l.Preamble), l.RowNumbers[0], l.Rows[0])
	}
	// With a comma delimiter the rows do not split at the semicolons.
	l, err = Inspect(b, Options{Delimiter: Comma, HeaderRow: 5})
	if err != nil {
		t.Fatal(err)
	}
	if l.Rows[0][0] != "14.05.2024;23:55:00;12" {
		t.Errorf("first cell %q", l.Rows[0][0])
	}
	if _, err := Inspect(b, Options{Delimiter: Comma, Decimal: CommaMark}); !errors.Is(err, ErrOption) {
		t.Errorf("decimal comma with comma delimiter: %v, want ErrOption", err)
	}
}
