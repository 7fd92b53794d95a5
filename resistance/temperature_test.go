package resistance

import (
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"
)

func TestDAt(t *testing.T) {
	for _, c := range []struct {
		name                   string
		dRef, tRef, z, celsius float64
		want, tol              float64
		source                 string
	}{
		{"published D150 to D160", 4.5, 150, 10, 160, 0.45, 1e-14, "published example of the z-value model, quoted secondarily: D150 = 4.5 min, z = 10 → D160 = 0.45 min"},
		{"published reversed", 0.45, 160, 10, 150, 4.5, 1e-14, "the same published example read backwards"},
		{"one z below", 1.5, 121, 10, 111, 15, 1e-14, "hand-worked: 1.5·10^1"},
		{"half z above", 2, 121, 6, 130, 0.0632455532033676, 1e-14, "hand-worked: 2·10^−1.5, Python 3 2*10**-1.5"},
		{"F0 reference", 1.8, 121.1, 10, 134, 0.0923150491184457, 1e-14, "hand-worked: 1.8·10^−1.29, Python 3 1.8*10**(-12.9/10)"},
		{"same temperature", 2.7, 121, 8.5, 121, 2.7, 0, "hand-worked: 10^0 = 1"},
		{"dry heat z 20", 3, 160, 20, 180, 0.3, 1e-14, "hand-worked: 3·10^−1"},
	} {
		got, err := DAt(c.dRef, c.tRef, c.z, c.celsius)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		near(t, c.name+" ("+c.source+")", got, c.want, c.tol)
	}
}

func TestTemperatureAt(t *testing.T) {
	for _, c := range []struct {
		name             string
		dRef, tRef, z, d float64
		want, tol        float64
	}{
		// Hand-worked from T = T_ref − z·(log10 D − log10 D_ref).
		{"published: D 0.45 from D150 4.5", 4.5, 150, 10, 0.45, 160, 1e-12},
		{"tenfold longer", 1.5, 121, 10, 15, 111, 1e-12},
		{"same D", 2, 121, 6, 2, 121, 0},
		{"z 6 hundredfold shorter", 2, 121, 6, 0.02, 133, 1e-12},
	} {
		got, err := TemperatureAt(c.dRef, c.tRef, c.z, c.d)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		near(t, c.name, got, c.want, c.tol)
	}
}

// TestDAtRoundTrip checks that TemperatureAt inverts DAt on random inputs.
func TestDAtRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for i := range 1000 {
		dRef := math.Pow(10, -2+4*rng.Float64())
		tRef := 50 + 200*rng.Float64()
		z := 2 + 48*rng.Float64()
		celsius := tRef - 40 + 80*rng.Float64()
		d, err := DAt(dRef, tRef, z, celsius)
		if err != nil {
			t.Fatalf("case %d: %v", i, err)
		}
		back, err := TemperatureAt(dRef, tRef, z, d)
		if err != nil {
			t.Fatalf("case %d: %v", i, err)
		}
		near(t, "temperature back", back, celsius, 1e-9)
	}
}

func TestDAtRefusals(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name                   string
		dRef, tRef, z, celsius float64
		want                   error
	}{
		{"D zero", 0, 121, 10, 111, ErrInvalidD},
		{"D negative", -1, 121, 10, 111, ErrInvalidD},
		{"D NaN", nan, 121, 10, 111, ErrInvalidD},
		{"D Inf", inf, 121, 10, 111, ErrInvalidD},
		{"z zero", 1, 121, 0, 111, ErrInvalidZ},
		{"z negative", 1, 121, -10, 111, ErrInvalidZ},
		{"z Inf", 1, 121, inf, 111, ErrInvalidZ},
		{"z NaN", 1, 121, nan, 111, ErrInvalidZ},
		{"reference temperature NaN", 1, nan, 10, 111, ErrInvalidTemperature},
		{"temperature -Inf", 1, 121, 10, -inf, ErrInvalidTemperature},
		{"overflow", 1, 121, 1, -1000, ErrOutOfRange},
		{"underflow", 1, 121, 1, 1000, ErrOutOfRange},
	} {
		if _, err := DAt(c.dRef, c.tRef, c.z, c.celsius); !errors.Is(err, c.want) {
			t.Errorf("DAt %s: error %v, want %v", c.name, err, c.want)
		}
	}
	for _, c := range []struct {
		name             string
		dRef, tRef, z, d float64
		want             error
	}{
		{"target D zero", 1, 121, 10, 0, ErrInvalidD},
		{"target D NaN", 1, 121, 10, nan, ErrInvalidD},
		{"reference D negative", -1, 121, 10, 1, ErrInvalidD},
		{"z zero", 1, 121, 0, 1, ErrInvalidZ},
		{"reference temperature Inf", 1, inf, 10, 1, ErrInvalidTemperature},
		{"overflow", 1e-300, 121, 1e306, 1e300, ErrOutOfRange},
	} {
		if _, err := TemperatureAt(c.dRef, c.tRef, c.z, c.d); !errors.Is(err, c.want) {
			t.Errorf("TemperatureAt %s: error %v, want %v", c.name, err, c.want)
		}
	}
}

func TestEstimateAt(t *testing.T) {
	in := Estimate{Value: 2, Lower: 1.8, Upper: 2.3, Level: 0.95, Method: "survivor curve", Warnings: []string{"four exposures"}}
	got, err := EstimateAt(in, 121, 10, 131)
	if err != nil {
		t.Fatal(err)
	}
	// Hand-worked: one z above, every number divided by 10.
	near(t, "value", got.Value, 0.2, 1e-14)
	near(t, "lower", got.Lower, 0.18, 1e-14)
	near(t, "upper", got.Upper, 0.23, 1e-14)
	near(t, "level", got.Level, 0.95, 0)
	if !strings.Contains(got.Method, "survivor curve at 131 °C") {
		t.Errorf("method %q does not name the temperature", got.Method)
	}
	if len(got.Warnings) != 2 || got.Warnings[0] != "four exposures" || !strings.Contains(got.Warnings[1], "not that of z") {
		t.Errorf("warnings %q", got.Warnings)
	}
	if len(in.Warnings) != 1 {
		t.Errorf("caller's warnings modified: %q", in.Warnings)
	}
	// Unbounded and missing limits are kept.
	got, err = EstimateAt(Estimate{Value: 2, Lower: math.NaN(), Upper: math.Inf(1), Level: 0.95}, 121, 10, 111)
	if err != nil {
		t.Fatal(err)
	}
	near(t, "value at 111", got.Value, 20, 1e-14)
	near(t, "NaN lower", got.Lower, math.NaN(), 0)
	near(t, "Inf upper", got.Upper, math.Inf(1), 0)
	if _, err := EstimateAt(Estimate{Value: 0}, 121, 10, 111); !errors.Is(err, ErrInvalidD) {
		t.Errorf("zero estimate: error %v, want ErrInvalidD", err)
	}
	if _, err := EstimateAt(Estimate{Value: 1}, 121, -1, 111); !errors.Is(err, ErrInvalidZ) {
		t.Errorf("negative z: error %v, want ErrInvalidZ", err)
	}
}
