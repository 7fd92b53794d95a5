package resistance

import (
	"fmt"
	"math"
)

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// minNormal is the smallest positive normal float64. A result below it is
// subnormal: it has lost significant digits (5e-324 has one), so the
// functions refuse it as out of range rather than return it.
const minNormal = 0x1p-1022

// representable reports whether a positive result is finite and not
// subnormal (nor 0).
func representable(v float64) bool { return finite(v) && v >= minNormal }

func checkD(what string, d float64) error {
	if !finite(d) || d <= 0 {
		return fmt.Errorf("%s %v: %w", what, d, ErrInvalidD)
	}
	return nil
}

func checkZ(what string, z float64) error {
	if !finite(z) || z <= 0 {
		return fmt.Errorf("%s %v: %w", what, z, ErrInvalidZ)
	}
	return nil
}

func checkCelsius(what string, t float64) error {
	if !finite(t) {
		return fmt.Errorf("%s %v °C: %w", what, t, ErrInvalidTemperature)
	}
	return nil
}

// DAt returns the D-value at temperature celsius from the D-value dRef at
// the reference temperature tRef and the z-value z:
//
//	D(T) = D_ref · 10^((T_ref − T)/z)
//
// D in minutes, temperatures and z in °C. The model is the z-value model of
// the FDA 2007 biological-indicator 510(k) guidance; the check D150 = 4.5 min,
// z = 10 °C gives D160 = 0.45 min.
//
// Special cases are:
//
//	dRef or z zero, negative, NaN or ±Inf: ErrInvalidD or ErrInvalidZ
//	tRef or celsius NaN or ±Inf: ErrInvalidTemperature
//	a result that overflows to +Inf or underflows below the smallest normal float64 (about 2.2e-308): ErrOutOfRange
func DAt(dRef, tRef, z, celsius float64) (float64, error) {
	if err := checkD("reference D", dRef); err != nil {
		return math.NaN(), err
	}
	if err := checkCelsius("reference temperature", tRef); err != nil {
		return math.NaN(), err
	}
	if err := checkZ("z", z); err != nil {
		return math.NaN(), err
	}
	if err := checkCelsius("temperature", celsius); err != nil {
		return math.NaN(), err
	}
	f := dFactor(tRef, z, celsius)
	d := dRef * f
	if !representable(d) {
		return math.NaN(), fmt.Errorf("result: D at %g °C from %g min at %g °C with z %g °C: %w", celsius, dRef, tRef, z, ErrOutOfRange)
	}
	return d, nil
}

// dFactor is 10^((tRef − celsius)/z), computed from the temperature
// difference so that large but close temperatures keep their digits.
func dFactor(tRef, z, celsius float64) float64 {
	return math.Pow(10, (tRef-celsius)/z)
}

// TemperatureAt returns the temperature (°C) at which the D-value is d,
// given the D-value dRef at tRef and the z-value z; it is the inverse of
// DAt:
//
//	T = T_ref − z · (log10 D − log10 D_ref)
//
// Special cases are:
//
//	dRef, d or z zero, negative, NaN or ±Inf: ErrInvalidD or ErrInvalidZ
//	tRef NaN or ±Inf: ErrInvalidTemperature
//	a result that overflows: ErrOutOfRange
func TemperatureAt(dRef, tRef, z, d float64) (float64, error) {
	if err := checkD("reference D", dRef); err != nil {
		return math.NaN(), err
	}
	if err := checkCelsius("reference temperature", tRef); err != nil {
		return math.NaN(), err
	}
	if err := checkZ("z", z); err != nil {
		return math.NaN(), err
	}
	if err := checkD("D", d); err != nil {
		return math.NaN(), err
	}
	t := tRef - z*(math.Log10(d)-math.Log10(dRef))
	if !finite(t) {
		return math.NaN(), fmt.Errorf("temperature of D %g min from %g min at %g °C with z %g °C: %w", d, dRef, tRef, z, ErrOutOfRange)
	}
	return t, nil
}

// EstimateAt carries the D-value estimate e, determined at tRef, to the
// temperature celsius with the z-value z: the value and both limits are
// multiplied by 10^((tRef − celsius)/z), as DAt does. Level is kept, Method
// gets " at <celsius> °C (z <z> °C)" appended, and a warning is added that
// the limits carry the uncertainty of D only, not that of z. Infinite limits
// stay infinite and NaN limits stay NaN.
//
// Special cases are those of DAt, with e.Value in the place of dRef. The
// limits are scaled as they are, without checks; a limit far from the value
// may overflow to ±Inf.
func EstimateAt(e Estimate, tRef, z, celsius float64) (Estimate, error) {
	if _, err := DAt(e.Value, tRef, z, celsius); err != nil {
		return Estimate{}, fmt.Errorf("estimate %s: %w", e.Method, err)
	}
	f := dFactor(tRef, z, celsius)
	out := Estimate{
		Value:    e.Value * f,
		Lower:    e.Lower * f,
		Upper:    e.Upper * f,
		Level:    e.Level,
		Method:   fmt.Sprintf("%s at %g °C (z %g °C)", e.Method, celsius, z),
		Warnings: append(append([]string(nil), e.Warnings...), fmt.Sprintf("carried from %g °C to %g °C with z %g °C: the limits carry the uncertainty of D only, not that of z", tRef, celsius, z)),
	}
	return out, nil
}
