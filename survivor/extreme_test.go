package survivor

import (
	"fmt"
	"math"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// offsets are invented log10 deviations from the line at exposures
// 0, 1, …, 6 (in units of D), so that the fit has scatter.
var offsets = [7]float64{0.05, -0.03, 0.02, -0.04, 0.01, 0.03, -0.04}

// TestFitExtremeScales fits curves with D from 0.01 to 1000 min (exposures
// from 0.6 s to about 4 days) and log10 N0 from 1 to 12. The observations
// are log10 count = log10 N0 − i + offsets[i] at t = i·D, i = 0…6, so the
// least-squares slope is s/D with s the slope of (−i + offsets[i]) on i,
// and every D-value and limit is D times a constant (hand-worked from the
// closed form below, with R 4.2.2 qt(0.975, 5) = 2.5705818356363137), and
// the intercept is log10 N0 plus a constant.
func TestFitExtremeScales(t *testing.T) {
	// Closed-form least squares of y_i = −i + offsets[i] on i = 0…6.
	var sy, sxy float64
	for i, o := range offsets {
		sy += -float64(i) + o
		sxy += float64(i-3) * (-float64(i) + o)
	}
	slope := sxy / 28 // Σ (i − 3)² = 28
	b0 := sy/7 - slope*3
	var rss float64
	for i, o := range offsets {
		r := -float64(i) + o - (b0 + slope*float64(i))
		rss += r * r
	}
	se := math.Sqrt(rss / 5 / 28)
	const t975 = 2.5705818356363137 // R 4.2.2: qt(0.975, 5)
	cD, cLo, cHi := -1/slope, -1/(slope-t975*se), -1/(slope+t975*se)

	for _, d := range []float64{0.01, 0.1, 1, 10, 100, 1000} {
		for _, l0 := range []float64{1, 3, 6, 9, 12} {
			obs := make([]Observation, 7)
			for i := range obs {
				obs[i] = Observation{Minutes: float64(i) * d, Count: math.Pow(10, l0-float64(i)+offsets[i])}
			}
			r, err := Fit(obs, nil)
			if err != nil {
				t.Fatalf("D %g, log10 N0 %g: %v", d, l0, err)
			}
			what := fmt.Sprintf("D %g min, log10 N0 %g: ", d, l0)
			tl := tol{rel: 1e-12}
			check(t, what+"D", r.D.Value, cD*d, tl)
			check(t, what+"D lower", r.D.Lower, cLo*d, tl)
			check(t, what+"D upper", r.D.Upper, cHi*d, tl)
			check(t, what+"log10 N0", r.Log10N0.Value, l0+b0, tol{abs: 1e-12})
			check(t, what+"log reduction", r.LogReduction, 6*-slope, tol{rel: 1e-12})
		}
	}
}

// TestFitSecondsAndMinutes: the same study with times in seconds gives a D
// 60 times the one with times in minutes, limits too (exactly, up to
// rounding).
func TestFitSecondsAndMinutes(t *testing.T) {
	obs := make([]Observation, 7)
	sec := make([]Observation, 7)
	for i := range obs {
		obs[i] = Observation{Minutes: 0.75 * float64(i), Count: math.Pow(10, 7-float64(i)+offsets[i])}
		sec[i] = Observation{Minutes: 60 * obs[i].Minutes, Count: obs[i].Count}
	}
	rm, err := Fit(obs, nil)
	if err != nil {
		t.Fatal(err)
	}
	rs, err := Fit(sec, nil)
	if err != nil {
		t.Fatal(err)
	}
	tl := tol{rel: 1e-13}
	check(t, "D", rs.D.Value, 60*rm.D.Value, tl)
	check(t, "D lower", rs.D.Lower, 60*rm.D.Lower, tl)
	check(t, "D upper", rs.D.Upper, 60*rm.D.Upper, tl)
	check(t, "log10 N0", rs.Log10N0.Value, rm.Log10N0.Value, tol{abs: 1e-13})
}

// TestCountPopulationExtremes counts units of 10¹ to 10¹² per unit: 100
// colonies on 0.1 mL of the 10^-k dilution of a 10 mL suspension give
// 100/(10^-k·0.1)·10 = 10^(k+4) per unit (hand-worked); 10¹ per unit is 10
// colonies in 1 mL of a 1 mL suspension, with a lowered countable range.
func TestCountPopulationExtremes(t *testing.T) {
	low := []Unit{{SuspensionML: 1, Plates: []Plate{{Colonies: 10, Dilution: 1, PlatedML: 1}}},
		{SuspensionML: 1, Plates: []Plate{{Colonies: 10, Dilution: 1, PlatedML: 1}}}}
	p, err := CountPopulation(low, &PopulationSettings{CountableMin: 5})
	if err != nil {
		t.Fatal(err)
	}
	check(t, "log10 mean of 10 per unit", p.Log10Mean, 1, tol{abs: 1e-15})
	for k := 0; k <= 8; k++ {
		d := math.Pow10(-k)
		units := []Unit{
			{SuspensionML: 10, Plates: []Plate{{Colonies: 100, Dilution: d, PlatedML: 0.1}}},
			{SuspensionML: 10, Plates: []Plate{{Colonies: 100, Dilution: d, PlatedML: 0.1}}},
			{SuspensionML: 10, Plates: []Plate{{Colonies: 100, Dilution: d, PlatedML: 0.1}}},
		}
		p, err := CountPopulation(units, nil)
		if err != nil {
			t.Fatalf("10^-%d: %v", k, err)
		}
		check(t, fmt.Sprintf("log10 mean at 10^-%d", k), p.Log10Mean, float64(k+4), tol{abs: 1e-14})
		check(t, fmt.Sprintf("SD at 10^-%d", k), p.SD, 0, tol{abs: 1e-15 * p.Mean})
	}
}

// TestConcurrentUse runs Fit and CountPopulation from many goroutines on
// shared input slices and compares every result with the sequential one
// (as JSON, which writes NaN too). Run it with go test -race.
func TestConcurrentUse(t *testing.T) {
	obs := benchObservations(40)
	zeros := append(benchObservations(12), Observation{Minutes: 30, Count: 0})
	units := assay()
	jobs := []apicheck.Job{
		func() (any, error) { return Fit(obs, nil) },
		func() (any, error) { return Fit(zeros, &Settings{ExcludeBelowDetection: true, Level: 0.9}) },
		func() (any, error) { return Fit(zeros, nil) },
		func() (any, error) { return CountPopulation(units, nil) },
		func() (any, error) { return CountPopulation(units[:1], nil) },
	}
	apicheck.RunConcurrently(t, 20, jobs)
}
