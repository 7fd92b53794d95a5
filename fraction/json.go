package fraction

import "github.com/dzf-go/dzf/internal/jsonnum"

// number is a float64 that marshals non-finite values as the strings "NaN",
// "+Inf" and "-Inf", as resistance.Estimate does (encoding/json refuses
// non-finite numbers).
type number = jsonnum.Float
