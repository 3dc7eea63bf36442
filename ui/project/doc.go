// Package project is the Fieldfit project document: a site with its wells
// and constant-rate pumping tests, the readings typed in the field, the fit
// settings and the last fit result, together with its JSON file format.
//
// Values are held in SI units (m, s, m³/s). Every number the user typed is
// kept as an Entry: the text exactly as typed, the unit it was typed in and,
// when the text is a number, its SI value. Nothing the user typed is thrown
// away, even when it is not a number.
//
// The file format is our own JSON envelope
//
//	{"format": "fieldfit-project", "version": 1, "project": {...}}
//
// Marshal writes it and Unmarshal reads it, upgrading older versions through
// the registered migrations, one version at a time. The package is pure Go.
package project
