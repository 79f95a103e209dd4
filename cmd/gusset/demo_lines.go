package main

import (
	"fmt"
	"strings"

	"gusset/protocol"
)

// summaryLine is the demo's line on a solved case's largest displacement
// and utilisation. A largest utilisation over the checked members alone
// would flatter, so the line says how many members were not checked and
// how far the axial checks of those alone go (a part of their check,
// never the whole); with no member checked it says the utilisation is
// not known rather than print a 0.
func summaryLine(c protocol.CaseResult) string {
	s := fmt.Sprintf("deflection %5.1f mm at %s, ", 1000*c.MaxDisplacement.Value, c.MaxDisplacement.At)
	switch {
	case c.UncheckedMembers == 0:
		return s + fmt.Sprintf("utilisation %.2f (%s)", c.MaxUtilisation.Value, c.MaxUtilisation.At)
	case c.MaxUtilisation.At == "":
		s += fmt.Sprintf("utilisation not known: no member fully checked, %d not (see unchecked)", c.UncheckedMembers)
	default:
		s += fmt.Sprintf("utilisation %.2f (%s) of the checked members; %d not checked (see unchecked)",
			c.MaxUtilisation.Value, c.MaxUtilisation.At, c.UncheckedMembers)
	}
	largest, found := 0.0, false
	for e, u := range c.AxialUtilisation {
		if u != nil && c.Utilisation[e] == nil && (!found || *u > largest) {
			largest, found = *u, true
		}
	}
	if found {
		s += fmt.Sprintf(", whose axial checks alone reach %.2f", largest)
	}
	return s
}

// moreCases is the demo's note that a warning stands for n more cases
// alike, empty when n is 0.
func moreCases(n int) string {
	switch n {
	case 0:
		return ""
	case 1:
		return " (and likewise in 1 more case)"
	}
	return fmt.Sprintf(" (and likewise in %d more cases)", n)
}

// wrapped breaks text at spaces into lines of at most width characters
// (a longer word stays whole), indenting the lines after the first; runs
// of spaces within a line (the demo's aligned columns) are kept.
func wrapped(text, indent string, width int) string {
	var b strings.Builder
	line, hasWord := 0, false
	for i, word := range strings.Split(text, " ") {
		n := len([]rune(word))
		if i > 0 {
			if word != "" && hasWord && line+1+n > width {
				b.WriteString("\n" + indent)
				line, hasWord = len(indent), false
			} else {
				b.WriteString(" ")
				line++
			}
		}
		b.WriteString(word)
		line += n
		hasWord = hasWord || word != ""
	}
	return b.String()
}
