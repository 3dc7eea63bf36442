package jsonc

import (
	"bytes"
	"reflect"
	"strconv"
	"time"
	"unicode/utf8"
)

// maxDepth is the deepest nesting of arrays and objects read or written,
// the same limit as encoding/json's.
const maxDepth = 10000

// Unmarshal reads the JSON document data into the value v points to. See
// the package documentation for how it is stricter than encoding/json.
// On error, *v may be partly filled.
func Unmarshal(data []byte, v any) error {
	rv := reflect.ValueOf(v)
	if rv.Kind() != reflect.Pointer || rv.IsNil() {
		return &Error{Msg: "Unmarshal needs a non-nil pointer", Err: ErrUnsupported}
	}
	d := &decoder{data: data}
	if err := d.value(rv.Elem()); err != nil {
		return err
	}
	d.space()
	if d.i < len(d.data) {
		return d.syntax("want the end of the data, got " + d.what())
	}
	return nil
}

// Valid reports whether data is one well-formed JSON value.
func Valid(data []byte) bool {
	d := &decoder{data: data}
	if d.skip() != nil {
		return false
	}
	d.space()
	return d.i == len(d.data)
}

type decoder struct {
	data  []byte
	i     int
	depth int
	path  []pathElem
}

func (d *decoder) space() {
	for d.i < len(d.data) {
		switch d.data[d.i] {
		case ' ', '\t', '\n', '\r':
			d.i++
		default:
			return
		}
	}
}

// what names the token at the read position, for messages.
func (d *decoder) what() string {
	if d.i >= len(d.data) {
		return "the end of the data"
	}
	switch c := d.data[d.i]; {
	case c == '"':
		return "a string"
	case c == '{':
		return "an object"
	case c == '[':
		return "a list"
	case c == 't' || c == 'f':
		return "true or false"
	case c == 'n':
		return "null"
	case c == '-' || c >= '0' && c <= '9':
		return "a number"
	case c == '\n' || c == '\r':
		return "the end of a line"
	case c == ' ' || c == '\t':
		return "a space"
	case c >= 0x20 && c < 0x7f:
		return "'" + string(rune(c)) + "'"
	default:
		return "the byte 0x" + strconv.FormatUint(uint64(c), 16)
	}
}

func (d *decoder) syntax(msg string) error {
	line, col := 1, 1
	for _, c := range d.data[:min(d.i, len(d.data))] {
		if c == '\n' {
			line++
			col = 1
		} else {
			col++
		}
	}
	return &Error{Path: formatPath(d.path), Line: line, Column: col, Msg: msg, Err: ErrSyntax}
}

func (d *decoder) mismatch(msg string) error {
	return &Error{Path: formatPath(d.path), Msg: msg, Err: ErrValue}
}

// want reports a value of the wrong type at the read position: a syntax
// error when the token itself is malformed.
func (d *decoder) want(what string) error {
	start := d.i
	if err := d.skip(); err != nil {
		return err
	}
	d.i = start
	return d.mismatch("want " + what + ", got " + d.what())
}

func (d *decoder) value(v reflect.Value) error {
	d.space()
	if d.i >= len(d.data) {
		return d.syntax("the data ends where a value should be")
	}
	c := d.data[d.i]
	t := v.Type()
	if t.Kind() == reflect.Pointer {
		if c == 'n' {
			if err := d.literal("null"); err != nil {
				return err
			}
			v.SetZero()
			return nil
		}
		if d.depth >= maxDepth {
			return d.syntax("nested too deeply")
		}
		if v.IsNil() {
			v.Set(reflect.New(t.Elem()))
		}
		d.depth++
		err := d.value(v.Elem())
		d.depth--
		return err
	}
	if t == timeType {
		return d.time(v)
	}
	if reflect.PointerTo(t).Implements(unmarshalerType) {
		start := d.i
		if err := d.skip(); err != nil {
			return err
		}
		if err := v.Addr().Interface().(Unmarshaler).UnmarshalJSON(d.data[start:d.i]); err != nil {
			return d.mismatch(err.Error())
		}
		return nil
	}
	switch t.Kind() {
	case reflect.Bool:
		switch c {
		case 't':
			if err := d.literal("true"); err != nil {
				return err
			}
			v.SetBool(true)
		case 'f':
			if err := d.literal("false"); err != nil {
				return err
			}
			v.SetBool(false)
		default:
			return d.want("true or false")
		}
	case reflect.String:
		if c != '"' {
			return d.want("a string")
		}
		s, err := d.str()
		if err != nil {
			return err
		}
		v.SetString(string(s))
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		lit, err := d.numberOr("a whole number")
		if err != nil {
			return err
		}
		n, perr := strconv.ParseInt(string(lit), 10, 64)
		if perr != nil || v.OverflowInt(n) {
			return d.mismatch("want a whole number that fits " + t.Kind().String() + ", got " + string(lit))
		}
		v.SetInt(n)
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		lit, err := d.numberOr("a whole number of zero or more")
		if err != nil {
			return err
		}
		n, perr := strconv.ParseUint(string(lit), 10, 64)
		if perr != nil || v.OverflowUint(n) {
			return d.mismatch("want a whole number of zero or more that fits " + t.Kind().String() + ", got " + string(lit))
		}
		v.SetUint(n)
	case reflect.Float32, reflect.Float64:
		lit, err := d.numberOr("a number")
		if err != nil {
			return err
		}
		f, perr := strconv.ParseFloat(string(lit), t.Bits())
		if perr != nil {
			return d.mismatch("the number " + string(lit) + " is out of range")
		}
		v.SetFloat(f)
	case reflect.Struct:
		if c != '{' {
			return d.want("an object")
		}
		return d.object(v)
	case reflect.Map:
		if t.Key().Kind() != reflect.String {
			return d.mismatch("maps with keys of type " + t.Key().String() + " are not supported")
		}
		if c == 'n' {
			if err := d.literal("null"); err != nil {
				return err
			}
			v.SetZero()
			return nil
		}
		if c != '{' {
			return d.want("an object")
		}
		return d.object(v)
	case reflect.Slice:
		if t.Elem().Kind() == reflect.Uint8 {
			return d.mismatch("byte slices (" + t.String() + ") are not supported")
		}
		if c == 'n' {
			if err := d.literal("null"); err != nil {
				return err
			}
			v.SetZero()
			return nil
		}
		if c != '[' {
			return d.want("a list")
		}
		return d.array(v)
	case reflect.Array:
		if c != '[' {
			return d.want("a list")
		}
		return d.array(v)
	case reflect.Interface:
		if t.NumMethod() != 0 {
			return d.mismatch("values of type " + t.String() + " are not supported")
		}
		x, err := d.generic()
		if err != nil {
			return err
		}
		if x == nil {
			v.SetZero()
		} else {
			v.Set(reflect.ValueOf(x))
		}
	default:
		return d.mismatch("values of type " + t.String() + " are not supported")
	}
	return nil
}

func (d *decoder) time(v reflect.Value) error {
	if d.i >= len(d.data) || d.data[d.i] != '"' {
		return d.want("a date and time (RFC 3339 text)")
	}
	start := d.i
	s, err := d.str()
	if err != nil {
		return err
	}
	var tm time.Time
	if err := tm.UnmarshalJSON(d.data[start:d.i]); err != nil {
		return d.mismatch("want a date and time as RFC 3339 text, for example 2024-05-14T08:00:00Z, got " + strconv.Quote(string(s)))
	}
	v.Set(reflect.ValueOf(tm))
	return nil
}

func (d *decoder) literal(lit string) error {
	if !bytes.HasPrefix(d.data[d.i:], []byte(lit)) {
		for k := 0; k < len(lit) && d.i < len(d.data) && d.data[d.i] == lit[k]; k++ {
			d.i++
		}
		if d.i >= len(d.data) {
			return d.syntax("the data ends inside " + lit)
		}
		return d.syntax("want " + lit + ", got " + d.what())
	}
	d.i += len(lit)
	return nil
}

// numberOr reads a number, or reports that one is wanted.
func (d *decoder) numberOr(what string) ([]byte, error) {
	if c := d.data[d.i]; c != '-' && (c < '0' || c > '9') {
		return nil, d.want(what)
	}
	return d.number()
}

// number reads a JSON number and returns its text.
func (d *decoder) number() ([]byte, error) {
	start := d.i
	digits := func() int {
		n := 0
		for d.i < len(d.data) && d.data[d.i] >= '0' && d.data[d.i] <= '9' {
			d.i++
			n++
		}
		return n
	}
	if d.i < len(d.data) && d.data[d.i] == '-' {
		d.i++
	}
	switch {
	case d.i < len(d.data) && d.data[d.i] == '0':
		d.i++
	case digits() == 0:
		return nil, d.syntax("want a digit in a number, got " + d.what())
	}
	if d.i < len(d.data) && d.data[d.i] == '.' {
		d.i++
		if digits() == 0 {
			return nil, d.syntax("want a digit after the decimal point, got " + d.what())
		}
	}
	if d.i < len(d.data) && (d.data[d.i] == 'e' || d.data[d.i] == 'E') {
		d.i++
		if d.i < len(d.data) && (d.data[d.i] == '+' || d.data[d.i] == '-') {
			d.i++
		}
		if digits() == 0 {
			return nil, d.syntax("want a digit in the exponent, got " + d.what())
		}
	}
	return d.data[start:d.i], nil
}

// str reads a string at the read position (a '"') and returns its
// content, unescaped. Invalid UTF-8 and lone surrogates become U+FFFD,
// as with encoding/json.
func (d *decoder) str() ([]byte, error) {
	d.i++
	start := d.i
	for d.i < len(d.data) {
		c := d.data[d.i]
		switch {
		case c == '"':
			s := d.data[start:d.i]
			d.i++
			return s, nil
		case c == '\\' || c >= utf8.RuneSelf:
			return d.strSlow(start)
		case c < 0x20:
			return nil, d.syntax("a control character (0x" + strconv.FormatUint(uint64(c), 16) + ") inside a string must be escaped")
		}
		d.i++
	}
	return nil, d.syntax("the data ends inside a string")
}

func (d *decoder) strSlow(start int) ([]byte, error) {
	out := append([]byte(nil), d.data[start:d.i]...)
	for d.i < len(d.data) {
		c := d.data[d.i]
		switch {
		case c == '"':
			d.i++
			return out, nil
		case c < 0x20:
			return nil, d.syntax("a control character (0x" + strconv.FormatUint(uint64(c), 16) + ") inside a string must be escaped")
		case c == '\\':
			if d.i+1 >= len(d.data) {
				d.i = len(d.data)
				return nil, d.syntax("the data ends inside a string")
			}
			d.i++
			switch e := d.data[d.i]; e {
			case '"', '\\', '/':
				out = append(out, e)
			case 'b':
				out = append(out, '\b')
			case 'f':
				out = append(out, '\f')
			case 'n':
				out = append(out, '\n')
			case 'r':
				out = append(out, '\r')
			case 't':
				out = append(out, '\t')
			case 'u':
				d.i++
				r, err := d.hex4()
				if err != nil {
					return nil, err
				}
				if r >= 0xD800 && r < 0xE000 {
					r2 := rune(-1)
					if r < 0xDC00 && d.i+1 < len(d.data) && d.data[d.i] == '\\' && d.data[d.i+1] == 'u' {
						save := d.i
						d.i += 2
						r2, err = d.hex4()
						if err != nil {
							return nil, err
						}
						if r2 >= 0xDC00 && r2 < 0xE000 {
							r = (r-0xD800)<<10 | (r2 - 0xDC00) + 0x10000
						} else {
							d.i = save
							r = utf8.RuneError
						}
					} else {
						r = utf8.RuneError
					}
				}
				out = utf8.AppendRune(out, r)
				continue
			default:
				return nil, d.syntax("the escape \\" + string(rune(e)) + " is not JSON")
			}
			d.i++
		case c < utf8.RuneSelf:
			out = append(out, c)
			d.i++
		default:
			r, size := utf8.DecodeRune(d.data[d.i:])
			if r == utf8.RuneError && size == 1 {
				out = append(out, "\uFFFD"...)
			} else {
				out = append(out, d.data[d.i:d.i+size]...)
			}
			d.i += size
		}
	}
	return nil, d.syntax("the data ends inside a string")
}

func (d *decoder) hex4() (rune, error) {
	var r rune
	for k := 0; k < 4; k++ {
		if d.i >= len(d.data) {
			return 0, d.syntax("the data ends inside a string")
		}
		c := d.data[d.i]
		switch {
		case c >= '0' && c <= '9':
			r = r<<4 | rune(c-'0')
		case c >= 'a' && c <= 'f':
			r = r<<4 | rune(c-'a'+10)
		case c >= 'A' && c <= 'F':
			r = r<<4 | rune(c-'A'+10)
		default:
			return 0, d.syntax("want four hexadecimal digits after \\u")
		}
		d.i++
	}
	return r, nil
}

// members reads the members of an object, calling member with each key
// (unescaped; valid until the next read) with the read position at its
// value, which member must read.
func (d *decoder) members(member func(key []byte) error) error {
	if d.depth >= maxDepth {
		return d.syntax("nested too deeply")
	}
	d.depth++
	d.i++ // '{'
	d.space()
	if d.i < len(d.data) && d.data[d.i] == '}' {
		d.i++
		d.depth--
		return nil
	}
	for {
		d.space()
		if d.i >= len(d.data) {
			return d.syntax("the data ends inside an object")
		}
		if d.data[d.i] != '"' {
			return d.syntax("want the name of a member in quotes, got " + d.what())
		}
		key, err := d.str()
		if err != nil {
			return err
		}
		d.space()
		if d.i >= len(d.data) {
			return d.syntax("the data ends inside an object")
		}
		if d.data[d.i] != ':' {
			return d.syntax("want ':' after the name of a member, got " + d.what())
		}
		d.i++
		if err := member(key); err != nil {
			return err
		}
		d.space()
		if d.i >= len(d.data) {
			return d.syntax("the data ends inside an object")
		}
		switch d.data[d.i] {
		case ',':
			d.i++
		case '}':
			d.i++
			d.depth--
			return nil
		default:
			return d.syntax("want ',' or '}' after a member, got " + d.what())
		}
	}
}

// elements reads the elements of a list, calling elem with each index
// with the read position at the element, which elem must read.
func (d *decoder) elements(elem func(i int) error) error {
	if d.depth >= maxDepth {
		return d.syntax("nested too deeply")
	}
	d.depth++
	d.i++ // '['
	d.space()
	if d.i < len(d.data) && d.data[d.i] == ']' {
		d.i++
		d.depth--
		return nil
	}
	for n := 0; ; n++ {
		if err := elem(n); err != nil {
			return err
		}
		d.space()
		if d.i >= len(d.data) {
			return d.syntax("the data ends inside a list")
		}
		switch d.data[d.i] {
		case ',':
			d.i++
		case ']':
			d.i++
			d.depth--
			return nil
		default:
			return d.syntax("want ',' or ']' after an element of a list, got " + d.what())
		}
	}
}

func (d *decoder) object(v reflect.Value) error {
	t := v.Type()
	if t.Kind() == reflect.Map {
		if v.IsNil() {
			v.Set(reflect.MakeMap(t))
		}
		seen := map[string]bool{}
		elem := reflect.New(t.Elem()).Elem()
		return d.members(func(key []byte) error {
			k := string(key)
			if seen[k] {
				return d.mismatch("the member " + strconv.Quote(k) + " appears twice")
			}
			seen[k] = true
			d.path = append(d.path, pathElem{name: k, index: -1})
			elem.SetZero()
			if err := d.value(elem); err != nil {
				return err
			}
			d.path = d.path[:len(d.path)-1]
			v.SetMapIndex(reflect.ValueOf(k).Convert(t.Key()), elem)
			return nil
		})
	}
	si, msg := structFields(t)
	if msg != "" {
		return d.mismatch(msg)
	}
	var small uint64
	var big []bool
	if len(si.fields) > 64 {
		big = make([]bool, len(si.fields))
	}
	return d.members(func(key []byte) error {
		k, ok := si.byName[string(key)]
		if !ok {
			return d.mismatch("unknown field " + strconv.Quote(string(key)))
		}
		if big != nil && big[k] || big == nil && small&(1<<k) != 0 {
			return d.mismatch("the field " + strconv.Quote(string(key)) + " appears twice")
		}
		if big != nil {
			big[k] = true
		} else {
			small |= 1 << k
		}
		f := &si.fields[k]
		d.path = append(d.path, pathElem{name: f.name, index: -1})
		if err := d.value(v.Field(f.index)); err != nil {
			return err
		}
		d.path = d.path[:len(d.path)-1]
		return nil
	})
}

func (d *decoder) array(v reflect.Value) error {
	t := v.Type()
	if t.Kind() == reflect.Array {
		n := 0
		err := d.elements(func(i int) error {
			if i >= v.Len() {
				return d.mismatch("want at most " + strconv.Itoa(v.Len()) + " elements")
			}
			d.path = append(d.path, pathElem{index: i})
			if err := d.value(v.Index(i)); err != nil {
				return err
			}
			d.path = d.path[:len(d.path)-1]
			n = i + 1
			return nil
		})
		if err != nil {
			return err
		}
		for i := n; i < v.Len(); i++ {
			v.Index(i).SetZero()
		}
		return nil
	}
	s := reflect.MakeSlice(t, 0, 0)
	err := d.elements(func(i int) error {
		if i >= s.Cap() {
			s = reflect.AppendSlice(s, reflect.MakeSlice(t, 1, 1))
		} else {
			s = s.Slice(0, i+1)
		}
		d.path = append(d.path, pathElem{index: i})
		if err := d.value(s.Index(i)); err != nil {
			return err
		}
		d.path = d.path[:len(d.path)-1]
		return nil
	})
	if err != nil {
		return err
	}
	v.Set(s)
	return nil
}

// generic reads any value into the types encoding/json gives the empty
// interface.
func (d *decoder) generic() (any, error) {
	d.space()
	if d.i >= len(d.data) {
		return nil, d.syntax("the data ends where a value should be")
	}
	switch c := d.data[d.i]; {
	case c == '{':
		m := map[string]any{}
		err := d.members(func(key []byte) error {
			k := string(key)
			if _, dup := m[k]; dup {
				return d.mismatch("the member " + strconv.Quote(k) + " appears twice")
			}
			d.path = append(d.path, pathElem{name: k, index: -1})
			x, err := d.generic()
			if err != nil {
				return err
			}
			d.path = d.path[:len(d.path)-1]
			m[k] = x
			return nil
		})
		return m, err
	case c == '[':
		l := []any{}
		err := d.elements(func(i int) error {
			d.path = append(d.path, pathElem{index: i})
			x, err := d.generic()
			if err != nil {
				return err
			}
			d.path = d.path[:len(d.path)-1]
			l = append(l, x)
			return nil
		})
		return l, err
	case c == '"':
		s, err := d.str()
		return string(s), err
	case c == 't':
		return true, d.literal("true")
	case c == 'f':
		return false, d.literal("false")
	case c == 'n':
		return nil, d.literal("null")
	case c == '-' || c >= '0' && c <= '9':
		lit, err := d.number()
		if err != nil {
			return nil, err
		}
		f, perr := strconv.ParseFloat(string(lit), 64)
		if perr != nil {
			return nil, d.mismatch("the number " + string(lit) + " is out of range")
		}
		return f, nil
	default:
		return nil, d.syntax("want a value, got " + d.what())
	}
}

// skip reads over one value, checking that it is well-formed.
func (d *decoder) skip() error {
	d.space()
	if d.i >= len(d.data) {
		return d.syntax("the data ends where a value should be")
	}
	switch c := d.data[d.i]; {
	case c == '{':
		return d.members(func([]byte) error { return d.skip() })
	case c == '[':
		return d.elements(func(int) error { return d.skip() })
	case c == '"':
		_, err := d.str()
		return err
	case c == 't':
		return d.literal("true")
	case c == 'f':
		return d.literal("false")
	case c == 'n':
		return d.literal("null")
	case c == '-' || c >= '0' && c <= '9':
		_, err := d.number()
		return err
	default:
		return d.syntax("want a value, got " + d.what())
	}
}
