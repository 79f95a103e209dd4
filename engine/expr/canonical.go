package expr

import (
	"math"
	"strconv"
	"strings"
)

// String returns the folded expression in a canonical form that Compile
// accepts with the same parameter list and that evaluates to the same value
// (bit for bit) or fails the same way. It writes only the parentheses the
// grouping needs, so it nests no deeper than the expression itself: a long
// sum stays flat. It works with explicit stacks, not recursion, so the
// length of the expression does not matter.
func (prog *Program) String() string {
	nodes, root := prog.tree()
	var b strings.Builder
	// Each task writes a node (with parentheses when its precedence is
	// below min) or a piece of text; tasks run last in, first out.
	type task struct {
		node int32
		min  int
		text string
	}
	tasks := []task{{node: root}}
	for len(tasks) > 0 {
		t := tasks[len(tasks)-1]
		tasks = tasks[:len(tasks)-1]
		if t.node < 0 {
			b.WriteString(t.text)
			continue
		}
		i := simplified(nodes, t.node)
		n := &nodes[i]
		if precedence(n.op) < t.min {
			b.WriteString("(")
			tasks = append(tasks, task{node: -1, text: ")"})
		}
		// The pieces of n, in writing order; pushed in reverse below.
		var pieces []task
		switch n.op {
		case opConst:
			pieces = []task{{node: -1, text: constantText(n.k)}}
		case opParam:
			pieces = []task{{node: -1, text: prog.names[n.n]}}
		case opNeg:
			pieces = []task{{node: -1, text: "(-"}, {node: n.args[0], min: 4}, {node: -1, text: ")"}}
		case opAdd, opSub, opMul, opDiv:
			// Left-associative: the left operand may be of the same
			// level, the right one must bind tighter.
			p := precedence(n.op)
			pieces = []task{{node: n.args[0], min: p}, {node: -1, text: opSymbols[n.op]}, {node: n.args[1], min: p + 1}}
		case opPow:
			// Right-associative: a^b^c is a^(b^c).
			pieces = []task{{node: n.args[0], min: 4}, {node: -1, text: "^"}, {node: n.args[1], min: 3}}
		default:
			pieces = append(pieces, task{node: -1, text: opNames[n.op] + "("})
			for k, a := range n.args {
				if k > 0 {
					pieces = append(pieces, task{node: -1, text: ","})
				}
				pieces = append(pieces, task{node: a})
			}
			pieces = append(pieces, task{node: -1, text: ")"})
		}
		for k := len(pieces) - 1; k >= 0; k-- {
			tasks = append(tasks, pieces[k])
		}
	}
	return b.String()
}

// treeNode is one instruction with the indices of its operands' roots.
type treeNode struct {
	op   opcode
	k    float64
	n    int32
	args []int32
}

// tree rebuilds the expression tree of the code (one node per
// instruction, operands by index) and returns it with its root.
func (prog *Program) tree() ([]treeNode, int32) {
	nodes := make([]treeNode, len(prog.code))
	var stack []int32
	for i, in := range prog.code {
		k := arity(in)
		nodes[i] = treeNode{op: in.op, k: in.k, n: in.n, args: append([]int32(nil), stack[len(stack)-k:]...)}
		stack = append(stack[:len(stack)-k], int32(i))
	}
	return nodes, stack[0]
}

func constantText(v float64) string {
	s := strconv.FormatFloat(v, 'g', -1, 64)
	if v < 0 || (v == 0 && math.Signbit(v)) {
		return "(-" + s[1:] + ")"
	}
	return s
}

var opSymbols = map[opcode]string{opAdd: "+", opSub: "-", opMul: "*", opDiv: "/", opPow: "^"}
var opNames = map[opcode]string{opSqrt: "sqrt", opSin: "sin", opCos: "cos", opTan: "tan",
	opAbs: "abs", opAtan2: "atan2", opMin: "min", opMax: "max"}

// precedence orders the binary operators; every other node prints as an
// atom (a number, a name, a call, or a parenthesised negation).
func precedence(op opcode) int {
	switch op {
	case opAdd, opSub:
		return 1
	case opMul, opDiv:
		return 2
	case opPow:
		return 3
	}
	return 4
}

// simplified drops pairs of negations: −(−x) is x exactly, so a chain of
// negations prints as at most one.
func simplified(nodes []treeNode, i int32) int32 {
	for nodes[i].op == opNeg && nodes[nodes[i].args[0]].op == opNeg {
		i = nodes[nodes[i].args[0]].args[0]
	}
	return i
}
