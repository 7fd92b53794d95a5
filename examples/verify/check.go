package main

import (
	"fmt"
	"math"
	"sort"
	"strings"
)

// within reports whether got matches the expectation: |got − x| ≤ max(abs,
// rel·|x|), and for an expected NaN or ±Inf, got is the same value.
func (t tolerance) within(got float64) bool {
	x := t.Value
	switch {
	case math.IsNaN(x):
		return math.IsNaN(got)
	case math.IsInf(x, 0):
		return got == x
	case math.IsNaN(got) || math.IsInf(got, 0):
		return false
	}
	return math.Abs(got-x) <= math.Max(t.Abs, t.Rel*math.Abs(x))
}

func (t tolerance) describe() string {
	var parts []string
	if t.HasAbs {
		parts = append(parts, fmt.Sprintf("abs %g", t.Abs))
	}
	if t.HasRel {
		parts = append(parts, fmt.Sprintf("rel %g", t.Rel))
	}
	return strings.Join(parts, ", ")
}

// runSafely calls m.Run, turning a panic into an error so that one broken
// computation fails its case instead of stopping the run.
func runSafely(m method, in inputs) (out map[string]float64, err error) {
	defer func() {
		if r := recover(); r != nil {
			out, err = nil, fmt.Errorf("panic: %v", r)
		}
	}()
	return m.Run(in)
}

// check runs the case and returns its report line and whether it passed.
func (c *refCase) check(m method) (string, bool) {
	out, err := runSafely(m, c.Input)
	var b strings.Builder
	ok := true
	if c.ExpectError {
		if err == nil {
			ok = false
			fmt.Fprintf(&b, "expected a refusal, got a result %s", formatOut(out))
		} else {
			fmt.Fprintf(&b, "refused as expected: %v", err)
		}
	} else if err != nil {
		ok = false
		fmt.Fprintf(&b, "expected values, got an error: %v", err)
	} else {
		for i, t := range c.Expect {
			if i > 0 {
				b.WriteString("; ")
			}
			got, present := out[t.Key]
			if !present {
				ok = false
				fmt.Fprintf(&b, "%s: expected %.10g, not computed", t.Key, t.Value)
				continue
			}
			mark := ""
			if !t.within(got) {
				ok = false
				mark = " (outside)"
			}
			fmt.Fprintf(&b, "%s: expected %.10g, got %.10g, tolerance %s%s", t.Key, t.Value, got, t.describe(), mark)
		}
	}
	status := "PASS"
	if !ok {
		status = "FAIL"
	}
	return fmt.Sprintf("%s %s [%s] %s | source: %s", status, c.ID, c.Method, b.String(), c.Source), ok
}

func formatOut(out map[string]float64) string {
	keys := make([]string, 0, len(out))
	for k := range out {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	var parts []string
	for _, k := range keys {
		parts = append(parts, fmt.Sprintf("%s=%.10g", k, out[k]))
	}
	return "{" + strings.Join(parts, ", ") + "}"
}
