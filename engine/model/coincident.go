package model

import (
	"math"
	"strconv"
)

// cellsPerTolerance sets the hash grid's cell size to this many
// coincidence tolerances: big enough that a point rarely lies within the
// tolerance of a cell face (so one cell is searched), small enough that
// distinct nodes of a real model rarely share a cell.
const cellsPerTolerance = 1000

// coincidentNodes reports every node within the coincidence tolerance of
// an earlier node, in O(n) expected time with a hash grid.
func (c *compiler) coincidentNodes() {
	dim, coords := c.dim, c.m.Coords
	n := len(c.spec.Nodes)
	if dim == 0 || n < 2 {
		return
	}
	tol := c.tol
	cell := tol * cellsPerTolerance
	if cell == 0 {
		cell = 1 // all nodes at one point: only exact coincidence counts
	}
	// A cell is keyed by a hash of its three indices: two cells that share
	// a key share a list, which costs comparisons but never misses a pair
	// (distances are always checked exactly), and a uint64 key is hashed
	// several times faster than a [3]int64.
	type key = uint64
	cellKey := func(a, b, z int64) key {
		return uint64(a)*0x9e3779b97f4a7c15 ^ uint64(b)*0xc2b2ae3d27d4eb4f ^ uint64(z)*0x165667b19e3779f9
	}
	heads := make(map[key]int32, n)
	next := make([]int32, n)
	cellOf := func(x float64) int64 {
		q := math.Floor(x / cell)
		// Clamping merges far-away cells, which costs comparisons but never
		// misses a pair: distances are always checked exactly.
		return int64(math.Max(-1<<62, math.Min(1<<62, q)))
	}
	for i := range n {
		p := coords[i*dim : (i+1)*dim]
		valid := true
		for _, x := range p {
			if math.IsNaN(x) {
				valid = false
			}
		}
		if !valid {
			next[i] = -1
			continue
		}
		var cell3, lo, hi [3]int64
		for k, x := range p {
			cell3[k] = cellOf(x)
			lo[k], hi[k] = cellOf(x-tol), cellOf(x+tol)
		}
		home := cellKey(cell3[0], cell3[1], cell3[2])
		reported := false
		for a := lo[0]; a <= hi[0] && !reported; a++ {
			for b := lo[1]; b <= hi[1] && !reported; b++ {
				for z := lo[2]; z <= hi[2] && !reported; z++ {
					for j := heads[cellKey(a, b, z)]; j > 0 && !reported; j = next[j-1] {
						q := coords[int(j-1)*dim : int(j)*dim]
						var d2 float64
						for k := range dim {
							d2 += (p[k] - q[k]) * (p[k] - q[k])
						}
						if d2 <= tol*tol {
							c.problem("nodes/"+strconv.Itoa(i)+"/at",
								"node %q is at the same point as node %q (within %.3g length units); merge them or move one",
								c.spec.Nodes[i].ID, c.spec.Nodes[j-1].ID, tol)
							reported = true
						}
					}
				}
			}
		}
		// Lists store index+1 so that the zero value means "empty".
		next[i] = heads[home]
		heads[home] = int32(i + 1)
	}
}
