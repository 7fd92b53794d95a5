package main

import (
	"fmt"

	"github.com/dzf-go/dzf/lethality"
)

// lethalityMethods lists the runner's lethality.* methods.
func lethalityMethods() []method {
	num := func(name string) param { return param{Name: name, Kind: kindNumber} }
	ref := func(in inputs) lethality.Reference {
		return lethality.Reference{TRef: in.Num("t_ref"), Z: in.Num("z")}
	}
	return []method{
		{
			Name:    "lethality.rate",
			Inputs:  []param{num("celsius"), num("t_ref"), num("z")},
			Outputs: []string{"rate"},
			Run: func(in inputs) (map[string]float64, error) {
				l, err := lethality.LethalRate(in.Num("celsius"), ref(in))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"rate": l}, nil
			},
		},
		{
			Name: "lethality.f",
			Inputs: []param{
				{Name: "samples", Kind: kindRows, RowLen: 2},
				num("t_ref"), num("z"),
				{Name: "rule", Kind: kindString},
			},
			Outputs: []string{"f"},
			Run: func(in inputs) (map[string]float64, error) {
				rule := lethality.Rule(in.Str("rule"))
				switch rule {
				case lethality.Rectangle, lethality.Trapezoid, lethality.Exact:
				default:
					// The library reads an empty rule as exact; the case
					// format names the rule always.
					return nil, fmt.Errorf("rule %q: %w", in.Str("rule"), lethality.ErrUnknownRule)
				}
				rows := in.Rows("samples")
				samples := make([]lethality.Sample, len(rows))
				for i, r := range rows {
					samples[i] = lethality.Sample{Minutes: r[0], Celsius: r[1]}
				}
				res, err := lethality.F(samples, ref(in), &lethality.FSettings{Rule: rule})
				if err != nil {
					return nil, err
				}
				return map[string]float64{"f": res.F}, nil
			},
		},
		{
			Name:    "lethality.equivalent_time",
			Inputs:  []param{num("f"), num("celsius"), num("t_ref"), num("z")},
			Outputs: []string{"minutes"},
			Run: func(in inputs) (map[string]float64, error) {
				m, err := lethality.EquivalentMinutes(in.Num("f"), in.Num("celsius"), ref(in))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"minutes": m}, nil
			},
		},
		{
			Name:    "lethality.sal",
			Inputs:  []param{num("log10_n0"), num("f"), num("d")},
			Outputs: []string{"log10_survivors", "pnsu", "log10_pnsu"},
			Run: func(in inputs) (map[string]float64, error) {
				s, err := lethality.Survivors(in.Num("log10_n0"), in.Num("f"), in.Num("d"))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"log10_survivors": s.Log10Survivors, "pnsu": s.PNSU, "log10_pnsu": s.Log10PNSU}, nil
			},
		},
		{
			Name:    "lethality.required_f",
			Inputs:  []param{num("log10_n0"), num("d"), num("log10_sal")},
			Outputs: []string{"f"},
			Run: func(in inputs) (map[string]float64, error) {
				f, err := lethality.RequiredF(in.Num("log10_n0"), in.Num("d"), in.Num("log10_sal"))
				if err != nil {
					return nil, err
				}
				return map[string]float64{"f": f}, nil
			},
		},
	}
}
