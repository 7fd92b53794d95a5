package survivor

import (
	"errors"
	"math"
	"strings"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// TestSentinels audits the package's errors against its source: every
// package-level variable is an exported, documented error sentinel listed
// in sentinels (no other package state), and each is reached through the
// public API, with errors.Is, by an input whose message names the
// offending value. TestRefusals and TestCountPopulationRefusals check many
// more refusals; this table holds one per sentinel.
func TestSentinels(t *testing.T) {
	vars, err := apicheck.PackageVars(".")
	if err != nil {
		t.Fatal(err)
	}
	listed := map[string]bool{}
	for _, s := range sentinels {
		listed[s.Error()] = true
	}
	reached := map[string]bool{}
	units := func(d float64) []Unit {
		return []Unit{{SuspensionML: 10, Plates: []Plate{{Colonies: 120, Dilution: d, PlatedML: 0.1}}}}
	}
	for _, c := range []struct {
		name string
		err  error
		call func() error
		msg  string
	}{
		{"ErrInvalidObservation", ErrInvalidObservation, func() error {
			_, err := Fit([]Observation{{0, 1e6}, {5, -3}, {10, 1e2}}, nil)
			return err
		}, "observation 1 at 5 min, count -3"},
		{"ErrZeroCount", ErrZeroCount, func() error { _, err := Fit([]Observation{{0, 1e6}, {5, 1e4}, {10, 0}}, nil); return err }, "observation 2 at 10 min, count 0"},
		{"ErrTooFewObservations", ErrTooFewObservations, func() error { _, err := Fit([]Observation{{0, 1e6}, {5, 1e4}}, nil); return err }, "2 observations left to fit"},
		{"ErrTooFewTimes", ErrTooFewTimes, func() error { _, err := Fit([]Observation{{4, 1e6}, {4, 1e4}, {4, 1e5}}, nil); return err }, "are at 4 min"},
		{"ErrNotDecreasing", ErrNotDecreasing, func() error { _, err := Fit([]Observation{{0, 1e2}, {5, 1e4}, {10, 1e6}}, nil); return err }, "slope 0.4"},
		{"ErrNotFinite", ErrNotFinite, func() error { _, err := Fit([]Observation{{0, 1e6}, {1e200, 1e3}, {2e200, 1}}, nil); return err }, "times 0 to 2e+200 min"},
		{"ErrLevel", ErrLevel, func() error {
			_, err := Fit([]Observation{{0, 1e6}, {5, 1e4}, {10, 1e2}}, &Settings{Level: 95})
			return err
		}, "level 95"},
		{"ErrSettings", ErrSettings, func() error {
			_, err := CountPopulation(units(1e-4), &PopulationSettings{MaxCV: math.Inf(1)})
			return err
		}, "MaxCV +Inf"},
		{"ErrNoUnits", ErrNoUnits, func() error { _, err := CountPopulation(nil, nil); return err }, "no unit"},
		{"ErrInvalidUnit", ErrInvalidUnit, func() error {
			_, err := CountPopulation([]Unit{{Label: "L-7", SuspensionML: -1}}, nil)
			return err
		}, "unit 0 (L-7): suspension volume -1 mL"},
		{"ErrInvalidPlate", ErrInvalidPlate, func() error { _, err := CountPopulation(units(1e4), nil); return err }, "unit 0, plate 0 (colonies 120, dilution 10000"},
		{"ErrNoCountablePlate", ErrNoCountablePlate, func() error {
			_, err := CountPopulation([]Unit{{SuspensionML: 10, Plates: []Plate{{Colonies: 500, Dilution: 1e-3, PlatedML: 0.1}}}}, nil)
			return err
		}, "unit 0: none of its 1 plate(s) lies in the countable range 30–300"},
	} {
		err := c.call()
		switch {
		case !errors.Is(err, c.err):
			t.Errorf("%s: error %v", c.name, err)
		case !strings.Contains(err.Error(), c.msg):
			t.Errorf("%s: message %q does not name %q", c.name, err, c.msg)
		case !wrapsOneSentinel(err):
			t.Errorf("%s: %q wraps more than one sentinel", c.name, err)
		}
		if !listed[c.err.Error()] {
			t.Errorf("%s is missing from the fuzz tests' sentinel list", c.name)
		}
		reached[c.name] = true
	}
	problems, nErr := apicheck.Audit(vars, reached, nil)
	for _, p := range problems {
		t.Error(p)
	}
	if nErr != len(sentinels) {
		t.Errorf("%d sentinels declared, %d listed", nErr, len(sentinels))
	}
}
