package rockheat

import (
	"syscall"
	"unsafe"
)

// hugePage is the size of a transparent huge page on x86-64 and arm64
// Linux, bytes.
const hugePage = 2 << 20

// hugePages asks Linux to back the whole huge pages that x covers, if
// any, with transparent huge pages (madvise(2), MADV_HUGEPAGE), which the
// kernel honours where they are enabled for advised memory
// (/sys/kernel/mm/transparent_hugepage/enabled: "madvise" or "always"),
// before x is first written. It is only advice: where the kernel
// declines, nothing changes.
func hugePages(x []float64) {
	if len(x)*8 < hugePage {
		return
	}
	p := uintptr(unsafe.Pointer(&x[0]))
	start := (p + hugePage - 1) &^ (hugePage - 1)
	end := (p + uintptr(len(x)*8)) &^ (hugePage - 1)
	if start < end {
		b := unsafe.Slice((*byte)(unsafe.Pointer(&x[0])), len(x)*8)
		_ = syscall.Madvise(b[start-p:end-p], syscall.MADV_HUGEPAGE)
	}
}
