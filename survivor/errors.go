package survivor

import "errors"

// Errors returned by Fit and CountPopulation. Every error these functions
// return wraps exactly one of them (test with errors.Is) and names the
// offending input: for an observation its 0-based index in the caller's
// slice, its time and its count; for a plate the 0-based indexes of its unit
// and of the plate within the unit.
var (
	// ErrInvalidObservation: an observation's time or count is NaN, ±Inf or
	// negative.
	ErrInvalidObservation = errors.New("survivor: invalid observation")
	// ErrZeroCount: an observation counts 0 survivors, whose logarithm does
	// not exist, and Settings.ExcludeBelowDetection is false.
	ErrZeroCount = errors.New("survivor: zero count")
	// ErrTooFewObservations: fewer than three observations remain for the
	// fit, so no residual degree of freedom is left.
	ErrTooFewObservations = errors.New("survivor: fewer than three observations")
	// ErrTooFewTimes: the observations that remain for the fit have fewer
	// than two distinct exposure times (or times too close together to
	// separate), so the slope is undefined.
	ErrTooFewTimes = errors.New("survivor: fewer than two distinct exposure times")
	// ErrNotDecreasing: the fitted slope of log10 count on time is zero or
	// positive, so the data show no inactivation and D does not exist.
	ErrNotDecreasing = errors.New("survivor: log10 count does not decrease with time")
	// ErrNotFinite: a computation overflowed (times, counts or volumes so
	// extreme that a sum of squares, a count per unit or a mean is not a
	// finite float64).
	ErrNotFinite = errors.New("survivor: fit not finite")
	// ErrLevel: a confidence level outside (0, 1), or NaN.
	ErrLevel = errors.New("survivor: confidence level outside (0, 1)")
	// ErrSettings: a settings field is NaN, ±Inf, negative or otherwise out
	// of its documented range.
	ErrSettings = errors.New("survivor: invalid settings")

	// ErrNoUnits: CountPopulation was given no unit.
	ErrNoUnits = errors.New("survivor: no unit counted")
	// ErrInvalidUnit: a unit's suspension volume is NaN, ±Inf, zero or
	// negative.
	ErrInvalidUnit = errors.New("survivor: invalid unit")
	// ErrInvalidPlate: a plate's colonies are NaN, ±Inf or negative; its
	// dilution factor or plated volume is NaN, ±Inf, zero or negative; its
	// dilution factor exceeds 1 (a factor is 10^-k, not 10^k); or it claims
	// more of the unit's suspension than the unit has (d·v above V).
	ErrInvalidPlate = errors.New("survivor: invalid plate")
	// ErrNoCountablePlate: a unit has no plate inside the countable range,
	// so no count per unit can be given for it.
	ErrNoCountablePlate = errors.New("survivor: unit has no countable plate")
)
