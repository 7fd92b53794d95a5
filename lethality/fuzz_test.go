package lethality

import (
	"encoding/binary"
	"encoding/json"
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"github.com/dzf-go/dzf/resistance"
)

// The fuzz tests check that no input makes an exported function panic,
// that every refusal wraps exactly one documented sentinel (a *ParseError
// for the reader, with its line), that every result keeps the documented
// invariants (F ≥ 0 and finite, cumulative F non-decreasing from 0 to F,
// probabilities in [0, 1], log10 PNSU ≤ 0, F and Accumulator equal to the
// last bit), and that results marshal to JSON. Inputs are bounded (64
// samples, 40 rows of 4 probes, 4 KiB of text) so that each costs
// microseconds.

// sentinels lists every error sentinel of the package (TestSentinels
// checks the list against the source).
var sentinels = []error{ErrInvalidReference, ErrTooFewSamples, ErrNonFinite, ErrTimeOrder, ErrUnknownRule, ErrGap, ErrOverflow,
	ErrInvalidD, ErrNegativeF, ErrNothingToKill, ErrInvalidSetting, ErrMissing, ErrNoProbe, ErrRowLength, ErrInvalidProbability,
	ErrInvalidStudy, ErrHeader, ErrDelimiter, ErrFieldCount, ErrBlankCell, ErrBadNumber, ErrBadTime, ErrTimeUnit, ErrQuote, ErrNoRows}

// documented reports whether err wraps exactly one sentinel.
func documented(err error) bool {
	n := 0
	for _, s := range sentinels {
		if errors.Is(err, s) {
			n++
		}
	}
	return n == 1
}

// fuzzRef returns a reference chosen by k, or one built from tRef and z.
func fuzzRef(k uint8, tRef, z float64) Reference {
	switch k % 5 {
	case 0:
		return MoistHeat()
	case 1:
		return MoistHeat121()
	case 2:
		return DryHeat()
	case 3:
		return Depyrogenation()
	}
	return Reference{TRef: tRef, Z: z}
}

// fuzzRule returns one of the rules, the empty default or an unknown one.
func fuzzRule(k uint8) Rule {
	return []Rule{Exact, Trapezoid, Rectangle, "", "simpson"}[int(k)%5]
}

// fuzzSamples decodes up to 64 samples. With raw, each 16 bytes are the
// float64 bits of a time and a temperature; otherwise each 3 bytes are a
// time step (b0 + 1)·scale/256 minutes (times increase; b0 = 0 repeats
// the time when scale is 0) and a temperature 60 + b1/2 + b2/512 °C.
func fuzzSamples(b []byte, raw bool, scale float64) []Sample {
	var s []Sample
	if raw {
		for len(b) >= 16 && len(s) < 64 {
			s = append(s, Sample{math.Float64frombits(binary.LittleEndian.Uint64(b)), math.Float64frombits(binary.LittleEndian.Uint64(b[8:]))})
			b = b[16:]
		}
		return s
	}
	t := 0.0
	for len(b) >= 3 && len(s) < 64 {
		s = append(s, Sample{t, 60 + float64(b[1])/2 + float64(b[2])/512})
		t += float64(b[0]+1) * scale / 256
		b = b[3:]
	}
	return s
}

// naiveF is the F of the rule computed plainly: math.Pow for every rate,
// expm1(x)/x for the exact rule, a plain sum.
func naiveF(s []Sample, ref Reference, rule Rule) float64 {
	f := 0.0
	for i := 1; i < len(s); i++ {
		dt := s[i].Minutes - s[i-1].Minutes
		l0, l1 := math.Pow(10, (s[i-1].Celsius-ref.TRef)/ref.Z), math.Pow(10, (s[i].Celsius-ref.TRef)/ref.Z)
		switch rule {
		case Rectangle:
			f += dt * l0
		case Trapezoid:
			f += dt * (l0 + l1) / 2
		default:
			// (L1 − L0)/x where a rate may underflow (found by fuzzing:
			// L0 = 0, L1 = 1.5e-245), L0·expm1(x)/x where they are close.
			x := (s[i].Celsius - s[i-1].Celsius) * math.Ln10 / ref.Z
			switch {
			case x == 0:
				f += dt * l0
			case math.Abs(x) > 1:
				f += dt * (l1 - l0) / x
			default:
				f += dt * l0 * math.Expm1(x) / x
			}
		}
	}
	return f
}

func FuzzF(f *testing.F) {
	f.Add([]byte{60, 80, 0, 60, 100, 0, 60, 120, 0, 60, 122, 0, 60, 122, 100, 60, 110, 0}, false, 1.0, uint8(0), uint8(0), 121.1, 10.0, 0.0, false, true)
	f.Add([]byte{255, 200, 255, 0, 0, 0, 255, 255, 255, 1, 2, 3}, false, 60.0, uint8(2), uint8(1), 0.0, 0.0, 0.5, true, true)
	f.Add([]byte{0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0x5e, 0x40, 0, 0, 0, 0, 0, 0, 0xf0, 0x3f, 0, 0, 0, 0, 0, 0x40, 0x5e, 0x40}, true, 1.0, uint8(4), uint8(0), 1e300, 1e-300, 0.0, false, false)
	f.Add([]byte("a temperature record as raw float64 bits, time and celsius pairs!"), true, 1.0, uint8(4), uint8(4), 0.0, -1.0, math.NaN(), true, true)
	f.Fuzz(func(t *testing.T, b []byte, raw bool, scale float64, refK, ruleK uint8, tRef, z, maxGap float64, warnGaps, cumulative bool) {
		samples := fuzzSamples(b, raw, scale)
		before := slices.Clone(samples)
		ref, rule := fuzzRef(refK, tRef, z), fuzzRule(ruleK)
		set := &FSettings{Rule: rule, MaxGap: maxGap, WarnGaps: warnGaps, Cumulative: cumulative}
		r, err := F(samples, ref, set)
		if !slices.EqualFunc(samples, before, func(a, b Sample) bool {
			return math.Float64bits(a.Minutes) == math.Float64bits(b.Minutes) && math.Float64bits(a.Celsius) == math.Float64bits(b.Celsius)
		}) {
			t.Fatal("F modified its input")
		}
		acc, aerr := NewAccumulator(ref, set)
		if err != nil {
			if !documented(err) {
				t.Fatalf("F: error %q does not wrap exactly one sentinel", err)
			}
			if aerr == nil {
				// The accumulator refuses the same sample (or the result).
				for _, x := range samples {
					if acc.Add(x) != nil {
						return
					}
				}
				if _, rerr := acc.Result(); rerr == nil {
					t.Fatalf("F refused (%v), the accumulator accepted every sample", err)
				}
			}
			return
		}
		if aerr != nil {
			t.Fatalf("F accepted the settings, NewAccumulator refused them: %v", aerr)
		}
		if !(r.F >= 0) || math.IsInf(r.F, 0) || r.Samples != len(samples) || r.GapCount < len(r.Gaps) || len(r.Gaps) > maxListedGaps {
			t.Fatalf("F %v over %d samples (%d given), %d gaps listed of %d", r.F, r.Samples, len(samples), len(r.Gaps), r.GapCount)
		}
		if cumulative {
			c := r.Cumulative
			if len(c) != len(samples) || c[0] != 0 || c[len(c)-1] != r.F {
				t.Fatalf("cumulative %v, F %v", c, r.F)
			}
			for i := 1; i < len(c); i++ {
				if c[i] < c[i-1] {
					t.Fatalf("cumulative F falls from %v to %v at sample %d", c[i-1], c[i], i)
				}
			}
		}
		// The accumulator gives the same bits, and Current the cumulative F.
		for i, x := range samples {
			if err := acc.Add(x); err != nil {
				t.Fatalf("accumulator refused sample %d that F accepted: %v", i, err)
			}
			if cumulative && acc.Current() != r.Cumulative[i] {
				t.Fatalf("sample %d: Current %v, cumulative %v", i, acc.Current(), r.Cumulative[i])
			}
		}
		ar, err := acc.Result()
		if err != nil || ar.F != r.F || ar.GapCount != r.GapCount {
			t.Fatalf("accumulator F %v (%v), F %v", ar.F, err, r.F)
		}
		// Against the plain computation, where it is well conditioned
		// (structured samples: 60–188 °C, at most 64 steps).
		if !raw && r.F > 1e-250 && r.F < 1e250 {
			rr := rule
			if rr == "" {
				rr = Exact
			}
			if want := naiveF(samples, ref, rr); !(math.Abs(r.F-want) <= 1e-12*want) {
				t.Fatalf("F %v, plain computation %v (rule %s)", r.F, want, rr)
			}
		}
		if _, err := json.Marshal(r); err != nil {
			t.Fatalf("JSON: %v", err)
		}
	})
}

func FuzzReadRecord(f *testing.F) {
	for _, s := range []string{
		"seconds,A,B\n0,1,2\n60,3,4\n",
		"t;a\n2031-04-02T10:00:00Z;1\n2031-04-02T10:01:00Z;2,5\n",
		"# c\n\"x\"\t\"y\"\n1\t\"2\"\n",
		"s,a\n0,\"1\n",
		"s,a\n,\n",
		"\xef\xbb\xbf# logger X-7\r\nminutes;P1;P2\r\n0;121,5;\r\n0,5;x;122\r\n",
	} {
		f.Add(s, uint8(0))
		f.Add(s, uint8(1))
		f.Add(s, uint8(7))
	}
	f.Fuzz(func(t *testing.T, text string, mode uint8) {
		if len(text) > 4096 {
			return
		}
		set := &ReadSettings{Time: []TimeFormat{TimeSeconds, TimeMinutes, TimeAuto, TimeRFC3339}[mode>>2&3]}
		if mode&1 == 1 {
			set.Missing, set.DecimalComma, set.Delimiter = MissingMark, mode&2 == 2, ';'
		}
		if mode&16 != 0 {
			set.Unit = Fahrenheit
		}
		rec, err := ReadRecord(strings.NewReader(text), set)
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) || pe.Line < 1 || pe.Column < 0 || !documented(err) {
				t.Fatalf("error %v is not a *ParseError with a line and one sentinel", err)
			}
			return
		}
		nan := 0
		for i, r := range rec.Rows {
			if len(r.Celsius) != len(rec.Probes) || !finite(r.Minutes) || (i > 0 && !(r.Minutes > rec.Rows[i-1].Minutes)) || r.Line < 1 {
				t.Fatalf("row %d: %+v", i, r)
			}
			for _, c := range r.Celsius {
				switch {
				case math.IsNaN(c):
					nan++
				case !finite(c):
					t.Fatalf("row %d: reading %v", i, c)
				}
			}
		}
		if nan != len(rec.Missing) || nan > 0 && set.Missing != MissingMark {
			t.Fatalf("%d NaN readings, %d cells listed missing", nan, len(rec.Missing))
		}
		if _, err := json.Marshal(rec); err != nil {
			t.Fatal(err)
		}
	})
}

// FuzzStreamF checks that streaming a file gives, probe by probe, the bits
// that reading it whole and integrating each probe with F give, and that
// the two refuse the same files.
func FuzzStreamF(f *testing.F) {
	f.Add("seconds,A,B\n0,118,119\n30,120.5,121\n60,121.5,121.2\n90,121.1,120\n", uint8(0), uint8(0))
	f.Add("minutes;P1;P2\n0;121,5;\n0,5;x;122\n1;122;122,5\n2;121;121\n", uint8(1), uint8(2))
	f.Add("seconds,A\n0,121\n", uint8(0), uint8(1))
	f.Add("seconds,A\n0,121\n1,5000\n", uint8(0), uint8(3))
	f.Fuzz(func(t *testing.T, text string, mode, ruleK uint8) {
		if len(text) > 4096 {
			return
		}
		rs := &ReadSettings{Time: TimeSeconds}
		if mode&1 == 1 {
			rs = &ReadSettings{Time: TimeMinutes, Missing: MissingMark, DecimalComma: true, Delimiter: ';'}
		}
		fs := &FSettings{Rule: fuzzRule(ruleK % 4), MaxGap: float64(mode>>1&3) * 0.5}
		ref := MoistHeat()
		res, serr := StreamF(strings.NewReader(text), ref, rs, fs)
		if serr != nil && !documented(serr) {
			t.Fatalf("StreamF: error %q does not wrap exactly one sentinel", serr)
		}
		rec, err := ReadRecord(strings.NewReader(text), rs)
		var fs2 []FResult
		if err == nil {
			for p := range rec.Probes {
				s, _, perr := rec.Series(p)
				if perr == nil {
					var r FResult
					r, perr = F(s, ref, fs)
					fs2 = append(fs2, r)
				}
				if perr != nil {
					err = perr
					break
				}
			}
		}
		if (serr == nil) != (err == nil) {
			t.Fatalf("StreamF: %v; whole record: %v", serr, err)
		}
		if serr != nil {
			return
		}
		if len(res.Probes) != len(fs2) || res.Rows != len(rec.Rows) {
			t.Fatalf("%d probes, %d rows; record %d probes, %d rows", len(res.Probes), res.Rows, len(fs2), len(rec.Rows))
		}
		for j, p := range res.Probes {
			if p.F.F != fs2[j].F || p.F.Samples != fs2[j].Samples || p.F.F < res.MinF {
				t.Fatalf("probe %s: streamed F %v over %d samples, F %v over %d; min %v", p.Probe, p.F.F, p.F.Samples, fs2[j].F, fs2[j].Samples, res.MinF)
			}
		}
		if res.Probes[res.ColdSpot].F.F != res.MinF || res.ColdSpotProbe != rec.Probes[res.ColdSpot] {
			t.Fatalf("cold spot %d (%s) with F %v, min %v", res.ColdSpot, res.ColdSpotProbe, res.Probes[res.ColdSpot].F.F, res.MinF)
		}
		if _, err := json.Marshal(res); err != nil {
			t.Fatal(err)
		}
	})
}

// fuzzRecord decodes a record of 1 to 4 probes and up to 40 rows: per row a
// time step byte and one byte per probe, 110 + b/8 °C, 255 marking a
// missing (NaN) reading.
func fuzzRecord(b []byte) Record {
	if len(b) == 0 {
		return Record{}
	}
	np := 1 + int(b[0]%4)
	b = b[1:]
	rec := Record{}
	for j := range np {
		rec.Probes = append(rec.Probes, string(rune('A'+j)))
	}
	t := 0.0
	for len(b) >= 1+np && len(rec.Rows) < 40 {
		row := Row{Line: len(rec.Rows) + 2, Minutes: t, Celsius: make([]float64, np)}
		for j := range np {
			if c := b[1+j]; c == 255 {
				row.Celsius[j] = math.NaN()
			} else {
				row.Celsius[j] = 110 + float64(c)/8
			}
		}
		rec.Rows = append(rec.Rows, row)
		t += float64(b[0]) / 16
		b = b[1+np:]
	}
	return rec
}

func FuzzCycle(f *testing.F) {
	f.Add([]byte{1, 4, 80, 88, 4, 100, 96, 4, 90, 92, 4, 88, 90, 4, 40, 70}, 121.0, 0.0, true, uint8(0))
	f.Add([]byte{2, 16, 255, 80, 60, 16, 90, 255, 90, 16, 100, 100, 100, 0, 100, 100, 100}, 0.0, 3.0, true, uint8(1))
	f.Add([]byte{3, 8, 10, 20, 30, 40, 8, 200, 200, 200, 200, 8, 250, 10, 250, 10}, 130.0, 0.5, false, uint8(2))
	f.Fuzz(func(t *testing.T, b []byte, celsius, band float64, bridge bool, ruleK uint8) {
		rec := fuzzRecord(b)
		r, err := Cycle(rec, MoistHeat121(), &CycleSettings{Celsius: celsius, Band: band, BridgeMissing: bridge, F: FSettings{Rule: fuzzRule(ruleK % 4), Cumulative: ruleK&4 != 0}})
		if err != nil {
			if !documented(err) {
				t.Fatalf("error %q does not wrap exactly one sentinel", err)
			}
			return
		}
		span := rec.Rows[len(rec.Rows)-1].Minutes - rec.Rows[0].Minutes
		tol := 1e-9 * (1 + span)
		if len(r.Probes) != len(rec.Probes) || r.Probes[r.ColdSpot].F.F != r.MinF {
			t.Fatalf("%d probes, cold spot %d, min F %v", len(r.Probes), r.ColdSpot, r.MinF)
		}
		for _, p := range r.Probes {
			switch {
			case !(p.F.F >= r.MinF) || math.IsInf(p.F.F, 0):
				t.Fatalf("probe %s: F %v, min %v", p.Probe, p.F.F, r.MinF)
			case !(p.MinCelsius <= p.MaxCelsius) || !(p.AtOrAbove >= 0 && p.AtOrAbove <= span+tol):
				t.Fatalf("probe %s: %v–%v °C, %v min at or above in %v", p.Probe, p.MinCelsius, p.MaxCelsius, p.AtOrAbove, span)
			case p.Reached && !(p.ReachMinutes >= rec.Rows[0].Minutes && p.ReachMinutes <= rec.Rows[len(rec.Rows)-1].Minutes):
				t.Fatalf("probe %s reached at %v min", p.Probe, p.ReachMinutes)
			case p.Reached != (p.MaxCelsius >= r.Celsius):
				t.Fatalf("probe %s: reached %v with maximum %v, sterilization %v", p.Probe, p.Reached, p.MaxCelsius, r.Celsius)
			}
		}
		if r.AllReached && !(r.Equilibration >= 0 && r.EquilibrationEnd-r.EquilibrationStart == r.Equilibration) {
			t.Fatalf("equilibration %v (%v–%v)", r.Equilibration, r.EquilibrationStart, r.EquilibrationEnd)
		}
		if r.HoldFound {
			if !(r.Hold > 0 && r.HoldStart < r.HoldEnd) || !(r.AllAtOrAbove >= r.Hold-tol && r.AllAtOrAbove <= span+tol) ||
				!(r.HoldMin >= r.Celsius && r.HoldMin <= r.HoldMax) || !(r.HoldSpread >= 0 && r.HoldSpread <= r.HoldMax-r.HoldMin+1e-9) ||
				r.WithinBand != (r.HoldMin >= r.BandLow && r.HoldMax <= r.BandHigh) {
				t.Fatalf("hold %v (%v–%v), all at or above %v, %v–%v °C, spread %v, within band %v", r.Hold, r.HoldStart, r.HoldEnd, r.AllAtOrAbove, r.HoldMin, r.HoldMax, r.HoldSpread, r.WithinBand)
			}
		} else if r.Hold != 0 || r.AllAtOrAbove != 0 {
			t.Fatalf("no hold, but hold %v, all at or above %v", r.Hold, r.AllAtOrAbove)
		}
		if _, err := json.Marshal(r); err != nil {
			t.Fatalf("JSON: %v", err)
		}
		_ = r.String()
	})
}

// FuzzSAL fuzzes the survival and requirement functions: probabilities in
// [0, 1], log10 PNSU ≤ 0 and consistent with PNSU, the required F bringing
// the population to the target, the conservative figures no better than
// the central ones, and the equivalent time inverting the lethal rate.
func FuzzSAL(f *testing.F) {
	f.Add(6.0, 18.0, 1.5, -6.0, 2.0, 121.0, 121.1, 10.0)
	f.Add(12.0, 1e4, 1e-3, -1000.0, math.Inf(1), 60.0, 250.0, 46.4)
	f.Add(1.0, 0.0, 1000.0, 0.5, 0.5, 5000.0, -1e300, 1e-300)
	f.Add(-300.0, 1e300, 1e-300, math.NaN(), 1.0, -273.15, 0.0, 0.0)
	f.Fuzz(func(t *testing.T, l0, fv, d, sal, upper, celsius, tRef, z float64) {
		s, err := Survivors(l0, fv, d)
		if err != nil {
			if !documented(err) {
				t.Fatalf("Survivors: undocumented error %v", err)
			}
		} else {
			checkSurvival(t, s)
			if s.Log10Survivors != l0-fv/d {
				t.Fatalf("log10 survivors %v, want %v", s.Log10Survivors, l0-fv/d)
			}
		}
		if lp := Log10PNSU(sal); !math.IsNaN(sal) && !(lp <= 0) {
			t.Fatalf("Log10PNSU(%v) = %v", sal, lp)
		} else if p := PNSU(sal); !math.IsNaN(sal) && !(p >= 0 && p <= 1) {
			t.Fatalf("PNSU(%v) = %v", sal, p)
		}
		if n, err := Log10SurvivorsForPNSU(sal); err != nil {
			if !documented(err) {
				t.Fatalf("Log10SurvivorsForPNSU: undocumented error %v", err)
			}
		} else if back := Log10PNSU(n); !(math.Abs(back-sal) <= 1e-12*(1+math.Abs(sal))) && sal > -300 {
			t.Fatalf("Log10PNSU(Log10SurvivorsForPNSU(%v) = %v) = %v", sal, n, back)
		}
		if req, err := RequiredF(l0, d, sal); err != nil {
			if !documented(err) {
				t.Fatalf("RequiredF: undocumented error %v", err)
			}
		} else {
			if !(req > 0) || math.IsInf(req, 0) {
				t.Fatalf("RequiredF(%v, %v, %v) = %v", l0, d, sal, req)
			}
			if s, err := Survivors(l0, req, d); err == nil && !(math.Abs(s.Log10Survivors-sal) <= 1e-12*(math.Abs(l0)+math.Abs(sal))) {
				t.Fatalf("F %v leaves log10 N %v, target %v", req, s.Log10Survivors, sal)
			}
		}
		ref := Reference{TRef: tRef, Z: z}
		if rate, err := LethalRate(celsius, ref); err != nil {
			if !documented(err) {
				t.Fatalf("LethalRate: undocumented error %v", err)
			}
		} else if !(rate >= 0) || math.IsInf(rate, 0) {
			t.Fatalf("LethalRate %v", rate)
		} else if m, err := EquivalentMinutes(fv, celsius, ref); err == nil && rate > 1e-300 && m > 0 && m < 1e300 {
			if !(math.Abs(m*rate-fv) <= 1e-12*fv) {
				t.Fatalf("%v min at a rate %v deliver %v, not F %v", m, rate, m*rate, fv)
			}
		}
		if m, err := EquivalentMinutes(fv, celsius, ref); err != nil {
			if !documented(err) {
				t.Fatalf("EquivalentMinutes: undocumented error %v", err)
			}
		} else if !(m >= 0) || math.IsInf(m, 0) {
			t.Fatalf("EquivalentMinutes %v", m)
		}
		est := resistance.Estimate{Value: d, Lower: d / 2, Upper: upper, Level: 0.95, Method: "fuzz", Warnings: []string{"w"}}
		if a, err := Assess(l0, fv, est); err != nil {
			if !documented(err) {
				t.Fatalf("Assess: undocumented error %v", err)
			}
		} else {
			checkSurvival(t, a.Central)
			if c := a.Conservative; c != nil {
				checkSurvival(t, *c)
				if c.Log10PNSU < a.Central.Log10PNSU {
					t.Fatalf("conservative log10 PNSU %v below central %v", c.Log10PNSU, a.Central.Log10PNSU)
				}
			} else if len(a.Warnings) < 2 {
				t.Fatalf("no conservative figure and no warning: %q", a.Warnings)
			}
			if _, err := json.Marshal(a); err != nil {
				t.Fatalf("JSON: %v", err)
			}
		}
		if r, err := Require(l0, sal, est, celsius, MoistHeat()); err != nil {
			if !documented(err) {
				t.Fatalf("Require: undocumented error %v", err)
			}
		} else {
			if !(r.F > 0) || !(r.Minutes >= 0) || r.FConservative != 0 && r.FConservative < r.F {
				t.Fatalf("requirement %+v", r)
			}
			if _, err := json.Marshal(r); err != nil {
				t.Fatalf("JSON: %v", err)
			}
		}
		if c, err := Compare(fv, Population{"indicator", l0, est}, Population{"bioburden", sal, est}); err != nil {
			if !documented(err) {
				t.Fatalf("Compare: undocumented error %v", err)
			}
		} else if _, err := json.Marshal(c); err != nil {
			t.Fatalf("JSON: %v", err)
		}
	})
}

// checkSurvival fails unless s keeps the documented ranges.
func checkSurvival(t *testing.T, s Survival) {
	t.Helper()
	if !(s.PNSU >= 0 && s.PNSU <= 1) || !(s.Log10PNSU <= 0) || !(s.LogReduction >= 0) || !finite(s.Log10Survivors) {
		t.Fatalf("survival %+v", s)
	}
	// PNSU and 10^Log10PNSU agree where PNSU is a normal float64.
	if s.PNSU > 1e-300 && !(math.Abs(math.Pow(10, s.Log10PNSU)-s.PNSU) <= 1e-12*s.PNSU) {
		t.Fatalf("PNSU %v, 10^log10 PNSU %v", s.PNSU, math.Pow(10, s.Log10PNSU))
	}
	if _, err := json.Marshal(s); err != nil {
		t.Fatalf("JSON: %v", err)
	}
}

// FuzzOverkill fuzzes Overkill and HalfCycle: Meets follows the numbers.
func FuzzOverkill(f *testing.F) {
	f.Add(18.0, 1.5, 12.0, 6.0, 20, 20, 30.0)
	f.Add(0.0, 0.0, 0.0, 1e-300, 1, 0, 0.0)
	f.Add(1e308, 1e-308, 1e308, math.Inf(1), -1, 2, math.NaN())
	f.Fuzz(func(t *testing.T, fv, d, target, l0 float64, units, negative int, half float64) {
		s := &OverkillSettings{D: d, TargetLogs: target}
		r, err := Overkill(fv, s)
		if err != nil {
			if !documented(err) {
				t.Fatalf("Overkill: undocumented error %v", err)
			}
		} else if r.LogReduction != fv/r.D || r.Meets != (r.LogReduction >= r.TargetLogs) || !(r.RequiredF >= 0) {
			t.Fatalf("overkill %+v", r)
		}
		h, err := HalfCycle(HalfCycleStudy{Log10N0: l0, Units: units, Negative: negative, HalfMinutes: half}, s)
		if err != nil {
			if !documented(err) {
				t.Fatalf("HalfCycle: undocumented error %v", err)
			}
			return
		}
		if h.Inactivated != (negative == units) || h.FullLogs != 2*h.HalfLogs || h.Meets != (h.Inactivated && h.FullLogs >= h.TargetLogs) || !(h.ImpliedMaxD >= 0) {
			t.Fatalf("half cycle %+v", h)
		}
		if _, err := json.Marshal(h); err != nil {
			t.Fatalf("JSON: %v", err)
		}
		_ = h.String()
	})
}
