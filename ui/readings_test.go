package ui

import (
	"math"
	"reflect"
	"strings"
	"testing"
	"time"

	"fieldfit/ui/project"
)

func TestParseNumber(t *testing.T) {
	tests := []struct {
		in   string
		want float64
		ok   bool
	}{
		{"7.42", 7.42, true}, {" 7.42 ", 7.42, true}, {"7,42", 7.42, true}, {"-0.5", -0.5, true},
		{"−0.5", -0.5, true}, {"1e-3", 1e-3, true}, {"", 0, false}, {"abc", 0, false},
		{"1,234.5", 0, false}, {"NaN", 0, false}, {"Inf", 0, false}, {"7.4.2", 0, false}, {"1,2,3", 0, false},
	}
	for _, tt := range tests {
		got, err := parseNumber(tt.in)
		if (err == nil) != tt.ok || (tt.ok && got != tt.want) {
			t.Errorf("parseNumber(%q) = %v, %v; want %v ok=%v", tt.in, got, err, tt.want, tt.ok)
		}
	}
}

func TestParseClock(t *testing.T) {
	tests := []struct {
		in   string
		want float64
		ok   bool
	}{
		{"10:42", 10*3600 + 42*60, true}, {"10:42:30", 10*3600 + 42*60 + 30, true}, {"9h05", 9*3600 + 5*60, true},
		{"23.59", 23*3600 + 59*60, true}, {"00:00:00.5", 0.5, true},
		{"24:00", 0, false}, {"10:60", 0, false}, {"10", 0, false}, {"a:b", 0, false}, {"1:2:3:4", 0, false}, {":30", 0, false},
	}
	for _, tt := range tests {
		got, err := ParseClock(tt.in)
		if (err == nil) != tt.ok || (tt.ok && got != tt.want) {
			t.Errorf("ParseClock(%q) = %v, %v; want %v ok=%v", tt.in, got, err, tt.want, tt.ok)
		}
	}
}

func entryM(v float64) project.Entry {
	return project.Entry{Text: "x", Unit: "m", SI: v, OK: true}
}

func rows(pairs ...string) []project.Reading {
	var rs []project.Reading
	for i := 0; i+1 < len(pairs); i += 2 {
		rs = append(rs, project.Reading{TimeText: pairs[i], DepthText: pairs[i+1]})
	}
	return rs
}

func TestCheckReadings(t *testing.T) {
	tests := []struct {
		name     string
		mode     project.TimeMode
		readings []project.Reading
		// want[i] is a fragment of row i's messages ("" = none), usable[i]
		// whether it goes into the fit.
		want    []string
		usable  []bool
		elapsed []float64 // s, for the rows with a valid time (NaN = skip)
	}{
		{"good", project.ElapsedMinutes, rows("1", "7.50", "2", "7.61", "3,5", "7,70"),
			[]string{"", "", ""}, []bool{true, true, true}, []float64{60, 120, 210}},
		{"not a number", project.ElapsedMinutes, rows("1", "7.50", "two", "7.61", "3", "7.6l"),
			[]string{"", `Time "two" is not a number`, `Depth "7.6l" is not a number`}, []bool{true, false, false}, nil},
		{"non-increasing", project.ElapsedMinutes, rows("1", "7.50", "5", "7.6", "4", "7.65", "5", "7.66", "6", "7.7"),
			[]string{"", "", "not after the row above (5 min)", "not after the row above (5 min)", ""},
			[]bool{true, true, false, false, true}, nil},
		{"negative drawdown", project.ElapsedMinutes, rows("1", "7.30"),
			[]string{"Negative drawdown (−0.120 m)"}, []bool{false}, nil},
		{"zero time", project.ElapsedMinutes, rows("0", "7.42"),
			[]string{"not after the pump start"}, []bool{false}, nil},
		{"missing", project.ElapsedMinutes, rows("1", "", "", "7.5"),
			[]string{"Depth to water missing", "Time missing"}, []bool{false, false}, nil},
		{"blank row kept quiet", project.ElapsedMinutes, rows("1", "7.5", "", "", "2", "7.6"),
			[]string{"", "", ""}, []bool{true, false, true}, nil},
		{"clock", project.ClockTime, rows("09:01", "7.5", "09:02:30", "7.6", "9:1", "7.7"),
			[]string{"", "", "not after the row above"}, []bool{true, true, false}, []float64{60, 150}},
		{"clock past midnight", project.ClockTime, rows("23:30", "7.5", "00:30", "7.6"),
			[]string{"", ""}, []bool{true, true}, nil},
		{"clock bad", project.ClockTime, rows("9:75", "7.5"),
			[]string{`"9:75" is not a clock time`}, []bool{false}, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			test := &project.Test{TimeMode: tt.mode, StaticLevel: entryM(7.42),
				Start: time.Date(2026, 6, 1, 9, 0, 0, 0, time.UTC), Readings: tt.readings}
			if tt.name == "clock past midnight" {
				test.Start = time.Date(2026, 6, 1, 23, 0, 0, 0, time.UTC)
			}
			before := append([]project.Reading(nil), tt.readings...)
			checks := CheckReadings(test, mustUnit("m"))
			for i, c := range checks {
				msg := strings.Join(c.Messages, " ")
				if tt.want[i] == "" && msg != "" || !strings.Contains(msg, tt.want[i]) {
					t.Errorf("row %d messages %q, want %q", i, msg, tt.want[i])
				}
				if c.Usable != tt.usable[i] {
					t.Errorf("row %d usable = %v, want %v", i, c.Usable, tt.usable[i])
				}
				// The typed text is never changed.
				if test.Readings[i].TimeText != before[i].TimeText || test.Readings[i].DepthText != before[i].DepthText {
					t.Errorf("row %d text changed", i)
				}
			}
			for i, e := range tt.elapsed {
				if checks[i].Elapsed != e {
					t.Errorf("row %d elapsed = %v s, want %v", i, checks[i].Elapsed, e)
				}
			}
			if tt.name == "clock past midnight" && checks[1].Elapsed != 90*60 {
				t.Errorf("past midnight: elapsed = %v s, want 5400", checks[1].Elapsed)
			}
		})
	}
}

func TestDrawdownInFeet(t *testing.T) {
	// Static 24.30 ft typed in feet, depths in feet: drawdown in metres
	// is (25.30 − 24.30) ft × 0.3048 m/ft (international foot, exact).
	test := &project.Test{StaticLevel: project.Entry{Text: "24.30", Unit: "ft", SI: 24.30 * 0.3048, OK: true},
		DepthUnit: "ft", Readings: rows("1", "25.30")}
	c := CheckReadings(test, mustUnit("ft"))
	if math.Abs(c[0].Drawdown-0.3048) > 1e-12 {
		t.Errorf("drawdown = %v m, want 0.3048", c[0].Drawdown)
	}
}

func TestSetReading(t *testing.T) {
	test := &project.Test{}
	SetReading(test, 0, "time", "1")
	SetReading(test, 0, "depth", "7.5")
	SetReading(test, 1, "time", "2")
	if len(test.Readings) != 2 || test.Readings[1].TimeText != "2" {
		t.Fatalf("readings = %+v", test.Readings)
	}
	SetReading(test, 1, "time", "") // clearing the last row drops it
	if len(test.Readings) != 1 {
		t.Errorf("empty last row kept: %+v", test.Readings)
	}
	if SetReading(test, 5, "time", "x") || SetReading(test, 0, "level", "x") {
		t.Error("SetReading accepted a row past the end or an unknown field")
	}
	SetReading(test, 1, "time", "") // typing nothing in the empty row adds nothing
	if len(test.Readings) != 1 {
		t.Errorf("empty row added: %+v", test.Readings)
	}
}

func TestPasteReadings(t *testing.T) {
	tests := []struct {
		name  string
		start []project.Reading
		row   int
		field string
		text  string
		want  []project.Reading
		msg   string
	}{
		{"two columns with heading", nil, 0, "time", "Minutes\tDepth (m)\r\n1\t7.50\r\n2\t7.61\r\n",
			rows("1", "7.50", "2", "7.61"), `Pasted 2 rows. Skipped the heading line "Minutes\tDepth (m)".`},
		{"into the middle, overwriting", rows("1", "7.5", "2", "7.6", "3", "7.7"), 1, "time", "2.5\t7.65\n3.5\t7.75\n4\t7.8",
			rows("1", "7.5", "2.5", "7.65", "3.5", "7.75", "4", "7.8"), "Pasted 3 rows."},
		{"one column into depth", rows("1", "", "2", ""), 0, "depth", "7.5\n7.6",
			rows("1", "7.5", "2", "7.6"), "Pasted 2 rows."},
		{"extra columns", nil, 0, "time", "1\t7.5\t12:01\n2\t7.6\t12:02", rows("1", "7.5", "2", "7.6"),
			"Pasted 2 rows. 2 cells beyond the depth column were not used."},
		{"bad cells kept", nil, 0, "time", "1\tn/a\nx\t7.6", rows("1", "n/a", "x", "7.6"), "Pasted 2 rows."},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			test := &project.Test{Readings: append([]project.Reading(nil), tt.start...)}
			_, msg := PasteReadings(test, tt.row, tt.field, tt.text)
			if !reflect.DeepEqual(test.Readings, tt.want) {
				t.Errorf("readings = %+v, want %+v", test.Readings, tt.want)
			}
			if msg != tt.msg {
				t.Errorf("message %q, want %q", msg, tt.msg)
			}
		})
	}
	if IsPastable("7.5") || !IsPastable("1\t7.5") || !IsPastable("7.5\n7.6") {
		t.Error("IsPastable")
	}
}

func FuzzCheckReadings(f *testing.F) {
	f.Add("1\t7.5\n2\t7.6\n1,5\tx", false)
	f.Add("09:00\t7.5\n23:59:59\t8\n00:01\t9", true)
	f.Fuzz(func(t *testing.T, text string, clock bool) {
		test := &project.Test{StaticLevel: entryM(7.42), Start: time.Date(2026, 1, 1, 8, 0, 0, 0, time.UTC)}
		if clock {
			test.TimeMode = project.ClockTime
		}
		PasteReadings(test, 0, "time", text)
		before := append([]project.Reading(nil), test.Readings...)
		checks := CheckReadings(test, mustUnit("m"))
		if len(checks) != len(test.Readings) {
			t.Fatalf("%d checks for %d rows", len(checks), len(test.Readings))
		}
		prev := 0.0
		for i, c := range checks {
			if test.Readings[i].TimeText != before[i].TimeText || test.Readings[i].DepthText != before[i].DepthText {
				t.Fatalf("row %d text changed", i)
			}
			if c.Usable {
				if !(c.Elapsed > prev) || math.IsNaN(c.Drawdown) || c.Drawdown < 0 {
					t.Fatalf("row %d usable with t=%v (prev %v) s=%v", i, c.Elapsed, prev, c.Drawdown)
				}
				prev = c.Elapsed
			} else if !test.Readings[i].Blank() && len(c.Messages) == 0 {
				t.Fatalf("row %d %+v unusable without a message", i, test.Readings[i])
			}
		}
	})
}
