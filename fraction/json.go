package fraction

import (
	"math"
	"strconv"
)

// number is a float64 that marshals non-finite values as the strings "NaN",
// "+Inf" and "-Inf", as resistance.Estimate does (encoding/json refuses
// non-finite numbers).
type number float64

// MarshalJSON implements json.Marshaler.
func (f number) MarshalJSON() ([]byte, error) {
	v := float64(f)
	switch {
	case math.IsNaN(v):
		return []byte(`"NaN"`), nil
	case math.IsInf(v, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(v, -1):
		return []byte(`"-Inf"`), nil
	}
	return strconv.AppendFloat(nil, v, 'g', -1, 64), nil
}
