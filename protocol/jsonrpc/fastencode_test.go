package jsonrpc

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"testing"

	"gusset/protocol"
)

// randomFloat returns numbers of every magnitude the formats switch on
// (encoding/json writes exponent notation below 1e-6 and from 1e21), whole
// numbers, and the extremes of float64.
func randomFloat(r *rand.Rand) float64 {
	switch r.IntN(8) {
	case 0:
		return []float64{0, math.Copysign(0, -1), 1e-6, -1e-6, 1e21, 1e-7, 9.999999999999999e20,
			math.MaxFloat64, math.SmallestNonzeroFloat64, -5e-324, 1e-300, 123456789}[r.IntN(12)]
	case 1:
		return float64(r.IntN(2000) - 1000)
	}
	return r.NormFloat64() * math.Pow(10, float64(r.IntN(70)-35))
}

func randomFloats(r *rand.Rand, n int) []float64 {
	x := make([]float64, n)
	for i := range x {
		x[i] = randomFloat(r)
	}
	return x
}

// randomCase returns a case result of n nodes and members with random
// numbers, null and empty arrays and omitted fields.
func randomCase(r *rand.Rand, n int) protocol.CaseResult {
	c := protocol.CaseResult{ID: "dead & <live>", Kind: "case",
		Displacements: make([][]float64, n), Rotations: make([][]float64, n), EndForces: make([][]float64, n),
		AxialForces: randomFloats(r, n), Stresses: randomFloats(r, n), Utilisation: make([]*float64, n),
		Members: make([]*protocol.MemberResult, n), Residual: randomFloat(r)}
	for i := range n {
		c.Displacements[i] = randomFloats(r, 3)
		if i%3 == 0 {
			c.Rotations[i] = randomFloats(r, 3)
		} else if i%3 == 1 {
			c.Rotations[i] = []float64{}
		}
		c.EndForces[i] = randomFloats(r, 6)
		if i%4 != 0 {
			u := randomFloat(r)
			c.Utilisation[i] = &u
		}
		if i%5 == 0 {
			c.Members[i] = randomMember(r, i)
		}
	}
	d := 2.5
	c.MaxDisplacement = protocol.Extreme{Value: randomFloat(r), At: "m1", Distance: &d}
	c.Reactions = []protocol.Reaction{{Node: "A", Force: randomFloats(r, 3), Moment: nil},
		{Node: "B\u2028", Force: []float64{}, Moment: randomFloats(r, 3), LocalForce: randomFloats(r, 3)}}
	return c
}

// randomMember returns a beam's results along it with random numbers at
// 11 stations, in 3D or (i odd) 2D, some checks not made.
func randomMember(r *rand.Rand, i int) *protocol.MemberResult {
	m := &protocol.MemberResult{ID: "m" + string(rune('a'+i%26)), Stations: randomFloats(r, 11), Axial: randomFloats(r, 11),
		ShearY: randomFloats(r, 11), MomentZ: randomFloats(r, 11), Displacements: make([][]float64, 11),
		PeakMomentZ: protocol.Along{Value: randomFloat(r), At: randomFloat(r)}, BucklingReduction: randomFloat(r),
		StrainEnergy: protocol.StrainEnergy{Axial: randomFloat(r), Bending: randomFloat(r)}}
	for k := range m.Displacements {
		m.Displacements[k] = randomFloats(r, 3-i%2)
	}
	if i%2 == 0 {
		m.ShearZ, m.Torsion, m.MomentY = randomFloats(r, 11), randomFloats(r, 11), randomFloats(r, 11)
		m.PeakMomentY = &protocol.Along{Value: randomFloat(r), At: 1}
	}
	if i%3 != 0 {
		u := randomFloat(r)
		m.AxialUtilisation, m.CombinedUtilisation = &u, &u
	}
	return m
}

// TestAppendJSONAgreesWithEncodingJSON compares appendJSON's bytes with
// encoding/json's (the reference: the standard library's encoder with
// SetEscapeHTML(false)) on solve results with numbers of every magnitude,
// arrays long enough to be written in parallel pieces, strings with every
// ASCII control character, quotes, backslashes, HTML characters, U+2028,
// invalid UTF-8, maps, raw ids with white space, expressions, nil and
// empty arrays and omitted fields.
func TestAppendJSONAgreesWithEncodingJSON(t *testing.T) {
	values := encoderCorpus()
	for k, v := range values {
		want, err := encodeStandard(v)
		if err != nil {
			t.Fatalf("value %d: encoding/json: %v", k, err)
		}
		got, err := appendJSON(nil, v)
		if err != nil {
			t.Fatalf("value %d: appendJSON: %v", k, err)
		}
		if !bytes.Equal(got, want) {
			i := 0
			for i < min(len(got), len(want)) && got[i] == want[i] {
				i++
			}
			t.Errorf("value %d differs at byte %d: got %.80q, want %.80q", k, i, got[i:], want[i:])
		}
	}
}

// TestAppendJSONRefusesWhatEncodingJSONRefuses: a NaN or an infinity
// anywhere, large arrays included, is refused (encode then gives
// encoding/json's error), and types appendJSON leaves to encoding/json
// still encode as encoding/json encodes them.
func TestAppendJSONRefusesWhatEncodingJSONRefuses(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	big := randomFloats(r, 3*parallelFloats)
	big[2*parallelFloats+5] = math.Inf(-1)
	long := make([]*float64, 4105)
	nan := math.NaN()
	long[len(long)-5] = &nan
	members := randomCase(r, 4096).Members
	members[len(members)-6].MomentZ[3] = math.Inf(1) // a beam's (every fifth is one)
	for k, v := range []any{math.NaN(), []float64{1, math.Inf(1)}, big, [][]float64{{1}, {math.NaN()}},
		protocol.Extreme{Value: math.NaN()}, long, members} {
		if _, err := appendJSON(nil, v); !errors.Is(err, errFallback) {
			t.Errorf("value %d: appendJSON error %v, want a refusal", k, err)
		}
		if _, err := encode(v); err == nil {
			t.Errorf("value %d: encode accepted a NaN or infinity", k)
		}
	}
	type embedded struct{ protocol.Problem }
	for k, v := range []any{[]byte("abc"), float32(1.5), embedded{protocol.Problem{Path: "/a"}}, [2]int{1, 2}} {
		if _, err := appendJSON(nil, v); !errors.Is(err, errFallback) {
			t.Errorf("value %d: appendJSON handled a type it leaves to encoding/json", k)
		}
		got, err := encode(v)
		want, _ := encodeStandard(v)
		if err != nil || !bytes.Equal(got, want) {
			t.Errorf("value %d: encode gave %q, %v; want %q", k, got, err, want)
		}
	}
}

// encoderCorpus returns the values the encoder tests compare: solve
// results with numbers of every magnitude, arrays long enough to be
// written in parallel pieces, strings with every ASCII control character,
// quotes, backslashes, HTML characters, U+2028, invalid UTF-8, maps, raw
// ids with white space, expressions, nil and empty arrays and omitted
// fields.
func encoderCorpus() []any {
	r := rand.New(rand.NewPCG(19, 2))
	var all []byte
	for c := range 256 {
		all = append(all, byte(c))
	}
	strs := []string{string(all), "plain", "é ü 漢 \U0001F600", "\u2028\u2029", "a\xffb\xc0", `"quoted" \back\slash`, "&<>"}
	values := []any{
		protocol.SolveResult{Cases: []protocol.CaseResult{randomCase(r, 50), randomCase(r, 3*parallelFloats),
			randomCase(r, 4227)},
			Warnings: strs, Unchecked: []protocol.Problem{{Path: "/members/0", Message: strs[0]}}, Caution: "check"},
		protocol.SolveResult{},
		&protocol.Response{JSONRPC: "2.0", ID: json.RawMessage(` { "a" : [1, 2] } `), Result: map[string]any{
			"z": 1.5, "a": []any{"x", nil, true, 3.0, map[string]float64{"b": 1e-9, "a": -0.0}}, "m": strs}},
		&protocol.Response{JSONRPC: "2.0", ID: json.RawMessage(`7`), Error: protocol.NewError(1001, "kind", "msg",
			protocol.Problem{Path: "/x", Message: "y"})},
		protocol.Notification{JSONRPC: "2.0", Method: "progress", Params: &protocol.Progress{Request: json.RawMessage(`"s"`), Stage: "step", Done: 3, Total: 9}},
		[]protocol.Number{{Value: 1.25}, {Expr: "a & b < c", IsExpr: true}, {Value: math.Copysign(0, -1)}},
		randomFloats(r, 5*parallelFloats+3),
		map[string][]float64{"p": randomFloats(r, 4), "q": nil, "": {}},
		nil, []any{}, (*protocol.Error)(nil),
		longSliceWithPieces(r),
	}
	for _, s := range strs {
		values = append(values, s)
	}
	return values
}

// longSliceWithPieces returns a long slice of numbers, strings, nulls and
// maps with arrays of numbers long enough to be written in pieces inside
// it.
func longSliceWithPieces(r *rand.Rand) []any {
	v := make([]any, 6145)
	for i := range v {
		switch i % 7 {
		case 0:
			v[i] = randomFloat(r)
		case 1:
			v[i] = "s\n" + string(rune(i))
		case 2:
			v[i] = map[string]any{"k": randomFloats(r, 2), "j": nil}
		}
	}
	v[259] = randomFloats(r, 2*parallelFloats+1)
	v[len(v)-1] = randomFloats(r, parallelFloats)
	return v
}
