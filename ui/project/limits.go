package project

import (
	"fmt"
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
	bad := func(where, format string, args ...any) error {
		return fmt.Errorf("%w: %s: %s", ErrInvalid, where, fmt.Sprintf(format, args...))
	}
	id := func(where, s string) error {
		switch {
		case len(s) > MaxIDLen:
			return bad(where, "the id is %d bytes long, more than %d", len(s), MaxIDLen)
		case strings.IndexFunc(s, func(c rune) bool { return c < 0x20 || c == 0x7f }) >= 0:
			return bad(where, "the id %q holds a control character", s)
		}
		return nil
	}
	name := func(where, s string) error {
		if n := utf8.RuneCountInString(s); n > MaxNameLen {
			return bad(where, "the name is %d characters long, more than %d", n, MaxNameLen)
		}
		return nil
	}
	when := func(where string, t time.Time) error {
		if y := t.UTC().Year(); y < 0 || y > 9999 {
			return bad(where, "the time %s is outside the years 0–9999", t.Format(time.RFC3339))
		}
		return nil
	}
	stamp := func(where string, s Stamp) error {
		if s.Rev < 0 || s.Rev > MaxRev {
			return bad(where, "revision %d is outside 0…%d", s.Rev, int64(MaxRev))
		}
		for k, n := range s.By {
			if n < 0 || n > MaxRev || k == "" || len(k) > MaxIDLen {
				return bad(where, "the change count %q: %d is not valid", k, n)
			}
		}
		return when(where, s.Changed)
	}
	errs := []error{id("project", p.ID), name("project", p.Name), when("project", p.Changed), stamp("project details", p.Details)}
	if p.Rev < 0 || p.Rev > MaxRev {
		errs = append(errs, bad("project", "revision %d is outside 0…%d", p.Rev, int64(MaxRev)))
	}
	for i := range p.Wells {
		w := &p.Wells[i]
		where := fmt.Sprintf("well %d (%q)", i+1, w.Name)
		errs = append(errs, id(where, w.ID), name(where, w.Name), stamp(where, w.Stamp))
	}
	for i := range p.Tests {
		t := &p.Tests[i]
		where := fmt.Sprintf("test %d (%q)", i+1, t.Name)
		errs = append(errs, id(where, t.ID), name(where, t.Name), stamp(where, t.Stamp))
		if !t.Kind.Valid() {
			errs = append(errs, bad(where, "the kind %q is not known", t.Kind))
		}
	}
	for _, err := range errs {
		if err != nil {
			return err
		}
	}
	return nil
}
