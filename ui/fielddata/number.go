package fielddata

import (
	"math"
	"strconv"
)

// pow10 holds the powers of ten that float64 represents exactly.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// parseNumber reads a decimal number written with the decimal mark mark
// ('.' or ','): an optional sign, digits with at most one decimal mark,
// and an optional exponent (e or E). Surrounding blanks are allowed.
// Infinite, NaN and out-of-range values are refused. The result is
// correctly rounded: small cases are computed exactly (one multiplication
// or division of exact operands, Clinger 1990), the rest by
// strconv.ParseFloat.
func parseNumber(b []byte, mark byte) (float64, bool) {
	b = trimBlank(b)
	i := 0
	neg := false
	if i < len(b) && (b[i] == '+' || b[i] == '-') {
		neg = b[i] == '-'
		i++
	}
	var mant uint64
	nd, exp := 0, 0
	digits, trunc := false, false
	for ; i < len(b) && b[i] >= '0' && b[i] <= '9'; i++ {
		digits = true
		if nd < 19 {
			mant = mant*10 + uint64(b[i]-'0')
			if mant != 0 {
				nd++
			}
		} else {
			exp++
			trunc = true
		}
	}
	if i < len(b) && b[i] == mark {
		i++
		for ; i < len(b) && b[i] >= '0' && b[i] <= '9'; i++ {
			digits = true
			if nd < 19 {
				mant = mant*10 + uint64(b[i]-'0')
				if mant != 0 {
					nd++
				}
				exp--
			} else {
				trunc = true
			}
		}
	}
	if !digits {
		return 0, false
	}
	if i < len(b) && (b[i] == 'e' || b[i] == 'E') {
		i++
		eneg := false
		if i < len(b) && (b[i] == '+' || b[i] == '-') {
			eneg = b[i] == '-'
			i++
		}
		e, ed := 0, false
		for ; i < len(b) && b[i] >= '0' && b[i] <= '9'; i++ {
			ed = true
			if e < 100000 {
				e = e*10 + int(b[i]-'0')
			}
		}
		if !ed {
			return 0, false
		}
		if eneg {
			e = -e
		}
		exp += e
	}
	if i != len(b) {
		return 0, false
	}
	if mant == 0 && !trunc {
		if neg {
			return math.Copysign(0, -1), true
		}
		return 0, true
	}
	if !trunc && mant < 1<<53 && exp >= -22 && exp <= 22 {
		v := float64(mant)
		if exp < 0 {
			v /= pow10[-exp]
		} else {
			v *= pow10[exp]
		}
		if neg {
			v = -v
		}
		return v, true
	}
	// Rare: many digits or a large exponent.
	s := make([]byte, len(b))
	copy(s, b)
	if mark != '.' {
		for k, c := range s {
			if c == mark {
				s[k] = '.'
			}
		}
	}
	v, err := strconv.ParseFloat(string(s), 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, false
	}
	return v, true
}
