package resistance

import (
	"encoding/json"
	"fmt"
	"math"

	"github.com/dzf-go/dzf/internal/jsonnum"
)

// Estimate is a D-value (or any resistance parameter) with its confidence
// limits, as every estimator of this module returns it inside its own richer
// result.
//
// Value is the point estimate, Lower and Upper the two-sided limits at
// confidence Level (for example 0.95). A limit the data cannot bound is
// ±Inf (math.Inf) and is explained in Warnings; a limit the method does not
// give is NaN. Method names the procedure that produced the estimate, with
// its source in the producing package's documentation. Warnings lists every
// broken prerequisite or doubt about the estimate; an empty list means none
// was found, not that the estimate is fit for any purpose.
//
// Estimate marshals to JSON with non-finite numbers written as the strings
// "NaN", "+Inf" and "-Inf" (encoding/json cannot write them as numbers), and
// reads them back.
type Estimate struct {
	Value    float64  `json:"value"`
	Lower    float64  `json:"lower"`
	Upper    float64  `json:"upper"`
	Level    float64  `json:"level"`
	Method   string   `json:"method"`
	Warnings []string `json:"warnings,omitempty"`
}

// String formats the estimate as "value (lower – upper, level %) method",
// or "value (no limits) method" when the method gives none, with one
// "warning:" line per warning.
func (e Estimate) String() string {
	var s string
	if math.IsNaN(e.Lower) && math.IsNaN(e.Upper) {
		s = fmt.Sprintf("%.4g (no limits) %s", e.Value, e.Method)
	} else {
		s = fmt.Sprintf("%.4g (%.4g – %.4g, %.4g %%) %s", e.Value, e.Lower, e.Upper, 100*e.Level, e.Method)
	}
	for _, w := range e.Warnings {
		s += "\n  warning: " + w
	}
	return s
}

// RelativeHalfWidth returns the larger distance from Value to a limit,
// divided by Value: 0.1 means the limits lie within 10 % of the estimate.
// It is +Inf when a limit is infinite and NaN when Value is 0 or a limit is
// NaN.
func (e Estimate) RelativeHalfWidth() float64 {
	if e.Value == 0 || math.IsNaN(e.Lower) || math.IsNaN(e.Upper) || math.IsNaN(e.Value) {
		return math.NaN()
	}
	return math.Max(math.Abs(e.Value-e.Lower), math.Abs(e.Upper-e.Value)) / math.Abs(e.Value)
}

// jsonFloat is a float64 that marshals non-finite values as strings.
type jsonFloat = jsonnum.Float

type estimateJSON struct {
	Value    jsonFloat `json:"value"`
	Lower    jsonFloat `json:"lower"`
	Upper    jsonFloat `json:"upper"`
	Level    jsonFloat `json:"level"`
	Method   string    `json:"method"`
	Warnings []string  `json:"warnings,omitempty"`
}

// MarshalJSON implements json.Marshaler, writing non-finite numbers as
// "NaN", "+Inf" or "-Inf".
func (e Estimate) MarshalJSON() ([]byte, error) {
	return json.Marshal(estimateJSON{jsonFloat(e.Value), jsonFloat(e.Lower), jsonFloat(e.Upper), jsonFloat(e.Level), e.Method, e.Warnings})
}

// UnmarshalJSON implements json.Unmarshaler, accepting numbers and the
// strings "NaN", "Inf", "+Inf" and "-Inf".
func (e *Estimate) UnmarshalJSON(b []byte) error {
	var j estimateJSON
	if err := json.Unmarshal(b, &j); err != nil {
		return err
	}
	*e = Estimate{float64(j.Value), float64(j.Lower), float64(j.Upper), float64(j.Level), j.Method, j.Warnings}
	return nil
}
