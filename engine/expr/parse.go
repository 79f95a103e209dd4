package expr

import (
	"fmt"
	"strconv"
)

// MaxLength is the longest expression source Compile accepts, in bytes.
// It bounds the work and memory of one expression (compiling allocates at
// most a few times its length) far above any expression a person or a
// parametric host writes.
const MaxLength = 1 << 16

// maxDepth bounds the parser's recursion so that hostile input (thousands
// of nested parentheses) gives an error rather than exhausting the stack.
// Only nesting recurses: a long chain of operators at one level is read in
// a loop.
const maxDepth = 200

// parser reads the source by recursive descent and writes the program in
// postfix order as it goes, folding an operation on constants into one
// constant as soon as it is complete; it builds no tree.
type parser struct {
	src     string
	pos     int
	params  []string
	depth   int
	err     error
	code    []instr
	scratch []float64 // the operands of an operation being folded
}

func (p *parser) fail(pos int, msg string) {
	if p.err == nil {
		p.err = &SyntaxError{Pos: pos, Msg: msg}
	}
}

func (p *parser) skipSpace() {
	for p.pos < len(p.src) {
		switch p.src[p.pos] {
		case ' ', '\t', '\n', '\r':
			p.pos++
		default:
			return
		}
	}
}

// peek returns the next non-space byte, or 0 at the end.
func (p *parser) peek() byte {
	p.skipSpace()
	if p.pos < len(p.src) {
		return p.src[p.pos]
	}
	return 0
}

func (p *parser) enter() bool {
	p.depth++
	if p.depth > maxDepth {
		p.fail(p.pos, "expression is nested too deeply")
		return false
	}
	return true
}

func (p *parser) leave() { p.depth-- }

// parseSum: term (('+' | '-') term)*
func (p *parser) parseSum() {
	if !p.enter() {
		return
	}
	defer p.leave()
	p.parseProduct()
	for p.err == nil {
		c := p.peek()
		if c != '+' && c != '-' {
			break
		}
		p.pos++
		p.parseProduct()
		op := opAdd
		if c == '-' {
			op = opSub
		}
		p.operation(op, 2)
	}
}

// parseProduct: unary (('*' | '/') unary)*
func (p *parser) parseProduct() {
	p.parseUnary()
	for p.err == nil {
		c := p.peek()
		if c != '*' && c != '/' {
			break
		}
		p.pos++
		p.parseUnary()
		op := opMul
		if c == '/' {
			op = opDiv
		}
		p.operation(op, 2)
	}
}

// parseUnary: ('-' | '+') unary | power
func (p *parser) parseUnary() {
	if !p.enter() {
		return
	}
	defer p.leave()
	switch p.peek() {
	case '-':
		p.pos++
		p.parseUnary()
		p.operation(opNeg, 1)
		return
	case '+':
		p.pos++
		p.parseUnary()
		return
	}
	p.parsePower()
}

// parsePower: primary ('^' unary)?, which makes ^ right-associative and
// lets the exponent carry its own sign (2^-1).
func (p *parser) parsePower() {
	p.parsePrimary()
	if p.err == nil && p.peek() == '^' {
		p.pos++
		p.parseUnary()
		p.operation(opPow, 2)
	}
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }
func isIdentStart(c byte) bool {
	return c == '_' || ('a' <= c && c <= 'z') || ('A' <= c && c <= 'Z')
}
func isIdent(c byte) bool { return isIdentStart(c) || isDigit(c) }

func (p *parser) parsePrimary() {
	if p.err != nil {
		return
	}
	c := p.peek()
	start := p.pos
	switch {
	case c == 0:
		if len(p.src) == 0 || onlySpace(p.src) {
			p.fail(start, "empty expression")
		} else {
			p.fail(start, "expression ends too early: expected a number, a name or \"(\"")
		}
		return
	case isDigit(c) || c == '.':
		p.parseNumber()
		return
	case isIdentStart(c):
		for p.pos < len(p.src) && isIdent(p.src[p.pos]) {
			p.pos++
		}
		name := p.src[start:p.pos]
		if p.peek() == '(' {
			p.parseCall(name, start)
			return
		}
		for i, param := range p.params {
			if param == name {
				p.code = append(p.code, instr{op: opParam, n: int32(i)})
				return
			}
		}
		if name == "pi" {
			p.code = append(p.code, instr{op: opConst, k: 3.141592653589793})
			return
		}
		if p.err == nil {
			p.err = newNameError(start, name, false, p.params)
		}
		return
	case c == '(':
		p.pos++
		p.parseSum()
		if p.err != nil {
			return
		}
		if p.peek() != ')' {
			p.fail(p.pos, "missing \")\" to close the \"(\" at byte "+strconv.Itoa(start))
			return
		}
		p.pos++
		return
	case c == ')':
		p.fail(start, "unexpected \")\": expected a number, a name or \"(\"")
	default:
		p.fail(start, "unexpected "+describeByte(c)+": expected a number, a name or \"(\"")
	}
}

func onlySpace(s string) bool {
	for i := 0; i < len(s); i++ {
		switch s[i] {
		case ' ', '\t', '\n', '\r':
		default:
			return false
		}
	}
	return true
}

func describeByte(c byte) string {
	if c >= 0x20 && c < 0x7f {
		return strconv.Quote(string(rune(c)))
	}
	return "byte 0x" + strconv.FormatUint(uint64(c), 16)
}

func (p *parser) parseNumber() {
	start := p.pos
	digits := 0
	for p.pos < len(p.src) && isDigit(p.src[p.pos]) {
		p.pos++
		digits++
	}
	if p.pos < len(p.src) && p.src[p.pos] == '.' {
		p.pos++
		for p.pos < len(p.src) && isDigit(p.src[p.pos]) {
			p.pos++
			digits++
		}
	}
	if digits == 0 {
		p.fail(start, "a number needs at least one digit")
		return
	}
	if p.pos < len(p.src) && (p.src[p.pos] == 'e' || p.src[p.pos] == 'E') {
		mark := p.pos
		p.pos++
		if p.pos < len(p.src) && (p.src[p.pos] == '+' || p.src[p.pos] == '-') {
			p.pos++
		}
		expDigits := 0
		for p.pos < len(p.src) && isDigit(p.src[p.pos]) {
			p.pos++
			expDigits++
		}
		if expDigits == 0 {
			p.fail(mark, "the exponent of a number needs digits, as in 1e-3")
			return
		}
	}
	text := p.src[start:p.pos]
	v, err := strconv.ParseFloat(text, 64)
	if err != nil {
		p.fail(start, "number "+text+" is out of range")
		return
	}
	p.code = append(p.code, instr{op: opConst, k: v})
}

type function struct {
	name    string
	op      opcode
	minArgs int
	maxArgs int // -1: any number
}

var functions = []function{
	{"abs", opAbs, 1, 1},
	{"atan2", opAtan2, 2, 2},
	{"cos", opCos, 1, 1},
	{"max", opMax, 1, -1},
	{"min", opMin, 1, -1},
	{"sin", opSin, 1, 1},
	{"sqrt", opSqrt, 1, 1},
	{"tan", opTan, 1, 1},
}

func functionNames() []string {
	names := make([]string, len(functions))
	for i, f := range functions {
		names[i] = f.name
	}
	return names
}

func (p *parser) parseCall(name string, start int) {
	var fn *function
	for i := range functions {
		if functions[i].name == name {
			fn = &functions[i]
		}
	}
	if fn == nil {
		p.err = newNameError(start, name, true, functionNames())
		return
	}
	p.pos++ // '('
	args := 0
	if p.peek() == ')' {
		p.pos++
	} else {
		for p.err == nil {
			p.parseSum()
			args++
			if p.err != nil {
				return
			}
			c := p.peek()
			if c == ',' {
				p.pos++
				continue
			}
			if c == ')' {
				p.pos++
				break
			}
			if c == 0 {
				p.fail(p.pos, "missing \")\" to close the call of "+name)
			} else {
				p.fail(p.pos, "unexpected "+describeByte(c)+" in the arguments of "+name+": expected \",\" or \")\"")
			}
			return
		}
	}
	if args < fn.minArgs || (fn.maxArgs >= 0 && args > fn.maxArgs) {
		want := strconv.Itoa(fn.minArgs) + " argument"
		if fn.maxArgs < 0 {
			want = "at least " + want
		} else if fn.minArgs != 1 {
			want += "s"
		}
		p.fail(start, name+" takes "+want+", got "+strconv.Itoa(args))
		return
	}
	p.operation(fn.op, args)
}

// operation appends op on the last arity operands, or, when they are all
// constants and op evaluates on them without error, replaces them with its
// value (constant folding: an operand whose last instruction is a constant
// is that one instruction, so the last arity instructions being constants
// means the last arity operands are). A failing operation stays as code so
// that Eval reports it.
func (p *parser) operation(op opcode, arity int) {
	if p.err != nil {
		return
	}
	n := len(p.code)
	constant := n >= arity
	for i := n - arity; constant && i < n; i++ {
		constant = p.code[i].op == opConst
	}
	if constant {
		p.scratch = p.scratch[:0]
		for _, in := range p.code[n-arity:] {
			p.scratch = append(p.scratch, in.k)
		}
		if v, err := apply(op, p.scratch); err == nil {
			p.code = append(p.code[:n-arity], instr{op: opConst, k: v})
			return
		}
	}
	in := instr{op: op}
	if op == opMin || op == opMax {
		in.n = int32(arity)
	}
	p.code = append(p.code, in)
}

// checkCharacters reports the first control character of the source (C0
// controls other than tab, line feed and carriage return, and DEL), which
// would otherwise be read as the end of the input or a stray byte.
func (p *parser) checkCharacters() {
	for i := 0; i < len(p.src); i++ {
		c := p.src[i]
		if (c < 0x20 && c != '\t' && c != '\n' && c != '\r') || c == 0x7f {
			p.fail(i, "control character U+"+fmt.Sprintf("%04X", c)+" is not allowed in an expression")
			return
		}
	}
}
