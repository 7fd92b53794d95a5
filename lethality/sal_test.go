package lethality

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/dzf-go/dzf/resistance"
)

func TestSurvivors(t *testing.T) {
	// Python 3.11 mpmath 1.2.1 (dps 60): l = log10N0 - F/D;
	// p = -mpmath.expm1(-10**l); mpmath.log10(p).
	cases := []struct {
		log10N0, f, d            float64
		log10N, pnsu, log10PNSU  float64
		pnsuRel, log10PNSUAbsTol float64
	}{
		{6, 18, 1.5, -6, 9.9999950000016667e-7, -6.000000217147222856, 1e-12, 1e-12},
		{6, 0, 1.5, 6, 1, 0, 1e-15, 1e-15},
		{6, 9, 1.5, 0, 0.63212055882855768, -0.19920008462778143733, 1e-13, 1e-13},
		{6, 6, 1.5, 2, 1, -1.6156084686467028247e-44, 1e-15, 1e-54},
		{6, 10.5, 1.5, -1, 0.095162581964040427, -1.0215337831383125974, 1e-13, 1e-13},
		{2, 2.5, 1, -0.5, 0.2711065858899754, -0.56685993213942080551, 1e-13, 1e-13},
		{6, 13.5, 1.5, -3, 0.00099950016662500833, -3.0002171291453483641, 1e-12, 1e-12},
		{6, 33.75, 1.5, -16.5, 3.1622776601683793e-17, -16.500000000000000007, 1e-12, 1e-12},
		{6, 35.25, 1.5, -17.5, 3.1622776601683793e-18, -17.500000000000000001, 1e-12, 1e-12},
		{6, 39, 1.5, -20, 1e-20, -20, 1e-12, 1e-12},
		{6, 459, 1.5, -300, 1e-300, -300, 1e-10, 1e-10},
		{6, 600, 1.5, -394, 0, -394, 0, 1e-10},
		{6, 406, 1, -400, 0, -400, 0, 1e-10},
	}
	for _, c := range cases {
		s, err := Survivors(c.log10N0, c.f, c.d)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "log10 survivors", s.Log10Survivors, c.log10N, 1e-12, 0)
		near(t, "log reduction", s.LogReduction, c.f/c.d, 0, 1e-15)
		near(t, "PNSU", s.PNSU, c.pnsu, 0, c.pnsuRel)
		near(t, "log10 PNSU", s.Log10PNSU, c.log10PNSU, c.log10PNSUAbsTol, 0)
		if _, err := json.Marshal(s); err != nil {
			t.Error(err)
		}
	}
}

func TestLog10PNSUBelowFloat64(t *testing.T) {
	// Below 10⁻³⁰⁰ and far below the smallest float64: log10 PNSU =
	// log10 N to float64 precision, since log10(1 − N/2 …) ≈ −N/(2 ln10)
	// (hand-worked from the series of 1 − e^(−N)); PNSU itself underflows
	// to 0 below about 10^−323.3 (smallest subnormal 4.9e-324).
	for _, l := range []float64{-300, -307.5, -320, -330, -400, -1e4, -1e300} {
		near(t, "log10 PNSU", Log10PNSU(l), l, 0, 1e-15)
		if p := PNSU(l); l < -323.4 && p != 0 {
			t.Errorf("PNSU(%g) = %g, want 0", l, p)
		}
	}
	near(t, "PNSU at 1e-300", PNSU(-300), 1e-300, 0, 1e-13)
	// Continuity where the computation changes form (at −17 and at
	// log10 ln2): both sides against mpmath values (Python 3.11 mpmath
	// 1.2.1 dps 60: mpmath.log10(-mpmath.expm1(-10**l))).
	for _, c := range []struct{ l, want float64 }{
		{-17.000000000001, -17.000000000000998315},
		{-16.999999999999, -16.99999999999900169},
		{-0.159, -0.30090902387147284614},
		{-0.16, -0.30160237161495304453},
	} {
		near(t, "log10 PNSU near a switch", Log10PNSU(c.l), c.want, 1e-13, 0)
	}
	if !math.IsNaN(Log10PNSU(math.NaN())) || Log10PNSU(math.Inf(1)) != 0 || !math.IsInf(Log10PNSU(math.Inf(-1)), -1) {
		t.Error("Log10PNSU special cases")
	}
}

func TestLog10SurvivorsForPNSU(t *testing.T) {
	// Round trip through Log10PNSU (two independent formulas).
	for _, l := range []float64{-400, -30, -16, -6, -3, -1, -0.5, -0.01} {
		n, err := Log10SurvivorsForPNSU(Log10PNSU(l))
		if err != nil {
			t.Fatal(err)
		}
		near(t, "round trip", n, l, 1e-12, 1e-12)
	}
	for _, p := range []float64{0, 0.5, math.NaN()} {
		if _, err := Log10SurvivorsForPNSU(p); !errors.Is(err, ErrInvalidProbability) {
			t.Errorf("log10 PNSU %g: %v", p, err)
		}
	}
}

func TestSurvivorsRefusals(t *testing.T) {
	cases := []struct {
		log10N0, f, d float64
		want          error
	}{
		{6, 12, 0, ErrInvalidD},
		{6, 12, -1.5, ErrInvalidD},
		{6, -1, 1.5, ErrNegativeF},
		{math.NaN(), 12, 1.5, ErrNonFinite},
		{6, math.Inf(1), 1.5, ErrNonFinite},
		{6, 12, math.Inf(1), ErrNonFinite},
		{6, 1e300, 1e-300, ErrOverflow},
	}
	for _, c := range cases {
		if _, err := Survivors(c.log10N0, c.f, c.d); !errors.Is(err, c.want) {
			t.Errorf("Survivors(%g, %g, %g): %v, want %v", c.log10N0, c.f, c.d, err, c.want)
		}
	}
}

func TestRequiredF(t *testing.T) {
	// Hand-worked from the closed form F = D·(log10 N0 − log10 SAL); the
	// arithmetic check of overkill texts: D121 1.5 min, 6 logs 9 min, 12
	// logs 18 min.
	for _, c := range []struct{ n0, d, sal, want float64 }{
		{6, 1.5, 0, 9}, {6, 1.5, -6, 18}, {5.5, 2, -6, 23}, {-1, 1, -3, 2},
	} {
		f, err := RequiredF(c.n0, c.d, c.sal)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "required F", f, c.want, 0, 1e-14)
		// Survivors at that F give back the target.
		s, _ := Survivors(c.n0, f, c.d)
		near(t, "survivors at required F", s.Log10Survivors, c.sal, 1e-13, 0)
	}
	for _, c := range []struct {
		n0, d, sal float64
		want       error
	}{
		{6, 0, -6, ErrInvalidD}, {6, -2, -6, ErrInvalidD},
		{6, 1.5, 6, ErrNothingToKill}, {2, 1.5, 3, ErrNothingToKill},
		{6, 1.5, math.NaN(), ErrNonFinite}, {6, 1e300, -1e300, ErrOverflow},
	} {
		if _, err := RequiredF(c.n0, c.d, c.sal); !errors.Is(err, c.want) {
			t.Errorf("RequiredF(%g, %g, %g): %v, want %v", c.n0, c.d, c.sal, err, c.want)
		}
	}
}

func TestAssessAndRequire(t *testing.T) {
	d := resistance.Estimate{Value: 1.5, Lower: 1.2, Upper: 2, Level: 0.95, Method: "invented", Warnings: []string{"invented estimate"}}
	a, err := Assess(6, 18, d)
	if err != nil {
		t.Fatal(err)
	}
	// Hand-worked: 18/1.5 = 12 logs → log10 N −6; 18/2 = 9 logs → −3.
	near(t, "central", a.Central.Log10Survivors, -6, 1e-13, 0)
	if a.Conservative == nil {
		t.Fatal("no conservative figure")
	}
	near(t, "conservative", a.Conservative.Log10Survivors, -3, 1e-13, 0)
	if len(a.Warnings) != 1 || !strings.Contains(a.String(), "conservative") {
		t.Errorf("warnings %q, String %q", a.Warnings, a.String())
	}
	if _, err := json.Marshal(a); err != nil {
		t.Error(err)
	}
	open := d
	open.Upper = math.Inf(1)
	a, err = Assess(6, 18, open)
	if err != nil || a.Conservative != nil || len(a.Warnings) != 2 {
		t.Errorf("infinite upper limit: %v, %+v", err, a)
	}
	if _, err := json.Marshal(a); err != nil {
		t.Errorf("JSON with an infinite limit: %v", err)
	}

	// Require: 12 logs from 10⁶ to 10⁻⁶ with D 1.5 (2 upper): F 18 (24);
	// at 111 °C against 121 °C ten times as long (closed form).
	r, err := Require(6, -6, d, 111, MoistHeat121())
	if err != nil {
		t.Fatal(err)
	}
	near(t, "F", r.F, 18, 0, 1e-14)
	near(t, "F conservative", r.FConservative, 24, 0, 1e-14)
	near(t, "minutes", r.Minutes, 180, 0, 1e-13)
	near(t, "minutes conservative", r.MinutesConservative, 240, 0, 1e-13)
	if _, err := Require(6, 7, d, 121, MoistHeat121()); !errors.Is(err, ErrNothingToKill) {
		t.Errorf("nothing to kill: %v", err)
	}
	if _, err := Assess(6, 18, resistance.Estimate{Value: 0}); !errors.Is(err, ErrInvalidD) {
		t.Errorf("D 0: %v", err)
	}
}
