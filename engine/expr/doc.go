// Package expr compiles arithmetic expressions over named parameters into
// programs that evaluate without allocating, so a parameter sweep can
// re-evaluate a model's expressions thousands of times cheaply.
//
// The language: decimal numbers (12, 0.5, .5, 1e-3); parameter names
// ([A-Za-z_][A-Za-z0-9_]*); the constant pi (unless a parameter of that
// name shadows it); the binary operators + − * / and ^; unary minus and
// plus; parentheses; and the functions sqrt, sin, cos, tan, abs (one
// argument), atan2(y, x) and min, max (one or more arguments). Angles are
// in radians. ^ binds tighter than unary minus and associates to the
// right, as in mathematics: −2^2 = −4 and 2^3^2 = 2^9 = 512. Spaces, tabs
// and line breaks are ignored; any other control character is an error.
// A source holds at most MaxLength bytes and nests at most 200 levels.
//
// Compile reports a *SyntaxError with a byte offset, or a *NameError for
// an unknown parameter or function (with the close candidates). Eval never
// returns NaN or ±Inf: division by zero, the square root of a negative
// number and any non-finite intermediate result are errors.
package expr
