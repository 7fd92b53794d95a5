package lethality

import (
	"encoding/json"
	"errors"
	"math"
	"os"
	"strings"
	"testing"
)

func readFile(t *testing.T, name string, set *ReadSettings) Record {
	t.Helper()
	f, err := os.Open("../testdata/lethality/" + name)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rec, err := ReadRecord(f, set)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return rec
}

// checkHandCycle checks the analysis of the hand-constructed cycle of
// testdata/lethality/hand_cycle.csv (invented data, built so that the
// phases are known by hand; see the file's header).
func checkHandCycle(t *testing.T, what string, res CycleResult, tol float64) {
	t.Helper()
	// F per probe: Python 3.11 mpmath 1.2.1 (dps 40), sum over the
	// one-minute intervals of mpmath.quad(lambda t: 10**((T0+(T1-T0)*t-121)/10), [0, 1]).
	for p, want := range []float64{10.584280089525536, 6.5033956063166874, 10.71554800214591} {
		near(t, what+" F of "+res.Probes[p].Probe, res.Probes[p].F.F, want, 0, 1e-12+tol)
	}
	if res.ColdSpot != 1 || res.ColdSpotProbe != "B" {
		t.Errorf("%s: cold spot %d %q, want 1 B", what, res.ColdSpot, res.ColdSpotProbe)
	}
	// Hand-worked: A reaches 121 °C at 1 min, B at 3 min, C at 2.5 min
	// (119 → 123 between 2 and 3 min); A is at or above for 1–9 min, B for
	// 3–8, C from 2.5 to 8 + 1/3 (122 → 119 between 8 and 9 min).
	for p, want := range []struct{ reach, above float64 }{{1, 8}, {3, 5}, {2.5, 8 + 1.0/3 - 2.5}} {
		pc := res.Probes[p]
		if !pc.Reached {
			t.Errorf("%s: probe %s not reached", what, pc.Probe)
		}
		near(t, what+" reach "+pc.Probe, pc.ReachMinutes, want.reach, 1e-12+tol, 0)
		near(t, what+" at or above "+pc.Probe, pc.AtOrAbove, want.above, 1e-12+tol, 0)
	}
	near(t, what+" min A", res.Probes[0].MinCelsius, 111, 1e-12+tol, 0)
	near(t, what+" max C", res.Probes[2].MaxCelsius, 123.5, 1e-12+tol, 0)
	// Equilibration from 1 (A) to 3 min (B); hold 3–8 min (B at 121 °C
	// from 3 to 8 min, then falling); all at or above 5 min in all.
	if !res.AllReached || !res.HoldFound || !res.WithinBand {
		t.Errorf("%s: reached %v, hold %v, within band %v", what, res.AllReached, res.HoldFound, res.WithinBand)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"equilibration start", res.EquilibrationStart, 1}, {"equilibration end", res.EquilibrationEnd, 3},
		{"equilibration", res.Equilibration, 2},
		{"hold start", res.HoldStart, 3}, {"hold end", res.HoldEnd, 8}, {"hold", res.Hold, 5},
		{"all at or above", res.AllAtOrAbove, 5},
		// During the hold: lowest B 121, highest C 123.5 at 4 min, widest
		// spread 123.5 − 121 = 2.5 °C at 4 min; band 121–124.
		{"hold min", res.HoldMin, 121}, {"hold max", res.HoldMax, 123.5}, {"hold spread", res.HoldSpread, 2.5},
		{"band low", res.BandLow, 121}, {"band high", res.BandHigh, 124},
	} {
		near(t, what+" "+c.name, c.got, c.want, 1e-12+tol, 0)
	}
}

func TestCycleHandWorked(t *testing.T) {
	rec := readFile(t, "hand_cycle.csv", &ReadSettings{Time: TimeSeconds})
	res, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 121})
	if err != nil {
		t.Fatal(err)
	}
	checkHandCycle(t, "°C file", res, 0)
	if len(res.Warnings) != 0 {
		t.Errorf("warnings %q", res.Warnings)
	}
	if _, err := json.Marshal(res); err != nil {
		t.Error(err)
	}
	if s := res.String(); !strings.Contains(s, "cold spot B") || !strings.Contains(s, "hold 5 min (3–8 min)") {
		t.Errorf("String():\n%s", s)
	}
	// The same cycle in °F, RFC 3339 timestamps and semicolons.
	recF := readFile(t, "hand_cycle_fahrenheit.csv", &ReadSettings{Unit: Fahrenheit})
	resF, err := Cycle(recF, MoistHeat121(), &CycleSettings{Celsius: 121})
	if err != nil {
		t.Fatal(err)
	}
	checkHandCycle(t, "°F file", resF, 1e-12)

	// A narrower band (2 °C) puts C's 123.5 °C outside it, with a warning.
	narrow, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 121, Band: 2})
	if err != nil || narrow.WithinBand || len(narrow.Warnings) != 1 {
		t.Errorf("narrow band: %v, within %v, warnings %q", err, narrow.WithinBand, narrow.Warnings)
	}
	// A sterilization temperature no probe reaches: no hold.
	high, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 125})
	if err != nil || high.AllReached || high.HoldFound || len(high.Warnings) != 4 {
		t.Errorf("125 °C: %v, %+v", err, high)
	}
}

func TestCycleDipAndReturn(t *testing.T) {
	// Invented two-probe record: X dips below 121 °C between 4 and 6 min
	// (121 → 120 → 121), so the first hold is 2–4 min and all are at or
	// above again 6–8 min (hand-worked: 2 + 2 = 4 min in all).
	rec := Record{Probes: []string{"X", "Y"}}
	x := []float64{110, 118, 121, 122, 121, 120, 121, 122, 121, 110}
	y := []float64{112, 119, 121, 121, 121, 121, 121, 121, 121, 111}
	for k := range x {
		rec.Rows = append(rec.Rows, Row{Line: k + 2, Minutes: float64(k), Celsius: []float64{x[k], y[k]}})
	}
	res, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 121})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "hold start", res.HoldStart, 2, 1e-12, 0)
	near(t, "hold end", res.HoldEnd, 4, 1e-12, 0)
	near(t, "all at or above", res.AllAtOrAbove, 4, 1e-12, 0)
	near(t, "X at or above", res.Probes[0].AtOrAbove, 4, 1e-12, 0) // 2–4 and 6–8 min
	if len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], "outside the first hold") {
		t.Errorf("warnings %q", res.Warnings)
	}
}

func TestCycleMissing(t *testing.T) {
	set := &ReadSettings{Time: TimeMinutes, Missing: MissingMark}
	rec := readFile(t, "missing_cells.tsv", set)
	if _, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 121}); !errors.Is(err, ErrMissing) || !strings.Contains(err.Error(), "line 6") {
		t.Errorf("missing cells not bridged: %v", err)
	}
	res, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: 121, BridgeMissing: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Missing) != 2 || res.Missing[0].Line != 6 || res.Missing[1].Text != "ERR" || res.Probes[0].Missing != 1 || res.Probes[1].Missing != 1 {
		t.Errorf("missing %+v", res.Missing)
	}
	warned := 0
	for _, w := range res.Warnings {
		if strings.Contains(w, "bridged") {
			warned++
		}
	}
	if warned != 2 {
		t.Errorf("warnings %q", res.Warnings)
	}
	// P1 without its 2-min cell: samples 0 120, 0.5 121, 1 121.5, 1.5
	// 121.5, 2.5 121.0; the F is that of those samples (independent: F of
	// the series typed in by hand).
	want, _ := F([]Sample{{0, 120}, {0.5, 121}, {1, 121.5}, {1.5, 121.5}, {2.5, 121}}, MoistHeat121(), nil)
	near(t, "P1 F with a bridged cell", res.Probes[0].F.F, want.F, 0, 1e-15)
	// Hold: P1 interpolated at 2 min is 121.25, P2 at 1 min 121.25: all
	// at or above 121 from 0.5 to 2.5 min (hand-worked).
	near(t, "hold start", res.HoldStart, 0.5, 1e-12, 0)
	near(t, "hold end", res.HoldEnd, 2.5, 1e-12, 0)
	near(t, "hold max", res.HoldMax, 121.5, 1e-12, 0)
}

func TestCycleRefusals(t *testing.T) {
	good := func() Record {
		return Record{Probes: []string{"a"}, Rows: []Row{{Minutes: 0, Celsius: []float64{120}}, {Minutes: 1, Celsius: []float64{121}}}}
	}
	cases := []struct {
		name string
		edit func(*Record)
		set  *CycleSettings
		ref  Reference
		want error
	}{
		{"no probe", func(r *Record) { r.Probes = nil }, nil, MoistHeat(), ErrNoProbe},
		{"one row", func(r *Record) { r.Rows = r.Rows[:1] }, nil, MoistHeat(), ErrTooFewSamples},
		{"row length", func(r *Record) { r.Rows[1].Celsius = []float64{1, 2} }, nil, MoistHeat(), ErrRowLength},
		{"time order", func(r *Record) { r.Rows[1].Minutes = 0 }, nil, MoistHeat(), ErrTimeOrder},
		{"NaN time", func(r *Record) { r.Rows[0].Minutes = math.NaN() }, nil, MoistHeat(), ErrNonFinite},
		{"Inf temperature", func(r *Record) { r.Rows[0].Celsius[0] = math.Inf(1) }, nil, MoistHeat(), ErrNonFinite},
		{"missing", func(r *Record) { r.Rows[0].Celsius[0] = math.NaN() }, nil, MoistHeat(), ErrMissing},
		{"missing leaves one reading", func(r *Record) { r.Rows[0].Celsius[0] = math.NaN() }, &CycleSettings{BridgeMissing: true}, MoistHeat(), ErrTooFewSamples},
		{"negative band", func(*Record) {}, &CycleSettings{Band: -1}, MoistHeat(), ErrInvalidSetting},
		{"bad reference", func(*Record) {}, nil, Reference{}, ErrInvalidReference},
		{"gap", func(r *Record) { r.Rows[1].Minutes = 10 }, &CycleSettings{F: FSettings{MaxGap: 5}}, MoistHeat(), ErrGap},
	}
	for _, c := range cases {
		rec := good()
		c.edit(&rec)
		if _, err := Cycle(rec, c.ref, c.set); !errors.Is(err, c.want) {
			t.Errorf("%s: %v, want %v", c.name, err, c.want)
		}
	}
}
