package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"testing"
)

// The fuzz tests check that no input makes an exported function panic, that
// every refusal wraps exactly one documented sentinel, that every result is
// finite where its documentation says so, keeps lower ≤ value ≤ upper, and
// marshals to JSON, and that inverse functions invert each other. Inputs are
// bounded (at most 24 points) so that each costs microseconds.

// sentinels lists every error sentinel of the package (TestSentinels checks
// the list against the source).
var sentinels = []error{ErrInvalidD, ErrInvalidZ, ErrInvalidTemperature, ErrInvalidPopulation, ErrInvalidTime, ErrInvalidLevel,
	ErrTooFewTemperatures, ErrRisingD, ErrInvalidWeight, ErrInvalidEnergy, ErrOutOfRange, ErrInvalidCount, ErrInvalidSetting, ErrProfile}

// documented reports whether err wraps exactly one sentinel.
func documented(err error) bool {
	n := 0
	for _, s := range sentinels {
		if errors.Is(err, s) {
			n++
		}
	}
	return n == 1
}

// ordered reports whether lo ≤ v ≤ hi, or both limits are NaN.
func ordered(lo, v, hi float64) bool {
	return lo <= v && v <= hi || math.IsNaN(lo) && math.IsNaN(hi)
}

func FuzzDAt(f *testing.F) {
	f.Add(4.5, 150.0, 10.0, 160.0)
	f.Add(1.0, 121.0, 1e-300, -1e300)
	f.Add(math.NaN(), 0.0, 0.0, math.Inf(1))
	f.Add(1e-300, -273.15, 1e300, 5000.0)
	f.Fuzz(func(t *testing.T, dRef, tRef, z, celsius float64) {
		d, err := DAt(dRef, tRef, z, celsius)
		if err != nil {
			if !documented(err) {
				t.Fatalf("DAt: undocumented error %v", err)
			}
		} else {
			if !finite(d) || d <= 0 {
				t.Fatalf("DAt gave %v", d)
			}
			// TemperatureAt inverts DAt: back to celsius within the
			// rounding of the two logarithms, scaled by z.
			back, err := TemperatureAt(dRef, tRef, z, d)
			if err != nil {
				t.Fatalf("TemperatureAt(DAt) refused: %v", err)
			}
			tol := 1e-12 * (math.Abs(celsius) + math.Abs(tRef) + z*(math.Abs(math.Log10(d))+math.Abs(math.Log10(dRef))+1))
			if !(math.Abs(back-celsius) <= tol) {
				t.Fatalf("TemperatureAt(DAt(%v, %v, %v, %v) = %v) = %v", dRef, tRef, z, celsius, d, back)
			}
		}
		e, err := EstimateAt(Estimate{Value: dRef, Lower: dRef / 2, Upper: math.Inf(1), Level: 0.95}, tRef, z, celsius)
		if err != nil {
			if !documented(err) {
				t.Fatalf("EstimateAt: undocumented error %v", err)
			}
		} else if !(e.Value == d && ordered(e.Lower, e.Value, e.Upper)) || !math.IsInf(e.Upper, 1) {
			t.Fatalf("EstimateAt gave %+v, DAt %v", e, d)
		}
		if ea, err := ActivationEnergy(z, tRef, celsius); err == nil {
			if !(ea > 0) || !finite(ea) {
				t.Fatalf("ActivationEnergy gave %v", ea)
			}
			if z2, err := ZFromActivationEnergy(ea, tRef, celsius); err == nil {
				if !(math.Abs(z2-z) <= 1e-12*z) {
					t.Fatalf("z %v → Ea %v → z %v", z, ea, z2)
				}
			} else if !documented(err) {
				t.Fatalf("ZFromActivationEnergy: undocumented error %v", err)
			}
		} else if !documented(err) {
			t.Fatalf("ActivationEnergy: undocumented error %v", err)
		}
	})
}

// FuzzArrhenius fuzzes the Arrhenius conversions directly (FuzzDAt reaches
// them only through z-values): results positive and finite, and each the
// inverse of the other.
func FuzzArrhenius(f *testing.F) {
	f.Add(2.5e5, 110.0, 130.0)
	f.Add(1e-300, -273.15, 1e300)
	f.Add(math.MaxFloat64, -273.1499, -273.1499)
	f.Fuzz(func(t *testing.T, ea, t1, t2 float64) {
		z, err := ZFromActivationEnergy(ea, t1, t2)
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
			return
		}
		if !(z > 0) || !finite(z) {
			t.Fatalf("z %v", z)
		}
		back, err := ActivationEnergy(z, t1, t2)
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
			return
		}
		if !(math.Abs(back-ea) <= 1e-12*ea) {
			t.Fatalf("Ea %v → z %v → Ea %v", ea, z, back)
		}
	})
}

// checkZResult fails unless r is a consistent z fit of n points.
func checkZResult(t *testing.T, r ZResult, n int) {
	t.Helper()
	switch {
	case !finite(r.Z.Value) || !(r.Z.Value > 0) || !ordered(r.Z.Lower, r.Z.Value, r.Z.Upper):
		t.Fatalf("z %v, limits %v – %v", r.Z.Value, r.Z.Lower, r.Z.Upper)
	case math.IsInf(r.Z.Upper, 1) && len(r.Z.Warnings) == 0:
		t.Fatalf("unbounded z without a warning")
	case !finite(r.DRef.Value) || !(r.DRef.Value > 0) || !ordered(r.DRef.Lower, r.DRef.Value, r.DRef.Upper):
		t.Fatalf("D ref %v, limits %v – %v", r.DRef.Value, r.DRef.Lower, r.DRef.Upper)
	case !(r.Slope < 0) || !(r.RSquared >= 0 && r.RSquared <= 1) || r.N != n || r.DF != n-2 || len(r.Residuals) != n:
		t.Fatalf("slope %v, r² %v, n %d, df %d, %d residuals for %d points", r.Slope, r.RSquared, r.N, r.DF, len(r.Residuals), n)
	case n == 2 && !math.IsNaN(r.Z.Lower):
		t.Fatalf("two points with limits %v – %v", r.Z.Lower, r.Z.Upper)
	}
	if _, err := json.Marshal(r); err != nil {
		t.Fatalf("JSON: %v", err)
	}
	_ = r.String()
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
			checkZResult(t, r, n)
		}
		z, err := ZFromTwo(t1, d1, t2, d2)
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
		} else if !(z > 0) || !finite(z) {
			t.Fatalf("ZFromTwo gave %v", z)
		}
	})
}

// FuzzZFitPoints fits up to 24 points decoded from bytes (4 per point:
// temperature 60 + b0/2 + b1/512 °C, D 10^((b2 − 128)/32) min, the
// half-width of its limits b3/256 on the log10 scale), with replicates and
// a free reference temperature.
func FuzzZFitPoints(f *testing.F) {
	f.Add([]byte{100, 0, 160, 10, 120, 0, 128, 12, 140, 0, 96, 9, 140, 128, 97, 8}, 121.0, 0.95, false)
	f.Add([]byte{100, 0, 160, 10, 100, 0, 161, 0, 140, 0, 96, 9}, -40.0, 0.999, true)
	f.Add([]byte{0, 0, 0, 0, 255, 255, 255, 255, 0, 1, 255, 0}, 1e300, 0.0, true)
	f.Fuzz(func(t *testing.T, b []byte, tRef, level float64, weighted bool) {
		var p []Point
		for len(b) >= 4 && len(p) < 24 {
			c := 60 + float64(b[0])/2 + float64(b[1])/512
			v := math.Pow(10, (float64(b[2])-128)/32)
			h := math.Pow(10, float64(b[3])/256)
			p = append(p, Point{Celsius: c, D: Estimate{Value: v, Lower: v / h, Upper: v * h, Level: 0.95}})
			b = b[4:]
		}
		r, err := ZFit(p, tRef, &ZSettings{Level: level, Weighted: weighted})
		if err != nil {
			if !documented(err) {
				t.Fatalf("undocumented error %v", err)
			}
			return
		}
		checkZResult(t, r, len(p))
	})
}

// FuzzWindow fuzzes SurvivalKill and CheckWindow: the window's times are
// positive and ordered, and the comparison's margins and verdicts agree.
func FuzzWindow(f *testing.F) {
	f.Add(6.0, 2.0, 8.0, 19.0, 1.8, 2.2)
	f.Add(2.0000001, 1e-300, 1e-300, 1e308, 0.0, math.Inf(1))
	f.Add(12.0, 1000.0, 9000.0, 16000.0, math.NaN(), math.NaN())
	f.Fuzz(func(t *testing.T, l, d, surv, kill, lo, hi float64) {
		w, err := SurvivalKill(l, d)
		if err != nil {
			if !documented(err) {
				t.Fatalf("SurvivalKill: undocumented error %v", err)
			}
		} else if !(w.Survival > 0 && w.Kill > w.Survival) || !finite(w.Kill) {
			t.Fatalf("window %+v", w)
		}
		c, err := CheckWindow(Window{surv, kill}, Estimate{Value: d, Lower: lo, Upper: hi, Level: 0.95}, l)
		if err != nil {
			if !documented(err) {
				t.Fatalf("CheckWindow: undocumented error %v", err)
			}
			return
		}
		if c.Computed != w || c.SurvivalMargin != surv-w.Survival || c.KillMargin != w.Kill-kill {
			t.Fatalf("check %+v for window %+v", c, w)
		}
		if c.SurvivalMargin >= 0 && c.KillMargin >= 0 && !c.Consistent {
			t.Fatalf("margins %v, %v but not consistent", c.SurvivalMargin, c.KillMargin)
		}
		if c.LimitsGiven == (math.IsNaN(lo) || math.IsNaN(hi)) || !c.LimitsGiven && c.ConsistentAtLimits {
			t.Fatalf("limits %v – %v: given %v, consistent at limits %v", lo, hi, c.LimitsGiven, c.ConsistentAtLimits)
		}
		if _, err := json.Marshal(c); err != nil {
			t.Fatalf("JSON: %v", err)
		}
		_ = c.String()
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
		if r.Passed+r.Failed+r.NotAssessed != len(r.Findings) || r.Caution != Caution {
			t.Fatalf("counts %d + %d + %d for %d findings", r.Passed, r.Failed, r.NotAssessed, len(r.Findings))
		}
		for _, f := range r.Findings {
			if f.Outcome == Pass && math.IsNaN(f.Value) {
				t.Fatalf("finding %q passed on NaN", f.Criterion)
			}
		}
		if (r.Failed > 0) != (r.Summary == SomeFailed) || r.Failed == 0 && r.Passed == 0 && r.Summary != NoneAssessed {
			t.Fatalf("summary %q with %d passed, %d failed", r.Summary, r.Passed, r.Failed)
		}
		if _, err := json.Marshal(r); err != nil {
			t.Fatalf("JSON: %v", err)
		}
		_ = r.String()
	})
}

// FuzzEstimateJSON checks that any Estimate survives a JSON round trip,
// NaN and ±Inf included, and that RelativeHalfWidth is NaN, +Inf or ≥ 0.
func FuzzEstimateJSON(f *testing.F) {
	f.Add(uint64(0), uint64(0x7ff8000000000001), uint64(0x7ff0000000000000), uint64(0xfff0000000000000), "survivor curve")
	f.Add(math.Float64bits(2), math.Float64bits(1.8), math.Float64bits(2.3), math.Float64bits(0.95), "\"quoted\"\n")
	f.Fuzz(func(t *testing.T, v, lo, hi, level uint64, method string) {
		e := Estimate{Value: math.Float64frombits(v), Lower: math.Float64frombits(lo), Upper: math.Float64frombits(hi), Level: math.Float64frombits(level), Method: method}
		b, err := json.Marshal(e)
		if err != nil {
			t.Fatalf("JSON: %v", err)
		}
		var back Estimate
		if err := json.Unmarshal(b, &back); err != nil {
			t.Fatalf("round trip of %s: %v", b, err)
		}
		same := func(a, b float64) bool { return a == b || math.IsNaN(a) && math.IsNaN(b) }
		if !same(back.Value, e.Value) || !same(back.Lower, e.Lower) || !same(back.Upper, e.Upper) || !same(back.Level, e.Level) {
			t.Fatalf("%+v → %s → %+v", e, b, back)
		}
		if h := e.RelativeHalfWidth(); !(h >= 0) && !math.IsNaN(h) {
			t.Fatalf("relative half-width %v", h)
		}
	})
}
