package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"text/tabwriter"
	"time"

	"github.com/dzf-go/dzf/internal/lab"
	"github.com/dzf-go/dzf/resistance"
)

// Widths and indents of the text.
const (
	width  = 100
	indent = "  "
)

// f1, f2 and f3 format with one, two and three decimals.
func f1(v float64) string { return lab.Format(v, 1) }
func f2(v float64) string { return lab.Format(v, 2) }
func f3(v float64) string { return lab.Format(v, 3) }

// sci formats v with three significant digits in e-notation.
func sci(v float64) string { return strconv.FormatFloat(v, 'e', 2, 64) }

// pct formats a fraction as a percentage with one decimal.
func pct(v float64) string { return lab.Percent(v, 1) }

// yesNo words a boolean outcome.
func yesNo(ok bool, yes, no string) string {
	if ok {
		return yes
	}
	return no
}

// writeText prints the report as aligned text, section by section.
func writeText(w io.Writer, r report) {
	for _, section := range []func(io.Writer, report){
		textHeading, textPopulation, textResistance, textZ, textLabelCheck,
		textCycle, textIndicator, textClaims, textCautions,
	} {
		section(w, r)
		fmt.Fprintln(w)
	}
}

// heading prints a section heading.
func heading(w io.Writer, s string) {
	fmt.Fprintf(w, "%s\n%s\n", s, strings.Repeat("-", len([]rune(s))))
}

// para prints s indented and wrapped, continuation lines indented further.
func para(w io.Writer, s string) {
	fmt.Fprintln(w, indent+lab.Wrap(s, width, indent+"  "))
}

// bullets prints a list of notes, wrapped.
func bullets(w io.Writer, head string, items []string) {
	if len(items) == 0 {
		return
	}
	fmt.Fprintln(w, indent+head)
	for _, s := range items {
		fmt.Fprintln(w, indent+"- "+lab.Wrap(s, width, indent+"  "))
	}
}

func textHeading(w io.Writer, r report) {
	fmt.Fprintf(w, "%s\n%s\n", r.Title, strings.Repeat("=", len([]rune(r.Title))))
	l := r.Label
	var who []string
	for _, s := range []string{l.Product, l.Supplier, l.Organism, string(l.Modality)} {
		if s != "" {
			who = append(who, s)
		}
	}
	fmt.Fprintln(w, lab.Wrap(fmt.Sprintf("Lot %s: %s", l.Lot, strings.Join(who, "; ")), width, "  "))
	fmt.Fprintln(w, lab.Wrap(fmt.Sprintf("Label: population %s per unit; D %s min at %s °C; z %s °C; survival %s min, kill %s min",
		sci(l.Population), f2(l.D), f1(l.Celsius), f1(l.Z), f1(l.SurvivalTime), f1(l.KillTime)), width, "  "))
	fmt.Fprintln(w)
	fmt.Fprintln(w, "Inputs")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	for _, s := range r.Inputs {
		fmt.Fprintf(tw, "%s%s\t%s\t%s\n", indent, s.Input, s.From, s.Name)
	}
	tw.Flush()
	s := r.Settings
	prof := "none"
	if s.Profile != nil {
		prof = s.Profile.Name
	}
	fmt.Fprintln(w, lab.Wrap(fmt.Sprintf("Settings: level %s (HSK %s); F0 T_ref %s °C, z %s °C; sterilization %s °C, band %s °C; "+
		"target log10 SAL %s; profile %s; z from the %s D",
		lab.Percent(s.Level, 0), lab.Percent(s.HSKLevel, 2), f1(s.F0.TRef), f1(s.F0.Z), f1(s.Sterilization), f1(s.Band),
		f1(s.Log10SAL), prof, s.ZFrom), width, "  "))
	for _, x := range r.Warnings {
		fmt.Fprintln(w, "WARNING: "+lab.Wrap(x, width, "         "))
	}
}

func textPopulation(w io.Writer, r report) {
	p := r.Population
	a := p.Assay
	heading(w, "Population (plate counts)")
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "%sunit\tper unit\tlog10\tplates used\tcolonies\n", indent)
	for _, u := range a.Units {
		fmt.Fprintf(tw, "%s%s\t%s\t%s\t%d\t%s\n", indent, u.Label, sci(u.PerUnit), f3(u.Log10PerUnit), u.Plates, lab.Format(u.Colonies, 0))
	}
	tw.Flush()
	para(w, fmt.Sprintf("mean %s per unit (%s – %s, %s), log10 %s (%s – %s); CV %s over %d units", sci(a.Mean), sci(a.Lower), sci(a.Upper), lab.Percent(a.Level, 0), f3(a.Log10Mean), f3(a.Log10Lower), f3(a.Log10Upper), pct(a.CV), a.N))
	para(w, fmt.Sprintf("label %s per unit (log10 %s): measured / label = %s", sci(p.Label), f3(p.Log10Label), pct(p.Ratio)))
	for _, s := range p.SetAside {
		para(w, fmt.Sprintf("set aside: %s plate %d at %s: %s", s.Unit, s.Plate, sci(s.Dilution), s.Reason))
	}
	bullets(w, "warnings:", a.Warnings)
}

func textResistance(w io.Writer, r report) {
	d := r.Resistance
	heading(w, fmt.Sprintf("D-value at %s °C (log10 N0 %s from the population assay)", f1(d.Celsius), f3(d.Log10N0)))
	lab.WriteMethods(w, indent, d.Methods)
	if s := d.Survivor; s != nil {
		line := fmt.Sprintf("survivor curve: %d units at %d times, r² %s, residual SD %s log10, fitted log reduction %s, log10 N0 %s",
			s.N, s.Times, f3(s.RSquared), f3(s.ResidualSD), f2(s.LogReduction), f3(s.Log10N0.Value))
		if l := s.LackOfFit; l != nil {
			line += fmt.Sprintf("; lack of fit F %s, p %s", f2(l.F), f3(l.P))
		}
		para(w, line)
		for _, x := range s.Excluded {
			para(w, fmt.Sprintf("left out of the curve: %s min, count %s: %s", f2(x.Minutes), lab.Format(x.Count, 0), x.Reason))
		}
	}
	lab.WriteFractionDetails(w, indent, d.Fraction)
	textAgreement(w, d.Agreement)
}

func textAgreement(w io.Writer, a agreement) {
	fmt.Fprintln(w, indent+lab.Wrap("agreement rule: "+a.Rule, width, indent+"  "))
	if a.Note != "" {
		fmt.Fprintln(w, indent+a.Note)
		return
	}
	var devs []string
	for _, d := range a.Deviations {
		devs = append(devs, fmt.Sprintf("%s %s", d.Method, pct(d.Relative)))
	}
	fmt.Fprintln(w, indent+lab.Wrap(fmt.Sprintf("mean D %s min; from the mean: %s: %s", f3(float64(a.Mean)), strings.Join(devs, ", "),
		yesNo(a.WithinBand, "all within ±20 %", "NOT all within ±20 %")), width, indent+"  "))
	var apart []string
	for _, p := range a.Pairs {
		if !p.Overlap {
			apart = append(apart, p.A+" / "+p.B)
		}
	}
	if len(apart) == 0 {
		fmt.Fprintln(w, indent+"limits: every pair of methods with limits overlaps")
	} else {
		fmt.Fprintln(w, indent+lab.Wrap("limits that do NOT overlap: "+strings.Join(apart, ", "), width, indent+"  "))
	}
	fmt.Fprintln(w, indent+yesNo(a.Agree, "=> the methods agree by this rule", "=> the methods do NOT agree by this rule"))
}

func textZ(w io.Writer, r report) {
	z := r.Z
	heading(w, "z-value")
	if len(z.Points) > 0 {
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintf(tw, "%s°C\tD min\tlower\tupper\tlevel\tmethod\n", indent)
		for _, p := range z.Points {
			fmt.Fprintf(tw, "%s%s\t%s\t%s\t%s\t%s\t%s\n", indent, f1(p.Celsius), f3(p.D.Value), f3(p.D.Lower), f3(p.D.Upper), lab.Percent(p.D.Level, 0), shortMethod(p.D.Method))
		}
		tw.Flush()
	}
	if z.Note != "" {
		para(w, z.Note)
	}
	if z.Result == nil {
		para(w, "z not determined: "+z.Refused)
		return
	}
	res := z.Result
	para(w, fmt.Sprintf("z %s °C (%s); fitted D at %s °C %s min (%s); r² %s; %d points at %d temperatures",
		f2(res.Z.Value), limits(res.Z, f2, true), f1(res.TRef), f3(res.DRef.Value), limits(res.DRef, f3, false),
		lab.Format(res.RSquared, 4), res.N, res.Temperatures))
	bullets(w, "warnings:", res.Warnings)
}

// limits formats an estimate's limits, with the level if asked, or says
// that there are none.
func limits(e resistance.Estimate, format func(float64) string, level bool) string {
	if math.IsNaN(e.Lower) && math.IsNaN(e.Upper) {
		return "no limits"
	}
	s := format(e.Lower) + " – " + format(e.Upper)
	if level {
		s += ", " + lab.Percent(e.Level, 0)
	}
	return s
}

// shortMethod cuts a method's description at its first colon.
func shortMethod(m string) string {
	if i := strings.Index(m, ":"); i > 0 {
		return m[:i]
	}
	return m
}

func textLabelCheck(w io.Writer, r report) {
	c := r.LabelCheck
	heading(w, "Label check (criterion by criterion)")
	// Sources are numbered once each, with the set of limits they belong
	// to.
	var sources []string
	ref := map[string]int{}
	for _, f := range c.Findings {
		key := f.Profile + ": " + f.Source
		if _, ok := ref[key]; !ok {
			sources = append(sources, key)
			ref[key] = len(sources)
		}
		ref[f.Source] = ref[key]
	}
	short := shortNames(r.Resistance)
	const col = 14 // width of the outcome column
	for _, f := range c.Findings {
		what := f.Criterion
		if f.Subject != "" {
			what += " (" + short.Replace(f.Subject) + ")"
		}
		line := fmt.Sprintf("%s: %s; limit %s [%d]", what, short.Replace(f.Measured), f.Limit, ref[f.Source])
		fmt.Fprintf(w, "%s%-*s%s\n", indent, col, strings.ToUpper(string(f.Outcome)), lab.Wrap(line, width, indent+strings.Repeat(" ", col)))
	}
	var notes []string
	for _, f := range c.Findings {
		if f.Note != "" {
			notes = append(notes, f.Criterion+" ("+orDash(short.Replace(f.Subject))+"): "+f.Note)
		}
	}
	bullets(w, "notes:", notes)
	fmt.Fprintln(w, indent+"sources:")
	for i, s := range sources {
		fmt.Fprintf(w, "%s[%d] %s\n", indent, i+1, lab.Wrap(s, width, indent+"    "))
	}
	fmt.Fprintf(w, "%ssummary: %d pass, %d fail, %d not assessed: %s\n", indent, c.Passed, c.Failed, c.NotAssessed, c.Summary)
	bullets(w, "warnings carried by the measurements:", c.Warnings)
}

// shortNames replaces the estimates' full method names by the short names
// of the D-value table.
func shortNames(d resistancePart) *strings.Replacer {
	var pairs []string
	for _, m := range d.Methods {
		if m.Estimate != nil && m.Estimate.Method != "" {
			pairs = append(pairs, m.Estimate.Method, m.Name)
		}
	}
	return strings.NewReplacer(pairs...)
}

// orDash returns s, or "—" when it is empty.
func orDash(s string) string {
	if s == "" {
		return "—"
	}
	return s
}

func textCycle(w io.Writer, r report) {
	c := r.Cycle
	res := c.Result
	heading(w, "Cycle")
	for _, s := range c.Comments {
		fmt.Fprintln(w, indent+"# "+strings.TrimSpace(s))
	}
	start := ""
	if c.Start != nil {
		start = " from " + c.Start.Format(time.RFC3339)
	}
	fmt.Fprintf(w, "%s%s: %d rows%s; %s T_ref %s °C, z %s °C\n", indent, c.Source, c.Rows, start, res.Reference.Name, f1(res.Reference.TRef), f1(res.Reference.Z))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "%sprobe\tF0 min\tmin °C\tmax °C\treached %s °C at min\tat or above, min\n", indent, f1(res.Celsius))
	for _, p := range res.Probes {
		reach := "never"
		if p.Reached {
			reach = f2(p.ReachMinutes)
		}
		fmt.Fprintf(tw, "%s%s\t%s\t%s\t%s\t%s\t%s\n", indent, p.Probe, f2(p.F.F), f2(p.MinCelsius), f2(p.MaxCelsius), reach, f2(p.AtOrAbove))
	}
	tw.Flush()
	fmt.Fprintf(w, "%scold spot: %s, F0 %s min\n", indent, res.ColdSpotProbe, f2(res.MinF))
	if res.AllReached {
		fmt.Fprintf(w, "%sequilibration: %s min (first probe at %s min, last at %s min)\n", indent, f2(res.Equilibration), f2(res.EquilibrationStart), f2(res.EquilibrationEnd))
	} else {
		fmt.Fprintln(w, indent+"equilibration: NOT every probe reached the sterilization temperature")
	}
	if res.HoldFound {
		para(w, fmt.Sprintf("hold (every probe at or above %s °C): %s min (%s – %s min), %s – %s °C, spread between probes up to %s °C, %s %s – %s °C", f1(res.Celsius), f2(res.Hold), f2(res.HoldStart), f2(res.HoldEnd), f2(res.HoldMin), f2(res.HoldMax), f2(res.HoldSpread),
			yesNo(res.WithinBand, "within the band", "OUTSIDE the band"), f1(res.BandLow), f1(res.BandHigh)))
	} else {
		fmt.Fprintln(w, indent+"hold: the probes were NEVER all at or above the sterilization temperature at once")
	}
	bullets(w, "warnings:", res.Warnings)
}

func textIndicator(w io.Writer, r report) {
	p := r.Indicator
	heading(w, "This indicator at the cold spot ("+p.ColdSpot+")")
	para(w, fmt.Sprintf("F at %s °C (z %s °C) at the cold spot: %s min; log10 N0 %s; target log10 SAL %s", f1(p.Reference.TRef), f1(p.Reference.Z), f2(p.F.F), f3(p.Log10N0), f1(p.Log10SAL)))
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	para(w, "logs = log reduction; SAL met: log10 PNSU ≤ log10 SAL; left of | at D, right of it at the upper limit of D (conservative)")
	fmt.Fprintf(tw, "%smethod\tD min\tlogs\tlog10 PNSU\tSAL met\t|\tupper D\tlogs\tlog10 PNSU\tSAL met\n", indent)
	for _, row := range p.Rows {
		if row.Assessment == nil {
			fmt.Fprintf(tw, "%s%s\trefused: %s\n", indent, row.Method, row.Refused)
			continue
		}
		a := row.Assessment
		cons := "\t|\t—\t—\t—\t—"
		if c := a.Conservative; c != nil {
			cons = fmt.Sprintf("\t|\t%s\t%s\t%s\t%s", f3(c.D), f2(c.LogReduction), f2(c.Log10PNSU), yesNo(*row.MeetsSALConservative, "yes", "NO"))
		}
		fmt.Fprintf(tw, "%s%s\t%s\t%s\t%s\t%s%s\n", indent, row.Method, f3(a.Central.D), f2(a.Central.LogReduction), f2(a.Central.Log10PNSU), yesNo(row.MeetsSAL, "yes", "NO"), cons)
	}
	tw.Flush()
	var need []string
	for _, row := range p.Rows {
		if q := row.Requirement; q != nil {
			s := fmt.Sprintf("%s: F %s min", row.Method, f2(q.F))
			if q.FConservative > 0 {
				s += fmt.Sprintf(", conservative %s min", f2(q.FConservative))
			}
			if q.Celsius != q.Reference.TRef {
				s += fmt.Sprintf("; exposure at %s °C %s min", f1(q.Celsius), f2(q.Minutes))
				if q.FConservative > 0 {
					s += fmt.Sprintf(", conservative %s min", f2(q.MinutesConservative))
				}
			}
			need = append(need, s)
		}
	}
	bullets(w, fmt.Sprintf("lethality needed at %s °C to reach log10 SAL %s from log10 N0 %s:", f1(p.Reference.TRef), f1(p.Log10SAL), f3(p.Log10N0)), need)
}

func textClaims(w io.Writer, r report) {
	c := r.Claims
	heading(w, "Overkill and half cycle")
	o := c.Overkill
	para(w, fmt.Sprintf("overkill: F0 at the cold spot %s min against %s min needed for %s logs of an organism with D = %s min: %s", f2(o.F), f2(o.RequiredF), f1(o.TargetLogs), f1(o.D), yesNo(o.Meets, "met", "NOT met")))
	if io := c.IndicatorOverkill; io != nil {
		para(w, fmt.Sprintf("%s logs of this indicator at D %s min (%s): F at %s °C %s min against %s min needed (it delivers %s logs): %s",
			f1(io.TargetLogs), f3(io.D), c.IndicatorDFrom, f1(r.Indicator.Reference.TRef), f2(io.F), f2(io.RequiredF), f2(io.LogReduction), yesNo(io.Meets, "met", "NOT met")))
	}
	h := c.HalfCycle
	if h == nil {
		fmt.Fprintln(w, indent+"half cycle: not assessed: "+c.HalfCycleRefused)
		return
	}
	s := h.Study
	para(w, fmt.Sprintf("half cycle: %d of %d indicators negative after %s min; credit %s logs for the half cycle, %s logs for the full cycle against %s: %s", s.Negative, s.Units, f1(s.HalfMinutes), f2(h.HalfLogs), f2(h.FullLogs), f1(h.TargetLogs), yesNo(h.Meets, "met", "NOT met")))
	hold := "this cycle had no hold with every probe at or above the sterilization temperature"
	if !math.IsNaN(float64(c.FullHold)) {
		hold = "this cycle's hold " + f2(float64(c.FullHold)) + " min"
	}
	para(w, fmt.Sprintf("(the credit needs a full cycle of at least twice the half cycle: %s, twice the half-cycle exposure %s min)",
		hold, f2(float64(c.TwiceHalf))))
	bullets(w, "warnings:", h.Warnings)
}

func textCautions(w io.Writer, r report) {
	heading(w, "Cautions")
	for _, s := range r.Cautions {
		fmt.Fprintln(w, "- "+lab.Wrap(s, width, "  "))
	}
}
