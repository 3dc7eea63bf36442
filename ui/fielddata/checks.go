package fielddata

import (
	"math"
	"sort"
)

// Duplicate is a reading at the same time as the reading before it.
type Duplicate struct {
	Row, PrevRow int     // 1-based line numbers in the file
	Time         float64 // s, on the record's time axis
	// Same reports whether every value equals the previous reading's.
	Same bool
}

// Gap is an interval between two readings much longer than the intervals
// around it.
type Gap struct {
	PrevRow, Row int     // the rows before and after the gap
	From, To     float64 // s, on the record's time axis
	// Around is the longer of the neighbouring intervals (s).
	Around float64
}

// Backward is a reading earlier than the reading before it.
type Backward struct {
	Row, PrevRow int
	Time, Prev   float64
}

// Checks reports what is odd about the times of a record. Each list holds
// at most ImportSettings.MaxListed entries; the counts are complete.
type Checks struct {
	Duplicates     []Duplicate
	DuplicateCount int
	Gaps           []Gap
	GapCount       int
	Backward       []Backward
	BackwardCount  int
	// Interval is the median interval between readings (s), from at most
	// 10 000 intervals spread over the record; 0 with fewer than 2
	// readings.
	Interval float64
}

// OK reports whether no duplicate, gap or backward step was found.
func (c Checks) OK() bool { return c.DuplicateCount == 0 && c.GapCount == 0 && c.BackwardCount == 0 }

func check(t []float64, rows []int32, cols []Column, maxListed int, factor float64) Checks {
	var c Checks
	n := len(t)
	if n < 2 {
		return c
	}
	row := func(i int) int {
		if i < len(rows) {
			return int(rows[i])
		}
		return i + 1
	}
	prevPos := 0.0 // last positive interval
	j := 1         // index of the next positive interval t[j]-t[j-1] at or after the current
	for i := 1; i < n; i++ {
		dt := t[i] - t[i-1]
		switch {
		case dt == 0:
			c.DuplicateCount++
			if len(c.Duplicates) < maxListed {
				same := true
				for _, col := range cols {
					if col.Values[i] != col.Values[i-1] {
						same = false
					}
				}
				c.Duplicates = append(c.Duplicates, Duplicate{Row: row(i), PrevRow: row(i - 1), Time: t[i], Same: same})
			}
		case dt < 0:
			c.BackwardCount++
			if len(c.Backward) < maxListed {
				c.Backward = append(c.Backward, Backward{Row: row(i), PrevRow: row(i - 1), Time: t[i], Prev: t[i-1]})
			}
		case dt > 0:
			if j <= i {
				j = i + 1
			}
			for j < n && !(t[j]-t[j-1] > 0) {
				j++
			}
			next := 0.0
			if j < n {
				next = t[j] - t[j-1]
			}
			around := math.Max(prevPos, next)
			if around > 0 && dt > factor*around && (prevPos == 0 || dt > factor*prevPos) && (next == 0 || dt > factor*next) {
				c.GapCount++
				if len(c.Gaps) < maxListed {
					c.Gaps = append(c.Gaps, Gap{PrevRow: row(i - 1), Row: row(i), From: t[i-1], To: t[i], Around: around})
				}
			}
			prevPos = dt
		}
	}
	step := max(1, (n-1)/10000)
	var iv []float64
	for i := 1; i < n; i += step {
		if dt := t[i] - t[i-1]; dt > 0 {
			iv = append(iv, dt)
		}
	}
	if len(iv) > 0 {
		sort.Float64s(iv)
		c.Interval = iv[len(iv)/2]
	}
	return c
}
