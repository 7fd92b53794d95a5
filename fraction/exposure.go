package fraction

import (
	"fmt"
	"math"
	"slices"
	"strconv"
)

// Exposure is one exposure time of a fraction-negative study: Units
// indicators exposed for Minutes, of which Negative showed no growth after
// incubation (sterile units). Negative counts negatives, as in every
// published formula of this package (r = negatives).
type Exposure struct {
	Minutes  float64 `json:"minutes"`
	Units    int     `json:"units"`
	Negative int     `json:"negative"`
}

// Positive returns the number of units that showed growth.
func (e Exposure) Positive() int { return e.Units - e.Negative }

// Excluded is an exposure that a procedure did not use, with the reason.
// Index is its position in the caller's slice, counting from 0.
type Excluded struct {
	Index   int     `json:"index"`
	Minutes float64 `json:"minutes"`
	Reason  string  `json:"reason"`
}

// MaxLog10N0 is the largest log10 N0 the likelihood and the study planning
// accept: 10^300 is near the largest float64, and the likelihood computes
// N0·10^(−t/D) from it.
const MaxLog10N0 = 300

// obs is a validated exposure, sorted by time, with its caller position.
type obs struct {
	idx  int     // position in the caller's slice
	t    float64 // minutes
	n, r float64 // units, negatives (as float64: sums of products of large counts must not overflow)
	ni   int     // units
	ri   int     // negatives
}

func (o obs) p() float64        { return o.r / o.n }
func (o obs) allPositive() bool { return o.ri == 0 }
func (o obs) allNegative() bool { return o.ri == o.ni }
func (o obs) fractional() bool  { return o.ri > 0 && o.ri < o.ni }
func (o obs) name() string      { return exposureName(o.idx, o.t) }
func exposureName(i int, t float64) string {
	return "exposures[" + strconv.Itoa(i) + "] at " + strconv.FormatFloat(t, 'g', -1, 64) + " min"
}

// checkPopulation validates log10 N0.
func checkPopulation(log10N0 float64) error {
	if math.IsNaN(log10N0) || math.IsInf(log10N0, 0) || log10N0 <= 0 {
		return fmt.Errorf("log10 N0 = %g (must be finite and > 0): %w", log10N0, ErrInvalidPopulation)
	}
	return nil
}

// prepare validates the population and the exposures and returns a sorted
// copy; the caller's slice is not modified.
func prepare(log10N0 float64, exposures []Exposure) ([]obs, error) {
	if err := checkPopulation(log10N0); err != nil {
		return nil, err
	}
	if len(exposures) < 2 {
		return nil, fmt.Errorf("%d exposure(s) given, at least two needed: %w", len(exposures), ErrTooFewExposures)
	}
	out := make([]obs, len(exposures))
	for i, e := range exposures {
		name := func() string { return exposureName(i, e.Minutes) }
		switch {
		case math.IsNaN(e.Minutes) || math.IsInf(e.Minutes, 0) || e.Minutes < 0:
			return nil, fmt.Errorf("exposures[%d]: time %g min (must be finite and ≥ 0): %w", i, e.Minutes, ErrInvalidTime)
		case e.Units < 1:
			return nil, fmt.Errorf("%s: %d units (at least 1 needed): %w", name(), e.Units, ErrInvalidUnits)
		case e.Negative < 0:
			return nil, fmt.Errorf("%s: %d negative units (must be ≥ 0): %w", name(), e.Negative, ErrInvalidNegatives)
		case e.Negative > e.Units:
			return nil, fmt.Errorf("%s: %d negative of %d units (more negatives than units): %w", name(), e.Negative, e.Units, ErrInvalidNegatives)
		}
		out[i] = obs{idx: i, t: e.Minutes, n: float64(e.Units), r: float64(e.Negative), ni: e.Units, ri: e.Negative}
	}
	slices.SortFunc(out, func(a, b obs) int {
		switch {
		case a.t < b.t:
			return -1
		case a.t > b.t:
			return 1
		}
		return a.idx - b.idx
	})
	for i := 1; i < len(out); i++ {
		if out[i].t == out[i-1].t {
			a, b := out[i-1], out[i]
			return nil, fmt.Errorf("exposures[%d] and exposures[%d] are both at %g min: pool them into one exposure (add their units and their negatives): %w",
				a.idx, b.idx, a.t, ErrDuplicateTime)
		}
	}
	return out, nil
}

// monotoneWarnings reports every exposure of o that has a smaller fraction
// negative than the exposure before it.
func monotoneWarnings(o []obs) []string {
	var w []string
	for i := 1; i < len(o); i++ {
		if o[i].p() < o[i-1].p() {
			w = append(w, fmt.Sprintf("not monotone: %s has a smaller fraction negative (%d/%d) than %s (%d/%d)",
				o[i].name(), o[i].ri, o[i].ni, o[i-1].name(), o[i-1].ri, o[i-1].ni))
		}
	}
	return w
}
