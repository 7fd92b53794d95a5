package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"strings"
	"testing"
)

// The lots below are invented: supplier "Harrowgate Bioindicators", lot
// numbers HB-…, values chosen by hand so that each criterion's outcome is
// known from its definition (hand-worked margins in the comments).

func steamLabel() Label {
	return Label{Supplier: "Harrowgate Bioindicators", Product: "strip, steam", Lot: "HB-23-0711", Organism: "G. stearothermophilus",
		Modality: MoistHeat, Population: 1.0e6, D: 2.0, Celsius: 121, Z: 10, SurvivalTime: 8.0, KillTime: 19}
}

// steamMeasured passes every default criterion against steamLabel
// (hand-worked): population 10^6.1 = 126 % of label; D 1.9 (−5 %) and 1.95
// (−2.5 %), limits within 5.3 % and 4.6 %; windows at log10 N0 6.1:
// claimed survival 8 ≥ 4.1·1.9 = 7.79 and claimed kill 19 ≤ 10.1·1.9 =
// 19.19 min, 8 ≥ 4.1·1.95 = 7.995 and 19 ≤ 10.1·1.95 = 19.695 min; the
// label's own window, 8 ≥ (6 − 2)·2 = 8 and 19 ≤ (6 + 4)·2 = 20 min.
func steamMeasured() Measured {
	return Measured{
		Log10N0: &Estimate{Value: 6.1, Lower: 6.0, Upper: 6.2, Level: 0.95, Method: "plate count"},
		D: []Estimate{
			{Value: 1.9, Lower: 1.8, Upper: 2.0, Level: 0.95, Method: "survivor curve"},
			{Value: 1.95, Lower: 1.86, Upper: 2.04, Level: 0.95, Method: "HSK"},
		},
		Z:            &Estimate{Value: 10.4, Lower: 9.6, Upper: 11.3, Level: 0.95, Method: "z fit"},
		SurvivalTest: &UnitTest{Minutes: 8.0, Units: 50, Growth: 50},
		KillTest:     &UnitTest{Minutes: 19, Units: 50, Growth: 0},
	}
}

func find(t *testing.T, r Report, criterion, subject string) Finding {
	t.Helper()
	for _, f := range r.Findings {
		if f.Criterion == criterion && f.Subject == subject {
			return f
		}
	}
	t.Fatalf("no finding %q / %q in\n%v", criterion, subject, r)
	return Finding{}
}

func TestCheckLabelPasses(t *testing.T) {
	p := ISOMoistHeatProfile()
	r, err := CheckLabel(steamLabel(), steamMeasured(), &Criteria{Profile: &p, ZAgreement: Limit{Value: 0.1, Source: "laboratory procedure SOP-BI-04 (invented)"}})
	if err != nil {
		t.Fatal(err)
	}
	if r.Failed != 0 || r.NotAssessed != 0 || r.Summary != AllPassed {
		t.Fatalf("want every criterion passed:\n%v", r)
	}
	// 1 population, 2×2 D, 1 methods, 1 z, 1 + 2 windows, 2 tests, profile
	// 2 population + 3 D + 2 z.
	if want := 1 + 4 + 1 + 1 + 3 + 2 + 2 + 3 + 2; len(r.Findings) != want || r.Passed != want {
		t.Errorf("%d findings, %d passed, want %d", len(r.Findings), r.Passed, want)
	}
	pop := find(t, r, "population vs label", "")
	near(t, "population ratio", pop.Value, math.Pow(10, 0.1), 1e-12) // 10^6.1 / 10^6
	d := find(t, r, "D vs label", "survivor curve")
	near(t, "relative D", d.Value, -0.05, 1e-12) // (1.9 − 2)/2
	lim := find(t, r, "D limits", "HSK")
	near(t, "relative half-width", lim.Value, 0.09/1.95, 1e-12)
	w := find(t, r, "window vs label D", "")
	near(t, "label window margin", w.Value, 0, 1e-12) // min(8 − 8, 20 − 19)
	z := find(t, r, "z vs label", "")
	if z.Source != "laboratory procedure SOP-BI-04 (invented)" || z.Profile != FromLaboratory {
		t.Errorf("z source %q, profile %q", z.Source, z.Profile)
	}
	if f := find(t, r, "minimum z", "measured"); f.Profile != p.Name || f.Source != p.Status {
		t.Errorf("profile finding names %q / %q", f.Profile, f.Source)
	}
	if f := find(t, r, "D methods", ""); f.Source != SourceISOMethods || f.Profile != FromDefault {
		t.Errorf("methods source %q", f.Source)
	}
}

// TestCheckLabelFails breaks one criterion at a time and checks that just
// that finding fails.
func TestCheckLabelFails(t *testing.T) {
	steam := FDASteamProfile()
	for _, c := range []struct {
		name              string
		edit              func(*Label, *Measured, *Criteria)
		criterion, subjct string
	}{
		{"population 40 % of label", func(l *Label, m *Measured, _ *Criteria) { m.Log10N0.Value = math.Log10(4e5) }, "population vs label", ""},
		{"population 350 % of label", func(l *Label, m *Measured, _ *Criteria) { m.Log10N0.Value = math.Log10(3.5e6) }, "population vs label", ""},
		{"D 25 % below label", func(l *Label, m *Measured, _ *Criteria) { l.D = 2.6; l.SurvivalTime = 10.4 }, "D vs label", "survivor curve"},
		{"D limits 15 %", func(l *Label, m *Measured, _ *Criteria) { m.D[1].Lower, m.D[1].Upper = 1.70, 2.05 }, "D limits", "HSK"},
		{"D limits unbounded", func(l *Label, m *Measured, _ *Criteria) { m.D[1].Upper = math.Inf(1) }, "D limits", "HSK"},
		{"one method", func(l *Label, m *Measured, _ *Criteria) { m.D[1].Method = "Survivor Curve " }, "D methods", ""},
		{"z 20 % off", func(l *Label, m *Measured, _ *Criteria) { m.Z.Value = 12 }, "z vs label", ""},
		{"label kill time too long for label D", func(l *Label, m *Measured, _ *Criteria) { l.KillTime = 20.5; m.KillTest.Minutes = 20.5 }, "window vs label D", ""},
		{"label survival too short for measured D", func(l *Label, m *Measured, _ *Criteria) { l.SurvivalTime = 7.7; m.SurvivalTest.Minutes = 7.7 }, "window vs measured D", "survivor curve"},
		{"survival test 49 of 50", func(l *Label, m *Measured, _ *Criteria) { m.SurvivalTest.Growth = 49 }, "survival test", ""},
		{"kill test 1 of 50", func(l *Label, m *Measured, _ *Criteria) { m.KillTest.Growth = 1 }, "kill test", ""},
		{"profile z 6 under FDA steam z 10", func(l *Label, m *Measured, c *Criteria) {
			c.Profile = &steam
			l.Z, m.Z.Value = 9, 9.2
		}, "minimum z", "measured"},
		{"profile population under 10^5", func(l *Label, m *Measured, c *Criteria) {
			c.Profile = &steam
			m.Log10N0.Value = math.Log10(9e4)
		}, "minimum population", "measured"},
		{"profile D under 1.5 min", func(l *Label, m *Measured, c *Criteria) {
			c.Profile = &steam
			m.D[0].Value, m.D[0].Lower, m.D[0].Upper = 1.45, 1.4, 1.5
		}, "minimum D", "measured: survivor curve"},
	} {
		t.Run(c.name, func(t *testing.T) {
			l, m := steamLabel(), steamMeasured()
			cr := &Criteria{ZAgreement: Limit{Value: 0.1}}
			c.edit(&l, &m, cr)
			r, err := CheckLabel(l, m, cr)
			if err != nil {
				t.Fatal(err)
			}
			f := find(t, r, c.criterion, c.subjct)
			if f.Outcome != Fail {
				t.Errorf("outcome %q, want fail:\n%v", f.Outcome, r)
			}
			if r.Summary != SomeFailed || r.Failed < 1 {
				t.Errorf("summary %q with %d failed", r.Summary, r.Failed)
			}
		})
	}
}

func TestCheckLabelNotAssessed(t *testing.T) {
	l := steamLabel()
	l.Population, l.Z = 0, 0 // the certificate states neither
	m := steamMeasured()
	m.Log10N0, m.Z, m.KillTest = nil, nil, nil
	m.D[1].Lower, m.D[1].Upper = math.NaN(), math.NaN() // a method without limits
	p := ISOMoistHeatProfile()
	r, err := CheckLabel(l, m, &Criteria{ZAgreement: Limit{Value: 0.1}, Profile: &p})
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct{ criterion, subject, note string }{
		{"population vs label", "", "no population"},
		{"D limits", "HSK", "no limits"},
		{"z vs label", "", "no z"},
		{"window vs label D", "", "no D or no population"},
		{"window vs measured D", "survivor curve", "no population"},
		{"window vs measured D", "HSK", "no population"},
		{"kill test", "", "not performed"},
		{"minimum population", "label", "no population"},
		{"minimum population", "measured", "no measured population"},
		{"minimum z", "label", "no z"},
		{"minimum z", "measured", "no measured z"},
	} {
		f := find(t, r, c.criterion, c.subject)
		if f.Outcome != NotAssessed || !strings.Contains(f.Note, c.note) || !math.IsNaN(f.Value) {
			t.Errorf("%s / %s: outcome %q, note %q, value %v; want not assessed, %q, NaN", c.criterion, c.subject, f.Outcome, f.Note, f.Value, c.note)
		}
	}
	if r.Summary != NoneFailed || r.Failed != 0 || r.NotAssessed != 11 {
		t.Errorf("summary %q, %d failed, %d not assessed", r.Summary, r.Failed, r.NotAssessed)
	}
	// No measurement at all: nothing passes.
	r, err = CheckLabel(steamLabel(), Measured{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Passed != 1 || r.Summary != NoneFailed {
		// Only the label's own window (8–20 min computed, 7.5–21 claimed) can be assessed.
		t.Errorf("empty measurements: %d passed, summary %q\n%v", r.Passed, r.Summary, r)
	}
	r, err = CheckLabel(Label{Celsius: 121}, Measured{}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if r.Passed != 0 || r.Failed != 0 || r.Summary != NoneAssessed {
		t.Errorf("empty label and measurements: %d passed, summary %q", r.Passed, r.Summary)
	}
}

func TestCheckLabelEdges(t *testing.T) {
	t.Run("boundaries pass", func(t *testing.T) {
		l, m := steamLabel(), steamMeasured()
		m.Log10N0.Value = math.Log10(0.5e6)                        // exactly 50 % of label
		m.D[0].Value, m.D[0].Lower, m.D[0].Upper = 1.6, 1.44, 1.76 // −20 %, limits ±10 %
		r, err := CheckLabel(l, m, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range [][2]string{{"population vs label", ""}, {"D vs label", "survivor curve"}, {"D limits", "survivor curve"}} {
			if f := find(t, r, c[0], c[1]); f.Outcome != Pass {
				t.Errorf("%s at its boundary: %q (value %v)", c[0], f.Outcome, f.Value)
			}
		}
		m.Log10N0.Value = math.Log10(3e6) // exactly 300 %
		if r, _ = CheckLabel(l, m, nil); find(t, r, "population vs label", "").Outcome != Pass {
			t.Errorf("300 %% of label fails")
		}
		// Window at its boundary, hand-worked: (6.5 − 2)·1.6 = 7.2 min and
		// (6.5 + 4)·1.6 = 16.8 min.
		m.Log10N0.Value, l.SurvivalTime, l.KillTime = 6.5, 7.2, 16.8
		r, _ = CheckLabel(l, m, nil)
		if f := find(t, r, "window vs measured D", "survivor curve"); f.Outcome != Pass {
			t.Errorf("claimed survival equal to the computed one: %+v", f)
		}
		l.SurvivalTime = 7.19
		r, _ = CheckLabel(l, m, nil)
		if f := find(t, r, "window vs measured D", "survivor curve"); f.Outcome != Fail {
			t.Errorf("claimed survival 0.01 min under the computed one: %+v", f)
		}
	})
	t.Run("laboratory limits", func(t *testing.T) {
		r, err := CheckLabel(steamLabel(), steamMeasured(), &Criteria{DAgreement: Limit{Value: 0.04}, DMethods: Limit{Value: 3, Source: "site procedure (invented)"}})
		if err != nil {
			t.Fatal(err)
		}
		f := find(t, r, "D vs label", "survivor curve") // −5 % against ±4 %
		if f.Outcome != Fail || f.Profile != FromLaboratory || f.Source != SourceNone {
			t.Errorf("D agreement 4 %%: %+v", f)
		}
		if f := find(t, r, "D methods", ""); f.Outcome != Fail || f.Source != "site procedure (invented)" {
			t.Errorf("three methods asked: %+v", f)
		}
	})
	t.Run("profile temperature differs", func(t *testing.T) {
		l := steamLabel()
		l.Celsius = 132
		p := FDASteamProfile()
		r, err := CheckLabel(l, steamMeasured(), &Criteria{Profile: &p})
		if err != nil {
			t.Fatal(err)
		}
		if f := find(t, r, "minimum D", "label"); f.Outcome != NotAssessed || !strings.Contains(f.Note, "132") {
			t.Errorf("label D at 132 °C against a 121 °C minimum: %+v", f)
		}
		if f := find(t, r, "minimum D", "measured: HSK"); f.Outcome != NotAssessed {
			t.Errorf("measured D at 132 °C against a 121 °C minimum: %+v", f)
		}
	})
	t.Run("ethylene oxide profile at the label's conditions", func(t *testing.T) {
		l := Label{Supplier: "Harrowgate Bioindicators", Lot: "HB-EO-0042", Modality: EthyleneOxide, Population: 2e6, D: 3.4, Celsius: 54}
		m := Measured{D: []Estimate{{Value: 3.3, Lower: 3.1, Upper: 3.5, Level: 0.95, Method: "survivor curve"}, {Value: 2.9, Lower: 2.7, Upper: 3.1, Level: 0.95, Method: "SMC"}}}
		p := FDAEthyleneOxideProfile()
		r, err := CheckLabel(l, m, &Criteria{Profile: &p})
		if err != nil {
			t.Fatal(err)
		}
		if f := find(t, r, "minimum D", "measured: survivor curve"); f.Outcome != Pass {
			t.Errorf("3.3 ≥ 3 min: %+v", f)
		}
		if f := find(t, r, "minimum D", "measured: SMC"); f.Outcome != Fail {
			t.Errorf("2.9 < 3 min: %+v", f)
		}
		if f := find(t, r, "minimum population", "label"); f.Outcome != Pass {
			t.Errorf("2e6 ≥ 1e6: %+v", f)
		}
	})
	t.Run("tests at other times", func(t *testing.T) {
		m := steamMeasured()
		m.SurvivalTest.Minutes, m.KillTest.Minutes = 7, 22
		r, err := CheckLabel(steamLabel(), m, nil)
		if err != nil {
			t.Fatal(err)
		}
		if f := find(t, r, "survival test", ""); f.Outcome != NotAssessed || !strings.Contains(f.Note, "shorter") {
			t.Errorf("survival test at 7 min for a 7.5 min claim: %+v", f)
		}
		if f := find(t, r, "kill test", ""); f.Outcome != NotAssessed || !strings.Contains(f.Note, "longer") {
			t.Errorf("kill test at 22 min for a 21 min claim: %+v", f)
		}
	})
	t.Run("population too small for a window", func(t *testing.T) {
		m := steamMeasured()
		m.Log10N0.Value = 1.5
		r, err := CheckLabel(steamLabel(), m, nil)
		if err != nil {
			t.Fatal(err)
		}
		if f := find(t, r, "window vs measured D", "HSK"); f.Outcome != Fail || !strings.Contains(f.Note, "log10 N0 ≤ 2") {
			t.Errorf("log10 N0 1.5: %+v", f)
		}
	})
	t.Run("labelled population used for the window", func(t *testing.T) {
		m := steamMeasured()
		m.Log10N0 = nil
		r, err := CheckLabel(steamLabel(), m, nil)
		if err != nil {
			t.Fatal(err)
		}
		// log10 N0 6 from the label: 8 ≥ (6 − 2)·1.9 = 7.6; 19 ≤ (6 + 4)·1.9 = 19:
		// margins 0.4 and 0.
		f := find(t, r, "window vs measured D", "survivor curve")
		if f.Outcome != Pass || !strings.Contains(f.Note, "labelled one") {
			t.Errorf("%+v", f)
		}
		near(t, "margin", f.Value, 0, 1e-12)
	})
	t.Run("unnamed methods count as one", func(t *testing.T) {
		m := steamMeasured()
		m.D[0].Method, m.D[1].Method = "", " "
		r, err := CheckLabel(steamLabel(), m, nil)
		if err != nil {
			t.Fatal(err)
		}
		if f := find(t, r, "D methods", ""); f.Outcome != Fail || f.Value != 1 {
			t.Errorf("two unnamed estimates: %+v", f)
		}
		find(t, r, "D vs label", "(unnamed method)")
		if n := len(r.Warnings); n != 1 || !hasWarning(r.Warnings, "names no method") {
			t.Errorf("warnings %q", r.Warnings)
		}
	})
	t.Run("no measured D", func(t *testing.T) {
		m := steamMeasured()
		m.D = nil
		r, err := CheckLabel(steamLabel(), m, nil)
		if err != nil {
			t.Fatal(err)
		}
		for _, c := range []string{"D vs label", "D limits", "D methods", "window vs measured D"} {
			if f := find(t, r, c, ""); f.Outcome != NotAssessed {
				t.Errorf("%s without D: %+v", c, f)
			}
		}
	})
}

func TestCheckLabelKeepsInput(t *testing.T) {
	m := steamMeasured()
	m.D[0].Warnings = []string{"five exposures only"}
	before := append([]Estimate(nil), m.D...)
	r, err := CheckLabel(steamLabel(), m, nil)
	if err != nil {
		t.Fatal(err)
	}
	for i := range m.D {
		if m.D[i].Value != before[i].Value || m.D[i].Method != before[i].Method || len(m.D[i].Warnings) != len(before[i].Warnings) {
			t.Errorf("D %d changed", i)
		}
	}
	if !hasWarning(r.Warnings, "survivor curve): five exposures only") {
		t.Errorf("the estimate's warning is not carried: %q", r.Warnings)
	}
}

func TestCheckLabelRefusals(t *testing.T) {
	nan := math.NaN()
	dry := FDADryHeatProfile()
	bad := Profile{Name: "bad", Modality: MoistHeat, MinD: -1}
	empty := Profile{Name: "empty", Modality: MoistHeat}
	for _, c := range []struct {
		name string
		edit func(*Label, *Measured, *Criteria)
		want error
	}{
		{"label population negative", func(l *Label, _ *Measured, _ *Criteria) { l.Population = -1 }, ErrInvalidPopulation},
		{"label population Inf", func(l *Label, _ *Measured, _ *Criteria) { l.Population = math.Inf(1) }, ErrInvalidPopulation},
		{"label D NaN", func(l *Label, _ *Measured, _ *Criteria) { l.D = nan }, ErrInvalidD},
		{"label z negative", func(l *Label, _ *Measured, _ *Criteria) { l.Z = -10 }, ErrInvalidZ},
		{"label temperature NaN", func(l *Label, _ *Measured, _ *Criteria) { l.Celsius = nan }, ErrInvalidTemperature},
		{"label kill before survival", func(l *Label, _ *Measured, _ *Criteria) { l.KillTime = 7 }, ErrInvalidTime},
		{"label survival negative", func(l *Label, _ *Measured, _ *Criteria) { l.SurvivalTime = -1 }, ErrInvalidTime},
		{"measured log10 N0 NaN", func(_ *Label, m *Measured, _ *Criteria) { m.Log10N0.Value = nan }, ErrInvalidPopulation},
		{"measured D zero", func(_ *Label, m *Measured, _ *Criteria) { m.D[1].Value = 0 }, ErrInvalidD},
		{"measured z Inf", func(_ *Label, m *Measured, _ *Criteria) { m.Z.Value = math.Inf(1) }, ErrInvalidZ},
		{"survival test with no unit", func(_ *Label, m *Measured, _ *Criteria) { m.SurvivalTest.Units, m.SurvivalTest.Growth = 0, 0 }, ErrInvalidCount},
		{"kill test growth > units", func(_ *Label, m *Measured, _ *Criteria) { m.KillTest.Growth = 51 }, ErrInvalidCount},
		{"kill test growth negative", func(_ *Label, m *Measured, _ *Criteria) { m.KillTest.Growth = -1 }, ErrInvalidCount},
		{"survival test time NaN", func(_ *Label, m *Measured, _ *Criteria) { m.SurvivalTest.Minutes = nan }, ErrInvalidTime},
		{"limit negative", func(_ *Label, _ *Measured, c *Criteria) { c.DAgreement.Value = -0.2 }, ErrInvalidSetting},
		{"limit NaN", func(_ *Label, _ *Measured, c *Criteria) { c.DLimits.Value = nan }, ErrInvalidSetting},
		{"population range reversed", func(_ *Label, _ *Measured, c *Criteria) { c.PopulationLow.Value = 4 }, ErrInvalidSetting},
		{"methods not whole", func(_ *Label, _ *Measured, c *Criteria) { c.DMethods.Value = 1.5 }, ErrInvalidSetting},
		{"profile for dry heat", func(_ *Label, _ *Measured, c *Criteria) { c.Profile = &dry }, ErrProfile},
		{"profile with a negative minimum", func(_ *Label, _ *Measured, c *Criteria) { c.Profile = &bad }, ErrProfile},
		{"profile with no minimum", func(_ *Label, _ *Measured, c *Criteria) { c.Profile = &empty }, ErrProfile},
	} {
		l, m := steamLabel(), steamMeasured()
		cr := &Criteria{}
		c.edit(&l, &m, cr)
		if _, err := CheckLabel(l, m, cr); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
	}
}

func TestReportTextAndJSON(t *testing.T) {
	m := steamMeasured()
	m.KillTest = nil
	m.D[1].Upper = math.Inf(1)
	p := FDASteamProfile()
	r, err := CheckLabel(steamLabel(), m, &Criteria{Profile: &p})
	if err != nil {
		t.Fatal(err)
	}
	s := r.String()
	for _, part := range []string{"lot HB-23-0711", "Harrowgate Bioindicators", "criterion", "not assessed", "fail", "FDA 2007 Table 3, steam", SourceUSP, "Caution: " + Caution, "Summary: "} {
		if !strings.Contains(s, part) {
			t.Errorf("report text lacks %q:\n%s", part, s)
		}
	}
	for _, text := range []string{s, string(AllPassed), string(NoneFailed), string(SomeFailed), string(NoneAssessed)} {
		if strings.Contains(strings.ToLower(text), "accepted") {
			t.Errorf("report says accepted:\n%s", text)
		}
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatalf("JSON with NaN and Inf values: %v", err)
	}
	if !strings.Contains(string(b), `"value":"NaN"`) || !strings.Contains(string(b), `"value":"+Inf"`) || !strings.Contains(string(b), `"outcome":"not assessed"`) {
		t.Errorf("JSON: %s", b)
	}
	var back Report
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if len(back.Findings) != len(r.Findings) || back.Summary != r.Summary || back.Label.Lot != "HB-23-0711" {
		t.Errorf("JSON round trip: %+v", back)
	}
	for i := range r.Findings {
		near(t, "finding value back", back.Findings[i].Value, r.Findings[i].Value, 0)
	}
}
