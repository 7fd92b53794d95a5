package main

import (
	"fmt"
	"math"
)

// kind is the JSON type an input key takes.
type kind int

const (
	kindNumber kind = iota // a JSON number or "NaN", "Inf", "+Inf", "-Inf"
	kindBool               // true or false
	kindString             // any JSON string
	kindRows               // an array of rows, each an array of RowLen numbers
)

func (k kind) String() string {
	switch k {
	case kindNumber:
		return "number"
	case kindBool:
		return "boolean"
	case kindString:
		return "string"
	case kindRows:
		return "array of rows"
	}
	return "unknown"
}

// param describes one input key of a method.
//
// A param with Optional false is required. An optional param with a non-nil
// Default takes that value when absent (float64, bool or string to match its
// kind); an optional param with a nil Default is simply absent, which the
// method's Run checks with inputs.Has.
type param struct {
	Name     string
	Kind     kind
	RowLen   int // for kindRows: the length of every row
	Optional bool
	Default  any
}

// method is one computation a reference case can name.
type method struct {
	Name    string
	Inputs  []param
	Outputs []string // the keys an "expect" object may hold
	// Run computes the outputs from validated inputs. An error means the
	// library (or the adapter, for inputs it cannot pass on, such as a
	// fractional number of units) refused the input. Run returns every key
	// of Outputs it can; a key missing from the result fails the case that
	// expects it.
	Run func(in inputs) (map[string]float64, error)
}

// levelParam is the optional confidence-level input shared by several
// methods. It is read only: methods copy it into their input lists.
var levelParam = param{Name: "level", Kind: kindNumber, Optional: true, Default: 0.95}

// inputs holds a case's validated input values.
type inputs struct {
	values map[string]any // float64, bool, string or [][]float64
}

// Has reports whether the key was given (or has a default).
func (in inputs) Has(name string) bool { _, ok := in.values[name]; return ok }

// Num returns a number input (NaN when absent).
func (in inputs) Num(name string) float64 {
	if v, ok := in.values[name].(float64); ok {
		return v
	}
	return math.NaN()
}

// Bool returns a boolean input (false when absent).
func (in inputs) Bool(name string) bool { v, _ := in.values[name].(bool); return v }

// Str returns a string input ("" when absent).
func (in inputs) Str(name string) string { v, _ := in.values[name].(string); return v }

// Rows returns a rows input (nil when absent).
func (in inputs) Rows(name string) [][]float64 { v, _ := in.values[name].([][]float64); return v }

// wholeNumber converts a row entry that must be a count of units to int,
// refusing non-integral or out-of-range values (an input error, reported as
// a refusal, not as a malformed file: the JSON type is right).
func wholeNumber(what string, v float64) (int, error) {
	if math.IsNaN(v) || math.IsInf(v, 0) || v != math.Trunc(v) || math.Abs(v) > 1<<40 {
		return 0, fmt.Errorf("%s %v is not a whole number", what, v)
	}
	return int(v), nil
}

// allMethods lists every method the runner knows, by family. Each family's
// file (methods_*.go) supplies its list.
func allMethods() map[string]method {
	m := map[string]method{}
	for _, family := range [][]method{survivorMethods(), fractionMethods(), resistanceMethods(), lethalityMethods()} {
		for _, x := range family {
			m[x.Name] = x
		}
	}
	return m
}
