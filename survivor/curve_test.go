package survivor

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"

	"github.com/dzf-go/dzf/internal/linefit"
)

var inf = math.Inf(1)

// c builds a slice, as R's c() does.
func c(v ...float64) []float64 { return v }

// observations pairs times with counts.
func observations(t, count []float64) []Observation {
	obs := make([]Observation, len(t))
	for i := range t {
		obs[i] = Observation{Minutes: t[i], Count: count[i]}
	}
	return obs
}

// tol is a per-case tolerance: |got − want| ≤ max(abs, rel·|want|). An
// infinite or NaN want needs the same value.
type tol struct{ abs, rel float64 }

// check compares got with want within tolerance.
func check(t *testing.T, what string, got, want float64, tl tol) {
	t.Helper()
	switch {
	case math.IsNaN(want):
		if !math.IsNaN(got) {
			t.Errorf("%s = %.15g, want NaN", what, got)
		}
	case math.IsInf(want, 0):
		if got != want {
			t.Errorf("%s = %.15g, want %v", what, got, want)
		}
	case !scalar.EqualWithinAbsOrRel(got, want, tl.abs, tl.rel):
		t.Errorf("%s = %.15g, want %.15g (abs %g, rel %g)", what, got, want, tl.abs, tl.rel)
	}
}

type want struct {
	d, dLo, dHi, n0, n0Lo, n0Hi, slope, seSlope, seN0, r2, sd float64
}

// TestFitR checks Fit against R. Every want comes from R 4.2.2 with the t
// and count of the row:
//
//	f <- lm(log10(count) ~ t); ci <- confint(f, level = level); s <- summary(f)
//	d = -1/coef(f)[2]; dLo = -1/ci[2, 1]; dHi = -1/ci[2, 2] (Inf when ci[2, 2] >= 0)
//	n0 = coef(f)[1]; n0Lo, n0Hi = ci[1, ]; slope = coef(f)[2]
//	seSlope, seN0 = s$coefficients[2, 2], s$coefficients[1, 2]; r2 = s$r.squared; sd = s$sigma
//
// printed with sprintf("%.15g"). All data are invented. In "exact" R's SEs
// and sigma are rounding noise (the exact values are 0): the absolute
// tolerance covers them.
func TestFitR(t *testing.T) {
	tl := tol{abs: 1e-12, rel: 1e-9}
	for _, tc := range []struct {
		name  string
		level float64
		t     []float64
		count []float64
		want  want
	}{
		{name: "six", level: 0.95, t: c(0, 2, 4, 6, 8, 10), count: c(1.8e6, 2.9e5, 3.6e4, 5.2e3, 6.1e2, 88), // R: t <- c(0,2,4,6,8,10); count <- c(1.8e6,2.9e5,3.6e4,5.2e3,6.1e2,88)
			want: want{d: 2.30070528237786, dLo: 2.24135355600897, dHi: 2.36328581210989, n0: 6.29321143842013, n0Lo: 6.22351706580762, n0Hi: 6.36290581103264, slope: -0.434649325865183, seSlope: 0.00414546169502544, seN0: 0.0251020171376827, r2: 0.999636277814185, sd: 0.0346834209175598}},
		{name: "repl", level: 0.95, t: c(0, 0, 0, 4, 4, 4, 8, 8, 8, 12, 12, 12, 16, 16, 16), count: c(2.1e6, 1.7e6, 2.4e6, 1.9e5, 2.6e5, 1.5e5, 2.2e4, 1.4e4, 3.0e4, 1.1e3, 2.3e3, 1.6e3, 160, 95, 210), // R: t <- c(0,0,0,4,4,4,8,8,8,12,12,12,16,16,16); count <- c(2.1e6,1.7e6,2.4e6,1.9e5,2.6e5,1.5e5,2.2e4,1.4e4,3.0e4,1.1e3,2.3e3,1.6e3,160,95,210)
			want: want{d: 3.85601500456697, dLo: 3.67286803095729, dHi: 4.05838575760839, n0: 6.33332559186476, n0Lo: 6.20662130062453, n0Hi: 6.460029883105, slope: -0.259335090453648, seSlope: 0.00598587770408062, seN0: 0.0586493841508, r2: 0.993121734296415, sd: 0.131144009799688}},
		{name: "infup", level: 0.95, t: c(0, 1, 2), count: c(1.0e6, 2.0e5, 9.0e5), // R: t <- c(0,1,2); count <- c(1.0e6,2.0e5,9.0e5)
			want: want{d: 43.7086906535645, dLo: 0.200696924672436, dHi: inf, n0: 5.77463624698144, n0Lo: -0.628384624433034, n0Hi: 12.1776571183959, slope: -0.0228787452803382, seSlope: 0.390341470412551, seN0: 0.503928671413975, r2: 0.00342362042135189, sd: 0.552026201414086}},
		{name: "precise", level: 0.95, t: c(10000, 10001, 10002, 10003, 10004, 10005, 10006), count: c(3.2e7, 3.1e6, 3.5e5, 2.9e4, 3.3e3, 3.0e2, 3.4e1), // R: t <- 10000+0:6; count <- c(3.2e7,3.1e6,3.5e5,2.9e4,3.3e3,3.0e2,3.4e1)
			want: want{d: 1.00089193174289, dLo: 0.985494718622689, dHi: 1.01677790845752, n0: 9998.59025632562, n0Lo: 9842.44423991675, n0Hi: 10154.7362727345, slope: -0.999108863090406, seSlope: 0.00607252340185193, seN0: 60.7434528028653, r2: 0.999815327356623, sd: 0.032132773503844}},
		{name: "lvl90", level: 0.90, t: c(0, 3, 6, 9, 12, 15, 18), count: c(9.5e5, 1.9e5, 4.4e4, 7.1e3, 1.8e3, 3.1e2, 66), // R: t <- c(0,3,6,9,12,15,18); count <- c(9.5e5,1.9e5,4.4e4,7.1e3,1.8e3,3.1e2,66)
			want: want{d: 4.32154274251218, dLo: 4.23025902881737, dHi: 4.41685291964372, n0: 5.9850705160103, n0Lo: 5.93105973501832, n0Hi: 6.03908129700228, slope: -0.231398845176916, seSlope: 0.00247800426787222, seN0: 0.0268037143458957, r2: 0.999426936457316, sd: 0.0393370982432795}},
		{name: "lvl99", level: 0.99, t: c(0, 3, 6, 9, 12, 15, 18), count: c(9.5e5, 1.9e5, 4.4e4, 7.1e3, 1.8e3, 3.1e2, 66), // R: t <- c(0,3,6,9,12,15,18); count <- c(9.5e5,1.9e5,4.4e4,7.1e3,1.8e3,3.1e2,66)
			want: want{d: 4.32154274251218, dLo: 4.14266488280597, dHi: 4.51656540944774, n0: 5.9850705160103, n0Lo: 5.87699410727727, n0Hi: 6.09314692474332, slope: -0.231398845176916, seSlope: 0.00247800426787222, seN0: 0.0268037143458957, r2: 0.999426936457316, sd: 0.0393370982432795}},
		{name: "eo", level: 0.95, t: c(0, 15, 30, 45, 60, 75, 90), count: c(2.5e6, 7.9e5, 1.6e5, 4.2e4, 1.1e4, 2.2e3, 6.0e2), // R: t <- c(0,15,30,45,60,75,90); count <- c(2.5e6,7.9e5,1.6e5,4.2e4,1.1e4,2.2e3,6.0e2)
			want: want{d: 24.514807607105, dLo: 23.6494496569098, dHi: 25.4458995256854, n0: 6.44775425490784, n0Lo: 6.36702904273603, n0Hi: 6.52847946707965, slope: -0.0407916723649984, seSlope: 0.000580650528364913, seN0: 0.0314034787971743, r2: 0.998987915278998, sd: 0.0460877069007545}},
		{name: "small", level: 0.95, t: c(0, 1, 2, 3, 4), count: c(850, 120, 14, 2.5, 0.31), // R: t <- c(0,1,2,3,4); count <- c(850,120,14,2.5,0.31)
			want: want{d: 1.16858529074267, dLo: 1.1089383466433, dHi: 1.23501349299733, n0: 2.92027712221642, n0Lo: 2.80753245564059, n0Hi: 3.03302178879225, slope: -0.855735570113563, seSlope: 0.014463030314787, seN0: 0.035427044405633, r2: 0.999143773500305, sd: 0.0457361176627891}},
		{name: "twotimes", level: 0.95, t: c(0, 0, 10, 10), count: c(1.1e6, 9.0e5, 1.2e2, 80), // R: t <- c(0,0,10,10); count <- c(1.1e6,9.0e5,1.2e2,80)
			want: want{d: 2.49583072676404, dLo: 2.25765815814081, dHi: 2.79018212898631, n0: 5.99781759729877, n0Lo: 5.69893307114084, n0Hi: 6.29670212345671, slope: -0.400668198077899, seSlope: 0.00982385930320286, seN0: 0.069465175307173, r2: 0.998799111557724, sd: 0.0982385930320286}},
		{name: "unordered", level: 0.95, t: c(8, 0, 4, 12, 2, 10, 6), count: c(4.1e3, 1.2e6, 7.4e4, 2.2e2, 2.8e5, 1.1e3, 1.6e4), // R: t <- c(8,0,4,12,2,10,6); count <- c(4.1e3,1.2e6,7.4e4,2.2e2,2.8e5,1.1e3,1.6e4)
			want: want{d: 3.24106817658266, dLo: 3.16371914481793, dHi: 3.32229417222132, n0: 6.0792829843955, n0Lo: 6.02488654611467, n0Hi: 6.13367942267633, slope: -0.308540254483134, seSlope: 0.00293452192126576, seN0: 0.0211611385121936, r2: 0.999547910240987, sd: 0.0310560608821467}},
		{name: "exact", level: 0.95, t: c(0, 5, 10, 15, 20), count: c(1e6, 1e5, 1e4, 1e3, 1e2), // R: t <- c(0,5,10,15,20); count <- c(1e6,1e5,1e4,1e3,1e2)
			want: want{d: 5, dLo: 5, dHi: 5, n0: 6, n0Lo: 6, n0Hi: 6, slope: -0.2, seSlope: 1.62158451853016e-17, seN0: 1.98602732259782e-16, r2: 1, sd: 2.56395024851142e-16}},
		{name: "curved", level: 0.95, t: c(0, 0, 5, 5, 10, 10, 15, 15, 20, 20), count: c(1e6, 1.3e6, 2.0e5, 1.6e5, 1.2e5, 0.9e5, 5.0e3, 6.5e3, 1.0e2, 1.4e2), // R: t <- c(0,0,5,5,10,10,15,15,20,20); count <- c(1e6,1.3e6,2.0e5,1.6e5,1.2e5,0.9e5,5.0e3,6.5e3,1.0e2,1.4e2)
			want: want{d: 5.28292793162262, dLo: 4.28113871236135, dHi: 6.89677856241669, n0: 6.3239425733369, n0Lo: 5.78145724445038, n0Hi: 6.86642790222342, slope: -0.189288972505982, seSlope: 0.0192080061556385, seN0: 0.235249070287763, r2: 0.923892837238641, sd: 0.429504074762421}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Fit(observations(tc.t, tc.count), &Settings{Level: tc.level})
			if err != nil {
				t.Fatal(err)
			}
			w := tc.want
			check(t, "D", r.D.Value, w.d, tl)
			check(t, "D lower", r.D.Lower, w.dLo, tl)
			check(t, "D upper", r.D.Upper, w.dHi, tl)
			check(t, "log10 N0", r.Log10N0.Value, w.n0, tl)
			check(t, "log10 N0 lower", r.Log10N0.Lower, w.n0Lo, tl)
			check(t, "log10 N0 upper", r.Log10N0.Upper, w.n0Hi, tl)
			check(t, "slope", r.Slope, w.slope, tl)
			check(t, "SE slope", r.SESlope, w.seSlope, tl)
			check(t, "SE log10 N0", r.SELog10N0, w.seN0, tl)
			check(t, "r²", r.RSquared, w.r2, tl)
			check(t, "residual SD", r.ResidualSD, w.sd, tl)
			if r.N != len(tc.t) || r.DF != len(tc.t)-2 {
				t.Errorf("n %d df %d, want %d and %d", r.N, r.DF, len(tc.t), len(tc.t)-2)
			}
			if r.Level != tc.level || r.D.Level != tc.level || r.Log10N0.Level != tc.level {
				t.Errorf("levels %v %v %v, want %v", r.Level, r.D.Level, r.Log10N0.Level, tc.level)
			}
			if r.D.Method != MethodCurve || r.Log10N0.Method != MethodIntercept {
				t.Errorf("methods %q, %q", r.D.Method, r.Log10N0.Method)
			}
			// Residuals: observed − fitted, in input order.
			for i, res := range r.Residuals {
				if res.Index != i || res.Minutes != tc.t[i] || res.Count != tc.count[i] {
					t.Fatalf("residual %d is %+v, want index %d at %v min count %v", i, res, i, tc.t[i], tc.count[i])
				}
				check(t, "observed", res.Observed, math.Log10(tc.count[i]), tol{abs: 1e-15})
				check(t, "fitted", res.Fitted, w.n0+w.slope*tc.t[i], tol{abs: 1e-9, rel: 1e-9})
				check(t, "residual", res.Residual, res.Observed-res.Fitted, tol{abs: 1e-12})
			}
		})
	}
}

// six is a clean invented survivor curve that breaks no prerequisite.
var six = observations(c(0, 2, 4, 6, 8, 10), c(1.8e6, 2.9e5, 3.6e4, 5.2e3, 6.1e2, 88))

// tailT and tailCount are an invented curve with a pronounced shoulder in
// triplicate, whose lack-of-fit p-value is far below 1e-16.
var (
	tailT     = c(0, 0, 0, 5, 5, 5, 10, 10, 10, 15, 15, 15, 20, 20, 20, 25, 25, 25)
	tailCount = c(1.00e6, 1.02e6, 0.98e6, 9.5e5, 9.7e5, 9.3e5, 4.1e5, 4.0e5, 4.2e5, 5.0e4, 5.1e4, 4.9e4, 2.0e3, 2.05e3, 1.95e3, 30, 31, 29)
)

// TestLackOfFitR checks the lack-of-fit test against R 4.2.2:
//
//	y <- log10(count); a <- anova(lm(y ~ t), lm(y ~ factor(t)))
//	PE SS = a$RSS[2], PE df = a$Res.Df[2], LOF SS = a[2, "Sum of Sq"],
//	LOF df = a$Df[2], F = a$F[2], p = a[2, "Pr(>F)"]
//
// printed with sprintf("%.15g"); invented data (those of TestFitR, and
// tailT/tailCount).
func TestLackOfFitR(t *testing.T) {
	for _, tc := range []struct {
		name          string
		t, count      []float64
		pe, lof, f, p float64
		dfPE, dfLOF   int
		pTol          tol
	}{
		{"repl", c(0, 0, 0, 4, 4, 4, 8, 8, 8, 12, 12, 12, 16, 16, 16), c(2.1e6, 1.7e6, 2.4e6, 1.9e5, 2.6e5, 1.5e5, 2.2e4, 1.4e4, 3.0e4, 1.1e3, 2.3e3, 1.6e3, 160, 95, 210),
			0.208140172581326, 0.0154435944011012, 0.247326824827901, 0.861408869633548, 10, 3, tol{rel: 1e-9}},
		{"curved", c(0, 0, 5, 5, 10, 10, 15, 15, 20, 20), c(1e6, 1.3e6, 2.0e5, 1.6e5, 1.2e5, 0.9e5, 5.0e3, 6.5e3, 1.0e2, 1.4e2),
			0.0361604082037602, 1.43962959369643, 66.3538597971692, 0.000189765113302312, 5, 3, tol{rel: 1e-9}},
		// 1 − CDF would give 0 here; R's pf(F, 4, 12, lower.tail = FALSE)
		// gives the same 7.58896663463305e-22.
		{"tail", tailT, tailCount,
			0.00134898150946, 6.17613574276395, 13735.1083750159, 7.58896663463305e-22, 12, 4, tol{rel: 1e-6}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Fit(observations(tc.t, tc.count), nil)
			if err != nil {
				t.Fatal(err)
			}
			lf := r.LackOfFit
			if lf == nil {
				t.Fatal("no lack-of-fit test")
			}
			check(t, "pure error SS", lf.PureErrorSS, tc.pe, tol{abs: 1e-13, rel: 1e-9})
			check(t, "lack-of-fit SS", lf.LackOfFitSS, tc.lof, tol{abs: 1e-13, rel: 1e-9})
			check(t, "F", lf.F, tc.f, tol{rel: 1e-9})
			check(t, "p", lf.P, tc.p, tc.pTol)
			if lf.PureErrorDF != tc.dfPE || lf.LackOfFitDF != tc.dfLOF || lf.Groups != tc.dfLOF+2 {
				t.Errorf("df %d and %d, groups %d; want %d and %d", lf.LackOfFitDF, lf.PureErrorDF, lf.Groups, tc.dfLOF, tc.dfPE)
			}
			rejects := hasWarning(r.Warnings, "lack-of-fit test rejects")
			if rejects != (tc.p < 0.05) {
				t.Errorf("p %g: rejection warning %v", tc.p, rejects)
			}
		})
	}
}

// TestFSurvival checks the F upper tail against R 4.2.2:
// pf(q, df1, df2, lower.tail = FALSE), printed with sprintf("%.15g").
func TestFSurvival(t *testing.T) {
	for _, tc := range []struct{ f, d1, d2, want float64 }{
		{3, 2, 10, 0.095367431640625},
		{50, 4, 12, 2.19064067133736e-07},
		{200, 3, 30, 6.42562933290939e-20},
		{0.5, 1, 1, 0.608173447969393},
		{0, 3, 5, 1},   // P(F > 0) = 1 (hand-worked)
		{inf, 3, 5, 0}, // P(F > ∞) = 0 (hand-worked)
	} {
		check(t, "P(F > f)", fSurvival(tc.f, tc.d1, tc.d2), tc.want, tol{rel: 1e-9})
	}
	if p := fSurvival(math.NaN(), 1, 1); !math.IsNaN(p) {
		t.Errorf("fSurvival(NaN) = %v, want NaN", p)
	}
}

func TestLackOfFitAbsent(t *testing.T) {
	// No replicates, or replicates at only two times: no test.
	for name, obs := range map[string][]Observation{
		"no replicates": six,
		"two times":     observations(c(0, 0, 10, 10), c(1.1e6, 9.0e5, 1.2e2, 80)),
	} {
		r, err := Fit(obs, nil)
		if err != nil {
			t.Fatal(err)
		}
		if r.LackOfFit != nil {
			t.Errorf("%s: lack-of-fit test %+v, want none", name, *r.LackOfFit)
		}
	}
}

func TestLackOfFitZeroPureError(t *testing.T) {
	// Identical replicates off the line: pure error 0, lack of fit > 0, so
	// F = +Inf and p = 0 (hand-worked from the definitions).
	r, err := Fit(observations(c(0, 0, 5, 5, 10, 10), c(1e6, 1e6, 1e5, 1e5, 1e3, 1e3)), nil)
	if err != nil {
		t.Fatal(err)
	}
	lf := r.LackOfFit
	if lf == nil || lf.PureErrorSS != 0 || !(lf.LackOfFitSS > 0) || !math.IsInf(lf.F, 1) || lf.P != 0 {
		t.Fatalf("lack of fit %+v, want pure error 0, F +Inf, p 0", lf)
	}
	// Identical replicates on an exact line: both sums 0, F and p NaN;
	// JSON still works.
	r, err = Fit(observations(c(0, 0, 5, 5, 10, 10), c(1e6, 1e6, 1e5, 1e5, 1e4, 1e4)), nil)
	if err != nil {
		t.Fatal(err)
	}
	lf = r.LackOfFit
	if lf == nil || !math.IsNaN(lf.F) || !math.IsNaN(lf.P) {
		t.Fatalf("lack of fit %+v, want F and p NaN", lf)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(b), `"f":"NaN","p":"NaN"`) {
		t.Errorf("JSON %s lacks the NaN F and p", b)
	}
}

func hasWarning(ws []string, sub string) bool {
	for _, w := range ws {
		if strings.Contains(w, sub) {
			return true
		}
	}
	return false
}

func TestWarnings(t *testing.T) {
	shifted := slices.Clone(six)
	for i := range shifted {
		shifted[i].Minutes++
	}
	for _, tc := range []struct {
		name string
		obs  []Observation
		s    *Settings
		want []string // substrings, each in some warning; nil: no warning at all
	}{
		{"clean", six, nil, nil},
		{"few times", observations(c(0, 0, 10, 10), c(1.1e6, 9.0e5, 1.2e2, 80)), nil, []string{"2 distinct exposure times, fewer than 5"}},
		{"no unexposed", shifted, nil, []string{"no unexposed (0 min) observation: the shortest exposure is 1 min"}},
		// 90 min × 0.0408 log10/min = 3.67 logs (R slope of TestFitR "eo").
		{"under 4 logs", observations(c(0, 15, 30, 45, 60, 75, 90), c(2.5e6, 7.9e5, 1.6e5, 4.2e4, 1.1e4, 2.2e3, 6.0e2)), nil, []string{"spans 3.67 log reductions"}},
		{"poor r² and unbounded D", observations(c(0, 1, 2), c(1.0e6, 2.0e5, 9.0e5)), nil, []string{"r² 0.0034 is below 0.8", "upper D limit is unbounded", "3 distinct exposure times"}},
		{"low counts", observations(c(0, 1, 2, 3, 4), c(850, 120, 14, 2.5, 0.31)), nil, []string{"3 observation(s) count fewer than 30", "observation 2 at 2 min: 14", "observation 4 at 4 min: 0.31"}},
		{"lack of fit", observations(tailT, tailCount), nil, []string{"lack-of-fit test rejects the straight line at 5 %"}},
		{"own count floor", six, &Settings{MinCount: 100}, []string{"1 observation(s) count fewer than 100", "observation 5 at 10 min: 88"}},
		{"own time floor", six, &Settings{MinTimes: 7}, []string{"6 distinct exposure times, fewer than 7"}},
		{"excluded", observations(c(0, 2, 4, 6, 8, 10, 12, 14), c(1.8e6, 2.9e5, 3.6e4, 5.2e3, 6.1e2, 88, 0, 0)), &Settings{ExcludeBelowDetection: true},
			[]string{"2 observation(s) with count 0 left out"}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Fit(tc.obs, tc.s)
			if err != nil {
				t.Fatal(err)
			}
			if tc.want == nil && len(r.Warnings) > 0 {
				t.Errorf("warnings %q, want none", r.Warnings)
			}
			for _, w := range tc.want {
				if !hasWarning(r.Warnings, w) {
					t.Errorf("no warning containing %q in %q", w, r.Warnings)
				}
			}
			if !slices.Equal(r.D.Warnings, r.Warnings) {
				t.Errorf("D warnings %q differ from result warnings %q", r.D.Warnings, r.Warnings)
			}
			// log10 N0 carries every warning but the one about D's upper limit.
			for _, w := range r.Log10N0.Warnings {
				if strings.Contains(w, "upper D limit") {
					t.Errorf("log10 N0 carries %q", w)
				}
			}
			if len(r.Log10N0.Warnings) != len(r.Warnings)-btoi(math.IsInf(r.D.Upper, 1)) {
				t.Errorf("log10 N0 warnings %q, result warnings %q", r.Log10N0.Warnings, r.Warnings)
			}
		})
	}
}

func btoi(b bool) int {
	if b {
		return 1
	}
	return 0
}

func TestLowCountsListed(t *testing.T) {
	// 15 low counts: the warning names maxListed of them and says how many
	// more.
	var obs []Observation
	for i := range 15 {
		obs = append(obs, Observation{Minutes: float64(i), Count: math.Pow(10, 1-0.1*float64(i))})
	}
	r, err := Fit(obs, nil)
	if err != nil {
		t.Fatal(err)
	}
	if !hasWarning(r.Warnings, "15 observation(s) count fewer than 30") || !hasWarning(r.Warnings, "; and 5 more") {
		t.Errorf("warnings %q", r.Warnings)
	}
}

func TestExcludeBelowDetection(t *testing.T) {
	obs := observations(c(0, 2, 4, 6, 8, 10, 12, 14), c(1.8e6, 2.9e5, 0, 5.2e3, 6.1e2, 88, 0, 4))
	if _, err := Fit(obs, nil); !errors.Is(err, ErrZeroCount) {
		t.Fatalf("default settings: error %v, want ErrZeroCount", err)
	}
	r, err := Fit(obs, &Settings{ExcludeBelowDetection: true})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Excluded) != 2 || r.Excluded[0].Index != 2 || r.Excluded[1].Index != 6 ||
		r.Excluded[0].Minutes != 4 || r.Excluded[1].Minutes != 12 || !strings.Contains(r.Excluded[0].Reason, "below the detection limit") {
		t.Fatalf("excluded %+v", r.Excluded)
	}
	// The fit equals a fit of the remaining observations, and the residuals
	// keep the caller's indexes.
	rest := slices.DeleteFunc(slices.Clone(obs), func(o Observation) bool { return o.Count == 0 })
	r2, err := Fit(rest, nil)
	if err != nil {
		t.Fatal(err)
	}
	check(t, "D", r.D.Value, r2.D.Value, tol{rel: 1e-15})
	check(t, "log10 N0", r.Log10N0.Value, r2.Log10N0.Value, tol{rel: 1e-15})
	if r.N != 6 {
		t.Errorf("n %d, want 6", r.N)
	}
	wantIdx := []int{0, 1, 3, 4, 5, 7}
	for i, res := range r.Residuals {
		if res.Index != wantIdx[i] || res.Minutes != obs[wantIdx[i]].Minutes {
			t.Errorf("residual %d: index %d at %v min, want %d", i, res.Index, res.Minutes, wantIdx[i])
		}
	}
	// Exclusion that leaves too little is still refused.
	few := observations(c(0, 5, 10, 15), c(1e6, 1e3, 0, 0))
	if _, err := Fit(few, &Settings{ExcludeBelowDetection: true}); !errors.Is(err, ErrTooFewObservations) {
		t.Errorf("error %v, want ErrTooFewObservations", err)
	}
	oneTime := observations(c(0, 0, 0, 5, 5), c(1e6, 2e6, 1.5e6, 0, 0))
	if _, err := Fit(oneTime, &Settings{ExcludeBelowDetection: true}); !errors.Is(err, ErrTooFewTimes) {
		t.Errorf("error %v, want ErrTooFewTimes", err)
	}
}

func TestRefusals(t *testing.T) {
	ok := func(i int, o Observation) []Observation {
		obs := slices.Clone(six)
		obs[i] = o
		return obs
	}
	nan := math.NaN()
	for _, tc := range []struct {
		name string
		obs  []Observation
		s    *Settings
		err  error
		msg  string // substring of the message naming the offender
	}{
		{"NaN time", ok(2, Observation{nan, 3.6e4}), nil, ErrInvalidObservation, "observation 2 at NaN min, count 36000"},
		{"Inf time", ok(3, Observation{inf, 5.2e3}), nil, ErrInvalidObservation, "observation 3 at +Inf min"},
		{"negative time", ok(1, Observation{-2, 2.9e5}), nil, ErrInvalidObservation, "observation 1 at -2 min"},
		{"NaN count", ok(4, Observation{8, nan}), nil, ErrInvalidObservation, "observation 4 at 8 min, count NaN"},
		{"Inf count", ok(0, Observation{0, inf}), nil, ErrInvalidObservation, "observation 0 at 0 min, count +Inf"},
		{"-Inf count", ok(0, Observation{0, -inf}), nil, ErrInvalidObservation, "count -Inf"},
		{"negative count", ok(5, Observation{10, -88}), nil, ErrInvalidObservation, "observation 5 at 10 min, count -88"},
		{"zero count", ok(5, Observation{10, 0}), nil, ErrZeroCount, "observation 5 at 10 min, count 0"},
		{"empty", nil, nil, ErrTooFewObservations, "0 observations"},
		{"two", six[:2], nil, ErrTooFewObservations, "2 observations left"},
		{"one time", observations(c(5, 5, 5), c(1e6, 2e5, 5e5)), nil, ErrTooFewTimes, "at 5 min"},
		{"times too close", observations(c(0, 0, 5e-324), c(1e6, 2e5, 5e5)), nil, ErrTooFewTimes, "too close"},
		{"rising", observations(c(0, 5, 10, 15), c(1e3, 1e4, 2e5, 1e6)), nil, ErrNotDecreasing, "slope 0.206"},
		{"flat", observations(c(0, 5, 10, 15), c(1e5, 1e5, 1e5, 1e5)), nil, ErrNotDecreasing, "slope 0 "},
		{"overflow", observations(c(0, 1e200, 2e200), c(1e6, 1e3, 1)), nil, ErrNotFinite, "times 0 to 2e+200 min"},
		{"level 1", six, &Settings{Level: 1}, ErrLevel, "level 1"},
		{"level negative", six, &Settings{Level: -0.95}, ErrLevel, "level -0.95"},
		{"level NaN", six, &Settings{Level: nan}, ErrLevel, "level NaN"},
		{"MinTimes", six, &Settings{MinTimes: -1}, ErrSettings, "MinTimes -1"},
		{"MinLogReduction", six, &Settings{MinLogReduction: inf}, ErrSettings, "MinLogReduction +Inf"},
		{"MinRSquared", six, &Settings{MinRSquared: 1.5}, ErrSettings, "MinRSquared 1.5"},
		{"MinCount", six, &Settings{MinCount: nan}, ErrSettings, "MinCount NaN"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			r, err := Fit(tc.obs, tc.s)
			if !errors.Is(err, tc.err) {
				t.Fatalf("error %v, want %v (result %+v)", err, tc.err, r)
			}
			if !strings.Contains(err.Error(), tc.msg) {
				t.Errorf("message %q does not contain %q", err, tc.msg)
			}
		})
	}
}

// TestExactLine: counts exactly on 10^(log10 N0 − t/D) give D back, with
// limits that collapse onto it (property; seeded random designs).
func TestExactLine(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := range 200 {
		d := 0.1 + 30*rng.Float64()
		n0 := 3 + 6*rng.Float64()
		k := 3 + rng.IntN(20)
		obs := make([]Observation, k)
		for i := range obs {
			tm := float64(i) * d * (0.2 + rng.Float64())
			if i > 0 && rng.IntN(4) == 0 {
				tm = obs[i-1].Minutes // a replicate
			}
			obs[i] = Observation{Minutes: tm, Count: math.Pow(10, n0-tm/d)}
		}
		if obs[k-1].Minutes == 0 {
			continue
		}
		r, err := Fit(obs, nil)
		if err != nil {
			t.Fatalf("trial %d: %v", trial, err)
		}
		tl := tol{abs: 1e-9, rel: 1e-9}
		check(t, "D", r.D.Value, d, tl)
		check(t, "D lower", r.D.Lower, d, tol{rel: 1e-6})
		check(t, "D upper", r.D.Upper, d, tol{rel: 1e-6})
		check(t, "log10 N0", r.Log10N0.Value, n0, tl)
		check(t, "residual SD", r.ResidualSD, 0, tol{abs: 1e-9})
		check(t, "r²", r.RSquared, 1, tol{abs: 1e-12})
	}
}

// TestScaleCounts: multiplying every count by k moves log10 N0 and its
// limits by log10 k and nothing else (property).
func TestScaleCounts(t *testing.T) {
	obs := observations(c(0, 0, 0, 4, 4, 4, 8, 8, 8, 12, 12, 12, 16, 16, 16), c(2.1e6, 1.7e6, 2.4e6, 1.9e5, 2.6e5, 1.5e5, 2.2e4, 1.4e4, 3.0e4, 1.1e3, 2.3e3, 1.6e3, 160, 95, 210))
	base, err := Fit(obs, nil)
	if err != nil {
		t.Fatal(err)
	}
	for _, k := range []float64{1e-3, 0.37, 7, 1e5} {
		scaled := slices.Clone(obs)
		for i := range scaled {
			scaled[i].Count *= k
		}
		r, err := Fit(scaled, nil)
		if err != nil {
			t.Fatal(err)
		}
		tl := tol{abs: 1e-12, rel: 1e-10}
		check(t, "D", r.D.Value, base.D.Value, tl)
		check(t, "D lower", r.D.Lower, base.D.Lower, tl)
		check(t, "D upper", r.D.Upper, base.D.Upper, tl)
		check(t, "slope", r.Slope, base.Slope, tl)
		check(t, "SE slope", r.SESlope, base.SESlope, tl)
		check(t, "SE log10 N0", r.SELog10N0, base.SELog10N0, tl)
		check(t, "r²", r.RSquared, base.RSquared, tl)
		check(t, "residual SD", r.ResidualSD, base.ResidualSD, tl)
		check(t, "LOF F", r.LackOfFit.F, base.LackOfFit.F, tol{rel: 1e-8})
		lk := math.Log10(k)
		check(t, "log10 N0", r.Log10N0.Value, base.Log10N0.Value+lk, tl)
		check(t, "log10 N0 lower", r.Log10N0.Lower, base.Log10N0.Lower+lk, tl)
		check(t, "log10 N0 upper", r.Log10N0.Upper, base.Log10N0.Upper+lk, tl)
	}
}

// TestReorder: the order of the observations changes nothing but the
// order of the residuals (property; seeded permutations).
func TestReorder(t *testing.T) {
	obs := observations(tailT, tailCount)
	base, err := Fit(obs, nil)
	if err != nil {
		t.Fatal(err)
	}
	rng := rand.New(rand.NewPCG(3, 4))
	for range 20 {
		perm := rng.Perm(len(obs))
		shuffled := make([]Observation, len(obs))
		for i, p := range perm {
			shuffled[i] = obs[p]
		}
		r, err := Fit(shuffled, nil)
		if err != nil {
			t.Fatal(err)
		}
		tl := tol{abs: 1e-13, rel: 1e-12}
		check(t, "D", r.D.Value, base.D.Value, tl)
		check(t, "D lower", r.D.Lower, base.D.Lower, tl)
		check(t, "D upper", r.D.Upper, base.D.Upper, tl)
		check(t, "log10 N0", r.Log10N0.Value, base.Log10N0.Value, tl)
		check(t, "SE slope", r.SESlope, base.SESlope, tl)
		check(t, "residual SD", r.ResidualSD, base.ResidualSD, tl)
		check(t, "LOF F", r.LackOfFit.F, base.LackOfFit.F, tol{rel: 1e-9})
		check(t, "LOF p", r.LackOfFit.P, base.LackOfFit.P, tol{rel: 1e-6})
		// The warnings are the same but for the input index they name.
		if len(r.Warnings) != len(base.Warnings) || r.Warnings[1] != base.Warnings[1] || !strings.Contains(r.Warnings[0], fmt.Sprintf("observation %d at 25 min: 29", slices.Index(perm, 17))) {
			t.Errorf("warnings %q, want %q with the low count's index %d", r.Warnings, base.Warnings, slices.Index(perm, 17))
		}
		for i, res := range r.Residuals {
			if res.Index != i || res.Minutes != shuffled[i].Minutes {
				t.Fatalf("residual %d is %+v", i, res)
			}
			check(t, "residual", res.Residual, base.Residuals[perm[i]].Residual, tol{abs: 1e-12})
		}
	}
}

// TestNoMutation: Fit never modifies the caller's slice.
func TestNoMutation(t *testing.T) {
	obs := observations(c(10, 0, 5, 15, 5, 20, 25), c(1e4, 1e6, 0, 1e3, 1e5, 90, 0))
	before := slices.Clone(obs)
	for _, s := range []*Settings{nil, {ExcludeBelowDetection: true}} {
		_, _ = Fit(obs, s)
		if !slices.Equal(obs, before) {
			t.Fatalf("observations changed to %v from %v", obs, before)
		}
	}
}

func TestResultJSON(t *testing.T) {
	r, err := Fit(observations(c(0, 1, 2, 0, 1, 2), c(1.0e6, 2.0e5, 9.0e5, 1.1e6, 1e5, 8e5)), &Settings{ExcludeBelowDetection: true})
	if err != nil {
		t.Fatal(err)
	}
	if !math.IsInf(r.D.Upper, 1) {
		t.Fatalf("D upper %v, want +Inf for this case", r.D.Upper)
	}
	b, err := json.Marshal(r)
	if err != nil {
		t.Fatalf("json.Marshal: %v", err)
	}
	for _, sub := range []string{`"upper":"+Inf"`, `"lack_of_fit":{"groups":3`, `"residuals":[{"index":0,"minutes":0,"count":1000000`, `"r2":`} {
		if !strings.Contains(string(b), sub) {
			t.Errorf("JSON lacks %s: %s", sub, b)
		}
	}
	var back Result
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	if !math.IsInf(back.D.Upper, 1) || back.D.Value != r.D.Value || back.LackOfFit.P != r.LackOfFit.P || len(back.Residuals) != 6 || !slices.Equal(back.Warnings, r.Warnings) {
		t.Errorf("round trip gave %+v", back)
	}
}

func TestResultString(t *testing.T) {
	r, err := Fit(observations(tailT, tailCount), nil)
	if err != nil {
		t.Fatal(err)
	}
	s := r.String()
	// D = 5.545 (R 4.2.2, see tail in lof data of TestLackOfFitR).
	for _, sub := range []string{"18 observations at 6 times", "D          5.545 min", "log10 N0   6.7654", "lack of fit: F = 1.374e+04 on 4 and 12 df", "warning: lack-of-fit test rejects"} {
		if !strings.Contains(s, sub) {
			t.Errorf("String() lacks %q:\n%s", sub, s)
		}
	}
}

// TestLimitsAgreeWithLinefit: Fit's limits equal those of linefit's
// NegReciprocal and InterceptInterval, which build them from the slope and
// intercept intervals (the same t quantile, tdist.TwoSided, checked against
// R and gonum in its own tests), a separate assembly of the same numbers,
// over seeded random studies.
func TestLimitsAgreeWithLinefit(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for trial := range 100 {
		k := 3 + rng.IntN(40)
		x, y := make([]float64, k), make([]float64, k)
		obs := make([]Observation, k)
		for i := range obs {
			x[i] = float64(rng.IntN(12)) * 2
			if i < 2 {
				x[i] = float64(i) * 10 // two distinct times at least
			}
			obs[i] = Observation{Minutes: x[i], Count: math.Pow(10, 6-x[i]/3+0.5*rng.NormFloat64())}
			y[i] = math.Log10(obs[i].Count)
		}
		level := []float64{0.8, 0.9, 0.95, 0.99}[trial%4]
		line, err := linefit.Fit(x, y)
		if err != nil {
			t.Fatal(err)
		}
		r, err := Fit(obs, &Settings{Level: level})
		if !(line.Slope < 0) {
			if !errors.Is(err, ErrNotDecreasing) {
				t.Errorf("slope %v: error %v, want ErrNotDecreasing", line.Slope, err)
			}
			continue
		}
		if err != nil {
			t.Fatal(err)
		}
		d, lo, hi, unbounded, err := line.NegReciprocal(level)
		if err != nil {
			t.Fatal(err)
		}
		n0Lo, n0Hi, err := line.InterceptInterval(level)
		if err != nil {
			t.Fatal(err)
		}
		tl := tol{abs: 1e-12, rel: 1e-11}
		check(t, "D", r.D.Value, d, tl)
		check(t, "D lower", r.D.Lower, lo, tl)
		check(t, "D upper", r.D.Upper, hi, tl)
		check(t, "log10 N0 lower", r.Log10N0.Lower, n0Lo, tl)
		check(t, "log10 N0 upper", r.Log10N0.Upper, n0Hi, tl)
		if unbounded != math.IsInf(r.D.Upper, 1) {
			t.Errorf("unbounded %v, upper %v", unbounded, r.D.Upper)
		}
	}
}
