package apicheck

import (
	"errors"
	"strings"
	"testing"
)

// Refusal is one input a package's sentinel test feeds to the public API:
// the sentinel's name and value, the call, and a piece of text the error
// message must hold (the offending input). It is an alias of a plain struct
// type so that the tests' tables can be written without field names.
type Refusal = struct {
	Name string
	Err  error
	Call func() error
	Msg  string
}

// CheckSentinels runs a package's sentinel test. Each refusal's call must
// return an error that wraps its sentinel and exactly one of sentinels (the
// package's list, as its fuzz tests use it), with Msg in the message; then
// the package's variables in dir are held to Audit, with readOnly the
// read-only tables, and the sentinels declared must be those listed.
func CheckSentinels(t testing.TB, dir string, sentinels []error, readOnly map[string]bool, cases []Refusal) {
	t.Helper()
	vars, err := PackageVars(dir)
	if err != nil {
		t.Fatal(err)
	}
	listed := map[error]bool{}
	for _, s := range sentinels {
		listed[s] = true
	}
	reached := map[string]bool{}
	for _, c := range cases {
		err := c.Call()
		n := 0
		for _, s := range sentinels {
			if errors.Is(err, s) {
				n++
			}
		}
		switch {
		case !errors.Is(err, c.Err):
			t.Errorf("%s: error %v", c.Name, err)
		case !strings.Contains(err.Error(), c.Msg):
			t.Errorf("%s: message %q does not name %q", c.Name, err, c.Msg)
		case n != 1:
			t.Errorf("%s: %q wraps %d of the package's sentinels, want 1", c.Name, err, n)
		}
		if !listed[c.Err] {
			t.Errorf("%s is missing from the package's sentinel list", c.Name)
		}
		reached[c.Name] = true
	}
	problems, declared := Audit(vars, reached, readOnly)
	for _, p := range problems {
		t.Errorf("%s", p)
	}
	if declared != len(sentinels) {
		t.Errorf("%d sentinels declared, %d listed", declared, len(sentinels))
	}
}
