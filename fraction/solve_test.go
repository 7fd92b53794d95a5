package fraction

import (
	"math"
	"testing"
)

func TestRootDecreasing(t *testing.T) {
	cube := func(x float64) (float64, float64) { return 2 - x*x*x, -3 * x * x }
	tests := []struct {
		name          string
		x0, lo, hi, s float64
	}{
		{"unbounded both sides", 10, math.Inf(-1), math.Inf(1), 1},
		{"bracketed", 0.5, 0, 3, 1},
		{"start far left, derivative 0 at 0", -50, math.Inf(-1), math.Inf(1), 1},
	}
	for _, c := range tests {
		x, ok := rootDecreasing(cube, c.x0, c.lo, c.hi, c.s)
		// 2^(1/3), closed form.
		if !ok || math.Abs(x-math.Cbrt(2)) > 1e-12 {
			t.Errorf("%s: root %.15g, %v; want %.15g", c.name, x, ok, math.Cbrt(2))
		}
	}
	if _, ok := rootDecreasing(func(float64) (float64, float64) { return math.NaN(), math.NaN() }, 1, math.Inf(-1), math.Inf(1), 1); ok {
		t.Error("a NaN function reported convergence")
	}
	// A decreasing function with no root in the bracket's open side never
	// converges: g(x) = 1 + e^(−x) > 0 pushes x to +Inf.
	if _, ok := rootDecreasing(func(x float64) (float64, float64) { return 1 + math.Exp(-x), -math.Exp(-x) }, 0, math.Inf(-1), math.Inf(1), 1); ok {
		t.Error("a function without a root reported convergence")
	}
}
