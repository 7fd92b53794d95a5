package main

import (
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"sort"
	"strconv"
	"strings"
)

// tolerance is one expected output field.
type tolerance struct {
	Key    string
	Value  float64
	Abs    float64 // 0 when not given
	Rel    float64 // 0 when not given
	HasAbs bool
	HasRel bool
}

// refCase is one validated reference case.
type refCase struct {
	File        string
	ID          string
	Method      string
	Source      string
	Input       inputs
	Expect      []tolerance
	ExpectError bool
}

// malformed builds the error for a file that does not fit the format.
func malformed(file string, index int, id, key, format string, a ...any) error {
	where := file
	if index >= 0 {
		where += fmt.Sprintf(": case %d", index+1)
		if id != "" {
			where += fmt.Sprintf(" (id %q)", id)
		}
	}
	if key != "" {
		where += ": key " + key
	}
	return fmt.Errorf("%s: %s", where, fmt.Sprintf(format, a...))
}

// loadDir reads and validates every .json file of dir, in name order.
func loadDir(dir string, methods map[string]method) ([]*refCase, error) {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return nil, fmt.Errorf("folder %s: %v", dir, err)
	}
	var names []string
	for _, e := range entries {
		if !e.IsDir() && strings.HasSuffix(e.Name(), ".json") {
			names = append(names, e.Name())
		}
	}
	sort.Strings(names)
	ids := map[string]string{} // id -> file
	var out []*refCase
	for _, n := range names {
		path := filepath.Join(dir, n)
		b, err := os.ReadFile(path)
		if err != nil {
			return nil, fmt.Errorf("%s: %v", path, err)
		}
		cases, err := parseFile(path, b, methods)
		if err != nil {
			return nil, err
		}
		for i, c := range cases {
			if prev, dup := ids[c.ID]; dup {
				return nil, malformed(path, i, c.ID, "id", "repeated id (first used in %s)", prev)
			}
			ids[c.ID] = path
		}
		out = append(out, cases...)
	}
	if len(out) == 0 {
		return nil, fmt.Errorf("folder %s: no case (a folder with no case is malformed)", dir)
	}
	return out, nil
}

// parseFile validates one case file.
func parseFile(path string, b []byte, methods map[string]method) ([]*refCase, error) {
	tree, err := parseJSON(b)
	if err != nil {
		return nil, malformed(path, -1, "", "", "not valid JSON: %v", err)
	}
	arr, ok := tree.([]any)
	if !ok {
		return nil, malformed(path, -1, "", "", "the file must hold a JSON array of cases, not a %s", jsonType(tree))
	}
	var out []*refCase
	seen := map[string]bool{}
	for i, v := range arr {
		c, err := parseCase(path, i, v, methods)
		if err != nil {
			return nil, err
		}
		if seen[c.ID] {
			return nil, malformed(path, i, c.ID, "id", "repeated id")
		}
		seen[c.ID] = true
		out = append(out, c)
	}
	return out, nil
}

// caseKeys is the set of keys a case object may hold. It is read only.
var caseKeys = map[string]bool{"id": true, "method": true, "source": true, "input": true, "expect": true, "expect_error": true}

func parseCase(path string, i int, v any, methods map[string]method) (*refCase, error) {
	o, ok := v.(*object)
	if !ok {
		return nil, malformed(path, i, "", "", "a case must be an object, not a %s", jsonType(v))
	}
	c := &refCase{File: path}
	if s, ok := o.values["id"].(string); ok {
		c.ID = s
	}
	bad := func(key, format string, a ...any) error { return malformed(path, i, c.ID, key, format, a...) }
	for _, k := range o.keys {
		if !caseKeys[k] {
			return nil, bad(k, "unknown key")
		}
	}
	str := func(key string) (string, error) {
		raw, ok := o.values[key]
		if !ok {
			return "", bad(key, "missing")
		}
		s, ok := raw.(string)
		if !ok {
			return "", bad(key, "must be a string, not a %s", jsonType(raw))
		}
		if strings.TrimSpace(s) == "" {
			return "", bad(key, "must not be empty")
		}
		return s, nil
	}
	var err error
	if c.ID, err = str("id"); err != nil {
		return nil, err
	}
	if c.Method, err = str("method"); err != nil {
		return nil, err
	}
	if c.Source, err = str("source"); err != nil {
		return nil, err
	}
	m, ok := methods[c.Method]
	if !ok {
		return nil, bad("method", "unknown method %q", c.Method)
	}
	rawIn, ok := o.values["input"]
	if !ok {
		return nil, bad("input", "missing")
	}
	inObj, ok := rawIn.(*object)
	if !ok {
		return nil, bad("input", "must be an object, not a %s", jsonType(rawIn))
	}
	if c.Input, err = parseInputs(inObj, m, bad); err != nil {
		return nil, err
	}
	rawExp, hasExp := o.values["expect"]
	rawErr, hasErr := o.values["expect_error"]
	switch {
	case hasExp && hasErr:
		return nil, bad("expect_error", "a case has exactly one of expect and expect_error")
	case !hasExp && !hasErr:
		return nil, bad("expect", "missing (a case has exactly one of expect and expect_error: true)")
	case hasErr:
		b, ok := rawErr.(bool)
		if !ok {
			return nil, bad("expect_error", "must be a boolean, not a %s", jsonType(rawErr))
		}
		if !b {
			return nil, bad("expect_error", "expect_error: false is not allowed; write expect instead")
		}
		c.ExpectError = true
	default:
		if c.Expect, err = parseExpect(rawExp, m, bad); err != nil {
			return nil, err
		}
	}
	return c, nil
}

func parseInputs(o *object, m method, bad func(key, format string, a ...any) error) (inputs, error) {
	known := map[string]param{}
	for _, p := range m.Inputs {
		known[p.Name] = p
	}
	in := inputs{values: map[string]any{}}
	for _, k := range o.keys {
		p, ok := known[k]
		if !ok {
			return in, bad("input."+k, "unknown input key for method %s", m.Name)
		}
		v, err := convert(o.values[k], p, func(format string, a ...any) error { return bad("input."+k, format, a...) })
		if err != nil {
			return in, err
		}
		in.values[k] = v
	}
	for _, p := range m.Inputs {
		if _, ok := in.values[p.Name]; ok {
			continue
		}
		if !p.Optional {
			return in, bad("input."+p.Name, "missing required input of method %s", m.Name)
		}
		if p.Default != nil {
			in.values[p.Name] = p.Default
		}
	}
	return in, nil
}

// number converts a parsed JSON number or one of the strings "NaN", "Inf",
// "+Inf", "-Inf".
func number(v any) (float64, bool, string) {
	switch t := v.(type) {
	case json.Number:
		f, err := strconv.ParseFloat(string(t), 64)
		if err != nil {
			return 0, false, fmt.Sprintf("number %s is outside float64's range (write \"Inf\" or \"-Inf\")", t)
		}
		return f, true, ""
	case string:
		switch t {
		case "NaN":
			return math.NaN(), true, ""
		case "Inf", "+Inf":
			return math.Inf(1), true, ""
		case "-Inf":
			return math.Inf(-1), true, ""
		}
		return 0, false, fmt.Sprintf("string %q is not a number (only \"NaN\", \"Inf\", \"+Inf\", \"-Inf\" are)", t)
	}
	return 0, false, fmt.Sprintf("must be a number, not a %s", jsonType(v))
}

func convert(v any, p param, bad func(format string, a ...any) error) (any, error) {
	switch p.Kind {
	case kindNumber:
		f, ok, why := number(v)
		if !ok {
			return nil, bad("%s", why)
		}
		return f, nil
	case kindBool:
		b, ok := v.(bool)
		if !ok {
			return nil, bad("must be a boolean, not a %s", jsonType(v))
		}
		return b, nil
	case kindString:
		s, ok := v.(string)
		if !ok {
			return nil, bad("must be a string, not a %s", jsonType(v))
		}
		return s, nil
	case kindRows:
		arr, ok := v.([]any)
		if !ok {
			return nil, bad("must be an array of rows, not a %s", jsonType(v))
		}
		rows := make([][]float64, 0, len(arr))
		for r, rv := range arr {
			ra, ok := rv.([]any)
			if !ok {
				return nil, bad("row %d must be an array, not a %s", r+1, jsonType(rv))
			}
			if len(ra) != p.RowLen {
				return nil, bad("row %d has %d values, want %d", r+1, len(ra), p.RowLen)
			}
			row := make([]float64, p.RowLen)
			for j, x := range ra {
				f, ok, why := number(x)
				if !ok {
					return nil, bad("row %d, value %d: %s", r+1, j+1, why)
				}
				row[j] = f
			}
			rows = append(rows, row)
		}
		return rows, nil
	}
	return nil, bad("internal error: unknown kind")
}

func parseExpect(raw any, m method, bad func(key, format string, a ...any) error) ([]tolerance, error) {
	o, ok := raw.(*object)
	if !ok {
		return nil, bad("expect", "must be an object, not a %s", jsonType(raw))
	}
	if len(o.keys) == 0 {
		return nil, bad("expect", "expects nothing (a case that checks nothing cannot fail)")
	}
	outs := map[string]bool{}
	for _, k := range m.Outputs {
		outs[k] = true
	}
	var ts []tolerance
	for _, k := range o.keys {
		key := "expect." + k
		if !outs[k] {
			return nil, bad(key, "unknown expected field for method %s (known: %s)", m.Name, strings.Join(m.Outputs, ", "))
		}
		fo, ok := o.values[k].(*object)
		if !ok {
			return nil, bad(key, "must be an object {\"value\": x, \"abs\": a, \"rel\": r}, not a %s", jsonType(o.values[k]))
		}
		t := tolerance{Key: k}
		hasValue := false
		for _, tk := range fo.keys {
			f, ok, why := number(fo.values[tk])
			if !ok {
				return nil, bad(key+"."+tk, "%s", why)
			}
			switch tk {
			case "value":
				t.Value, hasValue = f, true
			case "abs", "rel":
				if math.IsNaN(f) || f < 0 {
					return nil, bad(key+"."+tk, "a tolerance must be a number ≥ 0, not %v", f)
				}
				if tk == "abs" {
					t.Abs, t.HasAbs = f, true
				} else {
					t.Rel, t.HasRel = f, true
				}
			default:
				return nil, bad(key+"."+tk, "unknown key (an expected field holds value, abs and rel)")
			}
		}
		if !hasValue {
			return nil, bad(key+".value", "missing")
		}
		if !t.HasAbs && !t.HasRel {
			return nil, bad(key, "has neither abs nor rel")
		}
		ts = append(ts, t)
	}
	return ts, nil
}
