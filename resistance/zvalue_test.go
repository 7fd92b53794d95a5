package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/stat/distuv"
)

func pts(rows ...[2]float64) []Point {
	p := make([]Point, len(rows))
	for i, r := range rows {
		p[i] = Point{Celsius: r[0], D: Estimate{Value: r[1]}}
	}
	return p
}

// TestZFitR compares ZFit with R. The data are invented. Expected values:
// R 4.2.2, fit <- lm(log10(d) ~ celsius); z = -1/coef(fit)[2];
// -1/confint(fit, "celsius", level = L) (upper Inf when confint's upper end
// is ≥ 0); 10^predict(fit, data.frame(celsius = tref), interval =
// "confidence", level = L); summary(fit)$r.squared, $sigma.
func TestZFitR(t *testing.T) {
	inf := math.Inf(1)
	for _, c := range []struct {
		name                      string
		points                    []Point
		tRef, level               float64
		z, zLo, zHi               float64
		dRef, dLo, dHi            float64
		r2, sigma                 float64
		warnFewTemps, warnUnbound bool
	}{
		{"five temperatures", pts([2]float64{110, 19.5}, [2]float64{115, 6.3}, [2]float64{121, 1.85}, [2]float64{125, 0.71}, [2]float64{130, 0.20}), 121, 0.95,
			10.1682329772, 9.44725701869, 11.0083447574, 1.67143943049, 1.47773681565, 1.89053269852, 0.998277811805, 0.0373484209564, false, false},
		{"extrapolated to 134", pts([2]float64{110, 19.5}, [2]float64{115, 6.3}, [2]float64{121, 1.85}, [2]float64{125, 0.71}, [2]float64{130, 0.20}), 134, 0.95,
			10.1682329772, 9.44725701869, 11.0083447574, 0.0880235920816, 0.0673258471585, 0.115084370861, 0.998277811805, 0.0373484209564, false, false},
		{"replicates at 90 %", pts([2]float64{118, 4.1}, [2]float64{118, 3.7}, [2]float64{121, 2.05}, [2]float64{121, 1.88}, [2]float64{124, 0.98}, [2]float64{124, 1.07}), 121, 0.90,
			10.3414779511, 9.47105086163, 11.3880883822, 1.9857193023, 1.88864103092, 2.08778750593, 0.992620959165, 0.0250119113477, false, false},
		{"replicates at 95 %", pts([2]float64{118, 4.1}, [2]float64{118, 3.7}, [2]float64{121, 2.05}, [2]float64{121, 1.88}, [2]float64{124, 0.98}, [2]float64{124, 1.07}), 121, 0,
			10.3414779511, 9.23599733757, 11.7475759616, 1.9857193023, 1.86023316102, 2.11967038873, 0.992620959165, 0.0250119113477, false, false},
		{"three points, two temperatures", pts([2]float64{120, 2.4}, [2]float64{120, 2.6}, [2]float64{125, 0.8}), 121, 0.95,
			10.1111762688, 5.70111832736, 44.6493541021, 1.98926129781, 1.29210186511, 3.06257627035, 0.99630741801, 0.0245805210642, true, false},
		{"unbounded upper limit", pts([2]float64{120, 2.0}, [2]float64{121, 2.5}, [2]float64{122, 1.8}), 121, 0.95,
			43.7086906536, 1.10908914585, inf, 2.08008382305, 0.398634279123, 10.8539303756, 0.0986397446047, 0.0978071115761, false, true},
		{"dry heat", pts([2]float64{150, 12.0}, [2]float64{160, 2.9}, [2]float64{170, 0.65}), 160, 0.95,
			15.7944461574, 13.2787748854, 19.4860982942, 2.82811804939, 2.25715169198, 3.54351536483, 0.999777738865, 0.0133502878319, false, false},
	} {
		t.Run(c.name, func(t *testing.T) {
			r, err := ZFit(c.points, c.tRef, &ZSettings{Level: c.level})
			if err != nil {
				t.Fatal(err)
			}
			const tol = 1e-9 // R printed to 12 significant digits
			near(t, "z", r.Z.Value, c.z, tol)
			near(t, "z lower", r.Z.Lower, c.zLo, tol)
			near(t, "z upper", r.Z.Upper, c.zHi, tol)
			near(t, "D ref", r.DRef.Value, c.dRef, tol)
			near(t, "D ref lower", r.DRef.Lower, c.dLo, tol)
			near(t, "D ref upper", r.DRef.Upper, c.dHi, tol)
			near(t, "r2", r.RSquared, c.r2, tol)
			near(t, "residual sd", r.ResidualSD, c.sigma, tol)
			want := c.level
			if want == 0 {
				want = 0.95
			}
			near(t, "level", r.Z.Level, want, 0)
			if got := hasWarning(r.Warnings, "three or more"); got != c.warnFewTemps {
				t.Errorf("few-temperature warning %v, want %v: %q", got, c.warnFewTemps, r.Warnings)
			}
			if got := hasWarning(r.Warnings, "+Inf"); got != c.warnUnbound {
				t.Errorf("unbounded warning %v, want %v: %q", got, c.warnUnbound, r.Warnings)
			}
			if got, want := hasWarning(r.Warnings, "extrapolated"), c.tRef == 134; got != want {
				t.Errorf("extrapolation warning %v, want %v: %q", got, want, r.Warnings)
			}
			if r.Z.Method != MethodZLeastSq {
				t.Errorf("method %q", r.Z.Method)
			}
		})
	}
}

func hasWarning(ws []string, part string) bool {
	for _, w := range ws {
		if strings.Contains(w, part) {
			return true
		}
	}
	return false
}

// TestZFitWeighted compares the weighted fit with R 4.2.2 on invented data:
// L <- c(3.6,3.3,1.9,1.70,0.90,0.95); U <- c(4.7,4.2,2.2,2.08,1.07,1.2);
// se <- (log10(U)-log10(L))/(2*qnorm(0.975)); w <- 1/se^2;
// fit <- lm(log10(d) ~ celsius, weights = w), then as in TestZFitR.
func TestZFitWeighted(t *testing.T) {
	celsius := []float64{118, 118, 121, 121, 124, 124}
	d := []float64{4.1, 3.7, 2.05, 1.88, 0.98, 1.07}
	lo := []float64{3.6, 3.3, 1.9, 1.70, 0.90, 0.95}
	hi := []float64{4.7, 4.2, 2.2, 2.08, 1.07, 1.2}
	wantW := []float64{1145.97166652116, 1400.77890330039, 3790.52204004114, 2001.72796430316, 2721.44230482133, 1492.74853925192}
	p := make([]Point, len(d))
	for i := range d {
		p[i] = Point{Celsius: celsius[i], D: Estimate{Value: d[i], Lower: lo[i], Upper: hi[i], Level: 0.95, Method: "invented"}}
	}
	r, err := ZFit(p, 121, &ZSettings{Weighted: true})
	if err != nil {
		t.Fatal(err)
	}
	for i, w := range wantW {
		near(t, "weight", r.Weights[i], w, 1e-12)
	}
	near(t, "z", r.Z.Value, 10.2730623362, 1e-9)
	near(t, "z lower", r.Z.Lower, 9.13140275873, 1e-9)
	near(t, "z upper", r.Z.Upper, 11.7409868665, 1e-9)
	near(t, "D ref", r.DRef.Value, 1.98417479517, 1e-9)
	near(t, "D ref lower", r.DRef.Lower, 1.8654574508, 1e-9)
	near(t, "D ref upper", r.DRef.Upper, 2.11044728794, 1e-9)
	near(t, "r2", r.RSquared, 0.99195415501, 1e-9)
	near(t, "residual sd", r.ResidualSD, 1.06341346479, 1e-9)
	if r.Z.Method != MethodZWeightedLS {
		t.Errorf("method %q", r.Z.Method)
	}
	// A point without limits cannot be weighted.
	p[2].D.Lower = math.NaN()
	if _, err := ZFit(p, 121, &ZSettings{Weighted: true}); !errors.Is(err, ErrInvalidWeight) {
		t.Errorf("NaN lower limit: error %v, want ErrInvalidWeight", err)
	}
	p[2].D.Lower, p[2].D.Level = 1.9, 0
	if _, err := ZFit(p, 121, &ZSettings{Weighted: true}); !errors.Is(err, ErrInvalidWeight) {
		t.Errorf("zero level: error %v, want ErrInvalidWeight", err)
	}
	p[2].D.Level, p[2].D.Upper = 0.95, 1.9
	if _, err := ZFit(p, 121, &ZSettings{Weighted: true}); !errors.Is(err, ErrInvalidWeight) {
		t.Errorf("upper = lower: error %v, want ErrInvalidWeight", err)
	}
}

// TestZExact: D-values exactly on z-lines give that z, whatever the
// temperatures and reference (property; hand-worked from the model).
func TestZExact(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for i := range 200 {
		z := 3 + 40*rng.Float64()
		dRef := math.Pow(10, -1+2*rng.Float64())
		tRef := 100 + 80*rng.Float64()
		n := 2 + rng.IntN(6)
		p := make([]Point, n)
		for j := range p {
			c := tRef - 20 + 40*rng.Float64()
			if j == 1 {
				c = p[0].Celsius + 5 // two distinct temperatures at least
			}
			p[j] = Point{Celsius: c, D: Estimate{Value: dRef * math.Pow(10, (tRef-c)/z)}}
		}
		r, err := ZFit(p, tRef, nil)
		if err != nil {
			t.Fatalf("case %d: %v", i, err)
		}
		near(t, "exact z", r.Z.Value, z, 1e-9)
		near(t, "exact D ref", r.DRef.Value, dRef, 1e-9)
		near(t, "exact r2", r.RSquared, 1, 1e-9)
	}
}

// TestZTwoPoints: the closed form of ZFromTwo equals the least-squares line
// through the same two points, here fitted by linefit through each point
// entered twice (replicates do not move the line).
func TestZTwoPoints(t *testing.T) {
	for _, c := range []struct {
		t1, d1, t2, d2 float64
		want           float64 // hand-worked from the closed form, 0 when not hand-worked
	}{
		{150, 4.5, 160, 0.45, 10},   // the published D150 / D160 example
		{160, 0.45, 150, 4.5, 10},   // in the other order
		{121, 2, 127, 0.2, 6},       // a tenfold change over 6 °C
		{115, 7.3, 125, 0.9, 0},     // invented
		{110, 30.2, 121.1, 1.95, 0}, // invented
	} {
		z, err := ZFromTwo(c.t1, c.d1, c.t2, c.d2)
		if err != nil {
			t.Fatal(err)
		}
		if c.want != 0 {
			near(t, "closed form", z, c.want, 1e-12)
		}
		two, err := ZFit(pts([2]float64{c.t1, c.d1}, [2]float64{c.t2, c.d2}), 121, nil)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "ZFit of two points", two.Z.Value, z, 1e-12)
		if !math.IsNaN(two.Z.Lower) || !math.IsNaN(two.Z.Upper) || !math.IsNaN(two.DRef.Lower) || !math.IsNaN(two.SESlope) || !math.IsNaN(two.ResidualSD) {
			t.Errorf("two points gave limits: %v", two)
		}
		if two.Z.Method != MethodZTwoPoint || !hasWarning(two.Warnings, "no limits") || !hasWarning(two.Warnings, "three or more") {
			t.Errorf("two points: method %q, warnings %q", two.Z.Method, two.Warnings)
		}
		four, err := ZFit(pts([2]float64{c.t1, c.d1}, [2]float64{c.t2, c.d2}, [2]float64{c.t1, c.d1}, [2]float64{c.t2, c.d2}), 121, nil)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "regression through the points", four.Z.Value, z, 1e-12)
		near(t, "D121 of the regression", four.DRef.Value, two.DRef.Value, 1e-12)
		// And D121 itself from the closed form of DAt.
		d121, err := DAt(c.d1, c.t1, z, 121)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "D121 by DAt", two.DRef.Value, d121, 1e-12)
	}
}

func TestZRefusals(t *testing.T) {
	nan := math.NaN()
	good := pts([2]float64{111, 10}, [2]float64{121, 1}, [2]float64{131, 0.1})
	for _, c := range []struct {
		name   string
		points []Point
		tRef   float64
		s      *ZSettings
		want   error
	}{
		{"no point", nil, 121, nil, ErrTooFewTemperatures},
		{"one point", pts([2]float64{121, 2}), 121, nil, ErrTooFewTemperatures},
		{"one temperature", pts([2]float64{121, 2}, [2]float64{121, 2.2}, [2]float64{121, 1.9}), 121, nil, ErrTooFewTemperatures},
		{"two points one temperature", pts([2]float64{121, 2}, [2]float64{121, 2.2}), 121, nil, ErrTooFewTemperatures},
		{"D zero", pts([2]float64{111, 10}, [2]float64{121, 0}, [2]float64{131, 0.1}), 121, nil, ErrInvalidD},
		{"D negative", pts([2]float64{111, 10}, [2]float64{121, -1}, [2]float64{131, 0.1}), 121, nil, ErrInvalidD},
		{"D NaN", pts([2]float64{111, 10}, [2]float64{121, nan}, [2]float64{131, 0.1}), 121, nil, ErrInvalidD},
		{"D Inf", pts([2]float64{111, math.Inf(1)}, [2]float64{121, 1}, [2]float64{131, 0.1}), 121, nil, ErrInvalidD},
		{"temperature NaN", pts([2]float64{nan, 10}, [2]float64{121, 1}, [2]float64{131, 0.1}), 121, nil, ErrInvalidTemperature},
		{"reference NaN", good, nan, nil, ErrInvalidTemperature},
		{"rising D", pts([2]float64{111, 0.1}, [2]float64{121, 1}, [2]float64{131, 10}), 121, nil, ErrRisingD},
		{"flat D", pts([2]float64{111, 2}, [2]float64{121, 2}, [2]float64{131, 2}), 121, nil, ErrRisingD},
		{"rising D two points", pts([2]float64{111, 0.1}, [2]float64{121, 1}), 121, nil, ErrRisingD},
		{"level 1", good, 121, &ZSettings{Level: 1}, ErrInvalidLevel},
		{"level negative", good, 121, &ZSettings{Level: -0.5}, ErrInvalidLevel},
		{"level NaN", good, 121, &ZSettings{Level: nan}, ErrInvalidLevel},
		{"no limits to weight", good, 121, &ZSettings{Weighted: true}, ErrInvalidWeight},
		{"reference far away", good, 5000, nil, ErrOutOfRange},
	} {
		if _, err := ZFit(c.points, c.tRef, c.s); !errors.Is(err, c.want) {
			t.Errorf("ZFit %s: error %v, want %v", c.name, err, c.want)
		}
	}
	for _, c := range []struct {
		name           string
		t1, d1, t2, d2 float64
		want           error
	}{
		{"same temperature", 121, 2, 121, 1, ErrTooFewTemperatures},
		{"same D", 121, 2, 131, 2, ErrRisingD},
		{"rising", 121, 1, 131, 2, ErrRisingD},
		{"D zero", 121, 0, 131, 2, ErrInvalidD},
		{"D NaN", 121, 2, 131, nan, ErrInvalidD},
		{"temperature Inf", math.Inf(-1), 2, 131, 1, ErrInvalidTemperature},
		{"temperature NaN", 121, 2, nan, 1, ErrInvalidTemperature},
		{"z overflow", 0, 2, 1e300, 1.9999999999999998, ErrOutOfRange},
		{"temperature span overflow", -1e308, 2, 1e308, 1, ErrOutOfRange},
	} {
		if _, err := ZFromTwo(c.t1, c.d1, c.t2, c.d2); !errors.Is(err, c.want) {
			t.Errorf("ZFromTwo %s: error %v, want %v", c.name, err, c.want)
		}
	}
}

// TestZFitKeepsInput checks that the caller's points are not modified.
func TestZFitKeepsInput(t *testing.T) {
	p := pts([2]float64{130, 0.2}, [2]float64{110, 19.5}, [2]float64{121, 1.85})
	p[0].D.Warnings = []string{"kept"}
	before := append([]Point(nil), p...)
	if _, err := ZFit(p, 121, nil); err != nil {
		t.Fatal(err)
	}
	for i := range p {
		if p[i].Celsius != before[i].Celsius || p[i].D.Value != before[i].D.Value || len(p[i].D.Warnings) != len(before[i].D.Warnings) {
			t.Errorf("point %d changed: %v, was %v", i, p[i], before[i])
		}
	}
}

func TestZResultJSON(t *testing.T) {
	two, err := ZFit(pts([2]float64{121, 2}, [2]float64{131, 0.2}), 121, nil)
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(two)
	if err != nil {
		t.Fatalf("marshal with NaN fields: %v", err)
	}
	for _, part := range []string{`"se_slope":"NaN"`, `"residual_sd":"NaN"`, `"lower":"NaN"`, `"r2":1`} {
		if !strings.Contains(string(b), part) {
			t.Errorf("JSON lacks %s: %s", part, b)
		}
	}
	var back ZResult
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	near(t, "z back", back.Z.Value, 10, 1e-12)
	near(t, "se back", back.SESlope, math.NaN(), 0)
	near(t, "D ref back", back.DRef.Value, 2, 1e-12)
	unb, err := ZFit(pts([2]float64{120, 2.0}, [2]float64{121, 2.5}, [2]float64{122, 1.8}), 121, nil)
	if err != nil {
		t.Fatal(err)
	}
	if b, err = json.Marshal(unb); err != nil || !strings.Contains(string(b), `"upper":"+Inf"`) {
		t.Errorf("unbounded z JSON: %s, %v", b, err)
	}
	if s := unb.String(); !strings.Contains(s, "+Inf") || !strings.Contains(s, "warning:") {
		t.Errorf("String: %s", s)
	}
}

// TestZCoverage simulates studies with a known z and checks that the 95 %
// limits cover it about 95 % of the time (property of the t interval).
func TestZCoverage(t *testing.T) {
	if testing.Short() {
		t.Skip("statistical simulation")
	}
	rng := rand.New(rand.NewPCG(5, 6))
	noise := distuv.Normal{Mu: 0, Sigma: 0.04, Src: rng}
	const runs, z = 4000, 10.0
	covered := 0
	temps := []float64{115, 118, 121, 124, 127}
	for range runs {
		p := make([]Point, len(temps))
		for j, c := range temps {
			p[j] = Point{Celsius: c, D: Estimate{Value: 2 * math.Pow(10, (121-c)/z+noise.Rand())}}
		}
		r, err := ZFit(p, 121, nil)
		if err != nil {
			continue // a rising simulated slope is impossible at this noise, but not an error of the test
		}
		if r.Z.Lower <= z && z <= r.Z.Upper {
			covered++
		}
	}
	frac := float64(covered) / runs
	// Binomial standard error at 0.95 over 4000 runs is 0.0034; allow 4 of them.
	if math.Abs(frac-0.95) > 0.014 {
		t.Errorf("coverage %.4f, want about 0.95", frac)
	}
}
