// Package survivor estimates resistance from direct enumeration: the
// population of an indicator lot from plate counts, and the D-value from a
// log-linear survivor curve.
//
// # Survivor curve
//
// Units (carriers) are exposed for different times and the survivors on
// each are counted. First-order inactivation says the log10 count falls
// linearly with exposure:
//
//	log10 N(t) = log10 N0 − t/D
//
// D, the decimal reduction time, is the exposure (minutes) that kills 90 %
// of the population. [Fit] estimates the line by ordinary least squares of
// y = log10 count on t, over n observations (replicates at a time enter
// one by one), with df = n − 2:
//
//	slope b1 = Σ (t − t̄)(y − ȳ) / Σ (t − t̄)²
//	log10 N0 = b0 = ȳ − b1·t̄
//	D        = −1/b1
//	s²       = Σ (y − b0 − b1·t)² / (n − 2)       (residual SD = s)
//	SE(b1)   = s / √Σ (t − t̄)²
//	SE(b0)   = s · √(1/n + t̄²/Σ (t − t̄)²)
//
// The limits at confidence level L (two-sided; default 0.95) come from the
// slope's t interval, transformed:
//
//	[a, b]   = b1 ∓ t(1 − (1−L)/2, n − 2) · SE(b1)
//	D limits = [−1/a, −1/b]        (upper +Inf, with a warning, when b ≥ 0)
//	log10 N0 limits = b0 ∓ t · SE(b0)
//
// The fitted log reduction is (t_max − t_min)/D, the reduction the fitted
// line spans between the shortest and the longest exposure (the fitted
// value, not the observed range of log10 counts, so that replicate scatter
// does not inflate it).
//
// When some time carries replicates and there are at least three distinct
// times, [LackOfFit] tests the straight line against the replicate scatter
// (the classical pure-error F test of regression); a rejection at 5 % is a
// warning that the curve is not log-linear (shoulder, tail).
//
// # Population
//
// [CountPopulation] turns plate counts into the count per unit of each
// replicate unit and their mean. A unit is recovered into V mL of
// suspension, diluted in tenfold steps, and v mL of the liquid at dilution
// factor d = 10^-k (the fraction of the unit's suspension it holds; 1 for
// the suspension itself) is plated. A plate inside the countable range
// (default 30–300 colonies) gives c/(d·v)·V per unit; a unit's countable
// plates are pooled, the lot's population is the mean over units:
//
//	count per unit  x_u = Σ_j c_j / Σ_j (d_j · v_j) · V_u
//	mean            x̄   = Σ x_u / N
//	SD              s   = √(Σ (x_u − x̄)² / (N − 1)),   CV = s/x̄
//	limits          x̄ ∓ t(1 − (1−L)/2, N − 1) · s/√N,  also as log10
//
// Example: 10 mL of suspension, 0.1 mL of the 10^-4 dilution plated, 152
// colonies: 152 / (1e-4 · 0.1) · 10 = 1.52e8 per unit.
//
// # Units and logarithms
//
// Times in minutes, D in minutes, counts per unit (survivors per carrier),
// volumes in mL. Every logarithm is base 10; the slope is in log10 per
// minute.
//
// # Prerequisites and error policy
//
// Inputs that cannot give a number are refused with an error wrapping one
// of the exported sentinels (test with errors.Is); the message names the
// offending observation by its 0-based index in the caller's slice, its
// time and its count (for plates, the unit's and the plate's indexes). See
// [Fit] and [CountPopulation] for the lists. A zero count is refused
// unless [Settings].ExcludeBelowDetection asks to leave such observations
// out; each one left out is then listed in Result.Excluded with its reason.
//
// Broken prerequisites of the methods still give a number and are stated
// as warnings in the result, never silently: fewer than five distinct
// exposure times, no unexposed (0 min) observation, less than 4 fitted log
// reductions (testing-laboratory practice: at least five exposures, one
// unexposed, one reducing the count to about 0.01 % of N0, the rest
// between); r² below 0.8 (common practice, no source found); counts below
// 30 per unit (common practice: plate counting cannot see fewer than about
// 30 survivors per unit); an unbounded upper D limit; a rejecting
// lack-of-fit test; for populations, fewer than three units, a CV between
// units above 30 % (a project choice, no source) and a lower limit at or
// below zero. Plates outside the countable range are set aside and listed
// with their reason. No function modifies its arguments or panics on any
// input; all are safe for concurrent use.
//
// # Sources
//
//   - First-order (log-linear) inactivation and the decimal reduction time:
//     the standard model of sterilization microbiology (for example
//     Stumbo, C. R., Thermobacteriology in Food Processing, 2nd ed.,
//     Academic Press, 1973; from memory, not checked page by page).
//   - Least squares, its t-based limits and the lack-of-fit F test: Draper,
//     N. R. and Smith, H., Applied Regression Analysis, 3rd ed., Wiley,
//     1998, ch. 1 (straight line, its limits) and ch. 2 (lack of fit and
//     pure error); from memory. The results
//     are checked against R 4.2.2 lm, confint and anova (see the tests).
//   - At least five exposures, one unexposed, about 4 logs of reduction:
//     testing-laboratory practice for survivor curves of biological
//     indicators.
//   - r² of at least 0.8: common practice, no source found.
//   - Countable range 30–300 colonies per plate and the 30-per-unit floor
//     of plate counting: common practice, no source.
//   - Pooling plates by Σ c / Σ d·v: the Poisson maximum-likelihood
//     estimate (hand-derived).
//   - t quantiles: the Cornish–Fisher expansion (Abramowitz, M. and
//     Stegun, I. A., Handbook of Mathematical Functions, 1964, formula
//     26.7.5) refined by Newton steps on the regularized incomplete beta
//     function; checked against R 4.2.2 qt to 12 significant digits (11
//     from 1000 degrees of freedom on).
//
// # Cautions
//
// These numbers feed decisions about patient safety. The package computes;
// acceptance is decided by the laboratory's qualified people under the
// standards and regulations that apply to them. A D from a survivor curve
// assumes log-linear inactivation: shoulders and tails bias it, and the
// warnings flag only what the data show. Leaving zero counts out truncates
// the curve where it matters most and may overstate D; consider a
// fraction-negative method for those exposures.
package survivor
