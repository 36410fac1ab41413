package rockheat

import (
	"fmt"
	"sync"
	"testing"
)

// TestForBatches: every batch runs once; with first, every worker calls it
// before its batches, also a worker left without a batch; and the error
// reported is that of the lowest failing batch, whatever the workers.
func TestForBatches(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ workers, from, to int }{{1, 0, 5}, {2, 2, 9}, {4, 0, 2}, {8, 3, 4}} {
		name := fmt.Sprintf("%d workers, batches %d–%d", tc.workers, tc.from, tc.to)
		var mu sync.Mutex
		ran := map[int]int{}
		firsts := map[int]bool{}
		err := forBatches(tc.workers, tc.from, tc.to, func(w int) {
			mu.Lock()
			firsts[w] = true
			mu.Unlock()
		}, func(w int) func(b int) error {
			return func(b int) error {
				mu.Lock()
				defer mu.Unlock()
				if !firsts[w] {
					t.Errorf("%s: worker %d ran batch %d before first", name, w, b)
				}
				ran[b]++
				return nil
			}
		})
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		for b := tc.from; b < tc.to; b++ {
			if ran[b] != 1 {
				t.Errorf("%s: batch %d ran %d times", name, b, ran[b])
			}
		}
		if len(ran) != tc.to-tc.from {
			t.Errorf("%s: batches run %v", name, ran)
		}
		if len(firsts) != tc.workers {
			t.Errorf("%s: first called by %d workers, want all %d", name, len(firsts), tc.workers)
		}
	}
	for _, workers := range []int{1, 3} {
		err := forBatches(workers, 0, 10, nil, func(int) func(b int) error {
			return func(b int) error {
				if b == 4 || b == 7 {
					return fmt.Errorf("batch %d", b)
				}
				return nil
			}
		})
		if want := "batch 4"; err == nil || err.Error() != want {
			t.Errorf("%d workers: error %v, want %q", workers, err, want)
		}
	}
}
