package survivor

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// benchObservations is an invented study of n observations: five exposure
// times (0 to 20 min, D = 4 min, N0 = 10^7.5) in replicate, with a seeded
// log10 scatter of SD 0.1, so that no prerequisite is broken.
func benchObservations(n int) []Observation {
	rng := rand.New(rand.NewPCG(5, 6))
	obs := make([]Observation, n)
	for i := range obs {
		t := float64(i%5) * 5
		obs[i] = Observation{Minutes: t, Count: math.Pow(10, 7.5-t/4+0.1*rng.NormFloat64())}
	}
	return obs
}

func BenchmarkFit(b *testing.B) {
	for _, n := range []int{15, 10000} {
		obs := benchObservations(n)
		if r, err := Fit(obs, nil); err != nil || len(r.Warnings) > 0 {
			b.Fatalf("benchmark data: %v %q", err, r.Warnings)
		}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Fit(obs, nil); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/obs")
		})
	}
}

func BenchmarkCountPopulation(b *testing.B) {
	units := make([]Unit, 5)
	for i := range units {
		units[i] = Unit{SuspensionML: 10, Plates: []Plate{
			{Colonies: 150 + float64(i), Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 160 - float64(i), Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 15, Dilution: 1e-5, PlatedML: 0.1},
		}}
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := CountPopulation(units, nil); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(units)), "ns/unit")
}
