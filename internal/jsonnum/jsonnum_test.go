package jsonnum

import (
	"encoding/json"
	"math"
	"testing"
)

func TestRoundTrip(t *testing.T) {
	// Expected spellings: the reference-case format (testdata/reference/FORMAT.md).
	for _, c := range []struct {
		v    float64
		want string
	}{
		{1.5, "1.5"}, {-2e-300, "-2e-300"}, {0, "0"}, {1e8, "100000000"}, {2.5e-7, "2.5e-7"},
		{math.NaN(), `"NaN"`}, {math.Inf(1), `"+Inf"`}, {math.Inf(-1), `"-Inf"`},
	} {
		b, err := json.Marshal(Float(c.v))
		if err != nil || string(b) != c.want {
			t.Errorf("Marshal(%v) = %s, %v; want %s", c.v, b, err, c.want)
			continue
		}
		var back Float
		if err := json.Unmarshal(b, &back); err != nil {
			t.Errorf("Unmarshal(%s): %v", b, err)
			continue
		}
		if got := float64(back); !(got == c.v || (math.IsNaN(got) && math.IsNaN(c.v))) {
			t.Errorf("round trip of %v gave %v", c.v, got)
		}
	}
	var f Float
	if err := json.Unmarshal([]byte(`"Inf"`), &f); err != nil || !math.IsInf(float64(f), 1) {
		t.Errorf(`"Inf": %v %v`, f, err)
	}
	for _, bad := range []string{`"inf"`, `"1.5"`, `true`, `{}`} {
		if err := json.Unmarshal([]byte(bad), &f); err == nil {
			t.Errorf("%s: no error", bad)
		}
	}
}
