package lethality

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
	"github.com/dzf-go/dzf/resistance"
)

// TestSurvivorsExtremes: for log10 N0 from 1 to 12 and D from 0.01 to
// 1000 min, a lethality of D·(log10 N0 + k) leaves log10 N = −k survivors
// per unit, so that (hand-worked from the closed forms)
//
//	k = 6:    PNSU = −expm1(−10⁻⁶) = 9.999995e-7 (to 7 digits)
//	k = 300:  PNSU = 1e-300 (relative 5e-301 below), log10 PNSU = −300
//	k = 1000: PNSU = 0 (underflow), log10 PNSU = −1000 (N/2 below 1e-1000)
func TestSurvivorsExtremes(t *testing.T) {
	for l := 1.0; l <= 12; l++ {
		for _, d := range []float64{0.01, 0.1, 1, 10, 100, 1000} {
			what := fmt.Sprintf("log10 N0 %g, D %g: ", l, d)
			s, err := Survivors(l, d*(l+6), d)
			if err != nil {
				t.Fatal(err)
			}
			near(t, what+"log10 N at 6 logs below 1", s.Log10Survivors, -6, 1e-12, 0)
			near(t, what+"PNSU at 1e-6", s.PNSU, 9.999995e-7, 0, 1e-9)
			s, err = Survivors(l, d*(l+300), d)
			if err != nil {
				t.Fatal(err)
			}
			near(t, what+"PNSU at 1e-300", s.PNSU, 1e-300, 0, 1e-10)
			near(t, what+"log10 PNSU at 1e-300", s.Log10PNSU, -300, 1e-10, 0)
			s, err = Survivors(l, d*(l+1000), d)
			if err != nil {
				t.Fatal(err)
			}
			if s.PNSU != 0 {
				t.Errorf("%sPNSU at 10^-1000 = %g, want 0", what, s.PNSU)
			}
			near(t, what+"log10 PNSU at 10^-1000", s.Log10PNSU, -1000, 1e-9, 0)
			if _, err := json.Marshal(s); err != nil {
				t.Error(err)
			}
			// The required F is D·(log10 N0 + 6), and at 111.1 °C (lethal
			// rate 0.1 against F0) it takes ten times as long.
			f, err := RequiredF(l, d, -6)
			if err != nil {
				t.Fatal(err)
			}
			near(t, what+"required F", f, d*(l+6), 0, 1e-15)
			m, err := EquivalentMinutes(f, 111.1, MoistHeat())
			if err != nil {
				t.Fatal(err)
			}
			near(t, what+"minutes at 111.1 °C", m, 10*f, 0, 1e-13)
			r, err := Require(l, -1000, resistance.Estimate{Value: d, Lower: d / 2, Upper: 2 * d}, 121.1, MoistHeat())
			if err != nil {
				t.Fatal(err)
			}
			near(t, what+"F for 10^-1000", r.F, d*(l+1000), 0, 1e-15)
			near(t, what+"conservative F for 10^-1000", r.FConservative, 2*d*(l+1000), 0, 1e-15)
		}
	}
}

// TestFSecondsToDays: a constant temperature for a duration from seconds
// to ten days gives F = L·duration exactly, L = 10^((T − 121.1)/10)
// (hand-worked: L(121.1) = 1, L(111.1) = 0.1), with readings every second
// to every 15 minutes; and the same record with its times in seconds
// divided by 60 gives the same F.
func TestFSecondsToDays(t *testing.T) {
	for _, c := range []struct {
		duration, step, celsius, rate float64
	}{
		{5.0 / 60, 1.0 / 60, 121.1, 1},
		{15, 1.0 / 60, 111.1, 0.1},
		{1440, 1, 121.1, 1},
		{14400, 15, 111.1, 0.1},
	} {
		n := int(math.Round(c.duration/c.step)) + 1
		s := make([]Sample, n)
		for i := range s {
			s[i] = Sample{Minutes: float64(i) * c.step, Celsius: c.celsius}
		}
		for _, rule := range []Rule{Exact, Trapezoid, Rectangle} {
			r, err := F(s, MoistHeat(), &FSettings{Rule: rule})
			if err != nil {
				t.Fatal(err)
			}
			near(t, fmt.Sprintf("%g min at %g °C (%s)", c.duration, c.celsius, rule), r.F, c.rate*float64(n-1)*c.step, 0, 1e-12)
		}
	}
}

// TestConcurrentUse runs the package's functions from many goroutines on
// shared inputs (a sample slice, a record, the bytes of a file) and
// compares each result with the sequential one (as JSON). Run it with go
// test -race.
func TestConcurrentUse(t *testing.T) {
	samples := loggerRecord(3000)
	file := fourProbeFile(500)
	rec, err := ReadRecord(bytes.NewReader(file), &ReadSettings{Time: TimeSeconds})
	if err != nil {
		t.Fatal(err)
	}
	d := resistance.Estimate{Value: 1.8, Lower: 1.6, Upper: 2.1, Level: 0.95}
	jobs := []apicheck.Job{
		func() (any, error) { return F(samples, MoistHeat(), nil) },
		func() (any, error) { return F(samples, MoistHeat121(), &FSettings{Rule: Trapezoid, Cumulative: true}) },
		func() (any, error) {
			acc, err := NewAccumulator(MoistHeat(), nil)
			if err != nil {
				return nil, err
			}
			for _, x := range samples {
				if err := acc.Add(x); err != nil {
					return nil, err
				}
			}
			return acc.Result()
		},
		func() (any, error) { return Cycle(rec, MoistHeat(), &CycleSettings{Celsius: 115}) },
		func() (any, error) {
			return StreamF(bytes.NewReader(file), MoistHeat(), &ReadSettings{Time: TimeSeconds}, nil)
		},
		func() (any, error) { return ReadRecord(bytes.NewReader(file), &ReadSettings{Time: TimeSeconds}) },
		func() (any, error) { return Assess(6, 15, d) },
		func() (any, error) { return Require(6, -6, d, 118, MoistHeat()) },
		func() (any, error) {
			return HalfCycle(HalfCycleStudy{Log10N0: 6, Units: 20, Negative: 20, HalfMinutes: 9}, nil)
		},
	}
	apicheck.RunConcurrently(t, 9, jobs)
}
