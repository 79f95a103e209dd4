package main

import (
	"encoding/json"
	"fmt"
	"strings"

	"gusset/protocol"
)

// table is one result table of an answer, for the CSV files and the
// report: a header of column names (with units) and rows of cells, each a
// string or a float64. A nil float64 pointer prints as an empty cell (a
// quantity that was not computed, never a zero).
type table struct {
	// Name is short and safe in a file name: "members", "nodes-dead".
	Name    string
	Title   string
	Columns []string
	Rows    [][]any
}

// modelIDs holds what the tables need from a request's model.
type modelIDs struct {
	Nodes   []string
	Members []string
	Ends    [][]string
	Force   string
	Length  string
	Dim     int
}

func readModelIDs(params json.RawMessage) modelIDs {
	var p struct {
		Model struct {
			Dimension int `json:"dimension"`
			Units     struct {
				Length string `json:"length"`
				Force  string `json:"force"`
			} `json:"units"`
			Nodes []struct {
				ID string `json:"id"`
			} `json:"nodes"`
			Members []struct {
				ID   string   `json:"id"`
				Ends []string `json:"ends"`
			} `json:"members"`
		} `json:"model"`
	}
	_ = json.Unmarshal(params, &p)
	ids := modelIDs{Force: p.Model.Units.Force, Length: p.Model.Units.Length, Dim: p.Model.Dimension}
	if ids.Force == "" {
		ids.Force = "kN"
	}
	if ids.Length == "" {
		ids.Length = "m"
	}
	for _, n := range p.Model.Nodes {
		ids.Nodes = append(ids.Nodes, n.ID)
	}
	for _, m := range p.Model.Members {
		ids.Members = append(ids.Members, m.ID)
		ids.Ends = append(ids.Ends, m.Ends)
	}
	return ids
}

func (ids modelIDs) member(i int) string {
	if i < len(ids.Members) {
		return ids.Members[i]
	}
	return fmt.Sprint(i)
}

func (ids modelIDs) ends(i int) string {
	if i < len(ids.Ends) {
		return strings.Join(ids.Ends[i], "–")
	}
	return ""
}

func (ids modelIDs) node(i int) string {
	if i < len(ids.Nodes) {
		return ids.Nodes[i]
	}
	return fmt.Sprint(i)
}

// resultTables returns the member and node tables of one answer; none for
// an error or a result without such tables.
func resultTables(a answered) []table {
	if a.Response == nil || a.Response.Error != nil {
		return nil
	}
	ids := readModelIDs(a.Params)
	switch r := a.Response.Result.(type) {
	case *protocol.SolveResult:
		var out []table
		for _, c := range r.Cases {
			out = append(out, solveTables(ids, c)...)
		}
		return out
	case *protocol.LoadPathResult:
		return loadPathTables(ids, r)
	case *protocol.SweepResult:
		return []table{sweepTable(r)}
	case *protocol.LayoutResult:
		return []table{layoutTable(r)}
	case *protocol.ReciprocateResult:
		return []table{reciprocalTable(ids, r)}
	}
	return nil
}

var axes = []string{"x", "y", "z"}

func solveTables(ids modelIDs, c protocol.CaseResult) []table {
	f, l := ids.Force, ids.Length
	stress := f + "/" + l + "²"
	members := table{Name: "members-" + c.ID, Title: "Members, " + c.ID + " (" + c.Kind + ")",
		Columns: []string{"member", "ends", "axial force (" + f + ", tension +)", "stress (" + stress + ")", "utilisation"}}
	for i, n := range c.AxialForces {
		row := []any{ids.member(i), ids.ends(i), n, at(c.Stresses, i), utilisationAt(c.Utilisation, i)}
		members.Rows = append(members.Rows, row)
	}
	nodes := table{Name: "nodes-" + c.ID, Title: "Node displacements, " + c.ID, Columns: []string{"node"}}
	dim := 2
	if len(c.Displacements) > 0 {
		dim = len(c.Displacements[0])
	}
	for k := range dim {
		nodes.Columns = append(nodes.Columns, "u"+axes[k]+" ("+l+")")
	}
	for i, d := range c.Displacements {
		row := []any{ids.node(i)}
		for _, v := range d {
			row = append(row, v)
		}
		nodes.Rows = append(nodes.Rows, row)
	}
	reactions := table{Name: "reactions-" + c.ID, Title: "Reactions, " + c.ID, Columns: []string{"node"}}
	for k := range dim {
		reactions.Columns = append(reactions.Columns, "R"+axes[k]+" ("+f+")")
	}
	for _, r := range c.Reactions {
		row := []any{r.Node}
		for _, v := range r.Force {
			row = append(row, v)
		}
		reactions.Rows = append(reactions.Rows, row)
	}
	return []table{members, nodes, reactions}
}

// at returns x[i], or an empty cell when x is shorter.
func at(x []float64, i int) any {
	if i < len(x) {
		return x[i]
	}
	return (*float64)(nil)
}

func loadPathTables(ids modelIDs, r *protocol.LoadPathResult) []table {
	f, l := ids.Force, ids.Length
	m := r.Members
	members := table{Name: "members", Title: "Member quantities",
		Columns: []string{"member", "ends", "length (" + l + ")", "governing force (" + f + ")", "governing case", "area (" + l + "²)", "volume (" + l + "³)", "mass (kg)", "criterion"}}
	for i := range m.Length {
		members.Rows = append(members.Rows, []any{ids.member(i), ids.ends(i), m.Length[i], at(m.Force, i),
			str(m.GoverningCase, i), at(m.Area, i), at(m.Volume, i), at(m.Mass, i), str(m.Criterion, i)})
	}
	cases := table{Name: "cases", Title: "Load path by case",
		Columns: []string{"case", "load path (" + f + "·" + l + ")", "tension part", "compression part", "constant M (" + f + "·" + l + ")", "relative residual", "stress volume (" + l + "³)"}}
	for _, c := range r.Cases {
		cases.Rows = append(cases.Rows, []any{c.ID, c.LoadPath, c.TensionLoadPath, c.CompressionLoadPath, c.Constant, c.RelativeResidual, c.StressVolume})
	}
	return []table{members, cases}
}

// utilisationAt returns a member's utilisation, or an empty cell for a
// member whose utilisation was not checked (never 0).
func utilisationAt(u []*float64, i int) any {
	if i < len(u) && u[i] != nil {
		return *u[i]
	}
	return (*float64)(nil)
}

func str(x []string, i int) string {
	if i < len(x) {
		return x[i]
	}
	return ""
}

func sweepTable(r *protocol.SweepResult) table {
	t := table{Name: "steps", Title: "Sweep steps", Columns: []string{"step"}}
	t.Columns = append(t.Columns, r.Parameters...)
	names := map[string]bool{}
	for _, s := range r.Steps {
		for k := range s.Metrics {
			names[k] = true
		}
	}
	metrics := sortedKeys(names)
	t.Columns = append(t.Columns, metrics...)
	t.Columns = append(t.Columns, "error")
	for _, s := range r.Steps {
		row := []any{fmt.Sprint(s.Index)}
		for _, v := range s.Values {
			row = append(row, v)
		}
		for _, k := range metrics {
			if v, ok := s.Metrics[k]; ok {
				row = append(row, v)
			} else {
				row = append(row, (*float64)(nil))
			}
		}
		t.Rows = append(t.Rows, append(row, s.Error))
	}
	return t
}

func layoutTable(r *protocol.LayoutResult) table {
	t := table{Name: "members", Title: "Layout members", Columns: []string{"member", "ends", "length", "area"}}
	for _, c := range r.Cases {
		t.Columns = append(t.Columns, "force, "+c.ID)
	}
	for _, m := range r.Members {
		row := []any{m.ID, m.Ends[0] + "–" + m.Ends[1], m.Length, m.Area}
		for _, f := range m.Forces {
			row = append(row, f)
		}
		t.Rows = append(t.Rows, row)
	}
	return t
}

func reciprocalTable(ids modelIDs, r *protocol.ReciprocateResult) table {
	t := table{Name: "segments", Title: "Force-diagram segments, " + r.Case,
		Columns: []string{"label", "member or node", "spaces", "force (" + ids.Force + ", tension +)", "sense", "misfit (" + ids.Force + ")"}}
	for _, list := range [][]protocol.DiagramSegment{r.Members, r.ExternalForces} {
		for _, s := range list {
			who := s.Member
			if who == "" {
				who = s.Node
			}
			t.Rows = append(t.Rows, []any{s.Label, who, strings.Join(s.Spaces, "–"), s.Force, s.Sense, s.Misfit})
		}
	}
	return t
}
