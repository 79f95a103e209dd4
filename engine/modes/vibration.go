package modes

import (
	"context"
	"errors"
	"fmt"
	"math"
	"time"

	"gonum.org/v1/gonum/floats"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/sparse"
	"gusset/engine/statics"
	"gusset/engine/stiffness"
)

// Vibration finds the natural frequencies of m nearest opt.Shift (an ω²;
// the lowest by default): the ω for which (K − ω²·M)·φ = 0 has a solution
// φ ≠ 0, with M the consistent mass of the members (material
// mass_density; see massLocal) plus the nodes' lumped masses in every
// translation. Freedoms without stiffness or supports that leave the
// structure free give modes of zero frequency, marked Mechanism: when K
// is singular the shift moves below zero by itself.
//
// It returns a *fault.Error of kind MissingData when nothing has mass,
// InvalidModel for a freedom with neither stiffness nor mass (and for the
// data stiffness.Solve refuses), NoSolution when opt.Shift lies beyond the
// lowest eigenvalue, and ctx.Err() when ctx is cancelled.
func Vibration(ctx context.Context, m *model.Model, opt Options) (*Result, error) {
	opt = opt.withDefaults()
	if err := refuseOneSided(m); err != nil {
		return nil, err
	}
	start := time.Now()
	mx, err := assembleFor(ctx, m, opt)
	if err != nil {
		return nil, err
	}
	res := &Result{Kind: KindVibration}
	mass, err := massMatrix(mx, m, res)
	if err != nil {
		return nil, err
	}
	res.Stats.Assemble = time.Since(start)
	auto := opt.Shift == 0
	pairs, err := solvePencil(ctx, mx, mass, opt, true, res)
	if se := (*shiftError)(nil); errors.As(err, &se) && auto {
		// K is singular: shift below zero so that K + s·M is definite.
		res.Stats.Factorisations++
		opt.Shift = -autoShift(mass)
		res.Warnings = append(res.Warnings, fault.Problem{Path: "/supports",
			Message: "the stiffness is singular (a mechanism, or supports that leave the structure free): its zero-frequency modes are among the results, marked mechanism"})
		pairs, err = solvePencil(ctx, mx, mass, opt, true, res)
	}
	if se := (*shiftError)(nil); errors.As(err, &se) {
		return nil, fault.New(fault.NoSolution, "K − %g·M is not positive definite: the shift lies at or beyond the lowest natural frequency; choose a lower one", opt.Shift)
	}
	if err != nil {
		return nil, err
	}
	diag := maxDiagonal(mass)
	rot := statics.RotationalNodes(m)
	r := influence(m, mx)
	res.TotalMass = make([]float64, m.Dim)
	mr := make([]float64, mx.K.N)
	for d := range m.Dim {
		mass.MulVec(mr, r[d])
		res.TotalMass[d] = floats.Dot(r[d], mr)
	}
	for _, p := range pairs {
		res.Modes = append(res.Modes, vibrationMode(m, mx, mass, rot, r, p, diag))
	}
	return res, nil
}

// vibrationMode builds the mode of the eigenpair p: its frequency,
// mass-normalised shape, participation factors and effective masses.
// A Rayleigh quotient below 1e-11 of the scaled stiffness's unit diagonal
// per unit of the largest scaled mass marks a mechanism (common practice:
// round-off leaves rigid motions near 1e-16).
func vibrationMode(m *model.Model, mx *stiffness.Matrices, mass *sparse.Matrix, rot []bool, r [][]float64, p eigenPair, diag float64) Mode {
	md := Mode{Residual: p.residual}
	omega2 := p.value
	if 2*omega2*diag <= 1e-11 {
		md.Mechanism = true
		omega2 = 0
	}
	md.Angular = math.Sqrt(omega2)
	md.Frequency = md.Angular / (2 * math.Pi)
	y := p.vector
	my := make([]float64, len(y))
	mass.MulVec(my, y)
	if norm := floats.Dot(y, my); norm > 0 {
		c := 1 / math.Sqrt(norm)
		floats.Scale(c, y)
		floats.Scale(c, my)
	}
	md.Displacements, md.Rotations = shape(m, mx, rot, y, false)
	sign := shapeSign(mx, y)
	md.Participation = make([]float64, m.Dim)
	md.EffectiveMass = make([]float64, m.Dim)
	for d := range m.Dim {
		g := sign * floats.Dot(r[d], my)
		md.Participation[d] = g
		md.EffectiveMass[d] = g * g
	}
	return md
}

// shapeSign is the sign shape gives the vector y (that of its largest
// unscaled component).
func shapeSign(mx *stiffness.Matrices, y []float64) float64 {
	big, sign := 0.0, 1.0
	for i, v := range y {
		if a := math.Abs(v * mx.Scale[i]); a > big {
			big, sign = a, math.Copysign(1, v)
		}
	}
	return sign
}

// massMatrix assembles M (scaled like mx.K) and records in res a warning
// for every material that members use without a mass_density.
func massMatrix(mx *stiffness.Matrices, m *model.Model, res *Result) (*sparse.Matrix, error) {
	mass := mx.NewMatrix()
	var local [144]float64
	warned := make([]bool, len(m.Materials))
	for e, mem := range m.Members {
		mat := m.Materials[mem.Material]
		if !mat.HasMassDensity {
			if !warned[mem.Material] {
				warned[mem.Material] = true
				res.Warnings = append(res.Warnings, fault.Problem{Path: fmt.Sprintf("/materials/%d/mass_density", mem.Material),
					Message: fmt.Sprintf("material %q has no mass_density: its members carry no mass here", mat.ID)})
			}
			continue
		}
		n := massLocal(local[:], m, e, mat.MassDensity)
		mx.AddMember(mass, m, e, local[:n*n])
	}
	for node, w := range m.NodeMasses {
		for c := range m.Dim {
			if eq := mx.Equation(node, c); eq >= 0 && w > 0 {
				mass.Val[mass.ColPtr[eq]] += w * mx.Scale[eq] * mx.Scale[eq]
			}
		}
	}
	if maxDiagonal(mass) == 0 {
		return nil, fault.At(fault.MissingData, "/materials", "nothing has mass: give the materials a mass_density (mass per volume: t/m³ with kN and m, 7.85 for steel) or the nodes a mass")
	}
	for _, eq := range mx.Unrestrained {
		if mass.Val[mass.ColPtr[eq]] == 0 {
			n := mx.Node[eq]
			return nil, fault.At(fault.InvalidModel, fmt.Sprintf("/nodes/%d", n),
				"node %q has neither stiffness nor mass in %s, so its motion there is undefined", m.NodeIDs[n], model.ComponentNames[mx.Component[eq]])
		}
	}
	return mass, nil
}

// maxDiagonal returns the largest diagonal entry of a (diagonal first in
// each column).
func maxDiagonal(a *sparse.Matrix) float64 {
	var d float64
	for j := range a.N {
		d = max(d, a.Val[a.ColPtr[j]])
	}
	return d
}

// autoShift returns s > 0 for the shift −s that makes K + s·M definite
// when K is singular: 1e-8 of the smallest ratio of the scaled stiffness's
// unit diagonal to a diagonal mass, so that the rigid motions' pivots (of
// order s·M) stay far above the factorisation's tolerance while the
// lowest elastic eigenvalues remain well apart from them (common
// practice).
func autoShift(mass *sparse.Matrix) float64 {
	return 1e-8 / maxDiagonal(mass)
}

// influence returns per direction d the vector of unit translations of
// the free freedoms in the scaled coordinates (D⁻¹ at equations of
// component d).
func influence(m *model.Model, mx *stiffness.Matrices) [][]float64 {
	r := make([][]float64, m.Dim)
	for d := range r {
		r[d] = make([]float64, mx.K.N)
	}
	axes := model.NodeAxes(m)
	for i, c := range mx.Component {
		switch {
		case c >= m.Dim:
		case axes != nil && axes[mx.Node[i]] != nil:
			// A node in a support's axes: a unit global translation
			// along d has the local component axes[c][d].
			for d := range m.Dim {
				r[d][i] = axes[mx.Node[i]][c][d] / mx.Scale[i]
			}
		default:
			r[c][i] = 1 / mx.Scale[i]
		}
	}
	return r
}
