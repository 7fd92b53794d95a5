package survivor

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"strings"

	"github.com/dzf-go/dzf/internal/linefit"
	"github.com/dzf-go/dzf/internal/tdist"
	"github.com/dzf-go/dzf/resistance"
)

// Method names written into the estimates that Fit returns.
const (
	// MethodCurve names the D-value estimate of Fit.
	MethodCurve = "survivor curve: least squares of log10 count on exposure time, D = -1/slope, t-based limits"
	// MethodIntercept names the log10 N0 estimate of Fit.
	MethodIntercept = "survivor curve: fitted intercept (log10 count at time 0), t-based limits"
)

// Default settings of Fit (see Settings).
const (
	DefaultLevel           = 0.95 // two-sided confidence level of every limit
	DefaultMinTimes        = 5    // distinct exposure times (testing-laboratory practice)
	DefaultMinLogReduction = 4.0  // fitted log10 reduction spanned (testing-laboratory practice)
	DefaultMinRSquared     = 0.8  // r² (common practice, no source found)
	DefaultMinCount        = 30.0 // survivors per unit (common practice)
)

// maxListed is the number of observations a warning names before it says
// how many more there are.
const maxListed = 10

// Observation is one counted unit of a survivor-curve study: the exposure
// time and the survivors recovered from one unit (carrier) after it.
// Several observations at the same time are replicates.
type Observation struct {
	Minutes float64 `json:"minutes"` // exposure time, minutes; 0 for the unexposed units
	Count   float64 `json:"count"`   // survivors per unit (count per carrier), not its logarithm
}

// Settings configures Fit. A nil *Settings means all defaults; a zero field
// means that field's default.
type Settings struct {
	// Level is the two-sided confidence level of every limit, in (0, 1).
	// Default 0.95.
	Level float64 `json:"level,omitempty"`

	// ExcludeBelowDetection, when true, leaves every observation whose
	// count is 0 (no survivor seen: below the detection limit of the count)
	// out of the fit, lists it in Result.Excluded with its reason and warns.
	// Default false: a zero count is refused with ErrZeroCount, because its
	// logarithm does not exist and leaving it out changes the answer.
	ExcludeBelowDetection bool `json:"exclude_below_detection,omitempty"`

	// MinTimes is the number of distinct exposure times below which Fit
	// warns. Default 5 (testing-laboratory practice: at least five
	// exposures).
	MinTimes int `json:"min_times,omitempty"`

	// MinLogReduction is the fitted log reduction between the shortest and
	// the longest exposure below which Fit warns. Default 4
	// (testing-laboratory practice: one exposure reduces the count to about
	// 0.01 % of N0).
	MinLogReduction float64 `json:"min_log_reduction,omitempty"`

	// MinRSquared is the r² below which Fit warns, in (0, 1]. Default 0.8
	// (common practice, no source found).
	MinRSquared float64 `json:"min_r2,omitempty"`

	// MinCount is the count per unit below which Fit warns, naming the
	// observations. Default 30 (common practice: plate counting cannot see
	// fewer than about 30 survivors per unit).
	MinCount float64 `json:"min_count,omitempty"`
}

// resolved returns the settings with defaults filled in, or an error
// wrapping ErrLevel or ErrSettings.
func (s *Settings) resolved() (Settings, error) {
	var r Settings
	if s != nil {
		r = *s
	}
	if r.Level == 0 {
		r.Level = DefaultLevel
	}
	if !(r.Level > 0 && r.Level < 1) {
		return r, fmt.Errorf("level %v: %w", r.Level, ErrLevel)
	}
	if r.MinTimes == 0 {
		r.MinTimes = DefaultMinTimes
	}
	if r.MinLogReduction == 0 {
		r.MinLogReduction = DefaultMinLogReduction
	}
	if r.MinRSquared == 0 {
		r.MinRSquared = DefaultMinRSquared
	}
	if r.MinCount == 0 {
		r.MinCount = DefaultMinCount
	}
	switch {
	case r.MinTimes < 0:
		return r, fmt.Errorf("MinTimes %d is negative: %w", r.MinTimes, ErrSettings)
	case !finite(r.MinLogReduction) || r.MinLogReduction < 0:
		return r, fmt.Errorf("MinLogReduction %v is not a finite non-negative number: %w", r.MinLogReduction, ErrSettings)
	case !(r.MinRSquared > 0 && r.MinRSquared <= 1):
		return r, fmt.Errorf("MinRSquared %v is outside (0, 1]: %w", r.MinRSquared, ErrSettings)
	case !finite(r.MinCount) || r.MinCount < 0:
		return r, fmt.Errorf("MinCount %v is not a finite non-negative number: %w", r.MinCount, ErrSettings)
	}
	return r, nil
}

// Residual is one observation of the fit with its observed and fitted
// log10 count.
type Residual struct {
	Index    int     `json:"index"`    // 0-based position in the caller's slice
	Minutes  float64 `json:"minutes"`  // exposure time, minutes
	Count    float64 `json:"count"`    // survivors per unit, as given
	Observed float64 `json:"observed"` // log10 Count
	Fitted   float64 `json:"fitted"`   // log10 N0 − Minutes/D
	Residual float64 `json:"residual"` // Observed − Fitted, log10
}

// Excluded is an observation that Fit left out, with the reason.
type Excluded struct {
	Index   int     `json:"index"` // 0-based position in the caller's slice
	Minutes float64 `json:"minutes"`
	Count   float64 `json:"count"`
	Reason  string  `json:"reason"`
}

// Result is a fitted log-linear survivor curve.
//
// Every number outside D, Log10N0 and LackOfFit is finite; the non-finite
// values a fit can give (an unbounded upper D limit, an undefined F
// statistic) live in those, which marshal them to JSON as strings.
type Result struct {
	D       resistance.Estimate `json:"d"`        // D-value, minutes, with its limits (upper +Inf when the slope interval reaches 0)
	Log10N0 resistance.Estimate `json:"log10_n0"` // fitted intercept, log10 count per unit at time 0, with its limits

	Slope        float64 `json:"slope"`         // fitted slope, log10 per minute (−1/D)
	SESlope      float64 `json:"se_slope"`      // standard error of Slope
	SELog10N0    float64 `json:"se_log10_n0"`   // standard error of the intercept
	RSquared     float64 `json:"r2"`            // coefficient of determination of log10 count on time
	ResidualSD   float64 `json:"residual_sd"`   // residual standard deviation, log10, √(RSS/DF)
	N            int     `json:"n"`             // observations fitted
	DF           int     `json:"df"`            // residual degrees of freedom, N − 2
	Times        int     `json:"times"`         // distinct exposure times fitted
	LogReduction float64 `json:"log_reduction"` // fitted log10 reduction from the shortest to the longest exposure, (t_max − t_min)/D
	Level        float64 `json:"level"`         // confidence level of the limits

	Residuals []Residual `json:"residuals"`             // the fitted observations, in input order
	LackOfFit *LackOfFit `json:"lack_of_fit,omitempty"` // nil unless replicates allow the test (see LackOfFit)
	Excluded  []Excluded `json:"excluded,omitempty"`    // observations left out, with reasons
	Warnings  []string   `json:"warnings,omitempty"`    // broken prerequisites and doubts; empty means none found
}

// point is a fitted observation in sorted work arrays.
type point struct{ x, y float64 }

// Fit fits the log-linear survivor curve (first-order inactivation)
//
//	log10 N(t) = log10 N0 − t/D
//
// to the observations by ordinary least squares of log10 count on exposure
// time, and returns D = −1/slope with t-based limits, the fitted log10 N0
// with its limits, the fit statistics, the residuals and, when replicates
// exist, the lack-of-fit F test. The package documentation gives the
// formulas and sources. A nil s means the default Settings.
//
// Fit refuses, with an error wrapping the sentinel named:
//   - a level outside (0, 1) or another invalid setting: ErrLevel, ErrSettings;
//   - a NaN, ±Inf or negative time or count: ErrInvalidObservation;
//   - a count of 0, unless s.ExcludeBelowDetection: ErrZeroCount;
//   - fewer than three observations left to fit: ErrTooFewObservations;
//   - fewer than two distinct times left to fit: ErrTooFewTimes;
//   - a slope ≥ 0: ErrNotDecreasing;
//   - a fit that overflows float64: ErrNotFinite.
//
// Broken prerequisites of the method give warnings, never refusals: fewer
// than s.MinTimes distinct times, no unexposed (t = 0) observation, a fitted
// log reduction below s.MinLogReduction, r² below s.MinRSquared, counts
// below s.MinCount, an unbounded upper D limit, a lack-of-fit test that
// rejects the line at 5 %, and excluded observations.
//
// Fit does not modify obs; the order of the observations does not change
// the result, except for the order of Residuals and Excluded, which follow
// the input.
func Fit(obs []Observation, s *Settings) (Result, error) {
	cfg, err := s.resolved()
	if err != nil {
		return Result{}, err
	}
	var res Result
	for i, o := range obs {
		if !finite(o.Minutes) || o.Minutes < 0 || !finite(o.Count) || o.Count < 0 {
			return Result{}, fmt.Errorf("observation %d at %v min, count %v: %w", i, o.Minutes, o.Count, ErrInvalidObservation)
		}
		if o.Count == 0 {
			if !cfg.ExcludeBelowDetection {
				return Result{}, fmt.Errorf("observation %d at %v min, count 0 (log10 undefined; set ExcludeBelowDetection to leave such observations out): %w", i, o.Minutes, ErrZeroCount)
			}
			res.Excluded = append(res.Excluded, Excluded{Index: i, Minutes: o.Minutes, Count: o.Count,
				Reason: "count 0: below the detection limit of the count, log10 undefined"})
		}
	}
	n := len(obs) - len(res.Excluded)
	if n < 3 {
		return Result{}, fmt.Errorf("%d observations left to fit (%d given, %d excluded): %w", n, len(obs), len(res.Excluded), ErrTooFewObservations)
	}

	// Work arrays: x, y in input order for the fit; pts sorted by time for
	// the distinct times and the replicate groups.
	buf := make([]float64, 2*n)
	x, y := buf[:n:n], buf[n:]
	pts := make([]point, n)
	res.Residuals = make([]Residual, n)
	k := 0
	for i, o := range obs {
		if o.Count == 0 {
			continue
		}
		ly := math.Log10(o.Count)
		x[k], y[k] = o.Minutes, ly
		pts[k] = point{o.Minutes, ly}
		res.Residuals[k] = Residual{Index: i, Minutes: o.Minutes, Count: o.Count, Observed: ly}
		k++
	}
	slices.SortFunc(pts, func(a, b point) int {
		switch {
		case a.x < b.x:
			return -1
		case a.x > b.x:
			return 1
		}
		return 0
	})
	times := 1
	for i := 1; i < n; i++ {
		if pts[i].x != pts[i-1].x {
			times++
		}
	}
	if times < 2 {
		return Result{}, fmt.Errorf("all %d observations left to fit are at %v min: %w", n, pts[0].x, ErrTooFewTimes)
	}

	line, err := linefit.Fit(x, y)
	switch {
	case errors.Is(err, linefit.ErrNoSpread):
		return Result{}, fmt.Errorf("exposure times %v to %v min are too close together to fit a slope: %w", pts[0].x, pts[n-1].x, ErrTooFewTimes)
	case err != nil:
		// linefit.ErrOverflow: sums of squares beyond float64's range.
		return Result{}, fmt.Errorf("times %v to %v min: %v: %w", pts[0].x, pts[n-1].x, err, ErrNotFinite)
	}
	if !finite(line.Slope) || !finite(line.Intercept) || !finite(line.SESlope) || !finite(line.SEIntercept) || !finite(line.RSS) {
		return Result{}, fmt.Errorf("times %v to %v min: slope %v, intercept %v, RSS %v: %w", pts[0].x, pts[n-1].x, line.Slope, line.Intercept, line.RSS, ErrNotFinite)
	}
	if !(line.Slope < 0) {
		return Result{}, fmt.Errorf("fitted slope %.6g log10 per minute is not negative (the counts do not fall with exposure, so D does not exist): %w", line.Slope, ErrNotDecreasing)
	}
	// The limits are those of linefit's Line.NegReciprocal and
	// InterceptInterval (slope interval [a, b], D limits [−1/a, −1/b], upper
	// +Inf when b ≥ 0), with the t quantile (tdist.TwoSided) computed once.
	tq := tdist.TwoSided(cfg.Level, line.DF)
	a, b := line.Slope-tq*line.SESlope, line.Slope+tq*line.SESlope
	d, dLo, dHi := -1/line.Slope, -1/a, math.Inf(1)
	unbounded := b >= 0
	if !unbounded {
		dHi = -1 / b
	}
	n0Lo, n0Hi := line.Intercept-tq*line.SEIntercept, line.Intercept+tq*line.SEIntercept
	for i := range res.Residuals {
		r := &res.Residuals[i]
		r.Residual = line.Residuals[i]
		r.Fitted = r.Observed - r.Residual
	}

	res.Slope, res.SESlope, res.SELog10N0 = line.Slope, line.SESlope, line.SEIntercept
	res.RSquared, res.ResidualSD = line.RSquared, line.ResidualSD
	res.N, res.DF, res.Times, res.Level = line.N, line.DF, times, cfg.Level
	res.LogReduction = -line.Slope * (pts[n-1].x - pts[0].x)
	res.LackOfFit = lackOfFit(pts, times, line)

	// Warnings, in a fixed order.
	var w []string
	if len(res.Excluded) > 0 {
		w = append(w, fmt.Sprintf("%d observation(s) with count 0 left out of the fit as below detection (listed in Excluded); the curve rests on the remaining counts only and may overstate D", len(res.Excluded)))
	}
	if times < cfg.MinTimes {
		w = append(w, fmt.Sprintf("%d distinct exposure times, fewer than %d (testing-laboratory practice: at least five exposures, one unexposed, one near a 4-log reduction, the rest between)", times, cfg.MinTimes))
	}
	if pts[0].x != 0 {
		w = append(w, fmt.Sprintf("no unexposed (0 min) observation: the shortest exposure is %v min, so log10 N0 is extrapolated", pts[0].x))
	}
	if res.LogReduction < cfg.MinLogReduction {
		w = append(w, fmt.Sprintf("the fitted line spans %.3g log reductions from %v to %v min, fewer than %g (testing-laboratory practice: about 4 logs)", res.LogReduction, pts[0].x, pts[n-1].x, cfg.MinLogReduction))
	}
	if res.RSquared < cfg.MinRSquared {
		w = append(w, fmt.Sprintf("r² %.4f is below %g (common practice, no source found): the log-linear model fits poorly", res.RSquared, cfg.MinRSquared))
	}
	if low := lowCounts(res.Residuals, cfg.MinCount); low != "" {
		w = append(w, low)
	}
	if lf := res.LackOfFit; lf != nil && lf.P < 0.05 {
		w = append(w, fmt.Sprintf("lack-of-fit test rejects the straight line at 5 %% (F = %.4g on %d and %d df, p = %.3g): the survivor curve is not log-linear over these exposures", lf.F, lf.LackOfFitDF, lf.PureErrorDF, lf.P))
	}
	nCommon := len(w)
	if unbounded {
		w = append(w, fmt.Sprintf("the %g %% interval of the slope reaches 0, so the upper D limit is unbounded (+Inf)", 100*cfg.Level))
	}
	res.Warnings = w
	res.D = resistance.Estimate{Value: d, Lower: dLo, Upper: dHi, Level: cfg.Level, Method: MethodCurve, Warnings: slices.Clone(w)}
	res.Log10N0 = resistance.Estimate{Value: line.Intercept, Lower: n0Lo, Upper: n0Hi, Level: cfg.Level, Method: MethodIntercept, Warnings: slices.Clone(w[:nCommon])}
	return res, nil
}

// lowCounts returns the warning naming the fitted observations whose count
// is below min, or "" when there is none.
func lowCounts(rs []Residual, min float64) string {
	var b strings.Builder
	low := 0
	for _, r := range rs {
		if r.Count >= min {
			continue
		}
		low++
		if low <= maxListed {
			if low > 1 {
				b.WriteString("; ")
			}
			fmt.Fprintf(&b, "observation %d at %v min: %.4g", r.Index, r.Minutes, r.Count)
		}
	}
	if low == 0 {
		return ""
	}
	if low > maxListed {
		fmt.Fprintf(&b, "; and %d more", low-maxListed)
	}
	return fmt.Sprintf("%d observation(s) count fewer than %g survivors per unit (common practice: plate counting cannot see fewer than about 30 per unit): %s", low, min, b.String())
}

// String formats the result for reading: the estimates, the fit statistics,
// the lack-of-fit test, the excluded observations and the warnings.
func (r Result) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "survivor curve (log10 count on minutes, least squares), %d observations at %d times, df %d\n", r.N, r.Times, r.DF)
	fmt.Fprintf(&b, "  D          %.4g min  (%g %% limits %.4g – %.4g)\n", r.D.Value, 100*r.Level, r.D.Lower, r.D.Upper)
	fmt.Fprintf(&b, "  log10 N0   %.4f      (%g %% limits %.4f – %.4f)\n", r.Log10N0.Value, 100*r.Level, r.Log10N0.Lower, r.Log10N0.Upper)
	fmt.Fprintf(&b, "  slope %.5g log10/min (SE %.3g), r² %.4f, residual SD %.4f log10, %.3g logs spanned\n", r.Slope, r.SESlope, r.RSquared, r.ResidualSD, r.LogReduction)
	if lf := r.LackOfFit; lf != nil {
		fmt.Fprintf(&b, "  lack of fit: F = %.4g on %d and %d df, p = %.4g\n", lf.F, lf.LackOfFitDF, lf.PureErrorDF, lf.P)
	}
	for _, e := range r.Excluded {
		fmt.Fprintf(&b, "  excluded: observation %d at %v min: %s\n", e.Index, e.Minutes, e.Reason)
	}
	for _, w := range r.Warnings {
		fmt.Fprintf(&b, "  warning: %s\n", w)
	}
	return b.String()
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
