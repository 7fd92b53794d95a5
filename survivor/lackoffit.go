package survivor

import (
	"encoding/json"
	"math"

	"gonum.org/v1/gonum/mathext"

	"github.com/dzf-go/dzf/internal/linefit"
)

// LackOfFit is the lack-of-fit F test of the straight line against the
// replicate scatter (pure error), on the log10 scale. With k distinct times,
// n observations, ȳ_g the mean log10 count of the n_g observations at time
// t_g and ŷ(t) the fitted line:
//
//	pure error SS   = Σ_g Σ_i (y_gi − ȳ_g)²     on n − k degrees of freedom
//	lack-of-fit SS  = Σ_g n_g (ȳ_g − ŷ(t_g))²   on k − 2 degrees of freedom
//	F = (lack-of-fit SS/(k − 2)) / (pure error SS/(n − k))
//
// P is the upper tail P(F(k − 2, n − k) > F), computed directly as a
// regularized incomplete beta function (not as 1 − CDF). Fit reports the
// test only when both degrees of freedom are at least 1 (replicates and at
// least three distinct times). When the pure error SS is 0 (identical
// replicates), F is +Inf and P is 0 if the lack-of-fit SS is positive, and
// both are NaN if it is 0 too.
type LackOfFit struct {
	Groups      int     // distinct exposure times, k
	PureErrorSS float64 // Σ (y − ȳ_g)², log10²
	PureErrorDF int     // n − k
	LackOfFitSS float64 // Σ n_g (ȳ_g − ŷ_g)², log10²
	LackOfFitDF int     // k − 2
	F           float64 // F statistic
	P           float64 // upper-tail probability of F
}

// lackOfFit computes the test from the observations sorted by time, or
// returns nil when a degree of freedom is missing.
func lackOfFit(pts []point, groups int, line linefit.Line) *LackOfFit {
	n := len(pts)
	dfPE, dfLOF := n-groups, groups-2
	if dfPE < 1 || dfLOF < 1 {
		return nil
	}
	var pe, lof float64
	for i := 0; i < n; {
		j := i + 1
		for j < n && pts[j].x == pts[i].x {
			j++
		}
		var m float64
		for _, p := range pts[i:j] {
			m += p.y
		}
		m /= float64(j - i)
		for _, p := range pts[i:j] {
			d := p.y - m
			pe += d * d
		}
		d := m - line.At(pts[i].x)
		lof += float64(j-i) * d * d
		i = j
	}
	f := (lof / float64(dfLOF)) / (pe / float64(dfPE))
	return &LackOfFit{Groups: groups, PureErrorSS: pe, PureErrorDF: dfPE, LackOfFitSS: lof, LackOfFitDF: dfLOF,
		F: f, P: fSurvival(f, float64(dfLOF), float64(dfPE))}
}

// fSurvival returns P(X > f) for X ~ F(d1, d2), computed directly as
// I_{d2/(d2 + d1 f)}(d2/2, d1/2) so that small tail probabilities keep
// their digits (gonum's distuv.F.Survival is 1 − CDF).
func fSurvival(f, d1, d2 float64) float64 {
	switch {
	case math.IsNaN(f):
		return math.NaN()
	case f <= 0:
		return 1
	case math.IsInf(f, 1):
		return 0
	}
	return mathext.RegIncBeta(d2/2, d1/2, d2/(d2+d1*f))
}

// lackOfFitJSON is LackOfFit with numbers that may be non-finite.
type lackOfFitJSON struct {
	Groups      int     `json:"groups"`
	PureErrorSS jsonNum `json:"pure_error_ss"`
	PureErrorDF int     `json:"pure_error_df"`
	LackOfFitSS jsonNum `json:"lack_of_fit_ss"`
	LackOfFitDF int     `json:"lack_of_fit_df"`
	F           jsonNum `json:"f"`
	P           jsonNum `json:"p"`
}

// MarshalJSON implements json.Marshaler, writing a non-finite F or P as
// "NaN", "+Inf" or "-Inf".
func (l LackOfFit) MarshalJSON() ([]byte, error) {
	return json.Marshal(lackOfFitJSON{l.Groups, jsonNum(l.PureErrorSS), l.PureErrorDF, jsonNum(l.LackOfFitSS), l.LackOfFitDF, jsonNum(l.F), jsonNum(l.P)})
}

// UnmarshalJSON implements json.Unmarshaler, accepting numbers and the
// strings "NaN", "Inf", "+Inf" and "-Inf".
func (l *LackOfFit) UnmarshalJSON(b []byte) error {
	var j lackOfFitJSON
	if err := json.Unmarshal(b, &j); err != nil {
		return err
	}
	*l = LackOfFit{j.Groups, float64(j.PureErrorSS), j.PureErrorDF, float64(j.LackOfFitSS), j.LackOfFitDF, float64(j.F), float64(j.P)}
	return nil
}
