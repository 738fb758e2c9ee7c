// Package cell makes text cells of CSV outputs safe to open in a
// spreadsheet. It imports nothing from isofield, so every package that
// writes CSV can use it.
package cell

import "strings"

// Neutral returns s made safe for a spreadsheet: text that begins with
// =, +, - or @ (which spreadsheets may run as a formula) gets a leading
// apostrophe, unless the whole cell is a plain number such as -350.2, which
// stays as written. Tab and carriage return at the start are treated the
// same way, since some spreadsheets strip them before looking.
func Neutral(s string) string {
	if s == "" {
		return s
	}
	switch s[0] {
	case '=', '+', '-', '@', '\t', '\r':
	default:
		return s
	}
	if isPlainNumber(s) {
		return s
	}
	return "'" + s
}

// isPlainNumber reports whether s is a decimal number: an optional sign,
// digits with at most one point, and an optional exponent.
func isPlainNumber(s string) bool {
	if s[0] == '+' || s[0] == '-' {
		s = s[1:]
	}
	mant, exp, hasExp := strings.Cut(strings.ToLower(s), "e")
	if !digitsWithPoint(mant) {
		return false
	}
	if !hasExp {
		return true
	}
	if exp != "" && (exp[0] == '+' || exp[0] == '-') {
		exp = exp[1:]
	}
	return exp != "" && strings.Trim(exp, "0123456789") == ""
}

// digitsWithPoint reports whether s is digits with at most one '.', and at
// least one digit.
func digitsWithPoint(s string) bool {
	digits, points := 0, 0
	for _, c := range s {
		switch {
		case c >= '0' && c <= '9':
			digits++
		case c == '.':
			points++
		default:
			return false
		}
	}
	return digits > 0 && points <= 1
}
