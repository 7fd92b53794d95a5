package fraction

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"

	"github.com/dzf-go/dzf/resistance"
)

// SMCPoint is the Stumbo–Murphy–Cochran D at one fractional exposure.
type SMCPoint struct {
	// Index is the exposure's position in the caller's slice.
	Index    int     `json:"index"`
	Minutes  float64 `json:"minutes"`
	Units    int     `json:"units"`
	Negative int     `json:"negative"`
	// Survivors is ln(n/r), the most probable number of survivors per unit.
	Survivors float64 `json:"survivors"`
	// D is U/(log10 N0 − log10 ln(n/r)), minutes.
	D float64 `json:"d"`
}

// SMCResult is the result of the Stumbo–Murphy–Cochran procedure: the D of
// one fractional exposure (SMCAt) or the mean over all of them (SMC).
type SMCResult struct {
	// Estimate holds the D used (one exposure's, or the mean). The
	// procedure gives no confidence limits: Lower, Upper and Level are NaN.
	Estimate resistance.Estimate `json:"estimate"`
	Log10N0  float64             `json:"log10_n0"`
	// Points lists the D of every fractional exposure used, in time order.
	Points []SMCPoint `json:"points"`
	// SD is the sample standard deviation of the per-exposure D values
	// (minutes), a description of their spread, not a confidence limit; NaN
	// with fewer than two points.
	SD float64 `json:"sd"`
	// Excluded lists the exposures not used, with the reason.
	Excluded []Excluded `json:"excluded,omitempty"`
}

// MarshalJSON implements json.Marshaler, writing a NaN SD as "NaN".
func (r SMCResult) MarshalJSON() ([]byte, error) {
	type plain SMCResult
	return json.Marshal(struct {
		plain
		SD number `json:"sd"`
	}{plain(r), number(r.SD)})
}

// String formats the result: D, the points and warnings.
func (r SMCResult) String() string {
	var b strings.Builder
	e := r.Estimate
	what := "mean over"
	if len(r.Points) == 1 {
		what = "at"
	}
	fmt.Fprintf(&b, "%s: D = %.4g min (%s %d fractional exposure(s); no confidence limits), log10 N0 = %g", e.Method, e.Value, what, len(r.Points), r.Log10N0)
	for _, p := range r.Points {
		fmt.Fprintf(&b, "\n  %s: %d negative of %d, ln(n/r) = %.4g survivors per unit, D = %.4g min",
			exposureName(p.Index, p.Minutes), p.Negative, p.Units, p.Survivors, p.D)
	}
	if len(r.Points) > 1 {
		fmt.Fprintf(&b, "\n  spread of the per-exposure D: SD = %.3g min", r.SD)
	}
	for _, w := range e.Warnings {
		fmt.Fprintf(&b, "\n  warning: %s", w)
	}
	return b.String()
}

// smcPoint computes D at one fractional exposure.
func smcPoint(log10N0 float64, x obs) (SMCPoint, error) {
	if x.t == 0 {
		return SMCPoint{}, fmt.Errorf("%s is fractional at time 0, where the formula gives no D: %w", x.name(), ErrSMCUndefined)
	}
	mpn := math.Log(x.n) - math.Log(x.r)
	den := log10N0 - math.Log10(mpn)
	if !(den > 0) {
		return SMCPoint{}, fmt.Errorf("%s: log10 N0 − log10 ln(n/r) = %g − %g ≤ 0 (more survivors than the population): %w",
			x.name(), log10N0, math.Log10(mpn), ErrSMCUndefined)
	}
	return SMCPoint{Index: x.idx, Minutes: x.t, Units: x.ni, Negative: x.ri, Survivors: mpn, D: x.t / den}, nil
}

const smcMethod = "Stumbo–Murphy–Cochran"

// SMC estimates D by the Stumbo–Murphy–Cochran procedure (Stumbo, Murphy
// and Cochran 1950, as described by Lewis 1956, Applied Microbiology
// 4:211): at each fractional exposure U (0 < r < n, r the negatives) the
// most probable number of survivors per unit is ln(n/r) and
//
//	D = U / (log10 N0 − log10 ln(n/r))
//
// SMC returns the arithmetic mean of D over every fractional exposure,
// listing the exposures used (Points) and the others (Excluded). It warns
// when fewer than three exposures are fractional, as practice asks for
// three. It refuses data with no fractional exposure (ErrNoFractional), a
// fractional exposure where the formula is undefined (ErrSMCUndefined: time
// 0, or log10 N0 − log10 ln(n/r) ≤ 0), and the inputs every function of
// this package refuses.
func SMC(log10N0 float64, exposures []Exposure) (SMCResult, error) {
	o, err := prepare(log10N0, exposures)
	if err != nil {
		return SMCResult{}, err
	}
	res := SMCResult{Log10N0: log10N0}
	sum := 0.0
	for _, x := range o {
		if !x.fractional() {
			reason := "all positive"
			if x.allNegative() {
				reason = "all negative"
			}
			res.Excluded = append(res.Excluded, Excluded{x.idx, x.t, reason + " (not fractional)"})
			continue
		}
		p, err := smcPoint(log10N0, x)
		if err != nil {
			return SMCResult{}, err
		}
		res.Points = append(res.Points, p)
		sum += p.D
	}
	if len(res.Points) == 0 {
		return SMCResult{}, fmt.Errorf("none of the %d exposures is fractional (0 < negative < units): %w", len(o), ErrNoFractional)
	}
	m := float64(len(res.Points))
	mean := sum / m
	res.SD = math.NaN()
	if len(res.Points) > 1 {
		ss := 0.0
		for _, p := range res.Points {
			ss += (p.D - mean) * (p.D - mean)
		}
		res.SD = math.Sqrt(ss / (m - 1))
	}
	var w []string
	if len(res.Points) < 3 {
		w = append(w, fmt.Sprintf("only %d fractional exposure(s); practice asks for at least three", len(res.Points)))
	}
	w = append(w, monotoneWarnings(o)...)
	res.Estimate = resistance.Estimate{Value: mean, Lower: math.NaN(), Upper: math.NaN(), Level: math.NaN(),
		Method: smcMethod + " (mean)", Warnings: w}
	return res, nil
}

// SMCAt returns the Stumbo–Murphy–Cochran D (see SMC) at the exposure at
// the given time (matched within a relative 1e-9). It refuses a time that
// is not an exposure (ErrNotAnExposure), an exposure that is not fractional
// (ErrNotFractional), a fractional exposure where the formula is undefined
// (ErrSMCUndefined) and the inputs every function of this package refuses.
func SMCAt(log10N0 float64, exposures []Exposure, minutes float64) (SMCResult, error) {
	o, err := prepare(log10N0, exposures)
	if err != nil {
		return SMCResult{}, err
	}
	for _, x := range o {
		if math.Abs(x.t-minutes) > 1e-9*math.Max(math.Abs(x.t), math.Abs(minutes)) || math.IsNaN(minutes) {
			continue
		}
		if !x.fractional() {
			return SMCResult{}, fmt.Errorf("%s has %d negative of %d units, not fractional (0 < negative < units): %w",
				x.name(), x.ri, x.ni, ErrNotFractional)
		}
		p, err := smcPoint(log10N0, x)
		if err != nil {
			return SMCResult{}, err
		}
		return SMCResult{
			Estimate: resistance.Estimate{Value: p.D, Lower: math.NaN(), Upper: math.NaN(), Level: math.NaN(),
				Method: smcMethod + " (one exposure)"},
			Log10N0: log10N0,
			Points:  []SMCPoint{p},
			SD:      math.NaN(),
		}, nil
	}
	return SMCResult{}, fmt.Errorf("no exposure at %g min: %w", minutes, ErrNotAnExposure)
}
