package heatmodel

// chunkTestTrials is the length of the chunked models' tests: two full
// chunks and a short one.
const chunkTestTrials = 2*chunkTrials + 37

// chunkTestColumn returns chunkTestTrials values x·(1 + (i mod step)/100):
// a column that repeats every step trials, so that columns of different
// steps pair their values differently across the chunks.
func chunkTestColumn(x float64, step int) Column {
	c := make([]float64, chunkTestTrials)
	for i := range c {
		c[i] = x * (1 + float64(i%step)/100)
	}
	return Vary(c)
}
