package lethality

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// DefaultBand is the width of the sterilization temperature band above the
// sterilization temperature, in °C: the band runs from the sterilization
// temperature to 3 °C above it. From memory of the common steam-sterilizer
// standard; verify against the standard that governs the sterilizer, and
// override it with CycleSettings.Band.
const DefaultBand = 3.0

// CycleSettings configures Cycle. A nil *CycleSettings and every zero field
// mean the defaults.
type CycleSettings struct {
	// Celsius is the sterilization temperature (°C), the lower end of the
	// band; 0 means the reference temperature.
	Celsius float64 `json:"celsius,omitempty"`
	// Band is the band's width above Celsius (°C); default DefaultBand.
	Band float64 `json:"band,omitempty"`
	// F configures each probe's F (rule, gaps); Cumulative is honoured.
	F FSettings `json:"f"`
	// BridgeMissing accepts cells marked missing (NaN): each is left out of
	// its probe, whose F then bridges it by the rule and whose temperature
	// is interpolated linearly across it for the phase times; every such
	// cell is listed in CycleResult.Missing and warned about. Without it a
	// missing cell is refused with ErrMissing.
	BridgeMissing bool `json:"bridge_missing,omitempty"`
}

// ProbeCycle is one probe's part of a cycle.
type ProbeCycle struct {
	Probe string  `json:"probe"`
	F     FResult `json:"f"`
	// MinCelsius and MaxCelsius are the extreme readings of the probe.
	MinCelsius float64 `json:"min_celsius"`
	MaxCelsius float64 `json:"max_celsius"`
	// Reached says whether the probe reached the sterilization
	// temperature, first at ReachMinutes (interpolated between samples).
	Reached      bool    `json:"reached"`
	ReachMinutes float64 `json:"reach_minutes"`
	// AtOrAbove is the total time (minutes) the probe was at or above the
	// sterilization temperature, the temperature taken as linear between
	// samples.
	AtOrAbove float64 `json:"at_or_above_minutes"`
	// Missing counts the probe's cells marked missing.
	Missing int `json:"missing"`
}

// CycleResult is the analysis of a multi-probe cycle. Phase times are in
// minutes, taking each probe's temperature as linear between its samples.
type CycleResult struct {
	Reference Reference `json:"reference"`
	// Celsius is the sterilization temperature; the band is BandLow
	// (= Celsius) to BandHigh.
	Celsius  float64 `json:"celsius"`
	BandLow  float64 `json:"band_low"`
	BandHigh float64 `json:"band_high"`

	Probes []ProbeCycle `json:"probes"`
	// ColdSpot is the index of the probe with the smallest F (MinF).
	ColdSpot      int     `json:"cold_spot"`
	ColdSpotProbe string  `json:"cold_spot_probe"`
	MinF          float64 `json:"min_f"`

	// AllReached says whether every probe reached the sterilization
	// temperature. Equilibration runs from the first probe reaching it
	// (EquilibrationStart) to the last (EquilibrationEnd).
	AllReached         bool    `json:"all_reached"`
	EquilibrationStart float64 `json:"equilibration_start"`
	EquilibrationEnd   float64 `json:"equilibration_end"`
	Equilibration      float64 `json:"equilibration_minutes"`

	// HoldFound says whether every probe was at or above the sterilization
	// temperature at once. The hold is the first such period, from
	// HoldStart to HoldEnd; AllAtOrAbove the total time of all such
	// periods.
	HoldFound    bool    `json:"hold_found"`
	HoldStart    float64 `json:"hold_start"`
	HoldEnd      float64 `json:"hold_end"`
	Hold         float64 `json:"hold_minutes"`
	AllAtOrAbove float64 `json:"all_at_or_above_minutes"`
	// HoldMin and HoldMax are the lowest and highest temperature of any
	// probe during the hold, HoldSpread the largest difference between
	// probes at one instant of it; WithinBand says whether the hold stayed
	// in the band.
	HoldMin    float64 `json:"hold_min"`
	HoldMax    float64 `json:"hold_max"`
	HoldSpread float64 `json:"hold_spread"`
	WithinBand bool    `json:"within_band"`

	// Missing lists the cells marked missing that were bridged.
	Missing  []Cell   `json:"missing,omitempty"`
	Warnings []string `json:"warnings,omitempty"`
}

// String formats the result: the cold spot, the phases, one line per probe,
// then the warnings.
func (c CycleResult) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "cycle against %v; sterilization %g °C, band %g–%g °C\n", c.Reference, c.Celsius, c.BandLow, c.BandHigh)
	fmt.Fprintf(&b, "cold spot %s: F %.4g min\n", c.ColdSpotProbe, c.MinF)
	if c.AllReached {
		fmt.Fprintf(&b, "equilibration %.4g min (%.4g–%.4g min)\n", c.Equilibration, c.EquilibrationStart, c.EquilibrationEnd)
	} else {
		b.WriteString("equilibration: not every probe reached the sterilization temperature\n")
	}
	if c.HoldFound {
		band := "within band"
		if !c.WithinBand {
			band = "OUTSIDE band"
		}
		fmt.Fprintf(&b, "hold %.4g min (%.4g–%.4g min), %.4g–%.4g °C, spread %.4g °C, %s\n",
			c.Hold, c.HoldStart, c.HoldEnd, c.HoldMin, c.HoldMax, c.HoldSpread, band)
	} else {
		b.WriteString("hold: the probes were never all at or above the sterilization temperature\n")
	}
	for _, p := range c.Probes {
		reach := "not reached"
		if p.Reached {
			reach = fmt.Sprintf("reached at %.4g min", p.ReachMinutes)
		}
		fmt.Fprintf(&b, "  %s: F %.4g min, %.4g–%.4g °C, %s, %.4g min at or above\n",
			p.Probe, p.F.F, p.MinCelsius, p.MaxCelsius, reach, p.AtOrAbove)
	}
	for _, w := range c.Warnings {
		b.WriteString("  warning: " + w + "\n")
	}
	return strings.TrimSuffix(b.String(), "\n")
}

// probeTrack is one probe's temperature at every row: present or
// interpolated across missing cells; defined only between its first and
// last reading.
type probeTrack struct {
	v          []float64
	first, end int // rows first … end−1 are defined
}

// Cycle analyses a multi-probe record against a reference and a
// sterilization temperature band: F per probe and the cold spot (smallest
// F), each probe's time at or above the sterilization temperature, the
// equilibration time (from the first probe reaching the temperature to the
// last), the hold (the first period with every probe at or above it), the
// extremes and spread of the probes during the hold, and whether the hold
// stayed within the band (default DefaultBand above the sterilization
// temperature).
//
// Cycle refuses a record without probes (ErrNoProbe), with fewer than two
// rows (ErrTooFewSamples), a row of the wrong length (ErrRowLength), a time
// or temperature that is infinite or a time that is NaN (ErrNonFinite),
// times that do not strictly increase (ErrTimeOrder), a missing (NaN)
// reading unless s.BridgeMissing (ErrMissing), a probe with fewer than two
// readings, invalid settings (ErrInvalidSetting), and what F refuses. It
// does not modify rec.
func Cycle(rec Record, ref Reference, s *CycleSettings) (CycleResult, error) {
	var set CycleSettings
	if s != nil {
		set = *s
	}
	if err := ref.Validate(); err != nil {
		return CycleResult{}, err
	}
	ts := set.Celsius
	if ts == 0 {
		ts = ref.TRef
	}
	band := set.Band
	if band == 0 {
		band = DefaultBand
	}
	if !finite(ts) || !finite(band) || band < 0 {
		return CycleResult{}, fmt.Errorf("sterilization temperature %g °C, band %g °C: %w", ts, band, ErrInvalidSetting)
	}
	np := len(rec.Probes)
	if np == 0 {
		return CycleResult{}, fmt.Errorf("cycle: %w", ErrNoProbe)
	}
	if len(rec.Rows) < 2 {
		return CycleResult{}, fmt.Errorf("cycle with %d rows: %w", len(rec.Rows), ErrTooFewSamples)
	}
	res := CycleResult{Reference: ref, Celsius: ts, BandLow: ts, BandHigh: ts + band}
	for i, row := range rec.Rows {
		where := fmt.Sprintf("row %d (line %d, %g min)", i, row.Line, row.Minutes)
		if len(row.Celsius) != np {
			return CycleResult{}, fmt.Errorf("%s: %d temperatures for %d probes: %w", where, len(row.Celsius), np, ErrRowLength)
		}
		if !finite(row.Minutes) {
			return CycleResult{}, fmt.Errorf("%s: %w", where, ErrNonFinite)
		}
		if i > 0 && !(row.Minutes > rec.Rows[i-1].Minutes) {
			return CycleResult{}, fmt.Errorf("%s after %g min: %w", where, rec.Rows[i-1].Minutes, ErrTimeOrder)
		}
		for p, c := range row.Celsius {
			switch {
			case math.IsNaN(c):
				if !set.BridgeMissing {
					return CycleResult{}, fmt.Errorf("%s, probe %q: %w", where, rec.Probes[p], ErrMissing)
				}
				res.Missing = append(res.Missing, missingCell(rec, i, p))
			case math.IsInf(c, 0):
				return CycleResult{}, fmt.Errorf("%s, probe %q: %g °C: %w", where, rec.Probes[p], c, ErrNonFinite)
			}
		}
	}

	// Per probe: F, extremes, reach time, time at or above.
	res.Probes = make([]ProbeCycle, np)
	tracks := make([]probeTrack, np)
	res.MinF = math.Inf(1)
	for p := range np {
		series, skipped, err := rec.Series(p)
		if err != nil {
			return CycleResult{}, err
		}
		if len(series) < 2 {
			return CycleResult{}, fmt.Errorf("probe %q has %d readings: %w", rec.Probes[p], len(series), ErrTooFewSamples)
		}
		f, err := F(series, ref, &set.F)
		if err != nil {
			return CycleResult{}, fmt.Errorf("probe %q: %w", rec.Probes[p], err)
		}
		pc := ProbeCycle{Probe: rec.Probes[p], F: f, Missing: skipped, MinCelsius: math.Inf(1), MaxCelsius: math.Inf(-1)}
		for k, x := range series {
			pc.MinCelsius = math.Min(pc.MinCelsius, x.Celsius)
			pc.MaxCelsius = math.Max(pc.MaxCelsius, x.Celsius)
			if k == 0 {
				if x.Celsius >= ts {
					pc.Reached, pc.ReachMinutes = true, x.Minutes
				}
				continue
			}
			lo, hi, ok := aboveSet(series[k-1], x, ts)
			if ok {
				pc.AtOrAbove += hi - lo
				if !pc.Reached {
					pc.Reached, pc.ReachMinutes = true, lo
				}
			}
		}
		if pc.Reached && pc.ReachMinutes == series[0].Minutes && series[0].Celsius >= ts {
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q is already at or above %g °C at its first reading (%g min): its reach time is that reading", pc.Probe, ts, series[0].Minutes))
		}
		res.Probes[p] = pc
		if f.F < res.MinF {
			res.MinF, res.ColdSpot, res.ColdSpotProbe = f.F, p, pc.Probe
		}
		for _, w := range f.Warnings {
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q: %s", pc.Probe, w))
		}
		tracks[p] = track(rec, p)
		if skipped > 0 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q: %d missing reading(s) bridged (F by the %s rule, phase times by linear interpolation)", pc.Probe, skipped, f.Rule))
		}
	}

	// Equilibration.
	res.AllReached = true
	res.EquilibrationStart, res.EquilibrationEnd = math.Inf(1), math.Inf(-1)
	for _, pc := range res.Probes {
		if !pc.Reached {
			res.AllReached = false
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q never reached %g °C", pc.Probe, ts))
			continue
		}
		res.EquilibrationStart = math.Min(res.EquilibrationStart, pc.ReachMinutes)
		res.EquilibrationEnd = math.Max(res.EquilibrationEnd, pc.ReachMinutes)
	}
	if res.AllReached {
		res.Equilibration = res.EquilibrationEnd - res.EquilibrationStart
	} else {
		res.EquilibrationStart, res.EquilibrationEnd = 0, 0
	}

	// The rows where every probe is defined.
	kLo, kHi := 0, len(rec.Rows)
	for p, tr := range tracks {
		if tr.first > 0 || tr.end < len(rec.Rows) {
			res.Warnings = append(res.Warnings, fmt.Sprintf("probe %q has no reading before %g min or after %g min: phases with every probe use that span only",
				rec.Probes[p], rec.Rows[tr.first].Minutes, rec.Rows[tr.end-1].Minutes))
		}
		kLo, kHi = max(kLo, tr.first), min(kHi, tr.end)
	}
	if kHi-kLo < 2 {
		res.Warnings = append(res.Warnings, "the probes have fewer than two rows with a reading of every probe: no hold")
		return res, nil
	}
	holdPhases(&res, rec, tracks, kLo, kHi, ts)
	if res.HoldFound {
		if res.AllReached && res.HoldStart > res.EquilibrationEnd {
			res.Warnings = append(res.Warnings, fmt.Sprintf("a probe fell below %g °C after reaching it: the hold starts at %.4g min, after the last probe first reached it (%.4g min)", ts, res.HoldStart, res.EquilibrationEnd))
		}
		if res.AllAtOrAbove > res.Hold*(1+1e-12)+1e-12 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("the probes were all at or above %g °C for %.4g min in all, %.4g min of it outside the first hold", ts, res.AllAtOrAbove, res.AllAtOrAbove-res.Hold))
		}
		if !res.WithinBand {
			res.Warnings = append(res.Warnings, fmt.Sprintf("a probe reached %.4g °C during the hold, above the band's %g °C", res.HoldMax, res.BandHigh))
		}
	} else {
		res.Warnings = append(res.Warnings, fmt.Sprintf("the probes were never all at or above %g °C at once: no hold", ts))
	}
	return res, nil
}

// missingCell returns the record's description of a missing cell, or one
// built from the row.
func missingCell(rec Record, i, p int) Cell {
	row := rec.Rows[i]
	for _, m := range rec.Missing {
		if m.Line == row.Line && m.Column == p+2 && row.Line != 0 {
			return m
		}
	}
	return Cell{Line: row.Line, Column: p + 2, Probe: rec.Probes[p], Minutes: row.Minutes, Reason: "missing"}
}

// aboveSet returns the part [lo, hi] of the interval from a to b where the
// linear temperature between them is at or above ts.
func aboveSet(a, b Sample, ts float64) (lo, hi float64, ok bool) {
	va, vb := a.Celsius >= ts, b.Celsius >= ts
	switch {
	case va && vb:
		return a.Minutes, b.Minutes, true
	case !va && !vb:
		return 0, 0, false
	}
	tc := a.Minutes + (ts-a.Celsius)/(b.Celsius-a.Celsius)*(b.Minutes-a.Minutes)
	tc = math.Min(math.Max(tc, a.Minutes), b.Minutes)
	if va {
		return a.Minutes, tc, true
	}
	return tc, b.Minutes, true
}

// track returns probe p's temperature at every row, interpolating linearly
// across missing cells between readings.
func track(rec Record, p int) probeTrack {
	n := len(rec.Rows)
	tr := probeTrack{v: make([]float64, n), first: n, end: 0}
	last := -1
	for k, row := range rec.Rows {
		c := row.Celsius[p]
		if math.IsNaN(c) {
			tr.v[k] = math.NaN()
			continue
		}
		tr.v[k] = c
		if last >= 0 && last < k-1 {
			t0, t1, c0 := rec.Rows[last].Minutes, row.Minutes, tr.v[last]
			for j := last + 1; j < k; j++ {
				tr.v[j] = c0 + (c-c0)*(rec.Rows[j].Minutes-t0)/(t1-t0)
			}
		}
		if last < 0 {
			tr.first = k
		}
		last = k
	}
	tr.end = last + 1
	return tr
}

// holdPhases finds the hold and its extremes over rows kLo … kHi−1.
func holdPhases(res *CycleResult, rec Record, tracks []probeTrack, kLo, kHi int, ts float64) {
	started, done := false, false
	for k := kLo; k+1 < kHi; k++ {
		t0, t1 := rec.Rows[k].Minutes, rec.Rows[k+1].Minutes
		lo, hi, ok := t0, t1, true
		for _, tr := range tracks {
			a, b, in := aboveSet(Sample{t0, tr.v[k]}, Sample{t1, tr.v[k+1]}, ts)
			if !in {
				ok = false
				break
			}
			lo, hi = math.Max(lo, a), math.Min(hi, b)
		}
		if !ok || lo > hi {
			if started {
				done = true
			}
			continue
		}
		res.AllAtOrAbove += hi - lo
		switch {
		case !started && hi > lo:
			started = true
			res.HoldStart, res.HoldEnd = lo, hi
		case started && !done && lo == t0 && res.HoldEnd == t0:
			res.HoldEnd = hi
		case started:
			done = true
		}
		if started && res.HoldEnd < t1 {
			done = true
		}
	}
	if !started {
		return
	}
	res.HoldFound = true
	res.Hold = res.HoldEnd - res.HoldStart
	// Extremes at the hold's ends and at the rows inside it: between rows
	// every probe is linear, so the extremes and the largest spread fall
	// on these instants.
	res.HoldMin, res.HoldMax = math.Inf(1), math.Inf(-1)
	point := func(value func(tr probeTrack) float64) {
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, tr := range tracks {
			// Within the hold every probe is at or above ts; the bound
			// removes rounding of the interpolated ends only.
			v := math.Max(value(tr), ts)
			lo, hi = math.Min(lo, v), math.Max(hi, v)
		}
		res.HoldMin, res.HoldMax = math.Min(res.HoldMin, lo), math.Max(res.HoldMax, hi)
		res.HoldSpread = math.Max(res.HoldSpread, hi-lo)
	}
	end := func(t float64) {
		// The interval holding t: the last row at or before it.
		k := kLo + sort.Search(kHi-kLo, func(j int) bool { return rec.Rows[kLo+j].Minutes > t }) - 1
		k = min(max(k, kLo), kHi-2)
		t0, t1 := rec.Rows[k].Minutes, rec.Rows[k+1].Minutes
		point(func(tr probeTrack) float64 { return tr.v[k] + (tr.v[k+1]-tr.v[k])*((t-t0)/(t1-t0)) })
	}
	end(res.HoldStart)
	for k := kLo; k < kHi; k++ {
		if t := rec.Rows[k].Minutes; t > res.HoldStart && t < res.HoldEnd {
			point(func(tr probeTrack) float64 { return tr.v[k] })
		}
	}
	end(res.HoldEnd)
	res.WithinBand = res.HoldMin >= res.BandLow && res.HoldMax <= res.BandHigh
}
