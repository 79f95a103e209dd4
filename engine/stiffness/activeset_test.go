package stiffness

import (
	"context"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// xBraced builds a pin-jointed panel b wide and h high: A (0, 0) and
// B (b, 0) pinned, D (0, h) and C (b, h) free; posts AD and BC, a top
// chord DC and the tension-only diagonals AC and BD. A lateral load H
// acts at D along +x.
func xBraced(b, h, H float64) (*builder, [5]int) {
	bl := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	A := bl.node(0, 0)
	B := bl.node(b, 0)
	C := bl.node(b, h)
	D := bl.node(0, h)
	ms := [5]int{bl.bar(A, D), bl.bar(B, C), bl.bar(D, C), bl.bar(A, C), bl.bar(B, D)}
	bl.m.Members[ms[3]].Behaviour = model.TensionOnly
	bl.m.Members[ms[4]].Behaviour = model.TensionOnly
	bl.fix(A, pinned2...)
	bl.fix(B, pinned2...)
	bl.force(D, [3]float64{H, 0}, [3]float64{})
	return bl, ms
}

// TestXBracedSlackDiagonal checks the X-braced panel under a lateral
// load: the sway shortens BD, which goes slack, and the panel is then a
// statically determinate truss. Joint equilibrium by hand (derived here):
// at D, N_DC = −H and N_AD = 0; at C, N_AC·cos θ = H, so N_AC = H/cos θ
// with cos θ = b/√(b² + h²), and N_BC = −N_AC·sin θ = −H·h/b. With the
// load reversed, AC is slack and at D itself N_BD·cos θ = H, N_AD =
// −H·h/b and N_DC = 0. Both paths, and the symbolic analysis is made once per Solve.
func TestXBracedSlackDiagonal(t *testing.T) {
	const b, h, H = 4.0, 3.0, 12.0
	d := math.Hypot(b, h)
	for _, path := range []Path{Dense, Sparse} {
		for _, sense := range []float64{1, -1} {
			bl, ms := xBraced(b, h, sense*H)
			before := symbolicAnalyses.Load()
			res, err := Solve(context.Background(), bl.m, Options{Path: path})
			if err != nil {
				t.Fatal(err)
			}
			r := &res.Cases[0]
			taut, slack := ms[3], ms[4]
			if sense < 0 {
				taut, slack = slack, taut
			}
			near(t, "taut diagonal H/cos θ", r.AxialForce[taut], H*d/b, 1e-9)
			near(t, "slack diagonal", r.AxialForce[slack], 0, 1e-12)
			chord := -H // the load at D reaches C through DC
			if sense < 0 {
				chord = 0 // BD takes the load at D itself
			}
			near(t, "top chord", r.AxialForce[ms[2]], chord, 1e-9)
			post := ms[1]
			if sense < 0 {
				post = ms[0]
			}
			near(t, "loaded post −H·h/b", r.AxialForce[post], -H*h/b, 1e-9)
			it := r.Iteration
			if it == nil || !slices.Equal(it.Slack, []int{slack}) {
				t.Fatalf("iteration report %+v, want slack [%d]", it, slack)
			}
			// All active, then the compressed diagonal out: two solves
			// (the slack diagonal's trial force then shortens it, so it
			// stays out). The dense path refactorises; the sparse one
			// may solve the second by a rank-one update of the first
			// factorisation.
			if it.Iterations != 2 || it.Factorisations+it.LowRankSolves != 2 || path == Dense && it.Factorisations != 2 {
				t.Errorf("%d solves, %d factorisations and %d low-rank solves, want 2 solves", it.Iterations, it.Factorisations, it.LowRankSolves)
			}
			if want := map[Path]int{Dense: 0, Sparse: 1}[path]; symbolicAnalyses.Load()-before != int64(want) {
				t.Errorf("path %s: %d symbolic analyses, want %d", path, symbolicAnalyses.Load()-before, want)
			}
			if r.Residual > 1e-12 || r.BalanceError > 1e-12 {
				t.Errorf("residual %g, balance %g", r.Residual, r.BalanceError)
			}
		}
	}
}

// TestXBracedCombination checks that a model with one-sided members is
// not superposed: two opposite wind cases and their sum. Linear
// superposition would give zero forces for the sum; solved on its own the
// combination 1.0·right + 0.5·left is a net H/2 to the right, so AC
// carries (H/2)/cos θ and BD is slack (the same hand statics as above).
func TestXBracedCombination(t *testing.T) {
	const b, h, H = 4.0, 3.0, 12.0
	bl, ms := xBraced(b, h, H)
	bl.m.Cases = append(bl.m.Cases, model.LoadCase{ID: "left", Nodal: []model.NodalLoad{{Node: 3, Force: [3]float64{-H}}}})
	bl.m.Combinations = []model.Combination{{ID: "sum", Terms: []model.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 0.5}}}}
	res, err := Solve(context.Background(), bl.m, Options{})
	if err != nil {
		t.Fatal(err)
	}
	d := math.Hypot(b, h)
	near(t, "case right: AC", res.Cases[0].AxialForce[ms[3]], H*d/b, 1e-9)
	near(t, "case left: BD", res.Cases[1].AxialForce[ms[4]], H*d/b, 1e-9)
	near(t, "combination: AC", res.Cases[2].AxialForce[ms[3]], 0.5*H*d/b, 1e-9)
	near(t, "combination: BD", res.Cases[2].AxialForce[ms[4]], 0, 1e-12)
}

// TestCompressionOnlyStrut checks a node held by two equal collinear
// bars, a compression-only strut below (to a pinned base) and a two-way
// bar above (to a pinned head), with a horizontal bar holding x. Two
// equal springs in parallel share a load equally; with one out the other
// takes it all (derived here). Load P down: strut −P/2, bar above +P/2.
// Load P up: the strut would stretch, so it drops out and the bar above
// carries −P.
func TestCompressionOnlyStrut(t *testing.T) {
	const h, P = 2.0, 30.0
	for _, sense := range []float64{-1, 1} {
		bl := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
		n := bl.node(0, 0)
		base := bl.node(0, -h)
		head := bl.node(0, h)
		side := bl.node(-h, 0)
		strut := bl.bar(base, n)
		above := bl.bar(n, head)
		bl.bar(side, n)
		bl.m.Members[strut].Behaviour = model.CompressionOnly
		for _, s := range []int{base, head, side} {
			bl.fix(s, pinned2...)
		}
		bl.force(n, [3]float64{0, sense * P}, [3]float64{})
		r := solve1(t, bl.m, Options{})
		if sense < 0 {
			near(t, "strut", r.AxialForce[strut], -P/2, 1e-9)
			near(t, "bar above", r.AxialForce[above], P/2, 1e-9)
			if len(r.Iteration.Slack) != 0 || r.Iteration.Iterations != 1 {
				t.Errorf("report %+v, want one solve and no slack member", r.Iteration)
			}
		} else {
			near(t, "strut (out)", r.AxialForce[strut], 0, 1e-12)
			near(t, "bar above", r.AxialForce[above], -P, 1e-9)
			if !slices.Equal(r.Iteration.Slack, []int{strut}) {
				t.Errorf("slack %v, want [%d]", r.Iteration.Slack, strut)
			}
		}
	}
}

// cableLine builds two cables A–C and C–B along x (A at 0, C at a, B at
// a + b), A and B pinned, each with pretension T.
func cableLine(a, b, T, ea float64) (*builder, int, int, int) {
	bl := newBuilder(2, ea, 0, 1, 0, 0, 0)
	A := bl.node(0, 0)
	C := bl.node(a, 0)
	B := bl.node(a+b, 0)
	for _, e := range []int{bl.bar(A, C), bl.bar(C, B)} {
		bl.m.Members[e].Behaviour, bl.m.Members[e].Cable, bl.m.Members[e].Pretension = model.TensionOnly, true, T
	}
	bl.fix(A, pinned2...)
	bl.fix(B, pinned2...)
	return bl, A, C, B
}

// TestTautStringPointLoad checks a pretensioned cable between two
// supports under a transverse point load against the small-deflection
// taut string (derived here, as in H. M. Irvine, "Cable Structures", MIT
// Press 1981, ch. 1, from memory): with the tension T unchanged to first
// order in the deflection δ, the load point's equilibrium is
// T·δ/a + T·δ/b = P, so δ = P·a·b/(T·L), and the supports take P·b/L and
// P·a/L across the span. Second order gives the cables their transverse
// stiffness T/a and T/b; without it the string is a mechanism, and the
// error says to ask for it.
func TestTautStringPointLoad(t *testing.T) {
	const a, b, T, P, ea = 3.0, 5.0, 400.0, 2.0, 1e6
	L := a + b
	bl, A, C, B := cableLine(a, b, T, ea)
	bl.force(C, [3]float64{0, -P}, [3]float64{})
	res, err := Solve(context.Background(), bl.m, Options{SecondOrder: &SecondOrder{}})
	if err != nil {
		t.Fatal(err)
	}
	r := &res.Cases[0]
	near(t, "deflection P·a·b/(T·L)", r.Displacements[C][1], -P*a*b/(T*L), 1e-9)
	near(t, "reaction at A", r.Reactions[0].Force[1], P*b/L, 1e-9)
	near(t, "reaction at B", r.Reactions[1].Force[1], P*a/L, 1e-9)
	near(t, "tension in AC", r.AxialForce[0], T, 1e-9)
	near(t, "pull at A", r.Reactions[0].Force[0], -T, 1e-9)
	_, _ = A, B
	if r.Iteration == nil || !r.Iteration.SecondOrder || r.Iteration.Iterations != 2 {
		t.Errorf("report %+v, want second order in 2 solves", r.Iteration)
	}
	_, err = Solve(context.Background(), bl.m, Options{})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.Unstable || !strings.Contains(fe.Message, "second_order") {
		t.Errorf("first order: error %v, want an unstable error naming second_order", err)
	}
}

// TestPretensionedCableGoesSlack checks pretension as an initial force
// and a cable going slack. Two cables A–C, C–B of equal length a with
// pretension T; C is held in y by a roller, and pulled along +x by F.
// While both are taut, C moves x = F·a/(2·E·A) and N = T ± F/2; with
// F = 3T the cable C–B would be compressed (T − 3T/2 < 0), so it goes
// slack, loses its pretension, and A–C alone balances F: N_AC = F, C
// moves (F − T)·a/(E·A) (derived here). With no load each cable simply
// holds its pretension: N = T.
func TestPretensionedCableGoesSlack(t *testing.T) {
	const a, T, ea = 2.0, 10.0, 1e5
	for _, F := range []float64{0, 3 * T} {
		bl, _, C, _ := cableLine(a, a, T, ea)
		bl.fix(C, model.Y)
		bl.force(C, [3]float64{F, 0}, [3]float64{})
		r := solve1(t, bl.m, Options{})
		if F == 0 {
			near(t, "pretension AC", r.AxialForce[0], T, 1e-12)
			near(t, "pretension CB", r.AxialForce[1], T, 1e-12)
			continue
		}
		near(t, "AC alone", r.AxialForce[0], F, 1e-9)
		near(t, "CB slack", r.AxialForce[1], 0, 1e-12)
		near(t, "C moves", r.Displacements[C][0], (F-T)*a/ea, 1e-9)
		if !slices.Equal(r.Iteration.Slack, []int{1}) {
			t.Errorf("slack %v, want [1]", r.Iteration.Slack)
		}
	}
}

// TestSlackMechanism checks that a structure which needs a slack member
// is reported as a mechanism naming it: a node held by one tension-only
// bar and one two-way bar in line, pushed toward the tension-only one.
func TestSlackMechanism(t *testing.T) {
	bl := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	n := bl.node(0, 0)
	left := bl.node(-1, 0)
	below := bl.node(0, -1)
	tie := bl.bar(left, n)
	bl.bar(below, n)
	bl.m.Members[tie].Behaviour = model.TensionOnly
	bl.fix(left, pinned2...)
	bl.fix(below, pinned2...)
	bl.force(n, [3]float64{-5, 0}, [3]float64{})
	_, err := Solve(context.Background(), bl.m, Options{})
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.Unstable || !strings.Contains(fe.Message, `"m0"`) {
		t.Fatalf("error %v, want a mechanism naming the slack member m0", err)
	}
	if fe.Problems[0].Path != "/members/0" {
		t.Errorf("first problem %+v, want the slack member's pointer", fe.Problems[0])
	}
}

// TestIteratedWithAnalysis checks that an Analysis (as sweeps use) gives
// the iterated answer of Solve and makes no symbolic analysis of its own.
func TestIteratedWithAnalysis(t *testing.T) {
	bl, _ := xBraced(4, 3, 12)
	opt := Options{Path: Sparse}
	want, err := Solve(context.Background(), bl.m, opt)
	if err != nil {
		t.Fatal(err)
	}
	an := NewAnalysis(bl.m, opt)
	before := symbolicAnalyses.Load()
	for range 2 {
		got, err := an.Solve(context.Background(), bl.m)
		if err != nil {
			t.Fatal(err)
		}
		if !slices.Equal(got.Cases[0].AxialForce, want.Cases[0].AxialForce) {
			t.Errorf("analysis forces %v, Solve %v", got.Cases[0].AxialForce, want.Cases[0].AxialForce)
		}
	}
	if symbolicAnalyses.Load() != before {
		t.Errorf("%d symbolic analyses with an Analysis, want 0", symbolicAnalyses.Load()-before)
	}
}

// TestSlackCableSecondOrder checks the one loop of both nonlinearities:
// the two pretensioned cables of TestPretensionedCableGoesSlack without
// the roller, pulled along +x by F = 3T (so C–B goes slack) and across by
// P. With C–B out, C's equilibrium along the span gives N_AC = F, and
// across it the string A–C alone holds C with the stiffness N/a of its
// tension (the taut string, derived here; Irvine 1981, ch. 1, from
// memory): δ = P·a/F, to first order in δ.
func TestSlackCableSecondOrder(t *testing.T) {
	const a, T, ea, P = 2.0, 10.0, 1e5, 0.3
	F := 3 * T
	bl, _, C, _ := cableLine(a, a, T, ea)
	bl.force(C, [3]float64{F, -P}, [3]float64{})
	r := solve1(t, bl.m, Options{SecondOrder: &SecondOrder{Tolerance: 1e-10}})
	near(t, "AC carries F", r.AxialForce[0], F, 1e-9)
	near(t, "CB slack", r.AxialForce[1], 0, 1e-12)
	near(t, "sag P·a/F", r.Displacements[C][1], -P*a/F, 1e-9)
	if it := r.Iteration; !slices.Equal(it.Slack, []int{1}) || it.Iterations < 3 {
		t.Errorf("report %+v, want CB slack after 3 or more solves", it)
	}
}

// TestOneSidedAllTaut checks that one-sided members that all keep their
// sense change nothing: the symmetric three-bar truss hanging a load P
// below its supports, every bar tension-only, gives the closed form of
// TestThreeBarTruss (vertical bar P/(1 + 2cos³θ), inclined bars
// P·cos²θ/(1 + 2cos³θ); Timoshenko & Gere, from memory) in one solve.
func TestOneSidedAllTaut(t *testing.T) {
	const l, p, theta = 3.0, 50.0, math.Pi / 6
	b := newBuilder(2, 2e8, 0, 1e-3, 0, 0, 0)
	joint := b.node(0, 0)
	for _, x := range []float64{0, -l * math.Tan(theta), l * math.Tan(theta)} {
		e := b.bar(b.node(x, l), joint)
		b.m.Members[e].Behaviour = model.TensionOnly
		b.fix(b.m.Members[e].Ends[0], pinned2...)
	}
	b.force(joint, [3]float64{0, -p}, [3]float64{})
	r := solve1(t, b.m, Options{})
	c3 := 1 + 2*math.Pow(math.Cos(theta), 3)
	near(t, "vertical bar", r.AxialForce[0], p/c3, 1e-10)
	near(t, "inclined bar", r.AxialForce[1], p*math.Cos(theta)*math.Cos(theta)/c3, 1e-10)
	if it := r.Iteration; it.Iterations != 1 || len(it.Slack) != 0 {
		t.Errorf("report %+v, want one solve and no slack member", it)
	}
}

// TestOneSidedWithoutCases checks that a model with a cable and no load
// case answers with no cases rather than failing.
func TestOneSidedWithoutCases(t *testing.T) {
	bl, _ := xBraced(4, 3, 12)
	bl.m.Cases = nil
	for _, an := range []bool{false, true} {
		var res *Result
		var err error
		if an {
			res, err = NewAnalysis(bl.m, Options{}).Solve(context.Background(), bl.m)
		} else {
			res, err = Solve(context.Background(), bl.m, Options{})
		}
		if err != nil || len(res.Cases) != 0 {
			t.Errorf("analysis %v: %v cases, error %v; want none and no error", an, res, err)
		}
	}
}

// TestCycleDetection checks the bookkeeping that refuses an active set
// met before (a cycle): sets are told apart whole, not only by their
// hash, and the error names the members that switch, with pointers.
func TestCycleDetection(t *testing.T) {
	a := &memberState{inactive: []bool{true, false, false, false, false}}
	b := &memberState{inactive: []bool{false, true, false, false, false}}
	h := setHistory{}
	if h.add(&memberState{}) || h.add(a) || h.add(b) {
		t.Fatal("a new set reported as met before")
	}
	if !h.add(&memberState{inactive: []bool{true, false, false}}) || !h.add(&memberState{inactive: []bool{false, false, false}}) {
		t.Error("a set met before not recognised (the all-active set as nil or all false)")
	}
	bl, _ := xBraced(4, 3, 12)
	it := &iteration{r: &run{m: bl.m}}
	err := it.cycle(request{id: "wind"}, a, b)
	var fe *fault.Error
	if !errors.As(err, &fe) || fe.Kind != fault.NoSolution || !strings.Contains(fe.Message, `"m0", "m1"`) ||
		len(fe.Problems) != 2 || fe.Problems[1].Path != "/members/1" {
		t.Errorf("cycle error %v, want NoSolution naming m0 and m1", err)
	}
}

// TestSlackCableLosesThermalStrain checks that a slack member loses its
// thermal strain as it loses its pretension: a two-way bar A–C and a
// cable C–B (pretension T) of equal length a in line, C held across by a
// roller, the cable heated by ε. Restrained, the cable's free elongation
// ε·a less its pretension's T·a/(E·A) is shared by the two equal springs
// (derived here): C moves (T − E·A·ε)·a/(2·E·A) and both carry
// (T − E·A·ε)/2. Heated further, that force would compress the cable,
// which goes slack: nothing is left to strain the bar, so every force and
// displacement is zero.
func TestSlackCableLosesThermalStrain(t *testing.T) {
	const a, T, ea = 2.0, 10.0, 1e5
	for _, eps := range []float64{0.5 * T / ea, 3 * T / ea} {
		bl, _, C, _ := cableLine(a, a, T, ea)
		bl.m.Members[0].Behaviour, bl.m.Members[0].Cable, bl.m.Members[0].Pretension = model.Both, false, 0
		bl.fix(C, model.Y)
		bl.memberLoad(model.MemberLoad{Member: 1, Kind: model.Thermal, Strain: eps})
		r := solve1(t, bl.m, Options{})
		if n := (T - ea*eps) / 2; n > 0 {
			near(t, "bar", r.AxialForce[0], n, 1e-9)
			near(t, "cable", r.AxialForce[1], n, 1e-9)
			near(t, "C moves", r.Displacements[C][0], (T-ea*eps)*a/(2*ea), 1e-9)
			continue
		}
		near(t, "bar", r.AxialForce[0], 0, 1e-12)
		near(t, "cable (slack)", r.AxialForce[1], 0, 1e-12)
		near(t, "C stays", r.Displacements[C][0], 0, 1e-15)
	}
}
