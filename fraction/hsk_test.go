package fraction

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

// hskCase is a hand-worked Holcomb–Spearman–Kärber result for a study of
// testdata/fraction/studies.tsv (invented data).
type hskCase struct {
	study   string
	limited bool // the limited procedure accepts the study too
	u, v    float64
	d       float64
	lo, up  float64
	anchor  int // caller position
	firstN  int
	warn    []string // substrings of expected warnings (none others)
}

// Hand-worked from the closed forms of HSK (see the package
// documentation); arithmetic checked with bc -l (scale 20).
var hskCases = []hskCase{
	// lot-a, n = 20, d = 2, anchor 10 min, U_k = 18 min, r = 0, 6, 17, 19:
	// Ū = 11·0.3 + 13·0.55 + 15·0.1 + 17·0.05 = 12.8 = 18 − 1 − 0.1·42;
	// V = 4·(0.21 + 0.1275 + 0.0475)/19 = 4/(400·19)·154 = 0.0810526…;
	// D = 12.8/6.2507.
	{"lot-a", true, 12.8, 616.0 / 7600, 2.04777064968723502967, 1.95667767172991305675, 2.13886362764455700260, 1, 5, nil},
	// lot-b, unequal intervals and units: anchor 7 min, U_k = 13 min:
	// Ū = 7.5·0.3 + 9·0.3 + 11.5·0.4 = 9.55;
	// V = 2.25·0.21/9 + 6.25·0.24/14 = 0.0525 + 0.107142857… .
	{"lot-b", false, 9.55, 0.0525 + 1.5/14, 1.66066739701253760411, 1.52170924512596482584, 1.79962554889911038239, 1, 4, nil},
	// lot-c, anchor 0 min, U_k = 10 min, p = 0, .2, .1, .7, 1:
	// Ū = 2·0.2 − 5·0.1 + 7·0.6 + 9·0.3 = 6.8;
	// V = 9·0.16/9 + 4·0.09/9 + 4·0.21/9 = 0.29333… .
	{"lot-c", false, 6.8, 0.16 + 0.04 + 0.84/9, 1.29506541984878206715, 1.08876814127294874054, 1.50136269842461539376, 0, 4,
		[]string{"not monotone: exposures[2] at 6 min", "exposures[5] at 12 min shows growth in 1 of 10"}},
	// high-n0, n = 25, d = 0.5: Ū = 7 − 0.25 − 0.02·31 = 6.13;
	// V = 0.25/(625·24)·210 = 0.0035.
	{"high-n0", true, 6.13, 0.0035, 0.50037957014701200747, 0.49072121628462109750, 0.51003792400940291745, 1, 4, nil},
	// low-n0, n = 30, d = 3: Ū = 9 − 1.5 − 0.1·37 = 3.8;
	// V = 9/(900·29)·281 = 0.0968965… .
	{"low-n0", true, 3.8, 2529.0 / 26100, 3.03829855281042616134, 2.54052593020360990096, 3.53607117541724242173, 0, 3, nil},
	// seconds, n = 20, d = 0.02: Ū = 0.16 − 0.01 − 0.001·26 = 0.124;
	// V = 0.0004/7600·132 = 6.947…e−6.
	{"seconds", true, 0.124, 0.0528 / 7600, 0.01983777816884508934, 0.01899442106943482284, 0.02068113526825535585, 1, 4, nil},
	// days, n = 10, d = 1500: Ū = 12000 − 750 − 150·13 = 9300;
	// V = 1500²/900·33 = 82500.
	{"days", true, 9300, 82500, 1487.83336266338170124946, 1395.93065342220825411792, 1579.73607190455514838099, 1, 4, nil},
	// one-fractional: Ū = 11·0.45 + 13·0.55 = 12.1; V = 4·0.2475/19.
	{"one-fractional", false, 12.1, 0.99 / 19, 1.93578319228246436399, 1.86274632502733945434, 2.00882005953758927363, 0, 2,
		[]string{"fewer exposures than the usual design"}},
}

func TestHSKHandWorked(t *testing.T) {
	studies := loadStudies(t)
	for _, c := range hskCases {
		s := studies[c.study]
		fns := []struct {
			name string
			f    func(float64, []Exposure) (HSKResult, error)
		}{{"general", HSK}}
		if c.limited {
			fns = append(fns, struct {
				name string
				f    func(float64, []Exposure) (HSKResult, error)
			}{"limited", LimitedHSK})
		}
		for _, fn := range fns {
			t.Run(c.study+"/"+fn.name, func(t *testing.T) {
				r, err := fn.f(s.log10N0, s.exp)
				if err != nil {
					t.Fatalf("%s: %v", s.where, err)
				}
				const rel = 1e-12
				near(t, "mean time", r.MeanTime, c.u, 1e-12, rel)
				near(t, "variance", r.Variance, c.v, 1e-15, rel)
				near(t, "D", r.Estimate.Value, c.d, 0, rel)
				near(t, "lower", r.Estimate.Lower, c.lo, 0, rel)
				near(t, "upper", r.Estimate.Upper, c.up, 0, rel)
				if r.Estimate.Level != HSKLevel {
					t.Errorf("level %g, want %g", r.Estimate.Level, HSKLevel)
				}
				if r.Anchor != c.anchor || r.FirstAllNegative != c.firstN {
					t.Errorf("anchor %d, first all-negative %d; want %d, %d", r.Anchor, r.FirstAllNegative, c.anchor, c.firstN)
				}
				checkWarnings(t, r.Estimate.Warnings, c.warn)
				if r.Limited != (fn.name == "limited") {
					t.Errorf("Limited = %v", r.Limited)
				}
			})
		}
	}
}

// checkWarnings fails unless every want substring is in some warning and
// every warning matches some want.
func checkWarnings(t *testing.T, got, want []string) {
	t.Helper()
	used := make([]bool, len(got))
	for _, w := range want {
		found := false
		for i, g := range got {
			if strings.Contains(g, w) {
				found, used[i] = true, true
			}
		}
		if !found {
			t.Errorf("no warning containing %q in %q", w, got)
		}
	}
	for i, g := range got {
		if !used[i] {
			t.Errorf("unexpected warning %q", g)
		}
	}
}

func TestHSKHandWorkedSmall(t *testing.T) {
	// Invented data; hand-worked from the closed form.
	tests := []struct {
		name   string
		l      float64
		exp    []Exposure
		u, v   float64
		anchor int
		used   []int
		excl   []int
		warn   []string
	}{{
		// Two leading all-positive exposures: the anchor is the later one
		// (5 min); the 0-min exposure adds only zero terms and is listed as
		// not used. Ū = 7.5·0.5 + 12.5·0.5 = 10; V = 25·0.25/3 = 2.0833….
		name: "anchor is the last all-positive", l: 4,
		exp: []Exposure{{0, 4, 0}, {5, 4, 0}, {10, 4, 2}, {15, 4, 4}, {20, 4, 4}},
		u:   10, v: 25 * 0.25 / 3, anchor: 1, used: []int{1, 2, 3}, excl: []int{0, 4},
		warn: []string{"fewer exposures than the usual design"},
	}, {
		// An all-positive exposure after a fractional one: the anchor stays
		// at 0 min (the last all-positive before the first exposure with a
		// negative unit), so the fractional result at 2 min counts:
		// Ū = 1·0.3 + 3·(−0.3) + 5·1 = 4.4 (anchoring at 4 min would give
		// 5); V = 4·0.21/9 (the 4-min term is zero).
		name: "anchor before the first negative", l: 4,
		exp: []Exposure{{6, 10, 10}, {0, 10, 0}, {4, 10, 0}, {2, 10, 3}},
		u:   4.4, v: 4 * 0.21 / 9, anchor: 1, used: []int{1, 3, 2, 0},
		warn: []string{"not monotone: exposures[2] at 4 min", "fewer exposures than the usual design"},
	}, {
		// One unit per exposure (nᵢ = 1): variance terms are zero.
		// Ū = 1.5·0 + 2.5·1 = 2.5, V = 0.
		name: "single units", l: 3,
		exp: []Exposure{{1, 1, 0}, {2, 1, 0}, {3, 1, 1}},
		u:   2.5, v: 0, anchor: 1, used: []int{1, 2}, excl: []int{0},
		warn: []string{"fewer exposures than the usual design"},
	}, {
		// Two units, wide spacing: Ū = 5·0.5 + 15·0.5 = 10;
		// V = 100·0.25/1 = 25, so Ū − 2√V = 0: the lower limit is 0.
		name: "lower limit zero", l: 2,
		exp: []Exposure{{0, 2, 0}, {10, 2, 1}, {20, 2, 2}},
		u:   10, v: 25, anchor: 0, used: []int{0, 1, 2},
		warn: []string{"fewer exposures than the usual design", "lower limit ≤ 0"},
	}}
	for _, c := range tests {
		t.Run(c.name, func(t *testing.T) {
			r, err := HSK(c.l, c.exp)
			if err != nil {
				t.Fatal(err)
			}
			near(t, "mean time", r.MeanTime, c.u, 1e-12, 1e-12)
			near(t, "variance", r.Variance, c.v, 1e-12, 1e-12)
			div := c.l + 0.2507
			near(t, "D", r.Estimate.Value, c.u/div, 1e-12, 1e-12)
			near(t, "lower", r.Estimate.Lower, (c.u-2*math.Sqrt(c.v))/div, 1e-12, 1e-12)
			if r.Anchor != c.anchor {
				t.Errorf("anchor %d, want %d", r.Anchor, c.anchor)
			}
			if !equalInts(r.Used, c.used) {
				t.Errorf("used %v, want %v", r.Used, c.used)
			}
			var ex []int
			for _, x := range r.Excluded {
				ex = append(ex, x.Index)
			}
			if !equalInts(ex, c.excl) {
				t.Errorf("excluded %v, want %v", ex, c.excl)
			}
			checkWarnings(t, r.Estimate.Warnings, c.warn)
		})
	}
}

func equalInts(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

func TestHSKRefusals(t *testing.T) {
	tests := []struct {
		name string
		exp  []Exposure
		want error
	}{
		{"first exposure fractional", []Exposure{{0, 10, 1}, {5, 10, 10}}, ErrNoAllPositive},
		{"first exposure all negative", []Exposure{{0, 10, 10}, {5, 10, 10}}, ErrNoAllPositive},
		{"shortest exposure given last", []Exposure{{5, 10, 10}, {1, 10, 3}}, ErrNoAllPositive},
		{"no all-negative", []Exposure{{0, 10, 0}, {5, 10, 3}, {10, 10, 9}}, ErrNoAllNegative},
		{"all positive", []Exposure{{0, 10, 0}, {5, 10, 0}}, ErrNoAllNegative},
	}
	for _, c := range tests {
		for _, f := range []func(float64, []Exposure) (HSKResult, error){HSK, LimitedHSK} {
			if _, err := f(6, c.exp); !errors.Is(err, c.want) {
				t.Errorf("%s: error %v, want %v", c.name, err, c.want)
			}
		}
	}
}

func TestLimitedHSKRefusals(t *testing.T) {
	good := []Exposure{{8, 20, 0}, {10, 20, 0}, {12, 20, 6}, {14, 20, 17}, {16, 20, 19}, {18, 20, 20}, {20, 20, 20}}
	with := func(i int, e Exposure) []Exposure {
		x := append([]Exposure(nil), good...)
		x[i] = e
		return x
	}
	tests := []struct {
		name string
		exp  []Exposure
		want error
	}{
		{"unequal units at a fractional exposure", with(3, Exposure{14, 19, 16}), ErrUnequalUnits},
		{"unequal units at the first all-negative", with(5, Exposure{18, 10, 10}), ErrUnequalUnits},
		{"unequal interval", with(4, Exposure{16.5, 20, 19}), ErrUnequalIntervals},
		{"interval off by 1e-5 relative", with(4, Exposure{16 + 2e-5, 20, 19}), ErrUnequalIntervals},
		{"all positive between", with(3, Exposure{14, 20, 0}), ErrLimitedDesign},
		{"one fractional", []Exposure{{10, 20, 0}, {12, 20, 9}, {14, 20, 20}, {16, 20, 20}}, ErrLimitedDesign},
		{"one all-negative", []Exposure{{10, 20, 0}, {12, 20, 9}, {14, 20, 15}, {16, 20, 20}}, ErrLimitedDesign},
		{"growth after the first all-negative", with(6, Exposure{20, 20, 19}), ErrLimitedDesign},
	}
	for _, c := range tests {
		if _, err := LimitedHSK(6, c.exp); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
		if _, err := HSK(6, c.exp); err != nil {
			t.Errorf("%s: the general procedure refused: %v", c.name, err)
		}
	}
	// Within tolerance: an interval off by 1e-7 relative is equal.
	if _, err := LimitedHSK(6, with(4, Exposure{16 + 2e-7, 20, 19})); err != nil {
		t.Errorf("interval off by 1e-7 relative: %v", err)
	}
	// Units before the anchor and after U_k may differ: they are not used.
	x := with(0, Exposure{8, 5, 0})
	x[6] = Exposure{20, 7, 7}
	if _, err := LimitedHSK(6, x); err != nil {
		t.Errorf("unequal units outside the sums: %v", err)
	}
}

// TestLimitedEqualsGeneral checks, on randomized designs that meet the
// limited procedure's prerequisites, that both forms give the same
// numbers (a property of the closed forms: summation by parts).
func TestLimitedEqualsGeneral(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 2024))
	for trial := range 2000 {
		n := 2 + rng.IntN(60)
		d := math.Exp(rng.Float64()*12 - 6) // 0.0025 … 400 min
		t0 := rng.Float64() * 20 * d
		lead := rng.IntN(3)       // extra all-positive exposures before the anchor
		frac := 2 + rng.IntN(7)   // fractional exposures
		tail := 2 + rng.IntN(3)   // all-negative exposures
		l := 1 + rng.Float64()*11 // log10 N0
		var exp []Exposure
		tt := t0
		for range lead {
			exp = append(exp, Exposure{tt, 1 + rng.IntN(100), 0})
			tt += d * (0.5 + rng.Float64())
		}
		base := tt
		exp = append(exp, Exposure{base, n, 0})
		for j := range frac {
			exp = append(exp, Exposure{base + float64(j+1)*d, n, 1 + rng.IntN(n-1)})
		}
		for j := range tail {
			units := n
			if j > 0 {
				units = 1 + rng.IntN(100) // not used: any units
			}
			exp = append(exp, Exposure{base + float64(frac+1+j)*d, units, units})
		}
		rng.Shuffle(len(exp), func(i, j int) { exp[i], exp[j] = exp[j], exp[i] })
		g, err := HSK(l, exp)
		if err != nil {
			t.Fatalf("trial %d: general: %v", trial, err)
		}
		lim, err := LimitedHSK(l, exp)
		if err != nil {
			t.Fatalf("trial %d: limited: %v (%v)", trial, err, exp)
		}
		const rel = 1e-9
		near(t, "mean time", lim.MeanTime, g.MeanTime, 1e-12*d, rel)
		near(t, "variance", lim.Variance, g.Variance, 1e-12*d*d, rel)
		near(t, "D", lim.Estimate.Value, g.Estimate.Value, 1e-12*d, rel)
		near(t, "lower", lim.Estimate.Lower, g.Estimate.Lower, 1e-12*d, rel)
		near(t, "upper", lim.Estimate.Upper, g.Estimate.Upper, 1e-12*d, rel)
		if lim.Units != n || !scalarNear(lim.Interval, d) {
			t.Errorf("trial %d: units %d interval %g, want %d %g", trial, lim.Units, lim.Interval, n, d)
		}
		if t.Failed() {
			t.Fatalf("trial %d: %v", trial, exp)
		}
	}
}

func scalarNear(a, b float64) bool { return math.Abs(a-b) <= 1e-9*math.Abs(b) }
