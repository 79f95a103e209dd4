package stiffness

import (
	"fmt"
	"strings"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// parts groups the nodes into connected parts by union-find over the
// members and returns, per node, the index of its part (parts numbered in
// order of their first node) and the number of parts.
func parts(m *model.Model) (part []int, count int) {
	parent := make([]int, m.NodeCount())
	for i := range parent {
		parent[i] = i
	}
	var find func(int) int
	find = func(i int) int {
		for parent[i] != i {
			parent[i] = parent[parent[i]]
			i = parent[i]
		}
		return i
	}
	for _, mem := range m.Members {
		a, b := find(mem.Ends[0]), find(mem.Ends[1])
		if a != b {
			parent[max(a, b)] = min(a, b)
		}
	}
	part = make([]int, m.NodeCount())
	label := make(map[int]int)
	for n := range part {
		r := find(n)
		l, ok := label[r]
		if !ok {
			l = count
			label[r] = l
			count++
		}
		part[n] = l
	}
	return part, count
}

// checkParts returns an Unstable error for parts no support reaches (each
// is free to move as a rigid body) and a warning when the model falls into
// several supported parts.
func checkParts(m *model.Model, nb *numbering) (warning string, err error) {
	part, count := parts(m)
	if count <= 1 && len(m.Supports) > 0 {
		return "", nil
	}
	anchored := make([]bool, count)
	for f := range nb.total {
		if nb.supportOf[f] >= 0 {
			anchored[part[nb.node[f]]] = true
		}
	}
	var loose []int
	for n := range part {
		if !anchored[part[n]] {
			loose = append(loose, n)
		}
	}
	if len(loose) == 0 {
		return fmt.Sprintf("the model falls into %d disconnected parts, each with its own supports", count), nil
	}
	looseParts := make(map[int]bool)
	var problems []fault.Problem
	var names []string
	for _, n := range loose {
		looseParts[part[n]] = true
		if len(problems) < maxNamed {
			problems = append(problems, fault.Problem{Path: fmt.Sprintf("/nodes/%d", n),
				Message: fmt.Sprintf("node %q belongs to a part that no support holds", m.NodeIDs[n])})
			names = append(names, fmt.Sprintf("%q", m.NodeIDs[n]))
		}
	}
	msg := fmt.Sprintf("the structure is unstable: %d of its %d connected parts (nodes %s", len(looseParts), count, strings.Join(names, ", "))
	if len(loose) > len(names) {
		msg += fmt.Sprintf(" and %d more", len(loose)-len(names))
	}
	msg += ") are held by no support and can move as rigid bodies; connect them or add supports"
	// The mechanism of a loose part is its rigid-body translation, one
	// direction at a time.
	detail := &Mechanism{}
	for c := range m.Dim {
		mode := newMode(m, nb)
		for _, n := range loose {
			mode.Translations[n][c] = 1
			detail.Freedoms = append(detail.Freedoms, freedomRef(m, n, c))
		}
		detail.Modes = append(detail.Modes, mode)
	}
	return "", &fault.Error{Kind: fault.Unstable, Message: msg, Problems: problems, Detail: detail}
}
