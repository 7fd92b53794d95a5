package resistance

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"

	"github.com/dzf-go/dzf/internal/linefit"
	"gonum.org/v1/gonum/stat/distuv"
)

// Point is a D-value determined at one temperature, an input of ZFit. Only
// D.Value enters an unweighted fit; a weighted fit also uses D.Lower,
// D.Upper and D.Level.
type Point struct {
	Celsius float64  `json:"celsius"`
	D       Estimate `json:"d"`
}

// ZSettings configures ZFit. A nil *ZSettings, or a zero field, means the
// default.
type ZSettings struct {
	// Level is the two-sided confidence level of the limits, in (0, 1).
	// Default 0.95.
	Level float64 `json:"level"`
	// Weighted weights each point by 1/var(log10 D), the variance derived
	// from the point's own limits (see ZFit). Default false: unit weights.
	Weighted bool `json:"weighted"`
}

// ZResult is the z-value fitted by ZFit, with the line it comes from.
type ZResult struct {
	// Z is the z-value (°C) with its limits at the requested level. With two
	// points the limits are NaN; when the slope's interval reaches zero the
	// upper limit is +Inf.
	Z Estimate `json:"z"`
	// TRef is the reference temperature (°C) at which DRef is given.
	TRef float64 `json:"t_ref"`
	// DRef is the fitted D (minutes) at TRef, 10^(fitted log10 D), with the
	// limits 10^(limits of the fitted mean); NaN limits with two points.
	DRef Estimate `json:"d_ref"`
	// Slope is the fitted slope of log10 D on temperature (per °C), −1/z.
	Slope float64 `json:"slope"`
	// Intercept is the fitted log10 D at 0 °C (an extrapolation, given for
	// completeness; DRef is the useful summary).
	Intercept float64 `json:"intercept"`
	// SESlope is the standard error of Slope; NaN with two points.
	SESlope float64 `json:"se_slope"`
	// RSquared is the coefficient of determination of the fit (1 with two
	// points, which the line passes through).
	RSquared float64 `json:"r2"`
	// ResidualSD is the residual standard deviation of log10 D; NaN with
	// two points.
	ResidualSD float64 `json:"residual_sd"`
	// N is the number of points, Temperatures the number of distinct
	// temperatures among them, DF the residual degrees of freedom (N − 2).
	N            int `json:"n"`
	Temperatures int `json:"temperatures"`
	DF           int `json:"df"`
	// Weights are the weights used, in input order (nil for unit weights).
	Weights []float64 `json:"weights,omitempty"`
	// Residuals are log10 D minus the fitted log10 D, in input order.
	Residuals []float64 `json:"residuals"`
	// Warnings lists every broken prerequisite or doubt about the fit.
	Warnings []string `json:"warnings,omitempty"`
}

// Method names written in ZResult.Z.Method.
const (
	MethodZTwoPoint   = "z from two points, closed form"
	MethodZLeastSq    = "z by least squares of log10 D on temperature (FDA 2007 BI guidance)"
	MethodZWeightedLS = "z by weighted least squares of log10 D on temperature, weights 1/var(log10 D) from each D's limits"
	MethodDRefFitted  = "D at the reference temperature from the z fit"
)

type zResultJSON ZResult

// MarshalJSON implements json.Marshaler, writing the non-finite values of
// SESlope and ResidualSD (NaN with two points) as "NaN", "+Inf" or "-Inf".
func (r ZResult) MarshalJSON() ([]byte, error) {
	return json.Marshal(struct {
		zResultJSON
		SESlope    jsonFloat `json:"se_slope"`
		ResidualSD jsonFloat `json:"residual_sd"`
	}{zResultJSON(r), jsonFloat(r.SESlope), jsonFloat(r.ResidualSD)})
}

// UnmarshalJSON implements json.Unmarshaler, reading what MarshalJSON
// writes.
func (r *ZResult) UnmarshalJSON(b []byte) error {
	var v struct {
		zResultJSON
		SESlope    jsonFloat `json:"se_slope"`
		ResidualSD jsonFloat `json:"residual_sd"`
	}
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*r = ZResult(v.zResultJSON)
	r.SESlope, r.ResidualSD = float64(v.SESlope), float64(v.ResidualSD)
	return nil
}

// ZFromTwo returns the z-value (°C) from D-values d1 at t1 and d2 at t2 by
// the closed form
//
//	z = (T₂ − T₁) / (log10 D₁ − log10 D₂)
//
// the temperature change for a tenfold change of D (FDA 2007 BI guidance).
// The points may come in either order.
//
// Special cases are:
//
//	d1 or d2 zero, negative, NaN or ±Inf: ErrInvalidD
//	t1 or t2 NaN or ±Inf: ErrInvalidTemperature
//	t1 == t2: ErrTooFewTemperatures
//	D not falling as temperature rises (including d1 == d2): ErrRisingD
//	a z that overflows (D-values too close) or underflows (temperatures too close for D-values that far apart): ErrOutOfRange
func ZFromTwo(t1, d1, t2, d2 float64) (float64, error) {
	if err := checkCelsius("first temperature", t1); err != nil {
		return math.NaN(), err
	}
	if err := checkD("first D", d1); err != nil {
		return math.NaN(), err
	}
	if err := checkCelsius("second temperature", t2); err != nil {
		return math.NaN(), err
	}
	if err := checkD("second D", d2); err != nil {
		return math.NaN(), err
	}
	if t1 == t2 {
		return math.NaN(), fmt.Errorf("both D-values at %g °C: %w", t1, ErrTooFewTemperatures)
	}
	span := t2 - t1
	if !finite(span) {
		return math.NaN(), fmt.Errorf("temperatures %g and %g °C: %w", t1, t2, ErrOutOfRange)
	}
	slope := (math.Log10(d2) - math.Log10(d1)) / span
	if !(slope < 0) {
		return math.NaN(), fmt.Errorf("two points: D %g min at %g °C and %g min at %g °C: %w", d1, t1, d2, t2, ErrRisingD)
	}
	z := -1 / slope
	if !representable(z) {
		return math.NaN(), fmt.Errorf("two points: D %g min at %g °C and %g min at %g °C give z %v: %w", d1, t1, d2, t2, z, ErrOutOfRange)
	}
	return z, nil
}

// logWeight returns 1/var(log10 D) from the estimate's limits: the
// half-width of the interval on the log10 scale divided by the standard
// normal quantile of its level gives the standard error.
func logWeight(e Estimate) (float64, error) {
	if !finite(e.Lower) || !finite(e.Upper) || !(e.Lower > 0) || !(e.Upper > e.Lower) {
		return math.NaN(), fmt.Errorf("limits %v – %v: %w", e.Lower, e.Upper, ErrInvalidWeight)
	}
	if !(e.Level > 0 && e.Level < 1) {
		return math.NaN(), fmt.Errorf("level %v: %w", e.Level, ErrInvalidWeight)
	}
	q := distuv.UnitNormal.Quantile(0.5 + e.Level/2)
	se := (math.Log10(e.Upper) - math.Log10(e.Lower)) / (2 * q)
	w := 1 / (se * se)
	if !finite(w) || !(w > 0) {
		return math.NaN(), fmt.Errorf("limits %v – %v give weight %v: %w", e.Lower, e.Upper, w, ErrInvalidWeight)
	}
	return w, nil
}

// ZFit fits the z-value to D-values at two or more temperatures by least
// squares of log10 D on temperature (FDA 2007 BI 510(k) guidance, which asks
// for D at three or more temperatures):
//
//	log10 D = b0 + b1·T,   z = −1/b1
//
// with t-based limits: the slope's interval [a, b] at the level gives z
// limits [−1/a, −1/b], and +Inf as the upper limit when b ≥ 0 (the data
// cannot exclude a zero slope). DRef is the fitted D at tRef, 10^(b0 + b1·tRef),
// with limits 10^(limits of the fitted mean at tRef). Points may repeat a
// temperature (replicates); they come in any order and are not modified.
//
// With two points (at two temperatures) z is the closed form of ZFromTwo,
// the line passes through both, and every limit is NaN: no degree of
// freedom is left. A warning is given whenever fewer than three distinct
// temperatures were used, and when tRef lies outside the measured range.
//
// With s.Weighted, each point has weight w = 1/var(log10 D), the standard
// error of log10 D taken as (log10 Upper − log10 Lower)/(2·q), q the standard
// normal quantile at 0.5 + Level/2 of that D's own limits. The weights are
// relative, as in R's lm(weights = w): the residual variance is still
// estimated from the scatter about the line, so the limits reflect both the
// weights and the observed scatter.
//
// Special cases are:
//
//	fewer than two points, or every point at one temperature: ErrTooFewTemperatures
//	a D zero, negative, NaN or ±Inf: ErrInvalidD
//	a temperature or tRef NaN or ±Inf: ErrInvalidTemperature
//	s.Level outside (0, 1): ErrInvalidLevel
//	a slope ≥ 0 (D not falling with temperature): ErrRisingD
//	with s.Weighted, a D without finite limits 0 < Lower < Upper and a level in (0, 1): ErrInvalidWeight
//	a fitted value outside float64's range: ErrOutOfRange
func ZFit(points []Point, tRef float64, s *ZSettings) (ZResult, error) {
	level, weighted := 0.95, false
	if s != nil {
		if s.Level != 0 {
			level = s.Level
		}
		weighted = s.Weighted
	}
	if !(level > 0 && level < 1) {
		return ZResult{}, fmt.Errorf("level %v: %w", level, ErrInvalidLevel)
	}
	if err := checkCelsius("reference temperature", tRef); err != nil {
		return ZResult{}, err
	}
	n := len(points)
	x, y := make([]float64, n), make([]float64, n)
	var w []float64
	if weighted {
		w = make([]float64, n)
	}
	distinct := map[float64]bool{}
	tMin, tMax := math.Inf(1), math.Inf(-1)
	for i, p := range points {
		if !finite(p.Celsius) {
			return ZResult{}, fmt.Errorf("point %d: temperature %v °C: %w", i+1, p.Celsius, ErrInvalidTemperature)
		}
		if !finite(p.D.Value) || p.D.Value <= 0 {
			return ZResult{}, fmt.Errorf("point %d at %g °C: D %v: %w", i+1, p.Celsius, p.D.Value, ErrInvalidD)
		}
		if weighted {
			wi, err := logWeight(p.D)
			if err != nil {
				return ZResult{}, fmt.Errorf("point %d at %g °C: %w", i+1, p.Celsius, err)
			}
			w[i] = wi
		}
		x[i], y[i] = p.Celsius, math.Log10(p.D.Value)
		distinct[p.Celsius] = true
		tMin, tMax = math.Min(tMin, p.Celsius), math.Max(tMax, p.Celsius)
	}
	if len(distinct) < 2 {
		return ZResult{}, fmt.Errorf("%d point(s) at %d temperature(s): %w", n, len(distinct), ErrTooFewTemperatures)
	}
	r := ZResult{TRef: tRef, N: n, Temperatures: len(distinct), DF: n - 2, Weights: w}
	if len(distinct) < 3 {
		r.Warnings = append(r.Warnings, fmt.Sprintf("D at %d distinct temperatures: the FDA 2007 BI guidance asks for three or more", len(distinct)))
	}
	if tRef < tMin || tRef > tMax {
		r.Warnings = append(r.Warnings, fmt.Sprintf("reference temperature %g °C lies outside the measured range %g–%g °C: D there is extrapolated", tRef, tMin, tMax))
	}
	method := MethodZLeastSq
	if weighted {
		method = MethodZWeightedLS
	}
	if n == 2 {
		return zTwoPoints(r, x, y, level)
	}
	line, err := linefit.FitWeighted(x, y, w)
	if err != nil {
		if errors.Is(err, linefit.ErrNoSpread) {
			return ZResult{}, fmt.Errorf("temperatures %g–%g °C too close to fit: %w", tMin, tMax, ErrTooFewTemperatures)
		}
		return ZResult{}, fmt.Errorf("fit of log10 D on temperature: %v: %w", err, ErrOutOfRange)
	}
	if !(line.Slope < 0) {
		return ZResult{}, fmt.Errorf("fitted slope of log10 D on temperature %.6g per °C: %w", line.Slope, ErrRisingD)
	}
	// One t quantile serves the z limits and the limits of D at tRef.
	tq, err := line.T(level)
	if err != nil {
		return ZResult{}, fmt.Errorf("z limits: %v: %w", err, ErrOutOfRange)
	}
	z, zLo, zHi, unbounded := line.NegReciprocalT(tq)
	if !representable(z) || !finite(line.Intercept) || !finite(line.SESlope) {
		return ZResult{}, fmt.Errorf("fitted slope %v gives z %v: %w", line.Slope, z, ErrOutOfRange)
	}
	if unbounded {
		r.Warnings = append(r.Warnings, fmt.Sprintf("the slope's %g %% interval reaches zero: the data cannot bound z from above (upper limit +Inf)", 100*level))
	}
	r.Z = Estimate{Value: z, Lower: zLo, Upper: zHi, Level: level, Method: method}
	r.Slope, r.Intercept, r.SESlope = line.Slope, line.Intercept, line.SESlope
	r.RSquared, r.ResidualSD = line.RSquared, line.ResidualSD
	r.Residuals = line.Residuals
	lo, hi := line.MeanIntervalT(tRef, tq)
	r.DRef = Estimate{Value: math.Pow(10, line.At(tRef)), Lower: math.Pow(10, lo), Upper: math.Pow(10, hi), Level: level, Method: MethodDRefFitted}
	if !representable(r.DRef.Value) {
		return ZResult{}, fmt.Errorf("fitted D at %g °C: %w", tRef, ErrOutOfRange)
	}
	r.Z.Warnings = append([]string(nil), r.Warnings...)
	return r, nil
}

// zTwoPoints completes r for two points at two temperatures.
func zTwoPoints(r ZResult, x, y []float64, level float64) (ZResult, error) {
	slope := (y[1] - y[0]) / (x[1] - x[0])
	if !(slope < 0) {
		return ZResult{}, fmt.Errorf("slope of log10 D on temperature %.6g per °C through the two points: %w", slope, ErrRisingD)
	}
	z := -1 / slope
	xm, ym := (x[0]+x[1])/2, (y[0]+y[1])/2
	intercept := ym - slope*xm
	logRef := ym + slope*(r.TRef-xm)
	if !representable(z) || !finite(intercept) || !finite(logRef) {
		return ZResult{}, fmt.Errorf("two points give slope %v: %w", slope, ErrOutOfRange)
	}
	r.Warnings = append(r.Warnings, "two points: no residual degree of freedom, so no limits (NaN)")
	r.Z = Estimate{Value: z, Lower: math.NaN(), Upper: math.NaN(), Level: level, Method: MethodZTwoPoint, Warnings: append([]string(nil), r.Warnings...)}
	r.Slope, r.Intercept, r.SESlope = slope, intercept, math.NaN()
	r.RSquared, r.ResidualSD = 1, math.NaN()
	r.Residuals = []float64{y[0] - (ym + slope*(x[0]-xm)), y[1] - (ym + slope*(x[1]-xm))}
	r.DRef = Estimate{Value: math.Pow(10, logRef), Lower: math.NaN(), Upper: math.NaN(), Level: level, Method: MethodDRefFitted}
	if !representable(r.DRef.Value) {
		return ZResult{}, fmt.Errorf("fitted D at %g °C: %w", r.TRef, ErrOutOfRange)
	}
	return r, nil
}

// String formats the fit: z with its limits, D at the reference temperature,
// r², the number of points and temperatures, and the warnings.
func (r ZResult) String() string {
	s := fmt.Sprintf("z %.4g °C (%.4g – %.4g, %g %%); D at %g °C %.4g min (%.4g – %.4g); r² %.4f; %d points at %d temperatures; %s",
		r.Z.Value, r.Z.Lower, r.Z.Upper, 100*r.Z.Level, r.TRef, r.DRef.Value, r.DRef.Lower, r.DRef.Upper, r.RSquared, r.N, r.Temperatures, r.Z.Method)
	for _, w := range r.Warnings {
		s += "\n  warning: " + w
	}
	return s
}
