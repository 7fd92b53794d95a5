package main

import (
	"fmt"

	"github.com/dzf-go/dzf/resistance"
)

// resistanceMethods lists the runner's resistance.* methods.
func resistanceMethods() []method {
	return []method{
		{
			Name: "resistance.z",
			Inputs: []param{
				{Name: "points", Kind: kindRows, RowLen: 2},
				{Name: "t_ref", Kind: kindNumber},
				levelParam,
			},
			Outputs: []string{"z", "z_lower", "z_upper", "d_ref", "r2"},
			Run:     runZ,
		},
		{
			Name: "resistance.d_at",
			Inputs: []param{
				{Name: "d_ref", Kind: kindNumber},
				{Name: "t_ref", Kind: kindNumber},
				{Name: "z", Kind: kindNumber},
				{Name: "celsius", Kind: kindNumber},
			},
			Outputs: []string{"d"},
			Run: func(in inputs) (map[string]float64, error) {
				d, err := resistance.DAt(in.Num("d_ref"), in.Num("t_ref"), in.Num("z"), in.Num("celsius"))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"d": d}, nil
			},
		},
		{
			Name: "resistance.window",
			Inputs: []param{
				{Name: "log10_n0", Kind: kindNumber},
				{Name: "d", Kind: kindNumber},
			},
			Outputs: []string{"survival_time", "kill_time"},
			Run: func(in inputs) (map[string]float64, error) {
				w, err := resistance.SurvivalKill(in.Num("log10_n0"), in.Num("d"))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"survival_time": w.Survival, "kill_time": w.Kill}, nil
			},
		},
	}
}

// runZ adapts resistance.ZFit. The method refuses fewer than three points
// (the library itself fits two, without limits, but the case's z_lower and
// z_upper need three); every other refusal is the library's.
func runZ(in inputs) (map[string]float64, error) {
	rows := in.Rows("points")
	if len(rows) < 3 {
		return nil, fmt.Errorf("resistance.z: %d point(s); the method needs three or more for limits", len(rows))
	}
	pts := make([]resistance.Point, len(rows))
	for i, r := range rows {
		pts[i] = resistance.Point{Celsius: r[0], D: resistance.Estimate{Value: r[1]}}
	}
	level := in.Num("level")
	if level == 0 {
		// ZSettings reads a zero level as the default; the format refuses it.
		return nil, fmt.Errorf("resistance.z: level 0 is outside (0, 1)")
	}
	res, err := resistance.ZFit(pts, in.Num("t_ref"), &resistance.ZSettings{Level: level})
	if err != nil {
		return nil, err
	}
	return map[string]float64{
		"z": res.Z.Value, "z_lower": res.Z.Lower, "z_upper": res.Z.Upper,
		"d_ref": res.DRef.Value, "r2": res.RSquared,
	}, nil
}
