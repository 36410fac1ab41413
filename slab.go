package rockheat

// columns returns k columns of n values each (see columnSets).
func columns(k, n int) [][]float64 { return columnSets(n, k)[0] }

// columnSets returns, for each count k of ks, k columns of n values each,
// all carved from one allocation that the operating system may back with
// huge pages (hugePages): a run's columns are written in full, batch
// after batch, and on a virtual machine a page fault costs microseconds,
// so one fault for 2 MB rather than 512 of 4 kB is worth several per cent
// of a run of 10^6 trials. The larger the allocation, the more of it lies
// in whole huge pages.
func columnSets(n int, ks ...int) [][][]float64 {
	total := 0
	for _, k := range ks {
		total += k * n
	}
	slab := make([]float64, total)
	hugePages(slab)
	sets := make([][][]float64, len(ks))
	for s, k := range ks {
		sets[s] = make([][]float64, k)
		for j := range sets[s] {
			sets[s][j], slab = slab[:n:n], slab[n:]
		}
	}
	return sets
}
