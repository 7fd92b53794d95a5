package resistance

import "errors"

// Errors returned by the functions of this package. Every error wraps one of
// them, with context naming the offending input; test for them with
// errors.Is.
var (
	// ErrInvalidD: a D-value that is zero, negative, NaN or ±Inf.
	ErrInvalidD = errors.New("resistance: D-value must be positive and finite")
	// ErrInvalidZ: a z-value that is zero, negative, NaN or ±Inf.
	ErrInvalidZ = errors.New("resistance: z-value must be positive and finite")
	// ErrInvalidTemperature: a temperature that is NaN or ±Inf, or (for the
	// Arrhenius conversion) at or below absolute zero.
	ErrInvalidTemperature = errors.New("resistance: invalid temperature")
	// ErrInvalidPopulation: a population (log10 N0 or a count per unit) that
	// is NaN or ±Inf, not positive, or, for the survival–kill window, a
	// log10 N0 ≤ 2, which leaves no survival time.
	ErrInvalidPopulation = errors.New("resistance: invalid population")
	// ErrInvalidTime: a survival or kill time that is negative, NaN or ±Inf,
	// or a kill time not longer than the survival time.
	ErrInvalidTime = errors.New("resistance: invalid exposure time")
	// ErrInvalidLevel: a confidence level outside (0, 1).
	ErrInvalidLevel = errors.New("resistance: confidence level outside (0, 1)")
	// ErrTooFewTemperatures: fewer than two distinct temperatures, so no
	// z-value can be computed.
	ErrTooFewTemperatures = errors.New("resistance: fewer than two distinct temperatures")
	// ErrRisingD: D does not fall as temperature rises (a fitted or
	// two-point slope of log10 D on temperature ≥ 0), so there is no
	// positive z-value.
	ErrRisingD = errors.New("resistance: D does not fall with rising temperature")
	// ErrInvalidWeight: a weighted z fit was asked for, but a point's D has
	// no usable limits (both finite, 0 < lower < upper) or level to derive
	// its weight from.
	ErrInvalidWeight = errors.New("resistance: D limits cannot give a weight")
	// ErrInvalidEnergy: an activation energy that is zero, negative, NaN or
	// ±Inf.
	ErrInvalidEnergy = errors.New("resistance: activation energy must be positive and finite")
	// ErrOutOfRange: the inputs are valid one by one, but the result
	// overflows float64 or underflows below its smallest normal number
	// (about 2.2e-308, under which digits are lost), for example D at a
	// temperature hundreds of z-values away.
	ErrOutOfRange = errors.New("resistance: result outside float64's range")
	// ErrInvalidCount: a survival or kill test with fewer than one unit, a
	// negative count, or more positive units than units.
	ErrInvalidCount = errors.New("resistance: invalid unit count")
	// ErrInvalidSetting: a label-check criterion setting that is negative,
	// NaN or ±Inf, a population range whose low end is not below its high
	// end, or a number of D methods that is not a whole number ≥ 1.
	ErrInvalidSetting = errors.New("resistance: invalid criterion setting")
	// ErrProfile: a minimum-performance profile whose modality differs from
	// the label's, or whose minimums are negative or not finite.
	ErrProfile = errors.New("resistance: profile does not fit the label")
)
