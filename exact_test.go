package rockheat

import (
	"reflect"
	"testing"

	"rockheat/stats"
)

// TestSelectorMissFallsBack makes the one-pass selection of an exact run
// miss, as a misleading pilot would, and checks that the run then keeps
// its outputs and returns the summaries of a run that kept them from the
// start (Summarize on the full columns).
func TestSelectorMissFallsBack(t *testing.T) {
	t.Parallel()
	rn := &Run{Title: "miss", Model: goReservoir(t)}
	run := func(keep bool) *run {
		c, err := rn.resolve()
		if err != nil {
			t.Fatal(err)
		}
		s, err := resolveOptions(c, Options{Trials: keepOutputsLimit + 1000, Workers: 2, KeepSamples: keep})
		if err != nil {
			t.Fatal(err)
		}
		return newRun(c, s)
	}
	kept := run(true)
	if err := kept.keepExact(); err != nil {
		t.Fatal(err)
	}
	want, err := kept.outputs()
	if err != nil {
		t.Fatal(err)
	}
	r := run(false)
	if err := r.selectExact(); err != nil {
		t.Fatal(err)
	}
	// A pilot of one value far above every output brackets nothing.
	r.selection.sels[0] = stats.NewSelector(r.s.trials, r.s.stat, []float64{1e300})
	if _, ok := r.selectedOutputs(); ok {
		t.Fatal("a selector bracketed from a misleading pilot did not report its miss")
	}
	got, err := r.outputs()
	if err != nil {
		t.Fatal(err)
	}
	if r.exactOut == nil {
		t.Error("after a miss the run did not keep its outputs")
	}
	for j := range want {
		if !reflect.DeepEqual(got[j].Summary, want[j].Summary) {
			t.Errorf("%s: after a miss %+v, kept run %+v", want[j].Spec.Name, got[j].Summary, want[j].Summary)
		}
	}
	if r.ranTrials() != kept.ranTrials() || r.zero.Load() != kept.zero.Load() {
		t.Errorf("after a miss %d trials (%d without heat), kept run %d (%d)", r.ranTrials(), r.zero.Load(), kept.ranTrials(), kept.zero.Load())
	}
}

// TestExactRoute: exact runs hold their outputs up to keepOutputsLimit
// trials, or when asked to keep their trials, and select beyond it.
func TestExactRoute(t *testing.T) {
	t.Parallel()
	c, err := (&Run{Title: "route", Model: goReservoir(t)}).resolve()
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		opt  Options
		keep bool
	}{
		{Options{Trials: keepOutputsLimit}, true},
		{Options{Trials: keepOutputsLimit + 1}, false},
		{Options{Trials: keepOutputsLimit + 1, KeepSamples: true}, true},
		{Options{Trials: ExactLimit + 1}, false}, // streaming
	} {
		s, err := resolveOptions(c, tc.opt)
		if err != nil {
			t.Fatal(err)
		}
		if got := s.keepsOutputs(); got != tc.keep {
			t.Errorf("%+v: keeps its outputs %v, want %v", tc.opt, got, tc.keep)
		}
	}
}
