package fraction

import (
	"math"
	"testing"
)

// FuzzEstimators feeds arbitrary studies to every procedure: none may
// panic, and every result must be consistent (finite positive D inside its
// limits).
func FuzzEstimators(f *testing.F) {
	f.Add(6.0, 1.0, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, false)
	f.Add(6.0, 1.0, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, true)
	f.Add(1.0, 0.01, []byte{0, 30, 0, 3, 30, 10, 6, 30, 27, 9, 30, 30}, true)
	f.Add(12.0, 1000.0, []byte{5, 25, 0, 6, 25, 9, 7, 25, 25}, false)
	f.Add(math.NaN(), 1.0, []byte{1, 1, 1}, false)
	f.Add(0.3, 1.0, []byte{0, 20, 0, 5, 20, 1, 10, 20, 20}, false)
	f.Fuzz(func(t *testing.T, l, scale float64, data []byte, fit bool) {
		var exp []Exposure
		for i := 0; i+2 < len(data) && len(exp) < 30; i += 3 {
			exp = append(exp, Exposure{Minutes: float64(data[i]) * scale, Units: int(data[i+1]) - 5, Negative: int(data[i+2]) - 5})
		}
		check := func(name string, v, lo, up float64, err error) {
			if err != nil {
				return
			}
			if !(v > 0) || math.IsInf(v, 0) {
				t.Fatalf("%s: D = %g for %v (log10 N0 %g)", name, v, exp, l)
			}
			if !math.IsNaN(lo) && !(lo <= v && v <= up) {
				t.Fatalf("%s: D = %g outside its limits %g – %g for %v (log10 N0 %g)", name, v, lo, up, exp, l)
			}
		}
		if r, err := HSK(l, exp); err == nil {
			check("HSK", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, err)
		}
		if r, err := LimitedHSK(l, exp); err == nil {
			check("LimitedHSK", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, err)
		}
		if r, err := SMC(l, exp); err == nil {
			check("SMC", r.Estimate.Value, math.NaN(), math.NaN(), err)
		}
		if len(exp) > 0 {
			if r, err := SMCAt(l, exp, exp[0].Minutes); err == nil {
				check("SMCAt", r.Estimate.Value, math.NaN(), math.NaN(), err)
			}
		}
		if r, err := MLE(l, exp, &MLESettings{FitN0: fit}); err == nil {
			check("MLE", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, err)
		}
		_, _ = PlanStudy(scale, l, len(data), len(exp), &PlanSettings{Simulations: len(exp) % 3, FitN0: fit})
	})
}
