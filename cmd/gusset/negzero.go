package main

import "regexp"

// negativeZero matches a number that prints as zero with a minus sign
// ("-0", "-0.0", "-0.000") and not followed by a digit of its own (a
// full stop after it ends a sentence).
var negativeZero = regexp.MustCompile(`(^|[^0-9.])-(0(?:\.0+)?)([^0-9.]|\.[^0-9]|\.$|$)`)

// withoutNegativeZeros drops the sign of every printed zero: a reaction of
// −1e−14 kN formatted with one decimal reads 0.0, not −0.0.
func withoutNegativeZeros(s string) string {
	// Twice, since one match consumes the character before the next.
	s = negativeZero.ReplaceAllString(s, "${1}${2}${3}")
	return negativeZero.ReplaceAllString(s, "${1}${2}${3}")
}
