package resistance

import (
	"math"
	"testing"
)

func TestEstimateStringForms(t *testing.T) {
	// Expected strings written by hand from the documented format.
	for _, c := range []struct {
		e    Estimate
		want string
	}{
		{Estimate{Value: 2.0478, Lower: 1.9567, Upper: 2.1389, Level: 0.9544997361036416, Method: "HSK"}, "2.048 (1.957 – 2.139, 95.45 %) HSK"},
		{Estimate{Value: 2.095, Lower: math.NaN(), Upper: math.NaN(), Level: math.NaN(), Method: "SMC"}, "2.095 (no limits) SMC"},
		{Estimate{Value: 2.3, Lower: 1.1, Upper: math.Inf(1), Level: 0.95, Method: "curve", Warnings: []string{"slope interval reaches zero"}}, "2.3 (1.1 – +Inf, 95 %) curve\n  warning: slope interval reaches zero"},
	} {
		if got := c.e.String(); got != c.want {
			t.Errorf("got %q, want %q", got, c.want)
		}
	}
}
