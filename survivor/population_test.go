package survivor

import (
	"encoding/json"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
)

// assay is an invented three-unit population assay whose unit counts are
// 1.0e8, 1.2e8 and 1.4e8 per unit (hand-worked below).
func assay() []Unit {
	return []Unit{
		{Label: "A-1", SuspensionML: 10, Plates: []Plate{
			{Colonies: 100, Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 100, Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 1000, Dilution: 1e-3, PlatedML: 0.1}, // above 300: set aside
			{Colonies: 10, Dilution: 1e-5, PlatedML: 0.1},   // below 30: set aside
		}},
		{Label: "A-2", SuspensionML: 10, Plates: []Plate{
			{Colonies: 120, Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 60, Dilution: 1e-5, PlatedML: 0.5}, // pooled across dilutions
		}},
		{SuspensionML: 20, Plates: []Plate{
			{Colonies: 70, Dilution: 1e-4, PlatedML: 0.1},
			{Colonies: 70, Dilution: 1e-4, PlatedML: 0.1},
		}},
	}
}

// tQ975df2 and tQ975df1 are t quantiles from R 4.2.2:
// sprintf("%.17g", qt(0.975, 2)) and sprintf("%.17g", qt(0.975, 1)).
const (
	tQ975df2 = 4.3026527297494619
	tQ975df1 = 12.706204736174694
)

// TestCountPopulation checks the assay against values hand-worked from the
// closed forms of the package documentation:
//
//	(100 + 100) / (1e-4·0.1 + 1e-4·0.1) · 10 = 1.0e8
//	(120 + 60) / (1e-4·0.1 + 1e-5·0.5) · 10 = 180 / 1.5e-5 · 10 = 1.2e8
//	#2:  (70 + 70) / (2 · 1e-4·0.1) · 20 = 1.4e8
//	mean 1.2e8, SD √((2e7² + 0 + 2e7²)/2) = 2e7, CV 1/6, SE 2e7/√3
//	limits 1.2e8 ∓ qt(0.975, 2) · 2e7/√3
func TestCountPopulation(t *testing.T) {
	p, err := CountPopulation(assay(), nil)
	if err != nil {
		t.Fatal(err)
	}
	tl := tol{rel: 1e-13}
	for i, want := range []struct {
		per, colonies, ml float64
		plates            int
	}{{1e8, 200, 2e-5, 2}, {1.2e8, 180, 1.5e-5, 2}, {1.4e8, 140, 2e-5, 2}} {
		u := p.Units[i]
		check(t, "per unit", u.PerUnit, want.per, tl)
		check(t, "log10 per unit", u.Log10PerUnit, math.Log10(want.per), tl)
		check(t, "colonies", u.Colonies, want.colonies, tl)
		check(t, "plated mL", u.PlatedML, want.ml, tl)
		if u.Plates != want.plates || u.Index != i {
			t.Errorf("unit %d: %d plates, index %d", i, u.Plates, u.Index)
		}
	}
	if p.Units[0].Label != "A-1" || p.Units[2].Label != "" {
		t.Errorf("labels %q %q", p.Units[0].Label, p.Units[2].Label)
	}
	se := 2e7 / math.Sqrt(3)
	check(t, "mean", p.Mean, 1.2e8, tl)
	check(t, "SD", p.SD, 2e7, tol{rel: 1e-12})
	check(t, "SE", p.SE, se, tol{rel: 1e-12})
	check(t, "CV", p.CV, 1.0/6, tol{rel: 1e-12})
	check(t, "log10 mean", p.Log10Mean, math.Log10(1.2e8), tl)
	check(t, "lower", p.Lower, 1.2e8-tQ975df2*se, tol{rel: 1e-12})
	check(t, "upper", p.Upper, 1.2e8+tQ975df2*se, tol{rel: 1e-12})
	check(t, "log10 lower", p.Log10Lower, math.Log10(1.2e8-tQ975df2*se), tol{rel: 1e-12})
	check(t, "log10 upper", p.Log10Upper, math.Log10(1.2e8+tQ975df2*se), tol{rel: 1e-12})
	if p.N != 3 || p.DF != 2 || p.Level != 0.95 {
		t.Errorf("n %d df %d level %v", p.N, p.DF, p.Level)
	}
	if len(p.Warnings) != 0 {
		t.Errorf("warnings %q, want none", p.Warnings)
	}
	if len(p.SetAside) != 2 {
		t.Fatalf("set aside %+v, want two plates", p.SetAside)
	}
	a, b := p.SetAside[0], p.SetAside[1]
	if a.Unit != 0 || a.Plate != 2 || a.Colonies != 1000 || !strings.Contains(a.Reason, "above the countable range 30–300") ||
		b.Unit != 0 || b.Plate != 3 || b.Dilution != 1e-5 || !strings.Contains(b.Reason, "below the countable range 30–300") {
		t.Errorf("set aside %+v", p.SetAside)
	}
}

func TestCountPopulationSettings(t *testing.T) {
	// A 25–250 range keeps the 10-colony plate out and moves nothing else;
	// with a 5–1000 range every plate of A-1 counts:
	// (100 + 100 + 1000 + 10) / (1e-5 + 1e-5 + 1e-4 + 1e-6) · 10 = 1210/1.21e-4 · 10 = 1e8
	// (hand-worked).
	p, err := CountPopulation(assay(), &PopulationSettings{CountableMin: 5, CountableMax: 1000})
	if err != nil {
		t.Fatal(err)
	}
	check(t, "A-1 per unit", p.Units[0].PerUnit, 1e8, tol{rel: 1e-13})
	if p.Units[0].Plates != 4 || len(p.SetAside) != 0 {
		t.Errorf("A-1 used %d plates, set aside %+v", p.Units[0].Plates, p.SetAside)
	}
	// Level 0.90 narrows the limits: qt(0.95, 2) = 2.9199855803537238
	// (R 4.2.2: sprintf("%.17g", qt(0.95, 2))).
	p, err = CountPopulation(assay(), &PopulationSettings{Level: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	check(t, "lower at 0.90", p.Lower, 1.2e8-2.9199855803537238*2e7/math.Sqrt(3), tol{rel: 1e-12})
	// A MaxCV below 1/6 warns.
	p, err = CountPopulation(assay(), &PopulationSettings{MaxCV: 0.1})
	if err != nil {
		t.Fatal(err)
	}
	if !hasWarning(p.Warnings, "CV between units 16.7 % is above 10 %") {
		t.Errorf("warnings %q", p.Warnings)
	}
}

func TestCountPopulationWideLimits(t *testing.T) {
	// Two units, 1e6 and 1e8 per unit (hand-worked: 100/(1e-4·1)·1 and
	// 100/(1e-6·1)·1): mean 5.05e7, SD 9.9e7/√2, SE 4.95e7; the lower t
	// limit 5.05e7 − qt(0.975, 1)·4.95e7 is negative, so it is reported as 0.
	units := []Unit{
		{SuspensionML: 1, Plates: []Plate{{Colonies: 100, Dilution: 1e-4, PlatedML: 1}}},
		{SuspensionML: 1, Plates: []Plate{{Colonies: 100, Dilution: 1e-6, PlatedML: 1}}},
	}
	p, err := CountPopulation(units, nil)
	if err != nil {
		t.Fatal(err)
	}
	check(t, "mean", p.Mean, 5.05e7, tol{rel: 1e-13})
	check(t, "SD", p.SD, 9.9e7/math.Sqrt2, tol{rel: 1e-12})
	check(t, "upper", p.Upper, 5.05e7+tQ975df1*4.95e7, tol{rel: 1e-12})
	if p.Lower != 0 || !math.IsInf(p.Log10Lower, -1) {
		t.Errorf("lower %v (log10 %v), want 0 (-Inf)", p.Lower, p.Log10Lower)
	}
	for _, w := range []string{"2 unit(s) counted, fewer than 3", "CV between units 138.6 % is above 30 %", "reported as 0"} {
		if !hasWarning(p.Warnings, w) {
			t.Errorf("no warning %q in %q", w, p.Warnings)
		}
	}
	b, err := json.Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"log10_lower":"-Inf"`) {
		t.Errorf("JSON %s", b)
	}
}

func TestCountPopulationSingleUnit(t *testing.T) {
	p, err := CountPopulation(assay()[:1], nil)
	if err != nil {
		t.Fatal(err)
	}
	check(t, "mean", p.Mean, 1e8, tol{rel: 1e-13})
	for name, v := range map[string]float64{"SD": p.SD, "SE": p.SE, "CV": p.CV, "lower": p.Lower, "upper": p.Upper, "log10 lower": p.Log10Lower} {
		if !math.IsNaN(v) {
			t.Errorf("%s = %v, want NaN for one unit", name, v)
		}
	}
	if p.DF != 0 || !hasWarning(p.Warnings, "a single unit") || !hasWarning(p.Warnings, "1 unit(s) counted, fewer than 3") {
		t.Errorf("df %d, warnings %q", p.DF, p.Warnings)
	}
	b, err := json.Marshal(p)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"sd":"NaN"`) || !strings.Contains(string(b), `"mean":100000000`) {
		t.Errorf("JSON %s", b)
	}
	var back Population
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if back.Mean != p.Mean || !math.IsNaN(back.SD) || len(back.Units) != 1 || len(back.SetAside) != 2 || !slices.Equal(back.Warnings, p.Warnings) {
		t.Errorf("round trip %+v", back)
	}
}

func TestCountPopulationRefusals(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	plate := func(c, d, v float64) []Unit {
		u := assay()
		u[1].Plates[1] = Plate{Colonies: c, Dilution: d, PlatedML: v}
		return u
	}
	suspension := func(v float64) []Unit {
		u := assay()
		u[2].SuspensionML = v
		return u
	}
	tntc := assay()
	tntc[1].Plates = []Plate{{Colonies: 400, Dilution: 1e-4, PlatedML: 0.1}, {Colonies: 12, Dilution: 1e-5, PlatedML: 0.1}}
	noPlates := assay()
	noPlates[0].Plates = nil
	huge := []Unit{{SuspensionML: 10, Plates: []Plate{{Colonies: 100, Dilution: 1e-300, PlatedML: 1e-6}}}}
	big := []Unit{{SuspensionML: 1, Plates: []Plate{{Colonies: 100, Dilution: 1e-306, PlatedML: 1}}}, {SuspensionML: 1, Plates: []Plate{{Colonies: 100, Dilution: 1e-306, PlatedML: 1}}}}
	for _, tc := range []struct {
		name  string
		units []Unit
		s     *PopulationSettings
		err   error
		msg   string
	}{
		{"no units", nil, nil, ErrNoUnits, "no unit"},
		{"zero suspension", suspension(0), nil, ErrInvalidUnit, "unit 2: suspension volume 0 mL"},
		{"negative suspension", suspension(-10), nil, ErrInvalidUnit, "suspension volume -10"},
		{"NaN suspension", suspension(nan), nil, ErrInvalidUnit, "suspension volume NaN"},
		{"negative colonies", plate(-60, 1e-5, 0.5), nil, ErrInvalidPlate, "unit 1 (A-2), plate 1 (colonies -60"},
		{"NaN colonies", plate(nan, 1e-5, 0.5), nil, ErrInvalidPlate, "colonies NaN"},
		{"Inf colonies", plate(inf, 1e-5, 0.5), nil, ErrInvalidPlate, "colonies +Inf"},
		{"zero dilution", plate(60, 0, 0.5), nil, ErrInvalidPlate, "dilution 0,"},
		{"negative dilution", plate(60, -1e-5, 0.5), nil, ErrInvalidPlate, "dilution -1e-05"},
		{"NaN dilution", plate(60, nan, 0.5), nil, ErrInvalidPlate, "dilution NaN"},
		{"inverted dilution", plate(60, 1e5, 0.5), nil, ErrInvalidPlate, "1e-4, not 1e4"},
		{"zero volume", plate(60, 1e-5, 0), nil, ErrInvalidPlate, "0 mL plated"},
		{"Inf volume", plate(60, 1e-5, inf), nil, ErrInvalidPlate, "+Inf mL plated"},
		{"more than the suspension", plate(60, 1, 11), nil, ErrInvalidPlate, "more than its 10 mL"},
		{"no countable plate", tntc, nil, ErrNoCountablePlate, "unit 1 (A-2): none of its 2 plate(s)"},
		{"no plate", noPlates, nil, ErrNoCountablePlate, "unit 0 (A-1): none of its 0 plate(s)"},
		{"unit overflow", huge, nil, ErrNotFinite, "unit 0"},
		{"mean overflow", big, nil, ErrNotFinite, "mean or SD of 2 unit counts"},
		{"level", assay(), &PopulationSettings{Level: 1.2}, ErrLevel, "level 1.2"},
		{"empty range", assay(), &PopulationSettings{CountableMin: 300, CountableMax: 30}, ErrSettings, "countable range 300–30"},
		{"negative range", assay(), &PopulationSettings{CountableMin: -1}, ErrSettings, "countable range -1–300"},
		{"MaxCV", assay(), &PopulationSettings{MaxCV: -0.2}, ErrSettings, "MaxCV -0.2"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, err := CountPopulation(tc.units, tc.s)
			if !errors.Is(err, tc.err) {
				t.Fatalf("error %v, want %v", err, tc.err)
			}
			if !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("message %q does not contain %q", err, tc.msg)
			}
		})
	}
}

func TestCountPopulationNoMutation(t *testing.T) {
	units := assay()
	before := assay()
	if _, err := CountPopulation(units, nil); err != nil {
		t.Fatal(err)
	}
	for i := range units {
		if units[i].Label != before[i].Label || units[i].SuspensionML != before[i].SuspensionML || !slices.Equal(units[i].Plates, before[i].Plates) {
			t.Fatalf("unit %d changed: %+v", i, units[i])
		}
	}
}

func TestPopulationString(t *testing.T) {
	p, err := CountPopulation(assay(), nil)
	if err != nil {
		t.Fatal(err)
	}
	s := p.String()
	for _, sub := range []string{"population: 3 unit(s)", "A-1          1e+08 per unit (log10 8.000) from 2 plate(s)", "unit 2       1.4e+08", "mean 1.2e+08 per unit (log10 8.079), SD 2e+07, CV 16.7 %", "set aside: unit 0 plate 2"} {
		if !strings.Contains(s, sub) {
			t.Errorf("String() lacks %q:\n%s", sub, s)
		}
	}
}
