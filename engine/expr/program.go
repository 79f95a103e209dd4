package expr

import (
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
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
	tree  *node
}

// stackOnFrame is the stack depth Eval keeps in a local array; deeper
// programs (rare: it takes dozens of pending operands) use the heap.
const stackOnFrame = 32

// Compile parses src as an expression over the named parameters (the
// index of a name in params is its index in Eval's argument). Subtrees
// without parameters are folded to constants where they evaluate without
// error, so an expression with no parameters compiles to a single constant.
// The error is a *SyntaxError or a *NameError.
func Compile(src string, params []string) (*Program, error) {
	p := &parser{src: src, params: params}
	tree := p.parseSum()
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
	tree = fold(tree)
	prog := &Program{src: src, names: append([]string(nil), params...), tree: tree}
	seen := make(map[int]bool)
	depth := prog.emit(tree, 0, seen)
	prog.stack = depth
	for i := range seen {
		prog.uses = append(prog.uses, i)
	}
	sort.Ints(prog.uses)
	return prog, nil
}

// emit appends the code of n, whose operands start at stack height h,
// and returns the greatest stack height reached.
func (prog *Program) emit(n *node, h int, seen map[int]bool) int {
	deepest := h + 1
	for i, a := range n.args {
		deepest = max(deepest, prog.emit(a, h+i, seen))
	}
	in := instr{op: n.op, k: n.value}
	switch n.op {
	case opParam:
		in.n = int32(n.param)
		seen[n.param] = true
	case opMin, opMax:
		in.n = int32(len(n.args))
	}
	prog.code = append(prog.code, in)
	return deepest
}

// fold replaces subtrees without parameters by their values, except where
// evaluation fails: those stay as code so that Eval reports the failure.
func fold(n *node) *node {
	constant := true
	for i, a := range n.args {
		n.args[i] = fold(a)
		if n.args[i].op != opConst {
			constant = false
		}
	}
	if !constant || n.op == opConst || n.op == opParam {
		return n
	}
	var buf [stackOnFrame]float64
	args := buf[:0]
	for _, a := range n.args {
		args = append(args, a.value)
	}
	v, err := apply(n.op, args)
	if err != nil {
		return n
	}
	return &node{op: opConst, value: v, pos: n.pos}
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
		var arity int
		switch in.op {
		case opNeg, opSqrt, opSin, opCos, opTan, opAbs:
			arity = 1
		case opMin, opMax:
			arity = int(in.n)
		default:
			arity = 2
		}
		v, err := apply(in.op, stack[h-arity:h])
		if err != nil {
			return 0, err
		}
		h -= arity
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

// String returns the folded expression in a canonical form that Compile
// accepts with the same parameter list and that evaluates to the same value
// (bit for bit) or fails the same way. It writes only the parentheses the
// grouping needs, so it nests no deeper than the expression itself: a long
// sum stays flat.
func (prog *Program) String() string {
	var b strings.Builder
	write(&b, prog.tree, prog.names)
	return b.String()
}

var opSymbols = map[opcode]string{opAdd: "+", opSub: "-", opMul: "*", opDiv: "/", opPow: "^"}
var opNames = map[opcode]string{opSqrt: "sqrt", opSin: "sin", opCos: "cos", opTan: "tan",
	opAbs: "abs", opAtan2: "atan2", opMin: "min", opMax: "max"}

// precedence orders the binary operators; every other node prints as an
// atom (a number, a name, a call, or a parenthesised negation).
func precedence(n *node) int {
	switch n.op {
	case opAdd, opSub:
		return 1
	case opMul, opDiv:
		return 2
	case opPow:
		return 3
	}
	return 4
}

// writeOperand writes n, in parentheses when its precedence is below min.
func writeOperand(b *strings.Builder, n *node, params []string, min int) {
	n = simplified(n)
	if precedence(n) < min {
		b.WriteString("(")
		write(b, n, params)
		b.WriteString(")")
		return
	}
	write(b, n, params)
}

// simplified drops pairs of negations: −(−x) is x exactly, so a chain of
// negations prints as at most one.
func simplified(n *node) *node {
	for n.op == opNeg && n.args[0].op == opNeg {
		n = n.args[0].args[0]
	}
	return n
}

func write(b *strings.Builder, n *node, params []string) {
	n = simplified(n)
	switch n.op {
	case opConst:
		s := strconv.FormatFloat(n.value, 'g', -1, 64)
		if n.value < 0 || (n.value == 0 && math.Signbit(n.value)) {
			b.WriteString("(-")
			b.WriteString(s[1:])
			b.WriteString(")")
		} else {
			b.WriteString(s)
		}
	case opParam:
		b.WriteString(params[n.param])
	case opNeg:
		b.WriteString("(-")
		writeOperand(b, n.args[0], params, 4)
		b.WriteString(")")
	case opAdd, opSub, opMul, opDiv:
		// Left-associative: the left operand may be of the same level,
		// the right one must bind tighter.
		p := precedence(n)
		writeOperand(b, n.args[0], params, p)
		b.WriteString(opSymbols[n.op])
		writeOperand(b, n.args[1], params, p+1)
	case opPow:
		// Right-associative: a^b^c is a^(b^c).
		writeOperand(b, n.args[0], params, 4)
		b.WriteString("^")
		writeOperand(b, n.args[1], params, 3)
	default:
		b.WriteString(opNames[n.op])
		b.WriteString("(")
		for i, a := range n.args {
			if i > 0 {
				b.WriteString(",")
			}
			write(b, a, params)
		}
		b.WriteString(")")
	}
}
