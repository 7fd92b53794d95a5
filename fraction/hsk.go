package fraction

import (
	"fmt"
	"math"
	"strings"

	"github.com/dzf-go/dzf/resistance"
)

// EulerOverLn10 is the constant added to log10 N0 in the
// Holcomb–Spearman–Kärber D-value, D = Ū/(log10 N0 + 0.2507): Euler's
// constant divided by ln 10 (0.25068…), rounded as ISO 11138-1 Annex D
// prints it.
const EulerOverLn10 = 0.2507

// HSKLevel is the confidence level of the Holcomb–Spearman–Kärber limits
// Ū ± 2√V: the two-sided coverage of ±2 standard errors of a normal
// variate, erf(√2) ≈ 0.9545. The level is the procedure's, not a choice.
const HSKLevel = 0.9544997361036416

// limitedIntervalTolerance is the relative tolerance within which the
// limited procedure takes intervals as equal.
const limitedIntervalTolerance = 1e-6

// HSKResult is the result of the general or the limited
// Holcomb–Spearman–Kärber procedure.
//
// The sums run from the anchor (the last all-positive exposure before the
// first exposure with a negative unit) to the first all-negative exposure;
// Used lists those exposures by their position in the caller's slice, in
// time order, and Excluded every other exposure with its reason.
type HSKResult struct {
	// Estimate is D in minutes with the procedure's limits
	// (Ū ± 2√V)/(log10 N0 + 0.2507) at Level HSKLevel.
	Estimate resistance.Estimate `json:"estimate"`
	// Limited is true for the limited procedure.
	Limited bool `json:"limited"`
	// Log10N0 is the population used.
	Log10N0 float64 `json:"log10_n0"`
	// MeanTime is Ū, the mean time to sterility, in minutes.
	MeanTime float64 `json:"mean_time"`
	// Variance is V, the variance of Ū, in minutes².
	Variance float64 `json:"variance"`
	// Divisor is log10 N0 + EulerOverLn10.
	Divisor float64 `json:"divisor"`
	// Anchor and FirstAllNegative are the positions, in the caller's
	// slice, of the exposures where the sums start and end.
	Anchor           int `json:"anchor"`
	FirstAllNegative int `json:"first_all_negative"`
	// Fractional is the number of fractional exposures among those used.
	Fractional int `json:"fractional"`
	// Used lists the exposures that enter the sums (caller positions, in
	// time order).
	Used []int `json:"used"`
	// Excluded lists the other exposures with the reason.
	Excluded []Excluded `json:"excluded,omitempty"`
	// Interval (d, minutes) and Units (n) are the limited procedure's
	// common interval and units; zero for the general procedure.
	Interval float64 `json:"interval,omitempty"`
	Units    int     `json:"units,omitempty"`
}

// String formats the result on a few lines: D with its limits, the sums,
// the exposures used, exclusions and warnings.
func (r HSKResult) String() string {
	var b strings.Builder
	e := r.Estimate
	fmt.Fprintf(&b, "%s: D = %.4g min (%.4g – %.4g, %.4g %%)\n", e.Method, e.Value, e.Lower, e.Upper, 100*e.Level)
	fmt.Fprintf(&b, "  log10 N0 = %g; mean time to sterility Ū = %.6g min; variance V = %.6g min²; divisor %.4f\n",
		r.Log10N0, r.MeanTime, r.Variance, r.Divisor)
	if r.Limited {
		fmt.Fprintf(&b, "  interval d = %g min, %d units per exposure\n", r.Interval, r.Units)
	}
	fmt.Fprintf(&b, "  sums from exposures[%d] (last all-positive) to exposures[%d] (first all-negative), %d fractional between",
		r.Anchor, r.FirstAllNegative, r.Fractional)
	for _, x := range r.Excluded {
		fmt.Fprintf(&b, "\n  not used: %s: %s", exposureName(x.Index, x.Minutes), x.Reason)
	}
	for _, w := range e.Warnings {
		fmt.Fprintf(&b, "\n  warning: %s", w)
	}
	return b.String()
}

// hskFrame locates the anchor and the first all-negative exposure of sorted
// observations and lists the exclusions and the design warnings common to
// both forms.
type hskFrame struct {
	o             []obs
	anchor, k     int // indices into o
	fractional    int
	excluded      []Excluded
	warnings      []string
	positiveAfter []int // indices into o of exposures after k with a positive unit
}

func newHSKFrame(o []obs) (hskFrame, error) {
	f := hskFrame{o: o}
	if !o[0].allPositive() {
		return f, fmt.Errorf("the shortest exposure, %s, has %d negative of %d units; the procedure needs it all positive (growth in every unit): %w",
			o[0].name(), o[0].ri, o[0].ni, ErrNoAllPositive)
	}
	first := -1 // first exposure with a negative unit
	for i, x := range o {
		if x.ri > 0 {
			first = i
			break
		}
	}
	f.k = -1
	for i, x := range o {
		if x.allNegative() {
			f.k = i
			break
		}
	}
	if first < 0 || f.k < 0 {
		return f, fmt.Errorf("none of the %d exposures is all negative (no growth in any unit); the procedure needs one: %w", len(o), ErrNoAllNegative)
	}
	f.anchor = first - 1
	for i := 0; i < f.anchor; i++ {
		f.excluded = append(f.excluded, Excluded{o[i].idx, o[i].t, "all positive before the anchor (its terms are zero)"})
	}
	for i := f.k + 1; i < len(o); i++ {
		reason := "after the first all-negative exposure"
		if !o[i].allNegative() {
			reason += fmt.Sprintf("; %d of %d units positive", o[i].ni-o[i].ri, o[i].ni)
			f.positiveAfter = append(f.positiveAfter, i)
		}
		f.excluded = append(f.excluded, Excluded{o[i].idx, o[i].t, reason})
	}
	for i := f.anchor + 1; i < f.k; i++ {
		if o[i].fractional() {
			f.fractional++
		}
	}
	f.warnings = monotoneWarnings(o[f.anchor : f.k+1])
	for _, i := range f.positiveAfter {
		f.warnings = append(f.warnings, fmt.Sprintf("%s shows growth in %d of %d units after the first all-negative exposure, %s (not used in the sums)",
			o[i].name(), o[i].ni-o[i].ri, o[i].ni, o[f.k].name()))
	}
	allNeg := 0
	for _, x := range o {
		if x.allNegative() {
			allNeg++
		}
	}
	if f.fractional < 2 || allNeg < 2 {
		f.warnings = append(f.warnings, fmt.Sprintf("fewer exposures than the usual design (one all positive, two fractional, two all negative): %d fractional, %d all negative",
			f.fractional, allNeg))
	}
	return f, nil
}

func (f hskFrame) used() []int {
	u := make([]int, 0, f.k-f.anchor+1)
	for i := f.anchor; i <= f.k; i++ {
		u = append(u, f.o[i].idx)
	}
	return u
}

// finish builds the result from Ū and V.
func (f hskFrame) finish(log10N0, u, v float64, method string, limited bool) HSKResult {
	div := log10N0 + EulerOverLn10
	half := 2 * math.Sqrt(v)
	w := f.warnings
	if u-half <= 0 {
		w = append(w, fmt.Sprintf("lower limit ≤ 0 (Ū − 2√V = %.4g min): the data do not bound D from below", u-half))
	}
	return HSKResult{
		Estimate: resistance.Estimate{
			Value: u / div, Lower: (u - half) / div, Upper: (u + half) / div,
			Level: HSKLevel, Method: method, Warnings: w,
		},
		Limited:          limited,
		Log10N0:          log10N0,
		MeanTime:         u,
		Variance:         v,
		Divisor:          div,
		Anchor:           f.o[f.anchor].idx,
		FirstAllNegative: f.o[f.k].idx,
		Fractional:       f.fractional,
		Used:             f.used(),
		Excluded:         f.excluded,
	}
}

// HSK estimates D by the general Holcomb–Spearman–Kärber procedure (ISO
// 11138-1 Annex D), which allows unequal intervals and unequal units.
//
// With p = r/n the fraction negative, the anchor U₁ the last all-positive
// exposure before the first exposure with a negative unit, and U_k the
// first all-negative exposure:
//
//	Ū = Σ_{i=1}^{k−1} (tᵢ + tᵢ₊₁)/2 · (pᵢ₊₁ − pᵢ)
//	V = Σ_{i=2}^{k−1} ((tᵢ₊₁ − tᵢ₋₁)/2)² · pᵢ(1 − pᵢ)/(nᵢ − 1)
//	D = Ū/(log10 N0 + 0.2507), limits (Ū ± 2√V)/(log10 N0 + 0.2507)
//
// Variance terms where pᵢ is 0 or 1 are zero (which covers nᵢ = 1).
// Earlier all-positive exposures add only zero terms; exposures after U_k
// do not enter the sums. The mean-time formula and 0.2507 are as ISO
// 11138-1 Annex D publishes them; the variance formula and the factor 2 are
// from memory of the same annex and must be verified against it. The
// limits' level is the procedure's ±2√V, HSKLevel ≈ 0.9545.
//
// HSK refuses the inputs every function of this package refuses (see the
// package documentation), a shortest exposure that is not all positive
// (ErrNoAllPositive) and data with no all-negative exposure
// (ErrNoAllNegative). It warns of a fraction negative that falls at a longer
// time, of growth after the first all-negative exposure, of fewer exposures
// than the usual design (one all positive, two fractional, two all
// negative) and of a lower limit ≤ 0.
func HSK(log10N0 float64, exposures []Exposure) (HSKResult, error) {
	o, err := prepare(log10N0, exposures)
	if err != nil {
		return HSKResult{}, err
	}
	f, err := newHSKFrame(o)
	if err != nil {
		return HSKResult{}, err
	}
	u, v := 0.0, 0.0
	for i := f.anchor; i < f.k; i++ {
		u += (o[i].t + o[i+1].t) / 2 * (o[i+1].p() - o[i].p())
	}
	for i := f.anchor + 1; i < f.k; i++ {
		if !o[i].fractional() {
			continue
		}
		w := (o[i+1].t - o[i-1].t) / 2
		p := o[i].p()
		v += w * w * p * (1 - p) / (o[i].n - 1)
	}
	return f.finish(log10N0, u, v, "Holcomb–Spearman–Kärber (general)", false), nil
}

// LimitedHSK estimates D by the limited Holcomb–Spearman–Kärber procedure
// (ISO 11138-1 Annex D), for designs with the same number of units n at
// every exposure used and equal intervals d:
//
//	Ū = U_k − d/2 − (d/n) Σ_{i=1}^{k−1} rᵢ
//	V = d²/(n²(n − 1)) · Σ_{i=1}^{k−1} rᵢ(n − rᵢ)
//	D = Ū/(log10 N0 + 0.2507), limits (Ū ± 2√V)/(log10 N0 + 0.2507)
//
// with r the negatives, U₁ the last all-positive exposure (the anchor) and
// U_k the first all-negative exposure. On every design it accepts, it gives
// the same numbers as HSK; the variance formula and the factor 2 are from
// memory of the annex and must be verified against it.
//
// Besides HSK's refusals it refuses data that break the procedure's
// prerequisites: unequal units among U₁…U_k (ErrUnequalUnits), intervals
// that differ by more than a relative 1e-6 among U₁…U_k
// (ErrUnequalIntervals), and results that do not follow the design (one
// all-positive exposure, then fractional ones, then all-negative ones, as
// the usual design rule asks): an exposure between U₁ and U_k that is not
// fractional, fewer than two fractional exposures, fewer than two
// all-negative exposures, or growth after U_k (ErrLimitedDesign). Use HSK
// for such data.
func LimitedHSK(log10N0 float64, exposures []Exposure) (HSKResult, error) {
	o, err := prepare(log10N0, exposures)
	if err != nil {
		return HSKResult{}, err
	}
	f, err := newHSKFrame(o)
	if err != nil {
		return HSKResult{}, err
	}
	a, k := f.anchor, f.k
	n := o[a].ni
	for i := a + 1; i <= k; i++ {
		if o[i].ni != n {
			return HSKResult{}, fmt.Errorf("%s has %d units and %s has %d; the limited procedure needs the same units at every exposure it uses: %w",
				o[i].name(), o[i].ni, o[a].name(), n, ErrUnequalUnits)
		}
	}
	d := (o[k].t - o[a].t) / float64(k-a)
	for i := a; i < k; i++ {
		if di := o[i+1].t - o[i].t; math.Abs(di-d) > limitedIntervalTolerance*d {
			return HSKResult{}, fmt.Errorf("interval %g min from %s to %s differs from the mean interval %g min; the limited procedure needs equal intervals: %w",
				di, o[i].name(), o[i+1].name(), d, ErrUnequalIntervals)
		}
	}
	for i := a + 1; i < k; i++ {
		if !o[i].fractional() {
			return HSKResult{}, fmt.Errorf("%s is all positive between the anchor %s and the first all-negative exposure %s; the limited procedure needs fractional results there (use HSK): %w",
				o[i].name(), o[a].name(), o[k].name(), ErrLimitedDesign)
		}
	}
	if f.fractional < 2 {
		return HSKResult{}, fmt.Errorf("%d fractional exposure(s) between %s and %s; the limited procedure's design needs at least two (use HSK): %w",
			f.fractional, o[a].name(), o[k].name(), ErrLimitedDesign)
	}
	if len(f.positiveAfter) > 0 {
		x := o[f.positiveAfter[0]]
		return HSKResult{}, fmt.Errorf("%s shows growth in %d of %d units after the first all-negative exposure %s; the limited procedure's design needs all negative results there (use HSK): %w",
			x.name(), x.ni-x.ri, x.ni, o[k].name(), ErrLimitedDesign)
	}
	if k == len(o)-1 {
		return HSKResult{}, fmt.Errorf("only one all-negative exposure (%s); the limited procedure's design needs at least two (use HSK): %w",
			o[k].name(), ErrLimitedDesign)
	}
	nf := float64(n)
	sumR, sumRR := 0.0, 0.0
	for i := a; i < k; i++ {
		sumR += o[i].r
		sumRR += o[i].r * (nf - o[i].r)
	}
	u := o[k].t - d/2 - d/nf*sumR
	v := d * d / (nf * nf * (nf - 1)) * sumRR
	res := f.finish(log10N0, u, v, "Holcomb–Spearman–Kärber (limited)", true)
	res.Interval, res.Units = d, n
	return res, nil
}
