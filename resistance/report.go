package resistance

import (
	"fmt"
	"strings"
	"text/tabwriter"
)

// String formats the report as aligned text: a heading naming the lot, one
// numbered row per finding (criterion, subject, measured, limit, outcome,
// the set of limits it comes from and a reference to its source), the notes
// by row number, the sources, the summary, the warnings and the caution.
func (r Report) String() string {
	var b strings.Builder
	l := r.Label
	head := "Label check"
	if l.Lot != "" {
		head += ", lot " + l.Lot
	}
	var parts []string
	for _, s := range []string{l.Supplier, l.Product, l.Organism, string(l.Modality)} {
		if s != "" {
			parts = append(parts, s)
		}
	}
	if len(parts) > 0 {
		head += " (" + strings.Join(parts, ", ") + ")"
	}
	b.WriteString(head + "\n")
	var claims []string
	if l.Population > 0 {
		claims = append(claims, fmt.Sprintf("population %.3g per unit", l.Population))
	}
	if l.D > 0 {
		claims = append(claims, fmt.Sprintf("D %.4g min at %g °C", l.D, l.Celsius))
	}
	if l.Z > 0 {
		claims = append(claims, fmt.Sprintf("z %.4g °C", l.Z))
	}
	if l.SurvivalTime > 0 || l.KillTime > 0 {
		claims = append(claims, fmt.Sprintf("survival %g min, kill %g min", l.SurvivalTime, l.KillTime))
	}
	if len(claims) > 0 {
		b.WriteString("Label states: " + strings.Join(claims, "; ") + "\n")
	}
	b.WriteString("\n")
	// Sources are listed once each and referred to by number.
	var sources []string
	ref := map[string]int{}
	for _, f := range r.Findings {
		if _, ok := ref[f.Source]; !ok {
			sources = append(sources, f.Source)
			ref[f.Source] = len(sources)
		}
	}
	tw := tabwriter.NewWriter(&b, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "#\tcriterion\tsubject\tmeasured\tlimit\toutcome\tfrom [source]")
	for i, f := range r.Findings {
		subj := f.Subject
		if subj == "" {
			subj = "—"
		}
		fmt.Fprintf(tw, "%d\t%s\t%s\t%s\t%s\t%s\t%s [%d]\n", i+1, f.Criterion, subj, f.Measured, f.Limit, f.Outcome, f.Profile, ref[f.Source])
	}
	tw.Flush()
	var notes []string
	for i, f := range r.Findings {
		if f.Note != "" {
			notes = append(notes, fmt.Sprintf("  %d. %s\n", i+1, f.Note))
		}
	}
	if len(notes) > 0 {
		b.WriteString("\nNotes:\n" + strings.Join(notes, ""))
	}
	b.WriteString("\nSources:\n")
	for i, src := range sources {
		fmt.Fprintf(&b, "  [%d] %s\n", i+1, src)
	}
	fmt.Fprintf(&b, "\nSummary: %d passed, %d failed, %d not assessed: %s.\n", r.Passed, r.Failed, r.NotAssessed, r.Summary)
	if len(r.Warnings) > 0 {
		b.WriteString("Warnings:\n")
		for _, w := range r.Warnings {
			b.WriteString("  - " + w + "\n")
		}
	}
	b.WriteString("Caution: " + r.Caution + "\n")
	return b.String()
}
