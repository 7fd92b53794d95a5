package survivor

import (
	"encoding/json"
	"fmt"
	"math"
)

// jsonNum is a float64 that marshals non-finite values as the strings
// "NaN", "+Inf" and "-Inf" (encoding/json refuses them as numbers) and reads
// them back, as resistance.Estimate does.
type jsonNum float64

func (f jsonNum) MarshalJSON() ([]byte, error) {
	v := float64(f)
	switch {
	case math.IsNaN(v):
		return []byte(`"NaN"`), nil
	case math.IsInf(v, 1):
		return []byte(`"+Inf"`), nil
	case math.IsInf(v, -1):
		return []byte(`"-Inf"`), nil
	}
	return json.Marshal(v) // the number exactly as encoding/json writes a float64
}

func (f *jsonNum) UnmarshalJSON(b []byte) error {
	var s string
	if err := json.Unmarshal(b, &s); err == nil {
		switch s {
		case "NaN":
			*f = jsonNum(math.NaN())
		case "Inf", "+Inf":
			*f = jsonNum(math.Inf(1))
		case "-Inf":
			*f = jsonNum(math.Inf(-1))
		default:
			return fmt.Errorf("survivor: %q is not a number", s)
		}
		return nil
	}
	var v float64
	if err := json.Unmarshal(b, &v); err != nil {
		return err
	}
	*f = jsonNum(v)
	return nil
}
