package resistance

import (
	"encoding/json"
	"fmt"
	"math"
)

// Window is a survival–kill window: the exposure (minutes) after which every
// indicator unit should still show growth (Survival) and the exposure after
// which none should (Kill).
type Window struct {
	Survival float64 `json:"survival_time"`
	Kill     float64 `json:"kill_time"`
}

// SurvivalKill returns the survival–kill window of an indicator with
// population log10N0 (log10 spores per unit) and D-value d (minutes):
//
//	survival time = (log10 N0 − 2) · D
//	kill time     = (log10 N0 + 4) · D
//
// (FDA 2007 BI 510(k) guidance; USP monographs for biological indicators).
// At the survival time 10² spores per unit are expected to remain, at the
// kill time 10⁻⁴. The example survival times of the FDA guidance's table are
// not derived from these formulas.
//
// Special cases are:
//
//	d zero, negative, NaN or ±Inf: ErrInvalidD
//	log10N0 ≤ 2 (no survival time), NaN or ±Inf: ErrInvalidPopulation
//	a time that overflows, or a survival time that underflows (below the smallest normal float64): ErrOutOfRange
func SurvivalKill(log10N0, d float64) (Window, error) {
	if err := checkD("D", d); err != nil {
		return Window{}, err
	}
	if !finite(log10N0) || !(log10N0 > 2) {
		return Window{}, fmt.Errorf("log10 N0 %v (the survival time needs log10 N0 > 2): %w", log10N0, ErrInvalidPopulation)
	}
	w := Window{Survival: (log10N0 - 2) * d, Kill: (log10N0 + 4) * d}
	if !finite(w.Kill) || !representable(w.Survival) {
		return Window{}, fmt.Errorf("window for log10 N0 %g and D %g min: %w", log10N0, d, ErrOutOfRange)
	}
	return w, nil
}

// WindowCheck is the result of CheckWindow: how a claimed survival–kill
// window compares with the window computed from a D-value and population.
type WindowCheck struct {
	// Claim is the claimed window, Computed the window of SurvivalKill at
	// the D estimate's value.
	Claim    Window `json:"claim"`
	Computed Window `json:"computed"`
	// Log10N0 and D are the population and D-value the window was computed
	// from.
	Log10N0 float64  `json:"log10_n0"`
	D       Estimate `json:"d"`
	// SurvivalMargin is Claim.Survival − Computed.Survival and KillMargin is
	// Computed.Kill − Claim.Kill (minutes); both ≥ 0 is consistent.
	SurvivalMargin float64 `json:"survival_margin"`
	KillMargin     float64 `json:"kill_margin"`
	// Consistent reports whether both margins are ≥ 0 (within a relative
	// 1e-9 of the computed times, for rounding).
	Consistent bool `json:"consistent"`
	// LimitsGiven reports whether D has both limits (neither NaN).
	LimitsGiven bool `json:"limits_given"`
	// SurvivalMarginAtUpper is Claim.Survival − (log10 N0 − 2)·D.Upper and
	// KillMarginAtLower is (log10 N0 + 4)·D.Lower − Claim.Kill: the margins
	// at the unfavourable end of D's interval for each requirement. NaN
	// without limits; −Inf when the upper limit is +Inf.
	SurvivalMarginAtUpper float64 `json:"survival_margin_at_upper"`
	KillMarginAtLower     float64 `json:"kill_margin_at_lower"`
	// ConsistentAtLimits reports whether both margins at the limits are ≥ 0,
	// that is, the claim holds over D's whole interval (false without
	// limits).
	ConsistentAtLimits bool `json:"consistent_at_limits"`
	// Warnings lists doubts about the comparison.
	Warnings []string `json:"warnings,omitempty"`
}

type windowCheckJSON WindowCheck

// MarshalJSON implements json.Marshaler, writing the non-finite margins at
// the limits as "NaN", "+Inf" or "-Inf".
func (c WindowCheck) MarshalJSON() ([]byte, error) {
	return json.Marshal(struct {
		windowCheckJSON
		SurvivalMarginAtUpper jsonFloat `json:"survival_margin_at_upper"`
		KillMarginAtLower     jsonFloat `json:"kill_margin_at_lower"`
	}{windowCheckJSON(c), jsonFloat(c.SurvivalMarginAtUpper), jsonFloat(c.KillMarginAtLower)})
}

// UnmarshalJSON implements json.Unmarshaler, reading what MarshalJSON
// writes.
func (c *WindowCheck) UnmarshalJSON(b []byte) error {
	var v struct {
		windowCheckJSON
		SurvivalMarginAtUpper jsonFloat `json:"survival_margin_at_upper"`
		KillMarginAtLower     jsonFloat `json:"kill_margin_at_lower"`
	}
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*c = WindowCheck(v.windowCheckJSON)
	c.SurvivalMarginAtUpper, c.KillMarginAtLower = float64(v.SurvivalMarginAtUpper), float64(v.KillMarginAtLower)
	return nil
}

// notBelow reports whether margin ≥ 0, allowing a relative 1e-9 of scale for
// rounding of the claimed times.
func notBelow(margin, scale float64) bool {
	return margin >= 0 || (finite(margin) && finite(scale) && margin >= -1e-9*math.Abs(scale))
}

// CheckWindow compares a claimed survival–kill window with the one computed
// by SurvivalKill from the D estimate d and the population log10N0.
//
// The rule is the requirement of the FDA 2007 BI guidance and the USP
// monographs for biological indicators: the claimed survival time is not
// less than, and the claimed kill time not more than, the computed ones,
//
//	claimed survival ≥ (log10 N0 − 2) · D
//	claimed kill     ≤ (log10 N0 + 4) · D
//
// so that the window the indicator is sold with lies inside the one its
// resistance and population guarantee at the least. The margins are reported
// with their signs (≥ 0 meets the requirement). With D's limits, the claim is
// also compared at the unfavourable end of the interval for each
// requirement: survival at the upper limit, kill at the lower one.
//
// Special cases are:
//
//	claim.Survival not positive, claim.Kill not longer than claim.Survival, or either NaN or ±Inf: ErrInvalidTime
//	d.Value and log10N0 as in SurvivalKill: ErrInvalidD, ErrInvalidPopulation, ErrOutOfRange
func CheckWindow(claim Window, d Estimate, log10N0 float64) (WindowCheck, error) {
	if !finite(claim.Survival) || !(claim.Survival > 0) {
		return WindowCheck{}, fmt.Errorf("claimed survival time %v min: %w", claim.Survival, ErrInvalidTime)
	}
	if !finite(claim.Kill) || !(claim.Kill > claim.Survival) {
		return WindowCheck{}, fmt.Errorf("claimed kill time %v min (survival time %g min): %w", claim.Kill, claim.Survival, ErrInvalidTime)
	}
	computed, err := SurvivalKill(log10N0, d.Value)
	if err != nil {
		return WindowCheck{}, err
	}
	c := WindowCheck{
		Claim: claim, Computed: computed, Log10N0: log10N0, D: d,
		SurvivalMargin: claim.Survival - computed.Survival,
		KillMargin:     computed.Kill - claim.Kill,
	}
	c.Consistent = notBelow(c.SurvivalMargin, computed.Survival) && notBelow(c.KillMargin, computed.Kill)
	c.LimitsGiven = !math.IsNaN(d.Lower) && !math.IsNaN(d.Upper)
	if !c.LimitsGiven {
		c.SurvivalMarginAtUpper, c.KillMarginAtLower = math.NaN(), math.NaN()
		c.Warnings = append(c.Warnings, "D has no limits: the claim is compared at the estimate only")
		return c, nil
	}
	sHi, kLo := (log10N0-2)*d.Upper, (log10N0+4)*d.Lower
	c.SurvivalMarginAtUpper = claim.Survival - sHi
	c.KillMarginAtLower = kLo - claim.Kill
	c.ConsistentAtLimits = notBelow(c.SurvivalMarginAtUpper, sHi) && notBelow(c.KillMarginAtLower, kLo)
	if math.IsInf(d.Upper, 1) {
		c.Warnings = append(c.Warnings, "D's upper limit is +Inf: no survival time holds over the whole interval")
	}
	return c, nil
}

// String formats the comparison: claimed and computed windows, margins, and
// whether the claim is consistent at the estimate and over D's limits.
func (c WindowCheck) String() string {
	verdict := "inconsistent with D"
	if c.Consistent {
		verdict = "consistent with D"
	}
	s := fmt.Sprintf("claim %.4g–%.4g min, computed %.4g–%.4g min from D %.4g min and log10 N0 %.4g; margins %+.4g, %+.4g min: %s",
		c.Claim.Survival, c.Claim.Kill, c.Computed.Survival, c.Computed.Kill, c.D.Value, c.Log10N0, c.SurvivalMargin, c.KillMargin, verdict)
	switch {
	case !c.LimitsGiven:
	case c.ConsistentAtLimits:
		s += "; holds over D's limits"
	default:
		s += fmt.Sprintf("; not over D's limits (margins %+.4g, %+.4g min)", c.SurvivalMarginAtUpper, c.KillMarginAtLower)
	}
	for _, w := range c.Warnings {
		s += "\n  warning: " + w
	}
	return s
}
