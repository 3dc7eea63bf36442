// Package fielddata reads field logger files — pressure-transducer and
// barometric logger exports, or any delimited text of timed readings — and
// conditions them into the drawdown series a pumping-test fit uses.
//
// It is pure Go (no syscall/js): the import screen is a thin DOM layer
// over these steps, each of which native tests reach.
//
// # Preview
//
// Sniff looks at the start of the file (SampleSize bytes) and proposes
// Options — encoding (UTF-8 with or without byte order mark, UTF-16 LE/BE
// with or without, Latin-1 or Windows-1252 for bytes that are not UTF-8),
// delimiter (comma, semicolon, tab, runs of spaces), decimal mark, and the
// header, units and first data rows — together with a Mapping of the
// columns and, for every choice, a Guess: how sure, and why in a sentence.
// Detected.Questions lists what the user must decide (a date order the
// sample cannot settle is never guessed). The preamble lines above the
// header are kept as MetaLines (key and value when they read as one). A
// file that is not text (an image, a ZIP archive, binary data) fails with
// a *NotTextError whose message is one sentence. When the user changes an
// option, Inspect cuts the sample again.
//
// # Mapping
//
// The user checks the Mapping: which column holds the time (a date and
// time, a date and a clock column, or an elapsed time in s, min, h or d),
// the date order and time zone, and which columns hold depths to water,
// levels or pressures, in which units; Mapping.Check names a wrong field.
// Preview converts the first rows of the sample with it, listing the rows
// that cannot be read. When the dates of the sample are ambiguous,
// ScanDateOrder reads the date column of the whole file.
//
// # Import
//
// Import reads the whole file in a goroutine of the screen, with a
// context for cancelling and ImportSettings.Progress for the progress bar.
// Clock times without an offset are read in Mapping.Time.Zone, a fixed
// UTC offset (or an IANA zone name when LoadZone is set; the browser app
// has no zone database). Times become seconds — Unix seconds (UTC) for
// clock times, on what the package calls the record's time axis, or the
// file's elapsed seconds — and values metres: depth and level by their length unit, pressure as
// the head of water h = p/(ρ·gn), with ρ = Mapping.Density (999.97 kg/m³
// by default) and gn = 9.80665 m/s² (package units, reference §9). The
// columns are plain []float64. Rows that cannot be read are counted and
// listed as *RowError (row, column, value, why); with the default policy
// Import returns the Record together with a *BadRowsError so that the
// user decides to skip them (keep the Record) or stop. Repeated times,
// gaps and times going backwards are reported in Record.Checks.
//
// # Conditioning
//
// A Conditioning holds the steps that turn a Record's Series into
// drawdown, each a field whose zero value applies nothing, so that the
// project stores them with the test and undoing a step clears its field:
// pumping start and stop (antecedent, pumping and recovery segments),
// barometric compensation of unvented loggers by a second, barometric
// record (aligned by linear interpolation, with a note when it does not
// cover the test), a barometric efficiency correction, removal of a
// linear pre-test trend, the static level (typed, or the mean of the
// antecedent readings), log-spaced thinning (CountText: "12 400 → 143
// readings"), and the pumping-rate Schedule. Apply runs them and returns
// the segments with their notes; Interpolate, FitTrend and ThinLog are the
// pure steps it is made of.
package fielddata
