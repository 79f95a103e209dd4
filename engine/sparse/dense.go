package sparse

import (
	"sync"
	"sync/atomic"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
)

// syrkBlock is the width of the row strips in which updateMatrix splits a
// large symmetric update: small enough that a strip of L21ᵀ stays in cache,
// large enough for the matrix-multiply kernel to pay off.
const syrkBlock = 64

// updateMatrix sets the upper triangle of the r×r row-major u to −Aᵀ·A for
// the k×r matrix a, using scratch (at least r·k long, overwritten) for Aᵀ.
// A sits in its supernode's block with the block's long rows as stride, and
// gonum's Gemm multiplying a transposed A by a strided A runs at a fifth of
// the speed of the contiguous no-transpose by transpose form (measured here:
// 2.4 against 12 GFLOP/s on a 1024×3000 panel), so A is first copied to Aᵀ
// (r·k moves against r²·k multiply-adds). Large updates then go strip by
// strip: the diagonal block of each strip through Syrk and the rest of the
// strip through Gemm, which is blocked for the cache (gonum's Syrk streams
// the whole of its operand once per row of u). The split depends on r only,
// so the result does not depend on the number of workers; the strips are
// independent and run on up to workers goroutines.
func updateMatrix(a blas64.General, u, scratch []float64, workers int) {
	r, k := a.Cols, a.Rows
	at := scratch[:r*k]
	for l := 0; l < k; l++ {
		row := a.Data[l*a.Stride : l*a.Stride+r]
		for i, v := range row {
			at[i*k+l] = v
		}
	}
	rowsOf := func(i0, i1 int) blas64.General {
		return blas64.General{Rows: i1 - i0, Cols: k, Stride: k, Data: at[i0*k : i1*k]}
	}
	if r <= 2*syrkBlock {
		blas64.Syrk(blas.NoTrans, -1, rowsOf(0, r), 0, blas64.Symmetric{Uplo: blas.Upper, N: r, Stride: r, Data: u})
		return
	}
	strips := (r + syrkBlock - 1) / syrkBlock
	parallelFor(workers, strips, func(s int) {
		i0 := s * syrkBlock
		i1 := min(i0+syrkBlock, r)
		strip := rowsOf(i0, i1)
		blas64.Syrk(blas.NoTrans, -1, strip, 0, blas64.Symmetric{Uplo: blas.Upper, N: i1 - i0, Stride: r, Data: u[i0*r+i0:]})
		if i1 == r {
			return
		}
		blas64.Gemm(blas.NoTrans, blas.Trans, -1, strip, rowsOf(i1, r), 0,
			blas64.General{Rows: i1 - i0, Cols: r - i1, Stride: r, Data: u[i0*r+i1:]})
	})
}

// trsmBlock is the width of the column chunks in which solveBelow splits
// the off-diagonal block.
const trsmBlock = 128

// solveBelow overwrites the ns×r row-major b (stride ldb) with
// L11⁻¹·b, where t holds L11ᵀ in its upper triangle: in L's terms,
// L21 = A21·L11⁻ᵀ. Columns are independent, so chunks of trsmBlock columns
// run on up to workers goroutines; the chunking depends on r only.
func solveBelow(t blas64.Triangular, b blas64.General, workers int) {
	chunks := (b.Cols + trsmBlock - 1) / trsmBlock
	parallelFor(workers, chunks, func(k int) {
		c0 := k * trsmBlock
		c1 := min(c0+trsmBlock, b.Cols)
		blas64.Trsm(blas.Left, blas.Trans, 1, t,
			blas64.General{Rows: b.Rows, Cols: c1 - c0, Stride: b.Stride, Data: b.Data[c0:]})
	})
}

// parallelFor calls body(k) for k in [0, count) on up to workers
// goroutines, handing out indices in ascending order.
func parallelFor(workers, count int, body func(k int)) {
	if workers <= 1 || count <= 1 {
		for k := 0; k < count; k++ {
			body(k)
		}
		return
	}
	var next atomic.Int64
	var crash panicSlot
	var wg sync.WaitGroup
	for range min(workers, count) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			defer crash.catch(func() { next.Store(int64(count)) })
			for {
				k := int(next.Add(1)) - 1
				if k >= count {
					return
				}
				body(k)
			}
		}()
	}
	wg.Wait()
	crash.rethrow()
}

// panicSlot carries the first panic of a helper goroutine back to the
// goroutine that started it, where the caller can recover it: a panic left
// in a helper goroutine would end the whole process.
type panicSlot struct {
	once  sync.Once
	value any
	hit   atomic.Bool
}

// catch, deferred in a helper goroutine, records a panic and calls stop so
// the other helpers finish early.
func (p *panicSlot) catch(stop func()) {
	if r := recover(); r != nil {
		p.once.Do(func() {
			p.value = r
			p.hit.Store(true)
		})
		stop()
	}
}

// rethrow panics with the recorded value, if any, after the helpers ended.
func (p *panicSlot) rethrow() {
	if p.hit.Load() {
		panic(p.value)
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
	b := make([]float64, size)
	adviseHugePages(b)
	return b
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
