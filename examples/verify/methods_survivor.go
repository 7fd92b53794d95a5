package main

import (
	"fmt"

	"github.com/dzf-go/dzf/survivor"
)

// survivorMethods lists the runner's survivor.* methods.
func survivorMethods() []method {
	return []method{{
		Name:    "survivor.loglinear",
		Inputs:  []param{{Name: "points", Kind: kindRows, RowLen: 2}, levelParam},
		Outputs: []string{"d", "d_lower", "d_upper", "log10_n0", "slope", "r2", "residual_sd"},
		Run:     runLoglinear,
	}}
}

// runLoglinear fits the survivor curve with the library's defaults (a zero
// count is refused, never left out) at the case's level.
func runLoglinear(in inputs) (map[string]float64, error) {
	level := in.Num("level")
	// survivor.Settings reads a zero level as "default": a case that writes
	// 0 must be refused, not computed at 0.95.
	if !(level > 0 && level < 1) {
		return nil, fmt.Errorf("level %v is outside (0, 1)", level)
	}
	rows := in.Rows("points")
	obs := make([]survivor.Observation, len(rows))
	for i, r := range rows {
		obs[i] = survivor.Observation{Minutes: r[0], Count: r[1]}
	}
	res, err := survivor.Fit(obs, &survivor.Settings{Level: level})
	if err != nil {
		return nil, err
	}
	return map[string]float64{
		"d":           res.D.Value,
		"d_lower":     res.D.Lower,
		"d_upper":     res.D.Upper,
		"log10_n0":    res.Log10N0.Value,
		"slope":       res.Slope,
		"r2":          res.RSquared,
		"residual_sd": res.ResidualSD,
	}, nil
}
