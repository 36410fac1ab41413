package water

import (
	"math/rand/v2"
	"testing"
)

// benchStates returns n reservoir-like liquid states: 20–350 °C at 1 MPa
// above the saturation pressure up to 100 MPa.
func benchStates(n int) (p, T []float64) {
	rnd := rand.New(rand.NewPCG(1, 2))
	p, T = make([]float64, n), make([]float64, n)
	for i := range n {
		T[i] = 293.15 + rnd.Float64()*(Region1MaxTemperature-293.15)
		ps := saturationPressure(T[i])
		p[i] = ps + 1e6 + rnd.Float64()*(MaxPressure-ps-1e6)
	}
	return p, T
}

var sink State

func BenchmarkRegion1(b *testing.B) {
	p, T := benchStates(1024)
	i := 0
	for b.Loop() {
		st, err := Region1(p[i&1023], T[i&1023])
		if err != nil {
			b.Fatal(err)
		}
		sink = st
		i++
	}
}

func BenchmarkLiquid(b *testing.B) {
	p, T := benchStates(1024)
	i := 0
	for b.Loop() {
		st, err := Liquid(p[i&1023], T[i&1023])
		if err != nil {
			b.Fatal(err)
		}
		sink = st
		i++
	}
}

func BenchmarkRegion2(b *testing.B) {
	rnd := rand.New(rand.NewPCG(1, 2))
	p, T := make([]float64, 1024), make([]float64, 1024)
	for i := range p {
		T[i] = 400 + rnd.Float64()*600
		p[i] = 1e3 + rnd.Float64()*0.2e6
	}
	i := 0
	for b.Loop() {
		st, err := Region2(p[i&1023], T[i&1023])
		if err != nil {
			b.Fatal(err)
		}
		sink = st
		i++
	}
}

var sinkF float64

func BenchmarkSaturationPressure(b *testing.B) {
	_, T := benchStates(1024)
	i := 0
	for b.Loop() {
		ps, err := SaturationPressure(T[i&1023])
		if err != nil {
			b.Fatal(err)
		}
		sinkF = ps
		i++
	}
}

func BenchmarkSaturationTemperature(b *testing.B) {
	p, _ := benchStates(1024)
	for k := range p {
		p[k] = 1e3 + p[k]*0.2
	}
	i := 0
	for b.Loop() {
		Ts, err := SaturationTemperature(p[i&1023])
		if err != nil {
			b.Fatal(err)
		}
		sinkF = Ts
		i++
	}
}
