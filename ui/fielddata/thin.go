package fielddata

import (
	"math"
	"strconv"
)

// DefaultPerCycle is the default number of readings per log cycle kept by
// thinning. Common practice, no single source: 10 to 20 readings per log
// cycle of time are usual for type-curve analysis.
const DefaultPerCycle = 20

// ThinLog picks readings spaced evenly in log time: the log10 axis of
// elapsed time is cut into bins of 1/perCycle of a cycle, starting at the
// decades (…, 0.1, 1, 10 s, …), and the first reading in each bin is kept,
// together with every reading at elapsed ≤ 0 and the last reading.
// elapsed must be in increasing order; the result holds indices into it,
// increasing. perCycle ≤ 0 means DefaultPerCycle.
func ThinLog(elapsed []float64, perCycle int) []int {
	if perCycle <= 0 {
		perCycle = DefaultPerCycle
	}
	n := len(elapsed)
	keep := make([]int, 0, min(n, 64))
	last := math.MinInt
	for i, e := range elapsed {
		if !(e > 0) {
			keep = append(keep, i)
			continue
		}
		// The small offset puts a time that is a bin edge up to rounding
		// (10^(k/N) computed in floating point) in the bin it starts.
		b := int(math.Floor(math.Log10(e)*float64(perCycle) + 1e-9))
		if b != last {
			keep = append(keep, i)
			last = b
		}
	}
	if n > 0 && (len(keep) == 0 || keep[len(keep)-1] != n-1) {
		keep = append(keep, n-1)
	}
	return keep
}

// CountText says how many readings thinning keeps, as in
// "12 400 → 143 readings"; thousands are grouped with a no-break space.
func CountText(before, after int) string {
	w := "readings"
	if after == 1 {
		w = "reading"
	}
	return groupThousands(before) + " → " + groupThousands(after) + " " + w
}

func groupThousands(n int) string {
	s := strconv.Itoa(n)
	neg := false
	if n < 0 {
		neg, s = true, s[1:]
	}
	if len(s) <= 4 {
		// Four-digit numbers stay ungrouped, a common typographic
		// convention.
		if neg {
			return "-" + s
		}
		return s
	}
	var out []byte
	for i, c := range []byte(s) {
		if i > 0 && (len(s)-i)%3 == 0 {
			out = append(out, "\u00a0"...)
		}
		out = append(out, c)
	}
	if neg {
		return "-" + string(out)
	}
	return string(out)
}
