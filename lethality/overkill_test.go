package lethality

import (
	"encoding/json"
	"errors"
	"math"
	"testing"

	"github.com/dzf-go/dzf/resistance"
)

func TestOverkill(t *testing.T) {
	// The common definition: at least 12 logs of an organism with D 1 min,
	// so F ≥ 12 min (hand-worked).
	cases := []struct {
		f    float64
		set  *OverkillSettings
		logs float64
		need float64
		ok   bool
	}{
		{12, nil, 12, 12, true},
		{11.9, nil, 11.9, 12, false},
		{18, &OverkillSettings{D: 1.5}, 12, 18, true}, // D121 1.5 min: 12 logs take 18 min
		{9, &OverkillSettings{D: 1.5}, 6, 18, false},  // 6 logs take 9 min
		{9, &OverkillSettings{D: 1.5, TargetLogs: 6}, 6, 9, true},
	}
	for _, c := range cases {
		r, err := Overkill(c.f, c.set)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "logs", r.LogReduction, c.logs, 0, 1e-14)
		near(t, "required F", r.RequiredF, c.need, 0, 1e-14)
		if r.Meets != c.ok {
			t.Errorf("Overkill(%g, %+v).Meets = %v", c.f, c.set, r.Meets)
		}
	}
	for _, c := range []struct {
		f    float64
		set  *OverkillSettings
		want error
	}{
		{-1, nil, ErrNegativeF}, {math.NaN(), nil, ErrNonFinite},
		{12, &OverkillSettings{D: -1}, ErrInvalidD}, {12, &OverkillSettings{TargetLogs: -12}, ErrInvalidSetting},
	} {
		if _, err := Overkill(c.f, c.set); !errors.Is(err, c.want) {
			t.Errorf("Overkill(%g, %+v): %v, want %v", c.f, c.set, err, c.want)
		}
	}
}

func TestHalfCycle(t *testing.T) {
	// Half-cycle reasoning (Pharmaceutical Technology article on overkill
	// validation): a half cycle inactivating 10⁶ indicators credits the
	// full cycle with at least 12 logs.
	r, err := HalfCycle(HalfCycleStudy{Log10N0: 6, Units: 20, Negative: 20, HalfMinutes: 7.5}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !r.Inactivated || r.HalfLogs != 6 || r.FullLogs != 12 || !r.Meets || r.FullMinutes != 15 {
		t.Errorf("%+v", r)
	}
	near(t, "implied max D", r.ImpliedMaxD, 1.25, 0, 1e-15) // 7.5 min / 6 logs
	r, err = HalfCycle(HalfCycleStudy{Log10N0: 5.5, Units: 20, Negative: 20}, nil)
	if err != nil || r.Meets || r.FullLogs != 11 {
		t.Errorf("10^5.5 indicators: %v %+v", err, r)
	}
	r, err = HalfCycle(HalfCycleStudy{Log10N0: 6, Units: 20, Negative: 19}, nil)
	if err != nil || r.Inactivated || r.FullLogs != 0 || r.Meets || len(r.Warnings) != 1 {
		t.Errorf("a positive indicator: %v %+v", err, r)
	}
	if _, err := json.Marshal(r); err != nil {
		t.Error(err)
	}
	for _, s := range []HalfCycleStudy{
		{Log10N0: 6, Units: 0}, {Log10N0: 6, Units: 5, Negative: 6}, {Log10N0: 6, Units: 5, Negative: -1},
		{Log10N0: 0, Units: 5, Negative: 5}, {Log10N0: math.NaN(), Units: 5, Negative: 5},
		{Log10N0: 6, Units: 5, Negative: 5, HalfMinutes: -1},
	} {
		if _, err := HalfCycle(s, nil); !errors.Is(err, ErrInvalidStudy) {
			t.Errorf("HalfCycle(%+v): %v", s, err)
		}
	}
}

func TestCompare(t *testing.T) {
	// Invented figures: indicator 10⁶ of D 1.5 (upper 1.8); bioburden 10²
	// per unit of D 0.5 (upper 0.6). F 15: indicator 10 logs → −4, at the
	// upper limit 15/1.8 logs; bioburden 30 logs → −28 (hand-worked).
	ind := Population{Name: "indicator lot BI-7731 (invented)", Log10N0: 6, D: resistance.Estimate{Value: 1.5, Lower: 1.3, Upper: 1.8, Level: 0.95}}
	bio := Population{Name: "bioburden (invented)", Log10N0: 2, D: resistance.Estimate{Value: 0.5, Lower: 0.4, Upper: 0.6, Level: 0.95}}
	c, err := Compare(15, ind, bio)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "indicator", c.Indicator.Central.Log10Survivors, -4, 1e-13, 0)
	near(t, "indicator conservative", c.Indicator.Conservative.Log10Survivors, 6-15/1.8, 1e-13, 0)
	near(t, "bioburden", c.Bioburden.Central.Log10Survivors, -28, 1e-13, 0)
	near(t, "bioburden conservative", c.Bioburden.Conservative.Log10Survivors, -23, 1e-13, 0)
	if len(c.Warnings) != 0 {
		t.Errorf("warnings %q", c.Warnings)
	}
	bio.D.Value, bio.D.Upper = 2, 2.5
	if c, err = Compare(15, ind, bio); err != nil || len(c.Warnings) != 1 {
		t.Errorf("a bioburden more resistant than the indicator: %v %q", err, c.Warnings)
	}
	if _, err := json.Marshal(c); err != nil {
		t.Error(err)
	}
}
