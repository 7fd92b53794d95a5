// Package lethality computes the lethality of sterilization processes: lethal
// rates, F-values from temperature records of one or many probes, cycle
// phases, survivors, the probability of a non-sterile unit (PNSU) and the
// sterility assurance level (SAL), overkill and half-cycle arguments.
//
// # Model
//
// The lethal rate at temperature T against a reference temperature T_ref and
// a z-value z, and the lethality of an exposure T(t):
//
//	L(T) = 10^((T − T_ref)/z)
//	F    = ∫ L(T(t)) dt                        (minutes at T_ref)
//
// From a record of samples (tᵢ, Tᵢ), with Lᵢ = L(Tᵢ), three rules (see
// [Rule]):
//
//	rectangle  F = Σ Lᵢ (tᵢ₊₁ − tᵢ)                       left rule, error O(h)
//	trapezoid  F = Σ (Lᵢ + Lᵢ₊₁)/2 · (tᵢ₊₁ − tᵢ)          error O(h²)
//	exact      F = Σ (tᵢ₊₁ − tᵢ)(Lᵢ₊₁ − Lᵢ)/ln(Lᵢ₊₁/Lᵢ)  exact for T linear between samples
//
// with ln(Lᵢ₊₁/Lᵢ) = (Tᵢ₊₁ − Tᵢ)·ln10/z, so that no logarithm is needed, and
// the series of expm1(x)/x where that step is small. First-order
// inactivation then gives, for N0 organisms per unit of decimal reduction
// time D (minutes at T_ref, for an organism whose z is the z of F):
//
//	log reduction = F / D
//	log10 N       = log10 N0 − F/D               (expected survivors per unit)
//	PNSU          = 1 − exp(−N)                  (Poisson: P(unit holds ≥ 1 survivor))
//	F required    = D · (log10 N0 − log10 SAL)
//	exposure at T = F / L(T) = F · 10^((T_ref − T)/z)
//
// PNSU is computed as −expm1(−N); its log10 ([Log10PNSU]) is kept far below
// float64's range (log10 PNSU ≈ log10 N − N/(2 ln10) for tiny N, computed from
// log10 N without forming N). [RequiredF] reads log10 SAL as log10 N, the
// expected survivors per unit, as the reference-case method
// lethality.required_f does; read as a probability it differs by less than
// SAL/2 relative ([Log10SurvivorsForPNSU] converts).
//
// # Units
//
// Minutes, degrees Celsius (logger files in °F are converted by setting),
// base-10 logarithms unless a name says ln. Counts are per unit.
//
// # References and presets
//
// The presets are plain [Reference] values; change their fields where the
// governing text differs:
//
//	MoistHeat()      F0  121.1 °C, z 10 °C   common definition (from memory of Ph. Eur. 5.1.5)
//	MoistHeat121()   F0  121 °C,   z 10 °C   as some pharmacopoeial texts define it
//	DryHeat()        FH  170 °C,   z 20 °C   from memory — verify
//	Depyrogenation() FD  250 °C,   z 46.4 °C from memory, for endotoxin — verify
//
// Worked values used in the tests: L(111.1 °C) = 0.1 and L(101.1 °C) = 0.01
// at z 10 °C against 121.1 °C (German Wikipedia, "Letalitätswert"); with
// T_ref 121 °C, 15 min at 111 °C equal 1.5 min at 121 °C (closed form).
//
// # Cycles
//
// [Cycle] analyses a multi-probe [Record]: F per probe and the cold spot
// (smallest F); for a sterilization temperature T_s and a band from T_s to
// T_s + [DefaultBand] (3 °C: from memory of the common steam-sterilizer
// standard — verify; overridable), each probe's time at or above T_s, the
// equilibration time (first probe reaching T_s to the last), the hold (the
// first period with every probe at or above T_s), the extremes and the spread
// between probes during the hold, and whether the hold stayed in the band.
// Temperatures are taken as linear between samples, so crossing times are
// interpolated.
//
// # Overkill and half cycle
//
// [Overkill] checks F/D against a target: by default at least 12 logs of an
// organism with D = 1 min (the common definition of overkill: a 12-log
// reduction of organisms with D ≥ 1 min). [HalfCycle] credits the full cycle
// with at least twice the reduction a half cycle demonstrates by
// inactivating every indicator (half-cycle reasoning as described in a
// Pharmaceutical Technology article on overkill validation). Arithmetic
// check: with D121 = 1.5 min, 6 logs take 9 min at 121 °C and 12 logs 18 min.
// [Compare] sets the bioburden approach (the product's own bioburden and
// resistance) beside the indicator-based figure. Figures from a D estimate
// with limits ([Assess], [Require]) are given at the estimate's value and,
// conservatively, at its upper limit.
//
// # Logger files
//
// [Reader] and [ReadRecord] read CSV exports: a header (time column, then one
// column per probe), comma, semicolon or tab delimiters (detected or set),
// time in seconds, minutes or RFC 3339 timestamps (a numeric time column
// needs its unit stated: the reader never guesses), °C or °F, '#' comment
// lines. Problems are [ParseError] values with the line and column,
// wrapping sentinels. [StreamF] integrates every probe of a file of any
// length in bounded memory; an [Accumulator] does the same for samples fed
// one at a time from any source, and gives the same F as [F].
//
// # Accuracy
//
// The exact rule is exact for piecewise-linear temperatures to about 1e-13
// relative at worst (tested to 1e-12 on ramps against the closed form); the lethal
// rate inside F comes from a table-and-polynomial 2^w within about 2 ulp of
// math.Exp2, and sums are compensated. The rectangle and trapezoid rules
// carry their discretisation error (order h and h²), which no arithmetic
// removes: prefer the exact rule.
//
// # Sources
//
//   - F0, lethal rate and the 121.1 °C / z 10 °C convention: common
//     definition; worked rates from German Wikipedia, article
//     "Letalitätswert".
//   - Reference temperature 121 °C: as some pharmacopoeial texts define F0.
//   - Dry heat 170 °C / z 20 °C, depyrogenation 250 °C / z 46.4 °C, the
//     band of 3 °C above the sterilization temperature: from memory —
//     verify against the governing texts.
//   - PNSU as the Poisson probability 1 − exp(−N); SAL 10⁻⁶ as the usual
//     target (European Pharmacopoeia 5.1.1).
//   - Overkill (12 logs of organisms with D ≥ 1 min): common definition.
//     Half-cycle credit: Pharmaceutical Technology article on overkill
//     validation.
//
// # Errors
//
// Every error wraps an exported sentinel (ErrTimeOrder, ErrNonFinite, …;
// test with errors.Is) and names the offending sample, row, line, column or
// probe. Nothing is bridged or dropped silently: an interval longer than
// FSettings.MaxGap is an error, or, if the caller asks, a warning with the
// interval listed; a blank or unreadable cell is an error, or, if the caller
// asks, a missing cell (NaN) that is listed, and that Cycle refuses unless
// told to bridge it (then listed and warned about again). No exported
// function panics, and none modifies its arguments.
//
// # Cautions
//
// These numbers feed decisions about patient safety. The package computes;
// acceptance of a process is decided by the laboratory's qualified people
// under the standards and regulations that apply to them. An F-value is only
// as good as the temperature record (probe calibration, placement, logging
// interval); F/D is meaningful only when D is at the reference temperature
// and the organism's z equals the z of F; first-order kinetics is a model,
// and tailing survivor curves make extrapolated PNSU values optimistic. The
// presets marked "from memory" must be checked against the governing texts.
package lethality
