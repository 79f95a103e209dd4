package stiffness

import "math"

// maxDegree is the largest polynomial degree the root finder takes: the
// derivative of a squared quintic deflection.
const maxDegree = 10

// polyEval returns Σ c[k]·s^k by Horner's rule.
func polyEval(c []float64, s float64) float64 {
	var v float64
	for k := len(c) - 1; k >= 0; k-- {
		v = v*s + c[k]
	}
	return v
}

// polyDerivative writes the coefficients of p′ into dst and returns them.
func polyDerivative(dst *[maxDegree + 1]float64, c []float64) []float64 {
	if len(c) <= 1 {
		return dst[:0]
	}
	for k := 1; k < len(c); k++ {
		dst[k-1] = float64(k) * c[k]
	}
	return dst[:len(c)-1]
}

// trimZeros drops exactly zero leading coefficients.
func trimZeros(c []float64) []float64 {
	for len(c) > 0 && c[len(c)-1] == 0 {
		c = c[:len(c)-1]
	}
	return c
}

// roots holds up to maxDegree roots in increasing order, in place (no
// allocation: the root finder runs for every stretch of every member).
type roots struct {
	x [maxDegree]float64
	n int
}

func (r *roots) add(x float64) {
	r.x[r.n] = x
	r.n++
}

// list returns the roots found.
func (r *roots) list() []float64 { return r.x[:r.n] }

// realRoots adds to out the real roots of Σ c[k]·s^k that lie strictly
// inside (lo, hi) and at which the polynomial changes sign, in increasing
// order. On (0, hi) the signs of the polynomial's Bernstein coefficients
// settle most cases at once (bernstein.isolate); otherwise, and where
// they cannot, the roots of p′ split the interval into pieces on which p is
// monotone (found the same way, recursively); each piece whose ends differ
// in sign holds exactly one root, found by safeguarded Newton steps. The
// answer is exact to round-off for the degrees used here (at most
// maxDegree); a root of even multiplicity (a touch, not a crossing) is not
// reported, which is what extreme-value searches want: such a point of p′
// is an inflection, not an extreme, of p.
func realRoots(out *roots, c []float64, lo, hi float64) {
	c = trimZeros(c)
	switch len(c) {
	case 0, 1:
		return
	case 2:
		if s := -c[0] / c[1]; s > lo && s < hi {
			out.add(s)
		}
		return
	case 3:
		quadraticRoots(out, c[0], c[1], c[2], lo, hi)
		return
	}
	if lo == 0 && hi > 0 {
		var bz bernstein
		if bz.set(c, hi) {
			bz.isolate(out, c, 0, hi, 0)
			return
		}
	}
	derivativeRoots(out, c, lo, hi)
}

// derivativeRoots is realRoots by the roots of p′ for a polynomial of
// degree 3 or more: they split (lo, hi) into pieces on which p is
// monotone, each of which holds one root when its ends differ in sign.
func derivativeRoots(out *roots, c []float64, lo, hi float64) {
	// From degree 4 a proof that p has no root here saves the search
	// below (a cubic's own search is as cheap as the proof).
	if len(c) > 4 && clearOfRoots(c, lo, hi) {
		return
	}
	var d [maxDegree + 1]float64
	deriv := polyDerivative(&d, c)
	var crit roots
	realRoots(&crit, deriv, lo, hi)
	critical := crit.list()
	a, fa := lo, polyEval(c, lo)
	for i := 0; i <= len(critical); i++ {
		b := hi
		if i < len(critical) {
			b = critical[i]
		}
		fb := polyEval(c, b)
		if fa != 0 && fb != 0 && (fa < 0) != (fb < 0) {
			out.add(monotoneRoot(c, deriv, a, b, fa))
		} else if fb == 0 && b < hi {
			out.add(b)
		}
		a, fa = b, fb
	}
}

// clearOfRoots reports whether the polynomial c (degree ≥ 1) provably
// has no root in [lo, hi], so that realRoots may skip the search for the
// roots of its derivatives. On the interval p is Σ bᵢ·Bᵢ(u), u = (s −
// lo)/(hi − lo), in the Bernstein basis Bᵢ(u) = C(n,i)·uⁱ(1 − u)ⁿ⁻ⁱ, whose
// members are non-negative and sum to 1, so p lies between the least and
// the largest bᵢ; when every bᵢ has the same strict sign, p has no root
// there (Farouki & Rajan, "On the numerical condition of polynomials in
// Bernstein form", 1987, from memory; the convex hull property). The
// answer is "clear" only with a margin of 1e-10 of the polynomial's scale
// Σ |cₖ|·max(|lo|, |hi|)ᵏ, far above the round-off of the change of basis
// (a few hundred ε for the degrees used here), so a root realRoots would
// find is never skipped; a false "not clear" only costs the search.
func clearOfRoots(c []float64, lo, hi float64) bool {
	var a [maxDegree + 1]float64
	n := copy(a[:], c)
	// The Taylor shift to lo by repeated synthetic division (Horner's
	// scheme), then the scaling to u: a[k] is the coefficient of uᵏ.
	for i := 0; i < n-1; i++ {
		for j := n - 2; j >= i; j-- {
			a[j] += lo * a[j+1]
		}
	}
	h, power := hi-lo, 1.0
	for k := range n {
		a[k] *= power
		power *= h
	}
	x := math.Max(math.Abs(lo), math.Abs(hi))
	scale := 0.0
	power = 1
	for k := range n {
		scale += math.Abs(c[k]) * power
		power *= x
	}
	margin := 1e-10 * scale
	// bᵢ = Σₖ≤ᵢ C(i,k)/C(d,k)·aₖ for degree d = n − 1.
	ratio := &bernsteinRatio[n-1]
	sign := 0.0
	for i := range n {
		b := 0.0
		for k := 0; k <= i; k++ {
			b += ratio[i][k] * a[k]
		}
		switch {
		case b > margin && sign >= 0:
			sign = 1
		case b < -margin && sign <= 0:
			sign = -1
		default:
			return false
		}
	}
	return true
}

// quadraticRoots appends the roots of c0 + c1·s + c2·s² inside (lo, hi),
// computed in the cancellation-free form (Press et al., Numerical Recipes,
// 3rd ed., 2007, §5.6, eq. 5.6.4–5.6.5).
func quadraticRoots(out *roots, c0, c1, c2, lo, hi float64) {
	disc := c1*c1 - 4*c2*c0
	if disc <= 0 {
		return // no roots, or a double root (a touch, no sign change)
	}
	q := -0.5 * (c1 + math.Copysign(math.Sqrt(disc), c1))
	r1, r2 := q/c2, c0/q
	if r1 > r2 {
		r1, r2 = r2, r1
	}
	for _, r := range [2]float64{r1, r2} {
		if r > lo && r < hi {
			out.add(r)
		}
	}
}

// monotoneRoot finds the one root of the polynomial c (derivative deriv) on
// [a, b], where it is monotone and p(a) = fa has the opposite sign of p(b):
// Newton steps kept inside the shrinking bracket, a bisection whenever a
// step leaves it (Press et al., Numerical Recipes, 2007, §9.4, rtsafe).
func monotoneRoot(c, deriv []float64, a, b, fa float64) float64 {
	x := 0.5 * (a + b)
	for range 100 {
		f := polyEval(c, x)
		if f == 0 {
			return x
		}
		if (f < 0) == (fa < 0) {
			a = x
		} else {
			b = x
		}
		next := x - f/polyEval(deriv, x)
		if !(next > a && next < b) {
			next = 0.5 * (a + b)
		}
		if math.Abs(next-x) <= 1e-15*math.Max(math.Abs(a), math.Abs(b)) || b-a <= 4e-16*math.Max(math.Abs(a), math.Abs(b)) {
			return next
		}
		x = next
	}
	return x
}

// bernsteinRatio[n][i][k] is C(i, k)/C(n, k): the weight of the power
// coefficient k in the Bernstein coefficient i of a polynomial of degree n
// on [0, 1] (Farouki & Rajan, "Algorithms for polynomials in Bernstein
// form", Computer Aided Geometric Design 5, 1988, §2).
var bernsteinRatio = func() (r [maxDegree + 1][maxDegree + 1][maxDegree + 1]float64) {
	choose := func(n, k int) float64 {
		v := 1.0
		for j := 1; j <= k; j++ {
			v = v * float64(n-k+j) / float64(j)
		}
		return v
	}
	for n := range maxDegree + 1 {
		for i := range n + 1 {
			for k := range i + 1 {
				r[n][i][k] = choose(i, k) / choose(n, k)
			}
		}
	}
	return r
}()

// bernstein is a polynomial of degree n in Bernstein form on an interval:
// its coefficients b and, for each, a bound on the size of the terms that
// made it (size), from which the rounding error of b is judged.
type bernstein struct {
	n       int
	b, size [maxDegree + 1]float64
}

// sure reports whether every coefficient has a sure sign: none lies within
// a wide margin of its rounding error (below (n + depth)·ε·size).
func (bz *bernstein) sure() bool {
	for i := range bz.n + 1 {
		if !(math.Abs(bz.b[i]) > 1e-12*bz.size[i]) {
			return false
		}
	}
	return true
}

// set makes bz the Bernstein form of Σ c[k]·s^k on [0, h] and reports
// whether every coefficient has a sure sign.
func (bz *bernstein) set(c []float64, h float64) bool {
	bz.n = len(c) - 1
	var q, size [maxDegree + 1]float64
	w := 1.0
	for k := range c {
		q[k] = c[k] * w
		size[k] = math.Abs(q[k])
		w *= h
	}
	ratio := &bernsteinRatio[bz.n]
	for i := range bz.n + 1 {
		var b, bound float64
		for k := range i + 1 {
			b += ratio[i][k] * q[k]
			bound += ratio[i][k] * size[k]
		}
		bz.b[i], bz.size[i] = b, bound
	}
	return bz.sure()
}

// variations returns the number of sign changes of the coefficients.
func (bz *bernstein) variations() int {
	v := 0
	for i := 1; i <= bz.n; i++ {
		if (bz.b[i] < 0) != (bz.b[i-1] < 0) {
			v++
		}
	}
	return v
}

// halves splits bz at the middle of its interval by de Casteljau's
// algorithm (convex combinations, stable), the sizes alongside.
func (bz *bernstein) halves(left, right *bernstein) {
	left.n, right.n = bz.n, bz.n
	b, size := bz.b, bz.size
	for i := 0; i <= bz.n; i++ {
		left.b[i], left.size[i] = b[0], size[0]
		right.b[bz.n-i], right.size[bz.n-i] = b[bz.n-i], size[bz.n-i]
		for j := 0; j < bz.n-i; j++ {
			b[j] = 0.5 * (b[j] + b[j+1])
			size[j] = 0.5 * (size[j] + size[j+1])
		}
	}
}

// maxSplits bounds the halvings of bernstein.isolate before it hands a
// piece to derivativeRoots.
const maxSplits = 6

// isolate adds the sign-changing roots of c in (a, b), on which bz is c's
// Bernstein form with sure signs, in increasing order. By Descartes' rule
// of signs in Bernstein form the roots in the open interval, counted with
// multiplicity, are at most the coefficients' sign changes and of the same
// parity (Farouki & Rajan 1988, §4): none means no root, one exactly one,
// simple, found by monotoneRoot's safeguarded Newton steps; more are
// halved, and a piece still unsettled after maxSplits halvings, or whose
// middle value has no sure sign, goes to derivativeRoots, which is exact
// whatever the roots. The ends a and b are never roots (their
// coefficients have sure signs).
func (bz *bernstein) isolate(out *roots, c []float64, a, b float64, splits int) {
	switch bz.variations() {
	case 0:
		return
	case 1:
		var d [maxDegree + 1]float64
		out.add(monotoneRoot(c, polyDerivative(&d, c), a, b, bz.b[0]))
		return
	}
	var left, right bernstein
	if splits < maxSplits {
		bz.halves(&left, &right)
		if left.sure() && right.sure() {
			mid := 0.5 * (a + b)
			left.isolate(out, c, a, mid, splits+1)
			right.isolate(out, c, mid, b, splits+1)
			return
		}
	}
	derivativeRoots(out, c, a, b)
}
