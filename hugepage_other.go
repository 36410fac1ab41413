//go:build !linux

package rockheat

// hugePages does nothing outside Linux.
func hugePages(x []float64) {}

// AdviseHugeHeap does nothing outside Linux.
func AdviseHugeHeap() {}
