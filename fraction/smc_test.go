package fraction

import (
	"errors"
	"math"
	"testing"
)

// Hand-worked from the closed form D = U/(log10 N0 − log10 ln(n/r)) for
// studies of testdata/fraction/studies.tsv (invented data); arithmetic with
// bc -l (scale 20).
var smcCases = []struct {
	study string
	at    []float64 // fractional exposure times
	d     []float64 // D at each
	mean  float64
	warn  []string
}{
	// lot-a: 12/(6 − log10 ln(20/6)), 14/(6 − log10 ln(20/17)),
	// 16/(6 − log10 ln(20/19)).
	{"lot-a", []float64{12, 14, 16}, []float64{2.02723820123464249090, 2.06213020158571359370, 2.19480562280121458879}, 2.09472467520719022446, nil},
	// lot-b: 8/(5.5 − log10 ln(10/3)), 10/(5.5 − log10 ln(15/9)).
	{"lot-b", []float64{8, 10}, []float64{1.47618271734856916173, 1.72660062138789869731}, 1.60139166936823392952,
		[]string{"only 2 fractional"}},
	// lot-c: four fractional exposures, one after the first all-negative.
	{"lot-c", []float64{4, 6, 8, 12}, []float64{0.83449366678583889187, 1.29372122489186392373, 1.46850226067249420658, 2.00758797570751090027},
		1.40107628201442698061, []string{"not monotone: exposures[2]", "not monotone: exposures[5]"}},
	// high-n0: 6/(12 − log10 ln(25/9)), 6.5/(12 − log10 ln(25/22)).
	{"high-n0", []float64{6, 6.5}, []float64{0.50038791195360086836, 0.50413562788759185977}, 0.50226176992059636406,
		[]string{"only 2 fractional"}},
	// low-n0: 3/(1 − log10 ln 3), 6/(1 − log10 ln(30/27)).
	{"low-n0", []float64{3, 6}, []float64{3.12775128917822019414, 3.03440696993584127270}, 3.08107912955703073342,
		[]string{"only 2 fractional"}},
	// days: 9000/(6 − log10 ln 2.5), 10500/(6 − log10 ln(10/9)).
	{"days", []float64{9000, 10500}, []float64{1490.56800706050463858536, 1504.87534195651901625322}, 1497.72167450851182741929,
		[]string{"only 2 fractional"}},
}

func TestSMCHandWorked(t *testing.T) {
	studies := loadStudies(t)
	for _, c := range smcCases {
		t.Run(c.study, func(t *testing.T) {
			s := studies[c.study]
			r, err := SMC(s.log10N0, s.exp)
			if err != nil {
				t.Fatalf("%s: %v", s.where, err)
			}
			near(t, "mean D", r.Estimate.Value, c.mean, 0, 1e-13)
			if len(r.Points) != len(c.at) {
				t.Fatalf("%d points, want %d", len(r.Points), len(c.at))
			}
			for i, p := range r.Points {
				near(t, "time", p.Minutes, c.at[i], 0, 0)
				near(t, "D", p.D, c.d[i], 0, 1e-13)
				one, err := SMCAt(s.log10N0, s.exp, c.at[i])
				if err != nil {
					t.Fatalf("at %g: %v", c.at[i], err)
				}
				near(t, "D at", one.Estimate.Value, c.d[i], 0, 1e-13)
			}
			if len(r.Points)+len(r.Excluded) != len(s.exp) {
				t.Errorf("%d used + %d excluded ≠ %d exposures", len(r.Points), len(r.Excluded), len(s.exp))
			}
			for _, v := range []float64{r.Estimate.Lower, r.Estimate.Upper, r.Estimate.Level} {
				if !math.IsNaN(v) {
					t.Errorf("limits/level %g, want NaN (the procedure gives none)", v)
				}
			}
			checkWarnings(t, r.Estimate.Warnings, c.warn)
		})
	}
}

func TestSMCRefusals(t *testing.T) {
	lotA := []Exposure{{8, 20, 0}, {10, 20, 0}, {12, 20, 6}, {14, 20, 17}, {16, 20, 19}, {18, 20, 20}, {20, 20, 20}}
	at := []struct {
		name string
		l    float64
		exp  []Exposure
		at   float64
		want error
	}{
		{"all positive", 6, lotA, 10, ErrNotFractional},
		{"all negative", 6, lotA, 18, ErrNotFractional},
		{"not an exposure", 6, lotA, 13, ErrNotAnExposure},
		{"NaN time", 6, lotA, math.NaN(), ErrNotAnExposure},
		// ln(20/1) = 3.0 survivors: log10 3.0 = 0.48 > log10 N0 = 0.3.
		{"denominator ≤ 0", 0.3, []Exposure{{0, 20, 0}, {5, 20, 1}}, 5, ErrSMCUndefined},
		{"fractional at time 0", 1, []Exposure{{0, 20, 1}, {5, 20, 20}}, 0, ErrSMCUndefined},
		{"bad input first", 0, lotA, 12, ErrInvalidPopulation},
	}
	for _, c := range at {
		if _, err := SMCAt(c.l, c.exp, c.at); !errors.Is(err, c.want) {
			t.Errorf("SMCAt %s: error %v, want %v", c.name, err, c.want)
		}
	}
	mean := []struct {
		name string
		l    float64
		exp  []Exposure
		want error
	}{
		{"none fractional", 6, []Exposure{{10, 20, 0}, {12, 20, 20}}, ErrNoFractional},
		{"denominator ≤ 0", 0.3, []Exposure{{0, 20, 0}, {5, 20, 1}, {10, 20, 10}}, ErrSMCUndefined},
		{"fractional at time 0", 1, []Exposure{{0, 20, 1}, {5, 20, 20}}, ErrSMCUndefined},
	}
	for _, c := range mean {
		if _, err := SMC(c.l, c.exp); !errors.Is(err, c.want) {
			t.Errorf("SMC %s: error %v, want %v", c.name, err, c.want)
		}
	}
}
