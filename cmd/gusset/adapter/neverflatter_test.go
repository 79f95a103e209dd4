package adapter

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"gusset/protocol"
)

// Issue 14's beam that fails in bending: a simply supported span of
// 10 m (the parameter "span") under 10 kN/m, E = 2.1e8 kN/m²,
// I = 1e-4 m⁴, limits 2.35e5 kN/m² and, when given, W = 5e-4 m³. By the
// beam tables (Roark's Formulas for Stress and Strain, simply supported
// beam under a uniform load; from memory) M = wL²/8 = 125 kN·m at
// mid-span and δ = 5wL⁴/384EI = 62.0 mm there, so the bending check
// M/(W·f) = 125/117.5 = 1.064 fails. The combination "factored" is 1.5 × w.
const (
	flatterW, flatterE, flatterI = 10.0, 2.1e8, 1e-4
	flatterModulus, flatterLimit = 5e-4, 2.35e5
)

// failingBeam is the beam's model, with the section modulus or without.
func failingBeam(withModulus bool) string {
	modulus := ""
	if withModulus {
		modulus = fmt.Sprintf(`,"section_modulus":%g`, flatterModulus)
	}
	return fmt.Sprintf(`{"dimension":2,"units":{"length":"m","force":"kN"},"parameters":{"span":10},
"materials":[{"id":"steel","elastic_modulus":%g,"tension_limit":%g,"compression_limit":%g}],
"sections":[{"id":"s","area":0.005,"second_moment":%g%s}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":["span",0]}],
"members":[{"id":"girder","ends":["A","B"],"material":"steel","section":"s","type":"beam"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"B","fix":["y"]}],
"load_cases":[{"id":"w","member_loads":[{"member":"girder","kind":"uniform","value":[0,-%g]}]}],
"combinations":[{"id":"factored","factors":{"w":1.5}}]}`, flatterE, flatterLimit, flatterLimit, flatterI, modulus, flatterW)
}

// beamTables returns the span's mid-span moment wL²/8, deflection
// 5wL⁴/384EI and bending utilisation wL²/8/(W·f) under w (Roark; from
// memory).
func beamTables(span, w float64) (moment, deflection, utilisation float64) {
	moment = w * span * span / 8
	return moment, 5 * w * math.Pow(span, 4) / (384 * flatterE * flatterI), moment / (flatterModulus * flatterLimit)
}

func closeTo(t *testing.T, what string, got, want float64) {
	t.Helper()
	if math.Abs(got-want) > 1e-9*math.Max(1, math.Abs(want)) {
		t.Errorf("%s = %.12g, want %.12g", what, got, want)
	}
}

// hasPointer reports whether a problem of list points at path.
func hasPointer(list []protocol.Problem, path string) bool {
	for _, p := range list {
		if p.Path == path {
			return true
		}
	}
	return false
}

// TestNeverFlatterSolve checks solve's summaries of the failing beam:
// max_displacement and max_moment are the beam tables' mid-span values
// (inside the member, not at its nodes, where both are 0); utilisation
// and max_utilisation are the failing bending check. Without a section
// modulus the bending check cannot be made: utilisation is null,
// max_utilisation names no member and unchecked_members counts the beam,
// the unchecked list points at the section's section_modulus, and the
// moment and displacement summaries stay what they were.
func TestNeverFlatterSolve(t *testing.T) {
	moment, deflection, utilisation := beamTables(10, flatterW)
	for _, withModulus := range []bool{true, false} {
		out, err := call(t, protocol.MethodSolve, `{"cases":["w"],"model":`+failingBeam(withModulus)+`}`)
		if err != nil {
			t.Fatal(err)
		}
		res := out.(*protocol.SolveResult)
		c := res.Cases[0]
		closeTo(t, "max_displacement", c.MaxDisplacement.Value, deflection)
		closeTo(t, "max_moment", c.MaxMoment.Value, moment)
		if c.MaxDisplacement.At != "girder" || c.MaxDisplacement.Distance == nil || math.Abs(*c.MaxDisplacement.Distance-5) > 1e-9 ||
			c.MaxMoment.At != "girder" || c.MaxMoment.Distance == nil || math.Abs(*c.MaxMoment.Distance-5) > 1e-9 {
			t.Errorf("summaries at %+v and %+v, want the girder at 5 m", c.MaxDisplacement, c.MaxMoment)
		}
		if withModulus {
			if c.Utilisation[0] == nil || c.UncheckedMembers != 0 {
				t.Fatalf("utilisation %v with %d unchecked, want the bending check", c.Utilisation, c.UncheckedMembers)
			}
			closeTo(t, "utilisation", *c.Utilisation[0], utilisation)
			closeTo(t, "max_utilisation", c.MaxUtilisation.Value, utilisation)
			if c.MaxUtilisation.At != "girder" || c.AxialUtilisation != nil {
				t.Errorf("max_utilisation at %q, axial_utilisation %v: want the girder and no partial checks", c.MaxUtilisation.At, c.AxialUtilisation)
			}
			continue
		}
		if c.Utilisation[0] != nil || c.MaxUtilisation.At != "" || c.UncheckedMembers != 1 || c.Members[0].BendingUtilisation != nil {
			t.Errorf("without a section modulus: utilisation %v, max_utilisation %+v, unchecked_members %d, bending %v; want null, none, 1, null",
				c.Utilisation, c.MaxUtilisation, c.UncheckedMembers, c.Members[0].BendingUtilisation)
		}
		if !hasPointer(res.Unchecked, "/params/model/sections/0/section_modulus") {
			t.Errorf("unchecked %v does not point at the section's section_modulus", res.Unchecked)
		}
	}
}

// TestNeverFlatterLoadedBar checks a bar carrying its own weight: two
// bars of 5 m, A (0, 0) to B (4, 3) to C (8, 0), pinned at A and C,
// 100 kN down at B, A = 0.005 m², 77 kN/m³. Each bar weighs
// W = 77·0.005·5 = 1.925 kN, half of it reaching each end, and along the
// bar its axial component W·sin θ (sin θ = 3/5) changes the force
// linearly; by statics at B the bars carry −(100 + W)/(2 sin θ) there as
// a truss, so at the foot N = −(100 + W)/(2 sin θ) − (W/2)·sin θ =
// −85.515 kN (hand statics, common practice). The axial check is then
// |N|/(χ·A·fc) with χ from EN 1993-1-1:2005 §6.3.1.2 eq. (6.49), curve d
// (α = 0.76, Table 6.1), λ̄ = √(A·fc/Ncr), Ncr = π²EI/L². Each bar bends
// as a simple span under its weight's component across it, w·cosθ per
// unit length (cos θ = 4/5): M = w·cosθ·L²/8 = 0.9625 kN·m at mid-length
// (statics), which max_moment reports; the section gives no
// section_modulus, so the bending check is not made: utilisation stays
// null, axial_utilisation carries the axial part, and unchecked points at
// the section's section_modulus.
func TestNeverFlatterLoadedBar(t *testing.T) {
	const model = `{"dimension":2,"units":{"length":"m","force":"kN"},
"materials":[{"id":"steel","elastic_modulus":2.1e8,"tension_limit":2.35e5,"compression_limit":2.35e5,"weight_density":77}],
"sections":[{"id":"s","area":0.005,"second_moment":1e-4}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[4,3]},{"id":"C","at":[8,0]}],
"members":[{"id":"AB","ends":["A","B"],"material":"steel","section":"s","type":"bar"},{"id":"BC","ends":["B","C"],"material":"steel","section":"s","type":"bar"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"C","fix":["x","y"]}],
"load_cases":[{"id":"dead","self_weight":true,"loads":[{"node":"B","force":[0,-100]}]}]}`
	out, err := call(t, protocol.MethodSolve, `{"model":`+model+`}`)
	if err != nil {
		t.Fatal(err)
	}
	res := out.(*protocol.SolveResult)
	c := res.Cases[0]
	weight, sin := 77*0.005*5.0, 0.6
	foot := (100+weight)/(2*sin) + weight/2*sin
	squash, critical := 0.005*2.35e5, math.Pi*math.Pi*2.1e8*1e-4/25
	slenderness := math.Sqrt(squash / critical)
	phi := 0.5 * (1 + 0.76*(slenderness-0.2) + slenderness*slenderness)
	chi := 1 / (phi + math.Sqrt(phi*phi-slenderness*slenderness))
	closeTo(t, "axial force at A", c.AxialForces[0], -foot)
	if c.Utilisation[0] != nil || c.Utilisation[1] != nil || c.UncheckedMembers != 2 || c.MaxUtilisation.At != "" {
		t.Errorf("utilisation %v, unchecked_members %d, max_utilisation %+v: want null, 2, none", c.Utilisation, c.UncheckedMembers, c.MaxUtilisation)
	}
	if len(c.AxialUtilisation) != 2 || c.AxialUtilisation[0] == nil || c.AxialUtilisation[1] == nil {
		t.Fatalf("axial_utilisation %v, want both bars' axial checks", c.AxialUtilisation)
	}
	closeTo(t, "axial_utilisation", *c.AxialUtilisation[0], foot/(chi*squash))
	closeTo(t, "axial_utilisation (symmetry)", *c.AxialUtilisation[1], *c.AxialUtilisation[0])
	if p := "/params/model/sections/0/section_modulus"; !hasPointer(res.Unchecked, p) {
		t.Errorf("unchecked %v does not point at %s", res.Unchecked, p)
	}
	closeTo(t, "|max_moment|", math.Abs(c.MaxMoment.Value), 77*0.005*0.8*25/8)
	if c.MaxMoment.Distance == nil || math.Abs(*c.MaxMoment.Distance-2.5) > 1e-9 || c.Members[0] == nil {
		t.Errorf("max_moment %+v, members[0] %v: want mid-length of a bar with its results", c.MaxMoment, c.Members[0])
	}
}

// TestNeverFlatterSweep sweeps the failing beam's span over 10 m and 8 m:
// each step's max_displacement and max_utilisation are the beam tables'
// 5wL⁴/384EI and wL²/8/(W·f). Without a section modulus max_utilisation
// cannot be known: the step fails with a reason instead of giving 0,
// while max_displacement alone is still the tables' value.
func TestNeverFlatterSweep(t *testing.T) {
	sweep := func(model, metrics string) *protocol.SweepResult {
		out, err := call(t, protocol.MethodSweepParameter, `{"model":`+model+`,"cases":["w"],"parameters":{"name":"span","values":[10,8]},"metrics":`+metrics+`}`)
		if err != nil {
			t.Fatal(err)
		}
		return out.(*protocol.SweepResult)
	}
	res := sweep(failingBeam(true), `["max_displacement","max_utilisation"]`)
	for i, span := range []float64{10, 8} {
		_, deflection, utilisation := beamTables(span, flatterW)
		s := res.Steps[i]
		if s.Error != "" {
			t.Fatalf("step %d failed: %s", i, s.Error)
		}
		closeTo(t, fmt.Sprintf("step %d max_displacement", i), s.Metrics["max_displacement"], deflection)
		closeTo(t, fmt.Sprintf("step %d max_utilisation", i), s.Metrics["max_utilisation"], utilisation)
	}
	res = sweep(failingBeam(false), `["max_displacement","max_utilisation"]`)
	for i, s := range res.Steps {
		if _, ok := s.Metrics["max_utilisation"]; ok || s.Error == "" {
			t.Errorf("step %d without a section modulus: metrics %v, error %q; want a failed step", i, s.Metrics, s.Error)
		}
	}
	res = sweep(failingBeam(false), `["max_displacement"]`)
	_, deflection, _ := beamTables(10, flatterW)
	closeTo(t, "max_displacement without a section modulus", res.Steps[0].Metrics["max_displacement"], deflection)
}

// TestNeverFlatterEnvelope envelopes the failing beam's case and its
// combination 1.5 × w: the envelope's max_utilisation is the bending check
// under the combination, 1.5 × 1.064; without a section modulus it names
// no member and counts the beam unchecked.
func TestNeverFlatterEnvelope(t *testing.T) {
	_, _, utilisation := beamTables(10, flatterW)
	for _, withModulus := range []bool{true, false} {
		out, err := call(t, protocol.MethodSolve, `{"cases":["w","factored"],"envelope":{},"model":`+failingBeam(withModulus)+`}`)
		if err != nil {
			t.Fatal(err)
		}
		env := out.(*protocol.SolveResult).Envelope
		if env == nil {
			t.Fatal("no envelope")
		}
		if !withModulus {
			if env.MaxUtilisation.At != "" || env.UncheckedMembers != 1 {
				t.Errorf("without a section modulus: max_utilisation %+v, unchecked_members %d; want none and 1", env.MaxUtilisation, env.UncheckedMembers)
			}
			continue
		}
		closeTo(t, "envelope max_utilisation", env.MaxUtilisation.Value, 1.5*utilisation)
		if env.MaxUtilisation.At != "girder" || env.MaxUtilisation.Case != "factored" || env.UncheckedMembers != 0 {
			t.Errorf("envelope max_utilisation %+v with %d unchecked; want the girder under factored", env.MaxUtilisation, env.UncheckedMembers)
		}
	}
}

// TestNeverFlatterLoadPath checks that load-path never gives a bare 0 for
// the failing beam: its axial load path is 0 (no axial force), and the
// warning says that bending holds all the strain energy (a simply
// supported beam under transverse load has no axial force: statics) and
// gives the failing bending utilisation; with bars loaded across (the
// two bars under their own weight of TestNeverFlatterLoadedBar, here
// without a second moment) it says that the energy of their bending is
// not known.
func TestNeverFlatterLoadPath(t *testing.T) {
	out, err := call(t, protocol.MethodLoadPath, `{"model":`+failingBeam(true)+`}`)
	if err != nil {
		t.Fatal(err)
	}
	res := out.(*protocol.LoadPathResult)
	_, _, utilisation := beamTables(10, flatterW)
	if res.Cases[0].LoadPath != 0 || len(res.Warnings) == 0 ||
		!strings.Contains(res.Warnings[0], "100 % of the strain energy") ||
		!strings.Contains(res.Warnings[0], fmt.Sprintf("largest bending utilisation is %.3g", utilisation)) {
		t.Errorf("load path %g with warnings %q; want 0 with the bending share and utilisation", res.Cases[0].LoadPath, res.Warnings)
	}
	const bars = `{"dimension":2,"materials":[{"id":"steel","elastic_modulus":2.1e8,"weight_density":77}],"sections":[{"id":"s","area":0.005}],
"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[4,3]},{"id":"C","at":[8,0]}],
"members":[{"id":"AB","ends":["A","B"],"material":"steel","section":"s"},{"id":"BC","ends":["B","C"],"material":"steel","section":"s"}],
"supports":[{"node":"A","fix":["x","y"]},{"node":"C","fix":["x","y"]}],
"load_cases":[{"id":"dead","self_weight":true,"loads":[{"node":"B","force":[0,-100]}]}]}`
	out, err = call(t, protocol.MethodLoadPath, `{"model":`+bars+`}`)
	if err != nil {
		t.Fatal(err)
	}
	if w := out.(*protocol.LoadPathResult).Warnings; len(w) != 1 || !strings.Contains(w[0], "2 bars carry loads across them") {
		t.Errorf("warnings %q; want one saying the 2 bars' energy of bending is not known", w)
	}
}
