package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/dzf-go/dzf/fraction"
	"github.com/dzf-go/dzf/internal/lab"
	"github.com/dzf-go/dzf/resistance"
	"github.com/dzf-go/dzf/survivor"
)

const (
	nameSurvivor     = "survivor curve"
	fractionHSKLevel = fraction.HSKLevel
	// agreementBand is the largest relative distance of a method's D from
	// the mean of all methods' D for the methods to agree: a project rule
	// that borrows the ±20 % of the label check, no published source.
	agreementBand = 0.20
)

const agreementRule = "every method's D within ±20 % of the mean of all methods' D, and the limits of every two " +
	"methods that give limits overlapping (a project rule, no published source)"

// resistancePart is D at the label's temperature by every method.
type resistancePart struct {
	Celsius  float64             `json:"celsius"`
	Log10N0  float64             `json:"log10_n0"`
	Survivor *survivor.Result    `json:"survivor,omitempty"`
	Fraction lab.FractionResults `json:"fraction"`
	// Methods lists the estimates: survivor curve, HSK, limited HSK, SMC,
	// MLE (refusals included).
	Methods   []lab.Method `json:"methods"`
	Agreement agreement    `json:"agreement"`
}

// agreement says whether the methods' D-values agree by agreementRule.
type agreement struct {
	Rule       string      `json:"rule"`
	Mean       lab.Num     `json:"mean_d"`
	Deviations []deviation `json:"deviations"`
	WithinBand bool        `json:"within_band"`
	Pairs      []pair      `json:"pairs"`
	AllOverlap bool        `json:"all_overlap"`
	Agree      bool        `json:"agree"`
	Note       string      `json:"note,omitempty"`
}

// deviation is one method's relative distance from the mean D.
type deviation struct {
	Method   string  `json:"method"`
	D        float64 `json:"d"`
	Relative float64 `json:"relative"`
	Within   bool    `json:"within"`
}

// pair says whether the limits of two methods overlap.
type pair struct {
	A       string `json:"a"`
	B       string `json:"b"`
	Overlap bool   `json:"overlap"`
}

func resistanceOf(in inputs, log10N0 float64, s settings) resistancePart {
	r := resistancePart{Celsius: in.Label.Celsius, Log10N0: log10N0}
	fit, err := survivor.Fit(in.Survivor, &s.Survivor)
	switch {
	case errors.Is(err, survivor.ErrZeroCount):
		err = fmt.Errorf("%s: %w (-exclude-zero-counts leaves such counts out)", sourceName(in, "survivor"), err)
	case err != nil:
		err = fmt.Errorf("%s: %w", sourceName(in, "survivor"), err)
	default:
		r.Survivor = &fit
	}
	r.Methods = append(r.Methods, lab.NewMethod(nameSurvivor, fit.D, err))
	r.Fraction = lab.EstimateFraction(log10N0, in.Fraction, s.Level)
	r.Methods = append(r.Methods, r.Fraction.Methods...)
	r.Agreement = agreementOf(r.Methods)
	return r
}

// estimates returns the estimates that were given, in order.
func (r resistancePart) estimates() []resistance.Estimate {
	var es []resistance.Estimate
	for _, m := range r.Methods {
		if m.Estimate != nil {
			es = append(es, *m.Estimate)
		}
	}
	return es
}

// method returns the estimate of the method with the short name, or nil.
func (r resistancePart) method(name string) *resistance.Estimate {
	for _, m := range r.Methods {
		if m.Name == name {
			return m.Estimate
		}
	}
	return nil
}

func agreementOf(ms []lab.Method) agreement {
	a := agreement{Rule: agreementRule, Mean: lab.Num(math.NaN())}
	var given []lab.Method
	sum := 0.0
	for _, m := range ms {
		if m.Estimate != nil {
			given = append(given, m)
			sum += m.Estimate.Value
		}
	}
	if len(given) < 2 {
		a.Note = "fewer than two methods gave a D: agreement not assessed"
		return a
	}
	mean := sum / float64(len(given))
	a.Mean, a.WithinBand, a.AllOverlap = lab.Num(mean), true, true
	for _, m := range given {
		rel := (m.Estimate.Value - mean) / mean
		ok := math.Abs(rel) <= agreementBand
		a.WithinBand = a.WithinBand && ok
		a.Deviations = append(a.Deviations, deviation{Method: m.Name, D: m.Estimate.Value, Relative: rel, Within: ok})
	}
	for i, x := range given {
		for _, y := range given[i+1:] {
			if !hasLimits(*x.Estimate) || !hasLimits(*y.Estimate) {
				continue
			}
			ov := x.Estimate.Lower <= y.Estimate.Upper && y.Estimate.Lower <= x.Estimate.Upper
			a.AllOverlap = a.AllOverlap && ov
			a.Pairs = append(a.Pairs, pair{A: x.Name, B: y.Name, Overlap: ov})
		}
	}
	a.Agree = a.WithinBand && a.AllOverlap
	return a
}

// hasLimits reports whether e gives both limits.
func hasLimits(e resistance.Estimate) bool {
	return !math.IsNaN(e.Lower) && !math.IsNaN(e.Upper)
}

// zPart is the z-value from D at several temperatures.
type zPart struct {
	// Points are the D-values fitted: the -temperatures points and the
	// label temperature's D of the method Settings.ZFrom.
	Points  []resistance.Point  `json:"points"`
	Result  *resistance.ZResult `json:"result,omitempty"`
	Refused string              `json:"refused,omitempty"`
	// Note says why the label temperature's D was not added.
	Note string `json:"note,omitempty"`
}

func zOf(in inputs, r resistancePart, s settings) zPart {
	if in.Temperatures == nil {
		return zPart{Refused: "no D at other temperatures given (-temperatures none): z not determined"}
	}
	z := zPart{Points: append([]resistance.Point(nil), in.Temperatures...)}
	atLabel := false
	for _, p := range in.Temperatures {
		atLabel = atLabel || math.Abs(p.Celsius-in.Label.Celsius) < 0.05
	}
	switch e := r.method(s.ZFrom); {
	case atLabel:
		z.Note = "the -temperatures file has a D at the label's temperature: the " + s.ZFrom + " D was not added"
	case e == nil:
		z.Note = "the " + s.ZFrom + " gave no D at the label's temperature: only the -temperatures points are fitted"
	default:
		z.Points = append(z.Points, resistance.Point{Celsius: in.Label.Celsius, D: *e})
	}
	res, err := resistance.ZFit(z.Points, in.Label.Celsius, &resistance.ZSettings{Level: s.Level})
	if err != nil {
		z.Refused = err.Error()
		return z
	}
	z.Result = &res
	return z
}

func labelCheckOf(in inputs, r report) (resistance.Report, error) {
	n0 := r.Population.log10N0()
	m := resistance.Measured{Log10N0: &n0, D: r.Resistance.estimates(),
		SurvivalTest: in.Outcomes.Survival, KillTest: in.Outcomes.Kill}
	if r.Z.Result != nil {
		m.Z = &r.Z.Result.Z
	}
	// Zero limits mean CheckLabel's defaults, reported with their sources
	// as "default criteria"; the same limits set explicitly (as
	// DefaultCriteria fills them in) would be reported as laboratory
	// settings. Settings.Criteria shows the defaults in force.
	rep, err := resistance.CheckLabel(in.Label, m, &resistance.Criteria{Profile: r.Settings.Profile})
	if err != nil {
		return rep, fmt.Errorf("label check: %w", err)
	}
	return rep, nil
}
