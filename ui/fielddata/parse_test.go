package fielddata

import (
	"errors"
	"math"
	"strconv"
	"strings"
	"testing"
	"time"
	_ "time/tzdata" // the zone names of the tests, whatever the machine has
)

func TestParseNumber(t *testing.T) {
	for _, tc := range []struct {
		in   string
		mark byte
		want float64
		ok   bool
	}{
		{"12.345", '.', 12.345, true},
		{"12,345", ',', 12.345, true},
		{" -0.5 ", '.', -0.5, true},
		{"+3", '.', 3, true},
		{".5", '.', 0.5, true},
		{"5.", '.', 5, true},
		{"1e3", '.', 1000, true},
		{"1,5E-3", ',', 0.0015, true},
		{"0.1", '.', 0.1, true},
		{"123456789012345678901234", '.', 1.2345678901234568e23, true},
		{"0.000000000000000000000000001", '.', 1e-27, true},
		{"9007199254740993", '.', 9007199254740992, true}, // 2^53+1 rounds to even
		{"12,345", '.', 0, false},
		{"12.345", ',', 0, false},
		{"1.234,5", ',', 0, false}, // thousands separators are not read
		{"1 234", '.', 0, false},
		{"", '.', 0, false},
		{"-", '.', 0, false},
		{".", '.', 0, false},
		{"1e", '.', 0, false},
		{"NaN", '.', 0, false},
		{"Inf", '.', 0, false},
		{"1e400", '.', 0, false},
		{"0x10", '.', 0, false},
		{"1_000", '.', 0, false},
		{"n/a", '.', 0, false},
	} {
		got, ok := parseNumber([]byte(tc.in), tc.mark)
		if ok != tc.ok || (ok && got != tc.want) {
			t.Errorf("parseNumber(%q, %q) = %v, %v; want %v, %v", tc.in, tc.mark, got, ok, tc.want, tc.ok)
		}
	}
	if v, _ := parseNumber([]byte("-0"), '.'); !math.Signbit(v) {
		t.Error("-0 lost its sign")
	}
}

// The fast path must agree with strconv.ParseFloat (the standard library's
// correctly rounded conversion) on every number it takes.
func FuzzParseNumber(f *testing.F) {
	for _, s := range []string{"12.345", "-0.001", "1e22", "123456789.123456789", "4.9e-324", "0.30000000000000004"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		got, ok := parseNumber([]byte(s), '.')
		if !ok {
			return
		}
		ref, err := strconv.ParseFloat(trimSpaceString(s), 64)
		if err != nil {
			t.Fatalf("parseNumber(%q) = %v but strconv fails: %v", s, got, err)
		}
		if got != ref && !(got == 0 && ref == 0) {
			t.Fatalf("parseNumber(%q) = %v, strconv %v", s, got, ref)
		}
	})
}

func trimSpaceString(s string) string { return string(trimBlank([]byte(s))) }

func TestDaysFromCivil(t *testing.T) {
	// Against the standard library's calendar.
	for _, d := range []time.Time{
		time.Date(1970, 1, 1, 0, 0, 0, 0, time.UTC),
		time.Date(2000, 2, 29, 0, 0, 0, 0, time.UTC),
		time.Date(2024, 5, 14, 0, 0, 0, 0, time.UTC),
		time.Date(1900, 3, 1, 0, 0, 0, 0, time.UTC),
		time.Date(2100, 12, 31, 0, 0, 0, 0, time.UTC),
		time.Date(1066, 10, 14, 0, 0, 0, 0, time.UTC),
	} {
		if got := daysFromCivil(d.Year(), int(d.Month()), d.Day()) * 86400; got != d.Unix() {
			t.Errorf("%v: %d, want %d", d, got, d.Unix())
		}
	}
}

func TestStamp(t *testing.T) {
	utc := func(y, mo, d, h, mi, s int, frac float64) float64 { return unix(y, mo, d, h, mi, s) + frac }
	for _, tc := range []struct {
		in    string
		order DateOrder
		zone  string
		want  float64
		err   error
	}{
		{"2024-05-14T08:30:00", "", "", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"2024-05-14 08:30:00", "", "", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"2024-05-14 8:30", "", "", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"2024-05-14T08:30:00.25Z", "", "+05:00", utc(2024, 5, 14, 8, 30, 0, 0.25), nil},
		{"2024-05-14T08:30:00,5Z", "", "", utc(2024, 5, 14, 8, 30, 0, 0.5), nil},
		{"2024-05-14T08:30:00+02:00", "", "", utc(2024, 5, 14, 6, 30, 0, 0), nil},
		{"2024-05-14T08:30:00-0530", "", "", utc(2024, 5, 14, 14, 0, 0, 0), nil},
		{"2024-05-14T08:30:00+02", "", "", utc(2024, 5, 14, 6, 30, 0, 0), nil},
		{"2024-05-14 08:30:00 UTC", "", "+02:00", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"2024-05-14 08:30:00", "", "+02:00", utc(2024, 5, 14, 6, 30, 0, 0), nil},
		{"2024-05-14 08:30:00", "", "UTC-3", utc(2024, 5, 14, 11, 30, 0, 0), nil},
		// Named zone with daylight saving: Berlin is +02:00 in May, +01:00 in January.
		{"2024-05-14 08:30:00", "", "Europe/Berlin", utc(2024, 5, 14, 6, 30, 0, 0), nil},
		{"2024-01-14 08:30:00", "", "Europe/Berlin", utc(2024, 1, 14, 7, 30, 0, 0), nil},
		{"2024-05-14", "", "", utc(2024, 5, 14, 0, 0, 0, 0), nil},
		{"2024/05/14 08:30", "", "", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"14/05/2024 08:30", DayFirst, "", utc(2024, 5, 14, 8, 30, 0, 0), nil},
		{"14.05.2024 08:30:15", DayFirst, "", utc(2024, 5, 14, 8, 30, 15, 0), nil},
		{"05/14/2024 08:30 PM", MonthFirst, "", utc(2024, 5, 14, 20, 30, 0, 0), nil},
		{"05/14/2024 12:10:00 AM", MonthFirst, "", utc(2024, 5, 14, 0, 10, 0, 0), nil},
		{"05/14/2024 12:10:00 PM", MonthFirst, "", utc(2024, 5, 14, 12, 10, 0, 0), nil},
		{"05/14/2024 1:10:00 p.m.", MonthFirst, "", utc(2024, 5, 14, 13, 10, 0, 0), nil},
		{"05/14/2024 1:10:00am", MonthFirst, "", utc(2024, 5, 14, 1, 10, 0, 0), nil},
		{"14-05-24 08:30", DayFirst, "", utc(2024, 5, 14, 8, 30, 0, 0), nil},  // POSIX %y: 24 is 2024
		{"14-05-75 08:30", DayFirst, "", utc(1975, 5, 14, 8, 30, 0, 0), nil},  // and 75 is 1975
		{"29/02/2024 00:00", DayFirst, "", utc(2024, 2, 29, 0, 0, 0, 0), nil}, // a leap day
		{"29/02/2023 00:00", DayFirst, "", 0, ErrTime},
		{"05/06/2024 08:30", "", "", 0, ErrDateOrder},
		{"14/05/2024 08:30", "", "", 0, ErrDateOrder}, // even an evident one: the order is the file's, chosen once
		{"14/05/2024 08:30", MonthFirst, "", 0, ErrTime},
		{"2024-13-01 08:30", "", "", 0, ErrTime},
		{"2024-05-14 24:00", "", "", 0, ErrTime},
		{"2024-05-14 08:60", "", "", 0, ErrTime},
		{"2024-05-14 13:00 PM", "", "", 0, ErrTime},
		{"2024-05-14 08:30 +25:00", "", "", 0, ErrTime},
		{"2024-05-14x08:30", "", "", 0, ErrTime},
		{"2024-05-14 08:30 tomorrow", "", "", 0, ErrTime},
		{"0024-05-14", "", "", 0, ErrTime},
		{"yesterday", "", "", 0, ErrTime},
		{"", "", "", 0, ErrTime},
	} {
		z, err := parseZone(tc.zone)
		if err != nil {
			t.Fatal(err)
		}
		p := timeParser{order: tc.order, zone: z}
		got, err := p.stamp([]byte(tc.in))
		if tc.err != nil {
			if !errors.Is(err, tc.err) {
				t.Errorf("stamp(%q, %s) = %v, %v; want %v", tc.in, tc.order, got, err, tc.err)
			}
			continue
		}
		if err != nil || math.Abs(got-tc.want) > 1e-6 {
			t.Errorf("stamp(%q, %s, %q) = %v, %v; want %v (%s)", tc.in, tc.order, tc.zone, FormatTime(got, true), err, FormatTime(tc.want, true), tc.in)
		}
	}
}

func TestElapsedAndClock(t *testing.T) {
	for _, tc := range []struct {
		in     string
		unit   string
		mark   byte
		want   float64
		wantOK bool
	}{
		{"90", "s", '.', 90, true},
		{"1.5", "min", '.', 90, true},
		{"1,5", "min", ',', 90, true},
		{"0.25", "h", '.', 900, true},
		{"0.5", "d", '.', 43200, true},
		{"-2", "min", '.', -120, true},
		{"1:02:03.5", "s", '.', 3723.5, true},
		{"26:00:00", "s", '.', 93600, true}, // elapsed hours may pass 24
		{"-0:00:30", "s", '.', -30, true},
		{"1:60:00", "s", '.', 0, false},
		{"1:02", "s", '.', 0, false},
		{"ten", "s", '.', 0, false},
	} {
		f, err := elapsedFactor(tc.unit)
		if err != nil {
			t.Fatal(err)
		}
		p := timeParser{factor: f, mark: tc.mark}
		got, err := p.elapsed([]byte(tc.in))
		if (err == nil) != tc.wantOK || (err == nil && !closeTo(got, tc.want, 1e-12)) {
			t.Errorf("elapsed(%q %s) = %v, %v; want %v", tc.in, tc.unit, got, err, tc.want)
		}
	}
	p := timeParser{order: DayFirst}
	got, err := p.dateClock([]byte("14.05.2024"), []byte("8:05:30.5 PM"))
	if want := unix(2024, 5, 14, 20, 5, 30) + 0.5; err != nil || got != want {
		t.Errorf("dateClock = %v, %v; want %v", got, err, want)
	}
	if _, err := p.dateClock([]byte("14.05.2024 00:00:00"), []byte("08:00")); err != nil {
		t.Errorf("a midnight time in the date column: %v", err)
	}
	if _, err := p.dateClock([]byte("14.05.2024 08:00"), []byte("08:00")); !errors.Is(err, ErrTime) {
		t.Errorf("a time in the date column: %v", err)
	}
	var ec errClock
	if _, err := p.dateClock([]byte("14.05.2024"), []byte("8h05")); !errors.As(err, &ec) {
		t.Errorf("a bad clock cell is not marked as such: %v", err)
	}
	for _, z := range []string{"Mars/Olympus", "+2x", "UTC+99"} {
		if _, err := parseZone(z); err == nil {
			t.Errorf("parseZone(%q) works", z)
		}
	}
}

func TestTimeAxisHelpers(t *testing.T) {
	tm := time.Date(2024, 5, 14, 6, 0, 0, 500_000_000, time.UTC)
	s := UnixSeconds(tm)
	if s != unix(2024, 5, 14, 6, 0, 0)+0.5 || !TimeOf(s).Equal(tm) {
		t.Errorf("UnixSeconds %v, TimeOf %v", s, TimeOf(s))
	}
	if got := FormatTime(s, true); got != "2024-05-14 06:00:00.5Z" {
		t.Errorf("FormatTime = %q", got)
	}
	if got := FormatTime(90, false); got != "90 s" {
		t.Errorf("FormatTime = %q", got)
	}
}

// TestZoneNamesNeedLoadZone: without LoadZone (as in the browser app) a
// zone name is refused with a sentence pointing to UTC offsets, and
// offsets still work.
func TestZoneNamesNeedLoadZone(t *testing.T) {
	saved := LoadZone
	LoadZone = nil
	defer func() { LoadZone = saved }()
	if _, err := parseZone("Europe/Berlin"); err == nil || !strings.Contains(err.Error(), "use a UTC offset") {
		t.Errorf("Europe/Berlin without LoadZone: %v", err)
	}
	m := Mapping{Time: TimeColumns{Zone: "Europe/Berlin"}, Values: []ValueColumn{{Column: 1, Kind: Level, Unit: "m"}}}
	if err := m.Check(0); !errors.Is(err, ErrMapping) {
		t.Errorf("Mapping.Check with a zone name and no LoadZone: %v", err)
	}
	if z, err := parseZone("UTC+02:00"); err != nil || z.off != 7200 {
		t.Errorf("UTC+02:00: %+v, %v", z, err)
	}
}
