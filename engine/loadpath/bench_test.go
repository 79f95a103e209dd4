package loadpath

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"gusset/engine/model"
)

// BenchmarkCompute measures load path plus sizing with buckling over two
// cases for a plane grid truss (forces are random: the cost does not
// depend on equilibrium).
func BenchmarkCompute(b *testing.B) {
	for _, size := range []int{1000, 100000} {
		b.Run(fmt.Sprintf("members=%d", size), func(b *testing.B) {
			rng := rand.New(rand.NewPCG(1, 1))
			nx := size / 3
			var coords [][]float64
			for i := 0; i <= nx; i++ {
				coords = append(coords, []float64{float64(i), 0}, []float64{float64(i), 1})
			}
			var ends [][2]int
			for i := 0; len(ends) < size; i++ {
				ends = append(ends, [2]int{2 * i, 2*i + 1}, [2]int{2 * i, 2*i + 2}, [2]int{2*i + 1, 2*i + 3})
			}
			ends = ends[:size]
			m := newModel(2, coords, ends, steel)
			m.Units = model.UnitsSpec{Length: "m", Force: "kN"}
			cases := make([]Case, 2)
			for k := range cases {
				cases[k] = Case{ID: fmt.Sprint(k), AxialForce: make([]float64, size), External: make([][]float64, len(coords))}
				for e := range cases[k].AxialForce {
					cases[k].AxialForce[e] = 200*rng.Float64() - 100
				}
				for i := range cases[k].External {
					cases[k].External[i] = []float64{rng.Float64(), rng.Float64()}
				}
			}
			opt := Options{Size: true, Section: SectionFamily{Shape: ShapeTube, DiameterToThickness: 30}, MinimumArea: 1e-5, FloorArea: 100}
			b.ResetTimer()
			for b.Loop() {
				if _, err := Compute(m, cases, opt); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
