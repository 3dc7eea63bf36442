package store

import (
	"errors"
	"testing"
)

func TestClassify(t *testing.T) {
	cause := errors.New("DOMException from the browser")
	tests := []struct {
		op, name string
		want     error
	}{
		{"put", domQuotaExceeded, ErrQuota},
		{"open", domQuotaExceeded, ErrQuota},
		{"open", domVersion, ErrSchemaTooNew},
		{"open", domInvalidState, ErrUnavailable},
		{"open", domSecurity, ErrUnavailable},
		{"open", domUnknown, ErrUnavailable},
		{"open", domNotAllowed, ErrUnavailable},
		{"put", domInvalidState, ErrClosed},
		{"get", domUnknown, ErrUnavailable},
		{"put", domDataClone, nil},
		{"open", domAbort, nil},
		{"list", "SomethingNewError", nil},
	}
	for _, tt := range tests {
		err := wrapDOM(tt.op, "id1", tt.name, cause)
		if !errors.Is(err, cause) {
			t.Errorf("%s %s: %v does not wrap the cause", tt.op, tt.name, err)
		}
		if tt.want != nil && !errors.Is(err, tt.want) {
			t.Errorf("%s %s: %v, want it to wrap %v", tt.op, tt.name, err, tt.want)
		}
		for _, s := range []error{ErrQuota, ErrSchemaTooNew, ErrUnavailable, ErrClosed, ErrBlocked} {
			if s != tt.want && errors.Is(err, s) {
				t.Errorf("%s %s: %v also wraps %v", tt.op, tt.name, err, s)
			}
		}
		var se *Error
		if !errors.As(err, &se) || se.Op != tt.op || se.ID != "id1" {
			t.Errorf("%s %s: %#v does not name op and ID", tt.op, tt.name, err)
		}
	}
	for _, n := range domNames {
		_ = wrapDOM("put", "", n, cause) // every listed name is handled without panic
	}
}
