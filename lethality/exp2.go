package lethality

import "math"

// exp2Table holds 2^(j/32), j = 0…31, correctly rounded (computed with
// Python mpmath 1.2.1 at 50 digits: float(mpmath.power(2, mpf(j)/32))). It
// is read only.
var exp2Table = [32]float64{
	1.0, 1.0218971486541166, 1.0442737824274138, 1.0671404006768237,
	1.0905077326652577, 1.1143867425958924, 1.1387886347566916, 1.1637248587775775,
	1.189207115002721, 1.215247359980469, 1.241857812073484, 1.2690509571917332,
	1.2968395546510096, 1.3252366431597413, 1.3542555469368927, 1.383909881963832,
	1.4142135623730951, 1.4451808069770467, 1.4768261459394993, 1.5091644275934228,
	1.5422108254079407, 1.5759808451078865, 1.6104903319492543, 1.645755478153965,
	1.681792830507429, 1.718619298122478, 1.7562521603732995, 1.7947090750031072,
	1.8340080864093424, 1.8741676341103, 1.9152065613971474, 1.9571441241754002,
}

// Coefficients (ln 2)^k / k! of 2^r = Σ (r ln2)^k / k!.
const (
	ln2p1 = 0.6931471805599453
	ln2p2 = 0.24022650695910072
	ln2p3 = 0.05550410866482158
	ln2p4 = 0.009618129107628477
	ln2p5 = 0.0013333558146428443
	ln2p6 = 0.0001540353039338161
)

// roundMagic rounds a float64 of magnitude below 2^51 to the nearest
// integer by (x + roundMagic) − roundMagic.
const roundMagic = 0x1.8p52

// pow2 returns 2^w for the lethal rate in F's inner loop: w = 32k + … is
// split as 2^e · 2^(j/32) · 2^r with |r| ≤ 1/64, and 2^r is the Taylor
// polynomial of degree 6 (first omitted term below 4e-18 relative). Its
// error is within about 2 ulp of math.Exp2 over the whole range (tested);
// outside |w| < 1020 it defers to math.Exp2 (overflow to +Inf, underflow to
// 0). NaN gives NaN.
func pow2(w float64) float64 {
	if !(w > -1020 && w < 1020) {
		return math.Exp2(w)
	}
	kf := (w*32 + roundMagic) - roundMagic
	k := int64(kf)
	r := w - kf*(1.0/32)
	r2 := r * r
	p := (1 + ln2p1*r) + r2*((ln2p2+ln2p3*r)+r2*((ln2p4+ln2p5*r)+r2*ln2p6))
	return p * exp2Table[k&31] * math.Float64frombits(uint64((k>>5)+1023)<<52)
}

// Coefficients of expm1(x)/x ≈ Σ φₖ xᵏ, k = 0…8, on |x| ≤ 1/8: the
// Chebyshev fit of Python mpmath 1.2.1 (dps 50),
// mpmath.chebyfit(lambda x: mpmath.expm1(x)/x, [-1/8, 1/8], 9), rounded to
// float64; the largest error is 1.1e-17 (below 0.1 ulp of the value, about 1).
const (
	phi0 = 1.0
	phi1 = 0.49999999999999944
	phi2 = 0.1666666666666666
	phi3 = 0.041666666667159555
	phi4 = 0.00833333333337814
	phi5 = 0.0013888887753297243
	phi6 = 0.00019841268808950876
	phi7 = 2.481127714200542e-05
	phi8 = 2.7566127929189027e-06
)

// expm1x returns expm1(x)/x for |x| < seriesLimit, by Estrin's scheme on
// the coefficients φₖ.
func expm1x(x float64) float64 {
	x2 := x * x
	x4 := x2 * x2
	return ((phi0 + phi1*x) + x2*(phi2+phi3*x)) + x4*(((phi4+phi5*x)+x2*(phi6+phi7*x))+x4*phi8)
}

// seriesLimit is the |x| = |ΔT|·ln10/z (ΔT up to about 0.54 °C at z 10)
// below which the exact rule uses the series expm1x, and the lethal rate
// of the next sample follows from the last as Lᵢ·(1 + x·expm1x(x)). Above
// it, (Lᵢ₊₁ − Lᵢ)/x loses at most about 8ε(1 + |y|) relative on that
// interval (ε the float64 epsilon, y the exponent of Lᵢ: large only where
// L, and so the interval's share of F, is tiny).
const seriesLimit = 1.0 / 8

// pow2Chain is the largest w for which the batch loop takes pow2's value
// as the start of a chain: blockLen − 1 = 127 further steps of at most
// e^(1/8) keep the rate below 2^(1000 + 127/8·log2(e)) < 2^1023, short of
// overflow.
const pow2Chain = 1000
