package fraction_test

import (
	"fmt"

	"github.com/dzf-go/dzf/fraction"
)

// lotData is an invented study: indicator lot QX-5817 of an invented steam
// indicator, 20 units per exposure at 121 °C, population 10^6 per unit.
var lotData = []fraction.Exposure{
	{Minutes: 8, Units: 20, Negative: 0},
	{Minutes: 10, Units: 20, Negative: 0},
	{Minutes: 12, Units: 20, Negative: 6},
	{Minutes: 14, Units: 20, Negative: 17},
	{Minutes: 16, Units: 20, Negative: 19},
	{Minutes: 18, Units: 20, Negative: 20},
	{Minutes: 20, Units: 20, Negative: 20},
}

func ExampleHSK() {
	r, err := fraction.HSK(6, lotData)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Ū = %.4f min, V = %.5f min²\n", r.MeanTime, r.Variance)
	fmt.Printf("D = %.4f min (%.4f – %.4f, level %.4f)\n", r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper, r.Estimate.Level)
	fmt.Println("used:", r.Used)
	// Output:
	// Ū = 12.8000 min, V = 0.08105 min²
	// D = 2.0478 min (1.9567 – 2.1389, level 0.9545)
	// used: [1 2 3 4 5]
}

func ExampleLimitedHSK() {
	r, err := fraction.LimitedHSK(6, lotData)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("d = %g min, n = %d: D = %.4f min (%.4f – %.4f)\n", r.Interval, r.Units, r.Estimate.Value, r.Estimate.Lower, r.Estimate.Upper)

	// Unequal units among the exposures used break the procedure's
	// prerequisites.
	bad := append([]fraction.Exposure(nil), lotData...)
	bad[3].Units = 19
	_, err = fraction.LimitedHSK(6, bad)
	fmt.Println(err)
	// Output:
	// d = 2 min, n = 20: D = 2.0478 min (1.9567 – 2.1389)
	// exposures[3] at 14 min has 19 units and exposures[1] at 10 min has 20; the limited procedure needs the same units at every exposure it uses: fraction: unequal units (limited procedure)
}

func ExampleSMC() {
	r, err := fraction.SMC(6, lotData)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range r.Points {
		fmt.Printf("t = %g min: %2d/%d negative, D = %.4f min\n", p.Minutes, p.Negative, p.Units, p.D)
	}
	fmt.Printf("mean D = %.4f min\n", r.Estimate.Value)
	// Output:
	// t = 12 min:  6/20 negative, D = 2.0272 min
	// t = 14 min: 17/20 negative, D = 2.0621 min
	// t = 16 min: 19/20 negative, D = 2.1948 min
	// mean D = 2.0947 min
}

func ExampleSMCAt() {
	r, err := fraction.SMCAt(6, lotData, 14)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D at 14 min = %.4f min\n", r.Estimate.Value)
	_, err = fraction.SMCAt(6, lotData, 18)
	fmt.Println(err)
	// Output:
	// D at 14 min = 2.0621 min
	// exposures[5] at 18 min has 20 negative of 20 units, not fractional (0 < negative < units): fraction: exposure is not fractional
}

func ExampleMLE() {
	fixed, err := fraction.MLE(6, lotData, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	e := fixed.Estimate
	fmt.Printf("N0 fixed:  D = %.4f min (%.4f – %.4f, %g %%), deviance %.3f on %d df\n", e.Value, e.Lower, e.Upper, 100*e.Level, fixed.Deviance, fixed.DF)

	fitted, err := fraction.MLE(6, lotData, &fraction.MLESettings{FitN0: true})
	if err != nil {
		fmt.Println(err)
		return
	}
	e = fitted.Estimate
	fmt.Printf("N0 fitted: D = %.4f min (%.4f – %.4f), log10 N0 = %.3f\n", e.Value, e.Lower, e.Upper, fitted.Log10N0)
	// Output:
	// N0 fixed:  D = 2.0431 min (1.9702 – 2.1117, 95 %), deviance 1.340 on 6 df
	// N0 fitted: D = 2.4811 min (1.6186 – 3.7104), log10 N0 = 4.915
}

// ExamplePlanStudy plans a study for an indicator of expected D 2 min and
// 10^6 spores per unit; the simulation is seeded, so its counts repeat.
func ExamplePlanStudy() {
	p, err := fraction.PlanStudy(2, 6, 20, 7, &fraction.PlanSettings{Simulations: 500, Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, e := range p.Exposures {
		fmt.Printf("t = %2g min: expect %5.2f of %d negative\n", e.Minutes, e.ExpectedNegative, e.Units)
	}
	fmt.Printf("expected limits %.3f – %.3f min\n", p.Expected.Lower, p.Expected.Upper)
	fmt.Printf("simulated: limited procedure applicable in %d of %d studies\n", p.Simulation.LimitedApplicable, p.Simulation.Studies)
	// Output:
	// t =  8 min: expect  0.00 of 20 negative
	// t = 10 min: expect  0.00 of 20 negative
	// t = 12 min: expect  7.36 of 20 negative
	// t = 14 min: expect 18.10 of 20 negative
	// t = 16 min: expect 19.80 of 20 negative
	// t = 18 min: expect 19.98 of 20 negative
	// t = 20 min: expect 20.00 of 20 negative
	// expected limits 1.929 – 2.077 min
	// simulated: limited procedure applicable in 441 of 500 studies
}
