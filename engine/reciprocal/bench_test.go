package reciprocal

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gusset/engine/model"
)

// loadedGrid returns a jittered triangulated grid of about 3·rows·cols
// members in equilibrium under forces at its boundary nodes: the
// self-stress of a grid one ring larger (made from a random lift, see
// airySelfStress) with the outer ring cut away, the cut members' forces
// becoming external forces on the boundary (common practice: the method of
// sections).
func loadedGrid(rows, cols int, seed uint64) (*model.Model, []float64, [][2]float64) {
	rng := rand.New(rand.NewPCG(seed, seed+1))
	R, C := rows+2, cols+2
	xy, ends := gridTruss(R, C, 0.5, rng)
	heights := make([]float64, R*C)
	for r := 1; r < R-1; r++ {
		for c := 1; c < C-1; c++ {
			heights[r*C+c] = rng.Float64()*4 - 1
		}
	}
	state := airySelfStress(xy, ends, R, C, heights)
	inner := func(v int) bool { r, c := v/C, v%C; return r > 0 && c > 0 && r < R-1 && c < C-1 }
	index := make([]int, R*C)
	var nxy [][2]float64
	for v := range xy {
		index[v] = -1
		if inner(v) {
			index[v] = len(nxy)
			nxy = append(nxy, xy[v])
		}
	}
	ext := make([][2]float64, len(nxy))
	var nends [][2]int
	var axial []float64
	for e, en := range ends {
		a, b := inner(en[0]), inner(en[1])
		switch {
		case a && b:
			nends = append(nends, [2]int{index[en[0]], index[en[1]]})
			axial = append(axial, state[e])
		case a != b:
			in, out := en[0], en[1]
			if !a {
				in, out = out, in
			}
			dx, dy := xy[out][0]-xy[in][0], xy[out][1]-xy[in][1]
			l := math.Hypot(dx, dy)
			ext[index[in]][0] += state[e] * dx / l
			ext[index[in]][1] += state[e] * dy / l
		}
	}
	return newModel(nxy, nends), axial, ext
}

// TestLoadedGrid checks the benchmark's network: its diagram closes at
// round-off and the lift's slope jumps are the forces.
func TestLoadedGrid(t *testing.T) {
	m, axial, ext := loadedGrid(6, 7, 4)
	d, err := Build(context.Background(), Input{Model: m, AxialForce: axial, External: ext})
	if err != nil {
		t.Fatal(err)
	}
	checkDiagram(t, d, m, axial, ext, true, 1e-12)
}

// BenchmarkBuild times the diagram and the lift (planarity check,
// embedding, placement, labels, lift and polar) of loaded planar grids.
func BenchmarkBuild(b *testing.B) {
	for _, side := range []int{18, 58, 183} {
		m, axial, ext := loadedGrid(side, side, 1)
		b.Run(fmt.Sprintf("members=%d", len(m.Members)), func(b *testing.B) {
			in := Input{Model: m, AxialForce: axial, External: ext}
			b.ResetTimer()
			for b.Loop() {
				if _, err := Build(context.Background(), in); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkBuildInexact times Build when the axial forces carry relative
// errors of 1e-7, so that the least-squares placement has to iterate.
func BenchmarkBuildInexact(b *testing.B) {
	for _, side := range []int{18, 58, 183} {
		m, axial, ext := loadedGrid(side, side, 1)
		rng := rand.New(rand.NewPCG(1, 1))
		noisy := slices.Clone(axial)
		for e := range noisy {
			noisy[e] *= 1 + 1e-7*(rng.Float64()-0.5)
		}
		b.Run(fmt.Sprintf("members=%d", len(m.Members)), func(b *testing.B) {
			in := Input{Model: m, AxialForce: noisy, External: ext, Tolerance: 1e-3}
			b.ResetTimer()
			for b.Loop() {
				if _, err := Build(context.Background(), in); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
