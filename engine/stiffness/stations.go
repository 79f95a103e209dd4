package stiffness

import (
	"math"

	"gusset/engine/model"
)

// DefaultStations is the number of stations along each beam when
// Options.Stations is 0: both ends and every tenth of the length.
const DefaultStations = 11

// Extreme is a value along a member and where it occurs.
type Extreme struct {
	// Value is the value, signed (in the units of the quantity).
	Value float64
	// At is the distance from the member's first end (length units).
	At float64
}

// MemberResult holds one member's results along its length for one case.
//
// For a beam the internal forces are exact for Euler–Bernoulli theory:
// the element's end forces plus the particular solution of each load kind
// along it (uniform, linear and self-weight loads, point loads, thermal
// strain), not an interpolation. Internal forces are those on the face of
// a cut whose outward normal is local +x (the first end's side of the cut
// acting on the second's), in local axes: N tension positive; Vy, Vz the
// shears; T the torque about x; My, Mz the moments about local y and z as
// right-handed vectors, so that the axial stress at local (y, z) is
// N/A − Mz·y/Iz + My·z/Iy, a 2D beam sagging under gravity (local y up)
// has positive Mz, dMz/dx = −Vy and dMy/dx = Vz. (The shear of the beam
// tables, with dM/dx = V, is −Vy.) At a point load a station reports the value just past
// the load (towards the second end), except at the second end itself.
//
// For a bar only the axial extremes and the largest displacement (at an
// end: a bar's displacement is linear along it) are set, unless loads
// cross it: then it has the extremes of a simply supported span too (see
// LoadedAcross).
type MemberResult struct {
	// Stations holds the distances of the stations from the first end
	// (length units), evenly spaced with both ends; nil when stations were
	// not asked for or the member is a bar.
	Stations []float64
	// Axial, ShearY and MomentZ hold N, Vy and Mz at each station (in 2D
	// the shear and moment of the member's plane); ShearZ, Torsion and
	// MomentY hold Vz, T and My in 3D and are nil in 2D.
	Axial, ShearY, ShearZ, Torsion, MomentY, MomentZ []float64
	// Displacements holds the translation of the member's axis at each
	// station in global axes (Dim entries, length units); the displaced
	// position is the station's position plus it.
	Displacements [][]float64

	// MaxAxial and MinAxial are the largest and smallest axial force along
	// the member (tension positive).
	MaxAxial, MinAxial Extreme
	// PeakMomentZ and PeakMomentY are the moments of largest magnitude
	// about local z and (3D) local y, signed, found exactly from the
	// closed-form polynomials between point loads (zeros of the shear).
	PeakMomentZ, PeakMomentY Extreme
	// PeakDeflectionY and PeakDeflectionZ are the local transverse
	// displacements v (local y) and, in 3D, w (local z) of largest
	// magnitude along the member, signed, found exactly (zeros of the
	// slope).
	PeakDeflectionY, PeakDeflectionZ Extreme
	// PeakDisplacement is the largest translation magnitude along the
	// member (its value is ≥ 0), found exactly (zeros of the derivative of
	// the squared magnitude).
	PeakDisplacement Extreme
	// Ranges holds the largest and smallest value of each internal force
	// along the member (indexed by RangeAxial … RangeMomentZ), found
	// exactly like the peaks; a bar has its axial force only.
	Ranges [RangeCount]Range

	// AxialUtilisation, BendingUtilisation and CombinedUtilisation are the
	// member's checks (see Result.Unchecked and CaseResult.Utilisation);
	// each is −1 when it could not be made. BucklingReduction is the χ
	// used in compression (0 when the member is not in compression).
	AxialUtilisation, BendingUtilisation, CombinedUtilisation float64
	BucklingReduction                                         float64
	// Unchecked flags the checks not made, or made on an assumption.
	Unchecked uint16

	// LoadedAcross is set for a bar that carries loads across its length
	// (its own weight, member loads): it bends as a simply supported span,
	// and its moments, shears and (given EI) deflections above are those
	// of the span (see alongLoadedBar), without station arrays.
	LoadedAcross bool

	// AxialEnergy, BendingEnergy and TorsionEnergy are the member's strain
	// energy (force·length) from its axial force ∫N²/2EA, its bending
	// ∫Mz²/2EIz + My²/2EIy and its torsion ∫T²/2GJ (Euler–Bernoulli: no
	// shear strain energy), integrated exactly.
	AxialEnergy, BendingEnergy, TorsionEnergy float64
}

// Peak is where a case's largest value occurs: at a node (Member −1) or
// inside a member at a distance from its first end (Node −1).
type Peak struct {
	Value  float64
	Node   int
	Member int
	At     float64
}

// stationCount resolves Options.Stations: 0 means DefaultStations, a
// negative value none, and a positive value at least 2 (both ends).
func stationCount(n int) int {
	switch {
	case n == 0:
		return DefaultStations
	case n < 0:
		return 0
	}
	return max(n, 2)
}

// layoutStations lays out every beam's station arrays for one case in a few
// shared backing arrays: one allocation per quantity instead of one per
// member.
func layoutStations(m *model.Model, cr *CaseResult, n int) {
	if n == 0 {
		return
	}
	beams := 0
	for _, mem := range m.Members {
		if mem.Kind == model.Beam {
			beams++
		}
	}
	if beams == 0 {
		return
	}
	columns := 3
	if m.Dim == 3 {
		columns = 6
	}
	at := make([]float64, beams*n)
	forces := make([]float64, columns*beams*n)
	disp := make([]float64, m.Dim*beams*n)
	rows := make([][]float64, beams*n)
	for i := range rows {
		rows[i] = disp[i*m.Dim : (i+1)*m.Dim : (i+1)*m.Dim]
	}
	column := func() []float64 {
		c := forces[:n:n]
		forces = forces[n:]
		return c
	}
	b := 0
	for e, mem := range m.Members {
		if mem.Kind != model.Beam {
			continue
		}
		r := cr.kept(e) // a beam keeps its results
		r.Stations = at[b*n : (b+1)*n : (b+1)*n]
		r.Displacements = rows[b*n : (b+1)*n : (b+1)*n]
		r.Axial, r.ShearY, r.MomentZ = column(), column(), column()
		if m.Dim == 3 {
			r.ShearZ, r.Torsion, r.MomentY = column(), column(), column()
		}
		b++
	}
}

// alongBeam fills r with the beam's extremes and, where r has station
// arrays, its stations, from its local end forces p, local end
// displacements ul and loading ld; f is scratch space.
func alongBeam(r *MemberResult, el *element, sec *model.Section, mat *model.Material, p, ul []float64, ld *memberLoading, f *field) {
	e := mat.ElasticModulus
	ei, eiy := e*sec.SecondMoment, e*sec.SecondMomentY
	f.start(el, ei, eiy, p, ul, ld)
	beamExtremes(r, f)
	if f.dim3 {
		r.TorsionEnergy = f.torsion * f.torsion * el.length / (2 * mat.ShearModulus * sec.TorsionConstant)
	}
	if len(r.Stations) == 0 {
		return
	}
	f.start(el, ei, eiy, p, ul, ld)
	n := len(r.Stations)
	for i := range n {
		x := el.length * float64(i) / float64(n-1)
		if i == n-1 {
			x = el.length
		}
		f.moveTo(x, i < n-1)
		r.Stations[i] = x
		r.Axial[i], r.ShearY[i], r.MomentZ[i] = f.axial, f.y.shear, f.y.moment
		local := [3]float64{f.stretch, f.y.deflection, 0}
		if f.dim3 {
			r.ShearZ[i], r.Torsion[i], r.MomentY[i] = f.z.shear, f.torsion, -f.z.moment
			local[2] = f.z.deflection
		}
		d := r.Displacements[i]
		for c := range d {
			d[c] = local[0]*el.axes[0][c] + local[1]*el.axes[1][c] + local[2]*el.axes[2][c]
		}
	}
}

// beamExtremes walks the stretches between point loads and scans each
// quantity's polynomial for its exact extremes.
func beamExtremes(r *MemberResult, f *field) {
	var maxN, minN, mz, my, vy, vz, disp peak
	var rs rangeScan
	r.AxialEnergy, r.BendingEnergy = 0, 0
	for {
		end := f.stretchEnd()
		h := end - f.x0
		var force [3]float64
		var stretch [4]float64
		f.axialPolynomials(&force, &stretch)
		scan(force[:], f.x0, h, func(v, x float64) { maxN.largest(v, x); minN.smallest(v, x) })
		var momY, momZ [4]float64
		var defY, defZ [6]float64
		f.y.polynomials(f.x0, &momZ, &defY)
		scan(momZ[:], f.x0, h, func(v, x float64) { mz.magnitude(v, x); rs.see(RangeMomentZ, v, x) })
		scan(defY[:], f.x0, h, vy.magnitude)
		var square [maxDegree + 1]float64
		addSquare(&square, stretch[:])
		addSquare(&square, defY[:])
		if f.dim3 {
			f.z.polynomials(f.x0, &momY, &defZ)
			scan(momY[:], f.x0, h, func(v, x float64) { my.magnitude(-v, x); rs.see(RangeMomentY, -v, x) })
			scan(defZ[:], f.x0, h, vz.magnitude)
			addSquare(&square, defZ[:])
		}
		scan(square[:], f.x0, h, disp.largest)
		rs.stretch(f, h)
		r.AxialEnergy += integralOfSquare(force[:], h) / (2 * f.ea)
		r.BendingEnergy += integralOfSquare(momZ[:], h) / (2 * f.y.ei)
		if f.dim3 {
			r.BendingEnergy += integralOfSquare(momY[:], h) / (2 * f.z.ei)
		}
		if f.next >= len(f.points) {
			break
		}
		f.moveTo(end, true)
	}
	r.MaxAxial, r.MinAxial = maxN.Extreme, minN.Extreme
	r.Ranges = rs.ranges()
	r.Ranges[RangeAxial] = Range{Max: r.MaxAxial, Min: r.MinAxial}
	r.PeakMomentZ, r.PeakDeflectionY = mz.Extreme, vy.Extreme
	r.PeakMomentY, r.PeakDeflectionZ = my.Extreme, vz.Extreme
	r.PeakDisplacement = Extreme{Value: math.Sqrt(max(0, disp.Value)), At: disp.At}
}

// addSquare adds c² to sum (coefficients in increasing powers).
func addSquare(sum *[maxDegree + 1]float64, c []float64) {
	for i, ci := range c {
		if ci == 0 {
			continue
		}
		for j, cj := range c {
			sum[i+j] += ci * cj
		}
	}
}

// alongBar sets a bar's axial extremes from its end forces and its largest
// displacement, which is at an end.
func alongBar(r *MemberResult, el *element, p []float64, d1, d2 []float64) {
	n1, n2 := -p[0], p[el.perNode]
	r.MaxAxial, r.MinAxial = Extreme{Value: n1}, Extreme{Value: n1}
	if n2 > n1 {
		r.MaxAxial = Extreme{Value: n2, At: el.length}
	} else if n2 < n1 {
		r.MinAxial = Extreme{Value: n2, At: el.length}
	}
	r.Ranges[RangeAxial] = Range{Max: r.MaxAxial, Min: r.MinAxial}
	// N is linear between the ends: ∫N² = L(N₁² + N₁N₂ + N₂²)/3.
	r.AxialEnergy = el.length * (n1*n1 + n1*n2 + n2*n2) / (6 * el.ea)
	a, b := norm(d1), norm(d2)
	r.PeakDisplacement = Extreme{Value: a}
	if b > a {
		r.PeakDisplacement = Extreme{Value: b, At: el.length}
	}
}

func norm(v []float64) float64 {
	var s float64
	for _, x := range v {
		s += x * x
	}
	return math.Sqrt(s)
}

// summarise sets the case's largest displacement (nodes and member
// interiors) and largest moment. A member's interior wins over a node only
// when strictly larger, so a peak at a member's end is reported at its
// node. Without the members' results (forcesOnly) the nodes' largest
// displacement is the answer only when every member is a bar that no
// load crosses, whose displacement is linear along it
// (model.LinearBetweenEnds); otherwise both stay unset.
func summarise(m *model.Model, cr *CaseResult, forcesOnly bool) {
	cr.MaxDisplacement = Peak{Node: -1, Member: -1}
	cr.MaxMoment = Peak{Node: -1, Member: -1}
	if forcesOnly && !m.LinearBetweenEnds() {
		return
	}
	for n, d := range cr.Displacements {
		if v := norm(d); n == 0 || v > cr.MaxDisplacement.Value {
			cr.MaxDisplacement = Peak{Value: v, Node: n, Member: -1}
		}
	}
	for e := range cr.MemberCount() {
		// A bar no load touches peaks at an end, at its node's value
		// (the same norm of the same numbers): never strictly larger.
		r := cr.kept(e)
		if r == nil {
			continue
		}
		if v := r.PeakDisplacement.Value; v > cr.MaxDisplacement.Value {
			cr.MaxDisplacement = Peak{Value: v, Node: -1, Member: e, At: r.PeakDisplacement.At}
		}
		if m.Members[e].Kind != model.Beam && !r.LoadedAcross {
			continue
		}
		for _, pk := range [2]Extreme{r.PeakMomentZ, r.PeakMomentY} {
			if cr.MaxMoment.Member < 0 || math.Abs(pk.Value) > math.Abs(cr.MaxMoment.Value) {
				cr.MaxMoment = Peak{Value: pk.Value, Node: -1, Member: e, At: pk.At}
			}
		}
	}
}

// finite reports whether every number of r is finite.
func (r *MemberResult) finite() bool {
	for _, col := range [...][]float64{r.Stations, r.Axial, r.ShearY, r.ShearZ, r.Torsion, r.MomentY, r.MomentZ} {
		if !finite(col) {
			return false
		}
	}
	for _, d := range r.Displacements {
		if !finite(d) {
			return false
		}
	}
	return finite([]float64{r.MaxAxial.Value, r.MinAxial.Value, r.PeakMomentY.Value, r.PeakMomentZ.Value,
		r.PeakDeflectionY.Value, r.PeakDeflectionZ.Value, r.PeakDisplacement.Value})
}

// gauss4 is the four-point Gauss–Legendre rule on [−1, 1], exact for
// polynomials up to degree 7 (Abramowitz & Stegun, Handbook of
// Mathematical Functions, 1964, Table 25.4): the square of a cubic moment.
var gauss4 = [4][2]float64{
	{-0.8611363115940526, 0.3478548451374538},
	{-0.3399810435848563, 0.6521451548625461},
	{0.3399810435848563, 0.6521451548625461},
	{0.8611363115940526, 0.3478548451374538},
}

// integralOfSquare returns ∫₀ʰ c(s)² ds for a polynomial c of degree ≤ 3.
func integralOfSquare(c []float64, h float64) float64 {
	var sum float64
	for _, g := range gauss4 {
		v := polyEval(c, 0.5*h*(1+g[0]))
		sum += g[1] * v * v
	}
	return 0.5 * h * sum
}
