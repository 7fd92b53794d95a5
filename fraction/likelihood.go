package fraction

import "math"

// The binomial likelihood of fraction-negative data under first-order
// inactivation. For an exposure with linear predictor η = ln μ, where
// μ = N0·10^(−t/D) is the expected number of survivors per unit, a unit is
// negative with probability exp(−μ) and positive with 1 − exp(−μ): the
// complementary log-log link.

// logPositive returns log(1 − exp(−μ)) for μ = exp(eta), accurately for
// every eta.
func logPositive(eta, mu float64) float64 {
	switch {
	case eta < -700: // μ underflows; log(1 − e^{−μ}) = log μ − μ/2 + …
		return eta
	case mu < math.Ln2:
		return math.Log(-math.Expm1(-mu))
	}
	return math.Log1p(-math.Exp(-mu))
}

// terms returns one exposure's log-likelihood kernel (without the binomial
// coefficient; computed only when wantL) and its first and second
// derivatives in eta. An all-negative exposure costs one exponential.
func terms(eta, pos, neg float64, wantL bool) (l, s, h float64) {
	mu := math.Exp(eta)
	if neg > 0 {
		l, s, h = -neg*mu, -neg*mu, -neg*mu
	}
	if pos == 0 {
		return l, s, h
	}
	// q = μ/expm1(μ) = d log(1 − e^{−μ})/dη; c = 1 − μ − q, so that
	// dq/dη = q·c; lp = log(1 − e^{−μ}).
	var q, c, lp float64
	switch {
	case mu < 1e-5: // series; also right when μ underflows to 0
		q = 1 - mu/2 + mu*mu/12
		c = -mu/2 - mu*mu/12
		lp = eta - mu/2 + mu*mu/24
	case mu > 700:
		q, c, lp = 0, -mu, 0
	default:
		var e, om float64 // e^{−μ}, 1 − e^{−μ}
		if mu < 0.5 {
			om = -math.Expm1(-mu)
			e = 1 - om
		} else {
			e = math.Exp(-mu)
			om = 1 - e
		}
		q = mu * e / om
		c = 1 - mu - q
		if wantL {
			lp = math.Log(om)
		}
	}
	return l + pos*lp, s + pos*q, h + pos*q*c
}

// likelihood holds sorted observations for the fits.
type likelihood struct {
	t, tau   []float64 // minutes; minutes − tbar
	pos, neg []float64
	tbar     float64
	span     float64 // max t − min t
	lconst   float64 // Σ ln C(n, r)
}

func newLikelihood(o []obs) *likelihood {
	k := len(o)
	buf := make([]float64, 4*k)
	L := &likelihood{t: buf[:k], tau: buf[k : 2*k], pos: buf[2*k : 3*k], neg: buf[3*k:]}
	for i, x := range o {
		L.t[i], L.pos[i], L.neg[i] = x.t, x.n-x.r, x.r
		L.tbar += x.t
		L.lconst += lchoose(x.n, x.r)
	}
	L.tbar /= float64(k)
	for i := range o {
		L.tau[i] = L.t[i] - L.tbar
	}
	L.span = L.t[k-1] - L.t[0]
	return L
}

func lchoose(n, r float64) float64 {
	a, _ := math.Lgamma(n + 1)
	b, _ := math.Lgamma(r + 1)
	c, _ := math.Lgamma(n - r + 1)
	return a - b - c
}

// eval returns the log-likelihood kernel at η = a + b·x (x is L.t or
// L.tau) and its gradient and Hessian in (a, b).
func (L *likelihood) eval(a, b float64, x []float64) (l, ga, gb, haa, hab, hbb float64) {
	for i, xi := range x {
		li, s, h := terms(a+b*xi, L.pos[i], L.neg[i], true)
		l += li
		ga += s
		gb += s * xi
		haa += h
		hab += h * xi
		hbb += h * xi * xi
	}
	return
}

// slopeDerivs returns the score and its derivative in b at fixed a.
func (L *likelihood) slopeDerivs(a, b float64, x []float64) (g, dg float64) {
	for i, xi := range x {
		_, s, h := terms(a+b*xi, L.pos[i], L.neg[i], false)
		g += s * xi
		dg += h * xi * xi
	}
	return
}

// interceptDerivs returns the score and its derivative in a at fixed b.
func (L *likelihood) interceptDerivs(a, b float64, x []float64) (g, dg float64) {
	for i, xi := range x {
		_, s, h := terms(a+b*xi, L.pos[i], L.neg[i], false)
		g += s
		dg += h
	}
	return
}

// logLikSlope returns the kernel, and its derivative in b, at (a, b).
func (L *likelihood) logLikSlope(a, b float64, x []float64) (l, gb float64) {
	for i, xi := range x {
		li, s, _ := terms(a+b*xi, L.pos[i], L.neg[i], true)
		l += li
		gb += s * xi
	}
	return
}

// deviance returns the binomial deviance against the saturated model at
// η = a + b·x.
func (L *likelihood) deviance(a, b float64, x []float64) float64 {
	dev := 0.0
	for i, xi := range x {
		eta := a + b*xi
		mu := math.Exp(eta)
		n := L.pos[i] + L.neg[i]
		if p := L.pos[i]; p > 0 {
			dev += p * (math.Log(p/n) - logPositive(eta, mu))
		}
		if r := L.neg[i]; r > 0 {
			dev += r * (math.Log(r/n) + mu)
		}
	}
	return 2 * dev
}
