package fraction

import (
	"encoding/json"
	"errors"
	"math"
	"testing"
)

// The fuzz tests check that no input makes a function of the package
// panic, that every refusal wraps exactly one documented sentinel, that
// every accepted result is consistent (finite positive D inside its limits,
// probabilities in [0, 1]) and marshals to JSON, and that the caller's
// slice is not modified. Studies are bounded (at most 30 exposures) so that
// each input costs at most some hundreds of microseconds.

// sentinels lists every error sentinel of the package (TestSentinels
// checks the list against the source).
var sentinels = []error{ErrInvalidPopulation, ErrTooFewExposures, ErrInvalidTime, ErrInvalidUnits, ErrInvalidNegatives,
	ErrDuplicateTime, ErrNoAllPositive, ErrNoAllNegative, ErrUnequalUnits, ErrUnequalIntervals, ErrLimitedDesign,
	ErrNotFractional, ErrNotAnExposure, ErrNoFractional, ErrSMCUndefined, ErrNoInformation, ErrInvalidLevel,
	ErrNoConvergence, ErrInvalidPlan}

// sentinelCount returns how many of the sentinels err wraps.
func sentinelCount(err error) int {
	n := 0
	for _, s := range sentinels {
		if errors.Is(err, s) {
			n++
		}
	}
	return n
}

// fuzzStudy decodes up to 30 exposures from data, three bytes each: time
// b0·scale, units b1 − 5 and negatives b2 − 5 (so that invalid counts
// occur too).
func fuzzStudy(scale float64, data []byte) []Exposure {
	var exp []Exposure
	for i := 0; i+2 < len(data) && len(exp) < 30; i += 3 {
		exp = append(exp, Exposure{Minutes: float64(data[i]) * scale, Units: int(data[i+1]) - 5, Negative: int(data[i+2]) - 5})
	}
	return exp
}

// checkRefusal fails unless err wraps exactly one sentinel.
func checkRefusal(t *testing.T, name string, err error) {
	t.Helper()
	if n := sentinelCount(err); n != 1 {
		t.Fatalf("%s: error %q wraps %d sentinels", name, err, n)
	}
}

// checkD fails unless v is a finite D > 0 with lo ≤ v ≤ up (NaN limits
// are allowed where the procedure gives none).
func checkD(t *testing.T, name string, v, lo, up float64, exp []Exposure, l float64) {
	t.Helper()
	if !(v > 0) || math.IsInf(v, 0) {
		t.Fatalf("%s: D = %g for %v (log10 N0 %g)", name, v, exp, l)
	}
	if !math.IsNaN(lo) && !(lo <= v && v <= up) || math.IsNaN(lo) != math.IsNaN(up) {
		t.Fatalf("%s: D = %g outside its limits %g – %g for %v (log10 N0 %g)", name, v, lo, up, exp, l)
	}
}

// FuzzEstimators feeds arbitrary studies to every procedure: none may
// panic, and every result must be consistent.
func FuzzEstimators(f *testing.F) {
	f.Add(6.0, 1.0, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, false)
	f.Add(6.0, 1.0, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, true)
	f.Add(1.0, 0.01, []byte{0, 30, 0, 3, 30, 10, 6, 30, 27, 9, 30, 30}, true)
	f.Add(12.0, 1000.0, []byte{5, 25, 0, 6, 25, 9, 7, 25, 25}, false)
	f.Add(math.NaN(), 1.0, []byte{1, 1, 1}, false)
	f.Add(0.3, 1.0, []byte{0, 20, 0, 5, 20, 1, 10, 20, 20}, false)
	f.Fuzz(func(t *testing.T, l, scale float64, data []byte, fit bool) {
		exp := fuzzStudy(scale, data)
		before := append([]Exposure(nil), exp...)
		for _, hsk := range []struct {
			name string
			f    func(float64, []Exposure) (HSKResult, error)
		}{{"HSK", HSK}, {"LimitedHSK", LimitedHSK}} {
			r, err := hsk.f(l, exp)
			if err != nil {
				checkRefusal(t, hsk.name, err)
				continue
			}
			e := r.Estimate
			checkD(t, hsk.name, e.Value, e.Lower, e.Upper, exp, l)
			if !(r.MeanTime > 0) || !(r.Variance >= 0) || math.IsInf(r.Variance, 0) || len(r.Used)+len(r.Excluded) != len(exp) {
				t.Fatalf("%s: Ū %g, V %g, %d used, %d excluded of %d", hsk.name, r.MeanTime, r.Variance, len(r.Used), len(r.Excluded), len(exp))
			}
			if _, err := json.Marshal(r); err != nil {
				t.Fatalf("%s: json.Marshal: %v", hsk.name, err)
			}
		}
		if r, err := SMC(l, exp); err != nil {
			checkRefusal(t, "SMC", err)
		} else {
			checkD(t, "SMC", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, exp, l)
			for _, p := range r.Points {
				if !(p.D > 0) || math.IsInf(p.D, 0) || !(p.Survivors > 0) {
					t.Fatalf("SMC point %+v", p)
				}
			}
			if len(r.Points)+len(r.Excluded) != len(exp) || !(r.SD >= 0) && !(math.IsNaN(r.SD) && len(r.Points) == 1) {
				t.Fatalf("SMC: %d points, %d excluded of %d, SD %v", len(r.Points), len(r.Excluded), len(exp), r.SD)
			}
			if _, err := json.Marshal(r); err != nil {
				t.Fatalf("SMC: json.Marshal: %v", err)
			}
		}
		// SMCAt at every exposure time and between two of them.
		times := []float64{scale * 0.5}
		for _, e := range exp {
			times = append(times, e.Minutes)
		}
		for _, at := range times {
			r, err := SMCAt(l, exp, at)
			if err != nil {
				checkRefusal(t, "SMCAt", err)
				continue
			}
			checkD(t, "SMCAt", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, exp, l)
			if _, err := json.Marshal(r); err != nil {
				t.Fatalf("SMCAt: json.Marshal: %v", err)
			}
		}
		checkMLE(t, l, exp, &MLESettings{FitN0: fit})
		for i := range exp {
			if exp[i] != before[i] {
				t.Fatalf("exposure %d changed from %+v to %+v", i, before[i], exp[i])
			}
		}
	})
}

// checkMLE runs MLE and checks its result.
func checkMLE(t *testing.T, l float64, exp []Exposure, s *MLESettings) {
	t.Helper()
	r, err := MLE(l, exp, s)
	if err != nil {
		checkRefusal(t, "MLE", err)
		return
	}
	e := r.Estimate
	checkD(t, "MLE", e.Value, e.Lower, e.Upper, exp, l)
	switch {
	case !(e.Lower >= 0) || math.IsNaN(e.Upper):
		t.Fatalf("MLE limits %v – %v", e.Lower, e.Upper)
	case !(r.Slope < 0) || math.IsInf(r.Intercept, 0) || math.IsNaN(r.Intercept) || math.IsNaN(r.Log10N0) || math.IsInf(r.Log10N0, 0):
		t.Fatalf("MLE slope %v, intercept %v, log10 N0 %v", r.Slope, r.Intercept, r.Log10N0)
	case !(r.Deviance >= -1e-9*(1+math.Abs(r.LogLikelihood))) || math.IsInf(r.Deviance, 0):
		t.Fatalf("MLE deviance %v", r.Deviance)
	case r.DF > 0 && !(r.FitP >= 0 && r.FitP <= 1), r.DF <= 0 && !math.IsNaN(r.FitP):
		t.Fatalf("MLE fit p %v on %d df", r.FitP, r.DF)
	case len(r.Fitted) != len(exp):
		t.Fatalf("MLE: %d fitted of %d", len(r.Fitted), len(exp))
	}
	for _, x := range r.Fitted {
		if !(x.ProbabilityNegative >= 0 && x.ProbabilityNegative <= 1) {
			t.Fatalf("MLE fitted %+v", x)
		}
	}
	if _, err := json.Marshal(r); err != nil {
		t.Fatalf("MLE: json.Marshal: %v", err)
	}
}

// FuzzMLE fuzzes the likelihood with its level and N0 setting, on studies
// with many units per exposure (up to 10⁴, where the likelihood is sharp).
func FuzzMLE(f *testing.F) {
	f.Add(6.0, 1.0, 0.95, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, uint8(0), false)
	f.Add(6.0, 1.0, 0.5, []byte{8, 20, 0, 10, 20, 0, 12, 20, 6, 14, 20, 17, 16, 20, 19, 18, 20, 20}, uint8(7), true)
	f.Add(12.0, 1000.0, 0.999999, []byte{5, 25, 0, 6, 25, 9, 7, 25, 25}, uint8(2), true)
	f.Add(300.0, 1e-3, 1e-9, []byte{0, 10, 0, 200, 10, 5, 255, 10, 10}, uint8(3), false)
	f.Fuzz(func(t *testing.T, l, scale, level float64, data []byte, unitsExp uint8, fit bool) {
		exp := fuzzStudy(scale, data)
		// Multiply units and negatives by 10^(unitsExp mod 4): large studies.
		m := int(math.Pow10(int(unitsExp % 4)))
		for i := range exp {
			exp[i].Units *= m
			exp[i].Negative *= m
		}
		checkMLE(t, l, exp, &MLESettings{FitN0: fit, Level: level})
	})
}

// FuzzPlanStudy checks that PlanStudy never panics and that an accepted
// plan is consistent: exposures rising from the survival to the kill time,
// probabilities in [0, 1] rising with time, D inside its expected limits,
// and a simulation whose figures are proportions or medians.
func FuzzPlanStudy(f *testing.F) {
	f.Add(2.0, 6.0, 20, 7, 0.95, 0, uint64(1), false)
	f.Add(0.01, 12.0, 1, 2, 0.5, 3, uint64(7), true)
	f.Add(1000.0, 2.5, 1000000, 1000, 0.999, 0, uint64(0), true)
	f.Add(math.MaxFloat64, 300.0, 5, 3, 0.0, 1, uint64(3), false)
	f.Fuzz(func(t *testing.T, d, l float64, units, count int, level float64, sims int, seed uint64, fit bool) {
		// At most 3 simulated studies of at most 60 exposures keep an
		// input cheap; larger counts are still checked without them.
		if sims > 3 || (sims > 0 && count > 60) {
			sims %= 4
			if count > 60 {
				sims = 0
			}
		}
		p, err := PlanStudy(d, l, units, count, &PlanSettings{Level: level, FitN0: fit, Simulations: sims, Seed: seed})
		if err != nil {
			checkRefusal(t, "PlanStudy", err)
			return
		}
		if len(p.Exposures) != count || p.Exposures[0].Minutes != p.SurvivalTime || p.Exposures[count-1].Minutes != p.KillTime ||
			!(p.SurvivalTime > 0) || !(p.Interval > 0) || math.IsInf(p.KillTime, 0) {
			t.Fatalf("plan %d exposures, %v – %v min every %v", len(p.Exposures), p.SurvivalTime, p.KillTime, p.Interval)
		}
		for i, e := range p.Exposures {
			q := e.ProbabilityNegative
			if !(q >= 0 && q <= 1) || !(e.ExpectedNegative >= 0 && e.ExpectedNegative <= float64(units)) || e.Units != units {
				t.Fatalf("exposure %d: %+v", i, e)
			}
			if i > 0 && (!(e.Minutes > p.Exposures[i-1].Minutes) || q < p.Exposures[i-1].ProbabilityNegative) {
				t.Fatalf("exposure %d: %+v after %+v", i, e, p.Exposures[i-1])
			}
		}
		x := p.Expected
		if x.Value != d || !(x.Lower >= 0 && x.Lower <= d && d <= x.Upper) || (x.Lower == 0 || math.IsInf(x.Upper, 1)) && len(x.Warnings) == 0 || !(p.ExpectedHSKHalfWidth >= 0) || math.IsInf(p.ExpectedHSKHalfWidth, 0) {
			t.Fatalf("expected %v (%v – %v), HSK half-width %v", x.Value, x.Lower, x.Upper, p.ExpectedHSKHalfWidth)
		}
		if s := p.Simulation; s != nil {
			if s.Studies != sims || s.Refused < 0 || s.Refused > sims || s.HSKComputable > sims || s.LimitedApplicable > s.HSKComputable ||
				!(s.Coverage >= 0 && s.Coverage <= 1) && !(math.IsNaN(s.Coverage) && s.Refused == sims) {
				t.Fatalf("simulation %+v", *s)
			}
		}
		if _, err := json.Marshal(p); err != nil {
			t.Fatalf("json.Marshal: %v", err)
		}
		_ = p.String()
	})
}
