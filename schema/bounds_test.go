package schema

import (
	"fmt"
	"testing"

	"gusset/protocol"
)

// BenchmarkCheckBounds walks the params of a solve of a chain of n members:
// the cost the full check of array bounds adds to every request.
func BenchmarkCheckBounds(b *testing.B) {
	for _, n := range []int{1000, 100000} {
		p := &protocol.SolveParams{}
		for i := range n + 1 {
			p.Model.Nodes = append(p.Model.Nodes, protocol.Node{ID: fmt.Sprint("n", i), At: []protocol.Number{{Value: float64(i)}, {Value: 0}}})
		}
		for i := range n {
			p.Model.Members = append(p.Model.Members, protocol.Member{ID: fmt.Sprint("m", i), Ends: []string{fmt.Sprint("n", i), fmt.Sprint("n", i+1)}})
		}
		b.Run(fmt.Sprintf("members=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if problems := CheckBounds(p); len(problems) != 0 {
					b.Fatal(problems)
				}
			}
		})
	}
}
