package survivor

import (
	"encoding/json"
	"math"
	"testing"
)

func TestJSONNum(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		text string
	}{
		{math.NaN(), `"NaN"`}, {math.Inf(1), `"+Inf"`}, {math.Inf(-1), `"-Inf"`},
		{1e8, `100000000`}, {2.5e-7, `2.5e-7`}, {0, `0`},
	} {
		b, err := json.Marshal(jsonNum(tc.v))
		if err != nil || string(b) != tc.text {
			t.Errorf("Marshal(%v) = %s, %v; want %s", tc.v, b, err, tc.text)
		}
		var back jsonNum
		if err := json.Unmarshal(b, &back); err != nil {
			t.Fatal(err)
		}
		if !(float64(back) == tc.v || math.IsNaN(tc.v) && math.IsNaN(float64(back))) {
			t.Errorf("round trip of %v gave %v", tc.v, back)
		}
	}
	var v jsonNum
	if err := json.Unmarshal([]byte(`"Inf"`), &v); err != nil || !math.IsInf(float64(v), 1) {
		t.Errorf(`"Inf" read as %v, %v`, v, err)
	}
	for _, bad := range []string{`"infinity"`, `true`, `[1]`} {
		if err := json.Unmarshal([]byte(bad), &v); err == nil {
			t.Errorf("%s read without error", bad)
		}
	}
}
