package resistance

import (
	"errors"
	"math"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// TestSentinels audits the package's errors against its source: every
// package-level variable is a documented error sentinel listed in
// sentinels (no other package state), and each is reached through the
// public API, with errors.Is, by an input whose message names the
// offending value. Labels and measurements are invented (steamLabel).
func TestSentinels(t *testing.T) {
	three := []Point{{110, Estimate{Value: 20}}, {121, Estimate{Value: 2, Lower: math.NaN(), Upper: math.NaN()}}, {130, Estimate{Value: 0.2}}}
	label := func(c *Criteria, mod func(*Measured)) func() error {
		return func() error {
			m := steamMeasured()
			if mod != nil {
				mod(&m)
			}
			_, err := CheckLabel(steamLabel(), m, c)
			return err
		}
	}
	dry := FDADryHeatProfile()
	cases := []apicheck.Refusal{
		{"ErrInvalidD", ErrInvalidD, func() error { _, err := DAt(-1, 121, 10, 121); return err }, "reference D -1"},
		{"ErrInvalidZ", ErrInvalidZ, func() error { _, err := DAt(2, 121, 0, 121); return err }, "z 0"},
		{"ErrInvalidTemperature", ErrInvalidTemperature, func() error { _, err := ActivationEnergy(10, -300, 121); return err }, "first temperature -300 °C"},
		{"ErrInvalidPopulation", ErrInvalidPopulation, func() error { _, err := SurvivalKill(2, 1.5); return err }, "log10 N0 2 (the survival time needs log10 N0 > 2)"},
		{"ErrInvalidTime", ErrInvalidTime, func() error { _, err := CheckWindow(Window{8, 5}, Estimate{Value: 2}, 6); return err }, "claimed kill time 5 min (survival time 8 min)"},
		{"ErrInvalidLevel", ErrInvalidLevel, func() error { _, err := ZFit(three, 121, &ZSettings{Level: 1.5}); return err }, "level 1.5"},
		{"ErrTooFewTemperatures", ErrTooFewTemperatures, func() error {
			_, err := ZFit([]Point{{121, Estimate{Value: 2}}, {121, Estimate{Value: 2.1}}}, 121, nil)
			return err
		}, "2 point(s) at 1 temperature(s)"},
		{"ErrRisingD", ErrRisingD, func() error { _, err := ZFromTwo(110, 1, 120, 2); return err }, "D 1 min at 110 °C and 2 min at 120 °C"},
		{"ErrInvalidWeight", ErrInvalidWeight, func() error { _, err := ZFit(three, 121, &ZSettings{Weighted: true}); return err }, "point 1 at 110 °C: limits 0 – 0"},
		{"ErrInvalidEnergy", ErrInvalidEnergy, func() error { _, err := ZFromActivationEnergy(-5, 110, 120); return err }, "activation energy -5 J/mol"},
		// The fuzz regression of testdata/fuzz/FuzzDAt: a subnormal D.
		{"ErrOutOfRange", ErrOutOfRange, func() error { _, err := DAt(124, -369, 8, 2134.285714285714); return err }, "D at 2134.285714285714 °C from 124 min at -369 °C with z 8 °C"},
		{"ErrInvalidCount", ErrInvalidCount, label(nil, func(m *Measured) { m.SurvivalTest.Growth = 51 }), "survival test: 51 of 50 units with growth"},
		{"ErrInvalidSetting", ErrInvalidSetting, label(&Criteria{DAgreement: Limit{Value: -0.2}}, nil), "D agreement -0.2"},
		{"ErrProfile", ErrProfile, label(&Criteria{Profile: &dry}, nil), `profile "FDA 2007 Table 3, dry heat" is for "dry heat", the label for "moist heat"`},
	}
	apicheck.CheckSentinels(t, ".", sentinels, nil, cases)
}

// TestNoSubnormalResults: results below the smallest normal float64 have
// lost digits and are refused (regressions found by fuzzing: DAt gave
// 1.5e-311, ZFromActivationEnergy 1.1e-315; ZFromTwo gave z = 0 when the
// slope overflowed).
func TestNoSubnormalResults(t *testing.T) {
	for _, c := range []struct {
		name string
		call func() (float64, error)
	}{
		{"DAt", func() (float64, error) { return DAt(124, -369, 8, 2134.285714285714) }},
		{"ZFromActivationEnergy", func() (float64, error) { return ZFromActivationEnergy(math.MaxFloat64, -273.1499, -273.1499) }},
		{"ActivationEnergy", func() (float64, error) { return ActivationEnergy(math.MaxFloat64, -273.1499, -273.1499) }},
		{"ZFromTwo", func() (float64, error) { return ZFromTwo(0, 1e300, 5e-324, 1e-300) }},
		{"SurvivalKill", func() (float64, error) { w, err := SurvivalKill(2+1e-10, 1e-300); return w.Survival, err }},
	} {
		v, err := c.call()
		if !errors.Is(err, ErrOutOfRange) {
			t.Errorf("%s: %v, %v; want ErrOutOfRange", c.name, v, err)
		}
	}
}
