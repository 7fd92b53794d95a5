package survivor

import (
	"math"
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
	units := func(d float64) []Unit {
		return []Unit{{SuspensionML: 10, Plates: []Plate{{Colonies: 120, Dilution: d, PlatedML: 0.1}}}}
	}
	cases := []apicheck.Refusal{
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
	}
	apicheck.CheckSentinels(t, ".", sentinels, nil, cases)
}
