package jsonc

import (
	"errors"
	"strconv"
	"strings"
)

// Sentinel errors wrapped by *Error.
var (
	// ErrSyntax: the data is not well-formed JSON.
	ErrSyntax = errors.New("not well-formed JSON")
	// ErrValue: the JSON is well-formed but a value does not fit where it
	// is: wrong type, out of range, unknown or repeated field.
	ErrValue = errors.New("value does not fit")
	// ErrUnsupported: the Go type cannot be read or written by this
	// package, or a value (NaN, an infinity) cannot be written as JSON.
	ErrUnsupported = errors.New("not supported")
)

// Error says what is wrong and where.
type Error struct {
	// Path names the value concerned, for example
	// "tests[2].readings[14].elapsedS"; empty for the whole document.
	Path string
	// Line and Column (from 1, in bytes) locate a syntax error in the
	// data; zero otherwise.
	Line, Column int
	// Msg says what is wrong.
	Msg string
	// Err is ErrSyntax, ErrValue or ErrUnsupported.
	Err error
}

func (e *Error) Error() string {
	var b strings.Builder
	if e.Path != "" {
		b.WriteString(e.Path)
		b.WriteString(": ")
	}
	if e.Line > 0 {
		b.WriteString("line ")
		b.WriteString(strconv.Itoa(e.Line))
		b.WriteString(", column ")
		b.WriteString(strconv.Itoa(e.Column))
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}

func (e *Error) Unwrap() error { return e.Err }

// pathElem is one step of a path: a field name, or an index when name is
// empty and index ≥ 0.
type pathElem struct {
	name  string
	index int
}

func formatPath(p []pathElem) string {
	var b strings.Builder
	for _, e := range p {
		if e.index >= 0 {
			b.WriteByte('[')
			b.WriteString(strconv.Itoa(e.index))
			b.WriteByte(']')
			continue
		}
		if b.Len() > 0 {
			b.WriteByte('.')
		}
		b.WriteString(e.name)
	}
	return b.String()
}
