package lab

import (
	"math"
	"strconv"
	"strings"

	"github.com/dzf-go/dzf/internal/jsonnum"
)

// Num is a float64 that marshals to JSON like resistance.Estimate's
// numbers: finite values as numbers, NaN, +Inf and -Inf as the strings
// "NaN", "+Inf" and "-Inf" (encoding/json refuses non-finite numbers).
type Num = jsonnum.Float

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
