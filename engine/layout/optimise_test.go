package layout

import (
	"context"
	"errors"
	"math"
	"strings"
	"sync"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
)

// wallProblem is a load at distance a = 1 from a line support x = 0 on a
// grid of spacing 1/2 that contains the bars at ±45°.
func wallProblem(cases ...Case) Problem {
	p := Problem{
		Domain: Rectangle(0, -1, 1, 1), Divisions: [3]int{2, 4},
		Cases: cases, TensionLimit: 1, CompressionLimit: 1,
	}
	for j := 0; j <= 4; j++ {
		p.Supports = append(p.Supports, pin(0, -1+float64(j)/2))
	}
	return p
}

// TestAlternativeCases checks the multiple-load-case program against a
// hand result: a vertical force P and, as an alternative, a horizontal
// force P at the tip, a = 1 from a wall. By Hemp's two-case superposition
// (Optimum Structures, 1973; from memory) V = V((f¹+f²)/2) + V((f¹−f²)/2),
// two single cases (P/2)(1, −1) and (P/2)(−1, −1), each carried by one bar
// at 45° of volume (P/√2)(a√2)/σ = Pa/σ, which is optimal because the
// virtual displacement u = (0, −2x/σ) vanishes on the wall, has principal
// strains ±1/σ and does work Pa/σ on either force (Michell 1904). So
// V = 2Pa/σ: the two bars at ±45° each of area P/(√2σ). Together, the sum
// (P, −P) is one force P√2 along 45°, one bar of volume 2Pa/σ.
func TestAlternativeCases(t *testing.T) {
	vertical := Case{ID: "down", Loads: []Load{{Node: -1, At: [3]float64{1, 0}, Force: [3]float64{0, -1}}}}
	horizontal := Case{ID: "out", Loads: []Load{{Node: -1, At: [3]float64{1, 0}, Force: [3]float64{1, 0}}}}
	for _, tc := range []struct {
		name    string
		mode    Mode
		volume  float64
		cases   int
		members int
	}{
		{"alternatives", Alternatives, 2, 2, 2},
		{"single-case equivalent", SingleEquivalent, 2, 2, 2},
		{"together", Together, 2, 1, 1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := wallProblem(vertical, horizontal)
			p.Mode = tc.mode
			l, err := Optimise(context.Background(), p, Options{}, nil)
			if err != nil {
				t.Fatal(err)
			}
			checkResult(t, l)
			if !scalar.EqualWithinAbsOrRel(l.Volume, tc.volume, 1e-7, 1e-7) {
				t.Errorf("volume %.10g, want %g", l.Volume, tc.volume)
			}
			if len(l.Cases) != tc.cases || len(l.Members) != tc.members {
				t.Errorf("%d cases and %d members, want %d and %d", len(l.Cases), len(l.Members), tc.cases, tc.members)
			}
			for _, m := range l.Members {
				for k, q := range m.Forces {
					if math.Abs(q) > m.Area*(1+1e-9) {
						t.Errorf("case %d: force %g exceeds capacity of area %g", k, q, m.Area)
					}
				}
			}
		})
	}
}

// TestSingleEquivalentMatchesProgram compares the two ways of solving two
// alternative cases on an asymmetric problem: by the identity
// max(|q⁺+q⁻|, |q⁺−q⁻|) = |q⁺| + |q⁻| the multiple-load-case program with
// σ_t = σ_c splits into the single cases (f¹ ± f²)/2 (Hemp 1973; from
// memory), so the optimal volumes agree.
func TestSingleEquivalentMatchesProgram(t *testing.T) {
	p := threePoint(8)
	p.Cases = []Case{
		{ID: "left", Loads: []Load{{Node: -1, At: [3]float64{0.75, 0}, Force: [3]float64{0, -1}}}},
		{ID: "right", Loads: []Load{{Node: -1, At: [3]float64{1.5, 0.5}, Force: [3]float64{0.4, -2}}}},
	}
	volumes := make(map[Mode]float64)
	for _, mode := range []Mode{Alternatives, SingleEquivalent} {
		p.Mode = mode
		l, err := Optimise(context.Background(), p, Options{}, nil)
		if err != nil {
			t.Fatal(err)
		}
		checkResult(t, l)
		volumes[mode] = l.Volume
	}
	if !scalar.EqualWithinAbsOrRel(volumes[Alternatives], volumes[SingleEquivalent], 1e-6, 1e-6) {
		t.Errorf("multiple-load-case volume %.10g, single-case equivalent %.10g", volumes[Alternatives], volumes[SingleEquivalent])
	}
	// Each case alone needs no more than both (common practice).
	for _, c := range p.Cases {
		q := p
		q.Cases = []Case{c}
		l, err := Optimise(context.Background(), q, Options{}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if l.Volume > volumes[Alternatives]*(1+1e-7) {
			t.Errorf("case %s alone needs %g, more than both together %g", c.ID, l.Volume, volumes[Alternatives])
		}
	}
}

func TestBadInput(t *testing.T) {
	base := func() Problem { return threePoint(4) }
	uShape := Domain{Outline: [][2]float64{{0, 0}, {3, 0}, {3, 3}, {2, 3}, {2, 1}, {1, 1}, {1, 3}, {0, 3}}}
	for _, tc := range []struct {
		name   string
		change func(p *Problem)
		opt    Options
		kind   fault.Kind
		text   string
	}{
		{"no interior", func(p *Problem) { p.Domain = Rectangle(0, 0, 2, 0) }, Options{}, fault.InvalidModel, "no interior"},
		{"hole fills domain", func(p *Problem) {
			p.Domain.Holes = [][][2]float64{{{0, 0}, {2, 0}, {2, 1}, {0, 1}}}
		}, Options{}, fault.InvalidModel, "no interior"},
		{"too many candidates", func(p *Problem) { p.Divisions = [3]int{20, 10} }, Options{MaxCandidates: 1000}, fault.InvalidModel, "than the limit of 1000"},
		{"load off the grid", func(p *Problem) { p.Cases[0].Loads[0].At = [3]float64{0.8, 0.1} }, Options{}, fault.InvalidModel, "no node within"},
		{"no limits", func(p *Problem) { p.TensionLimit = 0 }, Options{}, fault.MissingData, "limits"},
		{"no supports", func(p *Problem) { p.Supports = nil }, Options{}, fault.InvalidModel, "support"},
		// One pin cannot resist the moment of a load beside it.
		{"moment unresisted", func(p *Problem) { p.Supports = p.Supports[:1] }, Options{}, fault.Infeasible, "cannot be carried"},
		{"moment unresisted, simplex", func(p *Problem) { p.Supports = p.Supports[:1] }, Options{Method: DenseSimplex}, fault.Infeasible, ""},
		{"load cut off", func(p *Problem) {
			p.Domain = uShape
			p.Divisions = [3]int{}
			p.Nodes = [][3]float64{{0.5, 2}, {0.5, 2.5}, {2.5, 2}, {2.5, 2.5}}
			p.Supports = []Support{{Node: 0, Fix: [3]bool{true, true}}, {Node: 1, Fix: [3]bool{true, true}}}
			p.Cases[0].Loads[0] = Load{Node: 3, Force: [3]float64{0, -1}}
		}, Options{}, fault.Infeasible, "cannot reach any support"},
		{"equivalent needs two cases", func(p *Problem) { p.Mode = SingleEquivalent; p.Cases = append(p.Cases, p.Cases[0], p.Cases[0]) }, Options{}, fault.InvalidModel, "exactly 2 cases"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := base()
			tc.change(&p)
			_, err := Optimise(context.Background(), p, tc.opt, nil)
			fe, ok := fault.As(err)
			if !ok || fe.Kind != tc.kind {
				t.Fatalf("error %v, want kind %v", err, tc.kind)
			}
			if !strings.Contains(fe.Error(), tc.text) {
				t.Errorf("message %q lacks %q", fe.Error(), tc.text)
			}
		})
	}
}

type recorder struct {
	mu     sync.Mutex
	stages map[string]int
	rounds []Round
	cancel context.CancelFunc
}

func (r *recorder) Progress(stage string, done, total int, partial any) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.stages[stage]++
}

// Record keeps each member-adding round (Options.Rounds).
func (r *recorder) Record(stage string, done, total int, round Round) {
	r.mu.Lock()
	defer r.mu.Unlock()
	r.stages[stage]++
	r.rounds = append(r.rounds, round)
	if r.cancel != nil {
		r.cancel()
	}
}

func TestProgressAndCancel(t *testing.T) {
	rec := &recorder{stages: map[string]int{}}
	l, err := Optimise(context.Background(), threePoint(16), Options{Rounds: rec}, rec)
	if err != nil {
		t.Fatal(err)
	}
	if rec.stages["member adding"] != l.Stats.Iterations || rec.stages["interior point"] == 0 {
		t.Errorf("stages %v for %d iterations", rec.stages, l.Stats.Iterations)
	}
	last := rec.rounds[len(rec.rounds)-1]
	if last.Added != 0 || last.MaxViolation > 1+1e-4 {
		t.Errorf("last round %+v still adds members", last)
	}
	ctx, cancel := context.WithCancel(context.Background())
	rec = &recorder{stages: map[string]int{}, cancel: cancel}
	_, err = Optimise(ctx, threePoint(16), Options{Rounds: rec}, rec)
	if !errors.Is(err, context.Canceled) {
		t.Errorf("error %v, want cancellation", err)
	}
}

func TestOwnNodes(t *testing.T) {
	// Michell's two bars again, from the caller's nodes: the wall points,
	// the tip, and a node on the line between two of them that must split
	// the overlapping candidate.
	p := Problem{
		Nodes:        [][3]float64{{0, -1}, {0, 1}, {1, 0}, {0.5, 0.5}, {0, 0}},
		Supports:     []Support{{Node: 0, Fix: [3]bool{true, true}}, {Node: 1, Fix: [3]bool{true, true}}, {Node: 4, Fix: [3]bool{true, true}}},
		Cases:        []Case{{ID: "P", Loads: []Load{{Node: 2, Force: [3]float64{0, -1}}}}},
		TensionLimit: 1, CompressionLimit: 1,
	}
	l, err := Optimise(context.Background(), p, Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	checkResult(t, l)
	if !scalar.EqualWithinAbsOrRel(l.Volume, 2, 1e-7, 1e-7) || len(l.Members) != 2 {
		t.Errorf("volume %g with %d members, want 2Pa/σ = 2 with 2", l.Volume, len(l.Members))
	}
	if l.Stats.Candidates != 8 {
		// 10 pairs less (0,1)–(1,0) through (0.5, 0.5) and (0,−1)–(0,1) through (0,0).
		t.Errorf("%d candidates, want 8", l.Stats.Candidates)
	}
}

// TestZeroLoad: no load needs no material (common practice).
func TestZeroLoad(t *testing.T) {
	p := threePoint(4)
	p.Cases[0].Loads[0].Force = [3]float64{}
	l, err := Optimise(context.Background(), p, Options{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if l.Volume != 0 || len(l.Members) != 0 {
		t.Errorf("volume %g with %d members, want none", l.Volume, len(l.Members))
	}
}
