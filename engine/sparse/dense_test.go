package sparse

import (
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/mat"
)

// TestUpdateMatrix compares the strip-wise update −AᵀA with gonum's dense
// product (reference library), below and above the strip threshold, with
// one and two workers and from inside a wider block (which must all agree
// bit for bit).
func TestUpdateMatrix(t *testing.T) {
	for _, r := range []int{1, 50, 300} {
		k := 37
		a := randomVec(k*r, uint64(r))
		var want mat.Dense
		am := mat.NewDense(k, r, a)
		want.Mul(am.T(), am)
		// The same A inside a block with longer rows, as in a supernode.
		const extra = 7
		wide := nanVec(k * (r + extra))
		for l := 0; l < k; l++ {
			copy(wide[l*(r+extra):], a[l*r:(l+1)*r])
		}
		var first []float64
		for _, workers := range []int{1, 2, -1} {
			u := nanVec(r * r)
			in := blas64.General{Rows: k, Cols: r, Stride: r, Data: a}
			if workers < 0 { // the strided block, one worker
				in, workers = blas64.General{Rows: k, Cols: r, Stride: r + extra, Data: wide}, 1
			}
			updateMatrix(in, u, nanVec(k*r), workers)
			for i := 0; i < r; i++ {
				for j := i; j < r; j++ {
					if !scalar.EqualWithinAbsOrRel(u[i*r+j], -want.At(i, j), 1e-12, 1e-12) {
						t.Fatalf("r=%d: U[%d,%d] = %v, want %v", r, i, j, u[i*r+j], -want.At(i, j))
					}
				}
			}
			if first == nil {
				first = u
				continue
			}
			for i := 0; i < r; i++ {
				for j := i; j < r; j++ {
					if u[i*r+j] != first[i*r+j] {
						t.Fatalf("r=%d: workers or stride change U[%d,%d]", r, i, j)
					}
				}
			}
		}
	}
}

// TestSolveBelow checks X = L⁻¹·B for the chunked triangular solve by
// multiplying back with gonum (reference library): L·X = B.
func TestSolveBelow(t *testing.T) {
	ns, cols := 20, 300
	// A well-conditioned upper triangle U = Lᵀ.
	u := make([]float64, ns*ns)
	vals := randomVec(ns*ns, 3)
	for i := 0; i < ns; i++ {
		for j := i; j < ns; j++ {
			u[i*ns+j] = vals[i*ns+j] / float64(ns)
		}
		u[i*ns+i] = 2
	}
	b := randomVec(ns*cols, 4)
	x := append([]float64(nil), b...)
	solveBelow(blas64.Triangular{Uplo: blas.Upper, Diag: blas.NonUnit, N: ns, Stride: ns, Data: u},
		blas64.General{Rows: ns, Cols: cols, Stride: cols, Data: x}, 2)
	var got mat.Dense
	got.Mul(mat.NewTriDense(ns, mat.Upper, u).T(), mat.NewDense(ns, cols, x))
	for i := 0; i < ns; i++ {
		for j := 0; j < cols; j++ {
			if !scalar.EqualWithinAbsOrRel(got.At(i, j), b[i*cols+j], 1e-12, 1e-12) {
				t.Fatalf("(Uᵀ·X)[%d,%d] = %v, want %v", i, j, got.At(i, j), b[i*cols+j])
			}
		}
	}
}

// TestParallelForPanic: a panic in a helper goroutine reaches the caller,
// where it can be recovered (a panic left in a goroutine ends the process).
func TestParallelForPanic(t *testing.T) {
	defer func() {
		if r := recover(); r != "boom" {
			t.Errorf("recovered %v, want boom", r)
		}
	}()
	parallelFor(2, 10, func(k int) {
		if k == 3 {
			panic("boom")
		}
	})
	t.Error("parallelFor returned normally")
}
