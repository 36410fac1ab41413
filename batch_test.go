package rockheat

import (
	"fmt"
	"reflect"
	"slices"
	"sync"
	"testing"
)

// TestForBatches: every batch runs once; each first[w] runs on its
// worker before that worker's batches, also when there are more firsts
// than batches; and the error reported is that of the lowest failing
// batch, whatever the workers.
func TestForBatches(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ workers, firsts, from, to int }{{1, 1, 0, 5}, {2, 2, 2, 9}, {4, 2, 0, 1}, {8, 1, 3, 4}, {3, 0, 0, 7}} {
		name := fmt.Sprintf("%d workers, %d firsts, batches %d–%d", tc.workers, tc.firsts, tc.from, tc.to)
		var mu sync.Mutex
		ran := map[int]int{}
		done := map[int]bool{} // workers whose first ran
		var first []func()
		for w := range tc.firsts {
			first = append(first, func() {
				mu.Lock()
				done[w] = true
				mu.Unlock()
			})
		}
		started := 0
		err := forBatches(tc.workers, tc.from, tc.to, first, func(w int) func(b int) error {
			started++
			return func(b int) error {
				mu.Lock()
				defer mu.Unlock()
				if w < tc.firsts && !done[w] {
					t.Errorf("%s: worker %d ran batch %d before its first", name, w, b)
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
		if len(done) != tc.firsts {
			t.Errorf("%s: %d firsts ran, want %d", name, len(done), tc.firsts)
		}
		if want := max(min(tc.workers, tc.to-tc.from), tc.firsts); started != want {
			t.Errorf("%s: %d workers made, want %d", name, started, want)
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

// TestSensitivityRanksFromPlan: the demo's inputs, a Latin hypercube
// without correlations, take their ranks from the plan, and the
// sensitivities are those of ranking every input by sorting
// (stats.DoubledRanks), bit for bit, in a kept and in a selecting run.
func TestSensitivityRanksFromPlan(t *testing.T) {
	t.Parallel()
	for _, trials := range []int{100_000, 400_000} {
		var got [2][]Sensitivity
		for k, sort := range []bool{false, true} {
			r, set := newDemoRun(t, trials)
			if r.sensRanks == nil {
				t.Fatalf("%d trials: the demo's run takes no ranks from its plan", trials)
			}
			if sort {
				r.sensRanks = nil
			}
			var err error
			if set.keepsOutputs() {
				err = r.keepExact()
			} else {
				err = r.selectExact()
			}
			if err != nil {
				t.Fatal(err)
			}
			if !sort && slices.ContainsFunc(r.sensRanks, func(rk []int32) bool { return rk == nil }) {
				t.Errorf("%d trials: the plan gave no ranks for some inputs", trials)
			}
			res, err := r.result()
			if err != nil {
				t.Fatal(err)
			}
			got[k] = res.Sensitivity
		}
		if len(got[0]) == 0 || !reflect.DeepEqual(got[0], got[1]) {
			t.Errorf("%d trials: sensitivities with the plan's ranks differ from sorting's:\n%+v\n%+v", trials, got[0], got[1])
		}
	}
}
