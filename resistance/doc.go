// Package resistance is the shared vocabulary of microbial resistance: the
// D-value estimate every estimator of this module returns, D at another
// temperature, the z-value, the Arrhenius equivalence, the survival–kill
// window, and the check of an indicator lot against its label.
//
// It is the bottom of the module's import graph: the estimators (survivor
// curves, fraction-negative methods) and the lethality package import it,
// and it imports none of them. Its functions take [Estimate] values and
// plain numbers.
//
// # Model
//
// First-order inactivation, with D (decimal reduction time) the exposure
// that kills 90 % of the population at a stated temperature:
//
//	log10 N(t) = log10 N0 − t/D
//
// The z-value model: z is the temperature change for a tenfold change of D
// (FDA 2007 biological-indicator 510(k) guidance):
//
//	D(T) = D_ref · 10^((T_ref − T)/z)
//	T    = T_ref − z · (log10 D − log10 D_ref)
//
// ([DAt], [TemperatureAt], [EstimateAt]). Published check: D150 = 4.5 min
// with z = 10 °C gives D160 = 0.45 min.
//
// z from two points, and from D at two or more temperatures by least
// squares of log10 D on temperature ([ZFromTwo], [ZFit]; the FDA 2007
// guidance asks for D at three or more temperatures):
//
//	z = (T₂ − T₁) / (log10 D₁ − log10 D₂)
//	log10 D = b0 + b1·T,   z = −1/b1
//
// The slope's t interval [a, b] gives the z limits [−1/a, −1/b]; when b ≥ 0
// the upper limit is +Inf. The fitted D at a reference temperature and its
// limits are 10^ of the fitted mean and of its t interval. A weighted fit
// weights each point by
//
//	w = 1/se²,   se = (log10 Upper − log10 Lower) / (2·q),   q = Φ⁻¹(0.5 + Level/2)
//
// from that D's own limits, as relative weights (R's lm(weights = w)).
//
// Arrhenius equivalence, kelvin temperatures, R = 8.314462618 J/(mol·K)
// ([ActivationEnergy], [ZFromActivationEnergy]):
//
//	Ea = ln 10 · R · T₁ · T₂ / z
//
// It is an approximation: the two models agree exactly only on the ratio
// D(T₁)/D(T₂) at the two temperatures of the conversion.
//
// Survival–kill window (FDA 2007 BI 510(k) guidance; USP monographs for
// biological indicators), [SurvivalKill]:
//
//	survival time = (log10 N0 − 2) · D
//	kill time     = (log10 N0 + 4) · D
//
// [CheckWindow] compares a claimed window with it by the requirement of
// those texts: the claimed survival time is not less than the computed one
// and the claimed kill time not more than the computed one. The signed
// margins are reported, at the estimate and at the unfavourable end of D's
// limits. The example survival times in the FDA guidance's table are not
// derived from these formulas.
//
// # Label check
//
// [CheckLabel] compares a lot's measured results with its [Label] and gives
// one [Finding] per criterion: what was measured, the limit, pass, fail or
// not assessed, the limit's source and the set of limits it belongs to. A
// criterion whose data are missing is not assessed, never passed. Default
// limits and their status:
//
//	D within ±20 % of label; D limits within 10 % of D    USP, as quoted secondarily (verify)
//	population within 50–300 % of label                     common practice, no source
//	at least two D methods                                  ISO 11138-1, as quoted in Shintani 2014
//	window consistent with label D and each measured D      formulas as above; rule of CheckWindow
//	all units grow at survival time, none at kill time      FDA 2007, USP (from memory, verify)
//
// Optional minimum-performance profiles ([Profile]), each stating its status:
//
//	FDASteamProfile            FDA 2007 Table 3 (as quoted): 121 °C, ≥ 10⁵, D ≥ 1.5 min, z ≥ 10 °C
//	FDAEthyleneOxideProfile    FDA 2007 Table 3 (as quoted): ≥ 10⁶, D ≥ 3 min
//	FDADryHeatProfile          FDA 2007 Table 3 (as quoted): 160 °C, ≥ 10⁶, D ≥ 3 min
//	ISOMoistHeatProfile        ISO 11138-3 from memory (verify): 121 °C, ≥ 10⁵, D ≥ 1.5 min, z ≥ 6 °C
//
// Every limit is overridable through [Criteria] ([Limit] carries a value and
// its source). The report's [Summary] counts outcomes; it never says that a
// lot is accepted.
//
// # Units
//
// Minutes, degrees Celsius (kelvin only inside the Arrhenius conversion),
// base-10 logarithms unless a name says ln. Populations are log10 spores
// per unit ([Measured].Log10N0) except the label's, which is a count
// ([Label].Population) as certificates print it. Activation energies are
// J/mol.
//
// # Errors
//
// No exported function panics on any input. Every refusal wraps one of the
// sentinels ([ErrInvalidD], [ErrInvalidZ], [ErrInvalidTemperature],
// [ErrInvalidPopulation], [ErrInvalidTime], [ErrInvalidLevel],
// [ErrTooFewTemperatures], [ErrRisingD], [ErrInvalidWeight],
// [ErrInvalidEnergy], [ErrOutOfRange], [ErrInvalidCount],
// [ErrInvalidSetting], [ErrProfile]) with context naming the offending
// input; test with errors.Is. Soft problems (fewer than three temperatures,
// an unbounded limit, an extrapolated reference temperature) are warnings in
// the result. Results marshal to JSON with non-finite numbers written as
// "NaN", "+Inf" or "-Inf". Inputs are never modified.
//
// # References
//
//   - FDA (2007). Biological Indicator (BI) Premarket Notification [510(k)]
//     Submissions; Guidance for Industry and FDA Staff. z-value from D at
//     three or more temperatures; survival–kill window; Table 3 minimum
//     performance (quoted here secondarily).
//   - United States Pharmacopeia, monographs for biological indicators and
//     the chapter on their resistance performance tests (survival–kill
//     window; D agreement and limits, quoted secondarily).
//   - ISO 11138-1, Sterilization of health care products — Biological
//     indicators — Part 1: General requirements (two methods, as quoted in
//     Shintani H., 2014, Pharmaceutical Regulatory Affairs 3:2); ISO 11138-3,
//     Part 3: moist heat (minimums from memory, to be verified).
//   - t quantiles of the z limits: the Cornish–Fisher expansion
//     (Abramowitz, M. and Stegun, I. A., Handbook of Mathematical
//     Functions, 1964, formula 26.7.5) refined by Newton steps on the
//     regularized incomplete beta function; checked against R 4.2.2 qt to
//     12 significant digits (the survivor package shares it).
//
// # Cautions
//
// These numbers feed decisions about patient safety. The package computes;
// acceptance is decided by the laboratory's qualified people under the
// standards and regulations that apply to them. The limits quoted
// secondarily or from memory must be checked against the current texts
// before they are relied on.
package resistance
