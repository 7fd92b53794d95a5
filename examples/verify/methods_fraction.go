package main

import (
	"fmt"

	"github.com/dzf-go/dzf/fraction"
)

// fractionMethods lists the runner's fraction.* methods.
func fractionMethods() []method {
	population := param{Name: "log10_n0", Kind: kindNumber}
	exposures := param{Name: "exposures", Kind: kindRows, RowLen: 3}
	hskOutputs := []string{"mean_time", "variance", "d", "d_lower", "d_upper"}
	hsk := func(f func(float64, []fraction.Exposure) (fraction.HSKResult, error)) func(in inputs) (map[string]float64, error) {
		return func(in inputs) (map[string]float64, error) {
			exp, err := exposureRows(in.Rows("exposures"))
			if err != nil {
				return nil, err
			}
			r, err := f(in.Num("log10_n0"), exp)
			if err != nil {
				return nil, err
			}
			return map[string]float64{
				"mean_time": r.MeanTime, "variance": r.Variance,
				"d": r.Estimate.Value, "d_lower": r.Estimate.Lower, "d_upper": r.Estimate.Upper,
			}, nil
		}
	}
	return []method{
		{Name: "fraction.hsk", Inputs: []param{population, exposures}, Outputs: hskOutputs, Run: hsk(fraction.HSK)},
		{Name: "fraction.limited_hsk", Inputs: []param{population, exposures}, Outputs: hskOutputs, Run: hsk(fraction.LimitedHSK)},
		{
			Name:    "fraction.smc",
			Inputs:  []param{population, exposures, {Name: "at", Kind: kindNumber, Optional: true}},
			Outputs: []string{"d"},
			Run: func(in inputs) (map[string]float64, error) {
				exp, err := exposureRows(in.Rows("exposures"))
				if err != nil {
					return nil, err
				}
				var r fraction.SMCResult
				if in.Has("at") {
					r, err = fraction.SMCAt(in.Num("log10_n0"), exp, in.Num("at"))
				} else {
					r, err = fraction.SMC(in.Num("log10_n0"), exp)
				}
				if err != nil {
					return nil, err
				}
				return map[string]float64{"d": r.Estimate.Value}, nil
			},
		},
		{
			Name:    "fraction.mle",
			Inputs:  []param{population, exposures, {Name: "fit_n0", Kind: kindBool, Optional: true, Default: false}, levelParam},
			Outputs: []string{"d", "d_lower", "d_upper", "log10_n0", "deviance"},
			Run: func(in inputs) (map[string]float64, error) {
				exp, err := exposureRows(in.Rows("exposures"))
				if err != nil {
					return nil, err
				}
				level := in.Num("level")
				if level == 0 { // the library reads 0 as its default; the format asks for (0, 1)
					return nil, fmt.Errorf("level 0 is outside (0, 1)")
				}
				r, err := fraction.MLE(in.Num("log10_n0"), exp, &fraction.MLESettings{FitN0: in.Bool("fit_n0"), Level: level})
				if err != nil {
					return nil, err
				}
				return map[string]float64{
					"d": r.Estimate.Value, "d_lower": r.Estimate.Lower, "d_upper": r.Estimate.Upper,
					"log10_n0": r.Log10N0, "deviance": r.Deviance,
				}, nil
			},
		},
	}
}

// exposureRows converts rows [minutes, units, negative] to exposures,
// refusing counts that are not whole numbers.
func exposureRows(rows [][]float64) ([]fraction.Exposure, error) {
	out := make([]fraction.Exposure, len(rows))
	for i, r := range rows {
		units, err := wholeNumber(fmt.Sprintf("exposure %d: units", i+1), r[1])
		if err != nil {
			return nil, err
		}
		neg, err := wholeNumber(fmt.Sprintf("exposure %d: negative", i+1), r[2])
		if err != nil {
			return nil, err
		}
		out[i] = fraction.Exposure{Minutes: r[0], Units: units, Negative: neg}
	}
	return out, nil
}
