package sparse

import (
	"syscall"
	"unsafe"
)

// hugePageMin is the size in bytes from which adviseHugePages asks for huge
// pages: two of them, so that at least one whole aligned huge page lies
// inside the array.
const hugePageMin = 4 << 20

// adviseHugePages asks the kernel to back the fresh, untouched array v with
// transparent huge pages (madvise MADV_HUGEPAGE) where the system allows
// them only on request. The factor and the large update matrices are
// touched first by the factorisation; with 4 KiB pages each first touch is
// a page fault and every pass over L misses the TLB, which on the
// 180,600-equation plane grid cost about a third of the numeric
// factorisation's user time (measured; common practice for large dense
// work arrays). The advice changes no value; a refusal (an old kernel,
// huge pages disabled) is ignored.
func adviseHugePages(v []float64) {
	size := len(v) * 8
	if size < hugePageMin {
		return
	}
	b := unsafe.Slice((*byte)(unsafe.Pointer(unsafe.SliceData(v))), size)
	_ = syscall.Madvise(b, syscall.MADV_HUGEPAGE)
}
