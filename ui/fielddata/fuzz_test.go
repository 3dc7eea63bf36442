package fielddata

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func addFixtureSeeds(f *testing.F) {
	files, _ := filepath.Glob(filepath.Join("..", "..", "testdata", "fielddata", "*.*"))
	for _, name := range files {
		if strings.HasSuffix(name, ".py") || strings.HasSuffix(name, ".txt") && strings.Contains(name, "thin_counts") {
			continue
		}
		b, err := os.ReadFile(name)
		if err == nil {
			f.Add(b)
		}
	}
	f.Add([]byte("\x89PNG\r\n\x1a\n"))
	f.Add([]byte(`"a""b",1` + "\n" + `"x`))
	f.Add([]byte("0;1,5\r1;\xff\xfe\r"))
}

// checkRecord checks what every import must give, whatever the input:
// columns of one length, rows in increasing order, bad rows that name a row.
func checkRecord(t *testing.T, rec *Record, err error) {
	t.Helper()
	var re *RowError
	if errors.As(err, &re) && (re.Row < 1 || !strings.HasPrefix(re.Error(), "row ")) {
		t.Fatalf("error without a row: %v", err)
	}
	if err != nil && re == nil && !errors.Is(err, ErrBadRows) && !errors.Is(err, ErrNoData) && !errors.Is(err, ErrDateOrder) &&
		!errors.Is(err, ErrLineTooLong) && !errors.Is(err, ErrMapping) && !errors.Is(err, ErrOption) {
		t.Fatalf("unexpected error: %v", err)
	}
	if rec == nil {
		return
	}
	n := len(rec.Time)
	if len(rec.Row) != n {
		t.Fatalf("%d times, %d rows", n, len(rec.Row))
	}
	for _, c := range rec.Columns {
		if len(c.Values) != n {
			t.Fatalf("%d times, %d values", n, len(c.Values))
		}
	}
	for i := 1; i < n; i++ {
		if rec.Row[i] <= rec.Row[i-1] {
			t.Fatalf("rows not increasing: %v", rec.Row)
		}
	}
	if rec.BadCount < len(rec.Bad) {
		t.Fatalf("%d bad rows counted, %d listed", rec.BadCount, len(rec.Bad))
	}
	for _, b := range rec.Bad {
		if b.Row < 1 || b.Err == nil || !strings.HasPrefix(b.Error(), "row ") {
			t.Fatalf("bad row without a row: %+v", b)
		}
	}
}

// FuzzSniff: Sniff never panics; what it proposes can be inspected,
// previewed and imported, and every error names a row.
func FuzzSniff(f *testing.F) {
	addFixtureSeeds(f)
	f.Fuzz(func(t *testing.T, data []byte) {
		d, err := Sniff(data)
		if err != nil {
			if !errors.Is(err, ErrEmpty) && !errors.Is(err, ErrNotText) {
				t.Fatalf("Sniff error %v", err)
			}
			return
		}
		if err := d.Options.Check(); err != nil {
			t.Fatalf("Sniff proposed bad options %+v: %v", d.Options, err)
		}
		if _, err := Inspect(data, d.Options); err != nil {
			t.Fatalf("Inspect: %v", err)
		}
		_ = d.Questions()
		if d.Mapping.Check(0) != nil {
			return
		}
		rec, err := Preview(data, d.Options, d.Mapping, 0)
		checkRecord(t, rec, err)
		rec, err = Import(context.Background(), bytes.NewReader(data), d.Options, d.Mapping, &ImportSettings{MaxListed: 5})
		checkRecord(t, rec, err)
	})
}

// FuzzImport: Import never panics, with any options, and every error names
// a row.
func FuzzImport(f *testing.F) {
	addFixtureSeeds(f)
	f.Fuzz(func(t *testing.T, data []byte) {
		k := 0
		if len(data) > 0 {
			k = int(data[0])
		}
		opt := Options{
			Encoding:  Encodings[k%len(Encodings)],
			Delimiter: Delimiters[(k/5)%len(Delimiters)],
			HeaderRow: (k / 20) % 3,
		}
		if opt.Delimiter != Comma && k&1 == 1 {
			opt.Decimal = CommaMark
		}
		formats := []TimeColumns{
			{Format: DateTime, Order: DayFirst, Zone: "+01:00"},
			{Format: DateAndClock, Column: 0, ClockColumn: 1, Order: MonthFirst},
			{Format: Elapsed, Unit: "min"},
			{Format: DateTime},
		}
		m := Mapping{Time: formats[(k/3)%len(formats)], Values: []ValueColumn{{Column: 2, Kind: Pressure, Unit: "kPa"}, {Column: 3, Kind: Depth, Unit: "ft"}}}
		for _, p := range []BadRowPolicy{CollectBadRows, StopAtBadRow} {
			rec, err := Import(context.Background(), bytes.NewReader(data), opt, m, &ImportSettings{BadRows: p, MaxListed: 3})
			checkRecord(t, rec, err)
		}
		rec, err := Preview(data, opt, m, 10)
		checkRecord(t, rec, err)
		_, _ = ScanDateOrder(context.Background(), bytes.NewReader(data), opt, m)
	})
}
