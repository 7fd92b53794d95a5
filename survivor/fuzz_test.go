package survivor

import (
	"encoding/binary"
	"encoding/json"
	"errors"
	"math"
	"slices"
	"testing"
)

// The fuzz tests check that no input makes Fit or CountPopulation panic,
// that every refusal wraps exactly one documented sentinel, that every
// accepted result keeps the documented invariants (finite numbers, lower ≤
// estimate ≤ upper, +Inf only as an upper D limit) and marshals to JSON,
// and that the caller's slices are not modified. Inputs are bounded (at
// most 48 observations, 6 units of 4 plates) so that each costs
// microseconds.

// sentinels lists every error sentinel of the package (TestSentinels
// checks the list against the source).
var sentinels = []error{ErrInvalidObservation, ErrZeroCount, ErrTooFewObservations, ErrTooFewTimes, ErrNotDecreasing,
	ErrNotFinite, ErrLevel, ErrSettings, ErrNoUnits, ErrInvalidUnit, ErrInvalidPlate, ErrNoCountablePlate}

// wrapsOneSentinel reports how many of the sentinels err wraps.
func wrapsOneSentinel(err error) bool {
	n := 0
	for _, s := range sentinels {
		if errors.Is(err, s) {
			n++
		}
	}
	return n == 1
}

// fuzzObservations decodes observations from b. With raw, each 16 bytes
// are the float64 bits of a time and a count (NaN, ±Inf, subnormals and
// huge values included); otherwise each 3 bytes are a time b0·scale and a
// count b1·10^(b2 mod 16 − 3), which reaches realistic curves.
func fuzzObservations(b []byte, raw bool, scale float64) []Observation {
	var obs []Observation
	if raw {
		for len(b) >= 16 && len(obs) < 48 {
			obs = append(obs, Observation{
				Minutes: math.Float64frombits(binary.LittleEndian.Uint64(b)),
				Count:   math.Float64frombits(binary.LittleEndian.Uint64(b[8:])),
			})
			b = b[16:]
		}
		return obs
	}
	for len(b) >= 3 && len(obs) < 48 {
		obs = append(obs, Observation{Minutes: float64(b[0]) * scale, Count: float64(b[1]) * math.Pow10(int(b[2]%16)-3)})
		b = b[3:]
	}
	return obs
}

func FuzzFit(f *testing.F) {
	// A six-point curve (D about 2.3 min) in the 3-byte form, replicates,
	// zero counts, raw float64 bits, and extreme scales.
	f.Add([]byte{0, 18, 11, 2, 29, 10, 4, 36, 9, 6, 52, 8, 8, 61, 7, 10, 88, 5}, false, 1.0, 0.95, false)
	f.Add([]byte{0, 21, 11, 0, 17, 11, 4, 19, 10, 4, 26, 10, 8, 22, 9, 8, 14, 9, 12, 11, 8, 12, 0, 8}, false, 1.0, 0.9, true)
	f.Add([]byte{0, 100, 15, 1, 100, 3, 2, 1, 0}, false, 1e-6, 0.5, false)
	f.Add([]byte{0, 100, 15, 1, 100, 3, 2, 1, 0}, false, 1e300, 0.999999, false)
	f.Add([]byte{0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0xe0, 0x3f, 0x41}, true, 1.0, 0.0, false)
	f.Add([]byte("exposure times and counts as raw float64 bits, forty-eight bytes.."), true, 1.0, 0.95, true)
	f.Fuzz(func(t *testing.T, b []byte, raw bool, scale, level float64, exclude bool) {
		obs := fuzzObservations(b, raw, scale)
		before := slices.Clone(obs)
		r, err := Fit(obs, &Settings{Level: level, ExcludeBelowDetection: exclude})
		if !slices.EqualFunc(obs, before, func(a, b Observation) bool { return sameBits(a.Minutes, b.Minutes) && sameBits(a.Count, b.Count) }) {
			t.Fatalf("Fit modified its input")
		}
		if err != nil {
			if !wrapsOneSentinel(err) {
				t.Fatalf("error %q does not wrap exactly one sentinel", err)
			}
			return
		}
		d, n0 := r.D, r.Log10N0
		switch {
		case !(d.Value > 0) || math.IsInf(d.Value, 0) || !(r.Slope < 0):
			t.Fatalf("D %v, slope %v", d.Value, r.Slope)
		case !(d.Lower > 0 && d.Lower <= d.Value && d.Value <= d.Upper) || math.IsNaN(d.Upper):
			t.Fatalf("D %v outside its limits %v – %v", d.Value, d.Lower, d.Upper)
		case !finite(n0.Value) || !finite(n0.Lower) || !finite(n0.Upper) || !(n0.Lower <= n0.Value && n0.Value <= n0.Upper):
			t.Fatalf("log10 N0 %v, limits %v – %v", n0.Value, n0.Lower, n0.Upper)
		case !(r.RSquared >= 0 && r.RSquared <= 1) || !(r.ResidualSD >= 0) || !finite(r.ResidualSD) || !finite(r.SESlope) || !finite(r.LogReduction):
			t.Fatalf("r² %v, residual SD %v, SE %v, log reduction %v", r.RSquared, r.ResidualSD, r.SESlope, r.LogReduction)
		case r.N != len(obs)-len(r.Excluded) || r.DF != r.N-2 || r.Times < 2 || r.Times > r.N || len(r.Residuals) != r.N:
			t.Fatalf("n %d, df %d, times %d, %d residuals for %d observations, %d excluded", r.N, r.DF, r.Times, len(r.Residuals), len(obs), len(r.Excluded))
		}
		if math.IsInf(d.Upper, 1) == (len(d.Warnings) == len(n0.Warnings)) {
			t.Fatalf("upper limit %v without its warning: %q", d.Upper, d.Warnings)
		}
		if lf := r.LackOfFit; lf != nil && !(lf.P >= 0 && lf.P <= 1) && !(math.IsNaN(lf.P) && lf.PureErrorSS == 0) {
			t.Fatalf("lack-of-fit P %v (F %v)", lf.P, lf.F)
		}
		if _, err := json.Marshal(r); err != nil {
			t.Fatalf("json.Marshal: %v", err)
		}
		_ = r.String()
	})
}

// fuzzUnits decodes up to 6 units of up to 4 plates from b: per unit a
// byte for its plate count and suspension volume, per plate three bytes
// (colonies, dilution 10^-k, plated volume).
func fuzzUnits(b []byte, scale float64) []Unit {
	var units []Unit
	for len(b) >= 1 && len(units) < 6 {
		np := int(b[0] % 5)
		u := Unit{SuspensionML: float64(b[0]/5) * scale}
		b = b[1:]
		for range np {
			if len(b) < 3 {
				break
			}
			u.Plates = append(u.Plates, Plate{Colonies: float64(b[0]) * 2, Dilution: math.Pow10(-int(b[1] % 12)), PlatedML: float64(b[2]) / 100})
			b = b[3:]
		}
		units = append(units, u)
	}
	return units
}

func FuzzCountPopulation(f *testing.F) {
	f.Add([]byte{52, 75, 4, 10, 80, 4, 10, 7, 5, 10, 52, 60, 4, 10, 70, 4, 10, 47, 90, 4, 10}, 1.0, 0.95, 0.0, 0.0)
	f.Add([]byte{1, 150, 0, 1}, 1.0, 0.0, 0.0, 0.0)
	f.Add([]byte{52, 75, 4, 10, 80, 4, 10, 7, 5, 10}, 1e-300, 0.99, 10.0, 500.0)
	f.Add([]byte{0, 255, 255, 255}, math.Inf(1), math.NaN(), -1.0, math.NaN())
	f.Fuzz(func(t *testing.T, b []byte, scale, level, cmin, cmax float64) {
		units := fuzzUnits(b, scale)
		before := make([]Unit, len(units))
		for i, u := range units {
			before[i] = u
			before[i].Plates = slices.Clone(u.Plates)
		}
		p, err := CountPopulation(units, &PopulationSettings{Level: level, CountableMin: cmin, CountableMax: cmax})
		for i := range units {
			same := sameBits(units[i].SuspensionML, before[i].SuspensionML) && slices.EqualFunc(units[i].Plates, before[i].Plates, func(a, b Plate) bool {
				return sameBits(a.Colonies, b.Colonies) && sameBits(a.Dilution, b.Dilution) && sameBits(a.PlatedML, b.PlatedML)
			})
			if !same {
				t.Fatalf("CountPopulation modified unit %d", i)
			}
		}
		if err != nil {
			if !wrapsOneSentinel(err) {
				t.Fatalf("error %q does not wrap exactly one sentinel", err)
			}
			return
		}
		if !(p.Mean > 0) || math.IsInf(p.Mean, 0) || p.N != len(units) || p.DF != p.N-1 {
			t.Fatalf("mean %v, n %d, df %d for %d units", p.Mean, p.N, p.DF, len(units))
		}
		plates, used := 0, 0
		for i, u := range p.Units {
			if !(u.PerUnit > 0) || math.IsInf(u.PerUnit, 0) || u.Plates < 1 || u.Index != i {
				t.Fatalf("unit %d: %+v", i, u)
			}
			plates += len(units[i].Plates)
			used += u.Plates
		}
		if used+len(p.SetAside) != plates {
			t.Fatalf("%d plates used and %d set aside of %d", used, len(p.SetAside), plates)
		}
		if p.N > 1 {
			if !(p.SD >= 0) || !finite(p.SD) || !(p.CV >= 0) || !(p.Lower >= 0 && p.Lower <= p.Mean && p.Mean <= p.Upper) || !finite(p.Upper) {
				t.Fatalf("SD %v, CV %v, limits %v – %v of mean %v", p.SD, p.CV, p.Lower, p.Upper, p.Mean)
			}
		} else if !math.IsNaN(p.SD) || !math.IsNaN(p.Lower) || !math.IsNaN(p.Upper) {
			t.Fatalf("single unit: SD %v, limits %v – %v, want NaN", p.SD, p.Lower, p.Upper)
		}
		if _, err := json.Marshal(p); err != nil {
			t.Fatalf("json.Marshal: %v", err)
		}
		_ = p.String()
	})
}

// sameBits reports whether a and b are the same float64, NaN included.
func sameBits(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
