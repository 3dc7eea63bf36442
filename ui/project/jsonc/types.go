package jsonc

import (
	"reflect"
	"strings"
	"sync"
	"time"
)

// Marshaler is implemented by types that write their own JSON. The bytes
// returned are written as they are: they must be one valid JSON value.
type Marshaler interface {
	MarshalJSON() ([]byte, error)
}

// Appender is implemented by types that append their own JSON to a
// buffer, saving the copy Marshaler needs. It is preferred to Marshaler.
type Appender interface {
	AppendJSON(dst []byte) ([]byte, error)
}

// Unmarshaler is implemented by types that read their own JSON. It gets
// the bytes of one well-formed JSON value (also "null").
type Unmarshaler interface {
	UnmarshalJSON([]byte) error
}

var (
	timeType        = reflect.TypeFor[time.Time]()
	marshalerType   = reflect.TypeFor[Marshaler]()
	appenderType    = reflect.TypeFor[Appender]()
	unmarshalerType = reflect.TypeFor[Unmarshaler]()
)

// field is one JSON member of a struct.
type field struct {
	name      string
	index     int
	omitEmpty bool
	key       []byte // the escaped name in quotes
}

type structInfo struct {
	fields []field
	byName map[string]int
}

var structCache struct {
	sync.Mutex
	m map[reflect.Type]*structInfo
}

// structFields returns the JSON members of struct type t.
func structFields(t reflect.Type) (*structInfo, string) {
	structCache.Lock()
	defer structCache.Unlock()
	if si, ok := structCache.m[t]; ok {
		return si, ""
	}
	si := &structInfo{byName: map[string]int{}}
	for i := 0; i < t.NumField(); i++ {
		sf := t.Field(i)
		tag, hasTag := sf.Tag.Lookup("json")
		if sf.Anonymous {
			if !sf.IsExported() && sf.Type.Kind() != reflect.Struct && sf.Type.Kind() != reflect.Pointer {
				continue
			}
			return nil, "embedded field " + sf.Name + " of " + t.String() + " is not supported"
		}
		if !sf.IsExported() {
			continue
		}
		if tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		f := field{name: name, index: i}
		if !hasTag || name == "" {
			f.name = sf.Name
		}
		if !validName(f.name) {
			return nil, "field " + sf.Name + " of " + t.String() + " has a JSON name not supported: " + f.name
		}
		for opts != "" {
			var o string
			o, opts, _ = strings.Cut(opts, ",")
			switch o {
			case "omitempty":
				f.omitEmpty = true
			case "":
			default:
				return nil, "field " + sf.Name + " of " + t.String() + " has the tag option " + o + ", which is not supported"
			}
		}
		if _, dup := si.byName[f.name]; dup {
			return nil, "two fields of " + t.String() + " have the JSON name " + f.name
		}
		f.key = appendString(nil, f.name)
		si.byName[f.name] = len(si.fields)
		si.fields = append(si.fields, f)
	}
	if structCache.m == nil {
		structCache.m = map[reflect.Type]*structInfo{}
	}
	structCache.m[t] = si
	return si, ""
}

// validName reports whether encoding/json would use name as given (it
// falls back to the Go name for other tags).
func validName(s string) bool {
	if s == "" {
		return false
	}
	for _, c := range s {
		switch {
		case strings.ContainsRune("!#$%&()*+-./:;<=>?@[]^_{|}~ ", c):
		case c >= 'a' && c <= 'z', c >= 'A' && c <= 'Z', c >= '0' && c <= '9':
		case c > 127:
		default:
			return false
		}
	}
	return true
}

// Raw is a JSON value kept as its text: Unmarshal checks that it is
// well-formed and keeps the bytes (sharing the data read, not copying
// it); Marshal writes them as they are ("null" when empty).
type Raw []byte

// UnmarshalJSON keeps b.
func (r *Raw) UnmarshalJSON(b []byte) error {
	*r = b
	return nil
}

// MarshalJSON returns r, or null when r is empty.
func (r Raw) MarshalJSON() ([]byte, error) {
	if len(r) == 0 {
		return []byte("null"), nil
	}
	return r, nil
}
