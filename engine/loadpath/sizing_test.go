package loadpath

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// TestEulerSizing checks compression sizing against Euler's buckling load
// N_cr = π²EI/(kL)² (L. Euler, 1744; S. P. Timoshenko & J. M. Gere, Theory
// of Elastic Stability, 2nd ed., 1961, §2.1, from memory), with I and A of
// the actual shapes (Roark's Formulas for Stress and Strain, table A.1, from
// memory): a bar loaded to exactly its Euler load must be given exactly the
// area of the shape that produced that load. A stocky bar is sized by its
// compression limit instead, the lesser capacity governing.
func TestEulerSizing(t *testing.T) {
	const E = 210000 // N/mm², structural steel (common practice)
	circle := func(d float64) (A, I float64) { return math.Pi * d * d / 4, math.Pi * math.Pow(d, 4) / 64 }
	square := func(b float64) (A, I float64) { return b * b, math.Pow(b, 4) / 12 }
	tube := func(D, t float64) (A, I float64) {
		d := D - 2*t
		return math.Pi * (D*D - d*d) / 4, math.Pi * (math.Pow(D, 4) - math.Pow(d, 4)) / 64
	}
	euler := func(I, k, L float64) float64 { return math.Pi * math.Pi * E * I / (k * L * k * L) }
	for _, tc := range []struct {
		name      string
		family    SectionFamily
		L, k      float64
		A, I      float64 // the shape that sets the force
		sigmaC    float64
		force     float64 // 0: the Euler load of the shape
		wantArea  float64 // 0: the shape's area
		wantCrit  Criterion
		tolerance float64
	}{
		{name: "round d=20 L=1000", family: SectionFamily{Shape: ShapeSolidRound}, L: 1000, k: 1, sigmaC: 1e9, wantCrit: Buckling, tolerance: 1e-13},
		{name: "square b=30 L=2000 k=0.7", family: SectionFamily{Shape: ShapeSolidSquare}, L: 2000, k: 0.7, sigmaC: 1e9, wantCrit: Buckling, tolerance: 1e-13},
		{name: "tube 100x5 L=3000", family: SectionFamily{Shape: ShapeTube, DiameterToThickness: 20}, L: 3000, k: 1, sigmaC: 1e9, wantCrit: Buckling, tolerance: 1e-13},
		{name: "tube 168.3x8 L=2500 k=2", family: SectionFamily{Shape: ShapeTube, DiameterToThickness: 168.3 / 8}, L: 2500, k: 2, sigmaC: 1e9, wantCrit: Buckling, tolerance: 1e-13},
		{name: "given c=0.5 A=400", family: SectionFamily{Coefficient: 0.5}, L: 1500, k: 1, A: 400, I: 0.5 * 400 * 400, sigmaC: 1e9, wantCrit: Buckling, tolerance: 1e-13},
		// A 100 mm bar at 10 kN: the yield area 10000/235 = 42.55 mm²
		// (d = 7.36 mm) has N_cr = π²·E·(πd⁴/64)/100² ≈ 29.8 kN > 10 kN,
		// so the compression limit governs.
		{name: "stocky round", family: SectionFamily{Shape: ShapeSolidRound}, L: 100, k: 1, sigmaC: 235, force: 10000, wantArea: 10000.0 / 235, wantCrit: Compression, tolerance: 1e-14},
	} {
		t.Run(tc.name, func(t *testing.T) {
			A, I := tc.A, tc.I
			switch {
			case A != 0:
			case tc.family.Shape == ShapeSolidRound:
				A, I = circle(20)
			case tc.family.Shape == ShapeSolidSquare:
				A, I = square(30)
			case tc.family.DiameterToThickness == 20:
				A, I = tube(100, 5)
			default:
				A, I = tube(168.3, 8)
			}
			force, want := tc.force, tc.wantArea
			if force == 0 {
				force = euler(I, tc.k, tc.L)
			}
			if want == 0 {
				want = A
			}
			mat := model.Material{ID: "steel", ElasticModulus: E, TensionLimit: 235, CompressionLimit: tc.sigmaC}
			m := newModel(2, [][]float64{{0, 0}, {tc.L, 0}}, [][2]int{{0, 1}}, mat)
			m.Units = model.UnitsSpec{Length: "mm", Force: "N"}
			m.Members[0].BucklingFactor = tc.k
			res, err := Compute(m, []Case{{ID: "c", AxialForce: []float64{-force}}}, Options{Size: true, Section: tc.family})
			if err != nil {
				t.Fatal(err)
			}
			if !scalar.EqualWithinAbsOrRel(res.Area[0], want, 0, tc.tolerance) || res.Criterion[0] != tc.wantCrit {
				t.Errorf("area %.15g (%v), want %.15g (%v)", res.Area[0], res.Criterion[0], want, tc.wantCrit)
			}
			if !scalar.EqualWithinAbsOrRel(res.Volume[0], want*tc.L, 0, tc.tolerance) {
				t.Errorf("volume %g, want %g", res.Volume[0], want*tc.L)
			}
		})
	}
}

// TestMassUnits sizes one steel tie in several unit systems. In kN and m: N
// = 235 kN at a tension limit of 235 MPa needs A = 1e-3 m²; over 2 m that is
// 2e-3 m³, weighing 77 kN/m³ × 2e-3 m³ = 154 N, a mass of 154/9.80665 kg
// (standard gravity, 3rd CGPM 1901) and, at 1.5 kg CO2e/kg, 1.5 times that
// in carbon. The other systems convert every input by the exact
// definitions 1 in = 0.0254 m, 1 ft = 0.3048 m, 1 lbf = 4.4482216152605 N,
// 1 kip = 1000 lbf (B. N. Taylor & A. Thompson, NIST SP 811, 2008,
// appendix B, from memory); mass and carbon must not change.
func TestMassUnits(t *testing.T) {
	const (
		wantMass   = 154 / 9.80665
		wantCarbon = 1.5 * wantMass
	)
	metres := map[string]float64{"m": 1, "cm": 0.01, "mm": 0.001, "ft": 0.3048, "in": 0.0254}
	newtons := map[string]float64{"N": 1, "kN": 1e3, "MN": 1e6, "lbf": 4.4482216152605, "kip": 4448.2216152605}
	for lu, lm := range metres {
		for fu, fn := range newtons {
			toF := 1e3 / fn // kN -> force unit
			toL := 1 / lm   // m -> length unit
			mat := model.Material{ID: "steel", ElasticModulus: 2.1e8 * toF / (toL * toL),
				TensionLimit: 2.35e5 * toF / (toL * toL), CompressionLimit: 2.35e5 * toF / (toL * toL),
				WeightDensity: 77 * toF / (toL * toL * toL), CarbonFactor: 1.5, HasCarbonFactor: true}
			m := newModel(2, [][]float64{{0, 0}, {2 * toL, 0}}, [][2]int{{0, 1}}, mat)
			m.Units = model.UnitsSpec{Length: lu, Force: fu}
			floor := 10 * toL * toL
			res, err := Compute(m, []Case{{ID: "c", AxialForce: []float64{235 * toF}}}, Options{Size: true, FloorArea: floor})
			if err != nil {
				t.Fatal(err)
			}
			a := res.Totals.All
			const tol = 1e-12
			if !scalar.EqualWithinAbsOrRel(res.Area[0], 1e-3*toL*toL, 0, tol) ||
				!scalar.EqualWithinAbsOrRel(a.Volume, 2e-3*toL*toL*toL, 0, tol) ||
				!scalar.EqualWithinAbsOrRel(a.Mass, wantMass, 0, tol) ||
				!scalar.EqualWithinAbsOrRel(a.Carbon, wantCarbon, 0, tol) {
				t.Errorf("%s/%s: area %g volume %g mass %g carbon %g", lu, fu, res.Area[0], a.Volume, a.Mass, a.Carbon)
			}
			if p := res.Totals.PerFloorArea; p == nil || !scalar.EqualWithinAbsOrRel(p.Mass, wantMass/floor, 0, tol) {
				t.Errorf("%s/%s: per floor area %+v", lu, fu, p)
			}
			if res.Totals.Tension != a || res.Totals.Compression != (Quantity{}) {
				t.Errorf("%s/%s: split %+v / %+v", lu, fu, res.Totals.Tension, res.Totals.Compression)
			}
		}
	}
}

// TestEnvelope sizes the two-bar truss (a = h = 1, L = √2) for two cases,
// with a tie between the supports that carries nothing. Hand statics (see
// twoBar): a downward load P = 10 puts both bars in compression
// P·L/(2h) = 5√2; a horizontal load H = 20 at the apex puts the left bar in
// tension H·L/(2a) = 10√2 and the right one in compression 10√2 (joint
// equilibrium at the apex). With σ_t = 400, σ_c = 100: the left bar needs
// 5√2/100 for the downward case but only 10√2/400 for the side case, so the
// downward case governs it although its force is smaller; the right bar
// needs 10√2/100 for the side case. The tie gets the minimum area.
func TestEnvelope(t *testing.T) {
	mat := model.Material{ID: "m", ElasticModulus: 1e8, TensionLimit: 400, CompressionLimit: 100, WeightDensity: 9.80665e-3}
	m := newModel(2, [][]float64{{-1, 0}, {1, 0}, {0, 1}}, [][2]int{{0, 2}, {1, 2}, {0, 1}}, mat)
	r2 := math.Sqrt2
	cases := []Case{
		{ID: "down", AxialForce: []float64{-5 * r2, -5 * r2, 0}, External: [][]float64{{5, 5}, {-5, 5}, {0, -10}}},
		{ID: "side", AxialForce: []float64{10 * r2, -10 * r2, 0}, External: [][]float64{{-10, -10}, {-10, 10}, {20, 0}}},
	}
	res, err := Compute(m, cases, Options{Size: true, MinimumArea: 0.01})
	if err != nil {
		t.Fatal(err)
	}
	wantArea := []float64{5 * r2 / 100, 10 * r2 / 100, 0.01}
	wantCase := []string{"down", "side", "down"}
	wantCrit := []Criterion{Compression, Compression, Minimum}
	wantForce := []float64{-5 * r2, -10 * r2, 0}
	for e := range wantArea {
		if !scalar.EqualWithinAbsOrRel(res.Area[e], wantArea[e], 0, 1e-14) || res.GoverningCase[e] != wantCase[e] ||
			res.Criterion[e] != wantCrit[e] || res.Force[e] != wantForce[e] {
			t.Errorf("member %d: area %g case %q crit %v force %g, want %g %q %v %g", e,
				res.Area[e], res.GoverningCase[e], res.Criterion[e], res.Force[e], wantArea[e], wantCase[e], wantCrit[e], wantForce[e])
		}
	}
	wantCompression := (wantArea[0] + wantArea[1]) * r2
	if !scalar.EqualWithinAbsOrRel(res.Totals.Compression.Volume, wantCompression, 0, 1e-14) ||
		!scalar.EqualWithinAbsOrRel(res.Totals.Unloaded.Volume, 0.02, 0, 1e-14) ||
		res.Totals.Tension.Volume != 0 ||
		!scalar.EqualWithinAbsOrRel(res.Totals.All.Volume, wantCompression+0.02, 0, 1e-14) {
		t.Errorf("totals %+v", res.Totals)
	}
	// Weight density 9.80665e-3 kN/m³ is 1 kg/m³.
	if !scalar.EqualWithinAbsOrRel(res.Totals.All.Mass, res.Totals.All.Volume, 0, 1e-12) {
		t.Errorf("mass %g, want %g", res.Totals.All.Mass, res.Totals.All.Volume)
	}
	// No carbon factor: the material is named.
	if len(res.Totals.CarbonMissing) != 1 || res.Totals.CarbonMissing[0] != "m" || res.Totals.All.Carbon != 0 {
		t.Errorf("carbon %g, missing %v", res.Totals.All.Carbon, res.Totals.CarbonMissing)
	}
	// Both cases still satisfy Maxwell's theorem (Maxwell 1870).
	for _, c := range res.Cases {
		if c.RelativeResidual > 1e-15 {
			t.Errorf("case %s: residual %g", c.ID, c.RelativeResidual)
		}
	}
}

// TestTheoremVolume checks the volume from the tension members and M alone,
// V = Z_T/σ_t + (Z_T − M)/σ_c, which follows from Maxwell's theorem
// Z_C = Z_T − M (Maxwell 1870) and becomes (2·Z_T − M)/σ for equal limits,
// against the direct sum Σ|N|·L/σ on random equilibrium trusses; with
// equal limits, no buckling and no minimum area, the sized volume equals
// both.
func TestTheoremVolume(t *testing.T) {
	for seed := uint64(1); seed <= 6; seed++ {
		dim := 2 + int(seed%2)
		rng := rand.New(rand.NewPCG(seed, 3))
		m, fixed, loads := randomTruss(rng, dim, 30, 10)
		c := equilibrium(t, m, fixed, loads)
		for _, limits := range [][2]float64{{2.35e5, 2.35e5}, {3e5, 1.2e5}} {
			m.Materials[0].TensionLimit, m.Materials[0].CompressionLimit = limits[0], limits[1]
			res, err := Compute(m, []Case{c}, Options{Size: true, ZeroForce: 1e-300})
			if err != nil {
				t.Fatal(err)
			}
			r := res.Cases[0]
			if !r.HasTheoremVolume || !scalar.EqualWithinAbsOrRel(r.TheoremVolume, r.StressVolume, 0, 1e-12) {
				t.Errorf("seed %d limits %v: theorem volume %g (%v), direct %g", seed, limits, r.TheoremVolume, r.HasTheoremVolume, r.StressVolume)
			}
			if limits[0] == limits[1] {
				twoZtMinusM := (2*r.TensionLoadPath - r.Constant) / limits[0]
				if !scalar.EqualWithinAbsOrRel(res.Totals.All.Volume, twoZtMinusM, 0, 1e-12) {
					t.Errorf("seed %d: sized volume %g, (2Z_T − M)/σ = %g", seed, res.Totals.All.Volume, twoZtMinusM)
				}
			}
		}
	}
}

// TestBadInput checks that every defect is reported with the right kind of
// error and a pointer to it, and that data not needed is not asked for.
func TestBadInput(t *testing.T) {
	_, good := twoBar(1, 1, 10) // both bars in compression
	noTension := steel
	noTension.TensionLimit = 0
	noCompression := steel
	noCompression.CompressionLimit = 0
	noE := steel
	noE.ElasticModulus = 0
	negative := steel
	negative.CompressionLimit = -5
	two := func(mat model.Material) *model.Model {
		return newModel(2, [][]float64{{-1, 0}, {1, 0}, {0, 1}}, [][2]int{{0, 2}, {1, 2}}, mat)
	}
	tension := Case{ID: "lift", AxialForce: []float64{1, 1}}
	for _, tc := range []struct {
		name  string
		m     *model.Model
		cases []Case
		opt   Options
		kind  fault.Kind // 0: an InputError
		path  string     // "" means no error expected
	}{
		{"tension limit not needed in compression", two(noTension), []Case{good}, Options{Size: true}, 0, ""},
		{"tension limit missing", two(noTension), []Case{good, tension}, Options{Size: true}, fault.MissingData, "/materials/0/tension_limit"},
		{"compression limit missing", two(noCompression), []Case{good}, Options{Size: true}, fault.MissingData, "/materials/0/compression_limit"},
		{"limits not needed without sizing", two(noCompression), []Case{good}, Options{}, 0, ""},
		{"modulus missing for buckling", two(noE), []Case{good}, Options{Size: true, Section: SectionFamily{Shape: ShapeSolidRound}}, fault.MissingData, "/materials/0/elastic_modulus"},
		{"modulus not needed without buckling", two(noE), []Case{good}, Options{Size: true}, 0, ""},
		{"negative limit", two(negative), []Case{good}, Options{Size: true}, fault.InvalidModel, "/materials/0/compression_limit"},
		{"no cases", two(steel), nil, Options{}, 0, "/cases"},
		{"short forces", two(steel), []Case{{ID: "x", AxialForce: []float64{1}}}, Options{}, 0, "/cases/0/axial_force"},
		{"NaN force", two(steel), []Case{good, {ID: "x", AxialForce: []float64{1, math.NaN()}}}, Options{}, 0, "/cases/1/axial_force/1"},
		{"external count", two(steel), []Case{{ID: "x", AxialForce: []float64{1, 1}, External: [][]float64{{0, 0}}}}, Options{}, 0, "/cases/0/external"},
		{"external dimension", two(steel), []Case{{ID: "x", AxialForce: []float64{1, 1}, External: [][]float64{nil, nil, {0, 0, 1}}}}, Options{}, 0, "/cases/0/external/2"},
		{"infinite external", two(steel), []Case{{ID: "x", AxialForce: []float64{1, 1}, External: [][]float64{nil, {math.Inf(1), 0}, nil}}}, Options{}, 0, "/cases/0/external/1"},
		{"thick tube", two(steel), []Case{good}, Options{Size: true, Section: SectionFamily{Shape: ShapeTube, DiameterToThickness: 1.5}}, 0, "/options/section"},
		{"unknown shape", two(steel), []Case{good}, Options{Size: true, Section: SectionFamily{Shape: "angle"}}, 0, "/options/section"},
		{"negative minimum area", two(steel), []Case{good}, Options{Size: true, MinimumArea: -1}, 0, "/options/minimum_area"},
		{"negative floor area", two(steel), []Case{good}, Options{Size: true, FloorArea: -1}, 0, "/options/floor_area"},
		{"zero-force threshold 1", two(steel), []Case{good}, Options{ZeroForce: 1}, 0, "/options/zero_force"},
		{"zero-length member", newModel(2, [][]float64{{0, 0}, {1, 0}, {1, 0}}, [][2]int{{0, 1}, {1, 2}}), []Case{good}, Options{}, fault.InvalidModel, "/members/1"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			res, err := Compute(tc.m, tc.cases, tc.opt)
			if tc.path == "" {
				if err != nil || res == nil {
					t.Fatalf("unexpected error %v", err)
				}
				return
			}
			if err == nil {
				t.Fatal("no error")
			}
			if tc.kind == 0 {
				var ie *InputError
				if !errors.As(err, &ie) || !errors.Is(err, ErrInvalidInput) || ie.Path != tc.path {
					t.Fatalf("got %v, want an input error at %s", err, tc.path)
				}
				return
			}
			fe, ok := fault.As(err)
			if !ok || fe.Kind != tc.kind || len(fe.Problems) == 0 || fe.Problems[0].Path != tc.path {
				t.Fatalf("got %#v, want kind %v at %s", err, tc.kind, tc.path)
			}
			if !strings.Contains(fe.Error(), `"steel"`) && tc.kind == fault.MissingData {
				t.Errorf("message does not name the material: %s", fe.Error())
			}
		})
	}
}

// TestUnknownUnit checks that sizing refuses a force unit it cannot
// convert to kilograms.
func TestUnknownUnit(t *testing.T) {
	m, c := twoBar(1, 1, 1)
	m.Units.Force = "tonf"
	_, err := Compute(m, []Case{c}, Options{Size: true})
	if fe, ok := fault.As(err); !ok || fe.Problems[0].Path != "/units/force" {
		t.Fatalf("got %v", err)
	}
}
