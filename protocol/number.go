package protocol

import (
	"bytes"
	"encoding/json"
	"reflect"
	"strconv"
)

// Number is a number that may instead be written as an expression string
// over the model's parameters: arithmetic (+ − × / ^), parentheses, sqrt,
// sin, cos, tan, atan2, abs, min, max and pi. Angles are in radians.
type Number struct {
	Value float64
	Expr  string
	// IsExpr tells an expression from a plain number.
	IsExpr bool
}

// MarshalJSON writes a plain number or the expression string.
func (n Number) MarshalJSON() ([]byte, error) {
	if n.IsExpr {
		return json.Marshal(n.Expr)
	}
	return json.Marshal(n.Value)
}

// UnmarshalJSON reads a number or a string.
func (n *Number) UnmarshalJSON(b []byte) error {
	b = bytes.TrimSpace(b)
	if len(b) > 0 && b[0] == '"' {
		var s string
		if err := json.Unmarshal(b, &s); err != nil {
			return err
		}
		*n = Number{Expr: s, IsExpr: true}
		return nil
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil {
		return &json.UnmarshalTypeError{Value: "number " + string(b), Type: numberType}
	}
	*n = Number{Value: v}
	return nil
}

var numberType = reflect.TypeOf(Number{})
