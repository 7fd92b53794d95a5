package fraction

import (
	"fmt"
	"math"
	"testing"
)

// benchStudy is a seven-exposure study (invented data, the lot-a study of
// testdata/fraction/studies.tsv).
var benchStudy = []Exposure{{8, 20, 0}, {10, 20, 0}, {12, 20, 6}, {14, 20, 17}, {16, 20, 19}, {18, 20, 20}, {20, 20, 20}}

func BenchmarkHSK(b *testing.B) {
	b.Run("general/7", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if _, err := HSK(6, benchStudy); err != nil {
				b.Fatal(err)
			}
		}
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(benchStudy)), "ns/exposure")
	})
	b.Run("limited/7", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if _, err := LimitedHSK(6, benchStudy); err != nil {
				b.Fatal(err)
			}
		}
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(benchStudy)), "ns/exposure")
	})
}

func BenchmarkSMC(b *testing.B) {
	b.Run("mean/7", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if _, err := SMC(6, benchStudy); err != nil {
				b.Fatal(err)
			}
		}
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(len(benchStudy)), "ns/exposure")
	})
	b.Run("at/7", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if _, err := SMCAt(6, benchStudy, 14); err != nil {
				b.Fatal(err)
			}
		}
	})
}

// BenchmarkMLE times the maximum-likelihood estimate with profile limits on
// a seven-exposure study (target: under 50 µs), with N0 fixed and fitted.
func BenchmarkMLE(b *testing.B) {
	// A 15-exposure study: the planned design for D = 2 min, log10 N0 = 6,
	// 20 units, with the expected negatives rounded (invented data).
	p, err := PlanStudy(2, 6, 20, 15, nil)
	if err != nil {
		b.Fatal(err)
	}
	long := make([]Exposure, len(p.Exposures))
	for i, e := range p.Exposures {
		long[i] = Exposure{e.Minutes, e.Units, int(math.Round(e.ExpectedNegative))}
	}
	for _, study := range [][]Exposure{benchStudy, long} {
		for _, fit := range []bool{false, true} {
			name := fmt.Sprintf("n0=fixed/exposures=%d", len(study))
			if fit {
				name = fmt.Sprintf("n0=fitted/exposures=%d", len(study))
			}
			b.Run(name, func(b *testing.B) {
				s := &MLESettings{FitN0: fit}
				b.ReportAllocs()
				for b.Loop() {
					if _, err := MLE(6, study, s); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/1000, "µs/study")
			})
		}
	}
}
