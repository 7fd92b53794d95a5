package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"
)

func TestSurvivalKill(t *testing.T) {
	for _, c := range []struct {
		name           string
		log10N0, d     float64
		survival, kill float64
	}{
		// Hand-worked from survival (log10 N0 − 2)·D and kill (log10 N0 + 4)·D.
		{"10^6, D 1.5", 6, 1.5, 6, 15},
		{"10^6.5, D 3.2", 6.5, 3.2, 14.4, 33.6},
		// Python 3: (math.log10(2.1e6)-2)*2.1, (math.log10(2.1e6)+4)*2.1.
		{"2.1·10^6, D 2.1", math.Log10(2.1e6), 2.1, 9.076660518941232, 21.676660518941233},
		{"just above 10^2", 2.5, 1, 0.5, 6.5},
	} {
		w, err := SurvivalKill(c.log10N0, c.d)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		near(t, c.name+" survival", w.Survival, c.survival, 1e-14)
		near(t, c.name+" kill", w.Kill, c.kill, 1e-14)
	}
}

func TestSurvivalKillRefusals(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name       string
		log10N0, d float64
		want       error
	}{
		{"D zero", 6, 0, ErrInvalidD},
		{"D negative", 6, -1, ErrInvalidD},
		{"D NaN", 6, nan, ErrInvalidD},
		{"D Inf", 6, inf, ErrInvalidD},
		{"log10 N0 = 2", 2, 1.5, ErrInvalidPopulation},
		{"log10 N0 < 2", 1, 1.5, ErrInvalidPopulation},
		{"log10 N0 NaN", nan, 1.5, ErrInvalidPopulation},
		{"log10 N0 Inf", inf, 1.5, ErrInvalidPopulation},
		{"overflow", 1e300, 1e300, ErrOutOfRange},
	} {
		if _, err := SurvivalKill(c.log10N0, c.d); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
	}
}

func TestCheckWindow(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	// Every case: log10 N0 = 6, so the computed window is 4·D to 10·D
	// (hand-worked from the closed forms).
	for _, c := range []struct {
		name                       string
		claim                      Window
		d                          Estimate
		sMargin, kMargin           float64
		consistent, limits, atLims bool
		sAtUpper, kAtLower         float64
	}{
		{"claim equals computed", Window{6, 15}, Estimate{Value: 1.5, Lower: nan, Upper: nan}, 0, 0, true, false, false, nan, nan},
		{"claim inside computed, no limits", Window{7, 14}, Estimate{Value: 1.5, Lower: nan, Upper: nan}, 1, 1, true, false, false, nan, nan},
		{"claim holds over limits", Window{7, 13}, Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95}, 1, 2, true, true, true, 0.6, 1},
		{"claim holds at estimate only", Window{6.2, 14.5}, Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95}, 0.2, 0.5, true, true, false, -0.2, -0.5},
		{"survival too short", Window{5.5, 14}, Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95}, -0.5, 1, false, true, false, -0.9, 0},
		{"kill too long", Window{7, 16}, Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95}, 1, -1, false, true, false, 0.6, -2},
		{"unbounded upper", Window{7, 10}, Estimate{Value: 1.5, Lower: 1.2, Upper: inf, Level: 0.95}, 1, 5, true, true, false, math.Inf(-1), 2},
	} {
		r, err := CheckWindow(c.claim, c.d, 6)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		near(t, c.name+" survival margin", r.SurvivalMargin, c.sMargin, 1e-12)
		near(t, c.name+" kill margin", r.KillMargin, c.kMargin, 1e-12)
		near(t, c.name+" survival margin at upper", r.SurvivalMarginAtUpper, c.sAtUpper, 1e-12)
		near(t, c.name+" kill margin at lower", r.KillMarginAtLower, c.kAtLower, 1e-12)
		if r.Consistent != c.consistent || r.LimitsGiven != c.limits || r.ConsistentAtLimits != c.atLims {
			t.Errorf("%s: consistent %v, limits %v, at limits %v; want %v, %v, %v", c.name, r.Consistent, r.LimitsGiven, r.ConsistentAtLimits, c.consistent, c.limits, c.atLims)
		}
		b, err := json.Marshal(r)
		if err != nil {
			t.Errorf("%s: JSON: %v", c.name, err)
		}
		var back WindowCheck
		if err := json.Unmarshal(b, &back); err != nil {
			t.Errorf("%s: JSON back: %v", c.name, err)
		}
		near(t, c.name+" JSON kill margin at lower", back.KillMarginAtLower, c.kAtLower, 1e-12)
		if s := r.String(); !strings.Contains(s, "consistent") {
			t.Errorf("%s: String %q", c.name, s)
		}
	}
}

func TestCheckWindowRounding(t *testing.T) {
	// A claim equal to the computed time up to the last bit is consistent:
	// (log10(2.1e6) − 2)·2.1 = 9.076660518941232 (Python 3), given here one
	// ulp shorter.
	claim := Window{math.Nextafter(9.076660518941232, 0), 21.676660518941233}
	r, err := CheckWindow(claim, Estimate{Value: 2.1, Lower: nan(), Upper: nan()}, math.Log10(2.1e6))
	if err != nil {
		t.Fatal(err)
	}
	if !r.Consistent {
		t.Errorf("rounding: %v", r)
	}
	claim.Survival = 9.07 // a rounded label value below the computed one
	if r, _ = CheckWindow(claim, Estimate{Value: 2.1, Lower: nan(), Upper: nan()}, math.Log10(2.1e6)); r.Consistent {
		t.Errorf("9.07 min survival claimed against 9.0767 computed: %v", r)
	}
}

func nan() float64 { return math.NaN() }

func TestCheckWindowRefusals(t *testing.T) {
	d := Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95}
	for _, c := range []struct {
		name    string
		claim   Window
		d       Estimate
		log10N0 float64
		want    error
	}{
		{"survival zero", Window{0, 15}, d, 6, ErrInvalidTime},
		{"survival NaN", Window{nan(), 15}, d, 6, ErrInvalidTime},
		{"kill before survival", Window{15, 6}, d, 6, ErrInvalidTime},
		{"kill equal to survival", Window{6, 6}, d, 6, ErrInvalidTime},
		{"kill Inf", Window{6, math.Inf(1)}, d, 6, ErrInvalidTime},
		{"D zero", Window{6, 15}, Estimate{}, 6, ErrInvalidD},
		{"population 10^2", Window{6, 15}, d, 2, ErrInvalidPopulation},
	} {
		if _, err := CheckWindow(c.claim, c.d, c.log10N0); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
	}
}
