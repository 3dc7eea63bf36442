package plot

import "strings"

// textWidth estimates the advance width in px of s set in a sans-serif
// face at the given size. The widths per character class are rounded up
// from common sans-serif faces, so the estimate errs on the wide side and
// labels keep clear of each other.
func textWidth(s string, size float64) float64 {
	w := 0.0
	for _, r := range s {
		switch {
		case r == ' ' || r == '.' || r == ',' || r == ':' || r == ';' || r == '\'' || r == '|' || r == '!':
			w += 0.30
		case r == 'i' || r == 'j' || r == 'l' || r == 'I' || r == 'f' || r == 't' || r == 'r' || r == '(' || r == ')' || r == '[' || r == ']':
			w += 0.36
		case r >= '0' && r <= '9':
			w += 0.58
		case r == 'm' || r == 'w' || r == 'M' || r == 'W' || r == '%' || r == '@':
			w += 0.90
		case r >= 'A' && r <= 'Z':
			w += 0.70
		case r >= 'a' && r <= 'z':
			w += 0.57
		case r < 0x80:
			w += 0.60
		case r >= 0x2070 && r <= 0x209F: // super- and subscripts
			w += 0.40
		case r >= 0x1100: // wide scripts
			w += 1.00
		default:
			w += 0.65
		}
	}
	return w * size
}

// wrap breaks s into lines no wider than width px at the given size,
// breaking at spaces; a word longer than the width stands on its own line.
// Every character of s is kept (runs of spaces become one space).
func wrap(s string, size, width float64) []string {
	words := strings.Fields(s)
	if len(words) == 0 {
		return nil
	}
	var lines []string
	line := words[0]
	for _, w := range words[1:] {
		if textWidth(line+" "+w, size) > width {
			lines = append(lines, line)
			line = w
			continue
		}
		line += " " + w
	}
	return append(lines, line)
}
