// Package jsonnum holds the JSON form of non-finite numbers shared by every
// result type of the module: encoding/json refuses NaN and ±Inf as numbers,
// and an unbounded confidence limit is +Inf, so such values are written as
// the strings "NaN", "+Inf" and "-Inf" (the spellings of the reference-case
// format) and read back, with "Inf" accepted for "+Inf".
package jsonnum

import (
	"encoding/json"
	"fmt"
	"math"
)

// Float is a float64 whose JSON form is a number when finite and one of
// the strings "NaN", "+Inf", "-Inf" otherwise.
type Float float64

// MarshalJSON implements json.Marshaler.
func (f Float) MarshalJSON() ([]byte, error) {
	v := float64(f)
	switch {
	case math.IsNaN(v):
		return []byte(`"NaN"`), nil
	case math.IsInf(v, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(v, -1):
		return []byte(`"-Inf"`), nil
	}
	return json.Marshal(v) // as encoding/json writes a plain float64
}

// UnmarshalJSON implements json.Unmarshaler, accepting a JSON number or one
// of the strings "NaN", "Inf", "+Inf" and "-Inf".
func (f *Float) UnmarshalJSON(b []byte) error {
	var s string
	if err := json.Unmarshal(b, &s); err == nil {
		switch s {
		case "NaN":
			*f = Float(math.NaN())
		case "Inf", "+Inf":
			*f = Float(math.Inf(1))
		case "-Inf":
			*f = Float(math.Inf(-1))
		default:
			return fmt.Errorf("%q is not a number", s)
		}
		return nil
	}
	var v float64
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*f = Float(v)
	return nil
}
