package models

import "math"

// RateModel is a drawdown model that is linear in the pumping rate Q: its
// drawdown is Q times a response that does not depend on Q. Such models
// can be superposed in time (VariableRate). Theis, CooperJacob, Hantush
// and ImageWell implement it.
type RateModel interface {
	Model
	// Rate returns the model's pumping rate Q, m³/s.
	Rate() float64
}

// Radial is a drawdown model of a pumped well observed at a distance r
// that can be evaluated at any other distance, as the method of images
// needs (ImageWell). Theis and Hantush implement it.
type Radial interface {
	RateModel
	// Distance returns the model's distance r from the pumped well, m.
	Distance() float64
	// AtDistance returns the same model (same rate and other constants)
	// at the distance r, m.
	AtDistance(r float64) Radial
	// DistanceDerivative writes ∂f(t[i]; p)/∂r, the derivative of the
	// model with respect to its distance, into dst (len(dst) = len(t)).
	DistanceDerivative(dst, t, p []float64)
}

// Rate returns the pumping rate Q.
func (m Theis) Rate() float64 { return m.Q }

// Distance returns the distance r from the pumped well.
func (m Theis) Distance() float64 { return m.R }

// AtDistance returns the Theis model at the distance r.
func (m Theis) AtDistance(r float64) Radial { m.R = r; return m }

// DistanceDerivative writes ∂s/∂r = −Q/(2πT·r)·e^(−u) (u = r²S/(4Tt)).
func (m Theis) DistanceDerivative(dst, t, p []float64) {
	T, S := p[0], p[1]
	a := m.Q / (4 * math.Pi * T)
	b := m.R * m.R * S / (4 * T)
	for i, ti := range t {
		switch {
		case ti > 0:
			dst[i] = -2 * a / m.R * math.Exp(-b/ti)
		case ti == 0:
			dst[i] = 0
		default:
			dst[i] = math.NaN()
		}
	}
}

// Rate returns the pumping rate Q.
func (m CooperJacob) Rate() float64 { return m.Q }

// Rate returns the pumping rate Q.
func (m Hantush) Rate() float64 { return m.Q }

// Distance returns the distance r from the pumped well.
func (m Hantush) Distance() float64 { return m.R }

// AtDistance returns the Hantush model at the distance r.
func (m Hantush) AtDistance(r float64) Radial { m.R = r; return m }

// DistanceDerivative writes ∂s/∂r = Q/(4πT)·(−(2/r)·exp(−u − β²/(4u)) +
// (β/r)·∂W/∂β), from u ∝ r² and β = r/B.
func (m Hantush) DistanceDerivative(dst, t, p []float64) {
	c := m.consts(p)
	for i, ti := range t {
		w, dwdu, dwdb, u := c.w(ti, true)
		switch {
		case math.IsNaN(w):
			dst[i] = math.NaN()
		case ti == 0:
			dst[i] = 0
		default:
			dst[i] = c.a * (2*u*dwdu + c.beta*dwdb) / m.R
		}
	}
}
