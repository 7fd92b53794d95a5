package main

import (
	"fmt"
	"math"
	"time"

	"github.com/dzf-go/dzf/internal/lab"
	"github.com/dzf-go/dzf/lethality"
	"github.com/dzf-go/dzf/resistance"
)

// cyclePart is the production cycle: F0 per probe, cold spot, phases.
type cyclePart struct {
	Source   string                `json:"source"`
	Comments []string              `json:"comments,omitempty"`
	Rows     int                   `json:"rows"`
	Start    *time.Time            `json:"start,omitempty"`
	Result   lethality.CycleResult `json:"result"`
}

func cycleOf(in inputs, s settings) (cyclePart, error) {
	res, err := lethality.Cycle(in.Cycle, s.F0, &lethality.CycleSettings{Celsius: s.Sterilization, Band: s.Band})
	if err != nil {
		return cyclePart{}, fmt.Errorf("cycle (%s): %w", in.CycleName, err)
	}
	return cyclePart{Source: in.CycleName, Comments: in.Cycle.Comments, Rows: len(in.Cycle.Rows), Start: in.Cycle.Start, Result: res}, nil
}

// indicatorPart is this indicator's survival at the cold spot.
type indicatorPart struct {
	ColdSpot string `json:"cold_spot"`
	// Reference is the reference of F here: the label's temperature, at
	// which D was measured, with the z of F0; F is the cold spot's F
	// against it.
	Reference lethality.Reference `json:"reference"`
	F         lethality.FResult   `json:"f"`
	Log10N0   float64             `json:"log10_n0"`
	Log10SAL  float64             `json:"log10_sal"`
	// MeasuredZ is the indicator's measured z (NaN when not determined),
	// to compare with the z of F.
	MeasuredZ lab.Num        `json:"measured_z"`
	Rows      []indicatorRow `json:"rows"`
}

// indicatorRow is the survival by one method's D.
type indicatorRow struct {
	Method      string                 `json:"method"`
	Assessment  *lethality.Assessment  `json:"assessment,omitempty"`
	Requirement *lethality.Requirement `json:"requirement,omitempty"`
	// MeetsSAL says whether log10 PNSU ≤ log10 SAL at D's value, and
	// MeetsSALConservative at its upper limit (nil without one).
	MeetsSAL             bool   `json:"meets_sal"`
	MeetsSALConservative *bool  `json:"meets_sal_conservative,omitempty"`
	Refused              string `json:"refused,omitempty"`
}

func indicatorOf(in inputs, r report) (indicatorPart, error) {
	c := r.Cycle.Result
	ref := lethality.Reference{
		Name: fmt.Sprintf("F at %g °C", in.Label.Celsius), TRef: in.Label.Celsius, Z: r.Settings.F0.Z,
		Status: "the label's temperature, at which D was measured, with the z of F0",
	}
	samples, _, err := in.Cycle.Series(c.ColdSpot)
	if err != nil {
		return indicatorPart{}, fmt.Errorf("cold spot %s: %w", c.ColdSpotProbe, err)
	}
	f, err := lethality.F(samples, ref, nil)
	if err != nil {
		return indicatorPart{}, fmt.Errorf("cold spot %s against %v: %w", c.ColdSpotProbe, ref, err)
	}
	p := indicatorPart{ColdSpot: c.ColdSpotProbe, Reference: ref, F: f, Log10N0: r.Resistance.Log10N0,
		Log10SAL: r.Settings.Log10SAL, MeasuredZ: lab.Num(math.NaN())}
	if r.Z.Result != nil {
		p.MeasuredZ = lab.Num(r.Z.Result.Z.Value)
	}
	for _, m := range r.Resistance.Methods {
		if m.Estimate == nil {
			continue
		}
		p.Rows = append(p.Rows, indicatorRowOf(m.Name, *m.Estimate, p, r.Settings.Sterilization))
	}
	return p, nil
}

func indicatorRowOf(name string, d resistance.Estimate, p indicatorPart, celsius float64) indicatorRow {
	row := indicatorRow{Method: name}
	a, err := lethality.Assess(p.Log10N0, p.F.F, d)
	if err != nil {
		row.Refused = err.Error()
		return row
	}
	row.Assessment = &a
	row.MeetsSAL = a.Central.Log10PNSU <= p.Log10SAL
	if a.Conservative != nil {
		ok := a.Conservative.Log10PNSU <= p.Log10SAL
		row.MeetsSALConservative = &ok
	}
	if req, err := lethality.Require(p.Log10N0, p.Log10SAL, d, celsius, p.Reference); err == nil {
		row.Requirement = &req
	}
	return row
}

// claimsPart holds the overkill and half-cycle statements.
type claimsPart struct {
	// Overkill is the common claim on the cold spot's F0: 12 logs of an
	// organism with D = 1 min.
	Overkill lethality.OverkillResult `json:"overkill"`
	// IndicatorOverkill is 12 logs of this indicator at IndicatorD (the
	// highest upper limit among the methods, or the highest D when none
	// gives limits), on the cold spot's F at the label's temperature.
	IndicatorOverkill *lethality.OverkillResult `json:"indicator_overkill,omitempty"`
	IndicatorD        lab.Num                   `json:"indicator_d"`
	IndicatorDFrom    string                    `json:"indicator_d_from,omitempty"`
	// HalfCycle is the credit of the half-cycle run of the outcomes file.
	HalfCycle        *lethality.HalfCycleResult `json:"half_cycle,omitempty"`
	HalfCycleRefused string                     `json:"half_cycle_refused,omitempty"`
	// FullHold is this cycle's hold (every probe at or above the
	// sterilization temperature), TwiceHalf twice the half-cycle exposure.
	FullHold  lab.Num `json:"full_hold_minutes"`
	TwiceHalf lab.Num `json:"twice_half_minutes"`
}

func claimsOf(in inputs, r report) claimsPart {
	var c claimsPart
	c.Overkill, _ = lethality.Overkill(r.Cycle.Result.MinF, nil) // F ≥ 0 and default settings: cannot fail
	c.IndicatorD, c.IndicatorDFrom = indicatorD(r.Resistance.Methods)
	if d := float64(c.IndicatorD); d > 0 {
		if ok, err := lethality.Overkill(r.Indicator.F.F, &lethality.OverkillSettings{D: d}); err == nil {
			c.IndicatorOverkill = &ok
		}
	}
	c.FullHold, c.TwiceHalf = lab.Num(math.NaN()), lab.Num(math.NaN())
	h := in.Outcomes.HalfCycle
	if h == nil {
		c.HalfCycleRefused = "no half-cycle run in the outcomes"
		return c
	}
	study := lethality.HalfCycleStudy{Log10N0: r.Resistance.Log10N0, Units: h.Units, Negative: h.Units - h.Growth, HalfMinutes: h.Minutes}
	res, err := lethality.HalfCycle(study, nil)
	if err != nil {
		c.HalfCycleRefused = err.Error()
		return c
	}
	c.HalfCycle = &res
	c.TwiceHalf = lab.Num(2 * h.Minutes)
	if r.Cycle.Result.HoldFound {
		c.FullHold = lab.Num(r.Cycle.Result.Hold)
	}
	return c
}

// indicatorD returns the most resistant D among the methods: the highest
// finite upper limit, or the highest value when no method gives one.
func indicatorD(ms []lab.Method) (lab.Num, string) {
	best, from := math.NaN(), ""
	for _, m := range ms {
		if e := m.Estimate; e != nil && !math.IsInf(e.Upper, 0) && !math.IsNaN(e.Upper) && !(e.Upper <= best) {
			best, from = e.Upper, "upper limit of "+m.Name
		}
	}
	if from != "" {
		return lab.Num(best), from
	}
	for _, m := range ms {
		if e := m.Estimate; e != nil && !(e.Value <= best) {
			best, from = e.Value, m.Name
		}
	}
	return lab.Num(best), from
}
