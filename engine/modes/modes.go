package modes

import (
	"context"
	"errors"
	"fmt"
	"math"
	"time"

	"gusset/engine/fault"
	"gusset/engine/model"
	"gusset/engine/progress"
	"gusset/engine/sparse"
	"gusset/engine/statics"
	"gusset/engine/stiffness"
)

// Kind tells the two eigenproblems apart.
type Kind string

// The kinds of modal analysis.
const (
	KindBuckling  Kind = "buckling"  // (K + λ·K_G)·φ = 0
	KindVibration Kind = "vibration" // (K − ω²·M)·φ = 0
)

// Defaults of Options.
const (
	DefaultCount     = 6
	DefaultTolerance = 1e-10
)

// Options configures Buckling and Vibration. The zero value is ready to
// use.
type Options struct {
	// Count is the number of modes wanted; 0 means DefaultCount. It is cut
	// to the number of unconstrained freedoms.
	Count int
	// Case names the load case or combination whose axial forces make the
	// geometric stiffness (Buckling); "" means the first case, or the
	// first combination when there are no cases.
	Case string
	// Shift is the centre of the spectral transformation: a load factor
	// (Buckling) or an eigenvalue ω² in (rad/s)² (Vibration). The modes
	// nearest it are found. K − Shift·B must be positive definite: a
	// shift beyond the first critical factor (or first frequency) is an
	// error. 0 means none.
	Shift float64
	// AboveShift seeks only the factors above Shift (Buckling): with the
	// shift 0, the least positive factors, even where load reversals
	// (negative factors) lie nearer zero, as they do for a double-layer
	// grid supported along its top layer's edges, whose bottom layer has
	// free edges. The least positive factor is then Critical whenever the
	// Lanczos process converges. Vibration seeks only those anyway.
	AboveShift bool
	// Tolerance is the largest accepted residual, the backward error
	// ‖K·φ − λ·B·φ‖ / ((‖K‖ + |λ|·‖B‖)·‖φ‖) of each mode on the scaled
	// matrices; 0 means DefaultTolerance.
	Tolerance float64
	// MaxBasis bounds the Lanczos basis (which holds 2·MaxBasis vectors
	// of the freedoms' length); 0 means max(3·Count + 20, 40). A full
	// basis restarts thick, keeping its best Ritz vectors.
	MaxBasis int
	// MaxIterations bounds the Lanczos steps (one solve each); 0 means
	// 30·Count + 200.
	MaxIterations int
	// Workers bounds the goroutines of assembly and factorisation; 0
	// means GOMAXPROCS. Results do not depend on it.
	Workers int
	// Reporter receives the stages of the static solve (Buckling),
	// "assembling", "factorising" and "lanczos" (done counts basis
	// vectors); nil reports nothing.
	Reporter progress.Reporter
	// Analysis, when not nil, is a stiffness.NewAnalysis of m's topology
	// (a sweep holds one for all its steps) whose numbering, pattern and
	// order are reused rather than worked out again. Results do not
	// depend on it.
	Analysis *stiffness.Analysis
}

func (opt Options) withDefaults() Options {
	if opt.Count <= 0 {
		opt.Count = DefaultCount
	}
	if opt.Tolerance <= 0 {
		opt.Tolerance = DefaultTolerance
	}
	if opt.MaxBasis <= 0 {
		opt.MaxBasis = max(3*opt.Count+20, 40)
	}
	if opt.MaxIterations <= 0 {
		opt.MaxIterations = 30*opt.Count + 200
	}
	return opt
}

// Mode is one eigenpair.
type Mode struct {
	// Factor is the critical load factor λ (Buckling): the case's loads
	// times λ bring the structure to bifurcation. Negative means the loads
	// reversed (LoadReversal).
	Factor       float64
	LoadReversal bool
	// Angular (rad/s) and Frequency (Hz) are ω and ω/2π (Vibration).
	Angular, Frequency float64
	// Mechanism marks a vibration mode of zero frequency: a rigid-body
	// motion or mechanism that the supports leave free.
	Mechanism bool
	// Displacements holds Dim translations per node and Rotations per node
	// one rotation (2D) or three (3D), nil at a node no beam touches; fixed
	// freedoms are 0. Buckling shapes are scaled to a largest translation
	// of 1 (a rotation when no node translates); vibration shapes are
	// mass-normalised (φᵀ·M·φ = 1, length per √mass). The sign is chosen
	// so that the largest component is positive.
	Displacements [][]float64
	Rotations     [][]float64
	// Residual is the backward error ‖K·φ − λ·B·φ‖ / ((‖K‖ + |λ|·‖B‖)·‖φ‖)
	// on the matrices scaled to K's unit diagonal (B = −K_G or M): the
	// relative change of the matrices that makes the mode exact.
	Residual float64
	// Participation holds per direction (x, y, (z)) the participation
	// factor Γ = φᵀ·M·r of the unit translation r of every free node, and
	// EffectiveMass its effective modal mass Γ² (Vibration only).
	Participation []float64
	EffectiveMass []float64
}

// Result is the outcome of Buckling or Vibration.
type Result struct {
	Kind Kind
	// Case is the load case or combination analysed (Buckling).
	Case string
	// Modes holds the modes nearest the shift, nearest first.
	Modes []Mode
	// Critical is the least positive load factor among Modes (Buckling);
	// HasCritical is false when none is positive.
	Critical    float64
	HasCritical bool
	// TotalMass holds per direction the mass that moves with the free
	// freedoms (the sum the effective masses approach) (Vibration).
	TotalMass []float64
	// Warnings locate what the analysis does not cover, each with a JSON
	// pointer into the model.
	Warnings []fault.Problem
	Stats    Stats
}

// Stats describes the work done; the times vary from run to run.
type Stats struct {
	Equations      int
	Iterations     int // Lanczos steps (one solve each)
	Solves         int // solves with the factor
	Restarts       int
	Factorisations int  // of the shifted matrix K − σ·B (the static solve's own not counted)
	Converged      bool // every mode met the tolerance
	Shift          float64
	Assemble       time.Duration
	Factor         time.Duration
	Lanczos        time.Duration
}

// Buckling finds the critical load factors of the case opt.Case of m
// nearest opt.Shift: the λ for which (K + λ·K_G)·φ = 0 has a solution φ ≠
// 0, with K_G the geometric stiffness of the case's axial forces (see
// geometricLocal). It is a linear bifurcation analysis: imperfections,
// nonlinearity and the design codes govern real design.
//
// It returns the errors of stiffness.Solve for the case (a mechanism is
// *fault.Error of kind Unstable), a *fault.Error of kind NoSolution when
// the case produces no axial force or the shift lies beyond a critical
// factor, and ctx.Err() when ctx is cancelled.
func Buckling(ctx context.Context, m *model.Model, opt Options) (*Result, error) {
	opt = opt.withDefaults()
	if err := refuseOneSided(m); err != nil {
		return nil, err
	}
	caseID, err := defaultCase(m, opt.Case)
	if err != nil {
		return nil, err
	}
	// One analysis of the topology serves the static solve and the
	// eigenvalue problem: the matrix is ordered once.
	an := analysisFor(m, opt, stiffness.Options{Cases: []string{caseID}, Workers: opt.Workers,
		Reporter: opt.Reporter, SkipCondition: true, StabilityLimit: -1})
	sol, err := an.Solve(ctx, m)
	if err != nil {
		return nil, err
	}
	start := time.Now()
	mx, err := an.Matrices(ctx, m)
	if err != nil {
		return nil, err
	}
	b, loaded := geometric(mx, m, sol.Cases[0].EndForces)
	if !loaded {
		return nil, fault.New(fault.NoSolution, "case %q produces no axial force, so nothing can buckle under it", caseID)
	}
	res := &Result{Kind: KindBuckling, Case: caseID, Warnings: bucklingWarnings(m)}
	res.Stats.Assemble = time.Since(start)
	pairs, err := solvePencil(ctx, mx, b, opt, opt.AboveShift, res)
	if se := (*shiftError)(nil); errors.As(err, &se) {
		return nil, fault.New(fault.NoSolution, "K + %g·K_G is not positive definite: the shift %g lies at or beyond a critical load factor; choose one nearer zero", opt.Shift, opt.Shift)
	}
	if err != nil {
		return nil, err
	}
	rot := statics.RotationalNodes(m)
	for _, p := range pairs {
		md := Mode{Factor: p.value, LoadReversal: p.value < 0, Residual: p.residual}
		md.Displacements, md.Rotations = shape(m, mx, rot, p.vector, true)
		if p.value > 0 && (!res.HasCritical || p.value < res.Critical) {
			res.Critical, res.HasCritical = p.value, true
		}
		res.Modes = append(res.Modes, md)
	}
	return res, nil
}

// defaultCase returns id after checking it, or the first case (or
// combination) when id is empty.
func defaultCase(m *model.Model, id string) (string, error) {
	switch {
	case id != "":
		if m.CaseIndex(id) < 0 && m.CombinationIndex(id) < 0 {
			return "", fault.New(fault.UnknownCase, "no load case or combination is called %q", id)
		}
		return id, nil
	case len(m.Cases) > 0:
		return m.Cases[0].ID, nil
	case len(m.Combinations) > 0:
		return m.Combinations[0].ID, nil
	}
	return "", fault.At(fault.MissingData, "/load_cases", "buckling needs a load case whose axial forces load the structure; the model has none")
}

// geometric assembles B = −K_G (scaled like mx.K) from the members' axial
// forces, the mean of the two ends' (tension positive). any reports a
// nonzero axial force.
func geometric(mx *stiffness.Matrices, m *model.Model, endForces [][]float64) (b *sparse.Matrix, loaded bool) {
	b = mx.NewMatrix()
	var local [144]float64
	for e := range m.Members {
		ef := endForces[e]
		half := len(ef) / 2
		N := (ef[half] - ef[0]) / 2
		if N == 0 {
			continue
		}
		loaded = true
		geometricLocal(local[:], m, e, -N)
		mx.AddMember(b, m, e, local[:4*half*half])
	}
	return b, loaded
}

// bucklingWarnings says what a global buckling analysis of m leaves out.
func bucklingWarnings(m *model.Model) []fault.Problem {
	var bars, beams bool
	for _, mem := range m.Members {
		bars = bars || mem.Kind != model.Beam
		beams = beams || mem.Kind == model.Beam
	}
	w := []fault.Problem{{Path: "", Message: "linear bifurcation factors of the perfect structure: imperfections, nonlinearity and the design codes govern real design, and lateral-torsional buckling is not modelled"}}
	if bars {
		w = append(w, fault.Problem{Path: "/members", Message: "a bar has no bending stiffness here, so its own buckling between its ends (π²EI/(kL)²) is not among these modes; solve's utilisation checks it"})
	}
	if beams {
		w = append(w, fault.Problem{Path: "/members", Message: "each beam is one cubic element: a mode that bends within one member is overestimated (a pinned strut of one element gives 12EI/L², 22% above π²EI/L²); divide members into four or more to refine"})
	}
	return w
}

// solvePencil shifts, factorises and runs the Lanczos process on the
// pencil (mx.K, b), filling res.Stats.
func solvePencil(ctx context.Context, mx *stiffness.Matrices, b *sparse.Matrix, opt Options, positive bool, res *Result) ([]eigenPair, error) {
	res.Stats.Equations = mx.K.N
	if mx.K.N == 0 {
		return nil, nil
	}
	start := time.Now()
	p := &pencil{s: mx.K, b: b, shift: opt.Shift, positiveOnly: positive}
	if err := factorShifted(ctx, mx, p, opt); err != nil {
		return nil, err
	}
	res.Stats.Factorisations++
	res.Stats.Shift = p.shift
	res.Stats.Factor = time.Since(start)
	start = time.Now()
	pairs, st, err := lanczos(ctx, p, lanczosOptions{count: min(opt.Count, mx.K.N), tolerance: opt.Tolerance,
		maxBasis: opt.MaxBasis, maxIterations: opt.MaxIterations, reporter: opt.Reporter})
	if err != nil {
		return nil, err
	}
	res.Stats.Lanczos = time.Since(start)
	res.Stats.Iterations, res.Stats.Solves, res.Stats.Restarts, res.Stats.Converged = st.Iterations, st.Solves, st.Restarts, st.Converged
	if !st.Converged {
		res.Warnings = append(res.Warnings, fault.Problem{Path: "", Message: fmt.Sprintf(
			"the Lanczos process stopped at its iteration bound (%d) before every mode met the residual tolerance %g; each mode's residual says how far it got", opt.MaxIterations, opt.Tolerance)})
	}
	return pairs, nil
}

// factorShifted forms A = S − σ·B in p and factorises it.
func factorShifted(ctx context.Context, mx *stiffness.Matrices, p *pencil, opt Options) error {
	a := mx.NewMatrix()
	for i := range a.Val {
		a.Val[i] = mx.K.Val[i] - p.shift*p.b.Val[i]
	}
	p.a = a
	c, err := sparse.FactorizeWith(ctx, a, mx.Symbolic, sparse.Options{Workers: opt.Workers, Reporter: opt.Reporter})
	var pe *sparse.PivotError
	if errors.As(err, &pe) {
		return &shiftError{columns: pe.Columns}
	}
	if err != nil {
		return err
	}
	p.factor = c
	return nil
}

// shiftError reports that K − σ·B is not positive definite.
type shiftError struct{ columns []int }

func (e *shiftError) Error() string { return "modes: the shifted matrix is not positive definite" }

// shape turns the scaled eigenvector y into node arrays: x = D·y, scaled
// to a largest translation of 1 when unit is set, with the sign that
// makes the largest component positive.
func shape(m *model.Model, mx *stiffness.Matrices, rot []bool, y []float64, unit bool) (disp, rotation [][]float64) {
	x := make([]float64, len(y))
	big, bigTrans := 0.0, 0.0
	sign := 1.0
	for i := range y {
		x[i] = y[i] * mx.Scale[i]
		a := math.Abs(x[i])
		if a > big {
			big, sign = a, math.Copysign(1, x[i])
		}
		if mx.Component[i] < m.Dim {
			bigTrans = max(bigTrans, a)
		}
	}
	c := sign
	if unit {
		if bigTrans == 0 {
			bigTrans = big
		}
		if bigTrans > 0 {
			c /= bigTrans
		}
	}
	_, nr := m.DOFsPerNode()
	disp = make([][]float64, m.NodeCount())
	rotation = make([][]float64, m.NodeCount())
	for n := range disp {
		disp[n] = make([]float64, m.Dim)
		if rot[n] {
			rotation[n] = make([]float64, nr)
		}
	}
	for i, v := range x {
		n, comp := mx.Node[i], mx.Component[i]
		switch {
		case comp < m.Dim:
			disp[n][comp] = c * v
		case m.Dim == 2:
			rotation[n][0] = c * v
		default:
			rotation[n][comp-model.RX] = c * v
		}
	}
	turnShape(m, disp, rotation, unit)
	return disp, rotation
}
