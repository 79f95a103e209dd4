package stiffness

import (
	"context"
	"errors"
	"fmt"
	"math"
	"reflect"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/model/modelgen"
)

// hungPratt returns a generated Pratt truss whose top chord sits at the
// expression "depth" and whose loads are "-q", with one extra node held by
// two bars between bottom node 1 and top node 2, at "drop" to the right of
// their midpoint and loaded by "-q" along y: at drop = 0 the two bars are collinear (and not along an
// axis), so the node can move across them and the truss is a mechanism
// found by a vanishing pivot, not by an empty diagonal.
func hungPratt(panels int) *model.Model {
	const dx = 4.0
	spec := modelgen.Pratt(panels, dx*float64(panels), 3, 10)
	for i := range spec.Nodes {
		if spec.Nodes[i].At[1].Num > 0 {
			spec.Nodes[i].At[1] = model.Expr("depth")
		}
	}
	for i := range spec.LoadCases[0].Loads {
		spec.LoadCases[0].Loads[i].Force[1] = model.Expr("-q")
	}
	spec.Nodes = append(spec.Nodes, model.NodeSpec{ID: "hung",
		At: []model.Value{model.Expr(fmt.Sprintf("%g + drop", 1.5*dx)), model.Expr("depth/2")}})
	top2 := fmt.Sprintf("n%d", panels+2) // top nodes follow the panels+1 bottom nodes, from top node 1
	for k, end := range []string{"n1", top2} {
		mem := spec.Members[0]
		mem.ID, mem.Ends = fmt.Sprintf("hang%d", k), [2]string{"hung", end}
		spec.Members = append(spec.Members, mem)
	}
	// A load on the node, across the bars at drop = 0, sets the mechanism
	// moving (a load along them would be carried, with a warning).
	spec.LoadCases[0].Loads = append(spec.LoadCases[0].Loads,
		model.NodalLoadSpec{Node: "hung", Force: []model.Value{model.Num(0), model.Expr("-q")}})
	spec.Parameters = []model.ParameterSpec{{Name: "depth", Value: 3}, {Name: "q", Value: 10}, {Name: "drop", Value: 0.5}}
	return modelgen.Must(spec)
}

// scaledFrame returns a generated 2D frame (beams, rotational freedoms)
// whose storey heights scale with the expression "s".
func scaledFrame(bays, storeys int) *model.Model {
	spec := modelgen.Frame2D(bays, storeys)
	for i := range spec.Nodes {
		if y := spec.Nodes[i].At[1]; y.Num > 0 {
			spec.Nodes[i].At[1] = model.Expr(fmt.Sprintf("%v*s", y.Num))
		}
	}
	spec.Parameters = []model.ParameterSpec{{Name: "s", Value: 1}}
	return modelgen.Must(spec)
}

// untimed returns r without the times of its Stats, which vary from run to
// run, and without Stats.Order, which Analysis.Solve does not spend.
func untimed(r *Result) *Result {
	if r == nil {
		return nil
	}
	out := *r
	out.Stats.Assemble, out.Stats.Order, out.Stats.Factor = 0, 0, 0
	out.Stats.Solve, out.Stats.Recover, out.Stats.Stability = 0, 0, 0
	return &out
}

// TestAnalysisMatchesSolve checks Analysis.Solve against the package's
// Solve (the reference, whose own tests check closed forms) bit for bit on
// generated models re-evaluated with WithParameters, on both solver paths
// and with one and two workers, including a step that is a mechanism (the
// error must be the same), and checks each step's vertical equilibrium:
// the reactions balance the applied loads (common practice).
func TestAnalysisMatchesSolve(t *testing.T) {
	type step = map[string]float64
	pratt := hungPratt(12)
	cases := []struct {
		name  string
		m     *model.Model
		steps []step
		load  func(p step) float64 // total downward load, or NaN to skip the check
	}{
		{"pratt", pratt, []step{
			{"depth": 3, "q": 10, "drop": 0.5},
			{"depth": 5.5, "q": 7, "drop": -0.25},
			{"depth": 3, "q": 10, "drop": 0}, // mechanism
			{"depth": 1.25, "q": 12.5, "drop": 1},
		}, func(p step) float64 { return 12 * p["q"] }},
		{"frame", scaledFrame(4, 3), []step{{"s": 1}, {"s": 0.8}, {"s": 1.7}}, func(step) float64 { return math.NaN() }},
	}
	for _, c := range cases {
		for _, opt := range []Options{
			{},
			{Path: Sparse, Workers: 1},
			{Path: Sparse, Workers: 2, Cases: []string{c.m.Cases[0].ID}},
			{DenseLimit: 1, StabilityLimit: -1, SkipCondition: true, Workers: 1},
		} {
			an := NewAnalysis(c.m, opt)
			for k, p := range c.steps {
				t.Run(fmt.Sprintf("%s/path=%q/workers=%d/step=%d", c.name, opt.Path, opt.Workers, k), func(t *testing.T) {
					m, err := c.m.WithParameters(p)
					if err != nil {
						t.Fatal(err)
					}
					want, wantErr := Solve(context.Background(), m, opt)
					got, gotErr := an.Solve(context.Background(), m)
					if !reflect.DeepEqual(gotErr, wantErr) {
						t.Fatalf("error %v, Solve gives %v", gotErr, wantErr)
					}
					if p["drop"] == 0 && c.name == "pratt" {
						var fe *fault.Error
						if !errors.As(gotErr, &fe) || fe.Kind != fault.Unstable {
							t.Fatalf("collinear bars: error %v, want a mechanism", gotErr)
						}
						return
					}
					if gotErr != nil {
						t.Fatal(gotErr)
					}
					if !reflect.DeepEqual(untimed(got), untimed(want)) {
						t.Fatalf("results differ from Solve's")
					}
					total := c.load(p)
					if math.IsNaN(total) {
						return
					}
					var up float64
					for _, r := range got.Cases[0].Reactions {
						up += r.Force[1]
					}
					if !scalar.EqualWithinAbsOrRel(up, total, 1e-9, 1e-12) {
						t.Errorf("reactions sum to %g upwards, loads to %g downwards", up, total)
					}
				})
			}
		}
	}
}

// TestAnalysisConcurrent solves several steps at once with one Analysis
// (run with -race), each result being Solve's.
func TestAnalysisConcurrent(t *testing.T) {
	m0 := hungPratt(40)
	opt := Options{Path: Sparse, Workers: 1, StabilityLimit: -1, SkipCondition: true}
	an := NewAnalysis(m0, opt)
	depths := []float64{1, 2, 3, 4, 5, 6}
	got := make([]*Result, len(depths))
	errs := make([]error, len(depths))
	var wg sync.WaitGroup
	for i, d := range depths {
		wg.Add(1)
		go func() {
			defer wg.Done()
			m, err := m0.WithParameters(map[string]float64{"depth": d})
			if err == nil {
				got[i], err = an.Solve(context.Background(), m)
			}
			errs[i] = err
		}()
	}
	wg.Wait()
	for i, d := range depths {
		m, err := m0.WithParameters(map[string]float64{"depth": d})
		if err != nil {
			t.Fatal(err)
		}
		want, err := Solve(context.Background(), m, opt)
		if err != nil || errs[i] != nil {
			t.Fatalf("depth %g: %v, %v", d, err, errs[i])
		}
		if !reflect.DeepEqual(untimed(got[i]), untimed(want)) {
			t.Errorf("depth %g: results differ from Solve's", d)
		}
	}
}

// TestAnalysisOtherTopology checks that a model with other supports is
// refused.
func TestAnalysisOtherTopology(t *testing.T) {
	m := hungPratt(4)
	an := NewAnalysis(m, Options{})
	other := *m
	other.Supports = append([]model.Support(nil), m.Supports...)
	other.Supports[1].Fixed[model.X] = true
	defer func() {
		if recover() == nil {
			t.Error("no panic for a support fixing another component")
		}
	}()
	_, _ = an.Solve(context.Background(), &other)
}
