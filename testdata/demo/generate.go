//go:build ignore

// Command generate writes the invented demo scenario of examples/qualify:
// an incoming steam indicator lot tested by a fictional contract laboratory
// and a production cycle of a fictional sterilizer. It is not part of any
// build; it documents how the demo files were made. Run it from the
// repository root:
//
//	go run testdata/demo/generate.go testdata/demo
//	cp testdata/demo/*.csv testdata/demo/*.json internal/lab/demo/
//
// The truth behind the data (invented): N0 = 2.0e6 spores per unit,
// D121 = 1.90 min, z = 10.5 °C, first-order inactivation with Poisson
// survivors. Every random draw comes from one PCG generator with a fixed
// seed. The files shipped are the ones this program wrote with Go 1.26;
// math/rand/v2 does not promise the same draws from every Go release, so
// a later run may differ in its digits.
package main

import (
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strings"
	"time"

	"github.com/dzf-go/dzf/survivor"
)

const (
	seed    = 20310520
	trueN0  = 2.0e6 // spores per unit
	trueD   = 1.90  // minutes at 121 °C
	trueZ   = 10.5  // °C
	refTemp = 121.0 // °C
	unitSD  = 0.04  // log10 SD of the spores per unit between units
	suspML  = 10.0  // mL of suspension each unit is recovered into
)

const scenario = "# Invented demo data, not a real laboratory, supplier, lot or sterilizer.\n" +
	"# Halvard Row Contract Laboratory (fictional), incoming lot K7-3108-24 of the\n" +
	"# Quillmere Spore Works (fictional) steam strip type K7.\n" +
	"# Made by testdata/demo/generate.go (seed 20310520) from N0 = 2.0e6 per unit,\n" +
	"# D121 = 1.90 min, z = 10.5 °C, first-order inactivation, Poisson survivors.\n"

func main() {
	dir := "testdata/demo"
	if len(os.Args) > 1 {
		dir = os.Args[1]
	}
	rng := rand.New(rand.NewPCG(seed, seed))
	// The draws are made in this order, one generator for all.
	files := []struct{ name, body string }{
		{"label.json", label()},
		{"population.csv", population(rng)},
		{"survivor.csv", survivorCurve(rng)},
		{"fraction.csv", fractionStudy(rng)},
		{"temperatures.csv", temperatures(rng)},
		{"outcomes.csv", outcomes(rng)},
		{"cycle.csv", cycle(rng)},
	}
	for _, f := range files {
		if err := os.WriteFile(filepath.Join(dir, f.name), []byte(f.body), 0o644); err != nil {
			fmt.Fprintln(os.Stderr, err)
			os.Exit(1)
		}
	}
}

// label is the supplier's certificate (invented). Its window satisfies the
// survival–kill formulas for the labelled D and for D near the true one.
func label() string {
	return `# Invented demo data: the certificate of a fictional supplier's lot.
# Fields: see the package documentation of examples/qualify.
{
  "supplier": "Quillmere Spore Works (fictional)",
  "product": "steam strip type K7",
  "lot": "K7-3108-24",
  "organism": "Geobacillus stearothermophilus",
  "modality": "moist heat",
  "population": 2300000,
  "d": 1.8,
  "celsius": 121,
  "z": 10.0,
  "survival_time": 9.0,
  "kill_time": 18.0
}
`
}

// poisson draws a Poisson variate by Knuth's product of uniforms (fine for
// the means below 700 used here).
func poisson(rng *rand.Rand, mean float64) int {
	l := math.Exp(-mean)
	k, p := 0, 1.0
	for {
		p *= rng.Float64()
		if p <= l {
			return k
		}
		k++
	}
}

// unitN0 draws one unit's spores, N0 with a lognormal spread between units.
func unitN0(rng *rand.Rand) float64 {
	return trueN0 * math.Pow(10, unitSD*rng.NormFloat64())
}

// plating is a dilution factor and a plated volume (mL).
type plating struct{ d, v float64 }

// platings lists the ways a unit's suspension is plated, most concentrated
// first: the whole suspension filtered, 1 mL of it, 1 mL of tenfold
// dilutions.
var platings = []plating{{1, 10}, {1, 1}, {1e-1, 1}, {1e-2, 1}, {1e-3, 1}, {1e-4, 1}, {1e-5, 1}}

// choosePlating returns the most concentrated plating expected to give at
// most 300 colonies from mean spores per unit.
func choosePlating(mean float64) plating {
	for _, p := range platings {
		if mean*p.d*p.v/suspML <= 300 {
			return p
		}
	}
	return platings[len(platings)-1]
}

func population(rng *rand.Rand) string {
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# Population assay: four unexposed units, each recovered into 10 mL, plated in\n" +
		"# duplicate at 10^-3 and 10^-4 (1 mL each). Columns: unit label; suspension\n" +
		"# volume mL; dilution factor of the plated liquid (10^-k); volume plated mL;\n" +
		"# colonies counted.\n")
	b.WriteString("unit,suspension_ml,dilution,plated_ml,colonies\n")
	for u := 1; u <= 4; u++ {
		n := unitN0(rng)
		for _, d := range []float64{1e-3, 1e-4} {
			for range 2 {
				fmt.Fprintf(&b, "U%d,%g,%g,%g,%d\n", u, suspML, d, 1.0, poisson(rng, n*d*1/suspML))
			}
		}
	}
	return b.String()
}

// curve simulates a survivor curve at a temperature where D is d: three
// units at each time, each counted at the plating that suits it.
func curve(rng *rand.Rand, d float64, times []float64) []survivor.Observation {
	var obs []survivor.Observation
	for _, t := range times {
		for range 3 {
			mean := unitN0(rng) * math.Pow(10, -t/d)
			p := choosePlating(mean)
			c := poisson(rng, mean*p.d*p.v/suspML)
			obs = append(obs, survivor.Observation{Minutes: t, Count: float64(c) / (p.d * p.v) * suspML})
		}
	}
	return obs
}

func survivorCurve(rng *rand.Rand) string {
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# Survivor curve at 121 °C: three units per exposure, each plated at the\n" +
		"# dilution giving 30-300 colonies (whole suspension filtered at the longest\n" +
		"# exposures). Columns: exposure minutes; survivors per unit.\n")
	b.WriteString("minutes,count\n")
	for _, o := range curve(rng, trueD, []float64{0, 1.6, 3.2, 4.8, 6.4, 8.0}) {
		fmt.Fprintf(&b, "%g,%.0f\n", o.Minutes, o.Count)
	}
	return b.String()
}

func fractionStudy(rng *rand.Rand) string {
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# Fraction-negative study at 121 °C: seven exposures 1.5 min apart, 20 units\n" +
		"# each, incubated 7 days. Columns: exposure minutes; units exposed; units\n" +
		"# negative (no growth).\n")
	b.WriteString("minutes,units,negative\n")
	for i := range 7 {
		t := 9 + 1.5*float64(i)
		neg := 0
		for range 20 {
			mu := unitN0(rng) * math.Pow(10, -t/trueD)
			if poisson(rng, mu) == 0 {
				neg++
			}
		}
		fmt.Fprintf(&b, "%g,%d,%d\n", t, 20, neg)
	}
	return b.String()
}

// temperatures fits simulated survivor curves at 118 and 124 °C with the
// library's survivor.Fit and writes D with its 95 % limits.
func temperatures(rng *rand.Rand) string {
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# D at two more temperatures, each from a survivor curve of six exposures x\n" +
		"# three units (simulated, fitted with survivor.Fit). Columns: temperature °C;\n" +
		"# D minutes; lower and upper limit minutes; confidence level; method.\n")
	b.WriteString("celsius,d,lower,upper,level,method\n")
	for _, c := range []struct {
		celsius float64
		times   []float64
	}{
		{118, []float64{0, 3, 6, 9, 12, 15}},
		{124, []float64{0, 0.8, 1.6, 2.4, 3.2, 4.0}},
	} {
		d := trueD * math.Pow(10, (refTemp-c.celsius)/trueZ)
		r, err := survivor.Fit(curve(rng, d, c.times), nil)
		if err != nil {
			panic(err)
		}
		fmt.Fprintf(&b, "%g,%.4g,%.4g,%.4g,%g,survivor curve\n", c.celsius, r.D.Value, r.D.Lower, r.D.Upper, r.D.Level)
	}
	return b.String()
}

// outcomes draws the survival and kill tests at the labelled window
// (resistometer, 121 °C) and the half-cycle run (sterilizer, hold halved to
// 15 min; the cold spot then receives about 16.5 min of lethality at 121 °C).
func outcomes(rng *rand.Rand) string {
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# Growth outcomes of indicator units: the survival and kill tests at the\n" +
		"# labelled times (resistometer, 121 °C) and a half-cycle run (production\n" +
		"# cycle with its hold halved to 15 min, indicators at the cold spot).\n" +
		"# Columns: test (survival, kill or half-cycle); exposure minutes; units;\n" +
		"# units that grew.\n")
	b.WriteString("test,minutes,units,growth\n")
	grow := func(lethalMinutes float64, units int) int {
		g := 0
		for range units {
			if poisson(rng, unitN0(rng)*math.Pow(10, -lethalMinutes/trueD)) > 0 {
				g++
			}
		}
		return g
	}
	fmt.Fprintf(&b, "survival,9.0,50,%d\n", grow(9.0, 50))
	fmt.Fprintf(&b, "kill,18.0,50,%d\n", grow(18.0, 50))
	fmt.Fprintf(&b, "half-cycle,15.0,20,%d\n", grow(16.5, 20))
	return b.String()
}

// probe is a temperature probe of the load: a first-order lag behind the
// chamber (time constant tau, minutes) and a steady offset (°C).
type probe struct {
	name        string
	tau, offset float64
}

// chamber is the controlled chamber temperature of the production cycle:
// a come-up from 60 °C to 122 °C in 12 min, a 32 min plateau at 122 °C,
// then exhaust and cooling.
func chamber(t float64) float64 {
	switch {
	case t < 12:
		return 60 + 62*(1-math.Exp(-t/4))/(1-math.Exp(-3))
	case t < 44:
		return 122
	default:
		return 80 + 42*math.Exp(-(t-44)/2.5)
	}
}

func cycle(rng *rand.Rand) string {
	probes := []probe{
		{"chamber", 0.05, 0},
		{"tray-top", 0.35, -0.15},
		{"tray-mid", 0.5, -0.25},
		{"door", 0.7, -0.45},
		{"pack-core", 1.2, -0.6},
	}
	var b strings.Builder
	b.WriteString(scenario)
	b.WriteString("# Production cycle 2031-05-20, steam sterilizer ST-2 (fictional, 600 L,\n" +
		"# pre-vacuum), load L-0931: 14 wrapped instrument trays. Set point 122 °C,\n" +
		"# hold 32 min. Five probes, one reading every 10 s, °C, RFC 3339 times.\n")
	b.WriteString("time")
	for _, p := range probes {
		b.WriteString("," + p.name)
	}
	b.WriteString("\n")
	start := time.Date(2031, 5, 20, 8, 0, 0, 0, time.FixedZone("", 2*3600))
	temp := make([]float64, len(probes))
	for i := range temp {
		temp[i] = 60
	}
	const dt = 10.0 / 60 // minutes
	const sub = 20       // integration steps per reading
	for k := 0; k <= 56*6; k++ {
		t := float64(k) * dt
		fmt.Fprintf(&b, "%s", start.Add(time.Duration(k)*10*time.Second).Format(time.RFC3339))
		for i := range probes {
			fmt.Fprintf(&b, ",%.2f", temp[i]+0.05*rng.NormFloat64())
		}
		b.WriteString("\n")
		for s := range sub {
			ts := t + float64(s)*dt/sub
			for i, p := range probes {
				target := chamber(ts) + p.offset
				temp[i] += (target - temp[i]) * (dt / sub) / p.tau
			}
		}
	}
	return b.String()
}
