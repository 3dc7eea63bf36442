package ui

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"

	"fieldfit/models"
)

// The scripted field session of TestFieldSession and the browser test: an
// invented 5-hour test, Q = 7.5 L/s, observation well at 25 m, static
// level 5.12 m. The depths were made from the Theis curve with
// T = 2.6e-3 m²/s and S = 2.2e-4 (E1 from models) plus noise of about
// 3 mm, rounded to the millimetre; see TestSessionReadingsOrigin.
const (
	sessionT      = 2.6e-3
	sessionS      = 2.2e-4
	sessionQ      = 7.5e-3
	sessionR      = 25.0
	sessionStatic = 5.12
)

var sessionReadings = [][2]string{
	{"1", "5.380"}, {"1.5", "5.456"}, {"2", "5.518"}, {"2.5", "5.571"}, {"3", "5.607"},
	{"4", "5.665"}, {"5", "5.720"}, {"6", "5.754"}, {"7", "5.786"}, {"8", "5.814"},
	{"10", "5.868"}, {"12", "5.908"}, {"15", "5.955"}, {"20", "6.028"}, {"25", "6.079"},
	{"30", "6.120"}, {"40", "6.182"}, {"50", "6.231"}, {"60", "6.278"}, {"80", "6.341"},
	{"100", "6.392"}, {"120", "6.433"}, {"180", "6.525"}, {"240", "6.589"}, {"300", "6.645"},
}

// sessionData returns the session's readings as elapsed s and drawdown m.
func sessionData() (times, drawdowns []float64) {
	for _, r := range sessionReadings {
		m, _ := strconv.ParseFloat(r[0], 64)
		d, _ := strconv.ParseFloat(r[1], 64)
		times = append(times, m*60)
		drawdowns = append(drawdowns, d-sessionStatic)
	}
	return times, drawdowns
}

// TestSessionReadingsOrigin regenerates the session's depths from the
// Theis curve and the seeded noise, so the table above stays what its
// comment says.
func TestSessionReadingsOrigin(t *testing.T) {
	m := models.Theis{Q: sessionQ, R: sessionR}
	rng := rand.New(rand.NewPCG(7, 25))
	for i, r := range sessionReadings {
		mn, _ := strconv.ParseFloat(r[0], 64)
		s := make([]float64, 1)
		m.Eval(s, []float64{mn * 60}, []float64{sessionT, sessionS})
		d := sessionStatic + s[0] + 0.003*rng.NormFloat64()
		if got := strconv.FormatFloat(math.Round(d*1000)/1000, 'f', 3, 64); got != r[1] {
			t.Errorf("row %d: depth %s, regenerated %s", i+1, r[1], got)
		}
	}
}
