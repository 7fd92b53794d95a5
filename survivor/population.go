package survivor

import (
	"encoding/json"
	"fmt"
	"math"
	"strings"

	"github.com/dzf-go/dzf/internal/tdist"
)

// Default settings of CountPopulation (see PopulationSettings).
const (
	DefaultCountableMin = 30.0  // fewest colonies of a countable plate (common practice)
	DefaultCountableMax = 300.0 // most colonies of a countable plate (common practice)
	DefaultMaxCV        = 0.3   // CV between units above which a warning is given (project choice, no source)
)

// Plate is one plate (or membrane filter) counted for a unit.
//
// Dilution is the factor d of the plated liquid relative to the unit's
// suspension: the fraction of the unit's suspension in it, 10^-k after k
// tenfold dilutions (1e-4 for the fourth tenfold tube, 1 for the suspension
// itself; write math.Pow10(-k)). It is never the reciprocal: 1e4 is
// refused. PlatedML is the volume of that liquid spread or filtered, so the
// plate saw d·PlatedML mL of the unit's suspension and
//
//	count per unit = Colonies / (d · PlatedML) × Unit.SuspensionML
type Plate struct {
	Colonies float64 `json:"colonies"`  // colonies counted (normally a whole number)
	Dilution float64 `json:"dilution"`  // factor d in (0, 1]: 10^-k
	PlatedML float64 `json:"plated_ml"` // volume plated, mL
}

// Unit is one replicate unit (carrier) of a population assay: the volume of
// suspension its organisms were recovered into and the plates counted from
// it, at one or more dilutions.
type Unit struct {
	Label        string  `json:"label,omitempty"` // the laboratory's name for the unit (optional)
	SuspensionML float64 `json:"suspension_ml"`   // volume of the unit's suspension, mL (V)
	Plates       []Plate `json:"plates"`
}

// PopulationSettings configures CountPopulation. A nil
// *PopulationSettings means all defaults; a zero field means that field's
// default.
type PopulationSettings struct {
	// Level is the two-sided confidence level of the limits of the mean,
	// in (0, 1). Default 0.95.
	Level float64 `json:"level,omitempty"`
	// CountableMin and CountableMax bound the countable range of colonies
	// per plate, inclusive; plates outside it are set aside. Defaults 30
	// and 300 (common practice, no source: fewer colonies count too
	// imprecisely, more crowd and merge).
	CountableMin float64 `json:"countable_min,omitempty"`
	CountableMax float64 `json:"countable_max,omitempty"`
	// MaxCV is the coefficient of variation between units (SD/mean, a
	// fraction) above which CountPopulation warns. Default 0.3, a project
	// choice with no published source: counting noise alone gives about
	// 18 % at 30 colonies and 6 % at 300, so more points at differences
	// between units or in their handling.
	MaxCV float64 `json:"max_cv,omitempty"`
}

func (s *PopulationSettings) resolved() (PopulationSettings, error) {
	var r PopulationSettings
	if s != nil {
		r = *s
	}
	if r.Level == 0 {
		r.Level = DefaultLevel
	}
	if !(r.Level > 0 && r.Level < 1) {
		return r, fmt.Errorf("level %v: %w", r.Level, ErrLevel)
	}
	if r.CountableMin == 0 {
		r.CountableMin = DefaultCountableMin
	}
	if r.CountableMax == 0 {
		r.CountableMax = DefaultCountableMax
	}
	if r.MaxCV == 0 {
		r.MaxCV = DefaultMaxCV
	}
	switch {
	case !finite(r.CountableMin) || !finite(r.CountableMax) || r.CountableMin < 0 || !(r.CountableMin < r.CountableMax):
		return r, fmt.Errorf("countable range %v–%v colonies is not an increasing range of finite non-negative numbers: %w", r.CountableMin, r.CountableMax, ErrSettings)
	case !(r.MaxCV > 0) || math.IsInf(r.MaxCV, 0):
		return r, fmt.Errorf("MaxCV %v is not a finite positive number: %w", r.MaxCV, ErrSettings)
	}
	return r, nil
}

// UnitCount is the count of one unit.
type UnitCount struct {
	Index        int     `json:"index"`           // 0-based position in the caller's slice
	Label        string  `json:"label,omitempty"` // Unit.Label
	PerUnit      float64 `json:"per_unit"`        // survivors per unit: Σ colonies / Σ (d·v) × V over the countable plates
	Log10PerUnit float64 `json:"log10_per_unit"`  // log10 PerUnit
	Plates       int     `json:"plates"`          // countable plates used
	Colonies     float64 `json:"colonies"`        // Σ colonies of those plates
	PlatedML     float64 `json:"plated_ml"`       // Σ d·v: mL of the unit's suspension those plates saw
}

// SetAside is a plate that CountPopulation did not use, with the reason.
type SetAside struct {
	Unit     int     `json:"unit"`  // 0-based index of the unit
	Plate    int     `json:"plate"` // 0-based index of the plate within the unit
	Label    string  `json:"label,omitempty"`
	Colonies float64 `json:"colonies"`
	Dilution float64 `json:"dilution"`
	Reason   string  `json:"reason"`
}

// Population is the result of a population assay: the count per unit of
// each unit, their mean, spread and limits.
//
// With a single unit SD, CV, SE and the limits are NaN. A lower limit that
// the t interval puts at or below 0 is reported as 0 (log10 −Inf) with a
// warning. Population marshals to JSON with non-finite numbers written as
// the strings "NaN", "+Inf" and "-Inf".
type Population struct {
	Units    []UnitCount `json:"units"`
	SetAside []SetAside  `json:"set_aside,omitempty"`

	N          int      `json:"n"`           // units
	DF         int      `json:"df"`          // N − 1
	Mean       float64  `json:"mean"`        // mean count per unit over the units
	SD         float64  `json:"sd"`          // standard deviation of the unit counts
	SE         float64  `json:"se"`          // SD/√N
	CV         float64  `json:"cv"`          // SD/Mean, a fraction
	Log10Mean  float64  `json:"log10_mean"`  // log10 Mean
	Level      float64  `json:"level"`       // confidence level of the limits
	Lower      float64  `json:"lower"`       // lower limit of the mean, Mean − t·SE (0 when that is ≤ 0)
	Upper      float64  `json:"upper"`       // upper limit of the mean, Mean + t·SE
	Log10Lower float64  `json:"log10_lower"` // log10 Lower
	Log10Upper float64  `json:"log10_upper"` // log10 Upper
	Warnings   []string `json:"warnings,omitempty"`
}

// CountPopulation computes the population (survivors per unit) of a lot
// from plate counts of replicate units.
//
// Each unit's plates inside the countable range (PopulationSettings) are
// pooled:
//
//	count per unit = Σ c_j / Σ (d_j · v_j) × V
//
// over its countable plates j (colonies c, dilution factor d, plated volume
// v mL, suspension volume V mL). Pooling weights each plate by the volume
// of suspension it saw, which is the maximum-likelihood estimate when
// colonies are Poisson (hand-derived) and equals the mean of the plates'
// own estimates when they share one dilution and volume. The lot's
// population is the mean over units, with SD, CV = SD/mean and t-based
// limits on the unit counts,
//
//	mean ± t(N − 1, level) · SD/√N
//
// also reported as log10 of the limits. Plates outside the range are listed
// in SetAside with the reason.
//
// CountPopulation refuses, with an error wrapping the sentinel named: no
// unit (ErrNoUnits); a NaN, ±Inf, zero or negative suspension volume
// (ErrInvalidUnit); NaN, ±Inf or negative colonies, a dilution factor or
// plated volume that is NaN, ±Inf, zero or negative, a dilution factor
// above 1, or d·v above V (ErrInvalidPlate); a unit with no countable plate
// (ErrNoCountablePlate); an invalid level or setting (ErrLevel,
// ErrSettings). It warns on fewer than three units, on a CV above
// MaxCV, and on a lower limit at or below zero. It does not modify units.
func CountPopulation(units []Unit, s *PopulationSettings) (Population, error) {
	cfg, err := s.resolved()
	if err != nil {
		return Population{}, err
	}
	if len(units) == 0 {
		return Population{}, ErrNoUnits
	}
	res := Population{Units: make([]UnitCount, len(units)), N: len(units), DF: len(units) - 1, Level: cfg.Level}
	for i, u := range units {
		if !finite(u.SuspensionML) || !(u.SuspensionML > 0) {
			return Population{}, fmt.Errorf("%s: suspension volume %v mL: %w", unitName(i, u.Label), u.SuspensionML, ErrInvalidUnit)
		}
		var colonies, seen float64
		used := 0
		for j, p := range u.Plates {
			if err := p.check(u.SuspensionML); err != "" {
				return Population{}, fmt.Errorf("%s, plate %d (colonies %v, dilution %v, %v mL plated): %s: %w", unitName(i, u.Label), j, p.Colonies, p.Dilution, p.PlatedML, err, ErrInvalidPlate)
			}
			reason := ""
			switch {
			case p.Colonies < cfg.CountableMin:
				reason = fmt.Sprintf("%v colonies, below the countable range %v–%v", p.Colonies, cfg.CountableMin, cfg.CountableMax)
			case p.Colonies > cfg.CountableMax:
				reason = fmt.Sprintf("%v colonies, above the countable range %v–%v", p.Colonies, cfg.CountableMin, cfg.CountableMax)
			}
			if reason != "" {
				res.SetAside = append(res.SetAside, SetAside{Unit: i, Plate: j, Label: u.Label, Colonies: p.Colonies, Dilution: p.Dilution, Reason: reason})
				continue
			}
			colonies += p.Colonies
			seen += p.Dilution * p.PlatedML
			used++
		}
		if used == 0 {
			return Population{}, fmt.Errorf("%s: none of its %d plate(s) lies in the countable range %v–%v colonies: %w", unitName(i, u.Label), len(u.Plates), cfg.CountableMin, cfg.CountableMax, ErrNoCountablePlate)
		}
		per := colonies / seen * u.SuspensionML
		if !finite(per) {
			return Population{}, fmt.Errorf("%s: %v colonies in %v mL of suspension give %v per unit: %w", unitName(i, u.Label), colonies, seen, per, ErrNotFinite)
		}
		res.Units[i] = UnitCount{Index: i, Label: u.Label, PerUnit: per, Log10PerUnit: math.Log10(per), Plates: used, Colonies: colonies, PlatedML: seen}
	}

	// Two-pass mean and SD of the unit counts.
	k := float64(res.N)
	var m float64
	for _, u := range res.Units {
		m += u.PerUnit
	}
	m /= k
	var ss, c float64
	for _, u := range res.Units {
		d := u.PerUnit - m
		ss += d * d
		c += d
	}
	if res.N > 1 {
		m += c / k
		res.SD = math.Sqrt((ss - c*c/k) / (k - 1))
	} else {
		res.SD = math.NaN()
	}
	if !finite(m) || !finite(ss) {
		return Population{}, fmt.Errorf("the mean or SD of %d unit counts overflows: %w", res.N, ErrNotFinite)
	}
	res.Mean, res.Log10Mean = m, math.Log10(m)
	res.SE = res.SD / math.Sqrt(k)
	res.CV = res.SD / m
	res.Lower, res.Upper = math.NaN(), math.NaN()

	if res.N < 3 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("%d unit(s) counted, fewer than 3: the mean rests on too few replicates", res.N))
	}
	if res.N > 1 {
		t := tdist.TwoSided(cfg.Level, res.DF)
		res.Lower, res.Upper = m-t*res.SE, m+t*res.SE
		if res.CV > cfg.MaxCV {
			res.Warnings = append(res.Warnings, fmt.Sprintf("CV between units %.1f %% is above %.0f %%: the units differ more than plate counting explains", 100*res.CV, 100*cfg.MaxCV))
		}
		if res.Lower <= 0 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("the %g %% t interval of the mean reaches %.4g, at or below 0: the lower limit is reported as 0 (log10 -Inf)", 100*cfg.Level, res.Lower))
			res.Lower = 0
		}
	} else {
		res.Warnings = append(res.Warnings, "a single unit: no spread between units, so no SD, CV or limits (NaN)")
	}
	res.Log10Lower, res.Log10Upper = math.Log10(res.Lower), math.Log10(res.Upper)
	return res, nil
}

// unitName names a unit in messages: "unit 2" or "unit 2 (label)".
func unitName(i int, label string) string {
	if label == "" {
		return fmt.Sprintf("unit %d", i)
	}
	return fmt.Sprintf("unit %d (%s)", i, label)
}

// check returns why the plate is invalid, or "".
func (p Plate) check(suspensionML float64) string {
	switch {
	case !finite(p.Colonies) || p.Colonies < 0:
		return "colonies must be a finite number ≥ 0"
	case !finite(p.Dilution) || !(p.Dilution > 0):
		return "dilution factor must be a finite number > 0"
	case p.Dilution > 1:
		return "dilution factor above 1: enter the factor d = 10^-k (1e-4, not 1e4)"
	case !finite(p.PlatedML) || !(p.PlatedML > 0):
		return "plated volume must be a finite number of mL > 0"
	case p.Dilution*p.PlatedML > suspensionML*(1+1e-9):
		return fmt.Sprintf("the plate would hold d·v = %v mL of the unit's suspension, more than its %v mL", p.Dilution*p.PlatedML, suspensionML)
	}
	return ""
}

// String formats the population for reading.
func (p Population) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "population: %d unit(s)\n", p.N)
	for _, u := range p.Units {
		name := u.Label
		if name == "" {
			name = fmt.Sprintf("unit %d", u.Index)
		}
		fmt.Fprintf(&b, "  %-12s %.4g per unit (log10 %.3f) from %d plate(s)\n", name, u.PerUnit, u.Log10PerUnit, u.Plates)
	}
	fmt.Fprintf(&b, "  mean %.4g per unit (log10 %.3f), SD %.3g, CV %.1f %%\n", p.Mean, p.Log10Mean, p.SD, 100*p.CV)
	fmt.Fprintf(&b, "  %g %% limits of the mean %.4g – %.4g (log10 %.3f – %.3f)\n", 100*p.Level, p.Lower, p.Upper, p.Log10Lower, p.Log10Upper)
	for _, s := range p.SetAside {
		fmt.Fprintf(&b, "  set aside: unit %d plate %d (dilution %g): %s\n", s.Unit, s.Plate, s.Dilution, s.Reason)
	}
	for _, w := range p.Warnings {
		fmt.Fprintf(&b, "  warning: %s\n", w)
	}
	return b.String()
}

type populationJSON struct {
	Units      []UnitCount `json:"units"`
	SetAside   []SetAside  `json:"set_aside,omitempty"`
	N          int         `json:"n"`
	DF         int         `json:"df"`
	Mean       jsonNum     `json:"mean"`
	SD         jsonNum     `json:"sd"`
	SE         jsonNum     `json:"se"`
	CV         jsonNum     `json:"cv"`
	Log10Mean  jsonNum     `json:"log10_mean"`
	Level      jsonNum     `json:"level"`
	Lower      jsonNum     `json:"lower"`
	Upper      jsonNum     `json:"upper"`
	Log10Lower jsonNum     `json:"log10_lower"`
	Log10Upper jsonNum     `json:"log10_upper"`
	Warnings   []string    `json:"warnings,omitempty"`
}

// MarshalJSON implements json.Marshaler, writing non-finite numbers (the
// SD and limits of a single unit, the log10 of a zero lower limit) as
// "NaN", "+Inf" or "-Inf".
func (p Population) MarshalJSON() ([]byte, error) {
	return json.Marshal(populationJSON{p.Units, p.SetAside, p.N, p.DF, jsonNum(p.Mean), jsonNum(p.SD), jsonNum(p.SE), jsonNum(p.CV),
		jsonNum(p.Log10Mean), jsonNum(p.Level), jsonNum(p.Lower), jsonNum(p.Upper), jsonNum(p.Log10Lower), jsonNum(p.Log10Upper), p.Warnings})
}

// UnmarshalJSON implements json.Unmarshaler, accepting numbers and the
// strings "NaN", "Inf", "+Inf" and "-Inf".
func (p *Population) UnmarshalJSON(b []byte) error {
	var j populationJSON
	if err := json.Unmarshal(b, &j); err != nil {
		return err
	}
	*p = Population{j.Units, j.SetAside, j.N, j.DF, float64(j.Mean), float64(j.SD), float64(j.SE), float64(j.CV),
		float64(j.Log10Mean), float64(j.Level), float64(j.Lower), float64(j.Upper), float64(j.Log10Lower), float64(j.Log10Upper), j.Warnings}
	return nil
}
