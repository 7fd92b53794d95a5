package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// addReferenceSeeds adds every case of the project's reference files as a
// one-case file, and a few malformed files, to the seed corpus.
func addReferenceSeeds(f *testing.F) {
	f.Helper()
	paths, err := filepath.Glob("../../testdata/reference/*.json")
	if err != nil || len(paths) == 0 {
		f.Fatalf("no reference files: %v", err)
	}
	for _, p := range paths {
		b, err := os.ReadFile(p)
		if err != nil {
			f.Fatal(err)
		}
		var cases []json.RawMessage
		if err := json.Unmarshal(b, &cases); err != nil {
			f.Fatalf("%s: %v", p, err)
		}
		for _, c := range cases {
			f.Add([]byte("[" + string(c) + "]"))
		}
	}
	for _, s := range []string{``, `[]`, `{}`, `[{"id":"a","id":"b"}]`, `[1e999]`, `[{"id":"x","method":"fraction.mle","source":"s","input":{"log10_n0":6,"exposures":[[1,2.5,1]]},"expect_error":true}]`} {
		f.Add([]byte(s))
	}
}

// maxFuzzFile bounds a fuzzed file, so that each input costs at most some
// hundreds of microseconds to parse and run.
const maxFuzzFile = 8 << 10

// FuzzParseFile checks that the case parser never panics on any bytes,
// names the file in every refusal, and that what it accepts is a valid
// list of cases: each with an id, a known method, a source and exactly one
// of expect (every field with a tolerance) and expect_error.
func FuzzParseFile(f *testing.F) {
	addReferenceSeeds(f)
	methods := allMethods()
	f.Fuzz(func(t *testing.T, b []byte) {
		if len(b) > maxFuzzFile {
			return
		}
		cases, err := parseFile("fuzz.json", b, methods)
		if err != nil {
			if !strings.HasPrefix(err.Error(), "fuzz.json") {
				t.Fatalf("refusal does not name the file: %v", err)
			}
			return
		}
		ids := map[string]bool{}
		for i, c := range cases {
			m, ok := methods[c.Method]
			switch {
			case !ok || strings.TrimSpace(c.ID) == "" || strings.TrimSpace(c.Source) == "" || ids[c.ID]:
				t.Fatalf("case %d accepted with method %q, id %q, source %q", i, c.Method, c.ID, c.Source)
			case c.ExpectError == (len(c.Expect) > 0):
				t.Fatalf("case %d: expect_error %v with %d expected fields", i, c.ExpectError, len(c.Expect))
			}
			ids[c.ID] = true
			for _, tl := range c.Expect {
				if !tl.HasAbs && !tl.HasRel || tl.Abs < 0 || tl.Rel < 0 {
					t.Fatalf("case %d: tolerance %+v", i, tl)
				}
			}
			for _, p := range m.Inputs {
				if !p.Optional && !c.Input.Has(p.Name) {
					t.Fatalf("case %d: required input %s missing", i, p.Name)
				}
			}
		}
	})
}

// FuzzRunCases parses arbitrary files and runs every case they hold with
// the real methods, calling Run directly (not through runSafely, which
// would hide a panic): no method may panic on any input the parser
// accepts, and check must report on every case.
func FuzzRunCases(f *testing.F) {
	addReferenceSeeds(f)
	methods := allMethods()
	f.Fuzz(func(t *testing.T, b []byte) {
		if len(b) > maxFuzzFile {
			return
		}
		cases, err := parseFile("fuzz.json", b, methods)
		if err != nil {
			return
		}
		for _, c := range cases {
			m := methods[c.Method]
			out, err := m.Run(c.Input)
			if err == nil {
				for k := range out {
					if !contains(m.Outputs, k) {
						t.Fatalf("%s returned %q, not one of its outputs %v", m.Name, k, m.Outputs)
					}
				}
			}
			line, _ := c.check(m)
			if !strings.Contains(line, c.ID) || strings.Contains(line, "panic:") {
				t.Fatalf("report line %q", line)
			}
		}
	})
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
