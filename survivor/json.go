package survivor

import "github.com/dzf-go/dzf/internal/jsonnum"

// jsonNum is a float64 that marshals non-finite values as the strings
// "NaN", "+Inf" and "-Inf" (encoding/json refuses them as numbers) and reads
// them back, as resistance.Estimate does.
type jsonNum = jsonnum.Float
