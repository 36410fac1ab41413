package rockheat

import (
	"os"
	"runtime"
	"strings"
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

// hugeHeapBytes is how much of the heap AdviseHugeHeap advises: more than
// a run of the demo at 10^6 trials uses (about 50 MB), the size of those
// where start-up and page faults are a large share of the time.
const hugeHeapBytes = 64 << 20

// AdviseHugeHeap asks Linux to back the first hugeHeapBytes of the heap a
// run grows into with transparent huge pages (madvise(2), MADV_HUGEPAGE,
// honoured where /sys/kernel/mm/transparent_hugepage/enabled is
// "madvise" or "always"): it allocates that much, untouched, advises it
// and frees it at once by a collection, so that the runtime, which reuses
// free heap from the lowest address, puts the run's columns, sketches and
// selections there, and the advice stays with the mapping while the
// runtime keeps it. A run then takes one page fault for 2 MB where it
// took 512, and on a virtual machine a fault costs microseconds: on this
// project's 2-core VM the demo at 10^6 trials went from 6 300 faults and
// 120 ms to 1 500 and 100 ms, for 2-4 MB more peak memory (README,
// "Speed"). It is only advice: where the kernel declines, nothing
// changes. GODEBUG=disablethp=1, the Go runtime's own switch against
// huge pages for the heap, turns it off. It is for a program that owns
// its process, as the rockheat command does before its runs: it costs a
// collection, some 2–7 ms, that a command without a run (--version,
// validate) would only lose.
func AdviseHugeHeap() {
	if strings.Contains(os.Getenv("GODEBUG"), "disablethp=1") {
		return
	}
	b := make([]byte, hugeHeapBytes)
	// The advice reaches down to the 64 MB boundary below b: the free
	// pages just below it, left by start-up's garbage, are where the
	// runtime puts the next large allocation first, and a column that
	// began there would begin outside the advice (the heap's arenas are
	// 64 MB-aligned on 64-bit Linux, so the range stays in the heap's
	// mapping; where it does not, the mapped part is advised and the
	// error is of no use). The range goes to madvise(2) as numbers, not as
	// a Go pointer: below b there may be free heap, which no pointer may
	// address.
	start := uintptr(unsafe.Pointer(&b[0]))
	lo := start &^ (hugeHeapBytes - 1)
	_, _, _ = syscall.Syscall(syscall.SYS_MADVISE, lo, start+hugeHeapBytes-lo, syscall.MADV_HUGEPAGE)
	runtime.KeepAlive(b)
	runtime.GC() // frees b now, before the run's first allocations
}
