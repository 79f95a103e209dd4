package envelope

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"

	"gusset/engine/model"
	"gusset/engine/stiffness"
)

func v(x float64) model.Value   { return model.Num(x) }
func pv(x float64) *model.Value { n := model.Num(x); return &n }
func vs(xs ...float64) []model.Value {
	out := make([]model.Value, len(xs))
	for i, x := range xs {
		out[i] = model.Num(x)
	}
	return out
}

// portal2 is a 2D portal frame (two columns, a beam, a pin-ended brace)
// with three cases and two combinations; the brace carries a member load
// in "wind" only, so its utilisation is unchecked in that case alone.
func portal2() *model.Spec {
	return &model.Spec{
		Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: v(2.1e8), WeightDensity: pv(77),
			TensionLimit: pv(2.35e5), CompressionLimit: pv(2.35e5)}},
		Sections: []model.SectionSpec{{ID: "s", Area: v(5e-3), SecondMoment: pv(8e-5), SectionModulus: pv(5e-4)}},
		Nodes:    []model.NodeSpec{{ID: "A", At: vs(0, 0)}, {ID: "B", At: vs(0, 4)}, {ID: "C", At: vs(6, 4)}, {ID: "D", At: vs(6, 0)}},
		Members: []model.MemberSpec{
			{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "s", Type: "beam"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "steel", Section: "s", Type: "beam"},
			{ID: "CD", Ends: [2]string{"C", "D"}, Material: "steel", Section: "s", Type: "beam"},
			{ID: "AC", Ends: [2]string{"A", "C"}, Material: "steel", Section: "s", Type: "bar"},
		},
		Supports: []model.SupportSpec{{Node: "A", Fix: []string{"x", "y", "rz"}}, {Node: "D", Fix: []string{"x", "y"}}},
		LoadCases: []model.LoadCaseSpec{
			{ID: "dead", MemberLoads: []model.MemberLoadSpec{{Member: "BC", Kind: "uniform", Value: vs(0, -12)}}},
			{ID: "live", MemberLoads: []model.MemberLoadSpec{{Member: "BC", Kind: "point", Value: vs(0, -40), Distance: pv(2)}}},
			{ID: "wind", Loads: []model.NodalLoadSpec{{Node: "B", Force: vs(15, 0)}},
				MemberLoads: []model.MemberLoadSpec{{Member: "AC", Kind: "uniform", Value: vs(0.5, 0)}, {Member: "AB", Kind: "linear", Value: vs(2, 0), EndValue: vs(4, 0)}}},
		},
		Combos: []model.CombinationSpec{
			{ID: "ultimate", Factors: map[string]float64{"dead": 1.35, "live": 1.5}},
			{ID: "uplift", Factors: map[string]float64{"dead": 1, "wind": -1.5}},
		},
	}
}

// frame3 is a small 3D frame: a cantilevered corner of two beams on a
// column, loaded in three cases.
func frame3() *model.Spec {
	return &model.Spec{
		Dimension: 3,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: v(2.1e8), TensionLimit: pv(2.35e5), CompressionLimit: pv(2.35e5)}},
		Sections:  []model.SectionSpec{{ID: "s", Area: v(5e-3), SecondMoment: pv(8e-5), SecondMomentY: pv(3e-5), TorsionConstant: pv(1e-5), SectionModulus: pv(5e-4), SectionModulusY: pv(2e-4)}},
		Nodes:     []model.NodeSpec{{ID: "A", At: vs(0, 0, 0)}, {ID: "B", At: vs(0, 0, 3)}, {ID: "C", At: vs(4, 0, 3)}, {ID: "E", At: vs(4, 3, 3)}},
		Members: []model.MemberSpec{
			{ID: "AB", Ends: [2]string{"A", "B"}, Material: "steel", Section: "s", Type: "beam"},
			{ID: "BC", Ends: [2]string{"B", "C"}, Material: "steel", Section: "s", Type: "beam"},
			{ID: "CE", Ends: [2]string{"C", "E"}, Material: "steel", Section: "s", Type: "beam"},
		},
		Supports: []model.SupportSpec{{Node: "A", Fix: []string{"x", "y", "z", "rx", "ry", "rz"}}},
		LoadCases: []model.LoadCaseSpec{
			{ID: "down", MemberLoads: []model.MemberLoadSpec{{Member: "CE", Kind: "uniform", Value: vs(0, 0, -3)}}},
			{ID: "side", Loads: []model.NodalLoadSpec{{Node: "E", Force: vs(2, -1, 0)}}},
			{ID: "twist", MemberLoads: []model.MemberLoadSpec{{Member: "BC", Kind: "point", Value: vs(0, 5, 1), Distance: pv(1.5)}}},
		},
		Combos: []model.CombinationSpec{{ID: "both", Factors: map[string]float64{"down": 1.2, "side": -0.8, "twist": 1}}},
	}
}

// caseIDs lists the ids of res's cases in order.
func caseIDs(res *stiffness.Result) []string {
	ids := make([]string, len(res.Cases))
	for i, c := range res.Cases {
		ids[i] = c.ID
	}
	return ids
}

func compileSolve(t *testing.T, s *model.Spec, cases []string) (*model.Model, *stiffness.Result) {
	t.Helper()
	m, err := model.Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := stiffness.Solve(context.Background(), m, stiffness.Options{Cases: cases})
	if err != nil {
		t.Fatal(err)
	}
	return m, res
}

// TestEnvelopeEqualsSeparateSolves checks every bound of the envelope
// against the largest and smallest value over the cases solved one at a
// time, by a plain loop (a consistency check: each case is solved in its
// own request, and the extremes are taken without the envelope's code).
func TestEnvelopeEqualsSeparateSolves(t *testing.T) {
	for name, spec := range map[string]func() *model.Spec{"2D portal": portal2, "3D corner": frame3} {
		t.Run(name, func(t *testing.T) {
			m, all := compileSolve(t, spec(), nil)
			env := New(m, caseIDs(all))
			// Added last to first: the envelope does not depend on the
			// order of adding.
			for i := len(all.Cases) - 1; i >= 0; i-- {
				env.Add(i, &all.Cases[i])
			}
			separate := make([]*stiffness.CaseResult, len(all.Cases))
			for i, c := range all.Cases {
				_, one := compileSolve(t, spec(), []string{c.ID})
				separate[i] = &one.Cases[0]
			}
			checkAgainst(t, m, env, separate)
		})
	}
}

// checkAgainst compares each bound with the extreme over the separate
// cases, found by brute force: get(c) returns one quantity's value and
// position in case c.
func checkAgainst(t *testing.T, m *model.Model, env *Envelope, cases []*stiffness.CaseResult) {
	t.Helper()
	check := func(what string, iv Interval, get func(c *stiffness.CaseResult) (lo, hi, loAt, hiAt float64)) {
		t.Helper()
		best, worst := math.Inf(-1), math.Inf(1)
		for _, c := range cases {
			lo, hi, _, _ := get(c)
			best, worst = math.Max(best, hi), math.Min(worst, lo)
		}
		if !scalar.EqualWithinAbsOrRel(iv.Max.Value, best, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(iv.Min.Value, worst, 1e-12, 1e-12) {
			t.Errorf("%s: envelope [%g, %g], separate solves [%g, %g]", what, iv.Min.Value, iv.Max.Value, worst, best)
			return
		}
		// The governing case reaches the bound at the stated place.
		lo, _, loAt, _ := get(cases[iv.Min.Case])
		_, hi, _, hiAt := get(cases[iv.Max.Case])
		if !scalar.EqualWithinAbsOrRel(hi, best, 1e-12, 1e-12) || !scalar.EqualWithinAbsOrRel(lo, worst, 1e-12, 1e-12) ||
			iv.Max.At != hiAt || iv.Min.At != loAt {
			t.Errorf("%s: governing cases %d, %d do not reach the bounds there", what, iv.Max.Case, iv.Min.Case)
		}
	}
	scalarOf := func(x float64) (float64, float64, float64, float64) { return x, x, 0, 0 }
	for n := range env.Nodes {
		for i := range env.Nodes[n].Displacement {
			check(fmt.Sprintf("node %d displacement %d", n, i), env.Nodes[n].Displacement[i],
				func(c *stiffness.CaseResult) (float64, float64, float64, float64) {
					return scalarOf(c.Displacements[n][i])
				})
		}
		if len(env.Nodes[n].Rotation) != len(cases[0].Rotations[n]) {
			t.Errorf("node %d: %d rotations enveloped, %d solved", n, len(env.Nodes[n].Rotation), len(cases[0].Rotations[n]))
		}
		for i := range env.Nodes[n].Rotation {
			check(fmt.Sprintf("node %d rotation %d", n, i), env.Nodes[n].Rotation[i],
				func(c *stiffness.CaseResult) (float64, float64, float64, float64) { return scalarOf(c.Rotations[n][i]) })
		}
	}
	for s := range env.Supports {
		for i := range env.Supports[s].Force {
			check(fmt.Sprintf("support %d force %d", s, i), env.Supports[s].Force[i],
				func(c *stiffness.CaseResult) (float64, float64, float64, float64) {
					return scalarOf(c.Reactions[s].Force[i])
				})
		}
		for i := range env.Supports[s].Moment {
			check(fmt.Sprintf("support %d moment %d", s, i), env.Supports[s].Moment[i],
				func(c *stiffness.CaseResult) (float64, float64, float64, float64) {
					return scalarOf(c.Reactions[s].Moment[i])
				})
		}
	}
	for e := range env.Members {
		mem := &env.Members[e]
		for i := range mem.EndForces {
			check(fmt.Sprintf("member %d end force %d", e, i), mem.EndForces[i],
				func(c *stiffness.CaseResult) (float64, float64, float64, float64) { return scalarOf(c.EndForces[e][i]) })
		}
		check(fmt.Sprintf("member %d axial", e), mem.Axial, func(c *stiffness.CaseResult) (float64, float64, float64, float64) {
			r := *c.Member(e, nil)
			return r.MinAxial.Value, r.MaxAxial.Value, r.MinAxial.At, r.MaxAxial.At
		})
		for q := range mem.Along {
			check(fmt.Sprintf("member %d internal force %d", e, q), mem.Along[q], func(c *stiffness.CaseResult) (float64, float64, float64, float64) {
				return stationRange(t, m, c, e, q)
			})
		}
		unchecked := -1
		for k, c := range cases {
			if c.Utilisation[e] < 0 && unchecked < 0 {
				unchecked = k
			}
		}
		if mem.Unchecked != unchecked {
			t.Errorf("member %d: unchecked in case %d, want %d", e, mem.Unchecked, unchecked)
		}
	}
}

// stationRange returns the range of internal force q of member e in case
// c over its stations and the exact peaks the solve reports; the
// envelope's exact extremes must agree with the stations to within the
// largest difference between neighbouring stations, and equal the peak
// of largest magnitude. It returns the envelope-independent range built
// from the stations, widened to the exact peak values.
func stationRange(t *testing.T, m *model.Model, c *stiffness.CaseResult, e, q int) (lo, hi, loAt, hiAt float64) {
	t.Helper()
	r := *c.Member(e, nil)
	columns := [stiffness.RangeCount][]float64{r.Axial, r.ShearY, r.ShearZ, r.Torsion, r.MomentY, r.MomentZ}
	col := columns[q]
	rg := r.Ranges[q]
	if len(col) == 0 {
		// A 2D beam has no 3D forces: their range is zero.
		return 0, 0, 0, 0
	}
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, x := range col {
		lo, hi = math.Min(lo, x), math.Max(hi, x)
	}
	// The stations lie inside the exact range, which reaches beyond them
	// by at most what lies between two stations.
	slack := 1e-9 * (1 + math.Abs(hi) + math.Abs(lo))
	if rg.Max.Value < hi-slack || rg.Min.Value > lo+slack {
		t.Errorf("member %d force %d: exact range [%g, %g] misses the stations' [%g, %g]", e, q, rg.Min.Value, rg.Max.Value, lo, hi)
	}
	peaks := map[int]stiffness.Extreme{stiffness.RangeMomentZ: r.PeakMomentZ, stiffness.RangeMomentY: r.PeakMomentY}
	if pk, ok := peaks[q]; ok && math.Abs(pk.Value) > 0 {
		if pk.Value > 0 && !scalar.EqualWithinAbsOrRel(rg.Max.Value, pk.Value, 1e-12, 1e-12) && rg.Max.Value < pk.Value ||
			pk.Value < 0 && rg.Min.Value > pk.Value+1e-12*math.Abs(pk.Value) {
			t.Errorf("member %d force %d: range [%g, %g] misses the peak %g", e, q, rg.Min.Value, rg.Max.Value, pk.Value)
		}
	}
	return rg.Min.Value, rg.Max.Value, rg.Min.At, rg.Max.At
}

// threeMoment solves Clapeyron's three-moment equation for a continuous
// beam of equal spans L (constant EI, simply supported at both ends) under
// a uniform load w[i] on span i, sagging moments positive:
// M₍ᵢ₋₁₎ + 4Mᵢ + M₍ᵢ₊₁₎ = −(wᵢ + wᵢ₊₁)L²/4 at each inner support (Timoshenko
// & Young, Theory of Structures, 1965, §9.1, the equation of three moments
// for equal spans; derived in the test from 6A·x̄/L = wL³/4 for a uniform
// load). It returns the moment at every support, ends (zero) included,
// solved by gonum's dense LU.
func threeMoment(w []float64, length float64) []float64 {
	n := len(w) - 1 // inner supports
	supports := make([]float64, len(w)+1)
	if n == 0 {
		return supports
	}
	a := mat.NewDense(n, n, nil)
	b := mat.NewVecDense(n, nil)
	for i := range n {
		a.Set(i, i, 4)
		if i > 0 {
			a.Set(i, i-1, 1)
		}
		if i < n-1 {
			a.Set(i, i+1, 1)
		}
		b.SetVec(i, -(w[i]+w[i+1])*length*length/4)
	}
	var x mat.VecDense
	if err := x.SolveVec(a, b); err != nil {
		panic(err)
	}
	for i := range n {
		supports[i+1] = x.AtVec(i)
	}
	return supports
}

// spanMoments returns the largest and smallest bending moment in a span
// of length L under uniform load w with end moments ml and mr (statics of
// the simply supported span plus the linear end-moment line:
// M(x) = w·x(L − x)/2 + ml + (mr − ml)·x/L, stationary at
// x = L/2 + (mr − ml)/(wL)).
func spanMoments(w, length, ml, mr float64) (lo, hi float64) {
	at := func(x float64) float64 { return w*x*(length-x)/2 + ml + (mr-ml)*x/length }
	lo, hi = math.Min(ml, mr), math.Max(ml, mr)
	if w != 0 {
		if x := length/2 + (mr-ml)/(w*length); x > 0 && x < length {
			lo, hi = math.Min(lo, at(x)), math.Max(hi, at(x))
		}
	}
	return lo, hi
}

// continuous is a continuous beam of equal spans (one beam member per
// span, pinned at the first support, on rollers at the others) with one
// load case per span: a uniform load q downwards on that span alone; and a
// permanent case g on every span; and one combination per on/off pattern
// of the span cases (g always on), named as a model's patterns name them
// ("live/on:Q1+Q3", "live/all-off"; engine/model's patterns generate the
// same, tested there), written out here so that the envelope is tested on
// its own.
func continuous(spans int, length, g, q float64) *model.Spec {
	s := &model.Spec{
		Dimension: 2,
		Materials: []model.MaterialSpec{{ID: "steel", ElasticModulus: v(2.1e8)}},
		Sections:  []model.SectionSpec{{ID: "s", Area: v(5e-3), SecondMoment: pv(8e-5)}},
	}
	permanent := model.LoadCaseSpec{ID: "G"}
	for i := 0; i <= spans; i++ {
		s.Nodes = append(s.Nodes, model.NodeSpec{ID: fmt.Sprintf("S%d", i), At: vs(float64(i)*length, 0)})
		fix := []string{"y"}
		if i == 0 {
			fix = []string{"x", "y"}
		}
		s.Supports = append(s.Supports, model.SupportSpec{Node: fmt.Sprintf("S%d", i), Fix: fix})
	}
	for i := range spans {
		id := fmt.Sprintf("span%d", i+1)
		s.Members = append(s.Members, model.MemberSpec{ID: id, Ends: [2]string{fmt.Sprintf("S%d", i), fmt.Sprintf("S%d", i+1)},
			Material: "steel", Section: "s", Type: "beam"})
		s.LoadCases = append(s.LoadCases, model.LoadCaseSpec{ID: fmt.Sprintf("Q%d", i+1),
			MemberLoads: []model.MemberLoadSpec{{Member: id, Kind: "uniform", Value: vs(0, -q)}}})
		permanent.MemberLoads = append(permanent.MemberLoads, model.MemberLoadSpec{Member: id, Kind: "uniform", Value: vs(0, -g)})
	}
	s.LoadCases = append(s.LoadCases, permanent)
	for on := range 1 << spans {
		cb := model.CombinationSpec{ID: "live/all-off", Factors: map[string]float64{"G": 1}}
		var names []string
		for i := range spans {
			if on&(1<<i) != 0 {
				names = append(names, fmt.Sprintf("Q%d", i+1))
				cb.Factors[fmt.Sprintf("Q%d", i+1)] = 1
			}
		}
		if names != nil {
			cb.ID = "live/on:" + strings.Join(names, "+")
		}
		s.Combos = append(s.Combos, cb)
	}
	return s
}

// envelopeOfPattern solves every combination of the spec and envelopes
// them.
func envelopeOfPattern(t *testing.T, s *model.Spec) (*model.Model, *Envelope) {
	t.Helper()
	m, err := model.Compile(s)
	if err != nil {
		t.Fatal(err)
	}
	var ids []string
	for _, cb := range m.Combinations {
		ids = append(ids, cb.ID)
	}
	res, err := stiffness.Solve(context.Background(), m, stiffness.Options{Cases: ids})
	if err != nil {
		t.Fatal(err)
	}
	env := New(m, caseIDs(res))
	for i := range res.Cases {
		env.Add(i, &res.Cases[i])
	}
	return m, env
}

// TestPatternLoadingContinuousBeams checks the envelope of all on/off
// patterns of a live load on the spans of continuous beams against the
// three-moment equation: the largest span moment comes from loading
// alternate spans, the largest support moment from loading the two spans
// beside it. The familiar coefficients (from memory, as printed in beam
// tables, e.g. Reynolds & Steedman, Reinforced Concrete Designer's
// Handbook, 1988, Table 2.29): two equal spans 0.0957 wL² (one span
// loaded), −0.125 wL² at the support (both); three equal spans 0.101 wL²
// in an end span (spans 1 and 3), 0.075 wL² in the middle span (span 2
// alone), −0.117 wL² at an inner support (spans 1 and 2); with every span
// loaded 0.070 / −0.125 and 0.080 / −0.100 / 0.025. The test derives each
// from the three-moment equation over every pattern and checks the
// coefficients too.
func TestPatternLoadingContinuousBeams(t *testing.T) {
	const length, q = 6.0, 10.0
	wl2 := q * length * length
	cases := []struct {
		spans             int
		g                 float64
		spanMax           []float64 // coefficient of wL² per span (from memory), live only
		supportMin        []float64 // per inner support
		spanGoverning     []string
		supportGoverning  []string
		allLoadedSpan     []float64 // every span loaded
		allLoadedSupports []float64
	}{
		{spans: 2, spanMax: []float64{0.0957, 0.0957}, supportMin: []float64{-0.125},
			spanGoverning: []string{"live/on:Q1", "live/on:Q2"}, supportGoverning: []string{"live/on:Q1+Q2"},
			allLoadedSpan: []float64{0.070, 0.070}, allLoadedSupports: []float64{-0.125}},
		{spans: 3, spanMax: []float64{0.101, 0.075, 0.101}, supportMin: []float64{-0.117, -0.117},
			spanGoverning: []string{"live/on:Q1+Q3", "live/on:Q2", "live/on:Q1+Q3"}, supportGoverning: []string{"live/on:Q1+Q2", "live/on:Q2+Q3"},
			allLoadedSpan: []float64{0.080, 0.025, 0.080}, allLoadedSupports: []float64{-0.100, -0.100}},
	}
	for _, tc := range cases {
		t.Run(fmt.Sprintf("%d spans", tc.spans), func(t *testing.T) {
			_, env := envelopeOfPattern(t, continuous(tc.spans, length, 0, q))
			// Every span loaded: the coefficients from memory.
			all := make([]float64, tc.spans)
			for i := range all {
				all[i] = q
			}
			ms := threeMoment(all, length)
			for i := range tc.spans {
				_, hi := spanMoments(q, length, ms[i], ms[i+1])
				if !scalar.EqualWithinAbs(hi/wl2, tc.allLoadedSpan[i], 5e-4) {
					t.Errorf("all loaded: span %d moment %.4f wL², tables %.3f", i+1, hi/wl2, tc.allLoadedSpan[i])
				}
			}
			for i, want := range tc.allLoadedSupports {
				if !scalar.EqualWithinAbs(ms[i+1]/wl2, want, 5e-4) {
					t.Errorf("all loaded: support %d moment %.4f wL², tables %.3f", i+1, ms[i+1]/wl2, want)
				}
			}
			spanHi, supportLo := patternExtremes(tc.spans, length, 0, q)
			for i := range tc.spans {
				got := env.Members[i].Along[stiffness.RangeMomentZ].Max
				if !scalar.EqualWithinAbsOrRel(got.Value, spanHi[i], 1e-9, 1e-9) {
					t.Errorf("span %d: largest moment %g, three-moment equation %g", i+1, got.Value, spanHi[i])
				}
				if !scalar.EqualWithinAbs(got.Value/wl2, tc.spanMax[i], 5e-4) {
					t.Errorf("span %d: largest moment %.4f wL², tables %.3f", i+1, got.Value/wl2, tc.spanMax[i])
				}
				if id := env.Cases[got.Case]; id != tc.spanGoverning[i] {
					t.Errorf("span %d: largest moment governed by %q, want %q (alternate spans)", i+1, id, tc.spanGoverning[i])
				}
			}
			for i := range tc.spans - 1 {
				// The support moment is the moment at the second end of the
				// span to its left: its end force M₂ (the internal moment
				// at x = L, sagging positive).
				got := env.Members[i].EndForces[5].Min
				if !scalar.EqualWithinAbsOrRel(got.Value, supportLo[i], 1e-9, 1e-9) {
					t.Errorf("support %d: smallest moment %g, three-moment equation %g", i+1, got.Value, supportLo[i])
				}
				if !scalar.EqualWithinAbs(got.Value/wl2, tc.supportMin[i], 5e-4) {
					t.Errorf("support %d: moment %.4f wL², tables %.3f", i+1, got.Value/wl2, tc.supportMin[i])
				}
				if id := env.Cases[got.Case]; id != tc.supportGoverning[i] {
					t.Errorf("support %d: moment governed by %q, want %q (adjacent spans)", i+1, id, tc.supportGoverning[i])
				}
			}
		})
	}
}

// TestPatternLoadingWithPermanentLoad adds a permanent load on every span:
// the envelope must still equal the largest span and support moments over
// every pattern by the three-moment equation (the superposed loads are
// one uniform load per span, so the equation applies as it is).
func TestPatternLoadingWithPermanentLoad(t *testing.T) {
	const length, g, q = 5.0, 4.0, 7.0
	for spans := 2; spans <= 4; spans++ {
		_, env := envelopeOfPattern(t, continuous(spans, length, g, q))
		spanHi, supportLo := patternExtremes(spans, length, g, q)
		for i := range spans {
			if got := env.Members[i].Along[stiffness.RangeMomentZ].Max.Value; !scalar.EqualWithinAbsOrRel(got, spanHi[i], 1e-9, 1e-9) {
				t.Errorf("%d spans, span %d: largest moment %g, three-moment equation %g", spans, i+1, got, spanHi[i])
			}
		}
		for i := range spans - 1 {
			if got := env.Members[i].EndForces[5].Min.Value; !scalar.EqualWithinAbsOrRel(got, supportLo[i], 1e-9, 1e-9) {
				t.Errorf("%d spans, support %d: smallest moment %g, three-moment equation %g", spans, i+1, got, supportLo[i])
			}
		}
		// Under downward loads a span's moment is least at an end: the
		// smallest along each span is the worse of its two supports.
		for i := range spans {
			want := 0.0
			for _, k := range []int{i - 1, i} {
				if k >= 0 && k < spans-1 {
					want = math.Min(want, supportLo[k])
				}
			}
			if got := env.Members[i].Along[stiffness.RangeMomentZ].Min.Value; !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-9) {
				t.Errorf("%d spans, span %d: smallest moment %g, three-moment equation %g", spans, i+1, got, want)
			}
		}
	}
}

// patternExtremes returns, over every on/off pattern of q on the spans
// with g on all, the largest moment in each span and the smallest moment
// at each inner support, by the three-moment equation.
func patternExtremes(spans int, length, g, q float64) (spanHi, supportLo []float64) {
	spanHi = make([]float64, spans)
	supportLo = make([]float64, spans-1)
	for i := range spanHi {
		spanHi[i] = math.Inf(-1)
	}
	for k := range supportLo {
		supportLo[k] = math.Inf(1)
	}
	for on := range 1 << spans {
		w := make([]float64, spans)
		for i := range w {
			w[i] = g
			if on&(1<<i) != 0 {
				w[i] += q
			}
		}
		ms := threeMoment(w, length)
		for i := range spans {
			_, hi := spanMoments(w[i], length, ms[i], ms[i+1])
			spanHi[i] = math.Max(spanHi[i], hi)
		}
		for k := range supportLo {
			supportLo[k] = math.Min(supportLo[k], ms[k+1])
		}
	}
	return spanHi, supportLo
}

// TestUncheckedUtilisationIsKept: a member unchecked in one case keeps
// that case, even when other cases check it.
func TestUncheckedUtilisationIsKept(t *testing.T) {
	spec := portal2()
	spec.Sections = append(spec.Sections, model.SectionSpec{ID: "brace", Area: v(5e-3), SecondMoment: pv(8e-5)})
	spec.Members[3].Section = "brace"
	m, res := compileSolve(t, spec, nil)
	env := New(m, caseIDs(res))
	for i := range res.Cases {
		env.Add(i, &res.Cases[i])
	}
	brace := env.Members[3]
	// The brace carries a load across it in wind (case 2) and in the
	// combination uplift (case 4), and bends there as a simple span; its
	// section gives no section modulus, so its bending is not checked.
	if brace.Unchecked != 2 {
		t.Errorf("brace unchecked in case %d, want 2 (wind)", brace.Unchecked)
	}
	if env.Members[1].Unchecked != -1 {
		t.Errorf("beam BC unchecked in case %d, want every case checked", env.Members[1].Unchecked)
	}
}
