package expr

import (
	"fmt"
	"math"
	"slices"
	"sort"
)

type opcode uint8

const (
	opConst opcode = iota
	opParam
	opNeg
	opAdd
	opSub
	opMul
	opDiv
	opPow
	opSqrt
	opSin
	opCos
	opTan
	opAbs
	opAtan2
	opMin
	opMax
)

// instr is one instruction of the stack machine. n is the parameter index
// for opParam and the argument count for opMin and opMax.
type instr struct {
	op opcode
	n  int32
	k  float64
}

// Program is a compiled expression. It is immutable and safe for
// concurrent use.
type Program struct {
	src   string
	code  []instr
	stack int // the deepest stack the code needs
	uses  []int
	names []string
}

// stackOnFrame is the stack depth Eval keeps in a local array; deeper
// programs (rare: it takes dozens of pending operands) use the heap.
const stackOnFrame = 32

// Compile parses src as an expression over the named parameters (the
// index of a name in params is its index in Eval's argument). Operations
// on constants are folded to constants where they evaluate without error,
// so an expression with no parameters compiles to a single constant.
// A source longer than MaxLength bytes, nested more than 200 levels deep
// or holding a control character is a syntax error. Parsing recurses only
// into nesting, and compiling allocates a small multiple of len(src).
// The error is a *SyntaxError or a *NameError.
func Compile(src string, params []string) (*Program, error) {
	// Every instruction comes from at least one byte of the source (a
	// digit, a name, an operator or a function name), so len(src)+1
	// instructions never need to grow while parsing; the program keeps an
	// exact copy.
	p := &parser{src: src, params: params}
	if len(src) > MaxLength {
		p.fail(MaxLength, fmt.Sprintf("the expression is longer than %d bytes (it has %d); split it with parameters or compute it in the host", MaxLength, len(src)))
		return nil, p.err
	}
	p.checkCharacters()
	if p.err == nil {
		p.code = make([]instr, 0, len(src)+1)
		p.parseSum()
	}
	if p.err == nil {
		if c := p.peek(); c != 0 {
			if c == ')' {
				p.fail(p.pos, "unexpected \")\" without a matching \"(\"")
			} else {
				p.fail(p.pos, "unexpected "+describeByte(c)+": expected an operator or the end of the expression")
			}
		}
	}
	if p.err != nil {
		return nil, p.err
	}
	prog := &Program{src: src, names: append([]string(nil), params...), code: slices.Clone(p.code)}
	seen := make(map[int]bool)
	h := 0
	for _, in := range prog.code {
		h += 1 - arity(in)
		prog.stack = max(prog.stack, h)
		if in.op == opParam && !seen[int(in.n)] {
			seen[int(in.n)] = true
			prog.uses = append(prog.uses, int(in.n))
		}
	}
	sort.Ints(prog.uses)
	return prog, nil
}

// arity returns how many operands in takes from the stack.
func arity(in instr) int {
	switch in.op {
	case opConst, opParam:
		return 0
	case opNeg, opSqrt, opSin, opCos, opTan, opAbs:
		return 1
	case opMin, opMax:
		return int(in.n)
	}
	return 2
}

// apply computes one operation on its operands.
func apply(op opcode, a []float64) (float64, error) {
	var v float64
	switch op {
	case opNeg:
		v = -a[0]
	case opAdd:
		v = a[0] + a[1]
	case opSub:
		v = a[0] - a[1]
	case opMul:
		v = a[0] * a[1]
	case opDiv:
		if a[1] == 0 {
			return 0, ErrDivisionByZero
		}
		v = a[0] / a[1]
	case opPow:
		v = math.Pow(a[0], a[1])
	case opSqrt:
		if a[0] < 0 {
			return 0, ErrSqrtNegative
		}
		v = math.Sqrt(a[0])
	case opSin:
		v = math.Sin(a[0])
	case opCos:
		v = math.Cos(a[0])
	case opTan:
		v = math.Tan(a[0])
	case opAbs:
		v = math.Abs(a[0])
	case opAtan2:
		v = math.Atan2(a[0], a[1])
	case opMin:
		v = a[0]
		for _, x := range a[1:] {
			v = math.Min(v, x)
		}
	case opMax:
		v = a[0]
		for _, x := range a[1:] {
			v = math.Max(v, x)
		}
	default:
		panic(fmt.Sprintf("expr: unknown opcode %d", op))
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, ErrNotFinite
	}
	return v, nil
}

// Eval evaluates the program with params[i] the value of the i-th
// parameter given to Compile. It does not allocate (for programs needing
// at most 32 pending operands) and never returns NaN or ±Inf: it returns
// ErrDivisionByZero, ErrSqrtNegative or ErrNotFinite instead, including
// when a parameter value itself is not finite. Eval panics if params is
// shorter than the parameter list given to Compile.
func (prog *Program) Eval(params []float64) (float64, error) {
	if len(params) < len(prog.names) {
		panic(fmt.Sprintf("expr: Eval got %d parameter values, the program was compiled with %d", len(params), len(prog.names)))
	}
	var frame [stackOnFrame]float64
	stack := frame[:]
	if prog.stack > stackOnFrame {
		stack = make([]float64, prog.stack)
	}
	h := 0
	for _, in := range prog.code {
		switch in.op {
		case opConst:
			stack[h] = in.k
			h++
			continue
		case opParam:
			x := params[in.n]
			if math.IsNaN(x) || math.IsInf(x, 0) {
				return 0, ErrNotFinite
			}
			stack[h] = x
			h++
			continue
		}
		k := arity(in)
		v, err := apply(in.op, stack[h-k:h])
		if err != nil {
			return 0, err
		}
		h -= k
		stack[h] = v
		h++
	}
	return stack[0], nil
}

// Uses returns the sorted indices of the parameters the program reads
// (after constant folding). The caller must not modify the slice.
func (prog *Program) Uses() []int { return prog.uses }

// Constant reports whether the program reads no parameter, and its value
// when it is a single folded constant.
func (prog *Program) Constant() (value float64, ok bool) {
	if len(prog.code) == 1 && prog.code[0].op == opConst {
		return prog.code[0].k, true
	}
	return 0, false
}

// Source returns the expression as it was given to Compile.
func (prog *Program) Source() string { return prog.src }
