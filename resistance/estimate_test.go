package resistance

import (
	"encoding/json"
	"errors"
	"math"
	"testing"
)

func TestEstimateJSON(t *testing.T) {
	in := Estimate{Value: 10.2, Lower: 1.1, Upper: math.Inf(1), Level: 0.95, Method: "z fit", Warnings: []string{"unbounded"}}
	b, err := json.Marshal(in)
	if err != nil {
		t.Fatal(err)
	}
	if want := `{"value":10.2,"lower":1.1,"upper":"+Inf","level":0.95,"method":"z fit","warnings":["unbounded"]}`; string(b) != want {
		t.Errorf("JSON %s, want %s", b, want)
	}
	var back Estimate
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	near(t, "upper back", back.Upper, math.Inf(1), 0)
	near(t, "value back", back.Value, 10.2, 0)
	for _, c := range []struct {
		in   string
		want float64
	}{
		{`{"value":"NaN"}`, math.NaN()},
		{`{"value":"Inf"}`, math.Inf(1)},
		{`{"value":"-Inf"}`, math.Inf(-1)},
		{`{"value":2.5}`, 2.5},
	} {
		var e Estimate
		if err := json.Unmarshal([]byte(c.in), &e); err != nil {
			t.Errorf("%s: %v", c.in, err)
			continue
		}
		near(t, c.in, e.Value, c.want, 0)
	}
	var e Estimate
	if err := json.Unmarshal([]byte(`{"value":"many"}`), &e); err == nil {
		t.Error(`"many" read as a number`)
	}
	var syn *json.SyntaxError
	if err := json.Unmarshal([]byte(`{"value":`), &e); !errors.As(err, &syn) {
		t.Errorf("truncated JSON: %v", err)
	}
}

func TestRelativeHalfWidth(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	for _, c := range []struct {
		name string
		e    Estimate
		want float64
	}{
		// Hand-worked: max(|v − lo|, |hi − v|)/|v|.
		{"symmetric", Estimate{Value: 2, Lower: 1.8, Upper: 2.2}, 0.1},
		{"upper side wider", Estimate{Value: 2, Lower: 1.9, Upper: 2.5}, 0.25},
		{"unbounded", Estimate{Value: 2, Lower: 1.9, Upper: inf}, inf},
		{"no limits", Estimate{Value: 2, Lower: nan, Upper: nan}, nan},
		{"zero value", Estimate{Value: 0, Lower: -1, Upper: 1}, nan},
	} {
		near(t, c.name, c.e.RelativeHalfWidth(), c.want, 1e-14)
	}
}

func TestEstimateString(t *testing.T) {
	s := Estimate{Value: 1.84, Lower: 1.74, Upper: 1.95, Level: 0.95, Method: "survivor curve", Warnings: []string{"r² 0.79"}}.String()
	if want := "1.84 (1.74 – 1.95, 95 %) survivor curve\n  warning: r² 0.79"; s != want {
		t.Errorf("String %q, want %q", s, want)
	}
}
