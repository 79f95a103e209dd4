package loadpath

import (
	"math"

	"gusset/engine/model"
)

// CaseResult holds Maxwell's load-path quantities of one case. Forces are in
// the model's force unit and lengths in its length unit, so load paths and
// M are in force × length.
type CaseResult struct {
	// ID is the case's id as given.
	ID string
	// LoadPath is Z = Σ|N|·L over all members, never negative.
	LoadPath float64
	// TensionLoadPath is Z_T = Σ N·L over the members in tension (N > 0),
	// never negative.
	TensionLoadPath float64
	// CompressionLoadPath is Z_C = Σ |N|·L over the members in compression
	// (N < 0), never negative, so that Z = Z_T + Z_C.
	CompressionLoadPath float64
	// Constant is the load-path constant M = Σ F·r over the nodes, F being
	// the external force at a node (applied loads and reactions together)
	// and r the node's position vector from the model's origin. With tension
	// positive, Maxwell's theorem reads Z_T − Z_C = M: a structure whose
	// loads and reactions point outward from each other (M > 0) is mostly in
	// tension.
	Constant float64
	// Residual is Z_T − Z_C − M, zero up to round-off when the axial forces
	// balance the external forces at every node.
	Residual float64
	// RelativeResidual is |Residual| divided by Z + Σ|F|·|r|, the sum of the
	// magnitudes of the terms of the identity (0 when that sum is 0). A value
	// near machine precision (say below 1e-12) confirms equilibrium.
	RelativeResidual float64
	// Resultant is ΣF, the sum of the external forces (Dim entries). It is
	// zero for a case in equilibrium, and then M does not depend on the
	// choice of origin.
	Resultant []float64
	// RelativeResultant is |ΣF| / Σ|F| (0 when there are no external forces).
	RelativeResultant float64

	// StressVolume is the direct sum Σ|N|·L/σ over the loaded members, σ
	// being the member material's tension or compression limit by the sign of
	// N: the volume if each member were sized for this case by its stress
	// limit alone (no buckling, no minimum area). It is set only when sizing.
	StressVolume float64
	// TheoremVolume is the same volume from the tension members and M alone,
	// as the theorem allows: with Z_C = Z_T − M,
	// V = Z_T/σ_t + Z_C/σ_c = Z_T/σ_t + (Z_T − M)/σ_c, which for σ_t = σ_c = σ
	// is (2·Z_T − M)/σ. It is set only when sizing and every member has the
	// same tension limit σ_t and the same compression limit σ_c
	// (HasTheoremVolume).
	TheoremVolume    float64
	HasTheoremVolume bool
}

// caseTheorem fills the load-path quantities of case c. lengths holds the
// member lengths.
func caseTheorem(m *model.Model, c *Case, lengths []float64) CaseResult {
	r := CaseResult{ID: c.ID, Resultant: make([]float64, m.Dim)}
	for e, n := range c.AxialForce {
		nl := n * lengths[e]
		if n > 0 {
			r.TensionLoadPath += nl
		} else {
			r.CompressionLoadPath -= nl
		}
	}
	r.LoadPath = r.TensionLoadPath + r.CompressionLoadPath

	var termScale, forceScale float64
	for i, f := range c.External {
		if f == nil {
			continue
		}
		pos := m.Coords[i*m.Dim : (i+1)*m.Dim]
		var dot, ff, rr float64
		for k := range f {
			dot += f[k] * pos[k]
			ff += f[k] * f[k]
			rr += pos[k] * pos[k]
			r.Resultant[k] += f[k]
		}
		r.Constant += dot
		termScale += math.Sqrt(ff * rr)
		forceScale += math.Sqrt(ff)
	}
	r.Residual = r.TensionLoadPath - r.CompressionLoadPath - r.Constant
	if s := r.LoadPath + termScale; s > 0 {
		r.RelativeResidual = math.Abs(r.Residual) / s
	}
	if forceScale > 0 {
		var rr float64
		for _, v := range r.Resultant {
			rr += v * v
		}
		r.RelativeResultant = math.Sqrt(rr) / forceScale
	}
	return r
}
