// Package ui holds the screens of Fieldfit: the project list, the site and
// wells forms, the test form, the readings table and the fit step with its
// results and plots, the logger data tab (logger files imported,
// conditioned into drawdown), together with autosave to a store.Store.
//
// The logic of every screen is pure Go: App keeps the state, its methods
// are the user's actions, and Render returns the screen as a view.Node
// tree, so native tests drive the whole app without a browser. The files
// behind the js && wasm build constraint only connect App to the page
// (view.Mount) and to browser services such as file download.
//
// # Element ids for browser tests
//
// Stable ids and data attributes of the rendered page (user text never
// appears in an id):
//
//	#app-root            the whole app
//	#storage-status      storage problems (quota, blocked, unavailable); #export-current offers the download
//	#notice              the last short notice (saved, pasted, deleted)
//	#busy                progress text while storage or a fit runs
//
//	project list (#screen-list)
//	#new-project         create a project
//	#demo-project        the invented example project (offered while the list is empty)
//	#project-list        the list; each item li[data-project-id=ID]
//	  .project-name      its name (text)
//	  [data-action=open|rename|duplicate|delete|export] its buttons
//	#rename-input, #rename-save, #rename-cancel   inline rename
//	#confirm-delete, #cancel-delete               delete confirmation
//	#undo-delete         undo within the undo window
//
//	project (#screen-project)
//	#back-to-list, #export-current
//	#tab-site, #tab-wells, #tab-test, #tab-readings, #tab-logger, #tab-fit, #tab-report   the sections
//	#project-name, #project-site, #project-units (select si|us), #aquifer-b, #project-notes
//	#add-pumping-well, #add-observation-well; each well div[data-well-id=ID][data-well-index=i]
//	  inputs #well-i-name, #well-i-radius, #well-i-screen-top, #well-i-screen-bottom,
//	  #well-i-mp, #well-i-distance; messages #well-i-FIELD-msg; #well-i-remove
//	#test-select, #add-test, #test-name, #test-start (datetime-local), #test-rate,
//	  #test-rate-unit, #test-static, #test-pumping-well, #test-obs-well, #test-time-mode
//	  (elapsed-min|clock); messages #test-FIELD-msg
//	#readings (table); rows tr[data-row=i]: #r-i-time, #r-i-depth (inputs),
//	  #r-i-dd (drawdown text), #r-i-msg (messages, class "row-msg"); the last row is
//	  always empty for the next reading
//	#fit-source (select tape|logger, on the logger and fit tabs): the readings fitted
//	#fit-model (select theis|cooper-jacob), #window-start, #window-end (min),
//	  #window-clear, #auto-fit (checkbox), #smoothing, #fit, #fit-status
//	#result-T, #result-S, #result-K (text "value unit (95 % CI lower – upper)",
//	  attribute data-value = the value in the displayed unit, full precision),
//	  #result-rmse, #result-iterations, #result-cj, #result-warnings, #caution
//	#plot-loglog, #plot-semilog, #plot-residuals (svg)
//
//	report (#panel-report; see report.go for the sections each kind of test adds)
//	#report-controls     not printed: #report-paper (select a4|letter), #report-print,
//	  #export-readings, #export-curves (CSV)
//	#report (article[data-paper=a4|letter])   what prints: #report-title, #report-ident,
//	  #report-caution-top, #report-site (#report-wells), #report-test, #report-data
//	  (#report-data-table), #report-plots (svg#report-plot-… with buttons #report-plot-…-svg
//	  and #report-plot-…-png), #report-fits (#report-fits-table), #report-validity,
//	  #report-notes, #report-caution
//
//	logger data (#panel-logger)
//	#card-water, #card-baro   the two records; in each:
//	  #logger-file, #baro-file (input type=file)
//	  #water-summary, #baro-summary (the record imported), #water-remove, #baro-remove,
//	  details #water-bad, #baro-bad with table #water-bad-rows, #baro-bad-rows (skipped rows)
//	#import-panel[data-phase=reading|preview|importing|bad-rows|failed]   the file on its way in
//	  #import-status, #import-progress (progress, value 0–1), #import-cancel
//	  #import-error      a file that is not delimited text: one sentence; #import-discard closes
//	  #import-preview    the detected choices, each with its reason p#imp-why-NAME:
//	    #imp-encoding, #imp-delimiter, #imp-decimal (selects), #imp-header-row, #imp-units-row,
//	    #imp-data-row (line numbers), #imp-why-encoding|delimiter|decimal|rows;
//	    #imp-preamble, #imp-sample (the start of the file), #imp-questions (what to decide),
//	    #imp-date-question with #date-day-first, #date-month-first (dates that can be read both ways),
//	    #imp-time-format (datetime|date+clock|elapsed), #imp-time-col, #imp-clock-col,
//	    #imp-time-unit, #imp-date-order, #imp-zone (a UTC offset) with #imp-zone-device,
//	    #imp-value-col, #imp-kind (depth|level|pressure), #imp-unit, #imp-density,
//	    #imp-why-time|order|zone|value, #imp-options-msg, #imp-mapping-msg, #import-msg,
//	    #imp-preview (the first readings converted), #import-start, #import-discard
//	  #bad-rows (table: row, column, value, why; tr[data-bad-row=ROW]), #bad-skip, #bad-stop
//	#cond-panel        the conditioning of the water record:
//	  #cond-start, #cond-stop (text, with #cond-start-msg …), #pick-start, #pick-stop
//	  (the next tap on #plot-raw sets it; #plot-raw[data-pick=start|stop] while armed),
//	  #cond-static-mode (select mean|typed|none), #cond-static, #cond-baro (checkbox),
//	  #cond-baro-shift (s), #cond-be, #cond-trend, #cond-thin (checkboxes), #cond-per-cycle,
//	  #rates (table; rows tr[data-rate=i]: #rate-i-start (min), #rate-i-rate, #rate-i-unit,
//	  #rate-i-remove, #rate-i-msg), #rate-add, #rates-msg,
//	  #thin-count ("12 400 → 143 readings"), #cond-summary, #cond-notes, #cond-error,
//	  #plot-raw, #plot-drawdown (svg)
package ui
