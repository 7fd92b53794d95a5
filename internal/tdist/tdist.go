// Package tdist computes two-sided quantiles of Student's t distribution,
// fast and accurately, for the t-based limits of the survivor curve and the
// z-value fit.
//
// TwoSided(level, df) is the q with P(|T| ≤ q) = level for T ~ t(df),
// which gonum's distuv.StudentsT{Mu: 0, Sigma: 1, Nu: df}.Quantile(0.5 +
// level/2) also gives, about ten times faster, so that a fit of a few
// points is not dominated by its quantile, and more accurately near levels
// 0 and 1, where 0.5 + level/2 rounds digits away. The tests check it
// against R 4.2.2 qt to 12 significant digits (11 from df = 1000 on) and
// against gonum over random df and levels.
//
// It is internal: the public packages wrap it with their own checks and
// error sentinels.
package tdist

import (
	"math"

	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/stat/distuv"
)

// TwoSided returns the two-sided Student t quantile q with
// P(|T| ≤ q) = level for df degrees of freedom. It returns NaN for a level
// outside (0, 1) (or NaN) and for df < 1; the callers check both first.
//
// For df = 1 and 2 it uses the closed forms
//
//	df = 1: q = tan(π·level/2) = 1/tan(π(1 − level)/2)
//	df = 2: q = level · √(2/((1 + level)(1 − level)))
//
// For df ≥ 3 and level below 1e-8 it returns level/(2·f(0)), f the t
// density, whose relative error is of order q² there. Otherwise it starts
// from the Cornish–Fisher expansion of the t quantile in the normal
// quantile z = √2 erfinv(level) (Abramowitz and Stegun, Handbook of
// Mathematical Functions, 1964, formula 26.7.5), which from df = 5000 on is
// returned as it is (its first omitted term is of order z¹¹/df⁵). Below
// that it refines the start by Newton steps with a second-order (Taylor)
// correction on
//
//	P(|T| ≤ q) = I_{q²/(df+q²)}(1/2, df/2) = 1 − I_{df/(df+q²)}(df/2, 1/2)
//
// (regularized incomplete beta functions, the first form for levels below
// 0.5, the second above), until a step is below 1e-6·q: the error after a
// second-order step is of the order of the cube of the one before. When the
// iteration does not settle (extreme levels at small df) it returns gonum's
// quantile.
func TwoSided(level float64, df int) float64 {
	if !(level > 0 && level < 1) || df < 1 {
		return math.NaN()
	}
	nu := float64(df)
	switch df {
	case 1:
		if level < 0.5 {
			return math.Tan(math.Pi * level / 2)
		}
		return 1 / math.Tan(math.Pi*(1-level)/2)
	case 2:
		return level * math.Sqrt(2/((1+level)*(1-level)))
	}
	// log of the density's constant, Γ((ν+1)/2) / (Γ(ν/2) √(νπ)).
	lg1, _ := math.Lgamma((nu + 1) / 2)
	lg2, _ := math.Lgamma(nu / 2)
	logC := lg1 - lg2 - 0.5*math.Log(nu*math.Pi)
	if level < 1e-8 {
		// P(|T| ≤ q) = 2·density(0)·q·(1 + O(q²)).
		return level / (2 * math.Exp(logC))
	}
	// Normal quantile Φ⁻¹(0.5 + level/2) = √2 erfinv(level), without
	// rounding 0.5 + level/2.
	z := math.Sqrt2 * math.Erfinv(level)
	z2 := z * z
	g1 := (z2 + 1) * z / 4
	g2 := ((5*z2+16)*z2 + 3) * z / 96
	g3 := (((3*z2+19)*z2+17)*z2 - 15) * z / 384
	g4 := ((((79*z2+776)*z2+1482)*z2-1920)*z2 - 945) * z / 92160
	q := z + (g1+(g2+(g3+g4/nu)/nu)/nu)/nu
	if df >= 5000 {
		// The expansion's first omitted term, of order z¹¹/ν⁵, is below
		// float64 resolution here, while the incomplete beta function
		// loses digits at such large parameters.
		return q
	}

	for range 20 {
		if !(q > 0) || math.IsInf(q, 0) {
			break
		}
		// miss = level − P(|T| ≤ q), from the central probability for
		// small levels and from the tails for large ones, so that it
		// keeps its relative precision.
		var miss float64
		if level < 0.5 {
			miss = level - mathext.RegIncBeta(0.5, nu/2, q*q/(nu+q*q))
		} else {
			miss = mathext.RegIncBeta(nu/2, 0.5, nu/(nu+q*q)) - (1 - level)
		}
		dens := math.Exp(logC - (nu+1)/2*math.Log1p(q*q/nu))
		if !(dens > 0) {
			break
		}
		x := miss / (2 * dens)
		step := x * (1 + x*q*(nu+1)/(2*(q*q+nu)))
		q += step
		if math.Abs(step) <= 1e-6*math.Abs(q) {
			if q > 0 && !math.IsInf(q, 0) {
				return q
			}
			break
		}
	}
	return distuv.StudentsT{Mu: 0, Sigma: 1, Nu: nu}.Quantile(0.5 + level/2)
}
