package resistance_test

import (
	"fmt"

	"github.com/dzf-go/dzf/resistance"
)

// D at another temperature: the published check D150 = 4.5 min, z = 10 °C.
func ExampleDAt() {
	d, err := resistance.DAt(4.5, 150, 10, 160)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D160 = %.2f min\n", d)
	// Output: D160 = 0.45 min
}

func ExampleTemperatureAt() {
	t, err := resistance.TemperatureAt(1.5, 121, 10, 15)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("D is 15 min at %.1f °C\n", t)
	// Output: D is 15 min at 111.0 °C
}

func ExampleZFromTwo() {
	z, err := resistance.ZFromTwo(150, 4.5, 160, 0.45)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("z = %.1f °C\n", z)
	// Output: z = 10.0 °C
}

// A z-value from D at five temperatures (invented data from a steam
// indicator lot, lot GS-0417).
func ExampleZFit() {
	points := []resistance.Point{
		{Celsius: 110, D: resistance.Estimate{Value: 19.5}},
		{Celsius: 115, D: resistance.Estimate{Value: 6.3}},
		{Celsius: 121, D: resistance.Estimate{Value: 1.85}},
		{Celsius: 125, D: resistance.Estimate{Value: 0.71}},
		{Celsius: 130, D: resistance.Estimate{Value: 0.20}},
	}
	r, err := resistance.ZFit(points, 121, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("z = %.2f °C (%.2f – %.2f)\n", r.Z.Value, r.Z.Lower, r.Z.Upper)
	fmt.Printf("D121 = %.3f min (%.3f – %.3f)\n", r.DRef.Value, r.DRef.Lower, r.DRef.Upper)
	fmt.Printf("r² = %.4f\n", r.RSquared)
	// Output:
	// z = 10.17 °C (9.45 – 11.01)
	// D121 = 1.671 min (1.478 – 1.891)
	// r² = 0.9983
}

func ExampleActivationEnergy() {
	ea, err := resistance.ActivationEnergy(10, 121, 131)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("Ea = %.1f kJ/mol over 121–131 °C\n", ea/1000)
	// Output: Ea = 305.0 kJ/mol over 121–131 °C
}

func ExampleSurvivalKill() {
	w, err := resistance.SurvivalKill(6, 1.5)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("survival %.1f min, kill %.1f min\n", w.Survival, w.Kill)
	// Output: survival 6.0 min, kill 15.0 min
}

func ExampleCheckWindow() {
	d := resistance.Estimate{Value: 1.5, Lower: 1.4, Upper: 1.6, Level: 0.95, Method: "survivor curve"}
	c, err := resistance.CheckWindow(resistance.Window{Survival: 6.2, Kill: 14.5}, d, 6)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("consistent %v (margins %+.1f, %+.1f min); over the limits %v\n", c.Consistent, c.SurvivalMargin, c.KillMargin, c.ConsistentAtLimits)
	// Output: consistent true (margins +0.2, +0.5 min); over the limits false
}

// A lot of steam indicators checked against its certificate (invented
// supplier and lot).
func ExampleCheckLabel() {
	label := resistance.Label{
		Supplier: "Northfield Spore Works", Lot: "NSW-2291", Modality: resistance.MoistHeat,
		Population: 2.1e6, D: 1.9, Celsius: 121, Z: 10.5, SurvivalTime: 8.5, KillTime: 18.5,
	}
	measured := resistance.Measured{
		Log10N0: &resistance.Estimate{Value: 6.28, Lower: 6.21, Upper: 6.35, Level: 0.95, Method: "plate count"},
		D: []resistance.Estimate{
			{Value: 1.84, Lower: 1.74, Upper: 1.95, Level: 0.95, Method: "survivor curve"},
			{Value: 1.97, Lower: 1.83, Upper: 2.11, Level: 0.95, Method: "HSK"},
		},
		SurvivalTest: &resistance.UnitTest{Minutes: 8.5, Units: 50, Growth: 50},
		KillTest:     &resistance.UnitTest{Minutes: 18.5, Units: 50, Growth: 0},
	}
	r, err := resistance.CheckLabel(label, measured, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, f := range r.Findings {
		fmt.Printf("%-22s %-15s %s\n", f.Criterion, f.Subject, f.Outcome)
	}
	fmt.Println(r.Summary)
	// Output:
	// population vs label                    pass
	// D vs label             survivor curve  pass
	// D limits               survivor curve  pass
	// D vs label             HSK             pass
	// D limits               HSK             pass
	// D methods                              pass
	// window vs label D                      pass
	// window vs measured D   survivor curve  pass
	// window vs measured D   HSK             pass
	// survival test                          pass
	// kill test                              pass
	// every criterion was assessed and passed
}
