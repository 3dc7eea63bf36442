// Package project is the Fieldfit project document: a site with its wells
// and constant-rate pumping tests, the readings typed in the field, the
// logger records imported with their conditioning, the fit settings and
// the last fit result, together with its JSON file format.
//
// Values are held in SI units (m, s, m³/s). Every number the user typed is
// kept as an Entry: the text exactly as typed, the unit it was typed in and,
// when the text is a number, its SI value. Nothing the user typed is thrown
// away, even when it is not a number.
//
// The file format is our own JSON envelope
//
//	{"format": "fieldfit-project", "version": 3, "project": {...}}
//
// Marshal writes it and Unmarshal reads it, upgrading older versions through
// the registered migrations, one version at a time. The package is pure Go.
//
// Version 2 added, per test, "source" ("tape" or "logger": the readings
// the fit uses) and "logger": the water-level and barometric records
// (file name, the reading options and column mapping, the readings in SI
// as base64 little-endian float64 text, the unreadable rows and the
// user's decision to skip them, the checks of the times), the
// fielddata.Conditioning settings and the texts typed for them. The
// upgrade from version 1 marks every test "source": "tape".
//
// Version 3 added a revision record (Stamp) to the project's details,
// each well and each test, and files of several projects ("projects",
// MarshalAll, UnmarshalFile). Touch stamps the objects a save changed;
// Merge compares a project with an incoming copy of it, object by object,
// and applies the user's decisions where both sides changed. Every field
// is described in FORMAT.md, which a test keeps complete.
package project
