package resistance

import (
	"errors"
	"fmt"
	"math"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// TestWindowExtremes: for log10 N0 from 3 to 12 and D from 0.01 to 1000 min
// the window is (log10 N0 − 2)·D to (log10 N0 + 4)·D (the closed form of
// the FDA 2007 guidance); log10 N0 of 1 and 2 leave no survival time and
// are refused.
func TestWindowExtremes(t *testing.T) {
	for _, l := range []float64{1, 2} {
		if _, err := SurvivalKill(l, 1.5); !errors.Is(err, ErrInvalidPopulation) {
			t.Errorf("log10 N0 %g: %v, want ErrInvalidPopulation", l, err)
		}
	}
	for l := 3.0; l <= 12; l++ {
		for _, d := range []float64{0.01, 0.1, 1, 10, 100, 1000} {
			w, err := SurvivalKill(l, d)
			if err != nil {
				t.Fatal(err)
			}
			what := fmt.Sprintf("log10 N0 %g, D %g: ", l, d)
			near(t, what+"survival", w.Survival, (l-2)*d, 1e-15)
			near(t, what+"kill", w.Kill, (l+4)*d, 1e-15)
		}
	}
}

// TestDScaleInvariance: multiplying every D of a z fit by k (D from 0.01 to
// 1000 min) leaves z and its limits unchanged and multiplies D at the
// reference temperature, and its limits, by k (log10 D only shifts).
// Invented D-values on a z = 10 °C line with offsets.
func TestDScaleInvariance(t *testing.T) {
	base := []Point{{110, Estimate{Value: 20.9}}, {115, Estimate{Value: 6.1}}, {121, Estimate{Value: 1.95}}, {125, Estimate{Value: 0.82}}, {130, Estimate{Value: 0.2}}}
	r1, err := ZFit(base, 121, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []float64{0.005, 0.05, 50, 500} {
		p := make([]Point, len(base))
		for i, x := range base {
			p[i] = Point{x.Celsius, Estimate{Value: k * x.D.Value}}
		}
		r, err := ZFit(p, 121, nil)
		if err != nil {
			t.Fatal(err)
		}
		what := fmt.Sprintf("D ×%g: ", k)
		near(t, what+"z", r.Z.Value, r1.Z.Value, 1e-12)
		near(t, what+"z lower", r.Z.Lower, r1.Z.Lower, 1e-12)
		near(t, what+"z upper", r.Z.Upper, r1.Z.Upper, 1e-12)
		near(t, what+"D ref", r.DRef.Value, k*r1.DRef.Value, 1e-12)
		near(t, what+"D ref lower", r.DRef.Lower, k*r1.DRef.Lower, 1e-12)
		near(t, what+"D ref upper", r.DRef.Upper, k*r1.DRef.Upper, 1e-12)
	}
}

// TestConcurrentUse runs the functions from many goroutines on shared
// inputs and compares each result with the sequential one (as JSON). Run
// it with go test -race.
func TestConcurrentUse(t *testing.T) {
	pts := []Point{{110, Estimate{Value: 20.9, Lower: 19, Upper: 23, Level: 0.95}}, {121, Estimate{Value: 1.95, Lower: 1.8, Upper: 2.1, Level: 0.95}},
		{130, Estimate{Value: 0.2, Lower: 0.18, Upper: 0.23, Level: 0.95}}, {121, Estimate{Value: 2.05, Lower: 1.9, Upper: 2.2, Level: 0.9}}}
	l, m := steamLabel(), steamMeasured()
	p := ISOMoistHeatProfile()
	jobs := []apicheck.Job{
		func() (any, error) { return ZFit(pts, 121, nil) },
		func() (any, error) { return ZFit(pts, 121, &ZSettings{Weighted: true, Level: 0.9}) },
		func() (any, error) { return ZFit(pts[:2], 121, nil) },
		func() (any, error) { return CheckLabel(l, m, &Criteria{Profile: &p}) },
		func() (any, error) { return CheckWindow(Window{8, 19}, m.D[0], 6.1) },
		func() (any, error) { return EstimateAt(m.D[1], 121, 10, 118) },
		func() (any, error) { return DAt(1.9, 121, 10, 131) },
	}
	apicheck.RunConcurrently(t, 21, jobs)
	if math.IsNaN(m.D[0].Value) {
		t.Fatal("shared input changed")
	}
}
