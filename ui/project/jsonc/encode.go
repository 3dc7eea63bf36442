package jsonc

import (
	"math"
	"reflect"
	"slices"
	"strconv"
	"unicode/utf8"
)

// Marshal returns the JSON of v, as encoding/json's Marshal writes it.
func Marshal(v any) ([]byte, error) {
	return Append(nil, v, "", "")
}

// MarshalIndent is Marshal with each member and element on its own line,
// starting with prefix and indented by one indent per level, as
// encoding/json's MarshalIndent writes it.
func MarshalIndent(v any, prefix, indent string) ([]byte, error) {
	return Append(nil, v, prefix, indent)
}

// Append appends the JSON of v to dst, indented as by MarshalIndent when
// prefix or indent is not empty.
func Append(dst []byte, v any, prefix, indent string) ([]byte, error) {
	e := &encoder{buf: dst, prefix: prefix, indent: indent, pretty: prefix != "" || indent != ""}
	if err := e.value(reflect.ValueOf(v)); err != nil {
		return nil, err
	}
	return e.buf, nil
}

type encoder struct {
	buf            []byte
	prefix, indent string
	pretty         bool
	depth          int
	path           []pathElem
}

func (e *encoder) fail(msg string) error {
	return &Error{Path: formatPath(e.path), Msg: msg, Err: ErrUnsupported}
}

func (e *encoder) newline() {
	e.buf = append(e.buf, '\n')
	e.buf = append(e.buf, e.prefix...)
	for range e.depth {
		e.buf = append(e.buf, e.indent...)
	}
}

func (e *encoder) value(v reflect.Value) error {
	if !v.IsValid() {
		e.buf = append(e.buf, "null"...)
		return nil
	}
	t := v.Type()
	if t == timeType {
		b, err := v.Interface().(interface{ MarshalJSON() ([]byte, error) }).MarshalJSON()
		if err != nil {
			return e.fail(err.Error())
		}
		e.buf = append(e.buf, b...)
		return nil
	}
	if v.Kind() != reflect.Pointer && v.CanAddr() && (reflect.PointerTo(t).Implements(appenderType) || reflect.PointerTo(t).Implements(marshalerType)) {
		v = v.Addr()
		t = v.Type()
	}
	if t.Implements(appenderType) || t.Implements(marshalerType) {
		if v.Kind() == reflect.Pointer && v.IsNil() {
			e.buf = append(e.buf, "null"...)
			return nil
		}
		var err error
		if a, ok := v.Interface().(Appender); ok {
			e.buf, err = a.AppendJSON(e.buf)
		} else {
			var b []byte
			b, err = v.Interface().(Marshaler).MarshalJSON()
			e.buf = append(e.buf, b...)
		}
		if err != nil {
			return e.fail(err.Error())
		}
		return nil
	}
	switch v.Kind() {
	case reflect.Bool:
		e.buf = strconv.AppendBool(e.buf, v.Bool())
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		e.buf = strconv.AppendInt(e.buf, v.Int(), 10)
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		e.buf = strconv.AppendUint(e.buf, v.Uint(), 10)
	case reflect.Float32, reflect.Float64:
		return e.float(v.Float(), t.Bits())
	case reflect.String:
		e.buf = appendString(e.buf, v.String())
	case reflect.Pointer, reflect.Interface:
		if v.IsNil() {
			e.buf = append(e.buf, "null"...)
			return nil
		}
		if e.depth > maxDepth {
			return e.fail("nested too deeply (a cycle?)")
		}
		return e.value(v.Elem())
	case reflect.Struct:
		return e.object(v)
	case reflect.Map:
		return e.mapping(v)
	case reflect.Slice:
		if v.IsNil() {
			e.buf = append(e.buf, "null"...)
			return nil
		}
		if t.Elem().Kind() == reflect.Uint8 {
			return e.fail("byte slices (" + t.String() + ") are not supported")
		}
		return e.array(v)
	case reflect.Array:
		return e.array(v)
	default:
		return e.fail("values of type " + t.String() + " are not supported")
	}
	return nil
}

func (e *encoder) float(f float64, bits int) error {
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return e.fail(strconv.FormatFloat(f, 'g', -1, bits) + " cannot be written as a JSON number")
	}
	// The choice of format is encoding/json's: 'f' between 1e-6 and
	// 1e21, 'e' outside, with a one-digit negative exponent unpadded.
	abs := math.Abs(f)
	fmtc := byte('f')
	if abs != 0 {
		if bits == 64 && (abs < 1e-6 || abs >= 1e21) || bits == 32 && (float32(abs) < 1e-6 || float32(abs) >= 1e21) {
			fmtc = 'e'
		}
	}
	e.buf = strconv.AppendFloat(e.buf, f, fmtc, -1, bits)
	if fmtc == 'e' {
		n := len(e.buf)
		if n >= 4 && e.buf[n-4] == 'e' && e.buf[n-3] == '-' && e.buf[n-2] == '0' {
			e.buf[n-2] = e.buf[n-1]
			e.buf = e.buf[:n-1]
		}
	}
	return nil
}

func (e *encoder) object(v reflect.Value) error {
	si, msg := structFields(v.Type())
	if msg != "" {
		return e.fail(msg)
	}
	e.buf = append(e.buf, '{')
	e.depth++
	n := 0
	for i := range si.fields {
		f := &si.fields[i]
		fv := v.Field(f.index)
		if f.omitEmpty && isEmpty(fv) {
			continue
		}
		if n > 0 {
			e.buf = append(e.buf, ',')
		}
		n++
		if e.pretty {
			e.newline()
		}
		e.buf = append(e.buf, f.key...)
		e.buf = append(e.buf, ':')
		if e.pretty {
			e.buf = append(e.buf, ' ')
		}
		e.path = append(e.path, pathElem{name: f.name, index: -1})
		if err := e.value(fv); err != nil {
			return err
		}
		e.path = e.path[:len(e.path)-1]
	}
	e.depth--
	if n > 0 && e.pretty {
		e.newline()
	}
	e.buf = append(e.buf, '}')
	return nil
}

func (e *encoder) mapping(v reflect.Value) error {
	if v.IsNil() {
		e.buf = append(e.buf, "null"...)
		return nil
	}
	if v.Type().Key().Kind() != reflect.String {
		return e.fail("maps with keys of type " + v.Type().Key().String() + " are not supported")
	}
	keys := v.MapKeys()
	slices.SortFunc(keys, func(a, b reflect.Value) int {
		if a.String() < b.String() {
			return -1
		}
		if a.String() > b.String() {
			return 1
		}
		return 0
	})
	e.buf = append(e.buf, '{')
	e.depth++
	for i, k := range keys {
		if i > 0 {
			e.buf = append(e.buf, ',')
		}
		if e.pretty {
			e.newline()
		}
		e.buf = appendString(e.buf, k.String())
		e.buf = append(e.buf, ':')
		if e.pretty {
			e.buf = append(e.buf, ' ')
		}
		e.path = append(e.path, pathElem{name: k.String(), index: -1})
		if err := e.value(v.MapIndex(k)); err != nil {
			return err
		}
		e.path = e.path[:len(e.path)-1]
	}
	e.depth--
	if len(keys) > 0 && e.pretty {
		e.newline()
	}
	e.buf = append(e.buf, '}')
	return nil
}

func (e *encoder) array(v reflect.Value) error {
	e.buf = append(e.buf, '[')
	e.depth++
	n := v.Len()
	for i := range n {
		if i > 0 {
			e.buf = append(e.buf, ',')
		}
		if e.pretty {
			e.newline()
		}
		e.path = append(e.path, pathElem{index: i})
		if err := e.value(v.Index(i)); err != nil {
			return err
		}
		e.path = e.path[:len(e.path)-1]
	}
	e.depth--
	if n > 0 && e.pretty {
		e.newline()
	}
	e.buf = append(e.buf, ']')
	return nil
}

// isEmpty is encoding/json's test for omitempty.
func isEmpty(v reflect.Value) bool {
	switch v.Kind() {
	case reflect.Array, reflect.Map, reflect.Slice, reflect.String:
		return v.Len() == 0
	case reflect.Bool,
		reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64,
		reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr,
		reflect.Float32, reflect.Float64,
		reflect.Interface, reflect.Pointer:
		return v.IsZero()
	}
	return false
}

const hexDigits = "0123456789abcdef"

// appendString appends s as a JSON string, escaped as encoding/json does
// (control characters, quote, backslash, <, > and &, U+2028 and U+2029;
// invalid UTF-8 becomes U+FFFD).
func appendString(dst []byte, s string) []byte {
	dst = append(dst, '"')
	start := 0
	for i := 0; i < len(s); {
		if b := s[i]; b < utf8.RuneSelf {
			if b >= 0x20 && b != '"' && b != '\\' && b != '<' && b != '>' && b != '&' {
				i++
				continue
			}
			dst = append(dst, s[start:i]...)
			switch b {
			case '\\', '"':
				dst = append(dst, '\\', b)
			case '\b':
				dst = append(dst, '\\', 'b')
			case '\f':
				dst = append(dst, '\\', 'f')
			case '\n':
				dst = append(dst, '\\', 'n')
			case '\r':
				dst = append(dst, '\\', 'r')
			case '\t':
				dst = append(dst, '\\', 't')
			default:
				dst = append(dst, '\\', 'u', '0', '0', hexDigits[b>>4], hexDigits[b&0xF])
			}
			i++
			start = i
			continue
		}
		c, size := utf8.DecodeRuneInString(s[i:])
		if c == utf8.RuneError && size == 1 {
			dst = append(dst, s[start:i]...)
			dst = append(dst, `\ufffd`...)
			i += size
			start = i
			continue
		}
		if c == '\u2028' || c == '\u2029' {
			dst = append(dst, s[start:i]...)
			dst = append(dst, '\\', 'u', '2', '0', '2', hexDigits[c&0xF])
			i += size
			start = i
			continue
		}
		i += size
	}
	dst = append(dst, s[start:]...)
	return append(dst, '"')
}
