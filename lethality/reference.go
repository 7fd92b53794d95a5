package lethality

import (
	"fmt"
	"math"
)

// Reference is the reference temperature and z-value against which a lethal
// rate and an F-value are expressed.
//
// TRef is in °C, Z in °C (the temperature change for a tenfold change of
// the lethal rate). Name and Status are descriptive: Name labels the preset
// (for example "F0"), Status says where its numbers come from. A Reference
// is a plain value: build one for any process, or start from a preset and
// change its fields.
type Reference struct {
	Name   string  `json:"name,omitempty"`
	TRef   float64 `json:"t_ref"`
	Z      float64 `json:"z"`
	Status string  `json:"status,omitempty"`
}

// MoistHeat returns the moist-heat F0 reference: T_ref 121.1 °C, z 10 °C
// (the common definition of F0; from memory of the European Pharmacopoeia's
// chapter 5.1.5 on the F0 concept — verify).
func MoistHeat() Reference {
	return Reference{Name: "F0", TRef: 121.1, Z: 10,
		Status: "moist-heat F0 as commonly defined: 121.1 °C, z 10 °C"}
}

// MoistHeat121 returns the moist-heat reference at 121 °C, z 10 °C, as some
// pharmacopoeial texts define F0. F-values against it are larger than
// against [MoistHeat] by the factor 10^(0.1/10) ≈ 1.023.
func MoistHeat121() Reference {
	return Reference{Name: "F0 (121 °C)", TRef: 121, Z: 10,
		Status: "moist heat at 121 °C, z 10 °C, as some pharmacopoeial texts define it"}
}

// DryHeat returns the dry-heat reference T_ref 170 °C, z 20 °C (F_H).
// The numbers are from memory of common dry-heat practice and have not been
// checked against a standard here: verify them against the text that
// governs the process, and override the fields where they differ.
func DryHeat() Reference {
	return Reference{Name: "FH", TRef: 170, Z: 20,
		Status: "from memory (dry heat 170 °C, z 20 °C): verify against the governing text"}
}

// Depyrogenation returns the dry-heat depyrogenation reference for
// endotoxin, T_ref 250 °C, z 46.4 °C (F_D). The numbers are from memory and
// have not been checked against a standard here: verify them, and override
// the fields where they differ.
func Depyrogenation() Reference {
	return Reference{Name: "FD", TRef: 250, Z: 46.4,
		Status: "from memory (depyrogenation 250 °C, z 46.4 °C): verify against the governing text"}
}

// Validate reports whether the reference can be used: TRef finite, Z finite
// and > 0. The error wraps ErrInvalidReference.
func (r Reference) Validate() error {
	if !finite(r.TRef) || !finite(r.Z) || r.Z <= 0 {
		return fmt.Errorf("reference T_ref %g °C, z %g °C: %w", r.TRef, r.Z, ErrInvalidReference)
	}
	return nil
}

// Rate returns the lethal rate at the given temperature (°C):
//
//	L = 10^((T − T_ref)/z)
//
// One minute at T is worth L minutes at T_ref. Rate does not validate the
// reference (see Validate); special cases are:
//
//	Rate(NaN) = NaN
//	Rate(+Inf) = +Inf, and +Inf when L overflows float64
//	Rate(-Inf) = 0, and 0 when L underflows
func (r Reference) Rate(celsius float64) float64 {
	return math.Pow(10, (celsius-r.TRef)/r.Z)
}

// String formats the reference as "F0: T_ref 121.1 °C, z 10 °C".
func (r Reference) String() string {
	name := r.Name
	if name == "" {
		name = "reference"
	}
	return fmt.Sprintf("%s: T_ref %g °C, z %g °C", name, r.TRef, r.Z)
}

// EquivalentMinutes returns the exposure at the given temperature (°C) that
// delivers the lethality f (minutes at T_ref):
//
//	minutes = F / L(T) = F · 10^((T_ref − T)/z)
//
// It refuses an invalid reference (ErrInvalidReference), a non-finite
// argument (ErrNonFinite), a negative F (ErrNegativeF) and a result that
// overflows (ErrOverflow: the temperature is so far below T_ref that no
// finite exposure delivers F).
func EquivalentMinutes(f, celsius float64, ref Reference) (float64, error) {
	if err := ref.Validate(); err != nil {
		return 0, err
	}
	if !finite(f) || !finite(celsius) {
		return 0, fmt.Errorf("equivalent time for F %g min at %g °C: %w", f, celsius, ErrNonFinite)
	}
	if f < 0 {
		return 0, fmt.Errorf("equivalent time for F %g min: %w", f, ErrNegativeF)
	}
	if f == 0 {
		return 0, nil
	}
	m := f * math.Pow(10, (ref.TRef-celsius)/ref.Z)
	if math.IsInf(m, 0) || math.IsNaN(m) {
		return 0, fmt.Errorf("equivalent time for F %g min at %g °C against %v: %w", f, celsius, ref, ErrOverflow)
	}
	return m, nil
}

// finite reports whether v is neither NaN nor ±Inf.
func finite(v float64) bool { return v-v == 0 }

// LethalRate returns the lethal rate at celsius against ref (see
// Reference.Rate), refusing an invalid reference (ErrInvalidReference), a
// non-finite temperature (ErrNonFinite) and a rate that overflows float64
// (ErrOverflow). A rate that underflows is 0.
func LethalRate(celsius float64, ref Reference) (float64, error) {
	if err := ref.Validate(); err != nil {
		return 0, err
	}
	if !finite(celsius) {
		return 0, fmt.Errorf("lethal rate at %g °C: %w", celsius, ErrNonFinite)
	}
	l := ref.Rate(celsius)
	if math.IsInf(l, 0) {
		return 0, fmt.Errorf("lethal rate at %g °C against %v: %w", celsius, ref, ErrOverflow)
	}
	return l, nil
}
