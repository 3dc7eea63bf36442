package fielddata

import (
	"bytes"
	"context"
	"errors"
	"fmt"
	"io"
	"math"
	"strings"

	"fieldfit/models/units"
)

// BadRowPolicy says what Import does with rows that cannot be read.
type BadRowPolicy string

const (
	// CollectBadRows (the zero value) reads on, lists every bad row in
	// Record.Bad and returns the record together with a *BadRowsError,
	// so that the user can decide: keep the record without those rows,
	// or give up.
	CollectBadRows BadRowPolicy = ""
	// SkipBadRows reads on and lists the bad rows in Record.Bad, without
	// an error: the user has chosen to skip them.
	SkipBadRows BadRowPolicy = "skip"
	// StopAtBadRow stops at the first bad row with its *RowError; the
	// record of the rows before it is returned too.
	StopAtBadRow BadRowPolicy = "stop"
)

// DefaultMaxListed is the default of ImportSettings.MaxListed.
const DefaultMaxListed = 1000

// DefaultGapFactor is the default of ImportSettings.GapFactor. Our own
// choice (no published source): an interval five times both of its
// neighbours is taken as a gap in the record.
const DefaultGapFactor = 5

// ImportSettings say how Import runs. A nil *ImportSettings means the
// zero value: bad rows collected, no progress, no limit.
type ImportSettings struct {
	// BadRows is the policy for rows that cannot be read; "" means
	// CollectBadRows.
	BadRows BadRowPolicy
	// MaxListed caps the bad rows, duplicates, gaps and backward steps
	// listed in the Record (each is counted in full); 0 means
	// DefaultMaxListed.
	MaxListed int
	// Size is the length of the input in bytes, for Progress; 0 means
	// unknown, and Progress is then called only at the end.
	Size int64
	// Progress, when not nil, is called with the fraction of the input
	// read so far (0 to 1), about every 1 % and at the end, from the
	// goroutine that runs Import.
	Progress func(done float64)
	// MaxRows stops after this many data rows (read or bad); 0 means no
	// limit.
	MaxRows int
	// GapFactor: an interval longer than GapFactor times both its
	// neighbouring intervals is reported as a gap; 0 means
	// DefaultGapFactor.
	GapFactor float64
}

// Column is one value column of a Record, in SI.
type Column struct {
	// Index is the 0-based column in the file and Name its header.
	Index int
	Name  string
	Kind  ValueKind
	// Unit is the symbol of the unit the file gave (kept for display).
	Unit string
	// Density is the water density (kg/m³) used to turn pressure into
	// head; 0 for depths and levels.
	Density float64
	// Values are depths or levels in m, or pressures as head of water in
	// m (p/(ρ·gn)), one per reading.
	Values []float64
}

// Record is a file read by Import: the times and value columns of every
// row that could be read, in SI, with what was found on the way.
type Record struct {
	// Time holds one time per reading, in s: Unix seconds (UTC) when
	// Clock is true, else the elapsed time as written in the file.
	Time  []float64
	Clock bool
	// Row is the 1-based line number in the file of each reading.
	Row     []int32
	Columns []Column

	Options  Options
	Mapping  Mapping
	Preamble []MetaLine
	Header   []string
	Units    []string

	// Lines is the number of lines read; Blank the blank lines among the
	// data (counted, not readings).
	Lines, Blank int
	// Bad lists the rows that could not be read (at most MaxListed);
	// BadCount counts them all.
	Bad      []*RowError
	BadCount int
	// Checks reports duplicated times, gaps and times going backwards.
	Checks Checks
	// Complete is false when Import stopped early (MaxRows, a bad row
	// with StopAtBadRow, a cancelled context).
	Complete bool
}

// Len returns the number of readings.
func (r *Record) Len() int { return len(r.Time) }

// Series returns value column i (an index into Columns) as a Series for
// conditioning. The slices are shared with the Record.
func (r *Record) Series(i int) Series {
	c := r.Columns[i]
	return Series{Name: c.Name, Kind: c.Kind, Unit: c.Unit, Density: c.Density, Clock: r.Clock,
		Time: r.Time, Value: c.Values, Row: r.Row}
}

// valueConv converts one mapped value column.
type valueConv struct {
	col    int
	factor float64
}

type importer struct {
	opt    Options
	m      Mapping
	s      ImportSettings
	format TimeFormat
	tp     timeParser
	mark   byte
	vals   []valueConv
	need   int
	names  []string
	rec    *Record
	scr    []float64
}

func (im *importer) name(col int) string {
	if col < len(im.names) {
		return im.names[col]
	}
	return fmt.Sprintf("column %d", col+1)
}

// Import reads a whole file with the given options and mapping into a
// Record, converting times to seconds and values to metres. It honours
// ctx (returning ctx's error, wrapped with the row reached, and the
// partial Record) and reports progress through s.Progress. Rows that
// cannot be read are handled by s.BadRows; a date order question stops
// it with a *RowError wrapping ErrDateOrder.
func Import(ctx context.Context, r io.Reader, opt Options, m Mapping, s *ImportSettings) (*Record, error) {
	if err := opt.Check(); err != nil {
		return nil, err
	}
	if err := m.Check(0); err != nil {
		return nil, err
	}
	im := &importer{opt: opt, m: m, format: m.Time.format(), mark: opt.decimal().byte(), need: m.need()}
	if s != nil {
		im.s = *s
	}
	if im.s.MaxListed <= 0 {
		im.s.MaxListed = DefaultMaxListed
	}
	if im.s.GapFactor <= 0 {
		im.s.GapFactor = DefaultGapFactor
	}
	zone, _ := parseZone(m.Time.Zone)
	factor, _ := elapsedFactor(m.Time.Unit)
	im.tp = timeParser{order: m.Time.Order, zone: zone, factor: factor, mark: im.mark}
	rec := &Record{Clock: im.format != Elapsed, Options: opt, Mapping: m}
	rec.Mapping.Values = append([]ValueColumn(nil), m.Values...)
	im.rec = rec
	for _, v := range m.Values {
		f, _ := valueFactor(v.Kind, v.Unit, m.density())
		im.vals = append(im.vals, valueConv{col: v.Column, factor: f})
		u, _ := units.Lookup(v.Unit)
		c := Column{Index: v.Column, Name: v.Name, Kind: v.Kind, Unit: u.Symbol}
		if v.Kind == Pressure {
			c.Density = m.density()
		}
		rec.Columns = append(rec.Columns, c)
	}
	im.scr = make([]float64, len(im.vals))

	counter := &countingReader{r: r}
	lr := newLineReader(decodeReader(counter, opt.encoding()))
	sp := newSplitter(opt.delimiter())
	first := opt.dataRow()
	nextReport := 0.01
	report := func() {
		if im.s.Progress == nil || im.s.Size <= 0 {
			return
		}
		if f := float64(counter.n) / float64(im.s.Size); f >= nextReport {
			im.s.Progress(math.Min(f, 1))
			nextReport = f + 0.01
		}
	}
	sized := false
	done := 0
	var stop error
	for {
		if lr.row&4095 == 0 {
			if err := ctx.Err(); err != nil {
				stop = fmt.Errorf("import stopped at row %d: %w", lr.row, err)
				break
			}
			report()
		}
		line, ok, err := lr.next()
		if err != nil {
			var re *RowError
			if errors.As(err, &re) {
				stop = re
			} else {
				stop = fmt.Errorf("reading the file after row %d: %w", lr.row, err)
			}
			break
		}
		if !ok {
			rec.Complete = true
			break
		}
		row := lr.row
		rec.Lines = row
		if row < first {
			im.headerLine(row, line, sp)
			continue
		}
		if im.names == nil {
			im.setNames()
		}
		fields, err := sp.split(line)
		if err != nil {
			if im.bad(&RowError{Row: row, Column: -1, Value: cellText(line), Err: err}) {
				stop = rec.Bad[len(rec.Bad)-1]
				break
			}
			done++
			continue
		}
		if len(fields) == 0 || allEmpty(fields) {
			rec.Blank++
			continue
		}
		if !sized && len(rec.Time) == 1000 && im.s.Size > 0 && counter.n > 0 && lr.consumed > 0 {
			// Size the columns once for the whole file: rows per byte
			// of text so far, times the text per byte of file (2 for
			// UTF-16), times the file's size, and 5 % more.
			sized = true
			est := 1000 / float64(lr.consumed) * float64(lr.read) / float64(counter.n) * float64(im.s.Size) * 1.05
			if est < 1<<31 {
				im.grow(int(est) + 16)
			}
		}
		if rerr := im.row(row, fields); rerr != nil {
			if errors.Is(rerr.Err, ErrDateOrder) {
				stop = rerr
				break
			}
			if im.bad(rerr) {
				stop = rerr
				break
			}
		}
		done++
		if im.s.MaxRows > 0 && done >= im.s.MaxRows {
			break
		}
	}
	if im.names == nil {
		im.setNames()
	}
	rec.Checks = check(rec.Time, rec.Row, rec.Columns, im.s.MaxListed, im.s.GapFactor)
	if im.s.Progress != nil && stop == nil {
		im.s.Progress(1)
	}
	if stop != nil {
		return rec, stop
	}
	if len(rec.Time) == 0 {
		if rec.BadCount > 0 {
			return rec, &BadRowsError{Count: rec.BadCount, First: rec.Bad[0]}
		}
		return rec, ErrNoData
	}
	if rec.BadCount > 0 && im.s.BadRows == CollectBadRows {
		return rec, &BadRowsError{Count: rec.BadCount, First: rec.Bad[0]}
	}
	return rec, nil
}

func allEmpty(f [][]byte) bool {
	for _, c := range f {
		if len(c) > 0 {
			return false
		}
	}
	return true
}

// headerLine keeps a line above the data: header, units or preamble.
func (im *importer) headerLine(row int, line []byte, sp *splitter) {
	rec := im.rec
	switch row {
	case im.opt.HeaderRow:
		f, _ := sp.split(line)
		rec.Header = stringsOf(f)
	case im.opt.UnitsRow:
		f, _ := sp.split(line)
		rec.Units = stringsOf(f)
	default:
		rec.Preamble = append(rec.Preamble, parseMeta(row, strings.ToValidUTF8(string(line), "\uFFFD"), im.opt.delimiter()))
	}
}

func (im *importer) setNames() {
	n := max(len(im.rec.Header), im.need)
	im.names = make([]string, n)
	for i := range im.names {
		if i < len(im.rec.Header) && strings.TrimSpace(im.rec.Header[i]) != "" {
			im.names[i] = im.rec.Header[i]
		} else {
			im.names[i] = fmt.Sprintf("column %d", i+1)
		}
	}
	for i := range im.rec.Columns {
		if im.rec.Columns[i].Name == "" {
			im.rec.Columns[i].Name = im.names[im.rec.Columns[i].Index]
		}
	}
}

func (im *importer) grow(n int) {
	rec := im.rec
	if cap(rec.Time) >= n {
		return
	}
	rec.Time = append(make([]float64, 0, n), rec.Time...)
	rec.Row = append(make([]int32, 0, n), rec.Row...)
	for i := range rec.Columns {
		rec.Columns[i].Values = append(make([]float64, 0, n), rec.Columns[i].Values...)
	}
}

// bad records a bad row and reports whether Import must stop.
func (im *importer) bad(e *RowError) bool {
	rec := im.rec
	rec.BadCount++
	if len(rec.Bad) < im.s.MaxListed {
		rec.Bad = append(rec.Bad, e)
	}
	if im.s.BadRows == StopAtBadRow {
		if len(rec.Bad) == 0 || rec.Bad[len(rec.Bad)-1] != e {
			rec.Bad = append(rec.Bad, e)
		}
		return true
	}
	return false
}

func (im *importer) cellErr(row, col int, cell []byte, err error) *RowError {
	return &RowError{Row: row, Column: col, Name: im.name(col), Value: cellText(cell), Err: err}
}

// row reads one data row into the record.
func (im *importer) row(row int, f [][]byte) *RowError {
	if len(f) < im.need {
		return &RowError{Row: row, Column: -1, Value: cellText(bytes.Join(f, []byte{im.opt.delimiter().byte()})),
			Err: fmt.Errorf("%w: %d of the %d needed", ErrFields, len(f), im.need)}
	}
	tc := im.m.Time.Column
	var t float64
	var err error
	switch im.format {
	case DateTime:
		if len(f[tc]) == 0 {
			return im.cellErr(row, tc, nil, ErrMissing)
		}
		t, err = im.tp.stamp(f[tc])
	case DateAndClock:
		cc := im.m.Time.ClockColumn
		if len(f[tc]) == 0 {
			return im.cellErr(row, tc, nil, ErrMissing)
		}
		if len(f[cc]) == 0 {
			return im.cellErr(row, cc, nil, ErrMissing)
		}
		t, err = im.tp.dateClock(f[tc], f[cc])
		if ec, ok := err.(errClock); ok {
			return im.cellErr(row, cc, f[cc], ec.error)
		}
	case Elapsed:
		if len(f[tc]) == 0 {
			return im.cellErr(row, tc, nil, ErrMissing)
		}
		t, err = im.tp.elapsed(f[tc])
	}
	if err != nil {
		return im.cellErr(row, tc, f[tc], err)
	}
	for i, v := range im.vals {
		cell := f[v.col]
		if len(cell) == 0 {
			return im.cellErr(row, v.col, nil, ErrMissing)
		}
		x, ok := parseNumber(cell, im.mark)
		if !ok {
			e := ErrNotNumber
			if other := byte(','); im.mark == ',' {
				other = '.'
				if _, ok2 := parseNumber(cell, other); ok2 {
					return im.cellErr(row, v.col, cell, fmt.Errorf("%w with a decimal comma", ErrNotNumber))
				}
			} else if _, ok2 := parseNumber(cell, other); ok2 {
				return im.cellErr(row, v.col, cell, fmt.Errorf("%w with a decimal point", ErrNotNumber))
			}
			return im.cellErr(row, v.col, cell, e)
		}
		im.scr[i] = x * v.factor
	}
	rec := im.rec
	rec.Time = append(rec.Time, t)
	rec.Row = append(rec.Row, int32(row))
	for i := range im.vals {
		rec.Columns[i].Values = append(rec.Columns[i].Values, im.scr[i])
	}
	return nil
}

// Preview reads the first n data rows of a sample with the options and
// mapping of the mapping step (n ≤ 0 means PreviewRows): the converted
// values and the rows that could not be read, without a *BadRowsError. A
// last line without a line end is left out, as by Sniff. Errors of the
// options or the mapping, and ErrDateOrder, are returned.
func Preview(sample []byte, opt Options, m Mapping, n int) (*Record, error) {
	if n <= 0 {
		n = PreviewRows
	}
	text := decodeBytes(sample, opt.encoding())
	if i := bytes.LastIndexAny(text, "\r\n"); i >= 0 && i < len(text)-1 {
		text = text[:i+1]
	}
	rec, err := Import(context.Background(), bytes.NewReader(text), Options{
		Delimiter: opt.Delimiter, Decimal: opt.Decimal,
		HeaderRow: opt.HeaderRow, UnitsRow: opt.UnitsRow, DataRow: opt.DataRow,
	}, m, &ImportSettings{BadRows: SkipBadRows, MaxRows: n})
	if rec != nil {
		rec.Options.Encoding = opt.Encoding
	}
	if errors.Is(err, ErrBadRows) {
		err = nil
	}
	return rec, err
}
