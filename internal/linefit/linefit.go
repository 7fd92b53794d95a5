// Package linefit fits a straight line by ordinary (optionally weighted)
// least squares, with the standard errors, residual standard deviation, r²
// and t-based confidence limits that the survivor-curve D-value and the
// z-value need.
//
// The model is
//
//	y = b0 + b1·x + e,   e ~ N(0, σ²/w)
//
// fitted in two passes about the weighted means of x and y (centred sums),
// which keeps full precision on data like NIST StRD Norris. With n points
// (n_w of positive weight) the residual degrees of freedom are n_w − 2.
//
// It is internal: the public packages wrap it with their own vocabulary and
// error sentinels.
package linefit

import (
	"errors"
	"fmt"
	"math"

	"github.com/dzf-go/dzf/internal/tdist"
)

// Errors returned by Fit and the interval methods.
var (
	// ErrInput: the inputs have different lengths, or a value is NaN or
	// ±Inf, or a weight is negative.
	ErrInput = errors.New("linefit: invalid input")
	// ErrTooFewPoints: fewer than three points of positive weight, so no
	// residual degree of freedom is left.
	ErrTooFewPoints = errors.New("linefit: fewer than three points")
	// ErrNoSpread: every x is the same, so the slope is undefined.
	ErrNoSpread = errors.New("linefit: fewer than two distinct x values")
	// ErrLevel: a confidence level outside (0, 1).
	ErrLevel = errors.New("linefit: confidence level outside (0, 1)")
	// ErrOverflow: the inputs are finite, but a mean, a sum of squares or
	// a standard error of the fit is not (values near float64's limits).
	ErrOverflow = errors.New("linefit: fit overflows float64")
)

// Line is a fitted straight line y = Intercept + Slope·x.
type Line struct {
	N           int       // points of positive weight
	SumW        float64   // Σ w (N for unit weights)
	DF          int       // residual degrees of freedom, N − 2
	XMean       float64   // weighted mean of x
	YMean       float64   // weighted mean of y
	Sxx         float64   // Σ w (x − x̄)²
	Intercept   float64   // b0
	Slope       float64   // b1
	SEIntercept float64   // standard error of b0
	SESlope     float64   // standard error of b1
	RSS         float64   // Σ w·residual²
	ResidualSD  float64   // √(RSS/DF)
	RSquared    float64   // 1 − RSS/Σ w (y − ȳ)²; 1 when y has no spread and fits exactly
	Residuals   []float64 // y − fitted, in input order (weight-0 points too)
}

// Fit fits y on x with unit weights.
func Fit(x, y []float64) (Line, error) { return FitWeighted(x, y, nil) }

// FitWeighted fits y on x with weights w (nil means all 1). Points of weight
// 0 do not influence the fit but get a residual. It refuses inputs of
// different lengths or non-finite values (ErrInput), fewer than three
// points of positive weight (ErrTooFewPoints), x without spread
// (ErrNoSpread) and a fit whose numbers overflow (ErrOverflow); every
// number of a Line it returns is finite.
func FitWeighted(x, y, w []float64) (Line, error) {
	if len(x) != len(y) || (w != nil && len(w) != len(x)) {
		return Line{}, fmt.Errorf("%w: %d x values, %d y values, %d weights", ErrInput, len(x), len(y), len(w))
	}
	weight := func(i int) float64 {
		if w == nil {
			return 1
		}
		return w[i]
	}
	var sw float64
	n := 0
	for i := range x {
		wi := weight(i)
		if !finite(x[i]) || !finite(y[i]) || !finite(wi) || wi < 0 {
			return Line{}, fmt.Errorf("%w: point %d (x %v, y %v, weight %v)", ErrInput, i+1, x[i], y[i], wi)
		}
		if wi > 0 {
			n++
			sw += wi
		}
	}
	if n < 3 {
		return Line{}, fmt.Errorf("%w: %d", ErrTooFewPoints, n)
	}
	// First pass: weighted means.
	var mx, my float64
	for i := range x {
		wi := weight(i)
		mx += wi * x[i]
		my += wi * y[i]
	}
	mx /= sw
	my /= sw
	// Second pass: centred sums, with the usual correction term for the
	// rounding error of the means.
	var sxx, sxy, syy, cx, cy float64
	for i := range x {
		wi := weight(i)
		dx, dy := x[i]-mx, y[i]-my
		cx += wi * dx
		cy += wi * dy
		sxx += wi * dx * dx
		sxy += wi * dx * dy
		syy += wi * dy * dy
	}
	sxx -= cx * cx / sw
	sxy -= cx * cy / sw
	syy -= cy * cy / sw
	if !finite(mx) || !finite(my) || !finite(sxx) || !finite(sxy) || !finite(syy) {
		return Line{}, fmt.Errorf("%w: means %v, %v; sums of squares %v, %v, %v", ErrOverflow, mx, my, sxx, sxy, syy)
	}
	if !(sxx > 0) || sxx <= 1e-300 {
		return Line{}, ErrNoSpread
	}
	// Means corrected for rounding.
	mx += cx / sw
	my += cy / sw
	b1 := sxy / sxx
	b0 := my - b1*mx
	res := make([]float64, len(x))
	var rss float64
	for i := range x {
		r := y[i] - (my + b1*(x[i]-mx))
		res[i] = r
		rss += weight(i) * r * r
	}
	df := n - 2
	s2 := rss / float64(df)
	seInt, seSlope := math.Sqrt(s2*(1/sw+mx*mx/sxx)), math.Sqrt(s2/sxx)
	if !finite(b1) || !finite(b0) || !finite(rss) || !finite(seInt) || !finite(seSlope) {
		return Line{}, fmt.Errorf("%w: slope %v, intercept %v, RSS %v, standard errors %v, %v", ErrOverflow, b1, b0, rss, seInt, seSlope)
	}
	r2 := 1.0
	if syy > 0 {
		r2 = 1 - rss/syy
		if r2 < 0 {
			r2 = 0
		}
	}
	return Line{
		N: n, SumW: sw, DF: df, XMean: mx, YMean: my, Sxx: sxx,
		Intercept: b0, Slope: b1,
		SEIntercept: seInt,
		SESlope:     seSlope,
		RSS:         rss, ResidualSD: math.Sqrt(s2), RSquared: r2,
		Residuals: res,
	}, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// At returns the fitted value at x.
func (l Line) At(x float64) float64 { return l.YMean + l.Slope*(x-l.XMean) }

// SEAt returns the standard error of the fitted mean at x (for unit
// weights; with weights, relative to a unit-weight observation).
func (l Line) SEAt(x float64) float64 {
	d := x - l.XMean
	return l.ResidualSD * math.Sqrt(1/l.SumW+d*d/l.Sxx)
}

// T returns the two-sided Student t quantile for the level and the line's
// degrees of freedom: the t with P(|T| ≤ t) = level.
func (l Line) T(level float64) (float64, error) { return TQuantile(level, l.DF) }

// TQuantile returns the two-sided Student t quantile at level with df
// degrees of freedom: the q with P(|T| ≤ q) = level, from tdist.TwoSided
// (which matches gonum's distuv.StudentsT quantile at 0.5 + level/2 and R's
// qt, about ten times faster than the former).
func TQuantile(level float64, df int) (float64, error) {
	if !(level > 0 && level < 1) {
		return math.NaN(), fmt.Errorf("%w: %v", ErrLevel, level)
	}
	if df < 1 {
		return math.NaN(), fmt.Errorf("%w: %d degrees of freedom", ErrTooFewPoints, df)
	}
	return tdist.TwoSided(level, df), nil
}

// SlopeInterval returns the t-based confidence limits of the slope.
func (l Line) SlopeInterval(level float64) (lo, hi float64, err error) {
	t, err := l.T(level)
	if err != nil {
		return math.NaN(), math.NaN(), err
	}
	return l.Slope - t*l.SESlope, l.Slope + t*l.SESlope, nil
}

// InterceptInterval returns the t-based confidence limits of the intercept.
func (l Line) InterceptInterval(level float64) (lo, hi float64, err error) {
	t, err := l.T(level)
	if err != nil {
		return math.NaN(), math.NaN(), err
	}
	return l.Intercept - t*l.SEIntercept, l.Intercept + t*l.SEIntercept, nil
}

// MeanInterval returns the t-based confidence limits of the fitted mean at x.
func (l Line) MeanInterval(x, level float64) (lo, hi float64, err error) {
	t, err := l.T(level)
	if err != nil {
		return math.NaN(), math.NaN(), err
	}
	lo, hi = l.MeanIntervalT(x, t)
	return lo, hi, nil
}

// MeanIntervalT returns the limits of the fitted mean at x for a t
// quantile already computed (by T, for a caller that needs several
// intervals at one level): At(x) ∓ t·SEAt(x).
func (l Line) MeanIntervalT(x, t float64) (lo, hi float64) {
	c, h := l.At(x), t*l.SEAt(x)
	return c - h, c + h
}

// NegReciprocal returns −1/Slope (the D-value of a survivor curve, the
// z-value of a log D on temperature line) with the limits obtained by
// transforming the slope's t interval [a, b]: for a < b < 0 they are
// [−1/a, −1/b]. When b ≥ 0 the interval reaches zero and the upper limit is
// +Inf (unbounded is true); when the slope itself is ≥ 0 the value is
// undefined and all three results are NaN with unbounded true.
func (l Line) NegReciprocal(level float64) (value, lower, upper float64, unbounded bool, err error) {
	t, err := l.T(level)
	if err != nil {
		return math.NaN(), math.NaN(), math.NaN(), false, err
	}
	value, lower, upper, unbounded = l.NegReciprocalT(t)
	return value, lower, upper, unbounded, nil
}

// NegReciprocalT is NegReciprocal for a t quantile already computed (by
// T): the slope interval is [Slope − t·SESlope, Slope + t·SESlope].
func (l Line) NegReciprocalT(t float64) (value, lower, upper float64, unbounded bool) {
	a, b := l.Slope-t*l.SESlope, l.Slope+t*l.SESlope
	if !(l.Slope < 0) {
		return math.NaN(), math.NaN(), math.NaN(), true
	}
	value, lower = -1/l.Slope, -1/a
	if b >= 0 {
		return value, lower, math.Inf(1), true
	}
	return value, lower, -1 / b, false
}
