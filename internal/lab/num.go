package lab

import (
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Num is a float64 that marshals to JSON like resistance.Estimate's
// numbers: finite values as numbers, NaN, +Inf and -Inf as the strings
// "NaN", "+Inf" and "-Inf" (encoding/json refuses non-finite numbers).
type Num float64

// MarshalJSON implements json.Marshaler.
func (n Num) MarshalJSON() ([]byte, error) {
	v := float64(n)
	switch {
	case math.IsNaN(v):
		return []byte(`"NaN"`), nil
	case math.IsInf(v, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(v, -1):
		return []byte(`"-Inf"`), nil
	}
	return json.Marshal(v)
}

// UnmarshalJSON implements json.Unmarshaler, reading numbers and the
// strings "NaN", "Inf", "+Inf" and "-Inf".
func (n *Num) UnmarshalJSON(b []byte) error {
	var s string
	if json.Unmarshal(b, &s) == nil {
		switch s {
		case "NaN":
			*n = Num(math.NaN())
		case "Inf", "+Inf":
			*n = Num(math.Inf(1))
		case "-Inf":
			*n = Num(math.Inf(-1))
		default:
			return fmt.Errorf("lab: %q is not a number", s)
		}
		return nil
	}
	var v float64
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*n = Num(v)
	return nil
}

// Format formats v with the given decimals, writing NaN as "—" (not
// given) and infinities as "+Inf" and "-Inf".
func Format(v float64, decimals int) string {
	switch {
	case math.IsNaN(v):
		return "—"
	case math.IsInf(v, 1):
		return "+Inf"
	case math.IsInf(v, -1):
		return "-Inf"
	}
	s := strconv.FormatFloat(v, 'f', decimals, 64)
	if strings.Trim(s, "-0.") == "" {
		s = strings.TrimPrefix(s, "-") // no "-0.0" for a value that rounds to zero
	}
	return s
}

// Percent formats the fraction v as a percentage with the given decimals
// ("12.5 %"), NaN as "—".
func Percent(v float64, decimals int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return Format(v*100, decimals)
	}
	return Format(v*100, decimals) + " %"
}
