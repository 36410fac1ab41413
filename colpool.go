package rockheat

import "sync"

// colPool lends columns of one length to the workers of a portfolio's
// prospects, so that a batch holds the draws and outputs of the few
// prospects being evaluated, not of every prospect. It is safe for
// concurrent use.
type colPool struct {
	mu   sync.Mutex
	size int         // length of every column
	free [][]float64 // columns given back
}

// take returns k columns, reused or new.
func (p *colPool) take(k int) [][]float64 {
	cols := make([][]float64, k)
	for j := range cols {
		cols[j] = p.one()
	}
	return cols
}

// one returns a column, reused or new.
func (p *colPool) one() []float64 {
	p.mu.Lock()
	defer p.mu.Unlock()
	if n := len(p.free); n > 0 {
		c := p.free[n-1]
		p.free = p.free[:n-1]
		return c
	}
	return make([]float64, p.size)
}

// give takes back columns that take or one returned; nil ones are skipped.
func (p *colPool) give(cols [][]float64) {
	p.mu.Lock()
	defer p.mu.Unlock()
	for _, c := range cols {
		if c != nil {
			p.free = append(p.free, c)
		}
	}
}
