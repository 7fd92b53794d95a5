package resistance

import (
	"fmt"
	"math"
)

// Modality is the sterilization process an indicator is made for.
type Modality string

// Modalities of the label check. The zero value means not stated.
const (
	MoistHeat     Modality = "moist heat"
	EthyleneOxide Modality = "ethylene oxide"
	DryHeat       Modality = "dry heat"
	OtherModality Modality = "other"
)

// Profile is a set of minimum-performance requirements for indicators of one
// modality, as a standard or guidance states them. Status says where the
// numbers come from and how far they have been verified; it is written as
// the source of every finding the profile gives.
//
// A zero minimum is not checked. Celsius is the temperature at which MinD
// applies; 0 means the profile fixes none and MinD applies at the label's
// conditions (the case of ethylene oxide, whose D-values are stated at a
// temperature, gas concentration and humidity together).
type Profile struct {
	Name          string   `json:"name"`
	Status        string   `json:"status"`
	Modality      Modality `json:"modality"`
	Celsius       float64  `json:"celsius"`
	MinPopulation float64  `json:"min_population"` // spores per unit
	MinD          float64  `json:"min_d"`          // minutes
	MinZ          float64  `json:"min_z"`          // °C
}

const fdaStatus = "FDA 2007 BI 510(k) guidance, Table 3, as quoted secondarily; not re-read from the guidance — verify"

// FDASteamProfile returns the steam row of Table 3 of the FDA 2007
// biological-indicator 510(k) guidance, as quoted secondarily: moist heat at
// 121 °C, population ≥ 10⁵ per unit, D121 ≥ 1.5 min, z ≥ 10 °C. Verify
// against the guidance before relying on it.
func FDASteamProfile() Profile {
	return Profile{Name: "FDA 2007 Table 3, steam", Status: fdaStatus, Modality: MoistHeat, Celsius: 121, MinPopulation: 1e5, MinD: 1.5, MinZ: 10}
}

// FDAEthyleneOxideProfile returns the ethylene oxide row of Table 3 of the
// FDA 2007 biological-indicator 510(k) guidance, as quoted secondarily:
// population ≥ 10⁶ per unit, D ≥ 3 min at the label's conditions (the
// profile fixes no temperature). Verify against the guidance before relying
// on it.
func FDAEthyleneOxideProfile() Profile {
	return Profile{Name: "FDA 2007 Table 3, ethylene oxide", Status: fdaStatus + "; the D conditions (temperature, gas concentration, humidity) are not stated here", Modality: EthyleneOxide, MinPopulation: 1e6, MinD: 3}
}

// FDADryHeatProfile returns the dry-heat row of Table 3 of the FDA 2007
// biological-indicator 510(k) guidance, as quoted secondarily: dry heat at
// 160 °C, population ≥ 10⁶ per unit, D160 ≥ 3 min. Verify against the
// guidance before relying on it.
func FDADryHeatProfile() Profile {
	return Profile{Name: "FDA 2007 Table 3, dry heat", Status: fdaStatus, Modality: DryHeat, Celsius: 160, MinPopulation: 1e6, MinD: 3}
}

// ISOMoistHeatProfile returns moist-heat minimums recalled from ISO 11138-3:
// population ≥ 10⁵ per unit, D121 ≥ 1.5 min, z ≥ 6 °C. They are from memory
// of the standard and must be verified against it before use.
func ISOMoistHeatProfile() Profile {
	return Profile{Name: "ISO 11138-3 moist heat (from memory)", Status: "from memory of ISO 11138-3 — verify against the standard", Modality: MoistHeat, Celsius: 121, MinPopulation: 1e5, MinD: 1.5, MinZ: 6}
}

// check validates the profile against the label it is applied to.
func (p Profile) check(l Label) error {
	if p.Modality != l.Modality {
		return fmt.Errorf("profile %q is for %q, the label for %q: %w", p.Name, p.Modality, l.Modality, ErrProfile)
	}
	for _, v := range []struct {
		name string
		x    float64
	}{{"temperature", p.Celsius}, {"minimum population", p.MinPopulation}, {"minimum D", p.MinD}, {"minimum z", p.MinZ}} {
		if !finite(v.x) || (v.name != "temperature" && v.x < 0) {
			return fmt.Errorf("profile %q %s %v: %w", p.Name, v.name, v.x, ErrProfile)
		}
	}
	if p.MinPopulation == 0 && p.MinD == 0 && p.MinZ == 0 {
		return fmt.Errorf("profile %q states no minimum: %w", p.Name, ErrProfile)
	}
	return nil
}

// sameTemperature reports whether two stated temperatures are the same to
// within 0.05 °C (the rounding of a label's one decimal).
func sameTemperature(a, b float64) bool { return math.Abs(a-b) <= 0.05 }
