package project

import (
	"fmt"
	"strconv"
	"strings"
	"time"
	"unicode/utf8"
)

// Limits of what a project file may hold, checked on every read (see
// Unmarshal): beyond them a value would not survive the store or the
// next save unchanged, or is no value Fieldfit writes.
const (
	// MaxIDLen is the longest identifier, in bytes (the store's limit).
	MaxIDLen = 256
	// MaxNameLen is the longest name of a project, well or test, in
	// characters.
	MaxNameLen = 1000
	// MaxRev is the largest revision counter: the largest integer a
	// JavaScript number holds exactly (2^53 − 1, ECMAScript
	// Number.MAX_SAFE_INTEGER), as the store keeps it.
	MaxRev = 1<<53 - 1
)

// checkLimits reports the first value of p outside the limits above, or
// a time outside the years 0–9999 (RFC 3339) in UTC.
func (p *Project) checkLimits() error {
	var first string
	bad := func(where, msg string) {
		if first == "" {
			first = where + ": " + msg
		}
	}
	revs := func(where, what string, n int64) {
		if n < 0 || n > MaxRev {
			bad(where, what+" "+strconv.FormatInt(n, 10)+" is outside 0…"+strconv.FormatInt(MaxRev, 10))
		}
	}
	when := func(where string, t time.Time) {
		if y := t.UTC().Year(); y < 0 || y > 9999 {
			bad(where, "the time "+t.Format(time.RFC3339)+" is outside the years 0–9999")
		}
	}
	object := func(where, id, name string, s Stamp) {
		switch {
		case len(id) > MaxIDLen:
			bad(where, "the id is "+strconv.Itoa(len(id))+" bytes long, more than "+strconv.Itoa(MaxIDLen))
		case strings.IndexFunc(id, func(c rune) bool { return c < 0x20 || c == 0x7f }) >= 0:
			bad(where, "the id "+strconv.Quote(id)+" holds a control character")
		}
		if n := utf8.RuneCountInString(name); n > MaxNameLen {
			bad(where, "the name is "+strconv.Itoa(n)+" characters long, more than "+strconv.Itoa(MaxNameLen))
		}
		revs(where, "revision", s.Rev)
		for k, n := range s.By {
			if k == "" || len(k) > MaxIDLen {
				bad(where, "the change count "+strconv.Quote(k)+" has no valid session name")
			}
			revs(where, "the change count", n)
		}
		when(where, s.Changed)
	}
	object("project", p.ID, p.Name, p.Details)
	revs("project", "revision", p.Rev)
	when("project", p.Changed)
	for i := range p.Wells {
		w := &p.Wells[i]
		object("well "+strconv.Itoa(i+1)+" ("+strconv.Quote(w.Name)+")", w.ID, w.Name, w.Stamp)
	}
	for i := range p.Tests {
		t := &p.Tests[i]
		where := "test " + strconv.Itoa(i+1) + " (" + strconv.Quote(t.Name) + ")"
		object(where, t.ID, t.Name, t.Stamp)
		if !t.Kind.Valid() {
			bad(where, "the kind "+strconv.Quote(string(t.Kind))+" is not known")
		}
	}
	if first != "" {
		return fmt.Errorf("%w: %s", ErrInvalid, first)
	}
	return nil
}
