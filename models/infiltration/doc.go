// Package infiltration interprets ring infiltration tests (single or
// double ring): it rebuilds the cumulative infiltration from the field
// readings across refills, fits the published infiltration models and
// reports the steady infiltration rate with its uncertainty.
//
// A Test holds the inner-ring diameter, the readings of water level (with
// refills marked) or of volume added to keep a level mark, and their unit
// (mm, cm, in … or L, m³, US gal). Rebuild turns them into a Cumulative:
// the cumulative infiltration F(t) and the mean rate of each interval, in
// SI units (m, s, m/s), with a volume turned into a depth by the
// inner-ring area.
//
// Fit fits one Method — Horton (1940), Philip (1957) two-term, Green–Ampt
// (1911), Kostiakov (1932) or modified Kostiakov — to the cumulative
// infiltration or to the interval rates (Settings.Rate) by damped Newton
// least squares through models.Fit and package fitcore. The Green–Ampt
// cumulative form is solved for F(t) by a safeguarded Newton iteration
// (GreenAmptDepth). Result.Curves gives both curves, F and f, with their
// confidence bands. The steady rate (fc, K or A) is given with its
// confidence interval in mm/h, in/h and m/s, compared with the Green–Ampt
// texture table of Rawls, Brakensiek & Miller (1983) as plausibility data
// (Plausibility; the table is kept from memory), and divided by the
// design safety factor when the user enters one — there is no default.
//
// Bad readings are reported as *models.Error values naming the reading and
// field; nothing here panics on user input.
//
// Package infiltration is pure Go and knows nothing of the browser.
package infiltration
