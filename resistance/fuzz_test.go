package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"testing"
)

// The fuzz tests check that no input makes an exported function panic, that
// every refusal wraps a documented sentinel, and that every result is
// finite where its documentation says so and marshals to JSON.

var sentinels = []error{ErrInvalidD, ErrInvalidZ, ErrInvalidTemperature, ErrInvalidPopulation, ErrInvalidTime, ErrInvalidLevel,
	ErrTooFewTemperatures, ErrRisingD, ErrInvalidWeight, ErrInvalidEnergy, ErrOutOfRange, ErrInvalidCount, ErrInvalidSetting, ErrProfile}

func documented(err error) bool {
	for _, s := range sentinels {
		if errors.Is(err, s) {
			return true
		}
	}
	return false
}

func FuzzDAt(f *testing.F) {
	f.Add(4.5, 150.0, 10.0, 160.0)
	f.Add(1.0, 121.0, 1e-300, -1e300)
	f.Add(math.NaN(), 0.0, 0.0, math.Inf(1))
	f.Fuzz(func(t *testing.T, dRef, tRef, z, celsius float64) {
		d, err := DAt(dRef, tRef, z, celsius)
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
			return
		}
		if !finite(d) || d <= 0 {
			t.Fatalf("DAt gave %v", d)
		}
		if back, err := TemperatureAt(dRef, tRef, z, d); err == nil && !finite(back) {
			t.Fatalf("TemperatureAt gave %v", back)
		}
		if _, err := EstimateAt(Estimate{Value: dRef, Lower: dRef / 2, Upper: math.Inf(1)}, tRef, z, celsius); err != nil && !documented(err) {
			t.Fatalf("undocumented error %v", err)
		}
		if ea, err := ActivationEnergy(z, tRef, celsius); err == nil {
			if _, err := ZFromActivationEnergy(ea, tRef, celsius); err != nil && !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
		} else if !documented(err) {
			t.Fatalf("undocumented error %v", err)
		}
	})
}

func FuzzZFit(f *testing.F) {
	f.Add(110.0, 19.5, 121.0, 1.85, 130.0, 0.2, 121.0, 0.95, false)
	f.Add(120.0, 2.0, 121.0, 2.5, 122.0, 1.8, 121.0, 0.5, true)
	f.Add(121.0, 2.0, 121.0, 2.0, 121.0, 2.0, 1e308, 1e-300, false)
	f.Fuzz(func(t *testing.T, t1, d1, t2, d2, t3, d3, tRef, level float64, weighted bool) {
		p := []Point{
			{t1, Estimate{Value: d1, Lower: d1 * 0.9, Upper: d1 * 1.1, Level: 0.95}},
			{t2, Estimate{Value: d2, Lower: d2 * 0.8, Upper: d2 * 1.3, Level: 0.9}},
			{t3, Estimate{Value: d3, Lower: d3 * 0.95, Upper: d3 * 1.05, Level: 0.95}},
		}
		for _, n := range []int{2, 3} {
			r, err := ZFit(p[:n], tRef, &ZSettings{Level: level, Weighted: weighted})
			if err != nil {
				if !documented(err) {
					t.Fatalf("undocumented error %v", err)
				}
				continue
			}
			if !finite(r.Z.Value) || !(r.Z.Value > 0) || !finite(r.DRef.Value) {
				t.Fatalf("ZFit gave z %v, D ref %v", r.Z.Value, r.DRef.Value)
			}
			if _, err := json.Marshal(r); err != nil {
				t.Fatalf("JSON: %v", err)
			}
		}
		if _, err := ZFromTwo(t1, d1, t2, d2); err != nil && !documented(err) {
			t.Fatalf("undocumented error %v", err)
		}
	})
}

func FuzzCheckLabel(f *testing.F) {
	f.Add(1e6, 2.0, 121.0, 10.0, 7.5, 21.0, 6.1, 1.9, 1.8, 2.0, 10.4, 50, 50, 0)
	f.Add(0.0, 0.0, 0.0, 0.0, 0.0, 0.0, math.NaN(), 0.0, 0.0, 0.0, 0.0, 0, 0, 0)
	f.Add(1e308, 1e308, -1e308, 1e-308, 1e300, 1e301, 1.5, 1e-300, math.Inf(-1), math.Inf(1), 1e300, 1, 2, -1)
	f.Fuzz(func(t *testing.T, pop, d, celsius, z, surv, kill, lgN0, md, mlo, mhi, mz float64, units, growth, killGrowth int) {
		l := Label{Modality: MoistHeat, Population: pop, D: d, Celsius: celsius, Z: z, SurvivalTime: surv, KillTime: kill}
		m := Measured{
			Log10N0:      &Estimate{Value: lgN0},
			D:            []Estimate{{Value: md, Lower: mlo, Upper: mhi, Method: "a"}, {Value: md * 1.1, Lower: math.NaN(), Upper: math.NaN(), Method: "b"}},
			Z:            &Estimate{Value: mz},
			SurvivalTest: &UnitTest{Minutes: surv, Units: units, Growth: growth},
			KillTest:     &UnitTest{Minutes: kill, Units: units, Growth: killGrowth},
		}
		p := ISOMoistHeatProfile()
		r, err := CheckLabel(l, m, &Criteria{Profile: &p, ZAgreement: Limit{Value: 0.1}})
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
			return
		}
		if r.Passed+r.Failed+r.NotAssessed != len(r.Findings) {
			t.Fatalf("counts %d + %d + %d for %d findings", r.Passed, r.Failed, r.NotAssessed, len(r.Findings))
		}
		if _, err := json.Marshal(r); err != nil {
			t.Fatalf("JSON: %v", err)
		}
		_ = r.String()
		if c, err := CheckWindow(Window{surv, kill}, m.D[0], lgN0); err == nil {
			if _, err := json.Marshal(c); err != nil {
				t.Fatalf("JSON: %v", err)
			}
		} else if !documented(err) {
			t.Fatalf("undocumented error %v", err)
		}
	})
}
