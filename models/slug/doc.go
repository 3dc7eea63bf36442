// Package slug interprets slug tests — rising or falling head after a slug
// is put in or taken out of a well, or after a pneumatic push — for the
// hydraulic conductivity K of the formation around the screen.
//
// A Test holds the well's Geometry (casing and screen radii, screen
// length, depth of the screen bottom below the water level, aquifer
// thickness, gravel-pack porosity), the readings of displacement against
// time and the initial displacement H0 (entered, or the first reading),
// with the displacement expected from the slug volume as a check.
// Normalise turns the readings into normalised head H/H0.
//
// Three published methods are offered:
//
//   - Hvorslev (1951): ln(H/H0) = −t/T0 fitted as a straight line on a
//     time window, K = π r_c²/(F·T0) with the shape factor F of one of the
//     common piezometer geometries (Shape);
//   - Bouwer & Rice (1976): the same straight line, K = r_c² ln(Re/r_w)/(2Le)
//     · (1/t) ln(y0/y_t), with ln(Re/r_w) from the partially or fully
//     penetrating formulas and their coefficients A, B, C (entered from the
//     paper's curves, or built-in polynomial fits recalled from memory and
//     flagged as unverified in every result that uses them);
//   - Cooper, Bredehoeft & Papadopulos (1967): the confined type curves
//     H/H0 = F(α, β) (Response) fitted for T and S by damped Newton least
//     squares with package fitcore through models.Fit; K = T/b.
//
// The straight lines are fitted with a free intercept so that the early,
// steeper segment of a "double straight line" can be left out of the
// window. Every Result gives K with its confidence interval in m/s, m/d,
// ft/d and cm/s, the geometry assumptions as plain sentences, caveats and
// the caution notice.
//
// Everything inside is SI (m, s, m³, m/s, m²/s). Bad geometry or readings
// are reported as *models.Error values naming the field or the reading;
// nothing here panics on user input.
//
// Package slug is pure Go and knows nothing of the browser.
package slug
