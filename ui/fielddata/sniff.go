package fielddata

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"strings"

	"fieldfit/models/units"
)

// SampleSize is the length of the start of a file that Sniff needs to
// see; more does no harm, less may miss the header of a long preamble.
const SampleSize = 64 << 10

// PreviewRows is the number of data rows a Layout shows.
const PreviewRows = 50

// sniffLines is the number of lines of the sample Sniff looks at.
const sniffLines = 2000

// CellKind says what the cells of a column hold.
type CellKind string

const (
	CellEmpty    CellKind = "empty"
	CellNumber   CellKind = "number"
	CellDateTime CellKind = "datetime" // a date with a clock time
	CellDate     CellKind = "date"
	CellClock    CellKind = "clock"
	CellText     CellKind = "text"
)

// Role is the use Sniff suggests for a column.
type Role string

const (
	RoleNone     Role = ""         // not mapped (temperature, conductivity, unknown)
	RoleTime     Role = "time"     // date and time (TimeColumns.Column, DateTime)
	RoleDate     Role = "date"     // date (DateAndClock)
	RoleClock    Role = "clock"    // clock time (DateAndClock)
	RoleElapsed  Role = "elapsed"  // elapsed time
	RoleDepth    Role = "depth"    // Depth
	RoleLevel    Role = "level"    // Level
	RolePressure Role = "pressure" // Pressure
)

// MetaLine is a line of the preamble, the lines above the header: kept
// and shown, with a key and value when it reads as one ("Serial number:
// 20417", "Site;Larkspur Flats", "units = kPa").
type MetaLine struct {
	Row   int    `json:"row"`
	Text  string `json:"text"`
	Key   string `json:"key,omitempty"`
	Value string `json:"value,omitempty"`
}

// ColumnInfo describes one column of a file as the sample shows it.
type ColumnInfo struct {
	Index int
	// Name is the header text, or "column N" (1-based) without a header.
	Name string
	// Unit is the symbol (package units) of a unit found in the header,
	// the units row or a preamble line about units; "" if none.
	Unit string
	// Kind is what more than half of the non-empty cells hold.
	Kind CellKind
	// Role is the suggested use, with how sure and why.
	Role Role
	Why  Guess
}

// Layout is a file's sample cut into preamble, header and rows with given
// Options: what the preview and the mapping steps show.
type Layout struct {
	Preamble []MetaLine
	// Header holds the column names: the header row's cells, or
	// "column 1" … when there is none. It has a name for every column
	// of the widest preview row.
	Header    []string
	HasHeader bool
	// Units holds the cells of the units row, nil without one.
	Units []string
	// Columns describes every column.
	Columns []ColumnInfo
	// Rows are the first PreviewRows data rows, cells as text, and
	// RowNumbers their 1-based line numbers in the file.
	Rows       [][]string
	RowNumbers []int
	// Cut reports that the sample ended inside a line, which was left
	// out (Import reads the whole file).
	Cut bool
}

// Why gives the reason of each choice Sniff made.
type Why struct {
	Encoding, Delimiter, Decimal, Layout, Time, DateOrder, Zone Guess
}

// Detected is what Sniff found: Options and a Mapping ready for Import,
// the reason of each choice, and the Layout of the sample.
type Detected struct {
	Options Options
	Mapping Mapping
	Why     Why
	Layout
}

// Questions returns, in the order of the screen, what the user must
// decide because the sample does not tell: the choices Sniff is unsure
// of, and the mapped columns without a unit.
func (d *Detected) Questions() []string {
	var q []string
	for _, g := range []struct {
		what string
		g    Guess
	}{{"Encoding", d.Why.Encoding}, {"Delimiter", d.Why.Delimiter}, {"Decimal mark", d.Why.Decimal},
		{"Header", d.Why.Layout}, {"Time", d.Why.Time}, {"Date order", d.Why.DateOrder}, {"Time zone", d.Why.Zone}} {
		if g.g.Confidence == Unsure {
			q = append(q, g.what+": "+g.g.Reason)
		}
	}
	for _, v := range d.Mapping.Values {
		if v.Unit == "" {
			name := fmt.Sprintf("column %d", v.Column+1)
			if v.Column < len(d.Header) {
				name = fmt.Sprintf("column %q", d.Header[v.Column])
			}
			q = append(q, fmt.Sprintf("Unit: %s has no unit in the file; choose it", name))
		}
	}
	return q
}

// sampleLine is a line of the sample with its 1-based row number.
type sampleLine struct {
	row  int
	text []byte
}

// splitSample returns the lines of decoded text, without the last one
// when it has no line end and others exist.
func splitSample(text []byte) (lines []sampleLine, cut bool) {
	lr := newLineReader(bytes.NewReader(text))
	for len(lines) < sniffLines+1 {
		l, ok, err := lr.next()
		if !ok || err != nil {
			break
		}
		lines = append(lines, sampleLine{lr.row, append([]byte(nil), l...)})
		if !lr.ended {
			if len(lines) > 1 {
				lines = lines[:len(lines)-1]
				cut = true
			}
			break
		}
	}
	if len(lines) > sniffLines {
		lines = lines[:sniffLines]
	}
	return lines, cut
}

// Sniff looks at the start of a file (SampleSize bytes suffice) and
// proposes how to read it: encoding, delimiter, decimal mark, preamble,
// header and units rows, the time columns and the value columns. Each
// choice comes with a Guess; Detected.Questions lists what the user must
// decide. A file that is not delimited text fails with a *NotTextError;
// an empty one with ErrEmpty. A last line without a line end is taken as
// cut off by the sample and left out.
func Sniff(sample []byte) (*Detected, error) {
	if len(bytes.TrimSpace(sample)) == 0 {
		return nil, ErrEmpty
	}
	enc, gEnc, err := sniffEncoding(sample)
	if err != nil {
		return nil, err
	}
	lines, cut := splitSample(decodeBytes(sample, enc))
	var nonBlank []sampleLine
	for _, l := range lines {
		if len(trimBlank(l.text)) > 0 {
			nonBlank = append(nonBlank, l)
		}
	}
	if len(nonBlank) == 0 {
		return nil, ErrEmpty
	}
	d := &Detected{}
	d.Why.Encoding = gEnc
	d.Options.Encoding = enc

	delim, width, gDelim := sniffDelimiter(nonBlank)
	d.Options.Delimiter, d.Why.Delimiter = delim, gDelim
	mark, gDec := sniffDecimal(nonBlank, delim)
	d.Options.Decimal, d.Why.Decimal = mark, gDec
	header, unitsRow, dataRow, gLay := sniffLayout(nonBlank, delim, mark, width)
	d.Options.HeaderRow, d.Options.UnitsRow, d.Options.DataRow = header, unitsRow, dataRow
	d.Why.Layout = gLay
	if d.Options.DataRow == d.Options.dataRowDefault() {
		d.Options.DataRow = 0
	}
	d.Layout = layoutOf(lines, cut, d.Options)
	d.suggest(lines)
	return d, nil
}

// dataRowDefault is the data row implied by the header and units rows.
func (o Options) dataRowDefault() int { return max(o.HeaderRow, o.UnitsRow) + 1 }

// Inspect cuts a sample into a Layout with the given (possibly
// user-changed) Options, for the preview step.
func Inspect(sample []byte, opt Options) (*Layout, error) {
	if err := opt.Check(); err != nil {
		return nil, err
	}
	if len(sample) == 0 {
		return nil, ErrEmpty
	}
	lines, cut := splitSample(decodeBytes(sample, opt.encoding()))
	l := layoutOf(lines, cut, opt)
	return &l, nil
}

// cellIsNumeric reports whether a cell is a number (with either decimal
// mark when mark is 0) or a date or time.
func cellKind(cell []byte, mark byte) CellKind {
	cell = trimBlank(cell)
	if len(cell) == 0 {
		return CellEmpty
	}
	if mark == 0 {
		if _, ok := parseNumber(cell, '.'); ok {
			return CellNumber
		}
		if _, ok := parseNumber(cell, ','); ok {
			return CellNumber
		}
	} else if _, ok := parseNumber(cell, mark); ok {
		return CellNumber
	}
	if dp, i, ok := scanDate(cell, 0); ok {
		if okDate(dp) {
			if i == len(cell) {
				return CellDate
			}
			if cell[i] == 'T' || cell[i] == ' ' {
				j := i + 1
				for j < len(cell) && cell[j] == ' ' {
					j++
				}
				if _, err := scanClock(cell, j); err == nil {
					return CellDateTime
				}
			}
		}
		return CellText
	}
	if parseClockOnly(cell) {
		return CellClock
	}
	return CellText
}

// okDate reports whether a date is valid in at least one order.
func okDate(dp dateParts) bool {
	if dp.yearFirst {
		_, _, _, err := dp.ymd("")
		return err == nil
	}
	_, _, _, e1 := dp.ymd(DayFirst)
	_, _, _, e2 := dp.ymd(MonthFirst)
	return e1 == nil || e2 == nil
}

func numericish(k CellKind) bool {
	return k == CellNumber || k == CellDateTime || k == CellDate || k == CellClock
}

// sniffDelimiter picks the delimiter that cuts the last lines of the
// sample into the same number of fields, most of them numbers or times.
func sniffDelimiter(lines []sampleLine) (Delimiter, int, Guess) {
	// The second half of the sample, at most 200 lines: past any
	// preamble in a short file.
	tail := lines[max(len(lines)/2, len(lines)-200):]
	type cand struct {
		d           Delimiter
		width       int
		cons, parse float64
	}
	var best *cand
	for _, d := range []Delimiter{Tab, Semicolon, Comma, Spaces} {
		sp := newSplitter(d)
		counts := map[int]int{}
		w := make([]int, len(tail))
		for i, l := range tail {
			f, err := sp.split(l.text)
			if err != nil {
				w[i] = -1
				continue
			}
			w[i] = len(f)
			counts[len(f)]++
		}
		mode, n := 0, 0
		for k, c := range counts {
			if c > n || (c == n && k > mode) {
				mode, n = k, c
			}
		}
		if mode < 2 {
			continue
		}
		cells, good := 0, 0
		for i, l := range tail {
			if w[i] != mode {
				continue
			}
			f, _ := sp.split(l.text)
			for _, c := range f {
				k := cellKind(c, 0)
				if k == CellEmpty {
					continue
				}
				cells++
				if numericish(k) {
					good++
				}
			}
		}
		c := &cand{d: d, width: mode, cons: float64(n) / float64(len(tail))}
		if cells > 0 {
			c.parse = float64(good) / float64(cells)
		}
		if best == nil || c.cons*c.parse > best.cons*best.parse+1e-9 {
			best = c
		}
	}
	if best == nil {
		return Comma, 1, Guess{Unsure, "no delimiter (comma, semicolon, tab or spaces) cuts the lines into columns"}
	}
	name := map[Delimiter]string{Tab: "tabs", Semicolon: "semicolons", Comma: "commas", Spaces: "runs of spaces"}[best.d]
	g := Guess{Likely, fmt.Sprintf("%.0f %% of the last %d lines split into %d fields at %s", 100*best.cons, len(tail), best.width, name)}
	if best.cons == 1 {
		g.Reason = fmt.Sprintf("each of the last %d lines splits into %d fields at %s", len(tail), best.width, name)
	}
	if best.cons >= 0.95 && best.parse >= 0.5 {
		g.Confidence = Sure
	}
	if best.cons*best.parse < 0.3 {
		g.Confidence = Unsure
	}
	return best.d, best.width, g
}

// sniffDecimal finds the decimal mark from the numbers of the last lines.
func sniffDecimal(lines []sampleLine, d Delimiter) (DecimalMark, Guess) {
	if d == Comma {
		return Point, Guess{Sure, "the comma separates the fields, so numbers use a decimal point"}
	}
	tail := lines[max(len(lines)/2, len(lines)-200):]
	sp := newSplitter(d)
	var withPoint, withComma int
	var exPoint, exComma string
	for _, l := range tail {
		f, err := sp.split(l.text)
		if err != nil {
			continue
		}
		for _, c := range f {
			if bytes.IndexByte(c, ',') >= 0 {
				if _, ok := parseNumber(c, ','); ok {
					withComma++
					if exComma == "" {
						exComma = string(c)
					}
				}
			} else if bytes.IndexByte(c, '.') >= 0 {
				if _, ok := parseNumber(c, '.'); ok {
					withPoint++
					if exPoint == "" {
						exPoint = string(c)
					}
				}
			}
		}
	}
	switch {
	case withComma > 0 && withPoint == 0:
		return CommaMark, Guess{Sure, fmt.Sprintf("numbers such as %q have a decimal comma", exComma)}
	case withPoint > 0 && withComma == 0:
		return Point, Guess{Sure, fmt.Sprintf("numbers such as %q have a decimal point", exPoint)}
	case withPoint > 0 && withComma > 0:
		if withComma > withPoint {
			return CommaMark, Guess{Unsure, fmt.Sprintf("numbers with a decimal comma (%q) and with a point (%q) both appear", exComma, exPoint)}
		}
		return Point, Guess{Unsure, fmt.Sprintf("numbers with a decimal point (%q) and with a comma (%q) both appear", exPoint, exComma)}
	}
	return Point, Guess{Likely, "no number in the sample has a fractional part; a decimal point is assumed"}
}

type lineInfo struct {
	sampleLine
	cells            [][]byte
	nonEmpty, numish int
	bad              bool
}

func (l lineInfo) dataLike() bool {
	return !l.bad && l.numish > 0 && 2*l.numish >= l.nonEmpty
}

func (l lineInfo) headerLike() bool {
	return !l.bad && l.nonEmpty > 0 && l.numish == 0
}

func (l lineInfo) unitsLike() bool {
	if !l.headerLike() {
		return false
	}
	found := false
	for _, c := range l.cells {
		s := strings.Trim(string(c), "()[] ")
		if len(s) > 12 {
			return false
		}
		if _, ok := lookupUnit(s); ok {
			found = true
		}
	}
	return found
}

func infoOf(lines []sampleLine, d Delimiter, mark DecimalMark) []lineInfo {
	sp := newSplitter(d)
	out := make([]lineInfo, len(lines))
	for i, l := range lines {
		li := lineInfo{sampleLine: l}
		f, err := sp.split(l.text)
		if err != nil {
			li.bad = true
		}
		for _, c := range f {
			li.cells = append(li.cells, append([]byte(nil), c...))
			k := cellKind(c, mark.byte())
			if k != CellEmpty {
				li.nonEmpty++
			}
			if numericish(k) {
				li.numish++
			}
		}
		out[i] = li
	}
	return out
}

// sniffLayout finds the first data row and the header and units rows
// above it. lines are the non-blank lines of the sample.
func sniffLayout(lines []sampleLine, d Delimiter, mark DecimalMark, width int) (header, unitsRow, dataRow int, g Guess) {
	info := infoOf(lines, d, mark)
	near := func(n int) bool { return n >= width-1 && n <= width+1 && n >= 1 }
	start := -1
	for i, li := range info {
		if !li.dataLike() || len(li.cells) != width {
			continue
		}
		ok := true
		for j := i + 1; j < len(info) && j <= i+3; j++ {
			if !info[j].dataLike() {
				ok = false
				break
			}
		}
		if ok {
			start = i
			break
		}
	}
	if start < 0 {
		for i, li := range info {
			if li.dataLike() {
				start = i
				break
			}
		}
	}
	if start < 0 {
		return 0, 0, 0, Guess{Unsure, "no line of the sample looks like a row of readings (numbers and times)"}
	}
	dataRow = info[start].row
	if start > 0 && info[start-1].headerLike() && near(len(info[start-1].cells)) {
		h := start - 1
		if h > 0 && info[h].unitsLike() && info[h-1].headerLike() && near(len(info[h-1].cells)) {
			return info[h-1].row, info[h].row, dataRow,
				Guess{Likely, fmt.Sprintf("line %d names the columns, line %d gives their units, readings start on line %d", info[h-1].row, info[h].row, dataRow)}
		}
		g = Guess{Likely, fmt.Sprintf("line %d names the columns; readings start on line %d", info[h].row, dataRow)}
		if start == 1 {
			g = Guess{Sure, fmt.Sprintf("the first line names the columns; readings start on line %d", dataRow)}
		} else {
			if info[h].row == 2 {
				g.Reason += "; the line above is kept as the preamble"
			} else {
				g.Reason += fmt.Sprintf("; the %d lines above are kept as the preamble", info[h].row-1)
			}
		}
		return info[h].row, 0, dataRow, g
	}
	if start == 0 {
		return 0, 0, dataRow, Guess{Likely, "the file has no header row; columns are named column 1, column 2, …"}
	}
	return 0, 0, dataRow, Guess{Unsure, fmt.Sprintf("readings start on line %d, but no header row names the columns right above", dataRow)}
}

// parseMeta reads a preamble line as a key and a value.
func parseMeta(row int, text string, d Delimiter) MetaLine {
	m := MetaLine{Row: row, Text: text}
	s := strings.TrimSpace(text)
	comment := false
	for _, p := range []string{"#", "//", "%", "*"} {
		if strings.HasPrefix(s, p) {
			comment = true
			s = strings.TrimSpace(strings.TrimPrefix(s, p))
		}
	}
	if d != Semicolon && strings.HasPrefix(s, ";") {
		comment = true
		s = strings.TrimSpace(strings.TrimPrefix(s, ";"))
	}
	try := func(sep string) bool {
		i := strings.Index(s, sep)
		if i <= 0 {
			return false
		}
		k, v := strings.TrimSpace(s[:i]), strings.TrimSpace(s[i+len(sep):])
		if k == "" || len(k) > 60 {
			return false
		}
		if _, ok := parseNumber([]byte(k), '.'); ok {
			return false
		}
		m.Key, m.Value = strings.Trim(k, `"`), strings.Trim(v, `"`)
		return true
	}
	if try(":") || try("=") || comment || d == Spaces {
		return m
	}
	sp := newSplitter(d)
	f, err := sp.split([]byte(s))
	if err == nil && len(f) >= 2 && len(f[0]) > 0 {
		if _, ok := parseNumber(f[0], '.'); !ok && len(f[0]) <= 60 {
			var vals []string
			for _, c := range f[1:] {
				if len(c) > 0 {
					vals = append(vals, string(c))
				}
			}
			m.Key, m.Value = string(f[0]), strings.Join(vals, ", ")
		}
	}
	return m
}

// layoutOf cuts the lines with the options.
func layoutOf(lines []sampleLine, cut bool, opt Options) Layout {
	l := Layout{Cut: cut}
	sp := newSplitter(opt.delimiter())
	data := opt.dataRow()
	width := 0
	for _, ln := range lines {
		switch {
		case ln.row == opt.HeaderRow:
			f, _ := sp.split(ln.text)
			l.Header = stringsOf(f)
			l.HasHeader = true
		case ln.row == opt.UnitsRow:
			f, _ := sp.split(ln.text)
			l.Units = stringsOf(f)
		case ln.row < data:
			l.Preamble = append(l.Preamble, parseMeta(ln.row, string(ln.text), opt.delimiter()))
		default:
			if len(l.Rows) >= PreviewRows {
				continue
			}
			f, err := sp.split(ln.text)
			if err != nil {
				f = [][]byte{ln.text}
			}
			if len(f) == 0 {
				continue
			}
			l.Rows = append(l.Rows, stringsOf(f))
			l.RowNumbers = append(l.RowNumbers, ln.row)
			width = max(width, len(f))
		}
	}
	width = max(width, len(l.Header))
	for i := len(l.Header); i < width; i++ {
		l.Header = append(l.Header, fmt.Sprintf("column %d", i+1))
	}
	for i := range l.Header {
		if strings.TrimSpace(l.Header[i]) == "" {
			l.Header[i] = fmt.Sprintf("column %d", i+1)
		}
	}
	mark := opt.decimal().byte()
	for i := 0; i < width; i++ {
		c := ColumnInfo{Index: i, Name: l.Header[i]}
		if l.HasHeader {
			c.Unit, _ = headerUnit(c.Name)
		}
		if c.Unit == "" && i < len(l.Units) {
			if u, ok := lookupUnit(strings.Trim(l.Units[i], "()[] ")); ok {
				c.Unit = u.Symbol
			}
		}
		counts := map[CellKind]int{}
		nonEmpty := 0
		for _, r := range l.Rows {
			if i >= len(r) {
				continue
			}
			k := cellKind([]byte(r[i]), mark)
			counts[k]++
			if k != CellEmpty {
				nonEmpty++
			}
		}
		// The kind of at least half the non-empty cells (a few garbage
		// rows do not hide a column of numbers).
		c.Kind = CellEmpty
		if nonEmpty > 0 {
			c.Kind = CellText
			for _, k := range []CellKind{CellNumber, CellDateTime, CellDate, CellClock} {
				if counts[k]*2 > nonEmpty {
					c.Kind = k
					break
				}
			}
		}
		l.Columns = append(l.Columns, c)
	}
	return l
}

func stringsOf(f [][]byte) []string {
	s := make([]string, len(f))
	for i, c := range f {
		s[i] = strings.ToValidUTF8(string(c), "\uFFFD")
	}
	return s
}

func hasAny(s string, words ...string) bool {
	for _, w := range words {
		if strings.Contains(s, w) {
			return true
		}
	}
	return false
}

// hasWord reports whether s holds w as a whole word.
func hasWord(s string, words ...string) bool {
	f := strings.FieldsFunc(s, func(r rune) bool {
		return !(r >= 'a' && r <= 'z' || r >= '0' && r <= '9')
	})
	for _, x := range f {
		for _, w := range words {
			if x == w {
				return true
			}
		}
	}
	return false
}

// suggest proposes the time columns, the value columns and the date order.
func (d *Detected) suggest(lines []sampleLine) {
	cols := d.Columns
	m := &d.Mapping
	timeCol := -1
	find := func(k CellKind, skip int) int {
		for i, c := range cols {
			if c.Kind == k && i != skip {
				return i
			}
		}
		return -1
	}
	switch {
	case find(CellDateTime, -1) >= 0:
		timeCol = find(CellDateTime, -1)
		m.Time = TimeColumns{Format: DateTime, Column: timeCol}
		cols[timeCol].Role = RoleTime
		cols[timeCol].Why = Guess{Sure, "the cells hold dates with clock times"}
		d.Why.Time = Guess{Sure, fmt.Sprintf("column %q holds dates with clock times", cols[timeCol].Name)}
	case find(CellDate, -1) >= 0 && find(CellClock, -1) >= 0:
		dc := find(CellDate, -1)
		cc := find(CellClock, dc)
		if dc+1 < len(cols) && cols[dc+1].Kind == CellClock {
			cc = dc + 1
		}
		m.Time = TimeColumns{Format: DateAndClock, Column: dc, ClockColumn: cc}
		cols[dc].Role, cols[cc].Role = RoleDate, RoleClock
		cols[dc].Why = Guess{Sure, "the cells hold dates"}
		cols[cc].Why = Guess{Sure, "the cells hold clock times"}
		timeCol = dc
		d.Why.Time = Guess{Sure, fmt.Sprintf("column %q holds the date and column %q the time of day", cols[dc].Name, cols[cc].Name)}
	default:
		for i, c := range cols {
			name := strings.ToLower(c.Name)
			u, _ := units.Lookup(c.Unit)
			if c.Kind == CellNumber && (hasAny(name, "elapsed", "time", "since") || hasWord(name, "t", "sec", "seconds", "min", "minutes", "hours", "days") || (c.Unit != "" && u.Quantity == units.Time)) {
				timeCol = i
				break
			}
		}
		if timeCol >= 0 {
			c := &cols[timeCol]
			unit := ""
			if u, ok := units.Lookup(c.Unit); ok && u.Quantity == units.Time {
				unit = u.Symbol
			} else {
				for _, w := range strings.FieldsFunc(strings.ToLower(c.Name), func(r rune) bool { return !(r >= 'a' && r <= 'z') }) {
					if u, ok := lookupUnit(w); ok && u.Quantity == units.Time {
						unit = u.Symbol
					}
				}
			}
			m.Time = TimeColumns{Format: Elapsed, Column: timeCol, Unit: unit}
			c.Role = RoleElapsed
			if unit != "" {
				c.Why = Guess{Sure, fmt.Sprintf("elapsed time in %s", unit)}
				d.Why.Time = Guess{Sure, fmt.Sprintf("column %q holds the elapsed time in %s", c.Name, unit)}
			} else {
				m.Time.Unit = "s"
				c.Why = Guess{Unsure, "elapsed time without a unit in the file; seconds assumed"}
				d.Why.Time = Guess{Unsure, fmt.Sprintf("column %q looks like an elapsed time but the file gives no unit: seconds are assumed, check", c.Name)}
			}
		} else if len(cols) > 0 && cols[0].Kind == CellNumber {
			timeCol = 0
			m.Time = TimeColumns{Format: Elapsed, Column: 0, Unit: "s"}
			cols[0].Role = RoleElapsed
			cols[0].Why = Guess{Unsure, "numbers in the first column, taken as elapsed seconds"}
			d.Why.Time = Guess{Unsure, "no column holds dates or clock times: the first column is taken as elapsed time in seconds, check"}
		} else {
			d.Why.Time = Guess{Unsure, "no column holds dates, clock times or elapsed times: choose the time column"}
		}
	}
	// Date order and zone from the rows of the sample.
	d.Why.DateOrder = Guess{Sure, "no date in the sample needs a date order"}
	d.Why.Zone = Guess{Sure, "elapsed times need no time zone"}
	if timeCol >= 0 && m.Time.Format != Elapsed {
		var ev dateEvidence
		zoned, naive := 0, 0
		sp := newSplitter(d.Options.delimiter())
		for _, ln := range lines {
			if ln.row < d.Options.dataRow() {
				continue
			}
			f, err := sp.split(ln.text)
			if err != nil || len(f) <= timeCol {
				continue
			}
			ev.add(f[timeCol], ln.row)
			cell := f[timeCol]
			if m.Time.Format == DateAndClock && m.Time.ClockColumn < len(f) {
				cell = f[m.Time.ClockColumn]
			}
			if hasZoneSuffix(cell) {
				zoned++
			} else {
				naive++
			}
		}
		m.Time.Order, d.Why.DateOrder = ev.verdict("the sample")
		switch {
		case naive == 0 && zoned > 0:
			d.Why.Zone = Guess{Sure, "the times carry their own UTC offset"}
		default:
			d.Why.Zone = Guess{Unsure, "the times carry no UTC offset: choose the time zone the logger clock was set to (UTC is used until then)"}
			if z, row, ok := preambleZone(d.Preamble); ok {
				m.Time.Zone = z
				d.Why.Zone = Guess{Likely, fmt.Sprintf("the times carry no UTC offset; line %d gives %s", row, z)}
			}
		}
	}
	// A unit named in the preamble ("Units: m") serves the value columns
	// that name none.
	preUnit, preRow := "", 0
	for _, ml := range d.Preamble {
		if strings.Contains(strings.ToLower(ml.Key), "unit") {
			if u, ok := lookupUnit(ml.Value); ok {
				preUnit, preRow = u.Symbol, ml.Row
			}
		}
	}
	// Value columns.
	for i := range cols {
		c := &cols[i]
		if c.Role != RoleNone || c.Kind != CellNumber {
			continue
		}
		c.Role, c.Why = valueRole(c.Name, c.Unit)
		if c.Unit == "" && preUnit != "" && c.Role != RoleNone {
			c.Unit = preUnit
			c.Why.Reason += fmt.Sprintf("; unit %s from line %d", preUnit, preRow)
		}
		var kind ValueKind
		switch c.Role {
		case RoleDepth:
			kind = Depth
		case RoleLevel:
			kind = Level
		case RolePressure:
			kind = Pressure
		default:
			continue
		}
		m.Values = append(m.Values, ValueColumn{Column: i, Kind: kind, Unit: c.Unit})
	}
}

func hasZoneSuffix(cell []byte) bool {
	c := trimBlank(cell)
	if len(c) == 0 {
		return false
	}
	if c[len(c)-1] == 'Z' || c[len(c)-1] == 'z' {
		return true
	}
	u := strings.ToUpper(string(c))
	if strings.HasSuffix(u, "UTC") || strings.HasSuffix(u, "GMT") {
		return true
	}
	// An offset after the clock: the last + or - follows a digit of the
	// seconds or minutes and is not part of an ISO date.
	if i := bytes.LastIndexAny(c, "+-"); i > 0 {
		if j := bytes.IndexByte(c, ':'); j >= 0 && j < i {
			_, n, ok := scanOffset(c, i)
			return ok && i+n == len(c)
		}
	}
	return false
}

// valueRole suggests what a numeric column measures from its name and
// unit.
func valueRole(name, unit string) (Role, Guess) {
	n := strings.ToLower(name)
	u, hasUnit := units.Lookup(unit)
	other := hasAny(n, "temp", "°", "cond", "batt", "volt", "salin", "tds", "ohm", "°c", "°f") || hasWord(n, "ec", "ph", "spc", "c", "f", "v", "ms", "us")
	switch {
	case other:
		return RoleNone, Guess{Likely, "not a water level, depth or pressure"}
	case hasAny(n, "baro", "atm", "air pressure"):
		return RolePressure, Guess{Sure, "a barometric pressure"}
	case hasAny(n, "depth", "dtw", "to water", "below") || hasWord(n, "bgl", "bgs", "btoc", "bmp", "bml"):
		if hasUnit && u.Quantity == units.Pressure {
			return RolePressure, Guess{Likely, "named a depth but given in a unit of pressure"}
		}
		return RoleDepth, Guess{Sure, "a depth to water"}
	case hasAny(n, "press", "pres") || (hasUnit && u.Quantity == units.Pressure):
		return RolePressure, Guess{Sure, "a pressure"}
	case hasAny(n, "level", "elev", "stage", "head", "water") || hasWord(n, "wl", "swl", "gwl"):
		return RoleLevel, Guess{Sure, "a water level above a datum"}
	case hasUnit && u.Quantity == units.Length:
		return RoleLevel, Guess{Unsure, "a length without a name saying what: taken as a water level above a datum"}
	}
	return RoleNone, Guess{Unsure, "the column's name says nothing of what it measures"}
}

// dateEvidence collects, from dates that do not start with the year, the
// first rows that settle the order of day and month.
type dateEvidence struct {
	ambiguous         int // dates with day and month both ≤ 12
	undecided         int // dates needing an order
	dayRow, monthRow  int // first row with a value > 12 in the first / second place
	dayText, monthTxt string
	yearFirst         int
}

func (e *dateEvidence) add(cell []byte, row int) {
	dp, _, ok := scanDate(trimBlank(cell), 0)
	if !ok {
		return
	}
	if dp.yearFirst {
		e.yearFirst++
		return
	}
	e.undecided++
	switch {
	case dp.g1 > 12 && dp.g2 <= 12:
		if e.dayRow == 0 {
			e.dayRow, e.dayText = row, string(trimBlank(cell))
		}
	case dp.g2 > 12 && dp.g1 <= 12:
		if e.monthRow == 0 {
			e.monthRow, e.monthTxt = row, string(trimBlank(cell))
		}
	case dp.g1 <= 12 && dp.g2 <= 12:
		e.ambiguous++
	}
}

func (e *dateEvidence) verdict(where string) (DateOrder, Guess) {
	switch {
	case e.undecided == 0:
		return "", Guess{Sure, "the dates start with the year; no date order is needed"}
	case e.dayRow > 0 && e.monthRow > 0:
		return "", Guess{Unsure, fmt.Sprintf("the dates contradict each other: row %d (%q) is day-first, row %d (%q) month-first", e.dayRow, e.dayText, e.monthRow, e.monthTxt)}
	case e.dayRow > 0:
		return DayFirst, Guess{Sure, fmt.Sprintf("row %d has %q: the day comes first", e.dayRow, e.dayText)}
	case e.monthRow > 0:
		return MonthFirst, Guess{Sure, fmt.Sprintf("row %d has %q: the month comes first", e.monthRow, e.monthTxt)}
	}
	return "", Guess{Unsure, fmt.Sprintf("every date in %s has day and month of 12 or less, so it can be read day-first or month-first: choose the order", where)}
}

// DateOrderScan is the result of ScanDateOrder.
type DateOrderScan struct {
	// Order is the order the dates prove, "" when they do not.
	Order DateOrder
	Why   Guess
	// DayFirstRow and MonthFirstRow are the first rows whose date can
	// only be read day-first, or only month-first; 0 if none.
	DayFirstRow, MonthFirstRow int
	// Dates is the number of dates read that need an order.
	Dates int
}

// ScanDateOrder reads the date column of a whole file (Mapping.Time.Column)
// to settle the order of day and month when Sniff's sample could not. It
// reads only that column and honours ctx.
func ScanDateOrder(ctx context.Context, r io.Reader, opt Options, m Mapping) (*DateOrderScan, error) {
	if err := opt.Check(); err != nil {
		return nil, err
	}
	if m.Time.format() == Elapsed {
		return &DateOrderScan{Why: Guess{Sure, "elapsed times need no date order"}}, nil
	}
	lr := newLineReader(decodeReader(r, opt.encoding()))
	sp := newSplitter(opt.delimiter())
	first := opt.dataRow()
	var ev dateEvidence
	for n := 0; ; n++ {
		if n&4095 == 0 {
			if err := ctx.Err(); err != nil {
				return nil, err
			}
		}
		line, ok, err := lr.next()
		if err != nil {
			return nil, err
		}
		if !ok {
			break
		}
		if lr.row < first {
			continue
		}
		f, err := sp.split(line)
		if err != nil || len(f) <= m.Time.Column {
			continue
		}
		ev.add(f[m.Time.Column], lr.row)
		if ev.dayRow > 0 && ev.monthRow > 0 {
			break
		}
	}
	order, why := ev.verdict("the file")
	return &DateOrderScan{Order: order, Why: why, DayFirstRow: ev.dayRow, MonthFirstRow: ev.monthRow, Dates: ev.undecided}, nil
}

// preambleZone finds a UTC offset in the preamble: a value such as
// "UTC+02:00", "GMT-5" or "+01:00" after a key about the clock or zone.
func preambleZone(pre []MetaLine) (zone string, row int, ok bool) {
	for _, ml := range pre {
		k := strings.ToLower(ml.Key)
		if !hasAny(k, "zone", "clock", "utc", "gmt", "offset", "time") {
			continue
		}
		v := strings.TrimSpace(ml.Value)
		u := strings.ToUpper(v)
		if !(strings.HasPrefix(u, "UTC") || strings.HasPrefix(u, "GMT") || strings.HasPrefix(v, "+") || strings.HasPrefix(v, "-")) {
			continue
		}
		if _, err := parseZone(v); err == nil {
			return v, ml.Row, true
		}
	}
	return "", 0, false
}
