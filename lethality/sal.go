package lethality

import (
	"fmt"
	"math"
	"strings"

	"github.com/dzf-go/dzf/resistance"
)

// Survival is the expected outcome of a process of lethality F on a
// population of N0 organisms per unit with decimal reduction time D.
//
//	LogReduction   = F / D
//	Log10Survivors = log10 N0 − F/D            (log10 N, N survivors per unit)
//	PNSU           = 1 − exp(−N)               (Poisson: P(at least one survivor))
//	Log10PNSU      = log10 PNSU, kept where PNSU underflows float64
//
// PNSU is 0 where it is below the smallest float64 (about 1e-308, or
// 5e-324 subnormal); Log10PNSU still holds it.
type Survival struct {
	Log10N0        float64 `json:"log10_n0"`
	F              float64 `json:"f"`
	D              float64 `json:"d"`
	LogReduction   float64 `json:"log_reduction"`
	Log10Survivors float64 `json:"log10_survivors"`
	PNSU           float64 `json:"pnsu"`
	Log10PNSU      float64 `json:"log10_pnsu"`
}

// String formats the survival on one line.
func (s Survival) String() string {
	return fmt.Sprintf("F %.4g min, D %.4g min: %.4g logs; log10 N %.4f, PNSU %.4g (log10 %.4f)",
		s.F, s.D, s.LogReduction, s.Log10Survivors, s.PNSU, s.Log10PNSU)
}

// Survivors returns the survival after a process of lethality f (minutes at
// the reference temperature) on log10N0 organisms per unit of decimal
// reduction time d (minutes, at the same reference temperature, for an
// organism whose z-value is the one F was computed with).
//
// It refuses non-finite arguments (ErrNonFinite), d ≤ 0 (ErrInvalidD), f < 0
// (ErrNegativeF) and an F/D that overflows float64 (ErrOverflow).
func Survivors(log10N0, f, d float64) (Survival, error) {
	if !finite(log10N0) || !finite(f) || !finite(d) {
		return Survival{}, fmt.Errorf("log10 N0 %g, F %g min, D %g min: %w", log10N0, f, d, ErrNonFinite)
	}
	if d <= 0 {
		return Survival{}, fmt.Errorf("survivors: D %g min: %w", d, ErrInvalidD)
	}
	if f < 0 {
		return Survival{}, fmt.Errorf("survivors: F %g min: %w", f, ErrNegativeF)
	}
	lr := f / d
	l := log10N0 - lr
	if !finite(lr) || !finite(l) {
		return Survival{}, fmt.Errorf("survivors: F %g min / D %g min: %w", f, d, ErrOverflow)
	}
	return Survival{Log10N0: log10N0, F: f, D: d, LogReduction: lr, Log10Survivors: l,
		PNSU: PNSU(l), Log10PNSU: Log10PNSU(l)}, nil
}

// PNSU returns the probability of a non-sterile unit, 1 − exp(−N), for
// log10N = log10 N expected survivors per unit, computed as −expm1(−N) so
// that small values keep their digits. Special cases are:
//
//	PNSU(log10N) = 0 where N underflows (log10N below about −323.3)
//	PNSU(log10N) = 1 where exp(−N) is below half an ulp of 1 (N > 37.4)
//	PNSU(+Inf) = 1, PNSU(-Inf) = 0, PNSU(NaN) = NaN
func PNSU(log10N float64) float64 {
	return -math.Expm1(-math.Pow(10, log10N))
}

// Log10PNSU returns log10 of the probability of a non-sterile unit,
// log10(1 − exp(−N)), for log10N = log10 N, accurate far below float64's
// range:
//
//	log10N < −17:        log10N + log1p(−N/2)/ln10   (the correction is below
//	                     1e-17 absolute; N is not needed where it underflows)
//	−17 ≤ log10N ≤ log10(ln 2): log10(−expm1(−N))
//	log10N > log10(ln 2):       log1p(−exp(−N))/ln10  (near 0, no cancellation)
//
// Special cases are: Log10PNSU(+Inf) = 0, Log10PNSU(-Inf) = -Inf,
// Log10PNSU(NaN) = NaN.
func Log10PNSU(log10N float64) float64 {
	switch {
	case math.IsNaN(log10N):
		return math.NaN()
	case log10N < -17:
		// 1 − e^(−N) = N(1 − N/2 + N²/6 − …); beyond N/2 the terms are
		// below 1e-34 relative. Pow underflows to 0 where N is tiny, which
		// is then exact to float64 precision.
		return log10N + math.Log1p(-0.5*math.Pow(10, log10N))/math.Ln10
	case log10N <= log10Ln2:
		return math.Log10(-math.Expm1(-math.Pow(10, log10N)))
	}
	return math.Log1p(-math.Exp(-math.Pow(10, log10N))) / math.Ln10
}

// log10Ln2 is log10(ln 2), where PNSU = 1/2 (Python mpmath 1.2.1:
// mpmath.log10(mpmath.log(2)) at 40 digits).
const log10Ln2 = -0.15917453895486159

// Log10SurvivorsForPNSU returns log10 N, the expected survivors per unit,
// that gives the probability of a non-sterile unit 10^log10PNSU: N =
// −ln(1 − PNSU). It refuses log10PNSU ≥ 0 or NaN (ErrInvalidProbability).
// Below 10⁻¹⁷ the two logs are equal to float64 precision.
func Log10SurvivorsForPNSU(log10PNSU float64) (float64, error) {
	if math.IsNaN(log10PNSU) || log10PNSU >= 0 {
		return 0, fmt.Errorf("log10 PNSU %g: %w", log10PNSU, ErrInvalidProbability)
	}
	if log10PNSU < -17 {
		// −ln(1 − p) = p(1 + p/2 + …)
		return log10PNSU + math.Log1p(0.5*math.Pow(10, log10PNSU))/math.Ln10, nil
	}
	return math.Log10(-math.Log1p(-math.Pow(10, log10PNSU))), nil
}

// RequiredF returns the lethality (minutes at the reference temperature)
// that brings log10N0 organisms per unit of decimal reduction time d down to
// log10SAL:
//
//	F = D · (log10 N0 − log10 SAL)
//
// log10SAL is read as log10 N, the expected survivors per unit (the usual
// "SAL 10⁻⁶ = 10⁻⁶ survivors per unit" reading, as in the reference-case
// method lethality.required_f). Read as a probability of a non-sterile unit
// it differs by less than 10^log10SAL/2 relative; convert with
// Log10SurvivorsForPNSU to use that reading.
//
// It refuses non-finite arguments (ErrNonFinite), d ≤ 0 (ErrInvalidD),
// log10SAL ≥ log10N0 (ErrNothingToKill) and an F that overflows
// (ErrOverflow).
func RequiredF(log10N0, d, log10SAL float64) (float64, error) {
	if !finite(log10N0) || !finite(d) || !finite(log10SAL) {
		return 0, fmt.Errorf("log10 N0 %g, D %g min, log10 SAL %g: %w", log10N0, d, log10SAL, ErrNonFinite)
	}
	if d <= 0 {
		return 0, fmt.Errorf("required F: D %g min: %w", d, ErrInvalidD)
	}
	if log10SAL >= log10N0 {
		return 0, fmt.Errorf("log10 SAL %g ≥ log10 N0 %g: %w", log10SAL, log10N0, ErrNothingToKill)
	}
	f := d * (log10N0 - log10SAL)
	if !finite(f) {
		return 0, fmt.Errorf("required F: D %g min × %g logs: %w", d, log10N0-log10SAL, ErrOverflow)
	}
	return f, nil
}

// Assessment gives a survival figure for a D-value with confidence limits:
// Central uses the estimate's Value, Conservative its Upper limit (a more
// resistant organism, so fewer logs and a higher PNSU). Conservative is nil
// when the estimate has no finite upper limit; Warnings says so.
type Assessment struct {
	D            resistance.Estimate `json:"d"`
	Central      Survival            `json:"central"`
	Conservative *Survival           `json:"conservative,omitempty"`
	Warnings     []string            `json:"warnings,omitempty"`
}

// String formats the assessment on two lines, followed by its warnings.
func (a Assessment) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "central (D %.4g min): %v", a.Central.D, a.Central)
	if a.Conservative != nil {
		fmt.Fprintf(&b, "\nconservative (D upper %.4g min): %v", a.Conservative.D, *a.Conservative)
	}
	for _, w := range a.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// Assess returns the survival after lethality f for log10N0 organisms per
// unit with the D-value estimate d, at the estimate's value and at its
// upper limit. The estimate's warnings are carried over. It refuses what
// Survivors refuses for the central value.
func Assess(log10N0, f float64, d resistance.Estimate) (Assessment, error) {
	c, err := Survivors(log10N0, f, d.Value)
	if err != nil {
		return Assessment{}, fmt.Errorf("central D: %w", err)
	}
	a := Assessment{D: d, Central: c}
	for _, w := range d.Warnings {
		a.Warnings = append(a.Warnings, "D estimate: "+w)
	}
	switch {
	case math.IsNaN(d.Upper) || math.IsInf(d.Upper, 0):
		a.Warnings = append(a.Warnings, fmt.Sprintf("the D estimate has no finite upper limit (%g): no conservative figure", d.Upper))
	case d.Upper < d.Value:
		a.Warnings = append(a.Warnings, fmt.Sprintf("the D upper limit %g is below the D value %g: no conservative figure", d.Upper, d.Value))
	default:
		u, err := Survivors(log10N0, f, d.Upper)
		if err != nil {
			return Assessment{}, fmt.Errorf("upper D: %w", err)
		}
		a.Conservative = &u
	}
	return a, nil
}

// Requirement is the lethality needed to reach a target, at the central D
// and at its upper limit, with the exposure that delivers it at a stated
// temperature.
type Requirement struct {
	Log10N0  float64             `json:"log10_n0"`
	Log10SAL float64             `json:"log10_sal"`
	D        resistance.Estimate `json:"d"`
	// F is the required lethality (minutes at the reference temperature) at
	// the central D; FConservative at D's upper limit (0 when there is
	// none: see Warnings).
	F             float64 `json:"f"`
	FConservative float64 `json:"f_conservative"`
	// Celsius is the exposure temperature; Minutes and MinutesConservative
	// the exposure at it that delivers F and FConservative.
	Celsius             float64   `json:"celsius"`
	Minutes             float64   `json:"minutes"`
	MinutesConservative float64   `json:"minutes_conservative"`
	Reference           Reference `json:"reference"`
	Warnings            []string  `json:"warnings,omitempty"`
}

// String formats the requirement on one line, followed by its warnings.
func (r Requirement) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "from log10 N0 %.4g to log10 SAL %.4g: F %.4g min (conservative %.4g); at %.4g °C %.4g min (conservative %.4g)",
		r.Log10N0, r.Log10SAL, r.F, r.FConservative, r.Celsius, r.Minutes, r.MinutesConservative)
	for _, w := range r.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// Require returns the lethality and the exposure at celsius needed to bring
// log10N0 organisms per unit with D-value estimate d down to log10SAL
// (read as log10 survivors per unit, see RequiredF), at the central D and at
// its upper limit. It refuses what RequiredF and EquivalentMinutes refuse
// for the central value.
func Require(log10N0, log10SAL float64, d resistance.Estimate, celsius float64, ref Reference) (Requirement, error) {
	f, err := RequiredF(log10N0, d.Value, log10SAL)
	if err != nil {
		return Requirement{}, fmt.Errorf("central D: %w", err)
	}
	m, err := EquivalentMinutes(f, celsius, ref)
	if err != nil {
		return Requirement{}, err
	}
	r := Requirement{Log10N0: log10N0, Log10SAL: log10SAL, D: d, F: f, Celsius: celsius, Minutes: m, Reference: ref}
	for _, w := range d.Warnings {
		r.Warnings = append(r.Warnings, "D estimate: "+w)
	}
	if !finite(d.Upper) || d.Upper < d.Value {
		r.Warnings = append(r.Warnings, fmt.Sprintf("the D estimate has no usable upper limit (%g): no conservative figure", d.Upper))
		return r, nil
	}
	fc, err := RequiredF(log10N0, d.Upper, log10SAL)
	if err != nil {
		return Requirement{}, fmt.Errorf("upper D: %w", err)
	}
	mc, err := EquivalentMinutes(fc, celsius, ref)
	if err != nil {
		return Requirement{}, fmt.Errorf("upper D: %w", err)
	}
	r.FConservative, r.MinutesConservative = fc, mc
	return r, nil
}
