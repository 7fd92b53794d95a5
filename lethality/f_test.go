package lethality

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// linearRamp returns n+1 samples of T(t) = t0C + k·t on [0, span].
func linearRamp(n int, span, t0C, k float64) []Sample {
	s := make([]Sample, n+1)
	for i := range s {
		t := span * float64(i) / float64(n)
		s[i] = Sample{Minutes: t, Celsius: t0C + k*t}
	}
	return s
}

// rampIntegral is the closed form of ∫₀^span 10^((t0C + k t − tref)/z) dt =
// z/(k ln10) · (L(T(span)) − L(T(0))) (hand-worked from the closed form).
func rampIntegral(span, t0C, k, tref, z float64) float64 {
	return z / (k * math.Ln10) * (math.Pow(10, (t0C+k*span-tref)/z) - math.Pow(10, (t0C-tref)/z))
}

func TestFConstant(t *testing.T) {
	// Hand-worked from the closed form: constant T for 10 min gives
	// F = 10 · L(T) by every rule. L(111.1) = 0.1 and L(101.1) = 0.01 at
	// z 10 against 121.1 °C (German Wikipedia, "Letalitätswert").
	for _, c := range []struct {
		celsius, want float64
	}{{121.1, 10}, {111.1, 1}, {101.1, 0.1}, {131.1, 100}} {
		s := []Sample{{0, c.celsius}, {2.5, c.celsius}, {7, c.celsius}, {10, c.celsius}}
		for _, rule := range []Rule{Rectangle, Trapezoid, Exact, ""} {
			r, err := F(s, MoistHeat(), &FSettings{Rule: rule})
			if err != nil {
				t.Fatal(err)
			}
			near(t, fmt.Sprintf("F at %g °C, rule %q", c.celsius, rule), r.F, c.want, 0, 1e-12)
		}
	}
}

func TestFLinearRamp(t *testing.T) {
	// The exact rule is exact for a linear temperature, with any step.
	cases := []struct {
		name            string
		n               int
		span, t0C, k, z float64
	}{
		{"coarse steps", 4, 20, 100, 1.2, 10},      // ΔT 6 °C: the difference branch
		{"fine steps", 4000, 20, 100, 1.2, 10},     // ΔT 0.006 °C: the series branch
		{"mixed", 100, 20, 100, 0.5, 10},           // ΔT 0.1 °C: d = 0.023
		{"falling", 50, 30, 125, -0.8, 10},         // cooling
		{"dry heat", 300, 60, 150, 0.5, 20},        // z 20
		{"depyrogenation", 64, 30, 240, 0.6, 46.4}, // z 46.4
		{"huge n", 100000, 10, 110, 1.5, 10},       // many blocks
	}
	for _, c := range cases {
		s := linearRamp(c.n, c.span, c.t0C, c.k)
		ref := Reference{TRef: 121.1, Z: c.z}
		want := rampIntegral(c.span, c.t0C, c.k, ref.TRef, c.z)
		r, err := F(s, ref, &FSettings{Rule: Exact})
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.name, r.F, want, 0, 1e-12)
	}
}

func TestFConvergenceOrders(t *testing.T) {
	// Halving h halves the rectangle rule's error (order h) and quarters
	// the trapezoid rule's (order h²) on a smooth ramp.
	span, t0C, k := 20.0, 100.0, 1.2
	want := rampIntegral(span, t0C, k, 121.1, 10)
	errAt := func(rule Rule, n int) float64 {
		r, err := F(linearRamp(n, span, t0C, k), MoistHeat(), &FSettings{Rule: rule})
		if err != nil {
			t.Fatal(err)
		}
		return r.F - want
	}
	for _, c := range []struct {
		rule  Rule
		ratio float64
	}{{Rectangle, 2}, {Trapezoid, 4}} {
		for _, n := range []int{64, 128, 256} {
			e1, e2 := errAt(c.rule, n), errAt(c.rule, 2*n)
			near(t, fmt.Sprintf("%s error ratio at n = %d", c.rule, n), e1/e2, c.ratio, 0, 0.02)
		}
	}
	// Signs: the left rule underestimates a rising rate, the trapezoid
	// rule overestimates a convex one.
	if errAt(Rectangle, 64) >= 0 || errAt(Trapezoid, 64) <= 0 {
		t.Errorf("error signs: rectangle %g (want < 0), trapezoid %g (want > 0)", errAt(Rectangle, 64), errAt(Trapezoid, 64))
	}
}

func TestFSmallRecords(t *testing.T) {
	// Python 3.11 mpmath 1.2.1 (dps 40), sums of the three rules over the
	// samples with L = mpmath.power(10, (T - t_ref)/z); exact also checked
	// against mpmath.quad over each linear interval.
	ramp := []Sample{{0, 100}, {2, 110}, {4, 121}, {6, 121.5}, {8, 115}, {10, 105}}
	uneven := []Sample{{0, 118}, {0.5, 119.5}, {1.5, 121.1}, {4, 121.3}, {4.25, 120}}
	dry := []Sample{{0, 160}, {10, 170}, {40, 172}, {50, 165}}
	cases := []struct {
		name string
		s    []Sample
		ref  Reference
		rule Rule
		want float64
	}{
		{"ramp rectangle", ramp, MoistHeat(), Rectangle, 4.8091469829933159},
		{"ramp trapezoid", ramp, MoistHeat(), Trapezoid, 4.8259316009838793},
		{"ramp exact", ramp, MoistHeat(), Exact, 4.1715523323843508},
		{"uneven rectangle", uneven, MoistHeat121(), Rectangle, 3.7846517082090575},
		{"uneven trapezoid", uneven, MoistHeat121(), Trapezoid, 4.0196489572284819},
		{"uneven exact", uneven, MoistHeat121(), Exact, 4.0048309689812368},
		{"dry rectangle", dry, DryHeat(), Rectangle, 45.751531778110051},
		{"dry trapezoid", dry, DryHeat(), Trapezoid, 49.571353691919279},
		{"dry exact", dry, DryHeat(), Exact, 48.317637003218411},
	}
	for _, c := range cases {
		r, err := F(c.s, c.ref, &FSettings{Rule: c.rule})
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.name, r.F, c.want, 0, 1e-13)
	}
}

func TestFRefusals(t *testing.T) {
	good := []Sample{{0, 120}, {1, 121}, {2, 121.5}}
	with := func(i int, x Sample) []Sample { s := slices.Clone(good); s[i] = x; return s }
	cases := []struct {
		name    string
		s       []Sample
		ref     Reference
		set     *FSettings
		want    error
		mention string
	}{
		{"no sample", nil, MoistHeat(), nil, ErrTooFewSamples, "0 samples"},
		{"one sample", good[:1], MoistHeat(), nil, ErrTooFewSamples, "1 samples"},
		{"repeated time", with(2, Sample{1, 121}), MoistHeat(), nil, ErrTimeOrder, "samples[2]"},
		{"decreasing time", with(1, Sample{-1, 121}), MoistHeat(), nil, ErrTimeOrder, "samples[1]"},
		{"NaN time", with(1, Sample{math.NaN(), 121}), MoistHeat(), nil, ErrNonFinite, "samples[1]"},
		{"Inf time", with(2, Sample{math.Inf(1), 121}), MoistHeat(), nil, ErrNonFinite, "samples[2]"},
		{"NaN temperature", with(1, Sample{1, math.NaN()}), MoistHeat(), nil, ErrNonFinite, "samples[1]"},
		{"-Inf temperature first", with(0, Sample{0, math.Inf(-1)}), MoistHeat(), nil, ErrNonFinite, "samples[0]"},
		{"+Inf temperature", with(2, Sample{2, math.Inf(1)}), MoistHeat(), &FSettings{Rule: Rectangle}, ErrNonFinite, "samples[2]"},
		{"z zero", good, Reference{TRef: 121.1}, nil, ErrInvalidReference, "z 0"},
		{"z negative", good, Reference{TRef: 121.1, Z: -10}, nil, ErrInvalidReference, "z -10"},
		{"z NaN", good, Reference{TRef: 121.1, Z: math.NaN()}, nil, ErrInvalidReference, "NaN"},
		{"z Inf", good, Reference{TRef: 121.1, Z: math.Inf(1)}, nil, ErrInvalidReference, "+Inf"},
		{"T_ref NaN", good, Reference{TRef: math.NaN(), Z: 10}, nil, ErrInvalidReference, "NaN"},
		{"unknown rule", good, MoistHeat(), &FSettings{Rule: "simpson"}, ErrUnknownRule, "simpson"},
		{"negative gap", good, MoistHeat(), &FSettings{MaxGap: -1}, ErrInvalidSetting, "-1"},
		{"gap", []Sample{{0, 120}, {1, 121}, {5, 121}}, MoistHeat(), &FSettings{MaxGap: 2}, ErrGap, "samples[2]"},
		{"overflow", with(2, Sample{2, 5000}), MoistHeat(), nil, ErrOverflow, "samples[2]"},
	}
	for _, c := range cases {
		_, err := F(c.s, c.ref, c.set)
		if !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
			continue
		}
		if !strings.Contains(err.Error(), c.mention) {
			t.Errorf("%s: error %q does not mention %q", c.name, err, c.mention)
		}
	}
}

func TestFGapsWarned(t *testing.T) {
	s := []Sample{{0, 121.1}, {1, 121.1}, {4, 121.1}, {5, 121.1}, {9, 121.1}}
	r, err := F(s, MoistHeat(), &FSettings{MaxGap: 2, WarnGaps: true})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "F across gaps", r.F, 9, 0, 1e-13) // hand-worked: 9 min at T_ref
	want := []Gap{{Index: 1, From: 1, To: 4}, {Index: 3, From: 5, To: 9}}
	if r.GapCount != 2 || !slices.Equal(r.Gaps, want) || len(r.Warnings) != 1 {
		t.Errorf("gaps %v (count %d), warnings %q; want %v", r.Gaps, r.GapCount, r.Warnings, want)
	}
}

func TestFCumulative(t *testing.T) {
	s := linearRamp(200, 20, 100, 1.2)
	r, err := F(s, MoistHeat(), &FSettings{Cumulative: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Cumulative) != len(s) || r.Cumulative[0] != 0 || r.Samples != len(s) || r.End != 20 {
		t.Fatalf("cumulative has %d values starting %v", len(r.Cumulative), r.Cumulative[:1])
	}
	near(t, "last cumulative", r.Cumulative[len(s)-1], r.F, 0, 1e-15)
	for _, i := range []int{1, 31, 32, 33, 100, 150} {
		// Independent: the closed form up to sample i.
		near(t, fmt.Sprintf("cumulative[%d]", i), r.Cumulative[i], rampIntegral(s[i].Minutes, 100, 1.2, 121.1, 10), 0, 1e-12)
	}
}

// randomRecord returns an invented record with steps of every size (seeded).
func randomRecord(n int, seed uint64) []Sample {
	rng := rand.New(rand.NewPCG(seed, 2))
	s := make([]Sample, n)
	t, c := 0.0, 110.0
	for i := range s {
		s[i] = Sample{Minutes: t, Celsius: c}
		t += 0.001 + rng.Float64()/30
		switch rng.IntN(4) {
		case 0:
			c += rng.NormFloat64() * 3 // large steps: the difference branch
		default:
			c += rng.NormFloat64() * 0.01 // small steps: the series branch
		}
		c = math.Max(90, math.Min(c, 130))
	}
	return s
}

func TestAccumulatorMatchesF(t *testing.T) {
	for _, rule := range []Rule{Rectangle, Trapezoid, Exact} {
		s := randomRecord(5000, 7)
		set := &FSettings{Rule: rule, MaxGap: 0.03, WarnGaps: true, Cumulative: true}
		want, err := F(s, MoistHeat(), set)
		if err != nil {
			t.Fatal(err)
		}
		acc, err := NewAccumulator(MoistHeat(), set)
		if err != nil {
			t.Fatal(err)
		}
		for i, x := range s {
			if err := acc.Add(x); err != nil {
				t.Fatal(err)
			}
			if acc.Current() != want.Cumulative[i] {
				t.Fatalf("%s: sample %d: accumulator %v, F cumulative %v", rule, i, acc.Current(), want.Cumulative[i])
			}
		}
		got, err := acc.Result()
		if err != nil {
			t.Fatal(err)
		}
		// F without cumulative values takes another loop for the exact
		// rule; it must agree too.
		plainSet := *set
		plainSet.Cumulative = false
		if plainF, err := F(s, MoistHeat(), &plainSet); err != nil || plainF.F != got.F {
			t.Errorf("%s: F without cumulative %v, accumulator %v (%v)", rule, plainF.F, got.F, err)
		}
		if got.F != want.F || got.GapCount != want.GapCount || got.GapCount == 0 || !slices.Equal(got.Gaps, want.Gaps) {
			t.Errorf("%s: accumulator F %v gaps %d, F %v gaps %d", rule, got.F, got.GapCount, want.F, want.GapCount)
		}
		// Independent check of the same record: the trapezoid rule summed
		// plainly in a straightforward loop with math.Pow.
		if rule == Trapezoid {
			plain := 0.0
			for i := 1; i < len(s); i++ {
				plain += (s[i].Minutes - s[i-1].Minutes) * (MoistHeat().Rate(s[i-1].Celsius) + MoistHeat().Rate(s[i].Celsius)) / 2
			}
			near(t, "trapezoid against a plain loop", got.F, plain, 0, 1e-12)
		}
	}
}

func TestExactAgainstQuadrature(t *testing.T) {
	// The exact rule on a random record against the per-interval closed
	// form evaluated with math.Log and math.Pow (an independent, slower
	// computation of the same integral).
	s := randomRecord(3000, 11)
	r, err := F(s, MoistHeat(), nil)
	if err != nil {
		t.Fatal(err)
	}
	want := 0.0
	for i := 1; i < len(s); i++ {
		l0, l1 := MoistHeat().Rate(s[i-1].Celsius), MoistHeat().Rate(s[i].Celsius)
		dt := s[i].Minutes - s[i-1].Minutes
		if s[i].Celsius == s[i-1].Celsius {
			want += dt * l0
		} else {
			want += dt * (l1 - l0) / math.Log(l1/l0)
		}
	}
	near(t, "exact rule on a random record", r.F, want, 0, 1e-11)
}

func TestAccumulatorRefusalKeepsState(t *testing.T) {
	acc, err := NewAccumulator(MoistHeat(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if _, err := acc.Result(); !errors.Is(err, ErrTooFewSamples) {
		t.Errorf("empty accumulator: %v", err)
	}
	for _, x := range []Sample{{0, 121.1}, {1, 121.1}} {
		if err := acc.Add(x); err != nil {
			t.Fatal(err)
		}
	}
	err = acc.Add(Sample{0.5, 121.1})
	if !errors.Is(err, ErrTimeOrder) || !strings.Contains(err.Error(), "samples[2]") {
		t.Errorf("out of order: %v", err)
	}
	if err := acc.Add(Sample{3, 121.1}); err != nil {
		t.Fatal(err)
	}
	r, _ := acc.Result()
	near(t, "F after a refused sample", r.F, 3, 0, 1e-14) // hand-worked: 3 min at T_ref
	if acc.Len() != 3 {
		t.Errorf("Len %d, want 3", acc.Len())
	}
	var nilAcc *Accumulator
	if err := nilAcc.Add(Sample{}); !errors.Is(err, ErrInvalidSetting) {
		t.Errorf("nil accumulator: %v", err)
	}
	if _, err := NewAccumulator(Reference{}, nil); !errors.Is(err, ErrInvalidReference) {
		t.Errorf("zero reference: %v", err)
	}
}

func TestFDoesNotModifyInput(t *testing.T) {
	s := randomRecord(100, 3)
	keep := slices.Clone(s)
	if _, err := F(s, MoistHeat(), &FSettings{Cumulative: true}); err != nil {
		t.Fatal(err)
	}
	if !slices.Equal(s, keep) {
		t.Error("F modified its samples")
	}
}

func TestFResultJSON(t *testing.T) {
	r, err := F([]Sample{{0, 121.1}, {1, 121.1}, {5, 121.1}}, MoistHeat(), &FSettings{MaxGap: 2, WarnGaps: true, Cumulative: true})
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	var back FResult
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if back.F != r.F || back.GapCount != 1 || back.Rule != Exact || back.Reference.TRef != 121.1 {
		t.Errorf("round trip %+v", back)
	}
	if !strings.Contains(r.String(), "F 5 min (exact rule") || !strings.Contains(r.String(), "warning:") {
		t.Errorf("String() = %q", r.String())
	}
}

func TestExpm1x(t *testing.T) {
	// Against math.Expm1(x)/x over the series range (and 1 at 0).
	worst := 0.0
	for i := -100000; i <= 100000; i++ {
		x := seriesLimit * float64(i) / 100001
		want := 1.0
		if x != 0 {
			want = math.Expm1(x) / x
		}
		worst = math.Max(worst, math.Abs(expm1x(x)-want)/want)
	}
	if worst > 5e-16 { // the reference itself rounds twice
		t.Errorf("expm1x: worst relative error %g against math.Expm1(x)/x", worst)
	}
}

func TestPow2(t *testing.T) {
	// Against math.Exp2 over the range the fast path serves, and the
	// special cases.
	worst := 0.0
	for i := 0; i <= 200000; i++ {
		w := -1019.9 + 2039.8*float64(i)/200000
		got, want := pow2(w), math.Exp2(w)
		worst = math.Max(worst, math.Abs(got-want)/want)
	}
	if worst > 5e-16 {
		t.Errorf("pow2: worst relative error %g against math.Exp2", worst)
	}
	if !math.IsInf(pow2(1100), 1) || pow2(-1100) != 0 || !math.IsNaN(pow2(math.NaN())) {
		t.Errorf("pow2 special cases: %v %v %v", pow2(1100), pow2(-1100), pow2(math.NaN()))
	}
}
