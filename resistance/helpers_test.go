package resistance

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// near reports a failure unless got equals want within tol, absolute or
// relative (scalar.EqualWithinAbsOrRel); NaN matches NaN and ±Inf matches
// the same infinity.
func near(t *testing.T, what string, got, want, tol float64) {
	t.Helper()
	switch {
	case math.IsNaN(want):
		if !math.IsNaN(got) {
			t.Errorf("%s = %v, want NaN", what, got)
		}
	case math.IsInf(want, 0):
		if got != want {
			t.Errorf("%s = %v, want %v", what, got, want)
		}
	case !scalar.EqualWithinAbsOrRel(got, want, tol, tol):
		t.Errorf("%s = %.15g, want %.15g (tolerance %g)", what, got, want, tol)
	}
}
