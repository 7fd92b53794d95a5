package resistance

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"
)

// Label is what an indicator lot's label or certificate states. A zero
// number means the label does not state it (no stated population, D, z or
// time is zero).
type Label struct {
	Supplier string   `json:"supplier,omitempty"`
	Product  string   `json:"product,omitempty"`
	Lot      string   `json:"lot,omitempty"`
	Organism string   `json:"organism,omitempty"`
	Modality Modality `json:"modality,omitempty"`
	// Population is the labelled population, spores per unit (a count, not
	// its log).
	Population float64 `json:"population"`
	// D is the labelled D-value (minutes) at Celsius.
	D float64 `json:"d"`
	// Celsius is the temperature (°C) at which the label states D and the
	// window, and at which the measured D-values were determined.
	Celsius float64 `json:"celsius"`
	// Z is the labelled z-value (°C).
	Z float64 `json:"z"`
	// SurvivalTime and KillTime are the labelled survival–kill window
	// (minutes) at Celsius.
	SurvivalTime float64 `json:"survival_time"`
	KillTime     float64 `json:"kill_time"`
}

// UnitTest is the outcome of exposing indicator units for a fixed time and
// incubating them: Growth of the Units showed growth.
type UnitTest struct {
	Minutes float64 `json:"minutes"`
	Units   int     `json:"units"`
	Growth  int     `json:"growth"`
}

// Measured holds the laboratory's results for a lot, every one determined at
// the label's conditions. A nil pointer or an empty slice means not
// measured.
type Measured struct {
	// Log10N0 is the measured population, log10 spores per unit, with its
	// limits.
	Log10N0 *Estimate `json:"log10_n0,omitempty"`
	// D holds one D-value estimate per method (survivor curve, HSK, …), each
	// naming its method in Method.
	D []Estimate `json:"d,omitempty"`
	// Z is the measured z-value (°C).
	Z *Estimate `json:"z,omitempty"`
	// SurvivalTest is the test at the survival time (every unit should
	// grow), KillTest the test at the kill time (no unit should grow).
	SurvivalTest *UnitTest `json:"survival_test,omitempty"`
	KillTest     *UnitTest `json:"kill_test,omitempty"`
}

// Limit is one overridable limit of a label check: a value and the source it
// comes from. A zero Value means the default, with the default's source; a
// Value given without a Source is reported as a laboratory setting with no
// source.
type Limit struct {
	Value  float64 `json:"value"`
	Source string  `json:"source,omitempty"`
}

// Criteria configures CheckLabel. A nil *Criteria, or a zero field, means
// the default, documented per field; DefaultCriteria returns them filled in.
type Criteria struct {
	// DAgreement is the largest relative difference of a measured D from the
	// labelled D: default 0.20 (±20 %; USP, as quoted secondarily).
	DAgreement Limit `json:"d_agreement"`
	// DLimits is the largest relative distance of a measured D's limits from
	// that D (Estimate.RelativeHalfWidth): default 0.10 (USP, as quoted
	// secondarily).
	DLimits Limit `json:"d_limits"`
	// PopulationLow and PopulationHigh bound the measured population as a
	// fraction of the labelled one: default 0.5 and 3.0 (50–300 %; common
	// practice, no source).
	PopulationLow  Limit `json:"population_low"`
	PopulationHigh Limit `json:"population_high"`
	// DMethods is the least number of distinct D methods: default 2
	// (ISO 11138-1, as quoted in Shintani 2014).
	DMethods Limit `json:"d_methods"`
	// ZAgreement is the largest relative difference of the measured z from
	// the labelled z. It has no published default: zero leaves the
	// criterion out.
	ZAgreement Limit `json:"z_agreement"`
	// Profile, when not nil, adds the minimums of a minimum-performance
	// profile (FDASteamProfile and the others, or the laboratory's own).
	Profile *Profile `json:"profile,omitempty"`
}

// Sources of the default limits, as the report writes them.
const (
	SourceUSP        = "USP, as quoted secondarily; not checked against the current monograph"
	SourcePopulation = "common practice, no source"
	SourceISOMethods = "ISO 11138-1, as quoted in Shintani 2014, Pharmaceut Reg Affairs 3:2"
	SourceWindow     = "formulas: FDA 2007 BI 510(k) guidance, USP monographs for biological indicators; consistency rule of this package (CheckWindow)"
	SourceUnitTest   = "survival–kill test (FDA 2007 BI 510(k) guidance, USP monographs for biological indicators): all units grow at the survival time, none at the kill time; from memory — verify"
	SourceNone       = "laboratory setting, no source given"
)

// Where a limit came from, as Finding.Profile names it.
const (
	FromDefault    = "default criteria"
	FromLaboratory = "laboratory setting"
)

// DefaultCriteria returns the default criteria of CheckLabel, every limit
// filled in with its source, no ZAgreement and no profile.
func DefaultCriteria() Criteria {
	return Criteria{
		DAgreement:     Limit{0.20, SourceUSP},
		DLimits:        Limit{0.10, SourceUSP},
		PopulationLow:  Limit{0.5, SourcePopulation},
		PopulationHigh: Limit{3.0, SourcePopulation},
		DMethods:       Limit{2, SourceISOMethods},
	}
}

// Outcome is the result of one criterion.
type Outcome string

// Outcomes of a criterion.
const (
	Pass        Outcome = "pass"
	Fail        Outcome = "fail"
	NotAssessed Outcome = "not assessed"
)

// Summary sums up a report's outcomes. It never says that a lot is accepted:
// that is the laboratory's decision.
type Summary string

// Summaries of a report.
const (
	AllPassed    Summary = "every criterion was assessed and passed"
	NoneFailed   Summary = "no assessed criterion failed; some were not assessed"
	SomeFailed   Summary = "some criteria failed"
	NoneAssessed Summary = "no criterion could be assessed"
)

// Caution is the note every report carries.
const Caution = "These numbers feed decisions about patient safety. This report compares measurements with limits; " +
	"whether the lot is fit for use is decided by the laboratory's qualified people under the standards and regulations that apply to them."

// Finding is one line of a label-check report.
type Finding struct {
	// Criterion names what is checked, Subject what it is checked on (a D
	// method's name, "label" or "measured"), when there are several.
	Criterion string `json:"criterion"`
	Subject   string `json:"subject,omitempty"`
	// Measured describes the measured value, Value is the number compared
	// with the limit (NaN when not assessed), Limit describes the limit.
	Measured string  `json:"measured"`
	Value    float64 `json:"value"`
	Limit    string  `json:"limit"`
	Outcome  Outcome `json:"outcome"`
	// Note explains a "not assessed" outcome, or adds what the outcome does
	// not show.
	Note string `json:"note,omitempty"`
	// Source is where the limit comes from; Profile names the set of limits
	// it belongs to (FromDefault, FromLaboratory or a Profile's Name).
	Source  string `json:"source"`
	Profile string `json:"profile"`
}

type findingJSON Finding

// MarshalJSON implements json.Marshaler, writing a non-finite Value as
// "NaN", "+Inf" or "-Inf".
func (f Finding) MarshalJSON() ([]byte, error) {
	return json.Marshal(struct {
		findingJSON
		Value jsonFloat `json:"value"`
	}{findingJSON(f), jsonFloat(f.Value)})
}

// UnmarshalJSON implements json.Unmarshaler, reading what MarshalJSON
// writes.
func (f *Finding) UnmarshalJSON(b []byte) error {
	var v struct {
		findingJSON
		Value jsonFloat `json:"value"`
	}
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*f = Finding(v.findingJSON)
	f.Value = float64(v.Value)
	return nil
}

// Report is the result of CheckLabel.
type Report struct {
	Label    Label     `json:"label"`
	Findings []Finding `json:"findings"`
	// Passed, Failed and NotAssessed count the findings by outcome.
	Passed      int     `json:"passed"`
	Failed      int     `json:"failed"`
	NotAssessed int     `json:"not_assessed"`
	Summary     Summary `json:"summary"`
	// Warnings lists doubts carried by the measurements (their own
	// warnings) and about the inputs.
	Warnings []string `json:"warnings,omitempty"`
	Caution  string   `json:"caution"`
}

// limit is a resolved limit: value, source and where it came from.
type limit struct {
	value        float64
	source, from string
}

func resolve(name string, l Limit, def float64, defSource string) (limit, error) {
	if !finite(l.Value) || l.Value < 0 {
		return limit{}, fmt.Errorf("%s %v: %w", name, l.Value, ErrInvalidSetting)
	}
	if l.Value == 0 {
		return limit{def, defSource, FromDefault}, nil
	}
	src := l.Source
	if strings.TrimSpace(src) == "" {
		src = SourceNone
	}
	return limit{l.Value, src, FromLaboratory}, nil
}

type criteria struct {
	dAgree, dLimits, popLow, popHigh, dMethods, zAgree limit
	profile                                            *Profile
}

func resolveCriteria(c *Criteria) (criteria, error) {
	if c == nil {
		c = &Criteria{}
	}
	d := DefaultCriteria()
	var r criteria
	var err error
	for _, x := range []struct {
		name string
		in   Limit
		def  Limit
		out  *limit
	}{
		{"D agreement", c.DAgreement, d.DAgreement, &r.dAgree},
		{"D limits", c.DLimits, d.DLimits, &r.dLimits},
		{"population low", c.PopulationLow, d.PopulationLow, &r.popLow},
		{"population high", c.PopulationHigh, d.PopulationHigh, &r.popHigh},
		{"D methods", c.DMethods, d.DMethods, &r.dMethods},
		{"z agreement", c.ZAgreement, Limit{0, SourceNone}, &r.zAgree},
	} {
		if *x.out, err = resolve(x.name, x.in, x.def.Value, x.def.Source); err != nil {
			return r, err
		}
	}
	if !(r.popLow.value < r.popHigh.value) {
		return r, fmt.Errorf("population range %g–%g: %w", r.popLow.value, r.popHigh.value, ErrInvalidSetting)
	}
	if n := r.dMethods.value; n != math.Trunc(n) || n < 1 || n > 1e6 {
		return r, fmt.Errorf("number of D methods %g: %w", n, ErrInvalidSetting)
	}
	if c.Profile != nil {
		p := *c.Profile
		r.profile = &p
	}
	return r, nil
}

func checkLabelValues(l Label) error {
	nonNeg := func(name string, v float64, sentinel error) error {
		if !finite(v) || v < 0 {
			return fmt.Errorf("label %s %v: %w", name, v, sentinel)
		}
		return nil
	}
	if err := nonNeg("population", l.Population, ErrInvalidPopulation); err != nil {
		return err
	}
	if err := nonNeg("D", l.D, ErrInvalidD); err != nil {
		return err
	}
	if err := checkCelsius("label temperature", l.Celsius); err != nil {
		return err
	}
	if err := nonNeg("z", l.Z, ErrInvalidZ); err != nil {
		return err
	}
	if err := nonNeg("survival time", l.SurvivalTime, ErrInvalidTime); err != nil {
		return err
	}
	if err := nonNeg("kill time", l.KillTime, ErrInvalidTime); err != nil {
		return err
	}
	if l.SurvivalTime > 0 && l.KillTime > 0 && !(l.KillTime > l.SurvivalTime) {
		return fmt.Errorf("label kill time %g min not longer than survival time %g min: %w", l.KillTime, l.SurvivalTime, ErrInvalidTime)
	}
	return nil
}

func checkUnitTest(name string, t *UnitTest) error {
	if t == nil {
		return nil
	}
	if !finite(t.Minutes) || !(t.Minutes > 0) {
		return fmt.Errorf("%s at %v min: %w", name, t.Minutes, ErrInvalidTime)
	}
	if t.Units < 1 || t.Growth < 0 || t.Growth > t.Units {
		return fmt.Errorf("%s: %d of %d units with growth: %w", name, t.Growth, t.Units, ErrInvalidCount)
	}
	return nil
}

func checkMeasuredValues(m Measured) error {
	if m.Log10N0 != nil && !finite(m.Log10N0.Value) {
		return fmt.Errorf("measured log10 N0 %v: %w", m.Log10N0.Value, ErrInvalidPopulation)
	}
	for i, e := range m.D {
		if err := checkD(fmt.Sprintf("measured D %d (%s)", i+1, e.Method), e.Value); err != nil {
			return err
		}
	}
	if m.Z != nil {
		if err := checkZ("measured z", m.Z.Value); err != nil {
			return err
		}
	}
	if err := checkUnitTest("survival test", m.SurvivalTest); err != nil {
		return err
	}
	return checkUnitTest("kill test", m.KillTest)
}

// within reports whether x ≤ lim, allowing 1e-12 for the rounding of
// relative differences (the boundary itself passes).
func within(x, lim float64) bool { return x <= lim+1e-12 }

func outcome(ok bool) Outcome {
	if ok {
		return Pass
	}
	return Fail
}

func methodName(e Estimate) string {
	if strings.TrimSpace(e.Method) == "" {
		return "(unnamed method)"
	}
	return e.Method
}

func pct(x float64) string { return fmt.Sprintf("%.4g %%", 100*x) }

// CheckLabel compares the measured results of an indicator lot with its
// label and returns one finding per criterion: what was measured, the limit,
// pass, fail or not assessed, and the limit's source. A criterion whose data
// are missing (on the label or among the measurements) is not assessed,
// never passed. The criteria, each limit overridable through c:
//
//   - population: the measured population (10^Log10N0) within 50–300 % of
//     the label (common practice, no source);
//   - D vs label: each measured D within ±20 % of the labelled D (USP, as
//     quoted secondarily);
//   - D limits: each measured D's limits within 10 % of that D
//     (Estimate.RelativeHalfWidth; USP, as quoted secondarily); a D without
//     limits is not assessed, an unbounded one fails;
//   - D methods: at least two distinct methods among the measured D-values
//     (ISO 11138-1, as quoted in Shintani 2014);
//   - z vs label: only when c.ZAgreement is set (no published default);
//   - window vs label D: the labelled window against the window computed
//     from the labelled D and population, and window vs measured D: against
//     each measured D with the measured population (the labelled one when
//     none was measured), both by the rule of CheckWindow (pass when
//     consistent at the estimate; the note says whether it holds over D's
//     limits);
//   - survival test and kill test: every unit grew at an exposure no
//     shorter than the labelled survival time; no unit grew at an exposure
//     no longer than the labelled kill time;
//   - with c.Profile, its minimum population, D and z, each applied to the
//     label and to the measurements; the minimum D only when the label's
//     temperature is the profile's (within 0.05 °C).
//
// Boundaries pass. The report's Summary counts outcomes and never says that
// the lot is accepted; it carries Caution.
//
// Special cases are:
//
//	a label number negative, NaN or ±Inf, or a kill time not longer than the survival time: ErrInvalidPopulation, ErrInvalidD, ErrInvalidZ, ErrInvalidTime or ErrInvalidTemperature
//	a measured D or z not positive and finite, a measured log10 N0 NaN or ±Inf: ErrInvalidD, ErrInvalidZ or ErrInvalidPopulation
//	a unit test with no unit, a growth count outside 0…units, or a time not positive and finite: ErrInvalidCount or ErrInvalidTime
//	a criterion limit negative, NaN or ±Inf, a population range low ≥ high, a number of methods not a whole number ≥ 1: ErrInvalidSetting
//	a profile for another modality than the label's, or with invalid or no minimums: ErrProfile
func CheckLabel(l Label, m Measured, c *Criteria) (Report, error) {
	cr, err := resolveCriteria(c)
	if err != nil {
		return Report{}, err
	}
	if err := checkLabelValues(l); err != nil {
		return Report{}, err
	}
	if err := checkMeasuredValues(m); err != nil {
		return Report{}, err
	}
	if cr.profile != nil {
		if err := cr.profile.check(l); err != nil {
			return Report{}, err
		}
	}
	r := Report{Label: l, Caution: Caution}
	add := func(f Finding) { r.Findings = append(r.Findings, f) }
	notAssessed := func(criterion, subject, limitText, note string, lim limit) Finding {
		return Finding{Criterion: criterion, Subject: subject, Measured: "—", Value: math.NaN(), Limit: limitText, Outcome: NotAssessed, Note: note, Source: lim.source, Profile: lim.from}
	}
	if m.Log10N0 != nil {
		for _, w := range m.Log10N0.Warnings {
			r.Warnings = append(r.Warnings, "measured population: "+w)
		}
	}
	for _, e := range m.D {
		for _, w := range e.Warnings {
			r.Warnings = append(r.Warnings, fmt.Sprintf("measured D (%s): %s", methodName(e), w))
		}
	}
	if m.Z != nil {
		for _, w := range m.Z.Warnings {
			r.Warnings = append(r.Warnings, "measured z: "+w)
		}
	}

	// Population against the label.
	{
		lim := fmt.Sprintf("%s–%s of label", pct(cr.popLow.value), pct(cr.popHigh.value))
		src := cr.popLow
		if cr.popHigh.from != cr.popLow.from || cr.popHigh.source != cr.popLow.source {
			src.source = "low: " + cr.popLow.source + "; high: " + cr.popHigh.source
			if cr.popHigh.from != cr.popLow.from {
				src.from = FromLaboratory
			}
		}
		switch {
		case l.Population == 0:
			add(notAssessed("population vs label", "", lim, "the label states no population", src))
		case m.Log10N0 == nil:
			add(notAssessed("population vs label", "", lim, "no measured population", src))
		default:
			ratio := math.Pow(10, m.Log10N0.Value-math.Log10(l.Population))
			ok := within(cr.popLow.value, ratio) && within(ratio, cr.popHigh.value)
			add(Finding{Criterion: "population vs label",
				Measured: fmt.Sprintf("%.3g per unit (log10 %.3f) = %s of label %.3g", math.Pow(10, m.Log10N0.Value), m.Log10N0.Value, pct(ratio), l.Population),
				Value:    ratio, Limit: lim, Outcome: outcome(ok), Source: src.source, Profile: src.from})
		}
	}

	// Each measured D against the labelled D, and its limits.
	{
		lim := "within ±" + pct(cr.dAgree.value) + " of label"
		limL := "limits within " + pct(cr.dLimits.value) + " of D"
		if len(m.D) == 0 {
			add(notAssessed("D vs label", "", lim, "no measured D", cr.dAgree))
			add(notAssessed("D limits", "", limL, "no measured D", cr.dLimits))
		}
		for _, e := range m.D {
			name := methodName(e)
			if l.D == 0 {
				add(notAssessed("D vs label", name, lim, "the label states no D", cr.dAgree))
			} else {
				rel := (e.Value - l.D) / l.D
				add(Finding{Criterion: "D vs label", Subject: name,
					Measured: fmt.Sprintf("%.4g min, %+.3g %% of label %.4g min", e.Value, 100*rel, l.D),
					Value:    rel, Limit: lim, Outcome: outcome(within(math.Abs(rel), cr.dAgree.value)),
					Source: cr.dAgree.source, Profile: cr.dAgree.from})
			}
			rhw := e.RelativeHalfWidth()
			if math.IsNaN(rhw) {
				add(notAssessed("D limits", name, limL, "the estimate has no limits", cr.dLimits))
				continue
			}
			f := Finding{Criterion: "D limits", Subject: name,
				Measured: fmt.Sprintf("%.4g–%.4g min (%.4g %%), within %s of D", e.Lower, e.Upper, 100*e.Level, pct(rhw)),
				Value:    rhw, Limit: limL, Outcome: outcome(within(rhw, cr.dLimits.value)),
				Source: cr.dLimits.source, Profile: cr.dLimits.from}
			if math.IsInf(rhw, 1) {
				f.Note = "a limit is unbounded"
			}
			add(f)
		}
	}

	// Number of D methods.
	{
		lim := fmt.Sprintf("≥ %g methods", cr.dMethods.value)
		if len(m.D) == 0 {
			add(notAssessed("D methods", "", lim, "no measured D", cr.dMethods))
		} else {
			seen := map[string]bool{}
			var names []string
			for _, e := range m.D {
				k := strings.ToLower(strings.TrimSpace(e.Method))
				if !seen[k] {
					seen[k] = true
					names = append(names, methodName(e))
				}
				if k == "" {
					r.Warnings = appendOnce(r.Warnings, "a measured D names no method: unnamed estimates count as one method")
				}
			}
			n := float64(len(names))
			add(Finding{Criterion: "D methods", Measured: fmt.Sprintf("%d: %s", len(names), strings.Join(names, "; ")),
				Value: n, Limit: lim, Outcome: outcome(n >= cr.dMethods.value), Source: cr.dMethods.source, Profile: cr.dMethods.from})
		}
	}

	// z against the label, only when asked for.
	if cr.zAgree.value > 0 {
		lim := "within ±" + pct(cr.zAgree.value) + " of label"
		switch {
		case l.Z == 0:
			add(notAssessed("z vs label", "", lim, "the label states no z", cr.zAgree))
		case m.Z == nil:
			add(notAssessed("z vs label", "", lim, "no measured z", cr.zAgree))
		default:
			rel := (m.Z.Value - l.Z) / l.Z
			add(Finding{Criterion: "z vs label", Measured: fmt.Sprintf("%.4g °C, %+.3g %% of label %.4g °C", m.Z.Value, 100*rel, l.Z),
				Value: rel, Limit: lim, Outcome: outcome(within(math.Abs(rel), cr.zAgree.value)), Source: cr.zAgree.source, Profile: cr.zAgree.from})
		}
	}

	windowFindings(&r, l, m)
	if cr.profile != nil {
		profileFindings(&r, l, m, *cr.profile)
	}

	for _, f := range r.Findings {
		switch f.Outcome {
		case Pass:
			r.Passed++
		case Fail:
			r.Failed++
		default:
			r.NotAssessed++
		}
	}
	switch {
	case r.Failed > 0:
		r.Summary = SomeFailed
	case r.Passed == 0:
		r.Summary = NoneAssessed
	case r.NotAssessed > 0:
		r.Summary = NoneFailed
	default:
		r.Summary = AllPassed
	}
	return r, nil
}

func appendOnce(list []string, s string) []string {
	for _, x := range list {
		if x == s {
			return list
		}
	}
	return append(list, s)
}

// windowFinding compares the label's window with the one of d and log10N0.
func windowFinding(criterion, subject string, claim Window, d Estimate, log10N0 float64, popNote string, labelled bool) Finding {
	lim := windowLimit
	f := Finding{Criterion: criterion, Subject: subject, Limit: lim, Source: SourceWindow, Profile: FromDefault}
	c, err := CheckWindow(claim, d, log10N0)
	if err != nil {
		// The label's times and D were validated, so only the population
		// can be at fault: with log10 N0 ≤ 2 no survival time exists.
		f.Measured = fmt.Sprintf("log10 N0 %.3f, D %.4g min", log10N0, d.Value)
		f.Value, f.Outcome = math.NaN(), Fail
		f.Note = "no survival time exists at this population (log10 N0 ≤ 2)"
		return f
	}
	f.Measured = fmt.Sprintf("computed %.4g–%.4g min for claim %.4g–%.4g min (margins %+.3g, %+.3g min)",
		c.Computed.Survival, c.Computed.Kill, claim.Survival, claim.Kill, c.SurvivalMargin, c.KillMargin)
	f.Value = math.Min(c.SurvivalMargin, c.KillMargin)
	f.Outcome = outcome(c.Consistent)
	var notes []string
	if popNote != "" {
		notes = append(notes, popNote)
	}
	switch {
	case labelled:
		// The labelled D has no limits to compare over.
	case !c.LimitsGiven:
		notes = append(notes, "D has no limits: compared at the estimate only")
	case c.ConsistentAtLimits:
		notes = append(notes, "holds over D's limits too")
	default:
		notes = append(notes, fmt.Sprintf("does not hold over D's limits (margins %+.3g, %+.3g min at %.4g, %.4g min)", c.SurvivalMarginAtUpper, c.KillMarginAtLower, d.Upper, d.Lower))
	}
	f.Note = strings.Join(notes, "; ")
	return f
}

const windowLimit = "survival ≥ (log10 N0 − 2)·D, kill ≤ (log10 N0 + 4)·D"

func windowFindings(r *Report, l Label, m Measured) {
	add := func(f Finding) { r.Findings = append(r.Findings, f) }
	lim := windowLimit
	na := func(criterion, subject, note string) {
		add(Finding{Criterion: criterion, Subject: subject, Measured: "—", Value: math.NaN(), Limit: lim, Outcome: NotAssessed, Note: note, Source: SourceWindow, Profile: FromDefault})
	}
	var noWindow string
	switch {
	case l.SurvivalTime == 0 && l.KillTime == 0:
		noWindow = "the label states no survival–kill window"
	case l.SurvivalTime == 0:
		noWindow = "the label states no survival time"
	case l.KillTime == 0:
		noWindow = "the label states no kill time"
	}
	claim := Window{l.SurvivalTime, l.KillTime}
	labelLog := math.NaN()
	if l.Population > 0 {
		labelLog = math.Log10(l.Population)
	}
	switch {
	case noWindow != "":
		na("window vs label D", "", noWindow)
	case l.D == 0 || l.Population == 0:
		na("window vs label D", "", "the label states no D or no population")
	default:
		add(windowFinding("window vs label D", "", claim, Estimate{Value: l.D, Lower: math.NaN(), Upper: math.NaN(), Method: "label"}, labelLog, "", true))
	}
	if len(m.D) == 0 {
		na("window vs measured D", "", "no measured D")
	}
	for _, e := range m.D {
		name := methodName(e)
		switch {
		case noWindow != "":
			na("window vs measured D", name, noWindow)
		case m.Log10N0 != nil:
			add(windowFinding("window vs measured D", name, claim, e, m.Log10N0.Value, "", false))
		case l.Population > 0:
			add(windowFinding("window vs measured D", name, claim, e, labelLog, "no measured population: the labelled one was used", false))
		default:
			na("window vs measured D", name, "no population, measured or labelled")
		}
	}

	type test struct {
		name, lim, limText string
		t                  *UnitTest
		labelled           float64
		survival           bool
	}
	for _, x := range []test{
		{"survival test", "survival time", "every unit grows", m.SurvivalTest, l.SurvivalTime, true},
		{"kill test", "kill time", "no unit grows", m.KillTest, l.KillTime, false},
	} {
		f := Finding{Criterion: x.name, Limit: x.limText, Source: SourceUnitTest, Profile: FromDefault, Value: math.NaN(), Measured: "—", Outcome: NotAssessed}
		switch {
		case x.t == nil:
			f.Note = "not performed"
		case x.labelled == 0:
			f.Note = "the label states no " + x.lim
		case x.survival && !within(x.labelled, x.t.Minutes):
			f.Note = fmt.Sprintf("exposed %g min, shorter than the labelled survival time %g min", x.t.Minutes, x.labelled)
		case !x.survival && !within(x.t.Minutes, x.labelled):
			f.Note = fmt.Sprintf("exposed %g min, longer than the labelled kill time %g min", x.t.Minutes, x.labelled)
		default:
			f.Measured = fmt.Sprintf("%d of %d units grew after %g min", x.t.Growth, x.t.Units, x.t.Minutes)
			f.Value = float64(x.t.Growth)
			if x.survival {
				f.Outcome = outcome(x.t.Growth == x.t.Units)
			} else {
				f.Outcome = outcome(x.t.Growth == 0)
			}
		}
		add(f)
	}
}

func profileFindings(r *Report, l Label, m Measured, p Profile) {
	add := func(f Finding) { r.Findings = append(r.Findings, f) }
	mk := func(criterion, subject, limText string) Finding {
		return Finding{Criterion: criterion, Subject: subject, Limit: limText, Source: p.Status, Profile: p.Name, Measured: "—", Value: math.NaN(), Outcome: NotAssessed}
	}
	if p.MinPopulation > 0 {
		limText := fmt.Sprintf("≥ %.3g per unit", p.MinPopulation)
		f := mk("minimum population", "label", limText)
		if l.Population == 0 {
			f.Note = "the label states no population"
		} else {
			f.Measured, f.Value = fmt.Sprintf("%.3g per unit", l.Population), l.Population
			f.Outcome = outcome(l.Population >= p.MinPopulation)
		}
		add(f)
		f = mk("minimum population", "measured", limText)
		if m.Log10N0 == nil {
			f.Note = "no measured population"
		} else {
			// Compare on the log scale: exact for powers of ten.
			f.Value = math.Pow(10, m.Log10N0.Value)
			f.Measured = fmt.Sprintf("%.3g per unit (log10 %.3f)", f.Value, m.Log10N0.Value)
			f.Outcome = outcome(m.Log10N0.Value >= math.Log10(p.MinPopulation)-1e-12)
		}
		add(f)
	}
	if p.MinD > 0 {
		limText := fmt.Sprintf("≥ %g min", p.MinD)
		if p.Celsius != 0 {
			limText = fmt.Sprintf("≥ %g min at %g °C", p.MinD, p.Celsius)
		}
		tempNote := ""
		if p.Celsius != 0 && !sameTemperature(l.Celsius, p.Celsius) {
			tempNote = fmt.Sprintf("the label's D is at %g °C, the profile's minimum at %g °C", l.Celsius, p.Celsius)
		}
		f := mk("minimum D", "label", limText)
		switch {
		case l.D == 0:
			f.Note = "the label states no D"
		case tempNote != "":
			f.Note = tempNote
		default:
			f.Measured, f.Value = fmt.Sprintf("%.4g min at %g °C", l.D, l.Celsius), l.D
			f.Outcome = outcome(l.D >= p.MinD)
		}
		add(f)
		if len(m.D) == 0 {
			f = mk("minimum D", "measured", limText)
			f.Note = "no measured D"
			add(f)
		}
		for _, e := range m.D {
			f = mk("minimum D", "measured: "+methodName(e), limText)
			if tempNote != "" {
				f.Note = tempNote
			} else {
				f.Measured, f.Value = fmt.Sprintf("%.4g min at %g °C", e.Value, l.Celsius), e.Value
				f.Outcome = outcome(e.Value >= p.MinD)
			}
			add(f)
		}
	}
	if p.MinZ > 0 {
		limText := fmt.Sprintf("≥ %g °C", p.MinZ)
		f := mk("minimum z", "label", limText)
		if l.Z == 0 {
			f.Note = "the label states no z"
		} else {
			f.Measured, f.Value, f.Outcome = fmt.Sprintf("%.4g °C", l.Z), l.Z, outcome(l.Z >= p.MinZ)
		}
		add(f)
		f = mk("minimum z", "measured", limText)
		if m.Z == nil {
			f.Note = "no measured z"
		} else {
			f.Measured, f.Value, f.Outcome = fmt.Sprintf("%.4g °C", m.Z.Value), m.Z.Value, outcome(m.Z.Value >= p.MinZ)
		}
		add(f)
	}
}
