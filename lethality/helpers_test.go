package lethality

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// near fails the test when got is not within max(abs, rel·|want|) of want.
// scalar.EqualWithinAbsOrRel measures a difference below the smallest
// normal float64 against rel·2.2e-308, which no value near 1e-300 passes;
// there the ratio got/want is compared instead.
func near(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	if scalar.EqualWithinAbsOrRel(got, want, abs, rel) {
		return
	}
	if want != 0 && math.Abs(got-want) < 0x1p-1022 && math.Abs(got/want-1) <= rel {
		return
	}
	t.Errorf("%s = %.17g, want %.17g (abs %g, rel %g)", what, got, want, abs, rel)
}
