package lethality_test

import (
	"fmt"
	"strings"

	"github.com/dzf-go/dzf/lethality"
	"github.com/dzf-go/dzf/resistance"
)

func ExampleReference_Rate() {
	f0 := lethality.MoistHeat()
	fmt.Printf("%.4f %.4f %.4f\n", f0.Rate(121.1), f0.Rate(111.1), f0.Rate(101.1))
	// Output: 1.0000 0.1000 0.0100
}

func ExampleF() {
	// An invented record: heat-up, 4 minutes near 121 °C, cool-down. The
	// printed values agree with Python mpmath 1.2.1 sums and quadrature of
	// the same samples.
	samples := []lethality.Sample{{0, 100}, {2, 115}, {3, 121}, {5, 121.4}, {7, 121.2}, {8, 112}, {9, 100}}
	for _, rule := range []lethality.Rule{lethality.Rectangle, lethality.Trapezoid, lethality.Exact} {
		r, err := lethality.F(samples, lethality.MoistHeat(), &lethality.FSettings{Rule: rule})
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%-9s F0 = %.4f min\n", rule, r.F)
	}
	// Output:
	// rectangle F0 = 5.5048 min
	// trapezoid F0 = 5.6467 min
	// exact     F0 = 5.2758 min
}

func ExampleEquivalentMinutes() {
	// With T_ref 121 °C, 1.5 min of lethality take 15 min at 111 °C.
	m, err := lethality.EquivalentMinutes(1.5, 111, lethality.MoistHeat121())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.4f min\n", m)
	// Output: 15.0000 min
}

func ExampleSurvivors() {
	// 10⁶ spores of D 1.5 min after F 18 min: 12 logs.
	s, err := lethality.Survivors(6, 18, 1.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("log10 N %.4f, PNSU %.6e, log10 PNSU %.6f\n", s.Log10Survivors, s.PNSU, s.Log10PNSU)
	// Far beyond float64: PNSU underflows, its log10 does not.
	s, _ = lethality.Survivors(6, 609, 1.5)
	fmt.Printf("log10 N %.1f, PNSU %g, log10 PNSU %.1f\n", s.Log10Survivors, s.PNSU, s.Log10PNSU)
	// Output:
	// log10 N -6.0000, PNSU 9.999995e-07, log10 PNSU -6.000000
	// log10 N -400.0, PNSU 0, log10 PNSU -400.0
}

func ExampleRequire() {
	// An invented D estimate: 1.5 min (1.3–1.8 min, 95 %).
	d := resistance.Estimate{Value: 1.5, Lower: 1.3, Upper: 1.8, Level: 0.95, Method: "invented"}
	r, err := lethality.Require(6, -6, d, 121, lethality.MoistHeat121())
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("F %.2f min (conservative %.2f); at 121 °C %.2f min (conservative %.2f)\n", r.F, r.FConservative, r.Minutes, r.MinutesConservative)
	// Output: F 18.00 min (conservative 21.60); at 121 °C 18.00 min (conservative 21.60)
}

func ExampleHalfCycle() {
	r, err := lethality.HalfCycle(lethality.HalfCycleStudy{Log10N0: 6, Units: 20, Negative: 20, HalfMinutes: 7.5}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(r)
	// Output: half cycle inactivated 20/20 indicators of 10^6: ≥ 6 logs; full cycle credited ≥ 12 logs (meets the 12-log target)
}

func ExampleCycle() {
	// An invented two-probe export, time in seconds.
	const export = `# invented demo: load LQ-0099, chamber 1
seconds,drain,pack
0,100,95
60,121,110
120,121.5,121
180,121.6,121.2
240,121.4,121.1
300,110,104
`
	rec, err := lethality.ReadRecord(strings.NewReader(export), &lethality.ReadSettings{Time: lethality.TimeSeconds})
	if err != nil {
		fmt.Println(err)
		return
	}
	res, err := lethality.Cycle(rec, lethality.MoistHeat121(), &lethality.CycleSettings{Celsius: 121})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("cold spot %s, F %.3f min\n", res.ColdSpotProbe, res.MinF)
	fmt.Printf("equilibration %.3f min, hold %.3f min, spread %.3f °C\n", res.Equilibration, res.Hold, res.HoldSpread)
	// Output:
	// cold spot pack, F 2.699 min
	// equilibration 1.000 min, hold 2.006 min, spread 0.500 °C
}

func ExampleStreamF() {
	const export = "timestamp;P1;P2\n" +
		"2031-04-02T10:00:00Z;250;248\n" +
		"2031-04-02T10:00:30Z;250;249.8\n" +
		"2031-04-02T10:01:00Z;250;250\n"
	res, err := lethality.StreamF(strings.NewReader(export), lethality.MoistHeat(),
		&lethality.ReadSettings{Unit: lethality.Fahrenheit}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range res.Probes {
		fmt.Printf("%s %.4f\n", p.Probe, p.F.F)
	}
	// Output:
	// P1 1.0026
	// P2 0.9314
}
