package lethality

import (
	"errors"
	"math"
	"testing"
)

func TestPresets(t *testing.T) {
	// The presets' numbers: F0 121.1 °C / z 10 (common definition), 121 °C
	// / z 10 (some pharmacopoeial texts), dry heat 170 °C / z 20 and
	// depyrogenation 250 °C / z 46.4 (from memory, as documented).
	cases := []struct {
		ref     Reference
		tref, z float64
	}{{MoistHeat(), 121.1, 10}, {MoistHeat121(), 121, 10}, {DryHeat(), 170, 20}, {Depyrogenation(), 250, 46.4}}
	for _, c := range cases {
		if c.ref.TRef != c.tref || c.ref.Z != c.z || c.ref.Validate() != nil || c.ref.Status == "" || c.ref.Name == "" {
			t.Errorf("preset %v: want T_ref %g, z %g, a name and a status", c.ref, c.tref, c.z)
		}
		near(t, c.ref.Name+" rate at T_ref", c.ref.Rate(c.tref), 1, 0, 1e-15)         // closed form
		near(t, c.ref.Name+" rate one z above", c.ref.Rate(c.tref+c.z), 10, 0, 1e-14) // closed form
	}
	// MoistHeat121 credits 10^(0.1/10) more than MoistHeat at any
	// temperature (closed form).
	near(t, "121 °C against 121.1 °C", MoistHeat121().Rate(118)/MoistHeat().Rate(118), math.Pow(10, 0.01), 0, 1e-14)
}

func TestRate(t *testing.T) {
	cases := []struct {
		name    string
		celsius float64
		ref     Reference
		want    float64
		rel     float64
	}{
		// German Wikipedia, "Letalitätswert": 0.1 at 111.1 °C, 0.01 at 101.1 °C.
		{"111.1 °C", 111.1, MoistHeat(), 0.1, 1e-12},
		{"101.1 °C", 101.1, MoistHeat(), 0.01, 1e-12},
		// Hand-worked from the closed form.
		{"dry heat 180 °C", 180, DryHeat(), math.Sqrt(10), 1e-14},
		{"depyrogenation 203.6 °C", 203.6, Depyrogenation(), 0.1, 1e-13},
	}
	for _, c := range cases {
		got, err := LethalRate(c.celsius, c.ref)
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.name, got, c.want, 0, c.rel)
	}
	if _, err := LethalRate(5000, MoistHeat()); !errors.Is(err, ErrOverflow) {
		t.Errorf("overflow: %v", err)
	}
	if _, err := LethalRate(math.NaN(), MoistHeat()); !errors.Is(err, ErrNonFinite) {
		t.Errorf("NaN: %v", err)
	}
	if _, err := LethalRate(121, Reference{TRef: 121, Z: 0}); !errors.Is(err, ErrInvalidReference) {
		t.Errorf("z 0: %v", err)
	}
	if l, err := LethalRate(-273, MoistHeat()); err != nil || l <= 0 || l > 1e-38 {
		t.Errorf("at -273 °C: %v, %v", l, err)
	}
	r := MoistHeat()
	if !math.IsNaN(r.Rate(math.NaN())) || !math.IsInf(r.Rate(math.Inf(1)), 1) || r.Rate(math.Inf(-1)) != 0 {
		t.Error("Rate special cases")
	}
}

func TestEquivalentMinutes(t *testing.T) {
	cases := []struct {
		name       string
		f, celsius float64
		ref        Reference
		want       float64
	}{
		// Closed form: with T_ref 121 °C, 15 min at 111 °C ≡ 1.5 min at 121 °C.
		{"1.5 min at 111 °C", 1.5, 111, MoistHeat121(), 15},
		// Arithmetic check (overkill texts): D121 1.5 min; 6 logs F 9, 12 logs F 18 at 121 °C.
		{"6 logs", 9, 121, MoistHeat121(), 9},
		{"12 logs", 18, 121, MoistHeat121(), 18},
		{"one z above", 1, 131.1, MoistHeat(), 0.1},
		{"zero F", 0, 100, MoistHeat(), 0},
		{"zero F where the rate underflows", 0, -1e5, MoistHeat(), 0},
	}
	for _, c := range cases {
		got, err := EquivalentMinutes(c.f, c.celsius, c.ref)
		if err != nil {
			t.Fatal(err)
		}
		near(t, c.name, got, c.want, 1e-300, 1e-13)
	}
	for _, c := range []struct {
		f, celsius float64
		ref        Reference
		want       error
	}{
		{-1, 121, MoistHeat(), ErrNegativeF},
		{math.NaN(), 121, MoistHeat(), ErrNonFinite},
		{1, math.Inf(-1), MoistHeat(), ErrNonFinite},
		{1, -10000, MoistHeat(), ErrOverflow},
		{1, 121, Reference{TRef: 121, Z: -1}, ErrInvalidReference},
	} {
		if _, err := EquivalentMinutes(c.f, c.celsius, c.ref); !errors.Is(err, c.want) {
			t.Errorf("EquivalentMinutes(%g, %g, %v): %v, want %v", c.f, c.celsius, c.ref, err, c.want)
		}
	}
}
