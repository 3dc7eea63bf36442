package store

import "fmt"

// DOMException names (WebIDL, "DOMException names" table) that the
// IndexedDB store maps to sentinels.
const (
	domQuotaExceeded = "QuotaExceededError"
	domVersion       = "VersionError"
	domInvalidState  = "InvalidStateError"
	domUnknown       = "UnknownError"
	domSecurity      = "SecurityError"
	domNotAllowed    = "NotAllowedError"
	domAbort         = "AbortError"
	domNotFound      = "NotFoundError"
	domDataClone     = "DataCloneError"
)

// domNames lists the names that classify knows, for the js side to test
// an error against each.
var domNames = []string{
	domQuotaExceeded, domVersion, domInvalidState, domUnknown, domSecurity,
	domNotAllowed, domAbort, domNotFound, domDataClone,
}

// classify returns the sentinel for a DOMException of this name met during
// op ("open" or a record operation), and a hint for the message, or nil and
// "" when the name has no sentinel.
func classify(op, name string) (error, string) {
	switch name {
	case domQuotaExceeded:
		return ErrQuota, ""
	case domVersion:
		return ErrSchemaTooNew, ""
	}
	if op == "open" {
		switch name {
		case domInvalidState, domUnknown, domSecurity, domNotAllowed, domNotFound:
			// Firefox private windows (InvalidStateError), Safari with
			// storage blocked (SecurityError, UnknownError), a browser
			// that refuses storage for the site (NotAllowedError), a
			// missing or damaged database file (NotFoundError, UnknownError).
			return ErrUnavailable, ""
		}
		return nil, ""
	}
	switch name {
	case domInvalidState:
		// The connection was closed under us: the library closes it when a
		// newer Fieldfit in another tab upgrades the database.
		return ErrClosed, "another Fieldfit tab upgraded the store; reload this page"
	case domUnknown:
		return ErrUnavailable, "the browser could not read or write its storage"
	}
	return nil, ""
}

// wrapDOM wraps err, a DOMException of the given name, with its sentinel.
func wrapDOM(op, id, name string, err error) error {
	kind, hint := classify(op, name)
	switch {
	case kind == nil:
		return &Error{Op: op, ID: id, Err: err}
	case hint != "":
		return &Error{Op: op, ID: id, Err: fmt.Errorf("%w (%s): %w", kind, hint, err)}
	default:
		return &Error{Op: op, ID: id, Err: fmt.Errorf("%w: %w", kind, err)}
	}
}
