package survivor_test

import (
	"fmt"

	"github.com/dzf-go/dzf/survivor"
)

// A survivor curve of an invented steam indicator lot (lot 7Q-0412, strips
// exposed at 121 °C in the test vessel of an invented laboratory), three
// strips per exposure, counted after each exposure.
func ExampleFit() {
	obs := []survivor.Observation{
		{Minutes: 0, Count: 2.1e6}, {Minutes: 0, Count: 1.7e6}, {Minutes: 0, Count: 2.4e6},
		{Minutes: 4, Count: 1.9e5}, {Minutes: 4, Count: 2.6e5}, {Minutes: 4, Count: 1.5e5},
		{Minutes: 8, Count: 2.2e4}, {Minutes: 8, Count: 1.4e4}, {Minutes: 8, Count: 3.0e4},
		{Minutes: 12, Count: 1.1e3}, {Minutes: 12, Count: 2.3e3}, {Minutes: 12, Count: 1.6e3},
		{Minutes: 16, Count: 160}, {Minutes: 16, Count: 95}, {Minutes: 16, Count: 210},
	}
	// The values printed agree with R 4.2.2: lm(log10(count) ~ t), confint
	// and anova against lm(log10(count) ~ factor(t)).
	r, err := survivor.Fit(obs, nil) // default settings: 95 % limits
	if err != nil {
		fmt.Println("refused:", err)
		return
	}
	fmt.Printf("D = %.3f min (95 %% limits %.3f – %.3f)\n", r.D.Value, r.D.Lower, r.D.Upper)
	fmt.Printf("log10 N0 = %.3f (%.3f – %.3f)\n", r.Log10N0.Value, r.Log10N0.Lower, r.Log10N0.Upper)
	fmt.Printf("r² = %.4f, residual SD = %.4f log10, %d observations, %d df\n", r.RSquared, r.ResidualSD, r.N, r.DF)
	fmt.Printf("lack of fit: F = %.3f on %d and %d df, p = %.3f\n", r.LackOfFit.F, r.LackOfFit.LackOfFitDF, r.LackOfFit.PureErrorDF, r.LackOfFit.P)
	fmt.Println("warnings:", len(r.Warnings))
	// Output:
	// D = 3.856 min (95 % limits 3.673 – 4.058)
	// log10 N0 = 6.333 (6.207 – 6.460)
	// r² = 0.9931, residual SD = 0.1311 log10, 15 observations, 13 df
	// lack of fit: F = 0.247 on 3 and 10 df, p = 0.861
	// warnings: 0
}

// Zero counts at the longest exposures can be left out on request; each is
// listed, and the result says so. Invented data.
func ExampleFit_excludeBelowDetection() {
	obs := []survivor.Observation{
		{Minutes: 0, Count: 1.2e6}, {Minutes: 3, Count: 1.4e5}, {Minutes: 6, Count: 1.3e4},
		{Minutes: 9, Count: 1.5e3}, {Minutes: 12, Count: 160}, {Minutes: 15, Count: 0},
	}
	r, err := survivor.Fit(obs, &survivor.Settings{ExcludeBelowDetection: true})
	if err != nil {
		fmt.Println("refused:", err)
		return
	}
	fmt.Printf("D = %.3f min from %d observations\n", r.D.Value, r.N)
	for _, e := range r.Excluded {
		fmt.Printf("excluded observation %d at %g min: %s\n", e.Index, e.Minutes, e.Reason)
	}
	// Output:
	// D = 3.086 min from 5 observations
	// excluded observation 5 at 15 min: count 0: below the detection limit of the count, log10 undefined
}
