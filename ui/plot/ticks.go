package plot

import (
	"math"
	"strconv"
	"strings"
)

// Tick is one tick mark of an axis.
type Tick struct {
	Value float64
	// Label is the text at the tick; "" for an unlabelled (minor or
	// thinned) tick.
	Label string
	// Major is true for decades on a log axis and for every tick on a
	// linear one; major ticks are longer and carry a grid line.
	Major bool
}

// The aim, in px, for the distance between linear ticks along x and y.
const (
	tickSpacingX = 90
	tickSpacingY = 60
)

// linearTarget returns the number of intervals to aim for on a linear axis
// px long.
func linearTarget(px float64, horizontal bool) int {
	sp := tickSpacingY
	if horizontal {
		sp = tickSpacingX
	}
	n := int(math.Round(math.Abs(px) / float64(sp)))
	return max(2, min(n, 10))
}

// LogTicks returns the ticks of a log axis from lo to hi (0 < lo < hi), in
// increasing order: a labelled major tick at each decade 10ᵏ and a minor tick
// at 2…9 × 10ᵏ. When fewer than two decades fall in the range, the minor ticks
// at 2 and 5 × 10ᵏ are labelled too, and when that still gives fewer than two
// labels, every minor tick is. A range too narrow for any such tick gets
// linear ticks. Labels are plain decimals ("0.01", "1", "1000") when the
// range lies within 0.0001 to 100000, and powers of ten for every label
// otherwise ("10⁻⁶", "10⁰", "10⁶", "2×10⁻⁵"). An unusable range gives nil.
func LogTicks(lo, hi float64) []Tick {
	if !(lo > 0 && hi > lo) || math.IsInf(hi, 0) {
		return nil
	}
	const tol = 1e-9
	k0 := int(math.Floor(math.Log10(lo) + tol))
	k1 := int(math.Floor(math.Log10(hi) + tol))
	if k1-k0 > 400 {
		return nil
	}
	power := k0 < -4 || k1 > 5
	label := func(m, k int) string {
		if power {
			return powerLabel(m, k)
		}
		return logLabel(m, k)
	}
	var ticks []Tick
	decades := 0
	for k := k0; k <= k1; k++ {
		for m := 1; m <= 9; m++ {
			v := mant10(m, k)
			if v < lo*(1-tol) || v > hi*(1+tol) {
				continue
			}
			t := Tick{Value: v, Major: m == 1}
			if m == 1 {
				t.Label = label(m, k)
				decades++
			}
			ticks = append(ticks, t)
		}
	}
	if decades < 2 {
		labelled := decades
		for i := range ticks {
			if m := mantissa(ticks[i].Value); m == 2 || m == 5 {
				ticks[i].Label = label(m, exponent(ticks[i].Value))
				labelled++
			}
		}
		if labelled < 2 {
			for i := range ticks {
				ticks[i].Label = label(mantissa(ticks[i].Value), exponent(ticks[i].Value))
			}
			labelled = len(ticks)
		}
		if labelled < 2 {
			return LinearTicks(lo, hi, 4)
		}
	}
	return ticks
}

// mant10 returns m × 10ᵏ, correctly rounded for |k| ≤ 22.
func mant10(m, k int) float64 {
	if k >= 0 {
		return float64(m) * math.Pow10(k)
	}
	return float64(m) / math.Pow10(-k)
}

func exponent(v float64) int { return int(math.Floor(math.Log10(v) + 1e-9)) }

func mantissa(v float64) int {
	return int(math.Round(v / math.Pow10(exponent(v))))
}

var superscript = strings.NewReplacer("0", "⁰", "1", "¹", "2", "²", "3", "³", "4", "⁴",
	"5", "⁵", "6", "⁶", "7", "⁷", "8", "⁸", "9", "⁹", "-", "⁻")

// logLabel writes m × 10ᵏ (m from 1 to 9).
func logLabel(m, k int) string {
	switch {
	case k >= 0 && k <= 5:
		return strconv.Itoa(m) + strings.Repeat("0", k)
	case k < 0 && k >= -4:
		return "0." + strings.Repeat("0", -k-1) + strconv.Itoa(m)
	}
	return powerLabel(m, k)
}

// powerLabel writes m × 10ᵏ as "10ᵏ" or "m×10ᵏ".
func powerLabel(m, k int) string {
	p := "10" + superscript.Replace(strconv.Itoa(k))
	if m == 1 {
		return p
	}
	return strconv.Itoa(m) + "×" + p
}

// LinearTicks returns about n+1 ticks (n ≥ 1 intervals) from lo to hi (lo <
// hi) at multiples of the step of 1, 2 or 5 × 10ᵏ nearest to (hi − lo)/n, all major and labelled with
// as many decimals as the step needs; negative labels use the minus sign
// "−". An unusable range gives nil.
func LinearTicks(lo, hi float64, n int) []Tick {
	if !(hi > lo) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return nil
	}
	n = max(1, min(n, 50))
	m, e := niceStepParts((hi - lo) / float64(n))
	step := mant10(m, e)
	if step == 0 || math.IsInf(step, 0) || (hi-lo)/step > 200 {
		return nil
	}
	i0 := math.Ceil(lo/step - 1e-9)
	i1 := math.Floor(hi/step + 1e-9)
	if math.Abs(i0) > 1e15 || math.Abs(i1) > 1e15 {
		return nil // step too fine for the magnitude of the values
	}
	ticks := make([]Tick, 0, int(i1-i0)+1)
	for i := i0; i <= i1; i++ {
		v := stepMultiple(i, m, e)
		ticks = append(ticks, Tick{Value: v, Label: linearLabel(v, e), Major: true})
	}
	return ticks
}

func niceStep(raw float64) float64 {
	m, e := niceStepParts(raw)
	return mant10(m, e)
}

// niceStepParts returns the step m × 10ᵉ with m ∈ {1, 2, 5} nearest to raw
// (on a log scale, with the thresholds 1.5, 3 and 7 of Heckbert, "Nice
// numbers for graph labels", Graphics Gems, 1990 — from memory).
func niceStepParts(raw float64) (int, int) {
	if !(raw > 0) || math.IsInf(raw, 0) {
		return 1, 0
	}
	e := int(math.Floor(math.Log10(raw)))
	f := raw / math.Pow10(e)
	switch {
	case f < 1.5:
		return 1, e
	case f < 3:
		return 2, e
	case f < 7:
		return 5, e
	}
	return 1, e + 1
}

func linearLabel(v float64, e int) string {
	var s string
	if e < -6 || e > 6 || math.Abs(v) >= 1e7 {
		s = sciLabel(v)
	} else {
		s = strconv.FormatFloat(v, 'f', max(0, -e), 64)
	}
	if strings.HasPrefix(s, "-") {
		if strings.Trim(s, "-0.") == "" {
			return s[1:] // −0 → 0
		}
		s = "−" + s[1:]
	}
	return s
}

// sciLabel writes v as "1.5×10⁷" with the fewest digits that give v back.
func sciLabel(v float64) string {
	if v == 0 {
		return "0"
	}
	s := strconv.FormatFloat(v, 'e', -1, 64)
	m, x, _ := strings.Cut(s, "e")
	exp, _ := strconv.Atoi(x)
	if m == "1" {
		return "10" + superscript.Replace(strconv.Itoa(exp))
	}
	if m == "-1" {
		return "-10" + superscript.Replace(strconv.Itoa(exp))
	}
	return m + "×10" + superscript.Replace(strconv.Itoa(exp))
}
