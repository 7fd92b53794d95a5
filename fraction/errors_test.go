package fraction

import (
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// TestSentinels audits the package's errors against its source: every
// package-level variable is a documented error sentinel listed in
// sentinels (no other package state), and each is reached through the
// public API, with errors.Is, by an input whose message names the
// offending exposure or value. The data are invented (lotA and variants).
func TestSentinels(t *testing.T) {
	with := func(i int, e Exposure) []Exposure {
		x := lotA()
		x[i] = e
		return x
	}
	hsk := func(l float64, e []Exposure) func() error { return func() error { _, err := HSK(l, e); return err } }
	limited := func(e []Exposure) func() error { return func() error { _, err := LimitedHSK(6, e); return err } }
	cases := []apicheck.Refusal{
		{"ErrInvalidPopulation", ErrInvalidPopulation, hsk(0, lotA()), "log10 N0 = 0 (must be finite and > 0)"},
		{"ErrTooFewExposures", ErrTooFewExposures, hsk(6, lotA()[:1]), "1 exposure(s) given"},
		{"ErrInvalidTime", ErrInvalidTime, hsk(6, with(1, Exposure{-1, 20, 0})), "exposures[1]: time -1 min"},
		{"ErrInvalidUnits", ErrInvalidUnits, hsk(6, with(4, Exposure{16, 0, 0})), "exposures[4] at 16 min: 0 units"},
		{"ErrInvalidNegatives", ErrInvalidNegatives, hsk(6, with(3, Exposure{14, 20, 21})), "exposures[3] at 14 min: 21 negative of 20 units"},
		{"ErrDuplicateTime", ErrDuplicateTime, hsk(6, with(6, Exposure{12, 20, 7})), "exposures[2] and exposures[6] are both at 12 min"},
		{"ErrNoAllPositive", ErrNoAllPositive, hsk(6, with(0, Exposure{8, 20, 1})), "the shortest exposure, exposures[0] at 8 min, has 1 negative of 20 units"},
		{"ErrNoAllNegative", ErrNoAllNegative, hsk(6, lotA()[:5]), "none of the 5 exposures is all negative"},
		{"ErrUnequalUnits", ErrUnequalUnits, limited(with(3, Exposure{14, 19, 17})), "exposures[3] at 14 min has 19 units"},
		{"ErrUnequalIntervals", ErrUnequalIntervals, limited(with(3, Exposure{15, 20, 17})), "interval 3 min from exposures[2] at 12 min to exposures[3] at 15 min"},
		{"ErrLimitedDesign", ErrLimitedDesign, limited([]Exposure{{8, 20, 0}, {10, 20, 5}, {12, 20, 20}, {14, 20, 20}}),
			"1 fractional exposure(s) between exposures[0] at 8 min and exposures[2] at 12 min"},
		{"ErrNotFractional", ErrNotFractional, func() error { _, err := SMCAt(6, lotA(), 18); return err }, "exposures[5] at 18 min has 20 negative of 20 units"},
		{"ErrNotAnExposure", ErrNotAnExposure, func() error { _, err := SMCAt(6, lotA(), 13); return err }, "no exposure at 13 min"},
		{"ErrNoFractional", ErrNoFractional, func() error { _, err := SMC(6, []Exposure{{8, 20, 0}, {10, 20, 20}}); return err }, "none of the 2 exposures is fractional"},
		{"ErrSMCUndefined", ErrSMCUndefined, func() error { _, err := SMC(6, []Exposure{{0, 20, 5}, {10, 20, 20}}); return err }, "exposures[0] at 0 min is fractional at time 0"},
		{"ErrNoInformation", ErrNoInformation, func() error { _, err := MLE(6, []Exposure{{8, 20, 0}, {10, 20, 0}}, nil); return err }, "every unit of the 2 exposures is positive"},
		{"ErrInvalidLevel", ErrInvalidLevel, func() error { _, err := MLE(6, lotA(), &MLESettings{Level: 1.5}); return err }, "level 1.5"},
		// All negative at 1 and 11 min, all positive at 10 min: data that
		// contradict the model so grossly that, with N0 fitted, the
		// likelihood is flat along a ridge and the joint search stops at
		// its iteration limit (invented data).
		{"ErrNoConvergence", ErrNoConvergence, func() error {
			_, err := MLE(6, []Exposure{{1, 20, 20}, {10, 20, 0}, {11, 20, 20}, {1000, 20, 20}}, &MLESettings{FitN0: true})
			return err
		}, "joint fit of N0 and D"},
		{"ErrInvalidPlan", ErrInvalidPlan, func() error { _, err := PlanStudy(-2, 6, 20, 7, nil); return err }, "expected D = -2 min"},
	}
	apicheck.CheckSentinels(t, ".", sentinels, nil, cases)
}
