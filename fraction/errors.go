package fraction

import "errors"

// Sentinel errors. Every error returned by this package wraps exactly one of
// them (test with errors.Is); the wrapping message names the offending input,
// for example the exposure by its position in the caller's slice
// ("exposures[2] at 10 min").
var (
	// ErrInvalidPopulation reports a log10 N0 that is not finite, is ≤ 0, or
	// (for the likelihood and planning) is above MaxLog10N0.
	ErrInvalidPopulation = errors.New("fraction: invalid log10 N0")
	// ErrTooFewExposures reports fewer than two exposures.
	ErrTooFewExposures = errors.New("fraction: fewer than two exposures")
	// ErrInvalidTime reports an exposure time that is negative or not finite.
	ErrInvalidTime = errors.New("fraction: invalid exposure time")
	// ErrInvalidUnits reports an exposure with fewer than one unit.
	ErrInvalidUnits = errors.New("fraction: invalid number of units")
	// ErrInvalidNegatives reports a count of negative units below 0 or above
	// the units tested.
	ErrInvalidNegatives = errors.New("fraction: invalid number of negative units")
	// ErrDuplicateTime reports two exposures at the same time; pool them
	// into one exposure (add their units and their negatives).
	ErrDuplicateTime = errors.New("fraction: two exposures at the same time")
	// ErrNoAllPositive reports that the shortest exposure is not all
	// positive (growth in every unit), which the Holcomb–Spearman–Kärber
	// procedures need.
	ErrNoAllPositive = errors.New("fraction: no all-positive first exposure")
	// ErrNoAllNegative reports that no exposure is all negative (no growth in
	// any unit), which the Holcomb–Spearman–Kärber procedures need.
	ErrNoAllNegative = errors.New("fraction: no all-negative exposure")
	// ErrUnequalUnits reports unequal numbers of units among the exposures
	// the limited Holcomb–Spearman–Kärber procedure uses.
	ErrUnequalUnits = errors.New("fraction: unequal units (limited procedure)")
	// ErrUnequalIntervals reports unequal time intervals among the exposures
	// the limited Holcomb–Spearman–Kärber procedure uses.
	ErrUnequalIntervals = errors.New("fraction: unequal intervals (limited procedure)")
	// ErrLimitedDesign reports a series of results that is not the limited
	// procedure's design: one all-positive exposure, then at least two
	// fractional ones, then at least two all-negative ones and nothing
	// positive after them.
	ErrLimitedDesign = errors.New("fraction: results do not follow the limited procedure's design")
	// ErrNotFractional reports an exposure asked of the
	// Stumbo–Murphy–Cochran procedure that is not fractional (0 < r < n).
	ErrNotFractional = errors.New("fraction: exposure is not fractional")
	// ErrNotAnExposure reports a time that is not one of the exposures.
	ErrNotAnExposure = errors.New("fraction: time is not an exposure")
	// ErrNoFractional reports data with no fractional exposure, where the
	// Stumbo–Murphy–Cochran procedure has nothing to average.
	ErrNoFractional = errors.New("fraction: no fractional exposure")
	// ErrSMCUndefined reports a fractional exposure where the
	// Stumbo–Murphy–Cochran formula is undefined: the denominator
	// log10 N0 − log10 ln(n/r) is ≤ 0, or the exposure is at time 0.
	ErrSMCUndefined = errors.New("fraction: Stumbo–Murphy–Cochran formula undefined")
	// ErrNoInformation reports data from which the likelihood cannot
	// estimate D: every unit positive, every unit negative, or (with N0
	// estimated too) a growth/no-growth boundary so sharp that no finite
	// estimate exists.
	ErrNoInformation = errors.New("fraction: the data carry no information on D")
	// ErrInvalidLevel reports a confidence level outside (0, 1).
	ErrInvalidLevel = errors.New("fraction: confidence level must be in (0, 1)")
	// ErrNoConvergence reports a numerical search that did not converge.
	// Data that contradict the model grossly reach it, for example, with
	// N0 fitted, every unit negative at a short exposure and every unit
	// positive at a longer one: the likelihood is then flat along a ridge
	// and the joint search of N0 and D stops at its iteration limit.
	ErrNoConvergence = errors.New("fraction: numerical search did not converge")
	// ErrInvalidPlan reports an input of study planning that is out of range.
	ErrInvalidPlan = errors.New("fraction: invalid study plan input")
)
