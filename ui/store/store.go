package store

import (
	"context"
	"errors"
	"fmt"
	"slices"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"
)

// Record is one stored project.
type Record struct {
	ID      string    // stable identity
	Name    string    // for the project list without decoding Data
	Rev     int64     // revision counter, +1 on each save
	Changed time.Time // last change
	Data    []byte    // the project document (JSON, ui/project codec)
	// Exported is the Rev of the project at its last export from this
	// device (0: never exported); Rev > Exported means changed since.
	Exported int64
	// Unexported is the time of the first change not in an export, zero
	// when every change was exported.
	Unexported time.Time
}

// ChangedSinceExport reports whether the record holds changes that were
// not exported from this device.
func (r Record) ChangedSinceExport() bool { return r.Rev > r.Exported }

// Store keeps Records. Every method may be called from several goroutines.
type Store interface {
	// List returns every record, sorted by Name (see SortRecords). If some
	// records cannot be read, List returns the others together with an error
	// that names each bad one.
	List(ctx context.Context) ([]Record, error)
	// Get returns the record with this ID, or an error wrapping ErrNotFound.
	Get(ctx context.Context, id string) (Record, error)
	// Put inserts r, or replaces the record with r.ID, in one transaction:
	// afterwards the store holds either the old record or r, never a mix.
	// Put stores Rev and Changed as given; the caller increments Rev and
	// sets Changed on each save. A record that fails Validate is refused
	// with an error wrapping ErrInvalid.
	Put(ctx context.Context, r Record) error
	// Delete removes the record with this ID. Deleting an ID that is not
	// stored is not an error.
	Delete(ctx context.Context, id string) error
	// Close releases the store. Later calls return an error wrapping
	// ErrClosed.
	Close() error
}

// Conditional is implemented by stores that replace a record only when
// the stored revision is the one the caller read, in one transaction, so
// that two tabs saving at once cannot overwrite each other unseen. Both
// stores of this package implement it.
type Conditional interface {
	// PutIfRev is Put when the stored record with r.ID has Rev rev (0:
	// none is stored); otherwise it stores nothing and fails with an
	// error wrapping ErrConflict.
	PutIfRev(ctx context.Context, r Record, rev int64) error
}

// Sentinel errors. An *Error wraps at most one of them; test with errors.Is.
var (
	// ErrConflict: another tab or window saved the record meanwhile.
	ErrConflict = errors.New("the project was saved meanwhile in another tab or window")
	// ErrNotFound: no record has the requested ID.
	ErrNotFound = errors.New("no such project in the store")
	// ErrInvalid: the record cannot be stored as it is (see Record.Validate).
	ErrInvalid = errors.New("project record is not valid")
	// ErrQuota: the browser refused the write because the storage quota for
	// this site is full.
	ErrQuota = errors.New("the browser's storage for Fieldfit is full; export and delete old projects to make room")
	// ErrUnavailable: the browser offers no usable IndexedDB, as in some
	// private-browsing modes or with site storage turned off.
	ErrUnavailable = errors.New("this browser does not let Fieldfit store projects (private browsing, or site storage turned off?)")
	// ErrBlocked: the stored data needs an upgrade, and another open
	// Fieldfit tab or window holds the old version open.
	ErrBlocked = errors.New("the project store is held open by another Fieldfit tab or window; close the others and reload")
	// ErrSchemaTooNew: the stored data was written by a newer Fieldfit than
	// this one.
	ErrSchemaTooNew = errors.New("the projects on this device were saved by a newer Fieldfit; reload to update")
	// ErrClosed: the store was closed.
	ErrClosed = errors.New("the project store is closed")
)

// Error reports a failed store operation.
type Error struct {
	Op    string // what was attempted: "open", "list", "get", "put", "delete", "migrate"
	ID    string // the record's ID, or "" when the operation concerns no one record
	Field string // the record field at fault, or ""
	Err   error  // the cause; wraps a sentinel where one applies
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString("store: ")
	b.WriteString(e.Op)
	if e.ID != "" {
		fmt.Fprintf(&b, " %q", e.ID)
	}
	if e.Field != "" {
		b.WriteString(", field ")
		b.WriteString(e.Field)
	}
	b.WriteString(": ")
	if e.Err != nil {
		b.WriteString(e.Err.Error())
	} else {
		b.WriteString("unknown error")
	}
	return b.String()
}

// Unwrap returns the cause, so that errors.Is finds the sentinel.
func (e *Error) Unwrap() error { return e.Err }

// Limits that Validate enforces.
const (
	// MaxIDLen is the longest ID, in bytes.
	MaxIDLen = 256
	// MaxRev is the largest Rev: the largest integer that a JavaScript
	// number holds exactly (2^53 - 1, ECMAScript Number.MAX_SAFE_INTEGER).
	MaxRev = 1<<53 - 1
)

// Validate reports whether r can be stored and read back unchanged: ID is
// not empty, at most MaxIDLen bytes, valid UTF-8 with no control characters;
// Name is valid UTF-8 (JavaScript strings cannot keep invalid UTF-8); Rev is
// in [0, MaxRev]; Changed is within years 0–9999 (RFC 3339). Data may be any
// bytes. The error names the field and value and wraps ErrInvalid.
func (r Record) Validate() error {
	bad := func(field, format string, args ...any) error {
		return &Error{Op: "put", ID: r.ID, Field: field,
			Err: fmt.Errorf("%w: %s", ErrInvalid, fmt.Sprintf(format, args...))}
	}
	switch {
	case r.ID == "":
		return bad("ID", "the ID is empty")
	case len(r.ID) > MaxIDLen:
		return bad("ID", "the ID is %d bytes long, more than %d", len(r.ID), MaxIDLen)
	case !utf8.ValidString(r.ID):
		return bad("ID", "the ID %q is not valid UTF-8", r.ID)
	case strings.IndexFunc(r.ID, isControl) >= 0:
		return bad("ID", "the ID %q contains a control character", r.ID)
	case !utf8.ValidString(r.Name):
		return bad("Name", "the name %q is not valid UTF-8", r.Name)
	case r.Rev < 0 || r.Rev > MaxRev:
		return bad("Rev", "revision %d is outside 0…%d", r.Rev, int64(MaxRev))
	case r.Exported < 0 || r.Exported > MaxRev:
		return bad("Exported", "revision %d is outside 0…%d", r.Exported, int64(MaxRev))
	}
	if y := r.Changed.UTC().Year(); y < 0 || y > 9999 {
		return bad("Changed", "time %s is outside the years 0–9999", r.Changed)
	}
	if y := r.Unexported.UTC().Year(); y < 0 || y > 9999 {
		return bad("Unexported", "time %s is outside the years 0–9999", r.Unexported)
	}
	return nil
}

func isControl(c rune) bool { return c < 0x20 || c == 0x7f }

// clone returns the form in which a store keeps and returns r: Changed in
// UTC without a monotonic clock reading, Data copied (nil when empty).
func clone(r Record) Record {
	r.Changed = r.Changed.UTC()
	r.Unexported = r.Unexported.UTC()
	if len(r.Data) == 0 {
		r.Data = nil
	} else {
		r.Data = slices.Clone(r.Data)
	}
	return r
}

// SortRecords sorts records into the order of Store.List: by Name without
// regard to case (simple Unicode case folding), then by Name byte for byte,
// then by ID.
func SortRecords(rs []Record) {
	slices.SortStableFunc(rs, compareRecords)
}

func compareRecords(a, b Record) int {
	if c := compareFold(a.Name, b.Name); c != 0 {
		return c
	}
	if c := strings.Compare(a.Name, b.Name); c != 0 {
		return c
	}
	return strings.Compare(a.ID, b.ID)
}

// compareFold compares two strings rune by rune after simple case folding.
func compareFold(a, b string) int {
	for a != "" && b != "" {
		ra, na := utf8.DecodeRuneInString(a)
		rb, nb := utf8.DecodeRuneInString(b)
		fa, fb := foldRune(ra), foldRune(rb)
		if fa != fb {
			if fa < fb {
				return -1
			}
			return 1
		}
		a, b = a[na:], b[nb:]
	}
	switch {
	case a == "" && b == "":
		return 0
	case a == "":
		return -1
	default:
		return 1
	}
}

// foldRune maps r to the smallest rune of its case-folding orbit, so that
// 'A', 'a' and others that fold together compare equal.
func foldRune(r rune) rune {
	min := r
	for f := unicode.SimpleFold(r); f != r; f = unicode.SimpleFold(f) {
		if f < min {
			min = f
		}
	}
	return min
}

// ctxErr returns an *Error for an ended context, or nil.
func ctxErr(ctx context.Context, op, id string) error {
	if err := ctx.Err(); err != nil {
		return &Error{Op: op, ID: id, Err: err}
	}
	return nil
}
