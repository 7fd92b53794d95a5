package linefit

import (
	"bufio"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// readXY reads "y x" rows, skipping # lines.
func readXY(t *testing.T, path string) (x, y []float64) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	line := 0
	for sc.Scan() {
		line++
		s := strings.TrimSpace(sc.Text())
		if s == "" || strings.HasPrefix(s, "#") {
			continue
		}
		fs := strings.Fields(s)
		if len(fs) != 2 {
			t.Fatalf("%s:%d: want 2 fields", path, line)
		}
		yv, err1 := strconv.ParseFloat(fs[0], 64)
		xv, err2 := strconv.ParseFloat(fs[1], 64)
		if err1 != nil || err2 != nil {
			t.Fatalf("%s:%d: bad number", path, line)
		}
		x, y = append(x, xv), append(y, yv)
	}
	return x, y
}

// sigDigits is the number of correct significant digits of got against want.
func sigDigits(got, want float64) float64 {
	if got == want {
		return 17
	}
	return -math.Log10(math.Abs(got-want) / math.Abs(want))
}

func TestNorris(t *testing.T) {
	x, y := readXY(t, "../../testdata/nist/nist-norris.txt")
	if len(x) != 36 {
		t.Fatalf("read %d observations, want 36", len(x))
	}
	l, err := Fit(x, y)
	if err != nil {
		t.Fatal(err)
	}
	// Certified values: NIST StRD, linear least squares, Norris (header of
	// testdata/nist/nist-norris.txt).
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"B0", l.Intercept, -0.262323073774029},
		{"B1", l.Slope, 1.00211681802045},
		{"sd(B0)", l.SEIntercept, 0.232818234301152},
		{"sd(B1)", l.SESlope, 0.429796848199937e-03},
		{"residual SD", l.ResidualSD, 0.884796396144373},
		{"R-squared", l.RSquared, 0.999993745883712},
		{"RSS", l.RSS, 26.6173985294224},
	} {
		if d := sigDigits(c.got, c.want); d < 9 {
			t.Errorf("%s = %.15g, certified %.15g: %.1f significant digits, want ≥ 9", c.name, c.got, c.want, d)
		}
	}
	if l.DF != 34 {
		t.Errorf("DF = %d, want 34 (NIST)", l.DF)
	}
}

func TestExactLine(t *testing.T) {
	// Invented data on the exact line y = 6 − x/1.5: the fit must return it
	// with zero residuals and equal limits.
	x := []float64{0, 1.5, 3, 4.5, 6, 7.5}
	y := make([]float64, len(x))
	for i := range x {
		y[i] = 6 - x[i]/1.5
	}
	l, err := Fit(x, y)
	if err != nil {
		t.Fatal(err)
	}
	v, lo, hi, unb, err := l.NegReciprocal(0.95)
	if err != nil || unb {
		t.Fatalf("NegReciprocal: %v %v", err, unb)
	}
	for _, c := range []struct {
		name      string
		got, want float64
	}{{"D", v, 1.5}, {"lower", lo, 1.5}, {"upper", hi, 1.5}, {"intercept", l.Intercept, 6}, {"r2", l.RSquared, 1}, {"sd", l.ResidualSD, 0}} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-12, 1e-12) {
			t.Errorf("%s = %.15g, want %.15g (closed form)", c.name, c.got, c.want)
		}
	}
}

func TestIntervalsAgainstR(t *testing.T) {
	// Invented survivor-curve data. Expected values: R 4.2.2,
	//   d <- data.frame(t=c(0,2,4,6,8,10), y=log10(c(1.2e6,2.9e5,8.1e4,1.6e4,5.2e3,1.1e3)))
	//   m <- lm(y ~ t, d); confint(m, level=0.95); predict(m, data.frame(t=5), interval="confidence")
	x := []float64{0, 2, 4, 6, 8, 10}
	counts := []float64{1.2e6, 2.9e5, 8.1e4, 1.6e4, 5.2e3, 1.1e3}
	y := make([]float64, len(counts))
	for i, c := range counts {
		y[i] = math.Log10(c)
	}
	l, err := Fit(x, y)
	if err != nil {
		t.Fatal(err)
	}
	slo, shi, _ := l.SlopeInterval(0.95)
	ilo, ihi, _ := l.InterceptInterval(0.95)
	mlo, mhi, _ := l.MeanInterval(5, 0.95)
	for _, c := range []struct {
		name      string
		got, want float64
	}{
		{"slope", l.Slope, rSlope},
		{"slope lower", slo, rSlopeLo},
		{"slope upper", shi, rSlopeHi},
		{"intercept lower", ilo, rIntLo},
		{"intercept upper", ihi, rIntHi},
		{"fit at 5", l.At(5), rFit5},
		{"fit at 5 lower", mlo, rFit5Lo},
		{"fit at 5 upper", mhi, rFit5Hi},
	} {
		if !scalar.EqualWithinAbsOrRel(c.got, c.want, 1e-9, 1e-9) {
			t.Errorf("%s = %.12g, want %.12g (R 4.2.2)", c.name, c.got, c.want)
		}
	}
}

func TestWeightedMatchesReplication(t *testing.T) {
	// A weight of 2 on a point gives the same coefficients as entering it
	// twice (property; invented data).
	x := []float64{1, 2, 3, 4, 5}
	y := []float64{2.1, 3.9, 6.2, 7.8, 10.1}
	w := []float64{1, 2, 1, 1, 1}
	lw, err := FitWeighted(x, y, w)
	if err != nil {
		t.Fatal(err)
	}
	lr, err := Fit(append([]float64{2}, x...), append([]float64{3.9}, y...))
	if err != nil {
		t.Fatal(err)
	}
	if !scalar.EqualWithinAbsOrRel(lw.Slope, lr.Slope, 1e-13, 1e-13) || !scalar.EqualWithinAbsOrRel(lw.Intercept, lr.Intercept, 1e-13, 1e-13) {
		t.Errorf("weighted %v %v, replicated %v %v", lw.Slope, lw.Intercept, lr.Slope, lr.Intercept)
	}
}

func TestRefusals(t *testing.T) {
	nan := math.NaN()
	for _, c := range []struct {
		name string
		x, y []float64
		w    []float64
		want error
	}{
		{"length", []float64{1, 2, 3}, []float64{1, 2}, nil, ErrInput},
		{"nan", []float64{1, 2, nan}, []float64{1, 2, 3}, nil, ErrInput},
		{"inf", []float64{1, 2, 3}, []float64{1, math.Inf(1), 3}, nil, ErrInput},
		{"negative weight", []float64{1, 2, 3}, []float64{1, 2, 3}, []float64{1, -1, 1}, ErrInput},
		{"two points", []float64{1, 2}, []float64{1, 2}, nil, ErrTooFewPoints},
		{"empty", nil, nil, nil, ErrTooFewPoints},
		{"one x", []float64{2, 2, 2}, []float64{1, 2, 3}, nil, ErrNoSpread},
	} {
		if _, err := FitWeighted(c.x, c.y, c.w); !errors.Is(err, c.want) {
			t.Errorf("%s: err %v, want %v", c.name, err, c.want)
		}
	}
	l, _ := Fit([]float64{1, 2, 3}, []float64{3, 2, 1.1})
	for _, lv := range []float64{0, 1, -0.5, nan} {
		if _, _, err := l.SlopeInterval(lv); !errors.Is(err, ErrLevel) {
			t.Errorf("level %v: err %v", lv, err)
		}
	}
}

func TestNegReciprocalUnbounded(t *testing.T) {
	// Invented noisy, nearly flat data: the slope interval reaches zero, so
	// the upper limit is +Inf.
	l, err := Fit([]float64{0, 1, 2, 3}, []float64{5, 4.2, 5.1, 4.3})
	if err != nil {
		t.Fatal(err)
	}
	_, lo, hi, unb, err := l.NegReciprocal(0.95)
	if err != nil || !unb || !math.IsInf(hi, 1) || !(lo > 0) {
		t.Errorf("got lo %v hi %v unbounded %v err %v", lo, hi, unb, err)
	}
	l2, _ := Fit([]float64{0, 1, 2}, []float64{1, 2, 3.1})
	if v, _, _, unb, _ := l2.NegReciprocal(0.95); !math.IsNaN(v) || !unb {
		t.Errorf("increasing line: %v %v", v, unb)
	}
}

func BenchmarkFit(b *testing.B) {
	for _, n := range []int{15, 10000} {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i] = float64(i % 5)
			y[i] = 6 - x[i]/1.5 + 0.01*float64(i%7)
		}
		b.Run(strconv.Itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Fit(x, y); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N)/float64(n), "ns/point")
		})
	}
}

// Values printed by R 4.2.2 for TestIntervalsAgainstR (call in that test).
const (
	rSlope   = -0.3018927400494601
	rSlopeLo = -0.31731161714651063
	rSlopeHi = -0.28647386295240956
	rIntLo   = 5.98469447522099074
	rIntHi   = 6.17142635003167328
	rFit5    = 4.5685967123790316
	rFit5Lo  = 4.5159312208857454
	rFit5Hi  = 4.6212622038723179
)

// FuzzFitWeighted checks that FitWeighted never panics, refuses with one of
// the package's sentinels, and that an accepted fit keeps its invariants:
// DF = N − 2, r² in [0, 1], non-negative standard errors, and t intervals
// that contain the estimate.
func FuzzFitWeighted(f *testing.F) {
	f.Add([]byte{0, 60, 4, 1, 50, 4, 2, 42, 4, 3, 31, 4, 4, 22, 0}, 1.0, 0.95, true)
	f.Add([]byte{0, 0, 0, 0, 0, 0, 0, 0, 0}, 1e-300, 0.5, false)
	f.Add([]byte{255, 255, 255, 0, 0, 0, 128, 128, 128}, 1e300, 0.999999, true)
	f.Fuzz(func(t *testing.T, b []byte, scale, level float64, weighted bool) {
		var x, y, w []float64
		for len(b) >= 3 && len(x) < 40 {
			x = append(x, float64(b[0])*scale)
			y = append(y, float64(b[1])/10-12)
			w = append(w, float64(b[2])/4)
			b = b[3:]
		}
		if !weighted {
			w = nil
		}
		l, err := FitWeighted(x, y, w)
		if err != nil {
			n := 0
			for _, s := range []error{ErrInput, ErrTooFewPoints, ErrNoSpread, ErrLevel, ErrOverflow} {
				if errors.Is(err, s) {
					n++
				}
			}
			if n != 1 {
				t.Fatalf("error %v wraps %d sentinels", err, n)
			}
			return
		}
		if l.DF != l.N-2 || l.N < 3 || len(l.Residuals) != len(x) || !(l.RSquared >= 0 && l.RSquared <= 1) || !(l.SESlope >= 0) || !(l.SEIntercept >= 0) || !(l.ResidualSD >= 0) {
			t.Fatalf("line %+v", l)
		}
		lo, hi, err := l.SlopeInterval(level)
		if err != nil {
			if !errors.Is(err, ErrLevel) {
				t.Fatalf("slope interval: %v", err)
			}
			return
		}
		if !(lo <= l.Slope && l.Slope <= hi) && !math.IsInf(l.Slope, 0) && !math.IsNaN(lo) {
			t.Fatalf("slope %v outside %v – %v", l.Slope, lo, hi)
		}
		if v, dlo, dhi, unb, err := l.NegReciprocal(level); err == nil && !unb && !(dlo <= v && v <= dhi) {
			t.Fatalf("-1/slope %v outside %v – %v", v, dlo, dhi)
		}
	})
}

// TestOverflow: finite inputs whose sums of squares overflow are refused
// with ErrOverflow, never returned as a line with infinite or NaN numbers
// (found by FuzzFitWeighted; its input is kept in testdata/fuzz).
func TestOverflow(t *testing.T) {
	for _, c := range []struct{ x, y []float64 }{
		{[]float64{0, 1e200, 2e200}, []float64{6, 3, 0}},
		{[]float64{0, 4.9e301, 9.8e301}, []float64{-7.2, -7.2, -7.2}},
		{[]float64{0, 1, 2}, []float64{1e300, -1e300, 1e300}},
	} {
		if l, err := Fit(c.x, c.y); !errors.Is(err, ErrOverflow) {
			t.Errorf("Fit(%v, %v) = %+v, %v; want ErrOverflow", c.x, c.y, l, err)
		}
	}
}
