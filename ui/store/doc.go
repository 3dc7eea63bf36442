// Package store keeps Fieldfit projects on the device, so that no reading is
// lost between visits and nothing needs a network.
//
// A Store holds Records: one project each, with a stable ID, a display name,
// a revision counter, the time of the last change and the project document
// itself as bytes (JSON of the ui/project codec; the store does not look
// inside). Two implementations share one interface and one set of rules:
//
//   - NewMemory, a map in memory for native tests and for a page on which
//     IndexedDB is unavailable;
//   - OpenIndexedDB (js && wasm only), the browser's IndexedDB through
//     github.com/hack-pad/go-indexeddb.
//
// Both return copies (a caller may change a Record it got or gave), both
// store Changed in UTC with nanosecond precision, both refuse a Record that
// would not survive the trip to JavaScript unchanged (see Record.Validate),
// and both list records in the same order (see List).
//
// # Schema versions
//
// The layout of the stored records has a version, SchemaVersion. A database
// written by an older layout is brought up to date when it is opened, by the
// chain of Migrations of a Schema, one step per version, applied to every
// record in one transaction: either every record is migrated and the new
// version recorded, or nothing changes and Open reports which record failed.
// The pure-Go part of this (Schema, Migration, Schema.Migrate) is tested
// natively; the IndexedDB part is tested in Chromium by the web tests.
//
// # Errors
//
// Every failure is an *Error that names the operation and the record, and
// wraps one of the sentinels ErrNotFound, ErrInvalid, ErrQuota,
// ErrUnavailable, ErrBlocked, ErrSchemaTooNew or ErrClosed where one applies,
// together with the browser's own error. Test with errors.Is.
//
// In the browser every Store method waits for IndexedDB, so it must not be
// called from inside a js.FuncOf callback (that stalls the page): call it
// from a goroutine.
package store
