package fraction

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/dzf-go/dzf/resistance"
)

// MLESettings configures MLE. A nil *MLESettings, and a zero field, mean
// the default.
type MLESettings struct {
	// FitN0 estimates N0 jointly with D; the log10 N0 given to MLE is then
	// only the starting value. Default false: N0 is fixed at the given
	// value (from the population assay).
	FitN0 bool
	// Level is the two-sided confidence level of the profile-likelihood
	// limits, in (0, 1). Default 0.95.
	Level float64
}

// FittedExposure is one exposure with the fitted model's probability of a
// negative unit and the expected number of negatives.
type FittedExposure struct {
	// Index is the exposure's position in the caller's slice.
	Index               int     `json:"index"`
	Minutes             float64 `json:"minutes"`
	Units               int     `json:"units"`
	Negative            int     `json:"negative"`
	ProbabilityNegative float64 `json:"probability_negative"`
	ExpectedNegative    float64 `json:"expected_negative"`
}

// MLEResult is the maximum-likelihood estimate of D from fraction-negative
// data.
type MLEResult struct {
	// Estimate is D in minutes with profile-likelihood limits at the level
	// asked; an unbounded limit is +Inf (or 0 for the lower) with a warning.
	Estimate resistance.Estimate `json:"estimate"`
	// FitN0 tells whether N0 was estimated (true) or fixed (false).
	FitN0 bool `json:"fit_n0"`
	// Log10N0 is the fitted log10 N0 with FitN0, else the given one.
	Log10N0 float64 `json:"log10_n0"`
	// Log10N0SE is the Wald standard error of the fitted log10 N0 from the
	// observed information; NaN when N0 is fixed.
	Log10N0SE float64 `json:"log10_n0_se"`
	// Intercept (ln N0) and Slope (−ln 10/D, per minute) are the
	// coefficients of the complementary log-log model.
	Intercept float64 `json:"intercept"`
	Slope     float64 `json:"slope"`
	// LogLikelihood is the binomial log-likelihood at the estimate,
	// binomial coefficients included.
	LogLikelihood float64 `json:"log_likelihood"`
	// Deviance is the binomial deviance against the saturated model; DF is
	// the number of exposures less the number of fitted parameters; FitP
	// the chi-square upper tail of Deviance on DF (NaN when DF = 0).
	Deviance float64 `json:"deviance"`
	DF       int     `json:"df"`
	FitP     float64 `json:"fit_p"`
	// Fractional is the number of fractional exposures.
	Fractional int `json:"fractional"`
	// Fitted lists every exposure in time order with its fitted values.
	Fitted []FittedExposure `json:"fitted"`
}

// MarshalJSON implements json.Marshaler, writing non-finite numbers as
// "NaN", "+Inf" or "-Inf".
func (r MLEResult) MarshalJSON() ([]byte, error) {
	type plain MLEResult
	return json.Marshal(struct {
		plain
		Log10N0SE     number `json:"log10_n0_se"`
		LogLikelihood number `json:"log_likelihood"`
		Deviance      number `json:"deviance"`
		FitP          number `json:"fit_p"`
	}{plain(r), number(r.Log10N0SE), number(r.LogLikelihood), number(r.Deviance), number(r.FitP)})
}

// String formats the result on a few lines.
func (r MLEResult) String() string {
	var b strings.Builder
	e := r.Estimate
	fmt.Fprintf(&b, "%s: D = %.4g min (%.4g – %.4g, %g %% profile likelihood)\n", e.Method, e.Value, e.Lower, e.Upper, 100*e.Level)
	if r.FitN0 {
		fmt.Fprintf(&b, "  log10 N0 = %.4f (fitted, Wald SE %.3g)", r.Log10N0, r.Log10N0SE)
	} else {
		fmt.Fprintf(&b, "  log10 N0 = %g (fixed)", r.Log10N0)
	}
	fmt.Fprintf(&b, "; deviance %.4g on %d df", r.Deviance, r.DF)
	if r.DF > 0 {
		fmt.Fprintf(&b, " (p = %.3g)", r.FitP)
	}
	fmt.Fprintf(&b, "; %d fractional exposure(s)", r.Fractional)
	for _, f := range r.Fitted {
		fmt.Fprintf(&b, "\n  %s: %d negative of %d, expected %.3g", exposureName(f.Index, f.Minutes), f.Negative, f.Units, f.ExpectedNegative)
	}
	for _, w := range e.Warnings {
		fmt.Fprintf(&b, "\n  warning: %s", w)
	}
	return b.String()
}

// MLE estimates D by maximum likelihood from fraction-negative data. Each
// unit exposed for t minutes is positive with probability
//
//	P(positive | t) = 1 − exp(−N0·10^(−t/D))
//
// independently, so that the count of negatives is binomial: a binomial
// generalized linear model with the complementary log-log link,
// log(−log P(negative)) = ln N0 − (ln 10/D)·t, intercept ln N0 and slope
// −ln 10/D. With N0 fixed (the default) only D is fitted; with
// settings.FitN0 N0 is fitted too and log10N0 is the starting value.
//
// The limits are profile-likelihood limits: the values of D where the
// (profile) log-likelihood falls χ²₁(level)/2 below its maximum, found by
// safeguarded Newton iteration; a side the data do not bound is +Inf (or 0)
// with a warning. Deviance is against the saturated model; FitP is its
// chi-square upper tail on DF degrees of freedom, an approximation that is
// rough with few units. MLE warns of a poor fit (FitP < 0.05), of no
// degrees of freedom left, of fewer than two fractional exposures, and of a
// fraction negative that falls at a longer time.
//
// MLE refuses, besides the inputs every function of this package refuses,
// a level outside (0, 1) (ErrInvalidLevel), log10 N0 above MaxLog10N0
// (ErrInvalidPopulation), and data that carry no information on D
// (ErrNoInformation): every unit positive, every unit negative, with N0
// fixed no negative or no positive unit after time 0 or a likelihood
// highest at D = ∞, with N0 fitted a growth/no-growth boundary so sharp
// that no finite estimate exists (no positive unit at a longer time than
// some negative unit) or a slope that is not negative. A search that fails
// to converge returns ErrNoConvergence (data that contradict the model
// grossly, such as all units negative at a short exposure and all positive
// at a longer one, can reach it with N0 fitted).
func MLE(log10N0 float64, exposures []Exposure, settings *MLESettings) (MLEResult, error) {
	var s MLESettings
	if settings != nil {
		s = *settings
	}
	if s.Level == 0 {
		s.Level = 0.95
	}
	if !(s.Level > 0 && s.Level < 1) {
		return MLEResult{}, fmt.Errorf("level %g: %w", s.Level, ErrInvalidLevel)
	}
	o, err := prepare(log10N0, exposures)
	if err != nil {
		return MLEResult{}, err
	}
	if log10N0 > MaxLog10N0 {
		return MLEResult{}, fmt.Errorf("log10 N0 = %g is above %d: %w", log10N0, MaxLog10N0, ErrInvalidPopulation)
	}
	if err := checkInformation(o, s.FitN0); err != nil {
		return MLEResult{}, err
	}
	L := newLikelihood(o)
	a0 := log10N0 * math.Ln10
	b0 := slopeGuess(o, log10N0)
	z := distuv.UnitNormal.Quantile((1 + s.Level) / 2)
	crit := z * z // χ²₁ quantile at level

	var (
		a, b     float64 // intercept ln N0 and slope at the estimate
		lmax     float64
		seLog10  = math.NaN()
		pf       func(b float64) (l, dl float64) // profile log-likelihood and its derivative
		bse      float64                         // Wald SE of b (to start the limit searches)
		innerErr error
	)
	if !s.FitN0 {
		a = a0
		if b, err = fitSlope(L, a, b0); err != nil {
			return MLEResult{}, err
		}
		lmax, _ = L.logLikSlope(a, b, L.t)
		_, dg := L.slopeDerivs(a, b, L.t)
		bse = 1 / math.Sqrt(-dg)
		pf = func(bb float64) (float64, float64) { return L.logLikSlope(a, bb, L.t) }
	} else {
		bStart := b0
		if bb, err := fitSlope(L, a0, b0); err == nil {
			bStart = bb
		}
		alpha, bb, err := fitJoint(L, a0+bStart*L.tbar, bStart)
		if err != nil {
			return MLEResult{}, err
		}
		if !(bb < 0) {
			return MLEResult{}, fmt.Errorf("fitted slope %g is not negative (the data do not show inactivation): %w", bb, ErrNoInformation)
		}
		b = bb
		a = alpha - b*L.tbar
		var haa, hab, hbb float64
		lmax, _, _, haa, hab, hbb = L.eval(alpha, b, L.tau)
		det := haa*hbb - hab*hab
		bse = math.Sqrt(-haa / det)
		va, vb, cab := -hbb/det, -haa/det, hab/det
		seLog10 = math.Sqrt(va+L.tbar*L.tbar*vb-2*L.tbar*cab) / math.Ln10
		// The profile maximizes over alpha at each slope, starting from a
		// linear extrapolation of the last solution (dα̂/db = −H_ab/H_aa
		// at the estimate, then the secant of the last two solutions).
		prevB, prevA, dadb := b, alpha, -hab/haa
		pf = func(bb float64) (float64, float64) {
			start := prevA + dadb*(bb-prevB)
			al, ok := rootDecreasing(func(x float64) (float64, float64) { return L.interceptDerivs(x, bb, L.tau) }, start, math.Inf(-1), math.Inf(1), 1)
			if !ok {
				innerErr = fmt.Errorf("profile over N0 at slope %g: %w", bb, ErrNoConvergence)
				return math.NaN(), math.NaN()
			}
			if bb != prevB {
				dadb = (al - prevA) / (bb - prevB)
			}
			prevB, prevA = bb, al
			return L.logLikSlope(al, bb, L.tau)
		}
	}
	// bse only places the first point of each limit search; a flat
	// likelihood (huge bse) must not throw it far off.
	if !(bse > 0) || bse > math.Abs(b) {
		bse = math.Abs(b)
	}
	thr := lmax - crit/2
	var warnings []string

	// Lower limit of D: slope below b.
	bLow, ok := rootDecreasing(func(x float64) (float64, float64) { l, dl := pf(x); return thr - l, -dl },
		b-math.Sqrt(crit)*bse, math.Inf(-1), b, math.Abs(b))
	if innerErr != nil {
		return MLEResult{}, innerErr
	}
	dLow := -math.Ln10 / bLow
	if !ok {
		if bLow > b*1e6 {
			return MLEResult{}, fmt.Errorf("lower profile limit: %w", ErrNoConvergence)
		}
		dLow = 0
		warnings = append(warnings, "the data do not bound D from below at this level (lower limit 0)")
	}
	// Upper limit of D: slope between b and 0.
	dUp := math.Inf(1)
	if l0, _ := pf(0); l0 >= thr {
		warnings = append(warnings, fmt.Sprintf("the data do not bound D from above at this level: the log-likelihood at D = ∞ is only %.3g below its maximum (upper limit +Inf)", lmax-l0))
	} else {
		x0 := b + math.Sqrt(crit)*bse
		if !(x0 < 0) {
			x0 = b / 2
		}
		bUp, ok := rootDecreasing(func(x float64) (float64, float64) { l, dl := pf(x); return l - thr, dl }, x0, b, 0, math.Abs(b))
		if !ok {
			return MLEResult{}, fmt.Errorf("upper profile limit: %w", ErrNoConvergence)
		}
		dUp = -math.Ln10 / bUp
	}
	if innerErr != nil {
		return MLEResult{}, innerErr
	}

	res := MLEResult{
		FitN0:         s.FitN0,
		Log10N0:       a / math.Ln10,
		Log10N0SE:     seLog10,
		Intercept:     a,
		Slope:         b,
		LogLikelihood: lmax + L.lconst,
		Deviance:      L.deviance(a, b, L.t),
		DF:            len(o) - 1,
		FitP:          math.NaN(),
		Fitted:        make([]FittedExposure, len(o)),
	}
	if !s.FitN0 {
		res.Log10N0 = log10N0
	} else {
		res.DF--
	}
	for i, x := range o {
		pneg := math.Exp(-math.Exp(a + b*x.t))
		res.Fitted[i] = FittedExposure{x.idx, x.t, x.ni, x.ri, pneg, pneg * x.n}
		if x.fractional() {
			res.Fractional++
		}
	}
	if res.DF > 0 {
		res.FitP = distuv.ChiSquared{K: float64(res.DF)}.Survival(res.Deviance)
		if res.FitP < 0.05 {
			warnings = append(warnings, fmt.Sprintf("the model fits poorly: deviance %.4g on %d df, p = %.3g", res.Deviance, res.DF, res.FitP))
		}
	} else {
		warnings = append(warnings, "no degrees of freedom left: the fit cannot be checked")
	}
	switch res.Fractional {
	case 0:
		warnings = append(warnings, "no fractional exposure: D rests on the step from all positive to all negative, and the data say little")
	case 1:
		warnings = append(warnings, "only one fractional exposure: the data say little about D")
	}
	warnings = append(warnings, monotoneWarnings(o)...)
	method := "maximum likelihood (complementary log-log, N0 fixed)"
	if s.FitN0 {
		method = "maximum likelihood (complementary log-log, N0 fitted)"
	}
	res.Estimate = resistance.Estimate{Value: -math.Ln10 / b, Lower: dLow, Upper: dUp, Level: s.Level, Method: method, Warnings: warnings}
	return res, nil
}

// checkInformation refuses data from which D cannot be estimated.
func checkInformation(o []obs, fitN0 bool) error {
	var pos, neg, posLater, negLater float64
	maxPos, minNeg := math.Inf(-1), math.Inf(1)
	minPos, maxNeg := math.Inf(1), math.Inf(-1)
	for _, x := range o {
		p := x.n - x.r
		pos += p
		neg += x.r
		if p > 0 {
			maxPos, minPos = math.Max(maxPos, x.t), math.Min(minPos, x.t)
			if x.t > 0 {
				posLater += p
			}
		}
		if x.r > 0 {
			minNeg, maxNeg = math.Min(minNeg, x.t), math.Max(maxNeg, x.t)
			if x.t > 0 {
				negLater += x.r
			}
		}
	}
	switch {
	case neg == 0:
		return fmt.Errorf("every unit of the %d exposures is positive: %w", len(o), ErrNoInformation)
	case pos == 0:
		return fmt.Errorf("every unit of the %d exposures is negative: %w", len(o), ErrNoInformation)
	}
	if !fitN0 {
		switch {
		case negLater == 0:
			return fmt.Errorf("no negative unit after time 0: %w", ErrNoInformation)
		case posLater == 0:
			return fmt.Errorf("no positive unit after time 0 (the likelihood grows without bound as D → 0): %w", ErrNoInformation)
		}
		return nil
	}
	switch {
	case maxPos <= minNeg:
		return fmt.Errorf("no positive unit at a longer time than the first negative unit (at %g min): the boundary is too sharp to estimate N0 and D together (fix N0): %w", minNeg, ErrNoInformation)
	case minPos >= maxNeg:
		return fmt.Errorf("every negative unit is at a shorter time than every positive unit (the data show no inactivation): %w", ErrNoInformation)
	}
	return nil
}

// slopeGuess returns a starting slope −ln10/D from the time at which half
// the units are negative, t½ ≈ D·(log10 N0 + log10(1/ln 2)).
func slopeGuess(o []obs, log10N0 float64) float64 {
	th := o[len(o)-1].t
	for i, x := range o {
		if x.p() >= 0.5 {
			th = x.t
			if i > 0 && x.p() > o[i-1].p() {
				f := (0.5 - o[i-1].p()) / (x.p() - o[i-1].p())
				th = o[i-1].t + f*(x.t-o[i-1].t)
			}
			break
		}
	}
	if !(th > 0) {
		th = o[len(o)-1].t
	}
	return -math.Ln10 * (log10N0 + 0.159) / th
}

// fitSlope finds the slope that maximizes the likelihood at a fixed
// intercept a = ln N0.
func fitSlope(L *likelihood, a, b0 float64) (float64, error) {
	if g0, _ := L.slopeDerivs(a, 0, L.t); !(g0 < 0) {
		return 0, fmt.Errorf("with N0 fixed the likelihood is highest at D = ∞ (no inactivation beyond what N0 = 10^%.4g explains): %w", a/math.Ln10, ErrNoInformation)
	}
	b, ok := rootDecreasing(func(x float64) (float64, float64) { return L.slopeDerivs(a, x, L.t) }, b0, math.Inf(-1), 0, math.Abs(b0))
	if !ok {
		return 0, fmt.Errorf("maximum-likelihood slope with N0 fixed: %w", ErrNoConvergence)
	}
	return b, nil
}

// fitJoint maximizes the likelihood over (alpha, b), alpha the linear
// predictor at the mean time, by Newton's method with a backtracking line
// search; the log-likelihood is concave, so the search converges from any
// start when a finite maximum exists.
func fitJoint(L *likelihood, alpha, b float64) (float64, float64, error) {
	l, ga, gb, haa, hab, hbb := L.eval(alpha, b, L.tau)
	span := math.Max(L.span, 1e-300)
	for range 200 {
		var da, db float64
		det := haa*hbb - hab*hab
		newton := haa < 0 && det > 0
		if newton {
			da = -(hbb*ga - hab*gb) / det
			db = -(haa*gb - hab*ga) / det
		} else { // not negative definite: scaled gradient step
			da = ga / math.Max(-haa, 1e-12)
			db = gb / math.Max(-hbb, 1e-12*span*span)
		}
		if c := math.Max(math.Abs(da), math.Abs(db)*span) / 5; c > 1 {
			da, db = da/c, db/c
		}
		slope := ga*da + gb*db                // the Newton decrement λ² for a Newton step
		if !(slope > 1e-26*(1+math.Abs(l))) { // predicted gain far below round-off: at the maximum
			return alpha, b, nil
		}
		step := 1.0
		var nl, nga, ngb, nhaa, nhab, nhbb float64
		if newton && slope < 1e-8*(1+math.Abs(l)) {
			// Quadratic region of a Newton step: take it whole (a line
			// search could not tell the values apart from round-off).
			nl, nga, ngb, nhaa, nhab, nhbb = L.eval(alpha+da, b+db, L.tau)
		} else {
			accepted := false
			for range 60 {
				nl, nga, ngb, nhaa, nhab, nhbb = L.eval(alpha+step*da, b+step*db, L.tau)
				if nl >= l+1e-4*step*slope && !math.IsNaN(nl) && !math.IsInf(nl, 0) {
					accepted = true
					break
				}
				step /= 2
			}
			if !accepted {
				return 0, 0, fmt.Errorf("joint fit of N0 and D: line search failed: %w", ErrNoConvergence)
			}
		}
		alpha, b = alpha+step*da, b+step*db
		l, ga, gb, haa, hab, hbb = nl, nga, ngb, nhaa, nhab, nhbb
		if step == 1 && math.Abs(da) <= 1e-12*(1+math.Abs(alpha)) && math.Abs(db)*span <= 1e-12*(1+math.Abs(b)*span) {
			return alpha, b, nil
		}
	}
	return 0, 0, fmt.Errorf("joint fit of N0 and D: %w", ErrNoConvergence)
}
