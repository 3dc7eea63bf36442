package steptest

import (
	"math"
	"math/rand/v2"

	"fieldfit/models"
)

// Our own scenario (invented): production well PW-3 at the Larkspur Mill
// site, screen radius 0.15 m, in an aquifer with T = 5e-3 m²/s and
// S = 2e-4; four 100-minute steps at 4, 8, 12 and 16 L/s; a linear well
// loss of 20 s/m² and a nonlinear one of C = 3000 s²/m⁵.
const (
	scRw = 0.15
	scT  = 5e-3
	scS  = 2e-4
	scB1 = 20.0
	scC  = 3000.0
	scDt = 6000.0
)

var scRates = []float64{0.004, 0.008, 0.012, 0.016}

// scSchedule is the scenario's schedule: steps every scDt seconds.
func scSchedule() []Step {
	s := make([]Step, len(scRates))
	for k, q := range scRates {
		s[k] = Step{Start: float64(k) * scDt, Rate: q}
	}
	return s
}

// theisStep is the generator of the synthetic step tests: the Theis (1935)
// drawdown of the rate history superposed in time (models.E1), plus the
// linear and nonlinear well losses of the current rate,
//
//	s(t) = Σ_i (Q_i − Q_{i−1})·W(r²S/(4T(t − t_i)))/(4πT) + B₁Q(t) + C·Q(t)²,
//
// where a reading at a step's start time belongs to the step before.
func theisStep(steps []Step, rw, T, S, b1, c, t float64) float64 {
	s, prev, q := 0.0, 0.0, 0.0
	for _, st := range steps {
		if !(t > st.Start) {
			break
		}
		s += (st.Rate - prev) * models.E1(rw*rw*S/(4*T*(t-st.Start))) / (4 * math.Pi * T)
		prev, q = st.Rate, st.Rate
	}
	return s + b1*q + c*q*q
}

// trueB is Jacob's B of the scenario at the duration dt: the Theis
// drawdown per unit rate at the well plus the linear well loss.
func trueB(rw, T, S, b1, dt float64) float64 {
	return models.E1(rw*rw*S/(4*T*dt))/(4*math.Pi*T) + b1
}

// scReadings returns perStep readings per step, log-spaced in the time
// since the step's start from 60 s to the step's end, with Gaussian noise
// of standard deviation sigma (m) from rng (nil = no noise).
func scReadings(steps []Step, perStep int, sigma float64, rng *rand.Rand) models.Data {
	var d models.Data
	for _, st := range steps {
		for j := 0; j < perStep; j++ {
			tau := 60 * math.Pow(scDt/60, float64(j)/float64(perStep-1))
			if j == perStep-1 {
				tau = scDt
			}
			t := st.Start + tau
			s := theisStep(steps, scRw, scT, scS, scB1, scC, t)
			if rng != nil {
				s += sigma * rng.NormFloat64()
			}
			d.Time = append(d.Time, t)
			d.Value = append(d.Value, s)
		}
	}
	return d
}

func relDiff(a, b float64) float64 { return math.Abs(a-b) / math.Max(math.Abs(b), 1e-300) }
