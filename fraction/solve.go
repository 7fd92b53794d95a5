package fraction

import "math"

// rootDecreasing finds a root of a decreasing function g, given g and its
// derivative by fd, starting at x0 inside the bracket (lo, hi) where g(lo) >
// 0 > g(hi); either end may be infinite. It takes Newton steps, falls back
// to bisection when a step leaves the bracket, and caps steps toward an
// unbounded end at a few times max(|x|, scale). It reports false when it
// did not converge in its iteration budget.
func rootDecreasing(fd func(x float64) (g, dg float64), x0, lo, hi, scale float64) (float64, bool) {
	x := x0
	for range 400 {
		g, dg := fd(x)
		switch {
		case g > 0:
			lo = x
		case g < 0:
			hi = x
		case g == 0:
			return x, true
		default: // NaN: shrink toward a finite end
			if math.IsInf(lo, 0) || math.IsInf(hi, 0) {
				return x, false
			}
			x = lo + (hi-lo)/2
			continue
		}
		step := -g / dg
		if !(dg < 0) || math.IsInf(step, 0) || math.IsNaN(step) {
			step = math.Copysign(scale, g)
		}
		if limit := 4 * math.Max(scale, math.Abs(x)); math.Abs(step) > limit {
			step = math.Copysign(limit, step)
		}
		next := x + step
		if math.Abs(step) <= 1e-8*math.Max(math.Abs(x), scale) && dg < 0 && next >= lo && next <= hi {
			// A Newton step this small leaves an error of order step²:
			// converged (and such a step may not even change x).
			return next, true
		}
		if next <= lo || next >= hi {
			switch {
			case !math.IsInf(lo, 0) && !math.IsInf(hi, 0):
				next = lo + (hi-lo)/2
			case next >= hi:
				next = x + (hi-x)/2
			default:
				next = x + (lo-x)/2
			}
		}
		tol := 1e-13 * math.Max(math.Abs(next), scale)
		if math.Abs(next-x) <= tol || hi-lo <= tol {
			return next, true
		}
		x = next
	}
	return x, false
}
