package resistance

import (
	"fmt"
	"math"
)

// Constants of the Arrhenius conversion.
const (
	// GasConstant is the molar gas constant R in J/(mol·K) (CODATA 2018,
	// exact since the 2019 SI).
	GasConstant = 8.314462618
	// KelvinOffset converts °C to kelvin: T[K] = T[°C] + KelvinOffset.
	KelvinOffset = 273.15
)

func kelvin(what string, celsius float64) (float64, error) {
	k := celsius + KelvinOffset
	if !finite(celsius) || !(k > 0) {
		return math.NaN(), fmt.Errorf("%s %v °C: %w", what, celsius, ErrInvalidTemperature)
	}
	return k, nil
}

// ActivationEnergy returns the Arrhenius activation energy Ea (J/mol) that
// matches the z-value z (°C) over the temperature range t1 to t2 (°C):
//
//	Ea = ln 10 · R · T₁ · T₂ / z      (T₁, T₂ in kelvin)
//
// It is an approximation. The z model (log10 D linear in T) and the
// Arrhenius model (ln k linear in 1/T, k = ln 10 / D) are different curves;
// they agree exactly only on the ratio D(T₁)/D(T₂) at the two temperatures
// given (with t1 == t2, on the local slope there). Outside the range, or over
// a wide one, the two models part. Each use of the result should state the
// range it was converted over.
//
// Special cases are:
//
//	z zero, negative, NaN or ±Inf: ErrInvalidZ
//	t1 or t2 NaN, ±Inf, or at or below absolute zero: ErrInvalidTemperature
//	a result that overflows or underflows (below the smallest normal float64): ErrOutOfRange
func ActivationEnergy(z, t1, t2 float64) (float64, error) {
	if err := checkZ("z", z); err != nil {
		return math.NaN(), err
	}
	k1, err := kelvin("first temperature", t1)
	if err != nil {
		return math.NaN(), err
	}
	k2, err := kelvin("second temperature", t2)
	if err != nil {
		return math.NaN(), err
	}
	ea := math.Ln10 * GasConstant * k1 * k2 / z
	if !representable(ea) {
		return math.NaN(), fmt.Errorf("activation energy for z %g °C over %g–%g °C: %w", z, t1, t2, ErrOutOfRange)
	}
	return ea, nil
}

// ZFromActivationEnergy returns the z-value (°C) that matches the Arrhenius
// activation energy ea (J/mol) over the temperature range t1 to t2 (°C), the
// inverse of ActivationEnergy:
//
//	z = ln 10 · R · T₁ · T₂ / Ea      (T₁, T₂ in kelvin)
//
// with the same caveat: an equivalence at the two temperatures only.
//
// Special cases are:
//
//	ea zero, negative, NaN or ±Inf: ErrInvalidEnergy
//	t1 or t2 NaN, ±Inf, or at or below absolute zero: ErrInvalidTemperature
//	a result that overflows or underflows (below the smallest normal float64): ErrOutOfRange
func ZFromActivationEnergy(ea, t1, t2 float64) (float64, error) {
	if !finite(ea) || ea <= 0 {
		return math.NaN(), fmt.Errorf("activation energy %v J/mol: %w", ea, ErrInvalidEnergy)
	}
	k1, err := kelvin("first temperature", t1)
	if err != nil {
		return math.NaN(), err
	}
	k2, err := kelvin("second temperature", t2)
	if err != nil {
		return math.NaN(), err
	}
	z := math.Ln10 * GasConstant * k1 * k2 / ea
	if !representable(z) {
		return math.NaN(), fmt.Errorf("z for %g J/mol over %g–%g °C: %w", ea, t1, t2, ErrOutOfRange)
	}
	return z, nil
}
