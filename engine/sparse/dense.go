package sparse

import (
	"sync"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
)

// syrkBlock is the width of the row strips in which updateMatrix splits a
// large symmetric update: small enough that a strip of L21ᵀ stays in cache,
// large enough for the matrix-multiply kernel to pay off.
const syrkBlock = 64

// updateMatrix sets the upper triangle of the r×r row-major u to −Aᵀ·A for
// the k×r matrix a. Large updates go strip by strip: the diagonal block of
// each strip through Syrk and the rest of the strip through Gemm, which is
// blocked for the cache (gonum's Syrk streams the whole of A once per row of
// u). The split depends on r only, so the result does not depend on the
// number of workers.
func updateMatrix(a blas64.General, u []float64) {
	r := a.Cols
	if r <= 2*syrkBlock {
		blas64.Syrk(blas.Trans, -1, a, 0, blas64.Symmetric{Uplo: blas.Upper, N: r, Stride: r, Data: u})
		return
	}
	for i0 := 0; i0 < r; i0 += syrkBlock {
		i1 := min(i0+syrkBlock, r)
		strip := blas64.General{Rows: a.Rows, Cols: i1 - i0, Stride: a.Stride, Data: a.Data[i0:]}
		blas64.Syrk(blas.Trans, -1, strip, 0, blas64.Symmetric{Uplo: blas.Upper, N: i1 - i0, Stride: r, Data: u[i0*r+i0:]})
		if i1 == r {
			break
		}
		rest := blas64.General{Rows: a.Rows, Cols: r - i1, Stride: a.Stride, Data: a.Data[i1:]}
		blas64.Gemm(blas.Trans, blas.NoTrans, -1, strip, rest, 0,
			blas64.General{Rows: i1 - i0, Cols: r - i1, Stride: r, Data: u[i0*r+i1:]})
	}
}

// bufferPool recycles the update matrices of the multifrontal method, which
// live from a supernode's factorisation to its parent's: fresh memory for
// each would cost page faults and clearing far above the arithmetic on it.
// Buffers are fully overwritten before use, so reuse cannot change results.
type bufferPool struct {
	mu   sync.Mutex
	free [][]float64
}

// get returns a buffer of length size, recycled when one is large enough.
func (p *bufferPool) get(size int) []float64 {
	p.mu.Lock()
	best := -1
	for i, b := range p.free {
		if cap(b) >= size && (best < 0 || cap(b) < cap(p.free[best])) {
			best = i
		}
	}
	if best >= 0 {
		b := p.free[best]
		p.free[best] = p.free[len(p.free)-1]
		p.free = p.free[:len(p.free)-1]
		p.mu.Unlock()
		return b[:size]
	}
	p.mu.Unlock()
	return make([]float64, size)
}

// put returns a buffer to the pool.
func (p *bufferPool) put(b []float64) {
	if cap(b) == 0 {
		return
	}
	p.mu.Lock()
	p.free = append(p.free, b)
	p.mu.Unlock()
}
