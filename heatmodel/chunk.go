package heatmodel

// chunkTrials is the number of trials a model's loop takes at a time
// (see chunks).
const chunkTrials = 512

// chunks serves a model's columns a chunk of trials at a time, as plain
// slices of one length, so that its loop reads every input the same way,
// with no test of whether a column is constant and no bounds checks: a
// varying column's own values, or a buffer filled once with a constant
// column's value. It holds up to len(buf) constant columns, and scratch
// for an output that is not wanted. A model calls span for each input in
// its own loop: a helper that stored span's slices into a slice it was
// given would let the buffers escape, and a chunks of 60 kB would be
// allocated on every call (escape analysis: "leaking param: ch").
type chunks struct {
	buf     [14][chunkTrials]float64
	filled  [14]bool
	scratch [chunkTrials]float64
}

// span returns the values of column c, input k of the model, for trials
// [lo, hi), hi − lo ≤ chunkTrials.
func (ch *chunks) span(k int, c Column, lo, hi int) []float64 {
	if c.Values != nil {
		return c.Values[lo:hi]
	}
	if !ch.filled[k] {
		for i := range ch.buf[k] {
			ch.buf[k][i] = c.Const
		}
		ch.filled[k] = true
	}
	return ch.buf[k][:hi-lo]
}
