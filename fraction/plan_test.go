package fraction

import (
	"errors"
	"math"
	"reflect"
	"testing"
)

func TestPlanStudy(t *testing.T) {
	p, err := PlanStudy(2, 6, 20, 7, nil)
	if err != nil {
		t.Fatal(err)
	}
	// Hand-worked: survival time (6 − 2)·2 = 8 min, kill time (6 + 4)·2 =
	// 20 min, 7 exposures every 2 min.
	near(t, "survival time", p.SurvivalTime, 8, 1e-12, 0)
	near(t, "kill time", p.KillTime, 20, 1e-12, 0)
	near(t, "interval", p.Interval, 2, 1e-12, 0)
	// Expected negatives 20·exp(−10^(6 − t/2)); R 4.2.2:
	// 20 * exp(-10^(6 - seq(8, 20, by = 2)/2)).
	wantNeg := []float64{7.44015195204167e-43, 0.000907998595249697, 7.35758882342885, 18.0967483607192,
		19.8009966749834, 19.9800099966675, 19.9980000999967}
	if len(p.Exposures) != 7 {
		t.Fatalf("%d exposures", len(p.Exposures))
	}
	for i, e := range p.Exposures {
		near(t, "minutes", e.Minutes, 8+2*float64(i), 1e-12, 0)
		near(t, "expected negative", e.ExpectedNegative, wantNeg[i], 0, 1e-12)
		if e.Units != 20 {
			t.Errorf("units %d", e.Units)
		}
	}
	// Expected limits from the Fisher information; R 4.2.2:
	// mu <- 10^(6 - t/2); w <- 20 * mu^2 / expm1(mu); b <- -log(10)/2;
	// se <- 1/sqrt(sum(w * t^2)); -log(10)/(b -/+ qnorm(0.975) * se).
	near(t, "expected lower", p.Expected.Lower, 1.92862598056712, 0, 1e-12)
	near(t, "expected upper", p.Expected.Upper, 2.07685981323643, 0, 1e-12)
	if p.Expected.Value != 2 || p.Expected.Level != 0.95 {
		t.Errorf("expected %v", p.Expected)
	}
	// The design meets the limited procedure's equal spacing.
	exp := make([]Exposure, len(p.Exposures))
	for i, e := range p.Exposures {
		exp[i] = Exposure{e.Minutes, e.Units, int(math.Round(e.ExpectedNegative))}
	}
	if _, err := LimitedHSK(6, exp); err != nil {
		t.Errorf("the rounded expected study breaks the limited procedure: %v", err)
	}
	// Expected HSK half-width, hand-worked: 2√(4·Σ p(1 − p)/20)/6.2507 over
	// the five inner exposures.
	ev := 0.0
	for _, e := range p.Exposures[1:6] {
		q := e.ProbabilityNegative
		ev += 4 * q * (1 - q) / 20
	}
	near(t, "HSK half-width", p.ExpectedHSKHalfWidth, 2*math.Sqrt(ev)/6.2507, 0, 1e-12)

	// N0 fitted: R 4.2.2: I <- matrix(c(sum(w), sum(w*t), sum(w*t),
	// sum(w*t^2)), 2); se <- sqrt(solve(I)[2, 2]).
	q, err := PlanStudy(2, 6, 20, 7, &PlanSettings{FitN0: true})
	if err != nil {
		t.Fatal(err)
	}
	near(t, "expected lower, N0 fitted", q.Expected.Lower, 1.3112554914885, 0, 1e-11)
	near(t, "expected upper, N0 fitted", q.Expected.Upper, 4.21279472120395, 0, 1e-11)
	if len(p.Warnings) != 0 {
		t.Errorf("warnings %q", p.Warnings)
	}
	few, err := PlanStudy(2, 6, 20, 4, nil)
	if err != nil || len(few.Warnings) != 1 {
		t.Errorf("4 exposures: %v %q", err, few.Warnings)
	}
}

func TestPlanRefusals(t *testing.T) {
	tests := []struct {
		name         string
		d, l         float64
		units, count int
		s            *PlanSettings
		want         error
	}{
		{"D 0", 0, 6, 20, 7, nil, ErrInvalidPlan},
		{"D NaN", math.NaN(), 6, 20, 7, nil, ErrInvalidPlan},
		{"D Inf", math.Inf(1), 6, 20, 7, nil, ErrInvalidPlan},
		{"log10 N0 2", 2, 2, 20, 7, nil, ErrInvalidPlan},
		{"log10 N0 0", 2, 0, 20, 7, nil, ErrInvalidPopulation},
		{"log10 N0 NaN", 2, math.NaN(), 20, 7, nil, ErrInvalidPopulation},
		{"log10 N0 huge", 2, 1000, 20, 7, nil, ErrInvalidPopulation},
		{"no units", 2, 6, 0, 7, nil, ErrInvalidPlan},
		{"one exposure", 2, 6, 20, 1, nil, ErrInvalidPlan},
		{"too many exposures", 2, 6, 20, MaxPlanExposures + 1, nil, ErrInvalidPlan},
		{"negative simulations", 2, 6, 20, 7, &PlanSettings{Simulations: -1}, ErrInvalidPlan},
		{"too many simulations", 2, 6, 20, 7, &PlanSettings{Simulations: MaxPlanSimulations + 1}, ErrInvalidPlan},
		{"level 2", 2, 6, 20, 7, &PlanSettings{Level: 2}, ErrInvalidLevel},
		{"kill time overflows", 1e308, 6, 20, 7, nil, ErrInvalidPlan},
	}
	for _, c := range tests {
		if _, err := PlanStudy(c.d, c.l, c.units, c.count, c.s); !errors.Is(err, c.want) {
			t.Errorf("%s: error %v, want %v", c.name, err, c.want)
		}
	}
}

// TestPlanSimulationSeeded checks that a seed reproduces the simulation and
// that another seed changes it.
func TestPlanSimulationSeeded(t *testing.T) {
	s := &PlanSettings{Simulations: 200, Seed: 42}
	a, err := PlanStudy(2, 6, 20, 7, s)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := PlanStudy(2, 6, 20, 7, s)
	if !reflect.DeepEqual(a.Simulation, b.Simulation) {
		t.Errorf("same seed, different simulations: %+v / %+v", a.Simulation, b.Simulation)
	}
	c, _ := PlanStudy(2, 6, 20, 7, &PlanSettings{Simulations: 200, Seed: 43})
	if reflect.DeepEqual(a.Simulation, c.Simulation) {
		t.Errorf("seeds 42 and 43 gave the same simulation")
	}
	sim := a.Simulation
	if sim.Studies != 200 || sim.Refused+sim.HSKComputable == 0 || sim.Coverage < 0.85 || sim.Coverage > 1 {
		t.Errorf("simulation %+v", sim)
	}
	// The simulated median limits are close to the expected (Fisher) ones.
	near(t, "median lower", sim.MedianLower, a.Expected.Lower, 0, 0.02)
	near(t, "median upper", sim.MedianUpper, a.Expected.Upper, 0, 0.02)
}
