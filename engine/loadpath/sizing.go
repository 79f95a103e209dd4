package loadpath

import (
	"fmt"
	"math"

	"gusset/engine/fault"
	"gusset/engine/model"
)

// DefaultZeroForce is the default of Options.ZeroForce.
const DefaultZeroForce = 1e-9

// Options controls Compute. The zero value computes load paths only.
type Options struct {
	// Size asks for member areas, volumes, mass and carbon. It needs the
	// tension limit of every material with a member in tension, the
	// compression limit of every material with a member in compression and,
	// with a declared Section family, their elastic moduli.
	Size bool
	// Section is the family compression members are checked for Euler
	// buckling with; the zero value means no buckling check.
	Section SectionFamily
	// MinimumArea is the least area any member gets when sizing (length²);
	// 0, the default, means none. Must not be negative.
	MinimumArea float64
	// FloorArea is the floor or deck area the structure serves (length²);
	// when positive, Totals.PerFloorArea is filled. Must not be negative.
	FloorArea float64
	// ZeroForce is the force, relative to the largest |N| of the same case,
	// at or below which a member counts as unloaded: it is not sized (so its
	// material needs no limit) and is totalled under Unloaded. It absorbs
	// the round-off of a solver on members that carry nothing. Zero means
	// DefaultZeroForce; must be in [0, 1).
	ZeroForce float64
}

func (o Options) check() error {
	if !(o.MinimumArea >= 0) || math.IsInf(o.MinimumArea, 1) {
		return &InputError{Path: "/options/minimum_area", Message: fmt.Sprintf("minimum area must be zero or positive and finite, not %g", o.MinimumArea)}
	}
	if !(o.FloorArea >= 0) || math.IsInf(o.FloorArea, 1) {
		return &InputError{Path: "/options/floor_area", Message: fmt.Sprintf("floor area must be zero or positive and finite, not %g", o.FloorArea)}
	}
	if !(o.ZeroForce >= 0 && o.ZeroForce < 1) {
		return &InputError{Path: "/options/zero_force", Message: fmt.Sprintf("zero-force threshold must be in [0, 1), not %g", o.ZeroForce)}
	}
	if _, ok, reason := o.Section.SectionCoefficient(); !ok {
		return &InputError{Path: "/options/section", Message: reason}
	}
	return nil
}

// Criterion tells what fixed a member's area.
type Criterion uint8

// The sizing criteria.
const (
	Unloaded    Criterion = iota // no force worth sizing for in any case: area 0 (or the minimum)
	Tension                      // axial force / tension limit
	Compression                  // |axial force| / compression limit
	Buckling                     // Euler buckling of the declared section family
	Minimum                      // Options.MinimumArea
)

var criterionNames = [...]string{"unloaded", "tension", "compression", "buckling", "minimum"}

// String returns the criterion's lower-case name.
func (c Criterion) String() string {
	if int(c) < len(criterionNames) {
		return criterionNames[c]
	}
	return fmt.Sprintf("criterion(%d)", int(c))
}

// limitProblems collects missing or bad material data, one problem per
// material and field.
type limitProblems struct {
	seen     map[string]bool
	problems []fault.Problem
	missing  bool
}

func (p *limitProblems) add(path string, missing bool, format string, args ...any) {
	if p.seen[path] {
		return
	}
	if p.seen == nil {
		p.seen = make(map[string]bool)
	}
	p.seen[path] = true
	p.missing = p.missing || missing
	p.problems = append(p.problems, fault.Problem{Path: path, Message: fmt.Sprintf(format, args...)})
}

// limit returns the material's limit v named field, or records why it
// cannot be used and returns 0.
func (p *limitProblems) limit(m *model.Model, mi int, v float64, field, what string, member int, caseID string) float64 {
	if v > 0 && !math.IsInf(v, 1) {
		return v
	}
	path := fmt.Sprintf("/materials/%d/%s", mi, field)
	mat, mem := m.Materials[mi].ID, m.Members[member].ID
	if v == 0 {
		p.add(path, true, "material %q has no %s; member %q needs it in case %q", mat, what, mem, caseID)
	} else {
		p.add(path, false, "material %q has %s %g; it must be positive and finite", mat, what, v)
	}
	return 0
}

// size fills the sizing fields of res: for each member, the area each case
// needs, the largest of them, and the quantities that follow.
func size(m *model.Model, cases []Case, opt Options, zero []float64, res *Result) error {
	c, _, _ := opt.Section.SectionCoefficient()
	kgPerForce, ok := KilogramsPerForceUnit(m.Units)
	if !ok {
		return fault.At(fault.InvalidModel, "/units/force", "unknown force unit %q", m.Units.Force)
	}
	nm := len(m.Members)
	res.Sized = true
	res.Area = make([]float64, nm)
	res.Volume = make([]float64, nm)
	res.Mass = make([]float64, nm)
	res.Criterion = make([]Criterion, nm)

	var bad limitProblems
	for e := range m.Members {
		mem := &m.Members[e]
		L := res.Length[e]
		mat := &m.Materials[mem.Material]
		k := mem.BucklingFactor
		if k == 0 {
			k = 1
		}
		gov, govArea, govCrit := -1, 0.0, Unloaded
		for ci := range cases {
			n := cases[ci].AxialForce[e]
			if math.Abs(n) <= zero[ci] {
				continue
			}
			area, crit, ok := caseArea(m, e, n, cases[ci].ID, c, L, k, &bad)
			if !ok {
				continue
			}
			if gov < 0 || area > govArea {
				gov, govArea, govCrit = ci, area, crit
			}
		}
		if gov < 0 {
			gov = largestForceCase(cases, e)
		}
		if govArea < opt.MinimumArea {
			govArea, govCrit = opt.MinimumArea, Minimum
		}
		res.Governing[e] = gov
		res.Area[e] = govArea
		res.Criterion[e] = govCrit
		res.Volume[e] = govArea * L
		res.Mass[e] = mat.WeightDensity * res.Volume[e] * kgPerForce
	}
	if len(bad.problems) > 0 {
		kind, msg := fault.InvalidModel, "material data unfit for sizing"
		if bad.missing {
			kind, msg = fault.MissingData, "sizing needs material data the model lacks"
		}
		return &fault.Error{Kind: kind, Message: msg, Problems: bad.problems}
	}
	for ci := range cases {
		stressVolumes(m, &cases[ci], res.Length, &res.Cases[ci])
	}
	return nil
}

// caseArea returns the area member e needs (in the square of the model's
// length unit) for axial force n (tension +, nonzero) in case caseID, and the
// criterion that sets it: the tension or compression limit, or Euler buckling
// with section coefficient c (when c > 0), length L and effective-length
// factor k. ok is false when a material value or k is missing or unfit; the
// problem is then recorded in bad.
func caseArea(m *model.Model, e int, n float64, caseID string, c, L, k float64, bad *limitProblems) (area float64, crit Criterion, ok bool) {
	mem := &m.Members[e]
	mi := mem.Material
	mat := &m.Materials[mi]
	if n > 0 {
		sigma := bad.limit(m, mi, mat.TensionLimit, "tension_limit", "tension limit", e, caseID)
		if sigma == 0 {
			return 0, Unloaded, false
		}
		return n / sigma, Tension, true
	}
	sigma := bad.limit(m, mi, mat.CompressionLimit, "compression_limit", "compression limit", e, caseID)
	if sigma == 0 {
		return 0, Unloaded, false
	}
	area, crit = -n/sigma, Compression
	if c > 0 {
		E := bad.limit(m, mi, mat.ElasticModulus, "elastic_modulus", "elastic modulus", e, caseID)
		if E == 0 {
			return 0, Unloaded, false
		}
		if !(k > 0) || math.IsInf(k, 1) {
			bad.add(fmt.Sprintf("/members/%d/buckling_factor", e), false,
				"member %q has effective-length factor %g; it must be positive", mem.ID, k)
			return 0, Unloaded, false
		}
		if ab := BucklingArea(-n, E, c, L, k); ab > area {
			area, crit = ab, Buckling
		}
	}
	return area, crit, true
}

// largestForceCase returns the first case in which member e carries its
// largest axial force by magnitude (case 0 when there is only one).
func largestForceCase(cases []Case, e int) int {
	gov := 0
	for ci := 1; ci < len(cases); ci++ {
		if math.Abs(cases[ci].AxialForce[e]) > math.Abs(cases[gov].AxialForce[e]) {
			gov = ci
		}
	}
	return gov
}

// stressVolumes fills the case's direct stress-limited volume and, when all
// members share their limits, the volume from Z_T and M by the theorem.
// Members whose material lacks the limit their force needs (possible only
// for forces below the zero threshold) are left out of the direct sum.
func stressVolumes(m *model.Model, c *Case, lengths []float64, r *CaseResult) {
	for e, n := range c.AxialForce {
		mat := &m.Materials[m.Members[e].Material]
		sigma := mat.CompressionLimit
		if n > 0 {
			sigma = mat.TensionLimit
		}
		if n != 0 && sigma > 0 {
			r.StressVolume += math.Abs(n) * lengths[e] / sigma
		}
	}
	if len(m.Members) == 0 {
		return
	}
	first := &m.Materials[m.Members[0].Material]
	st, sc := first.TensionLimit, first.CompressionLimit
	if !(st > 0 && sc > 0) {
		return
	}
	for e := range m.Members {
		mat := &m.Materials[m.Members[e].Material]
		if mat.TensionLimit != st || mat.CompressionLimit != sc {
			return
		}
	}
	r.TheoremVolume = r.TensionLoadPath/st + (r.TensionLoadPath-r.Constant)/sc
	r.HasTheoremVolume = true
}
