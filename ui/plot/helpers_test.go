package plot

import "strconv"

func parseF(s string) (float64, error) { return strconv.ParseFloat(s, 64) }
