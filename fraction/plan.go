package fraction

import (
	"encoding/json"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"

	"gonum.org/v1/gonum/stat/distuv"

	"github.com/dzf-go/dzf/resistance"
)

// Limits of study planning: beyond them the planning refuses the input
// (ErrInvalidPlan) rather than run out of memory or time.
const (
	MaxPlanExposures   = 1000
	MaxPlanSimulations = 1000000
)

// PlanSettings configures PlanStudy. A nil *PlanSettings, and a zero field,
// mean the default.
type PlanSettings struct {
	// Level is the two-sided confidence level of the expected limits and
	// of the simulated profile-likelihood limits. Default 0.95.
	Level float64
	// FitN0 plans for a likelihood fit that estimates N0 too. Default
	// false: N0 fixed from the population assay.
	FitN0 bool
	// Simulations is the number of studies to simulate (0, the default:
	// none). Each costs one likelihood fit with profile limits and the two
	// Holcomb–Spearman–Kärber procedures, some tens of microseconds.
	Simulations int
	// Seed seeds the PCG generator of the simulation (math/rand/v2
	// rand.NewPCG(Seed, Seed)); the same seed gives the same simulation.
	Seed uint64
}

// PlannedExposure is one proposed exposure with the probability that a
// unit is negative and the expected number of negatives, if D and N0 are
// as planned.
type PlannedExposure struct {
	Minutes             float64 `json:"minutes"`
	Units               int     `json:"units"`
	ProbabilityNegative float64 `json:"probability_negative"`
	ExpectedNegative    float64 `json:"expected_negative"`
}

// Simulation summarizes simulated studies of a plan: each draws the
// negatives of every exposure from the binomial distribution of the
// planned D and N0 and estimates D.
type Simulation struct {
	Studies int    `json:"studies"`
	Seed    uint64 `json:"seed"`
	// Refused counts the studies the likelihood refused (for example with
	// no information); the figures below are over the others.
	Refused int `json:"refused"`
	// Coverage is the fraction of fitted studies whose profile limits
	// contain the planned D.
	Coverage float64 `json:"coverage"`
	// MedianD, MedianLower and MedianUpper are medians of the estimates
	// and limits (minutes); MedianRelativeHalfWidth the median of
	// resistance.Estimate.RelativeHalfWidth. UnboundedUpper counts upper
	// limits at +Inf.
	MedianD                 float64 `json:"median_d"`
	MedianLower             float64 `json:"median_lower"`
	MedianUpper             float64 `json:"median_upper"`
	MedianRelativeHalfWidth float64 `json:"median_relative_half_width"`
	UnboundedUpper          int     `json:"unbounded_upper"`
	// HSKComputable counts studies the general Holcomb–Spearman–Kärber
	// procedure accepted, HSKCoverage the fraction of those whose limits
	// contain D, and LimitedApplicable the studies that met the limited
	// procedure's prerequisites.
	HSKComputable     int     `json:"hsk_computable"`
	HSKCoverage       float64 `json:"hsk_coverage"`
	LimitedApplicable int     `json:"limited_applicable"`
}

// MarshalJSON implements json.Marshaler, writing non-finite numbers as
// "NaN", "+Inf" or "-Inf".
func (s Simulation) MarshalJSON() ([]byte, error) {
	type plain Simulation
	return json.Marshal(struct {
		plain
		Coverage                number `json:"coverage"`
		MedianD                 number `json:"median_d"`
		MedianLower             number `json:"median_lower"`
		MedianUpper             number `json:"median_upper"`
		MedianRelativeHalfWidth number `json:"median_relative_half_width"`
		HSKCoverage             number `json:"hsk_coverage"`
	}{plain(s), number(s.Coverage), number(s.MedianD), number(s.MedianLower), number(s.MedianUpper),
		number(s.MedianRelativeHalfWidth), number(s.HSKCoverage)})
}

// Plan is a proposed fraction-negative study.
type Plan struct {
	D       float64 `json:"d"`
	Log10N0 float64 `json:"log10_n0"`
	Units   int     `json:"units"`
	FitN0   bool    `json:"fit_n0"`
	// SurvivalTime (log10 N0 − 2)·D and KillTime (log10 N0 + 4)·D are the
	// first and last exposure; Interval the equal spacing between
	// exposures (minutes).
	SurvivalTime float64           `json:"survival_time"`
	KillTime     float64           `json:"kill_time"`
	Interval     float64           `json:"interval"`
	Exposures    []PlannedExposure `json:"exposures"`
	// Expected is D with the limits expected from the design: Wald limits
	// on the slope −ln10/D from the Fisher information of the binomial
	// likelihood, at the planned D and N0, mapped to D.
	Expected resistance.Estimate `json:"expected"`
	// ExpectedHSKHalfWidth approximates the half-width of the
	// Holcomb–Spearman–Kärber limits, 2√E[V]/(log10 N0 + 0.2507), with
	// E[V] = Σ ((tᵢ₊₁ − tᵢ₋₁)/2)² pᵢ(1 − pᵢ)/n over the inner exposures
	// (minutes).
	ExpectedHSKHalfWidth float64 `json:"expected_hsk_half_width"`
	// Simulation is present when PlanSettings.Simulations > 0.
	Simulation *Simulation `json:"simulation,omitempty"`
	Warnings   []string    `json:"warnings,omitempty"`
}

// String formats the plan: the exposures with the expected negatives, the
// expected limits and the simulation.
func (p Plan) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "study plan for D = %g min, log10 N0 = %g, %d units per exposure: %d exposures from %.4g to %.4g min every %.4g min\n",
		p.D, p.Log10N0, p.Units, len(p.Exposures), p.SurvivalTime, p.KillTime, p.Interval)
	for _, e := range p.Exposures {
		fmt.Fprintf(&b, "  %8.4g min: expected %.3g negative of %d (P = %.3g)\n", e.Minutes, e.ExpectedNegative, e.Units, e.ProbabilityNegative)
	}
	e := p.Expected
	fmt.Fprintf(&b, "  expected limits (%s): %.4g – %.4g min at %g %%; HSK half-width ≈ %.3g min", e.Method, e.Lower, e.Upper, 100*e.Level, p.ExpectedHSKHalfWidth)
	if s := p.Simulation; s != nil {
		fmt.Fprintf(&b, "\n  simulation of %d studies (seed %d): %d refused; coverage %.3f; median limits %.4g – %.4g min; HSK computable in %d, limited procedure applicable in %d",
			s.Studies, s.Seed, s.Refused, s.Coverage, s.MedianLower, s.MedianUpper, s.HSKComputable, s.LimitedApplicable)
	}
	for _, w := range p.Warnings {
		fmt.Fprintf(&b, "\n  warning: %s", w)
	}
	return b.String()
}

// PlanStudy proposes a fraction-negative study for an indicator of
// expected D (minutes) and population log10N0: count exposures of units
// units each, equally spaced (so that the limited Holcomb–Spearman–Kärber
// procedure applies) from the survival time (log10 N0 − 2)·D to the kill
// time (log10 N0 + 4)·D. For each exposure it gives the probability
// exp(−N0·10^(−t/D)) that a unit is negative and the expected number of
// negatives; for the design it gives the limits of D expected from the
// Fisher information (see Plan.Expected), the approximate HSK half-width
// and, with settings.Simulations > 0, a simulation by a seeded generator.
//
// PlanStudy refuses (ErrInvalidPlan) D not finite or ≤ 0, log10 N0 ≤ 2 (no
// survival time), units < 1, count < 2 or above MaxPlanExposures,
// simulations < 0 or above MaxPlanSimulations, and a level outside (0, 1)
// (ErrInvalidLevel); log10 N0 not finite, ≤ 0 or above MaxLog10N0 is
// ErrInvalidPopulation. It warns when count is below the usual five
// exposures.
func PlanStudy(d, log10N0 float64, units, count int, settings *PlanSettings) (Plan, error) {
	var s PlanSettings
	if settings != nil {
		s = *settings
	}
	if s.Level == 0 {
		s.Level = 0.95
	}
	switch {
	case !(s.Level > 0 && s.Level < 1):
		return Plan{}, fmt.Errorf("level %g: %w", s.Level, ErrInvalidLevel)
	case math.IsNaN(d) || math.IsInf(d, 0) || d <= 0:
		return Plan{}, fmt.Errorf("expected D = %g min (must be finite and > 0): %w", d, ErrInvalidPlan)
	}
	if err := checkPopulation(log10N0); err != nil {
		return Plan{}, err
	}
	switch {
	case log10N0 > MaxLog10N0:
		return Plan{}, fmt.Errorf("log10 N0 = %g is above %d: %w", log10N0, MaxLog10N0, ErrInvalidPopulation)
	case log10N0 <= 2:
		return Plan{}, fmt.Errorf("log10 N0 = %g ≤ 2: the survival time (log10 N0 − 2)·D is not positive: %w", log10N0, ErrInvalidPlan)
	case units < 1:
		return Plan{}, fmt.Errorf("%d units per exposure (at least 1 needed): %w", units, ErrInvalidPlan)
	case count < 2 || count > MaxPlanExposures:
		return Plan{}, fmt.Errorf("%d exposures (between 2 and %d): %w", count, MaxPlanExposures, ErrInvalidPlan)
	case s.Simulations < 0 || s.Simulations > MaxPlanSimulations:
		return Plan{}, fmt.Errorf("%d simulations (between 0 and %d): %w", s.Simulations, MaxPlanSimulations, ErrInvalidPlan)
	}
	p := Plan{D: d, Log10N0: log10N0, Units: units, FitN0: s.FitN0,
		SurvivalTime: (log10N0 - 2) * d, KillTime: (log10N0 + 4) * d}
	if math.IsInf(p.KillTime, 0) {
		return Plan{}, fmt.Errorf("kill time (log10 N0 + 4)·D overflows: %w", ErrInvalidPlan)
	}
	p.Interval = (p.KillTime - p.SurvivalTime) / float64(count-1)
	if count < 5 {
		p.Warnings = append(p.Warnings, fmt.Sprintf("%d exposures: the usual design has at least five (one all positive, two fractional, two all negative)", count))
	}
	a := log10N0 * math.Ln10
	b := -math.Ln10 / d
	n := float64(units)
	p.Exposures = make([]PlannedExposure, count)
	var iaa, iab, ibb float64 // Fisher information in (a, b), t centred below
	var t0 float64
	for i := range count {
		t := p.SurvivalTime + float64(i)*p.Interval
		if i == count-1 {
			t = p.KillTime
		}
		t0 += t / float64(count)
		p.Exposures[i] = PlannedExposure{Minutes: t, Units: units}
	}
	for i := range p.Exposures {
		t := p.Exposures[i].Minutes
		mu := math.Exp(a + b*t)
		pneg := math.Exp(-mu)
		p.Exposures[i].ProbabilityNegative = pneg
		p.Exposures[i].ExpectedNegative = n * pneg
		w := n * fisherWeight(mu)
		x := t
		if s.FitN0 {
			x = t - t0
		}
		iaa += w
		iab += w * x
		ibb += w * x * x
	}
	varB := 1 / ibb
	if s.FitN0 {
		varB = iaa / (iaa*ibb - iab*iab)
	}
	z := distuv.UnitNormal.Quantile((1 + s.Level) / 2)
	lo, up := 0.0, math.Inf(1)
	var ew []string
	if !(varB > 0) || math.IsInf(varB, 0) {
		// Singular information (for example two exposures of which one
		// carries all of it, with N0 fitted): the design alone bounds
		// nothing.
		ew = append(ew, "the design carries too little information to estimate D: its Fisher information is singular, so the expected limits are 0 and +Inf")
	} else {
		se := math.Sqrt(varB)
		lo = -math.Ln10 / (b - z*se)
		if lo == 0 {
			ew = append(ew, "the expected limits do not bound D from below")
		}
		if b+z*se < 0 {
			up = -math.Ln10 / (b + z*se)
		} else {
			ew = append(ew, "the expected limits do not bound D from above")
		}
	}
	method := "Fisher information of the design, N0 fixed"
	if s.FitN0 {
		method = "Fisher information of the design, N0 fitted"
	}
	p.Expected = resistance.Estimate{Value: d, Lower: lo, Upper: up, Level: s.Level, Method: method, Warnings: ew}
	ev := 0.0
	for i := 1; i+1 < count; i++ {
		w := (p.Exposures[i+1].Minutes - p.Exposures[i-1].Minutes) / 2
		q := p.Exposures[i].ProbabilityNegative
		ev += w * w * q * (1 - q) / n
	}
	p.ExpectedHSKHalfWidth = 2 * math.Sqrt(ev) / (log10N0 + EulerOverLn10)
	if s.Simulations > 0 {
		sim := simulate(p, s)
		p.Simulation = &sim
	}
	return p, nil
}

// fisherWeight returns the expected information about η = ln μ of one
// unit, (dP/dη)²/(P(1 − P)) = μ²e^{−μ}/(1 − e^{−μ}) = μ²/expm1(μ).
func fisherWeight(mu float64) float64 {
	switch {
	case mu < 1e-5:
		return mu * (1 - mu/2 + mu*mu/12)
	case mu > 700:
		return 0
	}
	return mu * mu / math.Expm1(mu)
}

// simulate draws s.Simulations studies from the plan's model and fits them.
func simulate(p Plan, s PlanSettings) Simulation {
	src := rand.NewPCG(s.Seed, s.Seed)
	sim := Simulation{Studies: s.Simulations, Seed: s.Seed}
	exp := make([]Exposure, len(p.Exposures))
	var ds, los, ups, rhw []float64
	hskIn := 0
	for range s.Simulations {
		for i, e := range p.Exposures {
			r := 0
			switch q := e.ProbabilityNegative; {
			case q >= 1:
				r = e.Units
			case q > 0:
				r = int(distuv.Binomial{N: float64(e.Units), P: q, Src: src}.Rand())
			}
			exp[i] = Exposure{Minutes: e.Minutes, Units: e.Units, Negative: r}
		}
		if h, err := HSK(p.Log10N0, exp); err == nil {
			sim.HSKComputable++
			if h.Estimate.Lower <= p.D && p.D <= h.Estimate.Upper {
				hskIn++
			}
			if _, err := LimitedHSK(p.Log10N0, exp); err == nil {
				sim.LimitedApplicable++
			}
		}
		m, err := MLE(p.Log10N0, exp, &MLESettings{FitN0: s.FitN0, Level: s.Level})
		if err != nil {
			sim.Refused++
			continue
		}
		e := m.Estimate
		ds, los, ups = append(ds, e.Value), append(los, e.Lower), append(ups, e.Upper)
		rhw = append(rhw, e.RelativeHalfWidth())
		if math.IsInf(e.Upper, 1) {
			sim.UnboundedUpper++
		}
	}
	fitted := len(ds)
	sim.Coverage, sim.HSKCoverage = math.NaN(), math.NaN()
	sim.MedianD, sim.MedianLower, sim.MedianUpper, sim.MedianRelativeHalfWidth = math.NaN(), math.NaN(), math.NaN(), math.NaN()
	if fitted > 0 {
		in := 0
		for i := range ds {
			if los[i] <= p.D && p.D <= ups[i] {
				in++
			}
		}
		sim.Coverage = float64(in) / float64(fitted)
		sim.MedianD, sim.MedianLower, sim.MedianUpper, sim.MedianRelativeHalfWidth = median(ds), median(los), median(ups), median(rhw)
	}
	if sim.HSKComputable > 0 {
		sim.HSKCoverage = float64(hskIn) / float64(sim.HSKComputable)
	}
	return sim
}

// median returns the median of x, sorting it in place (x is the caller's
// own scratch slice).
func median(x []float64) float64 {
	slices.Sort(x)
	m := len(x) / 2
	if len(x)%2 == 1 {
		return x[m]
	}
	return x[m-1]/2 + x[m]/2
}
