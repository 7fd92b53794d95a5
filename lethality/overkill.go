package lethality

import (
	"fmt"
	"strings"
)

// OverkillSettings configures Overkill and HalfCycle. A nil *OverkillSettings
// and every zero field mean the defaults.
type OverkillSettings struct {
	// D is the decimal reduction time (minutes at the reference temperature)
	// of the organism the claim is made for; default 1 min.
	D float64 `json:"d,omitempty"`
	// TargetLogs is the reduction the claim requires; default 12.
	TargetLogs float64 `json:"target_logs,omitempty"`
}

// The overkill defaults: at least a 12-log reduction of an organism with
// D ≥ 1 min (the common definition of an overkill process).
const (
	DefaultOverkillD    = 1.0
	DefaultOverkillLogs = 12.0
)

func (s *OverkillSettings) resolve() (d, target float64, err error) {
	d, target = DefaultOverkillD, DefaultOverkillLogs
	if s != nil {
		if s.D != 0 {
			d = s.D
		}
		if s.TargetLogs != 0 {
			target = s.TargetLogs
		}
	}
	if !finite(d) || d <= 0 {
		return 0, 0, fmt.Errorf("overkill D %g min: %w", d, ErrInvalidD)
	}
	if !finite(target) || target <= 0 {
		return 0, 0, fmt.Errorf("overkill target %g logs: %w", target, ErrInvalidSetting)
	}
	return d, target, nil
}

// OverkillResult says whether a lethality meets an overkill claim.
type OverkillResult struct {
	F            float64 `json:"f"`
	D            float64 `json:"d"`
	LogReduction float64 `json:"log_reduction"`
	TargetLogs   float64 `json:"target_logs"`
	// RequiredF is D × TargetLogs, the least F that meets the claim.
	RequiredF float64 `json:"required_f"`
	Meets     bool    `json:"meets"`
}

// String formats the result on one line.
func (r OverkillResult) String() string {
	verdict := "meets"
	if !r.Meets {
		verdict = "does not meet"
	}
	return fmt.Sprintf("F %.4g min, D %.4g min: %.4g logs, %s the %.4g-log target (needs F ≥ %.4g min)",
		r.F, r.D, r.LogReduction, verdict, r.TargetLogs, r.RequiredF)
}

// Overkill reports whether lethality f (minutes at the reference
// temperature) gives at least the target reduction, F/D ≥ TargetLogs, for
// an organism of decimal reduction time D: by default 12 logs of an
// organism with D = 1 min (the common definition of overkill: a 12-log
// reduction of organisms with D ≥ 1 min). It refuses a non-finite or
// negative f and invalid settings.
func Overkill(f float64, s *OverkillSettings) (OverkillResult, error) {
	d, target, err := s.resolve()
	if err != nil {
		return OverkillResult{}, err
	}
	if !finite(f) {
		return OverkillResult{}, fmt.Errorf("overkill: F %g min: %w", f, ErrNonFinite)
	}
	if f < 0 {
		return OverkillResult{}, fmt.Errorf("overkill: F %g min: %w", f, ErrNegativeF)
	}
	lr := f / d
	if !finite(lr) {
		return OverkillResult{}, fmt.Errorf("overkill: F %g min / D %g min: %w", f, d, ErrOverflow)
	}
	return OverkillResult{F: f, D: d, LogReduction: lr, TargetLogs: target, RequiredF: d * target, Meets: lr >= target}, nil
}

// HalfCycleStudy is the outcome of a half-length exposure of biological
// indicators: Units indicators of Log10N0 organisms each, of which Negative
// showed no growth. HalfMinutes is the half cycle's exposure time (minutes;
// 0 when not given).
type HalfCycleStudy struct {
	Log10N0     float64 `json:"log10_n0"`
	Units       int     `json:"units"`
	Negative    int     `json:"negative"`
	HalfMinutes float64 `json:"half_minutes,omitempty"`
}

// HalfCycleResult is the reduction a half-cycle study credits to the full
// cycle.
type HalfCycleResult struct {
	Study HalfCycleStudy `json:"study"`
	// Inactivated is true when every indicator was negative.
	Inactivated bool `json:"inactivated"`
	// HalfLogs is the reduction shown by the half cycle (at least
	// log10 N0 when all indicators were inactivated, else 0: no credit);
	// FullLogs the reduction credited to the full cycle, 2 × HalfLogs.
	HalfLogs    float64 `json:"half_logs"`
	FullLogs    float64 `json:"full_logs"`
	FullMinutes float64 `json:"full_minutes,omitempty"`
	TargetLogs  float64 `json:"target_logs"`
	Meets       bool    `json:"meets"`
	// ImpliedMaxD is the largest D (minutes of the half-cycle exposure per
	// log) consistent with the result, HalfMinutes / log10 N0; 0 when
	// HalfMinutes is not given or there is no credit.
	ImpliedMaxD float64  `json:"implied_max_d,omitempty"`
	Warnings    []string `json:"warnings,omitempty"`
}

// String formats the result on one line, followed by its warnings.
func (r HalfCycleResult) String() string {
	var b strings.Builder
	if r.Inactivated {
		fmt.Fprintf(&b, "half cycle inactivated %d/%d indicators of 10^%.4g: ≥ %.4g logs; full cycle credited ≥ %.4g logs",
			r.Study.Negative, r.Study.Units, r.Study.Log10N0, r.HalfLogs, r.FullLogs)
	} else {
		fmt.Fprintf(&b, "half cycle left %d of %d indicators positive: no credit", r.Study.Units-r.Study.Negative, r.Study.Units)
	}
	if r.Meets {
		fmt.Fprintf(&b, " (meets the %.4g-log target)", r.TargetLogs)
	} else {
		fmt.Fprintf(&b, " (does not meet the %.4g-log target)", r.TargetLogs)
	}
	for _, w := range r.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// HalfCycle credits a full cycle from a half-cycle study: when a half-length
// exposure inactivates every indicator of a population N0, the half cycle
// delivered at least log10 N0 logs and the full cycle, twice as long, is
// credited with at least twice that reduction; with 10⁶ indicators, about
// 12 logs or more (the half-cycle reasoning of overkill validation, as
// described in a Pharmaceutical Technology article on overkill validation).
// Meets compares the credit with the target of s (default 12 logs). The
// credit assumes first-order kinetics and a full cycle that delivers at
// least twice the half cycle's lethality; a positive indicator after the
// half cycle earns no credit.
//
// HalfCycle refuses units < 1, negatives outside 0…units, a non-finite or
// non-positive log10 N0, and a negative or non-finite half time
// (ErrInvalidStudy), and invalid settings.
func HalfCycle(study HalfCycleStudy, s *OverkillSettings) (HalfCycleResult, error) {
	_, target, err := s.resolve()
	if err != nil {
		return HalfCycleResult{}, err
	}
	switch {
	case study.Units < 1 || study.Negative < 0 || study.Negative > study.Units:
		return HalfCycleResult{}, fmt.Errorf("%d negative of %d units: %w", study.Negative, study.Units, ErrInvalidStudy)
	case !finite(study.Log10N0) || study.Log10N0 <= 0:
		return HalfCycleResult{}, fmt.Errorf("log10 N0 %g: %w", study.Log10N0, ErrInvalidStudy)
	case !finite(study.HalfMinutes) || study.HalfMinutes < 0:
		return HalfCycleResult{}, fmt.Errorf("half-cycle time %g min: %w", study.HalfMinutes, ErrInvalidStudy)
	}
	r := HalfCycleResult{Study: study, TargetLogs: target, FullMinutes: 2 * study.HalfMinutes}
	if study.Negative < study.Units {
		r.Warnings = append(r.Warnings, fmt.Sprintf("%d of %d indicators grew after the half cycle: the study credits no reduction", study.Units-study.Negative, study.Units))
		return r, nil
	}
	r.Inactivated = true
	r.HalfLogs = study.Log10N0
	r.FullLogs = 2 * study.Log10N0
	r.Meets = r.FullLogs >= target
	if study.HalfMinutes > 0 {
		r.ImpliedMaxD = study.HalfMinutes / study.Log10N0
	}
	return r, nil
}
