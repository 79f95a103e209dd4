package sparse

import (
	"math/rand/v2"
	"slices"
	"testing"
)

// unitGroups returns gptr for n variables that each stand for themselves.
func unitGroups(n int) []int {
	gptr := make([]int, n+1)
	for i := range gptr {
		gptr[i] = i
	}
	return gptr
}

// TestConstrainedOrderKeepsSets checks the defining property of the
// constrained elimination (every variable of set s before any of set
// s+1) on random graphs with random sets of several variables each.
func TestConstrainedOrderKeepsSets(t *testing.T) {
	for seed := uint64(1); seed <= 5; seed++ {
		a := randomSPD(400, "random", seed)
		ptr, adj := a.Adjacency()
		rng := rand.New(rand.NewPCG(seed, 11))
		nsets := 1 + rng.IntN(30)
		set := make([]int, a.N)
		for i := range set {
			set[i] = rng.IntN(nsets)
		}
		g := newQuotientGraph(ptr, adj, unitGroups(a.N))
		g.constrain(set, nsets)
		perm := g.eliminate()
		if !isPermutation(perm, a.N) {
			t.Fatalf("seed %d: not a permutation", seed)
		}
		for k := 1; k < len(perm); k++ {
			if set[perm[k]] < set[perm[k-1]] {
				t.Fatalf("seed %d: variable %d of set %d numbered after %d of set %d",
					seed, perm[k], set[perm[k]], perm[k-1], set[perm[k-1]])
			}
		}
	}
}

// TestConstrainedSingletonSetsGiveThatOrder: with one variable a set the
// constraint leaves no choice, so the order is the sets' order, and with
// one set for all it is plain minimum degree (both by definition).
func TestConstrainedSingletonSetsGiveThatOrder(t *testing.T) {
	a := gridTruss2D(12, 9, 3)
	// The elimination prunes the adjacency lists in place: a fresh copy each.
	ptr, adj := a.Adjacency()
	want := rand.New(rand.NewPCG(5, 5)).Perm(a.N)
	set := make([]int, a.N)
	for k, i := range want {
		set[i] = k
	}
	g := newQuotientGraph(ptr, adj, unitGroups(a.N))
	g.constrain(set, a.N)
	if got := g.eliminate(); !slices.Equal(got, want) {
		t.Errorf("singleton sets: order %v, want %v", got[:10], want[:10])
	}
	ptr, adj = a.Adjacency()
	free := newQuotientGraph(ptr, adj, unitGroups(a.N)).eliminate()
	ptr, adj = a.Adjacency()
	one := newQuotientGraph(ptr, adj, unitGroups(a.N))
	one.constrain(make([]int, a.N), 1)
	if got := one.eliminate(); !slices.Equal(got, free) {
		t.Error("one set: order differs from unconstrained minimum degree")
	}
}

// TestChooseOrderKeepsLessFill: the order Factorize uses on a large matrix
// has no more nonzeros in L than either candidate (the definition of the
// choice), on a plane grid and a double-layer space grid.
func TestChooseOrderKeepsLessFill(t *testing.T) {
	for _, a := range []*Matrix{gridTruss2D(60, 60, 1), doubleLayerGrid(30, 1)} {
		if a.N < nestedMinSize {
			t.Fatalf("n = %d is below the size that tries both orders", a.N)
		}
		nnz := func(perm []int) int {
			_, count := countsFor(a, perm)
			sum := 0
			for _, c := range count {
				sum += c
			}
			return sum
		}
		perm, _, count := chooseOrder(a, 2)
		chosen := 0
		for _, c := range count {
			chosen += c
		}
		if chosen != nnz(perm) {
			t.Errorf("n=%d: counts returned (%d) are not those of the order (%d)", a.N, chosen, nnz(perm))
		}
		if md, nd := nnz(Order(a)), nnz(OrderNested(a)); chosen > min(md, nd) {
			t.Errorf("n=%d: chose nnz(L) %d; minimum degree %d, nested dissection %d", a.N, chosen, md, nd)
		} else {
			t.Logf("n=%d: nnz(L) minimum degree %d, nested dissection %d", a.N, md, nd)
		}
	}
}
