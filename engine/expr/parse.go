package expr

import (
	"strconv"
)

// node is an abstract syntax tree node.
type node struct {
	op    opcode
	value float64 // opConst
	param int     // opParam
	args  []*node
	pos   int
}

// maxDepth bounds the parser's recursion so that hostile input (thousands
// of nested parentheses) gives an error rather than exhausting the stack.
const maxDepth = 200

type parser struct {
	src    string
	pos    int
	params []string
	depth  int
	err    error
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
func (p *parser) parseSum() *node {
	if !p.enter() {
		return nil
	}
	defer p.leave()
	left := p.parseProduct()
	for p.err == nil {
		c := p.peek()
		if c != '+' && c != '-' {
			break
		}
		pos := p.pos
		p.pos++
		right := p.parseProduct()
		op := opAdd
		if c == '-' {
			op = opSub
		}
		left = &node{op: op, args: []*node{left, right}, pos: pos}
	}
	return left
}

// parseProduct: unary (('*' | '/') unary)*
func (p *parser) parseProduct() *node {
	left := p.parseUnary()
	for p.err == nil {
		c := p.peek()
		if c != '*' && c != '/' {
			break
		}
		pos := p.pos
		p.pos++
		right := p.parseUnary()
		op := opMul
		if c == '/' {
			op = opDiv
		}
		left = &node{op: op, args: []*node{left, right}, pos: pos}
	}
	return left
}

// parseUnary: ('-' | '+') unary | power
func (p *parser) parseUnary() *node {
	if !p.enter() {
		return nil
	}
	defer p.leave()
	switch p.peek() {
	case '-':
		pos := p.pos
		p.pos++
		return &node{op: opNeg, args: []*node{p.parseUnary()}, pos: pos}
	case '+':
		p.pos++
		return p.parseUnary()
	}
	return p.parsePower()
}

// parsePower: primary ('^' unary)?, which makes ^ right-associative and
// lets the exponent carry its own sign (2^-1).
func (p *parser) parsePower() *node {
	base := p.parsePrimary()
	if p.err == nil && p.peek() == '^' {
		pos := p.pos
		p.pos++
		exp := p.parseUnary()
		return &node{op: opPow, args: []*node{base, exp}, pos: pos}
	}
	return base
}

func isDigit(c byte) bool { return '0' <= c && c <= '9' }
func isIdentStart(c byte) bool {
	return c == '_' || ('a' <= c && c <= 'z') || ('A' <= c && c <= 'Z')
}
func isIdent(c byte) bool { return isIdentStart(c) || isDigit(c) }

func (p *parser) parsePrimary() *node {
	if p.err != nil {
		return nil
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
		return nil
	case isDigit(c) || c == '.':
		return p.parseNumber()
	case isIdentStart(c):
		for p.pos < len(p.src) && isIdent(p.src[p.pos]) {
			p.pos++
		}
		name := p.src[start:p.pos]
		if p.peek() == '(' {
			return p.parseCall(name, start)
		}
		for i, param := range p.params {
			if param == name {
				return &node{op: opParam, param: i, pos: start}
			}
		}
		if name == "pi" {
			return &node{op: opConst, value: 3.141592653589793, pos: start}
		}
		if p.err == nil {
			p.err = newNameError(start, name, false, p.params)
		}
		return nil
	case c == '(':
		p.pos++
		inner := p.parseSum()
		if p.err != nil {
			return nil
		}
		if p.peek() != ')' {
			p.fail(p.pos, "missing \")\" to close the \"(\" at byte "+strconv.Itoa(start))
			return nil
		}
		p.pos++
		return inner
	case c == ')':
		p.fail(start, "unexpected \")\": expected a number, a name or \"(\"")
	default:
		p.fail(start, "unexpected "+describeByte(c)+": expected a number, a name or \"(\"")
	}
	return nil
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

func (p *parser) parseNumber() *node {
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
		return nil
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
			return nil
		}
	}
	text := p.src[start:p.pos]
	v, err := strconv.ParseFloat(text, 64)
	if err != nil {
		p.fail(start, "number "+text+" is out of range")
		return nil
	}
	return &node{op: opConst, value: v, pos: start}
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

func (p *parser) parseCall(name string, start int) *node {
	var fn *function
	for i := range functions {
		if functions[i].name == name {
			fn = &functions[i]
		}
	}
	if fn == nil {
		p.err = newNameError(start, name, true, functionNames())
		return nil
	}
	p.pos++ // '('
	var args []*node
	if p.peek() == ')' {
		p.pos++
	} else {
		for p.err == nil {
			args = append(args, p.parseSum())
			if p.err != nil {
				return nil
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
			return nil
		}
	}
	if len(args) < fn.minArgs || (fn.maxArgs >= 0 && len(args) > fn.maxArgs) {
		want := strconv.Itoa(fn.minArgs) + " argument"
		if fn.maxArgs < 0 {
			want = "at least " + want
		} else if fn.minArgs != 1 {
			want += "s"
		}
		p.fail(start, name+" takes "+want+", got "+strconv.Itoa(len(args)))
		return nil
	}
	return &node{op: fn.op, args: args, pos: start}
}
