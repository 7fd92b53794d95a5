// Package fraction estimates the D-value of a biological indicator from
// fraction-negative (growth/no-growth) data: the general and the limited
// Holcomb–Spearman–Kärber procedures, the Stumbo–Murphy–Cochran procedure,
// maximum likelihood with profile-likelihood limits, and the planning of a
// study.
//
// # Data and conventions
//
// A study is a set of exposures (Exposure): at each exposure time t
// (minutes), n indicators are exposed and incubated, and r of them show no
// growth. r counts the NEGATIVE units (sterile, no growth), as in every
// published formula here; a unit that grows is positive. log10 N0 is the
// base-10 logarithm of the spores per unit from the population assay. Times
// are minutes, D is minutes, logarithms are base 10 unless a name says ln.
//
// Every function refuses, with an error wrapping a sentinel (test with
// errors.Is) and naming the offending exposure by its position in the
// caller's slice ("exposures[2] at 10 min"): log10 N0 not finite or ≤ 0
// (ErrInvalidPopulation), fewer than two exposures (ErrTooFewExposures), a
// time that is negative or not finite (ErrInvalidTime), fewer than one unit
// (ErrInvalidUnits), negatives below 0 or above the units
// (ErrInvalidNegatives), and two exposures at the same time
// (ErrDuplicateTime: pool them, adding units and negatives). Exposures may
// come in any order; the caller's slice is never modified. Soft problems
// are warnings in the result's resistance.Estimate; exposures a procedure
// does not use are listed with the reason. No function panics.
//
// # Model
//
// First-order inactivation with Poisson-distributed survivors: after t
// minutes a unit holds on average μ(t) survivors and is negative with
// probability e^−μ:
//
//	μ(t) = N0 · 10^(−t/D)
//	P(negative | t) = exp(−μ(t)),  P(positive | t) = 1 − exp(−μ(t))
//
// # Holcomb–Spearman–Kärber (HSK, LimitedHSK)
//
// With p = r/n, U₁ the anchor and U_k the first all-negative exposure, the
// mean time to sterility Ū and its variance V are
//
//	general:  Ū = Σ_{i=1}^{k−1} (tᵢ + tᵢ₊₁)/2 · (pᵢ₊₁ − pᵢ)
//	          V = Σ_{i=2}^{k−1} ((tᵢ₊₁ − tᵢ₋₁)/2)² · pᵢ(1 − pᵢ)/(nᵢ − 1)
//	limited:  Ū = U_k − d/2 − (d/n) Σ_{i=1}^{k−1} rᵢ
//	          V = d²/(n²(n − 1)) · Σ_{i=1}^{k−1} rᵢ(n − rᵢ)
//	both:     D = Ū/(log10 N0 + 0.2507),  limits (Ū ± 2√V)/(log10 N0 + 0.2507)
//
// 0.2507 is Euler's constant divided by ln 10. The limited form (equal
// units n, equal interval d) equals the general one on the designs it
// accepts. The anchor U₁ is the LAST all-positive exposure before the first
// exposure with a negative unit: earlier all-positive exposures add only
// zero terms (pᵢ₊₁ − pᵢ = 0, pᵢ(1 − pᵢ) = 0), and anchoring at the last
// all-positive exposure before the first all-NEGATIVE one instead would
// drop fractional results that precede a later all-positive one. Exposures
// after U_k do not enter the sums; growth there is a warning (and a
// refusal of the limited form). The limits are the procedure's ±2√V, whose
// level is the normal two-sided coverage of two standard errors,
// HSKLevel = erf(√2) ≈ 0.9545: it is not a choice.
//
// # Stumbo–Murphy–Cochran (SMC, SMCAt)
//
// At an exposure U with 0 < r < n the most probable number of survivors
// per unit is ln(n/r) (natural log), and
//
//	D = U / (log10 N0 − log10 ln(n/r))
//
// per fractional exposure, then averaged. The procedure gives no
// confidence limits.
//
// # Maximum likelihood (MLE)
//
// The counts of negatives are binomial with P(positive | t) as above, a
// binomial generalized linear model with the complementary log-log link:
//
//	log(−log P(negative | t)) = ln μ(t) = ln N0 − (ln 10 / D) · t
//
// intercept ln N0 (fixed from the population assay, or fitted) and slope
// −ln 10/D. The log-likelihood is computed in log space (log P(negative) =
// −μ, log P(positive) = log(−expm1(−μ)), μ = exp(ln N0 − t·ln 10/D)), so
// that N0 from 10¹ to 10¹² and times from seconds to days are handled
// alike. It is concave in (ln N0, slope); the fits are safeguarded Newton
// iterations (a bracketed one-dimensional search with N0 fixed, a
// line-searched two-dimensional one with N0 fitted). The limits are
// profile-likelihood limits, where the log-likelihood (profiled over N0
// when N0 is fitted) falls χ²₁(level)/2 below its maximum, found by
// bracketed Newton root finding; the deviance is against the saturated
// model.
//
// # Study planning (PlanStudy)
//
// Exposures from the survival time (log10 N0 − 2)·D to the kill time
// (log10 N0 + 4)·D at equal spacing, with the expected negatives n·e^−μ at
// each, the limits expected from the Fisher information
// I = Σ n·μ²/expm1(μ)·t² (with N0 fixed; the 2×2 matrix with N0 fitted),
// and optionally a seeded simulation of the study.
//
// # References
//
// ISO 11138-1, Sterilization of health care products — Biological
// indicators — Part 1: General requirements, Annex D (the
// Holcomb–Spearman–Kärber procedures and the constant 0.2507, seen in a
// national edition).
// The variance formula and the factor 2 of the limits are from memory of
// the same annex — verify them against the edition in force.
//
// Stumbo, Murphy and Cochran (1950), as described by Lewis (1956),
// Applied Microbiology 4:211 (the Stumbo–Murphy–Cochran formula and its
// most probable number ln(n/r)).
//
// McCullagh P., Nelder J. A. (1989), Generalized Linear Models, 2nd ed.,
// Chapman & Hall: the binomial model with the complementary log-log link
// and the deviance. The reference values of this package's tests come from
// R 4.2.2, glm(..., family = binomial(link = "cloglog")) and uniroot (see
// testdata/fraction/mle_reference.R in the module).
//
// # Cautions
//
// These numbers feed decisions about patient safety. The package
// computes; acceptance of an indicator lot or a process is decided by the
// laboratory's qualified people under the standards and regulations that
// apply to them. The HSK variance and its factor 2 are from memory and must
// be checked against ISO 11138-1. The goodness-of-fit p-value is a
// chi-square approximation, rough when few units are tested. A likelihood
// fit that estimates N0 needs at least two fractional exposures and still
// gives wide limits; fixing N0 from a population assay is the usual
// practice. Warnings in a result are part of the result: read them.
package fraction
