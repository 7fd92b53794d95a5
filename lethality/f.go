package lethality

import (
	"fmt"
	"math"
	"strings"
)

// Sample is one reading of a temperature record: the time in minutes and
// the temperature in °C.
type Sample struct {
	Minutes float64 `json:"minutes"`
	Celsius float64 `json:"celsius"`
}

// Rule names the integration rule F uses between two samples.
type Rule string

// The integration rules. With samples (tᵢ, Tᵢ), i = 0…n−1, and lethal rates
// Lᵢ = L(Tᵢ):
//
//	Rectangle: F = Σ Lᵢ (tᵢ₊₁ − tᵢ)                  (left rule, order h)
//	Trapezoid: F = Σ (Lᵢ + Lᵢ₊₁)/2 · (tᵢ₊₁ − tᵢ)      (order h²)
//	Exact:     F = Σ (tᵢ₊₁ − tᵢ)(Lᵢ₊₁ − Lᵢ)/ln(Lᵢ₊₁/Lᵢ), Lᵢ(tᵢ₊₁ − tᵢ) where Lᵢ₊₁ = Lᵢ
//
// Exact is the exact integral of L when the temperature is linear between
// samples. The empty Rule means Exact.
const (
	Exact     Rule = "exact"
	Trapezoid Rule = "trapezoid"
	Rectangle Rule = "rectangle"
)

// resolve returns the rule with the default applied, or ErrUnknownRule.
func (r Rule) resolve() (Rule, error) {
	switch r {
	case "":
		return Exact, nil
	case Exact, Trapezoid, Rectangle:
		return r, nil
	}
	return "", fmt.Errorf("rule %q (want %q, %q or %q): %w", string(r), Rectangle, Trapezoid, Exact, ErrUnknownRule)
}

// FSettings configures F and NewAccumulator. A nil *FSettings and every zero
// field mean the defaults.
type FSettings struct {
	// Rule is the integration rule; default Exact.
	Rule Rule `json:"rule,omitempty"`
	// MaxGap is the longest interval between two samples, in minutes, that
	// is integrated without comment; 0 means no limit. A longer interval is
	// refused with ErrGap, unless WarnGaps is set.
	MaxGap float64 `json:"max_gap,omitempty"`
	// WarnGaps makes an interval longer than MaxGap a warning instead of an
	// error: it is integrated by the rule like any other, listed in
	// FResult.Gaps and counted in FResult.GapCount.
	WarnGaps bool `json:"warn_gaps,omitempty"`
	// Cumulative asks F to return the cumulative F at every sample.
	Cumulative bool `json:"cumulative,omitempty"`
}

// Gap is an interval between two samples longer than FSettings.MaxGap.
// Index is the index of the sample that opens it.
type Gap struct {
	Index int     `json:"index"`
	From  float64 `json:"from_minutes"`
	To    float64 `json:"to_minutes"`
}

// maxListedGaps bounds the gaps listed in a result (all are counted), so
// that a streaming accumulator keeps bounded memory.
const maxListedGaps = 100

// FResult is the lethality of a temperature record.
type FResult struct {
	// F is the lethality in minutes at the reference temperature.
	F         float64   `json:"f"`
	Rule      Rule      `json:"rule"`
	Reference Reference `json:"reference"`
	// Samples is the number of samples integrated; Start and End the first
	// and last time (minutes).
	Samples int     `json:"samples"`
	Start   float64 `json:"start_minutes"`
	End     float64 `json:"end_minutes"`
	// Cumulative holds the F accumulated up to each sample (0 at the first)
	// when FSettings.Cumulative is set.
	Cumulative []float64 `json:"cumulative,omitempty"`
	// Gaps lists the first 100 intervals longer than FSettings.MaxGap;
	// GapCount counts them all.
	Gaps     []Gap    `json:"gaps,omitempty"`
	GapCount int      `json:"gap_count"`
	Warnings []string `json:"warnings,omitempty"`
}

// String formats the result on one line, followed by its warnings.
func (r FResult) String() string {
	var b strings.Builder
	fmt.Fprintf(&b, "F %.4g min (%s rule; %v) over %d samples, %.4g–%.4g min",
		r.F, r.Rule, r.Reference, r.Samples, r.Start, r.End)
	for _, w := range r.Warnings {
		b.WriteString("\n  warning: " + w)
	}
	return b.String()
}

// F returns the lethality of a temperature record,
//
//	F = ∫ 10^((T(t) − T_ref)/z) dt   (minutes at T_ref)
//
// by the rule of s (see Rule). Every rule evaluates at most one exponential
// per sample and no logarithm; the Exact rule uses
// ln(Lᵢ₊₁/Lᵢ) = x = (Tᵢ₊₁ − Tᵢ)·ln10/z and, where |x| < 1/8, the series of
// expm1(x)/x, so that it loses no digits to cancellation (there the next
// rate follows from the last as Lᵢ·(1 + x·expm1(x)/x), with a fresh
// exponential every 128 samples). Sums are compensated (Neumaier, over
// blocks of 128 intervals).
//
// F refuses, naming the sample by its index in samples: fewer than two
// samples (ErrTooFewSamples), a non-finite time or temperature
// (ErrNonFinite), times that do not strictly increase (ErrTimeOrder), an
// invalid reference (ErrInvalidReference), an unknown rule
// (ErrUnknownRule), an invalid setting (ErrInvalidSetting), an interval
// longer than s.MaxGap unless s.WarnGaps (ErrGap), and a lethal rate or F
// that overflows float64 (ErrOverflow). F does not modify samples.
func F(samples []Sample, ref Reference, s *FSettings) (FResult, error) {
	var set FSettings
	if s != nil {
		set = *s
	}
	in, err := newIntegrator(ref, &set)
	if err != nil {
		return FResult{}, err
	}
	if len(samples) < 2 {
		return FResult{}, fmt.Errorf("%d samples: %w", len(samples), ErrTooFewSamples)
	}
	var cum []float64
	if set.Cumulative {
		cum = make([]float64, len(samples))
	}
	if err := in.addAll(samples, cum); err != nil {
		return FResult{}, err
	}
	res, err := in.result()
	if err != nil {
		return FResult{}, err
	}
	res.Cumulative = cum
	return res, nil
}

// integrator is the state shared by F and Accumulator.
type integrator struct {
	ref      Reference
	rule     Rule
	code     int     // ruleExact, ruleTrapezoid or ruleRectangle
	a        float64 // ln10 / z
	b        float64 // log2(10) / z
	maxGap   float64 // math.MaxFloat64 for no limit
	warnGaps bool

	n         int
	first     Sample
	prev      Sample
	prevL     float64
	sum, comp float64 // Neumaier sum of the block sums and its compensation
	blk       float64 // plain sum of the current block
	nblk      int     // intervals in the current block
	gaps      []Gap
	gapCount  int
}

// Rule codes, so that the inner loop compares integers, not strings.
const (
	ruleExact = iota
	ruleTrapezoid
	ruleRectangle
)

// blockLen is the number of intervals summed plainly before the block sum
// is added to the compensated total.
const blockLen = 128

func newIntegrator(ref Reference, s *FSettings) (*integrator, error) {
	if err := ref.Validate(); err != nil {
		return nil, err
	}
	rule, err := s.Rule.resolve()
	if err != nil {
		return nil, err
	}
	if math.IsNaN(s.MaxGap) || s.MaxGap < 0 {
		return nil, fmt.Errorf("max gap %g min: %w", s.MaxGap, ErrInvalidSetting)
	}
	maxGap := s.MaxGap
	if maxGap == 0 || maxGap > math.MaxFloat64 {
		// No limit. MaxFloat64 rather than +Inf, so that dt ≤ maxGap also
		// refuses an infinite dt.
		maxGap = math.MaxFloat64
	}
	code := ruleRectangle
	switch rule {
	case Exact:
		code = ruleExact
	case Trapezoid:
		code = ruleTrapezoid
	}
	return &integrator{ref: ref, rule: rule, code: code, a: math.Ln10 / ref.Z, b: math.Log2(10) / ref.Z,
		maxGap: maxGap, warnGaps: s.WarnGaps}, nil
}

// total returns the F accumulated so far.
func (in *integrator) total() float64 { return in.sum + (in.comp + in.blk) }

// flush adds the block sum to the compensated total.
func (in *integrator) flush() {
	c := in.blk
	t := in.sum + c
	if math.Abs(in.sum) >= math.Abs(c) {
		in.comp += (in.sum - t) + c
	} else {
		in.comp += (c - t) + in.sum
	}
	in.sum, in.blk, in.nblk = t, 0, 0
}

// The lethal rate of each sample is 2^(b·(T − T_ref)) (pow2) at the first
// sample, at the first sample of each block of blockLen intervals, and
// wherever |d| ≥ seriesLimit, d = (Tᵢ₊₁ − Tᵢ)·ln10/z. In between it is
// Lᵢ₊₁ = Lᵢ·e^d = Lᵢ·(1 + d·φ(d)) with φ(d) = expm1(d)/d from expm1x, the
// same series the exact rule needs, so that such a sample costs no
// exponential. The error this chain adds is about an ulp per step, reset at
// every block: at most about 3e-14 relative (127 steps), typically 1e-15.

// add integrates up to sample x, numbered i in messages. On error the state
// is unchanged.
func (in *integrator) add(i int, x Sample) error {
	if !finite(x.Minutes) || !finite(x.Celsius) {
		return fmt.Errorf("samples[%d] (%g min, %g °C): %w", i, x.Minutes, x.Celsius, ErrNonFinite)
	}
	if in.n == 0 {
		l := pow2(in.b * (x.Celsius - in.ref.TRef))
		if l > math.MaxFloat64 {
			return fmt.Errorf("samples[%d] (%g min, %g °C): lethal rate against %v: %w", i, x.Minutes, x.Celsius, in.ref, ErrOverflow)
		}
		in.first, in.prev, in.prevL, in.n = x, x, l, 1
		return nil
	}
	dt := x.Minutes - in.prev.Minutes
	if !(dt > 0) {
		return fmt.Errorf("samples[%d] at %g min after %g min: %w", i, x.Minutes, in.prev.Minutes, ErrTimeOrder)
	}
	if dt > in.maxGap && !in.warnGaps {
		return fmt.Errorf("samples[%d]: %g min from %g to %g min, longer than %g min: %w", i, dt, in.prev.Minutes, x.Minutes, in.maxGap, ErrGap)
	}
	d := in.a * (x.Celsius - in.prev.Celsius)
	var l, c float64
	if in.nblk == 0 || !(math.Abs(d) < seriesLimit) {
		l = pow2(in.b * (x.Celsius - in.ref.TRef))
		switch in.code {
		case ruleExact:
			if math.Abs(d) < seriesLimit {
				c = dt * in.prevL * expm1x(d)
			} else {
				c = dt * ((l - in.prevL) / d)
			}
		case ruleTrapezoid:
			c = dt * (0.5*in.prevL + 0.5*l)
		default:
			c = dt * in.prevL
		}
	} else {
		phi := expm1x(d)
		l = in.prevL * (1 + d*phi)
		c = seriesContribution(in.code, dt, d, phi, in.prevL)
	}
	if l > math.MaxFloat64 {
		return fmt.Errorf("samples[%d] (%g min, %g °C): lethal rate against %v: %w", i, x.Minutes, x.Celsius, in.ref, ErrOverflow)
	}
	if dt > in.maxGap {
		if len(in.gaps) < maxListedGaps {
			in.gaps = append(in.gaps, Gap{Index: i - 1, From: in.prev.Minutes, To: x.Minutes})
		}
		in.gapCount++
	}
	in.blk += c
	if in.nblk++; in.nblk == blockLen {
		in.flush()
	}
	in.prev, in.prevL = x, l
	in.n++
	return nil
}

// seriesContribution is the integral over one interval on the series
// branch: φ = expm1(d)/d, l0 the rate at its start.
func seriesContribution(code int, dt, d, phi, l0 float64) float64 {
	switch code {
	case ruleExact:
		return dt * l0 * phi
	case ruleTrapezoid:
		return dt * (0.5*l0 + 0.5*(l0*(1+d*phi)))
	}
	return dt * l0
}

// addAll integrates every sample, storing the cumulative F in cum when it
// is not nil. The first interval of each block, and anything unusual (an
// error, a gap, a large temperature step), goes through add; the other
// intervals of the block run in a tight loop with the same arithmetic as
// add's series branch, so that F and Accumulator agree to the last bit.
func (in *integrator) addAll(samples []Sample, cum []float64) error {
	if err := in.add(0, samples[0]); err != nil {
		return err
	}
	if cum != nil {
		cum[0] = 0
	}
	code, a, b, tref, maxGap := in.code, in.a, in.b, in.ref.TRef, in.maxGap
	n := len(samples)
	for i := 1; i < n; {
		if err := in.add(i, samples[i]); err != nil {
			return err
		}
		if cum != nil {
			cum[i] = in.total()
		}
		i++
		if in.nblk == 0 {
			continue // the block is complete; the next starts with add
		}
		prev, prevL, blk := in.prev, in.prevL, in.blk
		end := min(n, i+blockLen-in.nblk)
		j := i
		if code == ruleExact && cum == nil {
			// The common case, in a loop of its own.
			j, prev, prevL, blk = exactRun(samples, i, end, a, b, tref, maxGap, prev, prevL, blk)
		}
		for ; j < end; j++ {
			x := samples[j]
			dt := x.Minutes - prev.Minutes
			d := a * (x.Celsius - prev.Celsius)
			// dt > 0 && dt ≤ maxGap (≤ MaxFloat64) also rejects a
			// non-finite time, the previous one being finite.
			if !(dt > 0 && dt <= maxGap) {
				break
			}
			var c, l float64
			if math.Abs(d) < seriesLimit {
				// expm1x(d), written out.
				d2 := d * d
				d4 := d2 * d2
				phi := ((phi0 + phi1*d) + d2*(phi2+phi3*d)) + d4*(((phi4+phi5*d)+d2*(phi6+phi7*d))+d4*phi8)
				switch code {
				case ruleExact:
					c = dt * prevL * phi
				case ruleTrapezoid:
					c = dt * (0.5*prevL + 0.5*(prevL*(1+d*phi)))
				default:
					c = dt * prevL
				}
				// No overflow is possible here (see pow2Chain).
				l = prevL * (1 + d*phi)
			} else {
				// pow2(w), written out; the range test also rejects a
				// non-finite temperature.
				w := b * (x.Celsius - tref)
				if !(w > -1020 && w < pow2Chain) {
					break
				}
				kf := (w*32 + roundMagic) - roundMagic
				k := int64(kf)
				r := w - kf*(1.0/32)
				r2 := r * r
				l = ((1 + ln2p1*r) + r2*((ln2p2+ln2p3*r)+r2*((ln2p4+ln2p5*r)+r2*ln2p6))) *
					exp2Table[k&31] * math.Float64frombits(uint64((k>>5)+1023)<<52)
				switch code {
				case ruleExact:
					c = dt * ((l - prevL) / d)
				case ruleTrapezoid:
					c = dt * (0.5*prevL + 0.5*l)
				default:
					c = dt * prevL
				}
			}
			blk += c
			prev, prevL = x, l
			if cum != nil {
				cum[j] = in.sum + (in.comp + blk)
			}
		}
		in.prev, in.prevL, in.blk = prev, prevL, blk
		in.nblk += j - i
		in.n += j - i
		if in.nblk == blockLen {
			in.flush()
			if cum != nil && j > i {
				cum[j-1] = in.total() // as Accumulator.Current reports it
			}
		}
		i = j
	}
	return nil
}

// exactRun is the tight loop of addAll for the exact rule without
// cumulative values: it integrates samples[i:end] while they are usual and
// returns the index of the first it did not take, with the state after the
// last it took. The arithmetic is that of addAll's loop.
func exactRun(samples []Sample, i, end int, a, b, tref, maxGap float64, prev Sample, prevL, blk float64) (int, Sample, float64, float64) {
	run := samples[i:end]
	j := 0
	for ; j < len(run); j++ {
		x := run[j]
		dt := x.Minutes - prev.Minutes
		d := a * (x.Celsius - prev.Celsius)
		if !(dt > 0 && dt <= maxGap) {
			break
		}
		var l float64
		if math.Abs(d) < seriesLimit {
			d2 := d * d
			d4 := d2 * d2
			phi := ((phi0 + phi1*d) + d2*(phi2+phi3*d)) + d4*(((phi4+phi5*d)+d2*(phi6+phi7*d))+d4*phi8)
			blk += dt * prevL * phi
			l = prevL * (1 + d*phi)
		} else {
			w := b * (x.Celsius - tref)
			if !(w > -1020 && w < pow2Chain) {
				break
			}
			kf := (w*32 + roundMagic) - roundMagic
			k := int64(kf)
			r := w - kf*(1.0/32)
			r2 := r * r
			l = ((1 + ln2p1*r) + r2*((ln2p2+ln2p3*r)+r2*((ln2p4+ln2p5*r)+r2*ln2p6))) *
				exp2Table[k&31] * math.Float64frombits(uint64((k>>5)+1023)<<52)
			blk += dt * ((l - prevL) / d)
		}
		prev, prevL = x, l
	}
	return i + j, prev, prevL, blk
}

// result returns the F so far.
func (in *integrator) result() (FResult, error) {
	if in.n < 2 {
		return FResult{}, fmt.Errorf("%d samples: %w", in.n, ErrTooFewSamples)
	}
	f := in.total()
	if math.IsInf(f, 0) || math.IsNaN(f) {
		return FResult{}, fmt.Errorf("lethality over %g–%g min against %v: %w", in.first.Minutes, in.prev.Minutes, in.ref, ErrOverflow)
	}
	r := FResult{F: f, Rule: in.rule, Reference: in.ref, Samples: in.n,
		Start: in.first.Minutes, End: in.prev.Minutes, GapCount: in.gapCount}
	if in.gapCount > 0 {
		r.Gaps = append([]Gap(nil), in.gaps...)
		w := fmt.Sprintf("%d interval(s) longer than %g min were integrated by the %s rule across the gap (first from %g to %g min)",
			in.gapCount, in.maxGap, in.rule, in.gaps[0].From, in.gaps[0].To)
		if in.gapCount > len(in.gaps) {
			w += fmt.Sprintf("; the first %d are listed", len(in.gaps))
		}
		r.Warnings = append(r.Warnings, w)
	}
	return r, nil
}

// Accumulator computes F from samples fed one at a time, in bounded memory,
// for records too large to hold. It gives the same F as the function F on
// the same samples. An Accumulator is not safe for concurrent use.
type Accumulator struct {
	in      *integrator
	offered int // samples offered to Add, accepted or not
}

// NewAccumulator returns an Accumulator for the reference and settings
// (s.Cumulative is ignored: read Current after each Add instead). It refuses
// an invalid reference, rule or setting as F does.
func NewAccumulator(ref Reference, s *FSettings) (*Accumulator, error) {
	var set FSettings
	if s != nil {
		set = *s
	}
	in, err := newIntegrator(ref, &set)
	if err != nil {
		return nil, err
	}
	return &Accumulator{in: in}, nil
}

// Add integrates up to the next sample. It refuses what F refuses (a
// non-finite value, a time that does not increase, a gap when gaps are
// errors, an overflow), naming the sample by the number of samples offered before it; a refused
// sample leaves the accumulator as it was, so the caller may go on.
func (a *Accumulator) Add(x Sample) error {
	if a == nil || a.in == nil {
		return fmt.Errorf("nil accumulator: %w", ErrInvalidSetting)
	}
	i := a.offered
	a.offered++
	return a.in.add(i, x)
}

// Current returns the F accumulated so far (0 before the second sample).
func (a *Accumulator) Current() float64 {
	if a == nil || a.in == nil {
		return 0
	}
	return a.in.total()
}

// Len returns the number of samples accepted so far.
func (a *Accumulator) Len() int {
	if a == nil || a.in == nil {
		return 0
	}
	return a.in.n
}

// Result returns the F of the samples accepted so far. It refuses fewer than
// two samples (ErrTooFewSamples) and an F that overflowed (ErrOverflow).
func (a *Accumulator) Result() (FResult, error) {
	if a == nil || a.in == nil {
		return FResult{}, fmt.Errorf("nil accumulator: %w", ErrInvalidSetting)
	}
	return a.in.result()
}
