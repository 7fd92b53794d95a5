package main

import (
	"fmt"
	"math"
	"strings"

	"github.com/dzf-go/dzf/internal/lab"
)

// runWarnings lists doubts about the run as a whole.
func runWarnings(in inputs, r report) []string {
	var w []string
	demo := in.demoInputs()
	switch {
	case len(demo) == len(in.Sources):
		w = append(w, "every input is the invented demo scenario (a fictional laboratory, supplier, lot and sterilizer): run with your own files for a real lot")
	case len(demo) > 0:
		w = append(w, "inputs taken from the invented demo scenario and mixed with your files: "+strings.Join(demo, ", ")+"; this report is not about one real lot")
	}
	if z := float64(r.Indicator.MeasuredZ); !math.IsNaN(z) && math.Abs(z-r.Settings.F0.Z) > 0.1*r.Settings.F0.Z {
		w = append(w, fmt.Sprintf("the indicator's measured z (%s °C) differs from the z of F (%s °C) by more than 10 %%: F/D assumes they are equal",
			lab.Format(z, 2), lab.Format(r.Settings.F0.Z, 2)))
	}
	if math.Abs(r.Settings.Sterilization-r.Label.Celsius) > 0.05 && r.Label.Celsius > 0 {
		w = append(w, fmt.Sprintf("the cycle's sterilization temperature (%g °C) differs from the label's temperature (%g °C)", r.Settings.Sterilization, r.Label.Celsius))
	}
	return w
}

// cautionsOf lists the cautions the report ends with.
func cautionsOf(r report) []string {
	c := []string{
		lab.Caution,
		"Limits to verify against the texts in force: D within ±20 % of the label and D limits within 10 % of D (USP, as quoted secondarily); " +
			"the all-grow/none-grow rule of the survival and kill tests (from memory); the HSK variance and its factor 2 (from memory of ISO 11138-1 Annex D); " +
			"the " + lab.Format(r.Settings.Band, 1) + " °C sterilization band (from memory of the common steam-sterilizer standard); " +
			"the F0 reference " + lab.Format(r.Settings.F0.TRef, 1) + " °C, z " + lab.Format(r.Settings.F0.Z, 1) + " °C (" + r.Settings.F0.Status + "; from memory of the European Pharmacopoeia's chapter on F0 — verify).",
		"Population within 50–300 % of the label is common practice with no source; the agreement rule between methods is this program's, with no published source.",
	}
	if p := r.Settings.Profile; p != nil {
		c = append(c, "Minimum-performance profile "+p.Name+": "+p.Status+".")
	}
	c = append(c,
		"F/D assumes first-order inactivation, D at the temperature of F's reference and the indicator's z equal to the z of F; "+
			"a tailing survivor curve makes extrapolated PNSU values optimistic. An F-value is only as good as the temperature record "+
			"(probe calibration and placement, logging interval).",
		"Overkill (12 logs of an organism with D ≥ 1 min) is the common definition; the half-cycle credit assumes first-order kinetics and a full cycle "+
			"delivering at least twice the half cycle's lethality.")
	return c
}
