package resistance

import (
	"errors"
	"math"
	"math/rand/v2"
	"testing"
)

func TestActivationEnergy(t *testing.T) {
	for _, c := range []struct {
		name      string
		z, t1, t2 float64
		want      float64
	}{
		// Hand-worked from Ea = ln10·R·T1·T2/z (Python 3:
		// math.log(10)*8.314462618*T1*T2/z with T in kelvin).
		{"z 10 at 121 °C", 10, 121, 121, 297421.894439924},
		{"z 10 over 121–131 °C", 10, 121, 131, 304967.8006796785},
		{"z 20 over 160–170 °C", 20, 160, 170, 183742.2162712501},
	} {
		got, err := ActivationEnergy(c.z, c.t1, c.t2)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		near(t, c.name, got, c.want, 1e-12)
	}
}

// TestArrheniusChord checks the sense in which the conversion is exact: the
// Arrhenius model with the converted Ea gives the same ratio D(T1)/D(T2) as
// the z model, computed independently from each model's own formula.
func TestArrheniusChord(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for range 500 {
		z := 4 + 30*rng.Float64()
		t1 := 50 + 150*rng.Float64()
		t2 := t1 + 1 + 30*rng.Float64()
		ea, err := ActivationEnergy(z, t1, t2)
		if err != nil {
			t.Fatal(err)
		}
		k1, k2 := t1+KelvinOffset, t2+KelvinOffset
		// Arrhenius: k2/k1 = exp(Ea/R·(1/T1 − 1/T2)); D ∝ 1/k.
		arrhenius := math.Exp(ea / GasConstant * (1/k1 - 1/k2))
		zModel := math.Pow(10, (t2-t1)/z) // D(T1)/D(T2) from DAt's formula
		near(t, "ratio D(T1)/D(T2)", arrhenius, zModel, 1e-10)
	}
}

// TestArrheniusRoundTrip checks that ZFromActivationEnergy inverts
// ActivationEnergy.
func TestArrheniusRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 10))
	for range 500 {
		z := 1 + 60*rng.Float64()
		t1, t2 := 20+250*rng.Float64(), 20+250*rng.Float64()
		ea, err := ActivationEnergy(z, t1, t2)
		if err != nil {
			t.Fatal(err)
		}
		back, err := ZFromActivationEnergy(ea, t1, t2)
		if err != nil {
			t.Fatal(err)
		}
		near(t, "z back", back, z, 1e-13)
	}
}

func TestArrheniusRefusals(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name      string
		z, t1, t2 float64
		want      error
	}{
		{"z zero", 0, 121, 131, ErrInvalidZ},
		{"z NaN", nan, 121, 131, ErrInvalidZ},
		{"absolute zero", 10, -273.15, 131, ErrInvalidTemperature},
		{"below absolute zero", 10, 121, -300, ErrInvalidTemperature},
		{"temperature Inf", 10, inf, 131, ErrInvalidTemperature},
		{"overflow", 1e-300, 1e300, 1e300, ErrOutOfRange},
	} {
		if _, err := ActivationEnergy(c.z, c.t1, c.t2); !errors.Is(err, c.want) {
			t.Errorf("ActivationEnergy %s: error %v, want %v", c.name, err, c.want)
		}
	}
	for _, c := range []struct {
		name       string
		ea, t1, t2 float64
		want       error
	}{
		{"Ea zero", 0, 121, 131, ErrInvalidEnergy},
		{"Ea negative", -3e5, 121, 131, ErrInvalidEnergy},
		{"Ea Inf", inf, 121, 131, ErrInvalidEnergy},
		{"temperature NaN", 3e5, nan, 131, ErrInvalidTemperature},
		{"underflow", 1e308, -273.15 + 1e-10, -273.15 + 1e-10, ErrOutOfRange},
	} {
		if _, err := ZFromActivationEnergy(c.ea, c.t1, c.t2); !errors.Is(err, c.want) {
			t.Errorf("ZFromActivationEnergy %s: error %v, want %v", c.name, err, c.want)
		}
	}
}
