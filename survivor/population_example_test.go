package survivor_test

import (
	"fmt"

	"github.com/dzf-go/dzf/survivor"
)

// The population assay of an invented indicator lot (lot 7Q-0412): three
// strips, each shaken into 10 mL of diluent, diluted in tenfold steps, and
// 0.1 mL of two dilutions spread in duplicate.
func ExampleCountPopulation() {
	strip := func(label string, at2a, at2b, at3a, at3b float64) survivor.Unit {
		return survivor.Unit{Label: label, SuspensionML: 10, Plates: []survivor.Plate{
			{Colonies: at2a, Dilution: 1e-2, PlatedML: 0.1},
			{Colonies: at2b, Dilution: 1e-2, PlatedML: 0.1},
			{Colonies: at3a, Dilution: 1e-3, PlatedML: 0.1},
			{Colonies: at3b, Dilution: 1e-3, PlatedML: 0.1},
		}}
	}
	units := []survivor.Unit{
		strip("strip 1", 212, 198, 23, 19),
		strip("strip 2", 176, 190, 31, 17),
		strip("strip 3", 240, 226, 25, 28),
	}
	p, err := survivor.CountPopulation(units, nil) // countable range 30–300
	if err != nil {
		fmt.Println("refused:", err)
		return
	}
	for _, u := range p.Units {
		fmt.Printf("%s: %.3e per strip from %d plates\n", u.Label, u.PerUnit, u.Plates)
	}
	fmt.Printf("mean %.3e per strip (log10 %.3f), CV %.1f %%\n", p.Mean, p.Log10Mean, 100*p.CV)
	fmt.Printf("95 %% limits %.3e – %.3e (log10 %.3f – %.3f)\n", p.Lower, p.Upper, p.Log10Lower, p.Log10Upper)
	fmt.Println("plates set aside:", len(p.SetAside))
	// The values agree with R 4.2.2: mean, sd and qt(0.975, 2) of the
	// three strip counts.

	// Output:
	// strip 1: 2.050e+06 per strip from 2 plates
	// strip 2: 1.890e+06 per strip from 3 plates
	// strip 3: 2.330e+06 per strip from 2 plates
	// mean 2.090e+06 per strip (log10 6.320), CV 10.6 %
	// 95 % limits 1.537e+06 – 2.643e+06 (log10 6.187 – 6.422)
	// plates set aside: 5
}
