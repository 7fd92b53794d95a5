package fraction

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"reflect"
	"strings"
	"testing"
)

// estimators runs every procedure of the package on the same input.
var estimators = []struct {
	name string
	run  func(l float64, e []Exposure) (any, error)
}{
	{"HSK", func(l float64, e []Exposure) (any, error) { return HSK(l, e) }},
	{"LimitedHSK", func(l float64, e []Exposure) (any, error) { return LimitedHSK(l, e) }},
	{"SMC", func(l float64, e []Exposure) (any, error) { return SMC(l, e) }},
	{"SMCAt", func(l float64, e []Exposure) (any, error) { return SMCAt(l, e, 12) }},
	{"MLE", func(l float64, e []Exposure) (any, error) { return MLE(l, e, nil) }},
	{"MLE fitted", func(l float64, e []Exposure) (any, error) { return MLE(l, e, &MLESettings{FitN0: true}) }},
}

func lotA() []Exposure {
	// Invented data: study lot-a of testdata/fraction/studies.tsv.
	return []Exposure{{8, 20, 0}, {10, 20, 0}, {12, 20, 6}, {14, 20, 17}, {16, 20, 19}, {18, 20, 20}, {20, 20, 20}}
}

// TestCommonRefusals checks that every procedure refuses the inputs the
// package documentation lists, with the documented sentinel and a message
// naming the offending exposure.
func TestCommonRefusals(t *testing.T) {
	with := func(i int, e Exposure) []Exposure {
		x := lotA()
		x[i] = e
		return x
	}
	tests := []struct {
		name    string
		l       float64
		exp     []Exposure
		want    error
		mention string
	}{
		{"more negatives than units", 6, with(3, Exposure{14, 20, 21}), ErrInvalidNegatives, "exposures[3] at 14 min"},
		{"negative count below 0", 6, with(2, Exposure{12, 20, -1}), ErrInvalidNegatives, "exposures[2] at 12 min"},
		{"no units", 6, with(4, Exposure{16, 0, 0}), ErrInvalidUnits, "exposures[4] at 16 min"},
		{"negative units", 6, with(4, Exposure{16, -3, 0}), ErrInvalidUnits, "exposures[4]"},
		{"negative time", 6, with(0, Exposure{-1, 20, 0}), ErrInvalidTime, "exposures[0]"},
		{"NaN time", 6, with(1, Exposure{math.NaN(), 20, 0}), ErrInvalidTime, "exposures[1]"},
		{"infinite time", 6, with(6, Exposure{math.Inf(1), 20, 20}), ErrInvalidTime, "exposures[6]"},
		{"duplicate time", 6, with(6, Exposure{12, 20, 7}), ErrDuplicateTime, "pool them"},
		{"log10 N0 = 0", 0, lotA(), ErrInvalidPopulation, "log10 N0"},
		{"log10 N0 < 0", -2, lotA(), ErrInvalidPopulation, "log10 N0"},
		{"log10 N0 NaN", math.NaN(), lotA(), ErrInvalidPopulation, "log10 N0"},
		{"log10 N0 +Inf", math.Inf(1), lotA(), ErrInvalidPopulation, "log10 N0"},
		{"one exposure", 6, []Exposure{{12, 20, 6}}, ErrTooFewExposures, "1 exposure"},
		{"no exposure", 6, nil, ErrTooFewExposures, "0 exposure"},
	}
	for _, c := range tests {
		for _, f := range estimators {
			_, err := f.run(c.l, c.exp)
			if !errors.Is(err, c.want) {
				t.Errorf("%s, %s: error %v, want %v", f.name, c.name, err, c.want)
				continue
			}
			if !strings.Contains(err.Error(), c.mention) {
				t.Errorf("%s, %s: message %q does not mention %q", f.name, c.name, err, c.mention)
			}
		}
	}
}

// TestCallerSliceUnmodified checks that no procedure reorders or changes
// the caller's exposures.
func TestCallerSliceUnmodified(t *testing.T) {
	in := []Exposure{{20, 20, 20}, {12, 20, 6}, {8, 20, 0}, {16, 20, 19}, {10, 20, 0}, {18, 20, 20}, {14, 20, 17}}
	keep := append([]Exposure(nil), in...)
	for _, f := range estimators {
		if _, err := f.run(6, in); err != nil {
			t.Fatalf("%s: %v", f.name, err)
		}
		if !reflect.DeepEqual(in, keep) {
			t.Fatalf("%s modified the caller's slice: %v", f.name, in)
		}
	}
	if _, err := PlanStudy(2, 6, 20, 7, &PlanSettings{Simulations: 3}); err != nil {
		t.Fatal(err)
	}
}

// TestOrderIndependence checks that shuffled exposures give the same
// numbers (positions in the caller's slice follow the shuffle).
func TestOrderIndependence(t *testing.T) {
	studies := loadStudies(t)
	rng := rand.New(rand.NewPCG(5, 8))
	for name, s := range studies {
		for range 5 {
			x := append([]Exposure(nil), s.exp...)
			rng.Shuffle(len(x), func(i, j int) { x[i], x[j] = x[j], x[i] })
			for _, f := range estimators {
				a, errA := f.run(s.log10N0, s.exp)
				b, errB := f.run(s.log10N0, x)
				if (errA == nil) != (errB == nil) || (errA != nil && !sameSentinel(errA, errB)) {
					t.Errorf("%s %s: errors %v / %v", name, f.name, errA, errB)
					continue
				}
				if errA != nil {
					continue
				}
				ea, eb := estimateOf(a), estimateOf(b)
				for _, p := range [][2]float64{{ea.Value, eb.Value}, {ea.Lower, eb.Lower}, {ea.Upper, eb.Upper}} {
					if !(p[0] == p[1] || math.IsNaN(p[0]) && math.IsNaN(p[1]) || math.Abs(p[0]-p[1]) <= 1e-12*math.Abs(p[0])) {
						t.Errorf("%s %s: %v vs %v after shuffling", name, f.name, ea, eb)
					}
				}
			}
		}
	}
}

func sameSentinel(a, b error) bool {
	for _, s := range sentinels {
		if errors.Is(a, s) {
			return errors.Is(b, s)
		}
	}
	return false
}

func estimateOf(v any) (e struct{ Value, Lower, Upper float64 }) {
	switch r := v.(type) {
	case HSKResult:
		e.Value, e.Lower, e.Upper = r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper
	case SMCResult:
		e.Value, e.Lower, e.Upper = r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper
	case MLEResult:
		e.Value, e.Lower, e.Upper = r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper
	}
	return e
}

// TestJSONAndString checks that every result marshals to JSON (also with
// NaN and ±Inf inside) and prints a readable summary.
func TestJSONAndString(t *testing.T) {
	studies := loadStudies(t)
	for name, s := range studies {
		for _, f := range estimators {
			r, err := f.run(s.log10N0, s.exp)
			if err != nil {
				continue
			}
			b, err := json.Marshal(r)
			if err != nil {
				t.Errorf("%s %s: %v", name, f.name, err)
			}
			var back map[string]any
			if err := json.Unmarshal(b, &back); err != nil || back["estimate"] == nil {
				t.Errorf("%s %s: %v %s", name, f.name, err, b)
			}
			str := r.(interface{ String() string }).String()
			if !strings.Contains(str, "D = ") || !strings.Contains(str, "min") {
				t.Errorf("%s %s: String() = %q", name, f.name, str)
			}
		}
	}
	p, err := PlanStudy(2, 6, 20, 3, &PlanSettings{FitN0: true, Simulations: 20, Seed: 1})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := json.Marshal(p); err != nil {
		t.Errorf("plan: %v", err)
	}
	if !strings.Contains(p.String(), "expected limits") {
		t.Errorf("plan String() = %q", p.String())
	}
}
