package lab

import (
	"fmt"
	"io"
	"strings"

	"github.com/dzf-go/dzf/fraction"
	"github.com/dzf-go/dzf/resistance"
	"github.com/dzf-go/dzf/survivor"
)

// ReadPopulation reads a population assay: one row per plate with the
// columns unit (the unit's label), suspension_ml (mL the unit was
// recovered into), dilution (the factor 10^-k of the plated liquid, in
// (0, 1]), plated_ml (mL plated) and colonies. A unit's rows need not be
// adjacent; units keep the order of their first row, and every row of a
// unit must give the same suspension_ml.
func ReadPopulation(file string, src io.Reader) ([]survivor.Unit, error) {
	t, err := readTable(file, src, []string{"unit", "suspension_ml", "dilution", "plated_ml", "colonies"}, nil)
	if err != nil {
		return nil, err
	}
	var units []survivor.Unit
	where := map[string]int{} // unit label → index in units
	firstLine := map[string]int{}
	for _, r := range t.rows {
		name := t.text(r, "unit")
		if name == "" {
			return nil, t.fail(r, "unit", fmt.Errorf("blank unit label: %w", ErrValue))
		}
		v, err := t.numIn(r, "suspension_ml", positive, "positive")
		if err != nil {
			return nil, err
		}
		var p survivor.Plate
		if p.Dilution, err = t.numIn(r, "dilution", func(d float64) bool { return d > 0 && d <= 1 }, "a factor in (0, 1], 10^-k (1e-3 for the third tenfold dilution)"); err != nil {
			return nil, err
		}
		if p.PlatedML, err = t.numIn(r, "plated_ml", positive, "positive"); err != nil {
			return nil, err
		}
		if p.Colonies, err = t.numIn(r, "colonies", nonNegative, "zero or more"); err != nil {
			return nil, err
		}
		i, seen := where[name]
		if !seen {
			i = len(units)
			where[name], firstLine[name] = i, r.line
			units = append(units, survivor.Unit{Label: name, SuspensionML: v})
		} else if units[i].SuspensionML != v {
			return nil, t.fail(r, "suspension_ml", fmt.Errorf("unit %s has %g mL here and %g mL on line %d: %w", name, v, units[i].SuspensionML, firstLine[name], ErrValue))
		}
		units[i].Plates = append(units[i].Plates, p)
	}
	return units, nil
}

// ReadSurvivor reads a survivor-curve study: one row per counted unit with
// the columns minutes (exposure) and count (survivors per unit, not its
// logarithm). Rows at the same time are replicates.
func ReadSurvivor(file string, src io.Reader) ([]survivor.Observation, error) {
	t, err := readTable(file, src, []string{"minutes", "count"}, nil)
	if err != nil {
		return nil, err
	}
	obs := make([]survivor.Observation, 0, len(t.rows))
	for _, r := range t.rows {
		var o survivor.Observation
		if o.Minutes, err = t.numIn(r, "minutes", nonNegative, "zero or more"); err != nil {
			return nil, err
		}
		if o.Count, err = t.numIn(r, "count", nonNegative, "zero or more"); err != nil {
			return nil, err
		}
		obs = append(obs, o)
	}
	return obs, nil
}

// ReadFraction reads a fraction-negative study: one row per exposure time
// with the columns minutes, units (exposed) and negative (units with no
// growth, the r of the published formulas).
func ReadFraction(file string, src io.Reader) ([]fraction.Exposure, error) {
	t, err := readTable(file, src, []string{"minutes", "units", "negative"}, nil)
	if err != nil {
		return nil, err
	}
	ex := make([]fraction.Exposure, 0, len(t.rows))
	for _, r := range t.rows {
		var e fraction.Exposure
		if e.Minutes, err = t.numIn(r, "minutes", nonNegative, "zero or more"); err != nil {
			return nil, err
		}
		if e.Units, err = t.whole(r, "units", 1); err != nil {
			return nil, err
		}
		if e.Negative, err = t.whole(r, "negative", 0); err != nil {
			return nil, err
		}
		if e.Negative > e.Units {
			return nil, t.fail(r, "negative", fmt.Errorf("%d negative of %d units: %w", e.Negative, e.Units, ErrValue))
		}
		ex = append(ex, e)
	}
	return ex, nil
}

// ReadTemperatures reads D-values at other temperatures for the z-value:
// one row per D with the columns celsius, d, lower, upper (minutes) and
// level (two-sided, in (0, 1)), and an optional method (free text).
func ReadTemperatures(file string, src io.Reader) ([]resistance.Point, error) {
	t, err := readTable(file, src, []string{"celsius", "d", "lower", "upper", "level"}, []string{"method"})
	if err != nil {
		return nil, err
	}
	pts := make([]resistance.Point, 0, len(t.rows))
	for _, r := range t.rows {
		var p resistance.Point
		if p.Celsius, err = t.num(r, "celsius"); err != nil {
			return nil, err
		}
		d := &p.D
		if d.Value, err = t.numIn(r, "d", positive, "positive"); err != nil {
			return nil, err
		}
		if d.Lower, err = t.numIn(r, "lower", func(v float64) bool { return v > 0 && v <= d.Value }, "positive and not above d"); err != nil {
			return nil, err
		}
		if d.Upper, err = t.numIn(r, "upper", func(v float64) bool { return v >= d.Value }, "not below d"); err != nil {
			return nil, err
		}
		if d.Level, err = t.numIn(r, "level", func(v float64) bool { return v > 0 && v < 1 }, "in (0, 1), for example 0.95"); err != nil {
			return nil, err
		}
		d.Method = t.text(r, "method")
		if d.Method == "" {
			d.Method = "as given in " + file
		}
		pts = append(pts, p)
	}
	return pts, nil
}

// Outcomes are the growth outcomes of indicator units: the survival and
// kill tests at the labelled times (in the resistometer) and a half-cycle
// run (in the sterilizer). A nil field was not in the file.
type Outcomes struct {
	Survival  *resistance.UnitTest `json:"survival,omitempty"`
	Kill      *resistance.UnitTest `json:"kill,omitempty"`
	HalfCycle *resistance.UnitTest `json:"half_cycle,omitempty"`
}

// Test names of the outcomes file.
const (
	TestSurvival  = "survival"
	TestKill      = "kill"
	TestHalfCycle = "half-cycle"
)

// ReadOutcomes reads growth outcomes: one row per test with the columns
// test (survival, kill or half-cycle), minutes (exposure; for the half
// cycle, its exposure time), units and growth (units that grew). Each
// test may appear at most once.
func ReadOutcomes(file string, src io.Reader) (Outcomes, error) {
	t, err := readTable(file, src, []string{"test", "minutes", "units", "growth"}, nil)
	if err != nil {
		return Outcomes{}, err
	}
	var o Outcomes
	for _, r := range t.rows {
		var slot **resistance.UnitTest
		switch strings.ToLower(t.text(r, "test")) {
		case TestSurvival:
			slot = &o.Survival
		case TestKill:
			slot = &o.Kill
		case TestHalfCycle:
			slot = &o.HalfCycle
		default:
			return Outcomes{}, t.fail(r, "test", fmt.Errorf("%q is not one of %s, %s, %s: %w", t.text(r, "test"), TestSurvival, TestKill, TestHalfCycle, ErrValue))
		}
		if *slot != nil {
			return Outcomes{}, t.fail(r, "test", fmt.Errorf("%s given twice: %w", t.text(r, "test"), ErrValue))
		}
		var u resistance.UnitTest
		if u.Minutes, err = t.numIn(r, "minutes", positive, "positive"); err != nil {
			return Outcomes{}, err
		}
		if u.Units, err = t.whole(r, "units", 1); err != nil {
			return Outcomes{}, err
		}
		if u.Growth, err = t.whole(r, "growth", 0); err != nil {
			return Outcomes{}, err
		}
		if u.Growth > u.Units {
			return Outcomes{}, t.fail(r, "growth", fmt.Errorf("%d grew of %d units: %w", u.Growth, u.Units, ErrValue))
		}
		*slot = &u
	}
	return o, nil
}
