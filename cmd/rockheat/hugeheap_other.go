//go:build !linux

package main

// adviseHugeHeap does nothing outside Linux.
func adviseHugeHeap() {}
