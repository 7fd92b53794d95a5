package lethality

import (
	"fmt"
	"strings"

	"github.com/dzf-go/dzf/resistance"
)

// Population is an organism population on a unit: log10 of its number per
// unit and its D-value estimate (minutes at the reference temperature). Name
// labels it in reports ("indicator", "bioburden", a lot number …).
type Population struct {
	Name    string              `json:"name"`
	Log10N0 float64             `json:"log10_n0"`
	D       resistance.Estimate `json:"d"`
}

// Comparison sets the survival of the product's bioburden beside that of the
// biological indicator for the same lethality.
type Comparison struct {
	F         float64    `json:"f"`
	Indicator Assessment `json:"indicator"`
	Bioburden Assessment `json:"bioburden"`
	Warnings  []string   `json:"warnings,omitempty"`
}

// String formats both assessments, followed by the warnings.
func (c Comparison) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "F %.4g min\nindicator: %v\nbioburden: %v", c.F, c.Indicator, c.Bioburden)
	for _, w := range c.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// Compare returns the survival after lethality f of the indicator
// population and of the product's bioburden (the bioburden approach: the
// SAL from the product's own bioburden per unit and its resistance, beside
// the indicator-based figure), each at its D value and at its D upper limit
// (see Assess). It warns when the bioburden is more resistant than the
// indicator (the indicator would not then be a worst case). It refuses what
// Assess refuses.
func Compare(f float64, indicator, bioburden Population) (Comparison, error) {
	ia, err := Assess(indicator.Log10N0, f, indicator.D)
	if err != nil {
		return Comparison{}, fmt.Errorf("indicator %q: %w", indicator.Name, err)
	}
	ba, err := Assess(bioburden.Log10N0, f, bioburden.D)
	if err != nil {
		return Comparison{}, fmt.Errorf("bioburden %q: %w", bioburden.Name, err)
	}
	c := Comparison{F: f, Indicator: ia, Bioburden: ba}
	if bioburden.D.Value > indicator.D.Value {
		c.Warnings = append(c.Warnings, fmt.Sprintf("the bioburden's D %g min exceeds the indicator's %g min: the indicator is not the worst case", bioburden.D.Value, indicator.D.Value))
	}
	if ba.Central.Log10PNSU > ia.Central.Log10PNSU {
		c.Warnings = append(c.Warnings, "the bioburden gives a higher PNSU than the indicator")
	}
	return c, nil
}
