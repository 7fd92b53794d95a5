package fraction

import (
	"fmt"
	"math"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// TestHSKExtremes runs the invented study lotA at log10 N0 from 1 to 12 and
// with its times rescaled from seconds (1/60) to days (×1440). Hand-worked
// from the closed form (anchor 10 min, first all-negative 18 min):
//
//	Ū = 11·0.30 + 13·0.55 + 15·0.10 + 17·0.05 = 12.8 min
//	V = 2²·(0.3·0.7 + 0.85·0.15 + 0.95·0.05)/19 = 1.54/19 min²
//
// and D = s·Ū/(log10 N0 + 0.2507), limits s·(Ū ± 2√V)/(log10 N0 + 0.2507)
// for times multiplied by s.
func TestHSKExtremes(t *testing.T) {
	u, v := 12.8, 1.54/19
	for _, s := range []float64{1.0 / 60, 1, 60, 1440, 1e6} {
		exp := lotA()
		for i := range exp {
			exp[i].Minutes *= s
		}
		for l := 1.0; l <= 12; l++ {
			what := fmt.Sprintf("times ×%g, log10 N0 %g: ", s, l)
			div := l + EulerOverLn10
			for _, f := range []func(float64, []Exposure) (HSKResult, error){HSK, LimitedHSK} {
				r, err := f(l, exp)
				if err != nil {
					t.Fatalf("%s%v", what, err)
				}
				near(t, what+"Ū", r.MeanTime, s*u, 0, 1e-13)
				near(t, what+"V", r.Variance, s*s*v, 0, 1e-13)
				near(t, what+"D", r.Estimate.Value, s*u/div, 0, 1e-13)
				near(t, what+"lower", r.Estimate.Lower, s*(u-2*math.Sqrt(v))/div, 0, 1e-13)
				near(t, what+"upper", r.Estimate.Upper, s*(u+2*math.Sqrt(v))/div, 0, 1e-13)
			}
		}
	}
}

// TestSMCExtremes: for D from 0.01 to 1000 min and log10 N0 from 1 to 12,
// exposures placed at t = D·(log10 N0 − log10 ln(n/r)) give SMC's D back
// exactly (the closed form inverted), at one exposure and as the mean of
// two.
func TestSMCExtremes(t *testing.T) {
	for _, d := range []float64{0.01, 0.1, 1, 10, 100, 1000} {
		for l := 1.0; l <= 12; l++ {
			t1 := d * (l - math.Log10(math.Log(20.0/10)))
			t2 := d * (l - math.Log10(math.Log(20.0/15)))
			exp := []Exposure{{0, 20, 0}, {t1, 20, 10}, {t2, 20, 15}, {3 * t2, 20, 20}}
			what := fmt.Sprintf("D %g min, log10 N0 %g: ", d, l)
			r, err := SMCAt(l, exp, t1)
			if err != nil {
				t.Fatalf("%s%v", what, err)
			}
			near(t, what+"SMCAt", r.Estimate.Value, d, 0, 1e-14)
			m, err := SMC(l, exp)
			if err != nil {
				t.Fatalf("%s%v", what, err)
			}
			near(t, what+"SMC mean", m.Estimate.Value, d, 0, 1e-14)
			near(t, what+"SMC SD", m.SD, 0, 1e-14*d, 0)
		}
	}
}

// modelStudy returns six exposures of n units at t = D·(log10 N0 + c),
// c = −0.5…0.75, where the expected survivors per unit are 10^−c (3.2 to
// 0.18, all fractional), with the negatives n·exp(−10^−c) rounded: data
// from the model itself (invented).
func modelStudy(d, l float64, n int) []Exposure {
	exp := make([]Exposure, 6)
	for i := range exp {
		c := -0.5 + 0.25*float64(i)
		exp[i] = Exposure{Minutes: d * (l + c), Units: n, Negative: int(math.Round(float64(n) * math.Exp(-math.Pow(10, -c))))}
	}
	return exp
}

// TestMLEModelData: on data from the model with 10⁶ units per exposure the
// likelihood recovers D (and N0 when fitted) for D from 0.01 to 1000 min
// (exposures from under a second to about 9 days) and log10 N0 from 1 to
// 12, up to the rounding of the counts; and times ×60 give D ×60 and limits
// ×60, to the search's tolerance.
func TestMLEModelData(t *testing.T) {
	for _, d := range []float64{0.01, 1, 1000} {
		for _, l := range []float64{1, 2, 6, 9, 12} {
			exp := modelStudy(d, l, 1000000)
			what := fmt.Sprintf("D %g min, log10 N0 %g: ", d, l)
			for _, fit := range []bool{false, true} {
				r, err := MLE(l, exp, &MLESettings{FitN0: fit})
				if err != nil {
					t.Fatalf("%sfitted N0 %v: %v", what, fit, err)
				}
				// Rounding n·p to a whole number moves p by at most 5e-7: D within
				// 2e-6 relative, log10 N0 within 2e-5 (observed: 9e-6 at log10 N0 12).
				near(t, what+"D", r.Estimate.Value, d, 0, 2e-6)
				if fit {
					near(t, what+"log10 N0", r.Log10N0, l, 2e-5, 0)
				}
				sec := make([]Exposure, len(exp))
				for i, e := range exp {
					sec[i] = Exposure{60 * e.Minutes, e.Units, e.Negative}
				}
				rs, err := MLE(l, sec, &MLESettings{FitN0: fit})
				if err != nil {
					t.Fatalf("%sin seconds: %v", what, err)
				}
				near(t, what+"D in seconds", rs.Estimate.Value, 60*r.Estimate.Value, 0, 1e-9)
				near(t, what+"lower in seconds", rs.Estimate.Lower, 60*r.Estimate.Lower, 0, 1e-9)
				near(t, what+"upper in seconds", rs.Estimate.Upper, 60*r.Estimate.Upper, 0, 1e-9)
			}
		}
	}
}

// TestPlanExtremes: plans for D from 0.01 to 1000 min and log10 N0 from 3
// to 12 run from (log10 N0 − 2)·D to (log10 N0 + 4)·D (the closed form).
func TestPlanExtremes(t *testing.T) {
	for _, d := range []float64{0.01, 1, 1000} {
		for _, l := range []float64{3, 6, 12} {
			p, err := PlanStudy(d, l, 20, 7, nil)
			if err != nil {
				t.Fatal(err)
			}
			near(t, "survival time", p.SurvivalTime, (l-2)*d, 0, 1e-15)
			near(t, "kill time", p.KillTime, (l+4)*d, 0, 1e-15)
			near(t, "interval", p.Interval, d, 0, 1e-14)
			if !(p.Expected.Lower < d && d < p.Expected.Upper) {
				t.Errorf("D %g, log10 N0 %g: expected limits %v – %v", d, l, p.Expected.Lower, p.Expected.Upper)
			}
		}
	}
}

// TestConcurrentUse runs every procedure from many goroutines on one shared
// slice and compares each result with the sequential one (as JSON). Run it
// with go test -race.
func TestConcurrentUse(t *testing.T) {
	exp := lotA()
	jobs := []apicheck.Job{
		func() (any, error) { return HSK(6, exp) },
		func() (any, error) { return LimitedHSK(6, exp) },
		func() (any, error) { return SMC(6, exp) },
		func() (any, error) { return SMCAt(6, exp, 14) },
		func() (any, error) { return SMCAt(6, exp, 13) },
		func() (any, error) { return MLE(6, exp, nil) },
		func() (any, error) { return MLE(6, exp, &MLESettings{FitN0: true, Level: 0.9}) },
		func() (any, error) { return PlanStudy(2, 6, 20, 7, &PlanSettings{Simulations: 5, Seed: 3}) },
	}
	apicheck.RunConcurrently(t, 16, jobs)
}
