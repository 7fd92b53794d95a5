package fraction

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

const mleReferenceFile = "../testdata/fraction/mle_r.tsv"

// TestMLEAgainstR compares every row of testdata/fraction/mle_r.tsv
// (R 4.2.2: glm(cbind(pos, neg) ~ 0 + t + offset(rep(log(N0), k)) or ~ t,
// family = binomial(link = "cloglog")), profile limits by uniroot; the
// exact calls are in testdata/fraction/mle_reference.R) with MLE on the
// study of testdata/fraction/studies.tsv it names.
func TestMLEAgainstR(t *testing.T) {
	studies := loadStudies(t)
	rows, where := tsvRows(t, mleReferenceFile)
	if len(rows) < 10 {
		t.Fatalf("%s: only %d rows", mleReferenceFile, len(rows))
	}
	for i, r := range rows {
		w := where[i]
		if len(r) != 12 {
			t.Fatalf("%s: %d columns, want 12", w, len(r))
		}
		s := studies[r[0]]
		if s == nil {
			t.Fatalf("%s: no study %q in %s", w, r[0], studiesFile)
		}
		fit := r[1] == "true"
		// glm's coefficients are good to about 1e-9 relative (its
		// deviance criterion); rows fitted by optimize to about 1e-8.
		rel := 1e-7
		if r[11] == "optimize" {
			rel = 1e-6
		}
		res, err := MLE(s.log10N0, s.exp, &MLESettings{FitN0: fit, Level: parseNum(t, w, r[2])})
		if err != nil {
			t.Errorf("%s: %v", w, err)
			continue
		}
		e := res.Estimate
		upper := math.Inf(1)
		if r[5] != "Inf" {
			upper = parseNum(t, w, r[5])
		}
		near(t, w+" d", e.Value, parseNum(t, w, r[3]), 0, rel)
		near(t, w+" d_lower", e.Lower, parseNum(t, w, r[4]), 0, rel)
		near(t, w+" d_upper", e.Upper, upper, 0, rel)
		near(t, w+" log10_n0", res.Log10N0, parseNum(t, w, r[6]), 0, rel)
		near(t, w+" deviance", res.Deviance, parseNum(t, w, r[7]), 1e-8, rel)
		near(t, w+" log-likelihood", res.LogLikelihood, parseNum(t, w, r[8]), 1e-8, rel)
		if res.FitN0 != fit {
			t.Errorf("%s: FitN0 %v", w, res.FitN0)
		}
	}
}

func TestMLEWarnings(t *testing.T) {
	studies := loadStudies(t)
	tests := []struct {
		study string
		fit   bool
		warn  []string
	}{
		{"lot-a", false, nil},
		{"lot-c", false, []string{"fits poorly", "not monotone: exposures[2]", "not monotone: exposures[5]"}},
		{"one-fractional", false, []string{"only one fractional"}},
		{"step", false, []string{"no fractional exposure", "fits poorly"}},
		{"unbounded", false, []string{"do not bound D from above"}},
	}
	for _, c := range tests {
		s := studies[c.study]
		r, err := MLE(s.log10N0, s.exp, &MLESettings{FitN0: c.fit})
		if err != nil {
			t.Fatalf("%s: %v", c.study, err)
		}
		t.Run(c.study, func(t *testing.T) { checkWarnings(t, r.Estimate.Warnings, c.warn) })
	}
	// Two exposures with N0 fitted leave no degrees of freedom.
	r, err := MLE(6, []Exposure{{12, 20, 6}, {14, 20, 17}}, &MLESettings{FitN0: true})
	if err != nil {
		t.Fatal(err)
	}
	if r.DF != 0 || !math.IsNaN(r.FitP) {
		t.Errorf("df %d, p %g; want 0, NaN", r.DF, r.FitP)
	}
	checkWarnings(t, r.Estimate.Warnings, []string{"no degrees of freedom"})
}

func TestMLERefusals(t *testing.T) {
	tests := []struct {
		name string
		l    float64
		exp  []Exposure
		s    *MLESettings
		want error
	}{
		{"every unit positive", 6, []Exposure{{0, 10, 0}, {10, 10, 0}}, nil, ErrNoInformation},
		{"every unit negative", 6, []Exposure{{0, 10, 10}, {10, 10, 10}}, nil, ErrNoInformation},
		{"every unit positive, N0 fitted", 6, []Exposure{{0, 10, 0}, {10, 10, 0}}, &MLESettings{FitN0: true}, ErrNoInformation},
		{"every unit negative, N0 fitted", 6, []Exposure{{0, 10, 10}, {10, 10, 10}}, &MLESettings{FitN0: true}, ErrNoInformation},
		{"negatives only at time 0", 1, []Exposure{{0, 10, 1}, {10, 10, 0}}, nil, ErrNoInformation},
		{"positives only at time 0", 6, []Exposure{{0, 10, 9}, {10, 10, 10}}, nil, ErrNoInformation},
		// N0 = 10, 1000 units: 5 negatives at 10 min are fewer than
		// e^−10·1000 ≈ 0.045? No: more; but 1000 positives at 20 min
		// with N0 fixed at 10 make D = ∞ the most likely.
		{"most likely D = ∞", 1, []Exposure{{10, 1000000, 1}, {20, 1000000, 0}}, nil, ErrNoInformation},
		// One fractional exposure between all-positive and all-negative:
		// quasi-complete separation, no finite joint estimate.
		{"sharp boundary, N0 fitted", 6, []Exposure{{10, 20, 0}, {12, 20, 9}, {14, 20, 20}}, &MLESettings{FitN0: true}, ErrNoInformation},
		{"step, N0 fitted", 6, []Exposure{{10, 20, 0}, {12, 20, 20}}, &MLESettings{FitN0: true}, ErrNoInformation},
		{"survival rising, N0 fitted", 6, []Exposure{{10, 20, 15}, {12, 20, 5}, {14, 20, 0}}, &MLESettings{FitN0: true}, ErrNoInformation},
		{"level 1", 6, []Exposure{{10, 20, 0}, {12, 20, 9}}, &MLESettings{Level: 1}, ErrInvalidLevel},
		{"level -0.5", 6, []Exposure{{10, 20, 0}, {12, 20, 9}}, &MLESettings{Level: -0.5}, ErrInvalidLevel},
		{"level NaN", 6, []Exposure{{10, 20, 0}, {12, 20, 9}}, &MLESettings{Level: math.NaN()}, ErrInvalidLevel},
		{"log10 N0 above 300", 301, []Exposure{{10, 20, 0}, {12, 20, 9}}, nil, ErrInvalidPopulation},
	}
	for _, c := range tests {
		if _, err := MLE(c.l, c.exp, c.s); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
	}
}

// simulateStudy draws the negatives of each exposure from the model with
// the given D and N0 (invented data, seeded).
func simulateStudy(src rand.Source, d, log10N0 float64, times []float64, units int) []Exposure {
	exp := make([]Exposure, len(times))
	for i, t := range times {
		p := math.Exp(-math.Exp(log10N0*math.Ln10 - t*math.Ln10/d))
		exp[i] = Exposure{t, units, int(distuv.Binomial{N: float64(units), P: p, Src: src}.Rand())}
	}
	return exp
}

// TestMLEExtremes recovers D from large simulated studies (seeded) at N0 of
// 10¹ and 10¹² and at time scales from seconds to days: with 2000 units
// per exposure the estimate is within a few per cent of the true D, the
// limits contain it, and the fitted log10 N0 is within four of its
// standard errors of the true one.
func TestMLEExtremes(t *testing.T) {
	src := rand.NewPCG(3, 14)
	tests := []struct {
		name    string
		d, l    float64
		spacing float64 // in units of D
	}{
		{"N0 1e1, D 3 min", 3, 1, 0.5},
		{"N0 1e12, D 0.5 min", 0.5, 12, 0.5},
		{"seconds: D 0.005 min", 0.005, 6, 0.5},
		{"days: D 2880 min", 2880, 6, 0.5},
		{"N0 1e12, D 1e4 min", 1e4, 12, 0.5},
	}
	for _, c := range tests {
		// Exposures around the time where μ ≈ 1, t = l·D, from μ = 10 to
		// μ = 0.001 (t = (l−1)D … (l+3)D), at least one exposure ≥ 0.
		var times []float64
		for x := math.Max(c.l-1, 0); x <= c.l+3+1e-9; x += c.spacing {
			times = append(times, x*c.d)
		}
		exp := simulateStudy(src, c.d, c.l, times, 2000)
		for _, fit := range []bool{false, true} {
			r, err := MLE(c.l+0.3*boolFloat(fit), exp, &MLESettings{FitN0: fit}) // fitted: start 0.3 log off
			if err != nil {
				t.Errorf("%s fit=%v: %v", c.name, fit, err)
				continue
			}
			e := r.Estimate
			tol := 0.03
			if fit {
				tol = 0.08
			}
			if math.Abs(e.Value/c.d-1) > tol || !(e.Lower <= c.d && c.d <= e.Upper) {
				t.Errorf("%s fit=%v: D = %g (%g – %g), true %g", c.name, fit, e.Value, e.Lower, e.Upper, c.d)
			}
			if fit && !(math.Abs(r.Log10N0-c.l) <= 4*r.Log10N0SE) {
				t.Errorf("%s: fitted log10 N0 %g (SE %g), true %g", c.name, r.Log10N0, r.Log10N0SE, c.l)
			}
		}
	}
}

func boolFloat(b bool) float64 {
	if b {
		return 1
	}
	return 0
}

// TestMLEStartValue checks that with N0 fitted the estimate does not depend
// on the starting log10 N0.
func TestMLEStartValue(t *testing.T) {
	lotA := []Exposure{{8, 20, 0}, {10, 20, 0}, {12, 20, 6}, {14, 20, 17}, {16, 20, 19}, {18, 20, 20}, {20, 20, 20}}
	ref, err := MLE(6, lotA, &MLESettings{FitN0: true})
	if err != nil {
		t.Fatal(err)
	}
	for _, start := range []float64{0.5, 1, 3, 9, 12, 30} {
		r, err := MLE(start, lotA, &MLESettings{FitN0: true})
		if err != nil {
			t.Errorf("start %g: %v", start, err)
			continue
		}
		near(t, "D", r.Estimate.Value, ref.Estimate.Value, 0, 1e-9)
		near(t, "lower", r.Estimate.Lower, ref.Estimate.Lower, 0, 1e-9)
		near(t, "upper", r.Estimate.Upper, ref.Estimate.Upper, 0, 1e-9)
		near(t, "log10 N0", r.Log10N0, ref.Log10N0, 0, 1e-9)
	}
}

func TestMLEJSON(t *testing.T) {
	studies := loadStudies(t)
	s := studies["unbounded"]
	r, err := MLE(s.log10N0, s.exp, nil)
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatalf("marshal with +Inf upper limit and NaN SE: %v", err)
	}
	for _, want := range []string{`"upper":"+Inf"`, `"log10_n0_se":"NaN"`, `"fit_n0":false`, `"deviance":0.738`} {
		if !strings.Contains(string(b), want) {
			t.Errorf("JSON lacks %s: %s", want, b)
		}
	}
	var back struct {
		Estimate struct {
			Upper string `json:"upper"`
		} `json:"estimate"`
		Fitted []FittedExposure `json:"fitted"`
	}
	if err := json.Unmarshal(b, &back); err != nil || back.Estimate.Upper != "+Inf" || len(back.Fitted) != 3 {
		t.Errorf("round trip: %v %+v", err, back)
	}
}
