// Package static holds the hand-written files of the Fieldfit page shell:
// the HTML page, its style sheet, the loader script, the service worker and
// the web app manifest. The bundle package adds the WebAssembly program,
// wasm_exec.js and the icons, and fills in the placeholders below.
//
// Placeholders, replaced in every text file by bundle.Assemble:
//
//	__FIELDFIT_CSP__      the Content-Security-Policy for the <meta> tag
//	__FIELDFIT_FILES__    a JSON array of every file of the bundle but sw.js
//	__FIELDFIT_VERSION__  the version, derived from the content hash
//	__FIELDFIT_STYLES__   <link> tags for the style sheets other than app.css
//
// The page contract for the app (wasm/main.go): the app renders into
// <main id="app">; the loader hides #loading as soon as the app adds an
// element of its own to #app (or removes #loading itself), and sets data-fieldfit on <html> to "loading", "running", "exited" or
// "failed"; the version is in <meta name="fieldfit-version">. When a new
// release has been downloaded, the loader shows #update-ready and fires the
// event "fieldfit:update-ready" on window, so that the app can save work in
// progress before the user reloads.
package static

import "embed"

// FS holds the shell files.
//
//go:embed index.html app.css loader.js sw.js manifest.webmanifest
var FS embed.FS
