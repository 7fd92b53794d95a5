package main

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// fakeMethods is a method table for testing the runner itself: test.echo
// returns its input x as output y, and refuses x = −1.
func fakeMethods() map[string]method {
	return map[string]method{
		"test.echo": {
			Name: "test.echo",
			Inputs: []param{
				{Name: "x", Kind: kindNumber},
				{Name: "rows", Kind: kindRows, RowLen: 2, Optional: true},
				levelParam,
			},
			Outputs: []string{"y", "level", "rows"},
			Run: func(in inputs) (map[string]float64, error) {
				if in.Num("x") == -1 {
					return nil, errors.New("negative x")
				}
				return map[string]float64{"y": in.Num("x"), "level": in.Num("level"), "rows": float64(len(in.Rows("rows")))}, nil
			},
		},
	}
}

// runOn writes files into a temporary folder and runs the runner on it.
func runOn(t *testing.T, files map[string]string, methods map[string]method) (int, string, string) {
	t.Helper()
	dir := t.TempDir()
	for name, body := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	var out, errOut bytes.Buffer
	code := run([]string{dir}, &out, &errOut, methods)
	return code, out.String(), errOut.String()
}

func TestRunnerPassFail(t *testing.T) {
	good := `[{"id":"a","method":"test.echo","source":"invented","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}},
	          {"id":"b","method":"test.echo","source":"invented","input":{"x":-1},"expect_error":true},
	          {"id":"c","method":"test.echo","source":"invented","input":{"x":100},"expect":{"y":{"value":101,"rel":0.02},"level":{"value":0.95,"abs":1e-15}}}]`
	code, out, _ := runOn(t, map[string]string{"a.json": good}, fakeMethods())
	if code != 0 || !strings.HasSuffix(out, "\n3 passed, 0 failed\n") {
		t.Errorf("code %d, output:\n%s", code, out)
	}
	// A wrong expectation must fail: 2 is not 2.5 within abs 0.1.
	wrong := `[{"id":"w","method":"test.echo","source":"invented","input":{"x":2},"expect":{"y":{"value":2.5,"abs":0.1}}},
	           {"id":"e","method":"test.echo","source":"invented","input":{"x":2},"expect_error":true},
	           {"id":"v","method":"test.echo","source":"invented","input":{"x":-1},"expect":{"y":{"value":-1,"abs":1}}}]`
	code, out, _ = runOn(t, map[string]string{"a.json": wrong}, fakeMethods())
	if code != 1 || !strings.HasSuffix(out, "\n0 passed, 3 failed\n") {
		t.Errorf("code %d, output:\n%s", code, out)
	}
	for _, id := range []string{"w", "e", "v"} {
		if !regexp.MustCompile(`(?m)^FAIL ` + id + ` `).MatchString(out) {
			t.Errorf("no FAIL line for %s:\n%s", id, out)
		}
	}
	if !strings.Contains(out, "Caution:") {
		t.Error("report lacks the caution")
	}
}

func TestRunnerNonFinite(t *testing.T) {
	// "NaN" and "Inf" parse as numbers; an expected NaN or Inf passes only
	// on the same value.
	f := `[{"id":"n","method":"test.echo","source":"invented","input":{"x":"NaN"},"expect":{"y":{"value":"NaN","abs":0}}},
	       {"id":"i","method":"test.echo","source":"invented","input":{"x":"Inf"},"expect":{"y":{"value":"+Inf","abs":0}}},
	       {"id":"j","method":"test.echo","source":"invented","input":{"x":"+Inf"},"expect":{"y":{"value":"Inf","rel":0}}},
	       {"id":"k","method":"test.echo","source":"invented","input":{"x":"-Inf"},"expect":{"y":{"value":"-Inf","abs":0}}},
	       {"id":"r","method":"test.echo","source":"invented","input":{"x":1,"rows":[[1,"NaN"],["-Inf",2]]},"expect":{"rows":{"value":2,"abs":0}}},
	       {"id":"m","method":"test.echo","source":"invented","input":{"x":"Inf"},"expect":{"y":{"value":"-Inf","abs":1e300}}},
	       {"id":"q","method":"test.echo","source":"invented","input":{"x":"NaN"},"expect":{"y":{"value":1,"abs":1e300}}}]`
	code, out, _ := runOn(t, map[string]string{"a.json": f}, fakeMethods())
	if code != 1 || !strings.HasSuffix(out, "\n5 passed, 2 failed\n") {
		t.Errorf("code %d, output:\n%s", code, out)
	}
	for _, id := range []string{"m", "q"} {
		if !regexp.MustCompile(`(?m)^FAIL ` + id + ` `).MatchString(out) {
			t.Errorf("no FAIL line for %s:\n%s", id, out)
		}
	}
}

func TestRunnerMalformed(t *testing.T) {
	ok := `{"id":"a","method":"test.echo","source":"invented","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}}`
	for _, c := range []struct {
		name, body, mention string
	}{
		{"unknown case key", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":0}},"note":1}]`, "note"},
		{"unknown input key", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2,"z":1},"expect":{"y":{"value":2,"abs":0}}}]`, "input.z"},
		{"unknown expect key", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"w":{"value":2,"abs":0}}}]`, "expect.w"},
		{"unknown tolerance key", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":0,"ulp":1}}}]`, "expect.y.ulp"},
		{"missing input", `[{"id":"a","method":"test.echo","source":"s","input":{},"expect":{"y":{"value":2,"abs":0}}}]`, "input.x"},
		{"unknown method", `[{"id":"a","method":"test.nope","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}}]`, "method"},
		{"row length", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2,"rows":[[1,2,3]]},"expect":{"y":{"value":2,"abs":0}}}]`, "input.rows"},
		{"expect_error false", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect_error":false}]`, "expect_error"},
		{"both", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect_error":true,"expect":{"y":{"value":2,"abs":0}}}]`, "expect_error"},
		{"neither", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2}}]`, "expect"},
		{"no tolerance", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2}}}]`, "expect.y"},
		{"no value", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"abs":2}}}]`, "expect.y.value"},
		{"repeated id", `[` + ok + `,` + ok + `]`, "id"},
		{"wrong type", `[{"id":"a","method":"test.echo","source":"s","input":{"x":"two"},"expect":{"y":{"value":2,"abs":0}}}]`, "input.x"},
		{"wrong type level", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2,"level":true},"expect":{"y":{"value":2,"abs":0}}}]`, "input.level"},
		{"id not string", `[{"id":7,"method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}}]`, "id"},
		{"missing source", `[{"id":"a","method":"test.echo","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}}]`, "source"},
		{"not an array", `{"id":"a"}`, "array"},
		{"not JSON", `[{"id":"a",]`, "JSON"},
		{"repeated key", `[{"id":"a","id":"b","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":0}}}]`, "repeated"},
		{"empty expect", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{}}]`, "expect"},
		{"negative tolerance", `[{"id":"a","method":"test.echo","source":"s","input":{"x":2},"expect":{"y":{"value":2,"abs":-1}}}]`, "expect.y.abs"},
		{"empty array", `[]`, "no case"},
		{"overflowing number", `[{"id":"a","method":"test.echo","source":"s","input":{"x":1e999},"expect":{"y":{"value":2,"abs":0}}}]`, "input.x"},
	} {
		t.Run(c.name, func(t *testing.T) {
			// A good file sorts first: it must not be run either.
			files := map[string]string{"0good.json": `[` + strings.Replace(ok, `"a"`, `"good"`, 1) + `]`, "1bad.json": c.body}
			if c.name == "empty array" { // malformed only when the folder has no case at all
				delete(files, "0good.json")
			}
			code, out, errOut := runOn(t, files, fakeMethods())
			if code != 2 {
				t.Errorf("exit %d, want 2", code)
			}
			if strings.Contains(out, "PASS") || strings.Contains(out, "passed") {
				t.Errorf("ran cases despite a malformed file:\n%s", out)
			}
			if c.name != "empty array" && !strings.Contains(errOut, "1bad.json") {
				t.Errorf("error does not name the file: %s", errOut)
			}
			if !strings.Contains(errOut, c.mention) {
				t.Errorf("error does not mention %q: %s", c.mention, errOut)
			}
		})
	}
}

func TestRunnerEmptyFolder(t *testing.T) {
	code, _, errOut := runOn(t, map[string]string{"notes.txt": "not a case file"}, fakeMethods())
	if code != 2 || !strings.Contains(errOut, "no case") {
		t.Errorf("exit %d, %s", code, errOut)
	}
	var out, eo bytes.Buffer
	if code := run([]string{filepath.Join(t.TempDir(), "missing")}, &out, &eo, fakeMethods()); code != 2 {
		t.Errorf("missing folder: exit %d", code)
	}
}

func TestRunnerFileOrder(t *testing.T) {
	// Files in name order, cases in file order; sub-folders are not read.
	a := `[{"id":"z1","method":"test.echo","source":"s","input":{"x":1},"expect":{"y":{"value":1,"abs":0}}}]`
	b := `[{"id":"a2","method":"test.echo","source":"s","input":{"x":1},"expect":{"y":{"value":1,"abs":0}}},{"id":"a1","method":"test.echo","source":"s","input":{"x":1},"expect":{"y":{"value":1,"abs":0}}}]`
	dir := t.TempDir()
	os.WriteFile(filepath.Join(dir, "b.json"), []byte(b), 0o644)
	os.WriteFile(filepath.Join(dir, "a.json"), []byte(a), 0o644)
	os.Mkdir(filepath.Join(dir, "sub"), 0o755)
	os.WriteFile(filepath.Join(dir, "sub", "c.json"), []byte(`not json`), 0o644)
	var out, eo bytes.Buffer
	if code := run([]string{dir}, &out, &eo, fakeMethods()); code != 0 {
		t.Fatalf("exit %d: %s", code, eo.String())
	}
	ids := regexp.MustCompile(`(?m)^PASS (\S+)`).FindAllStringSubmatch(out.String(), -1)
	var got []string
	for _, m := range ids {
		got = append(got, m[1])
	}
	if strings.Join(got, ",") != "z1,a2,a1" {
		t.Errorf("order %v, want z1,a2,a1", got)
	}
}

func TestTolerance(t *testing.T) {
	// |got − x| ≤ max(abs, rel·|x|) (testdata/reference/FORMAT.md).
	for _, c := range []struct {
		tol  tolerance
		got  float64
		want bool
	}{
		{tolerance{Value: 10, Abs: 0.1, HasAbs: true}, 10.1, true},
		{tolerance{Value: 10, Abs: 0.1, HasAbs: true}, 10.1001, false},
		{tolerance{Value: 10, Rel: 0.01, HasRel: true}, 9.9, true},
		{tolerance{Value: 10, Rel: 0.01, HasRel: true}, 9.89, false},
		{tolerance{Value: 10, Abs: 0.5, Rel: 0.01, HasAbs: true, HasRel: true}, 10.4, true},
		{tolerance{Value: 0, Rel: 0.5, HasRel: true}, 1e-300, false},
		{tolerance{Value: math.NaN(), Abs: 1, HasAbs: true}, math.NaN(), true},
		{tolerance{Value: math.Inf(1), Abs: 1, HasAbs: true}, math.MaxFloat64, false},
		{tolerance{Value: 1, Abs: math.Inf(1), HasAbs: true}, math.Inf(1), false},
	} {
		if got := c.tol.within(c.got); got != c.want {
			t.Errorf("%+v within(%v) = %v, want %v", c.tol, c.got, got, c.want)
		}
	}
}

// TestProjectReferenceCases runs every case of testdata/reference with the
// real methods: go test ./... thereby checks them all.
func TestProjectReferenceCases(t *testing.T) {
	var out, errOut bytes.Buffer
	code := run([]string{"../../testdata/reference"}, &out, &errOut, allMethods())
	require.Equal(t, 0, code, "exit status\n%s\n%s", errOut.String(), failLines(out.String()))
	require.Regexp(t, `^[1-9][0-9]* passed, 0 failed$`, lastLine(out.String()))
	t.Log(lastLine(out.String()))
}

func failLines(s string) string {
	var b strings.Builder
	for _, l := range strings.Split(s, "\n") {
		if strings.HasPrefix(l, "FAIL") {
			b.WriteString(l + "\n")
		}
	}
	return b.String()
}

func lastLine(s string) string {
	s = strings.TrimRight(s, "\n")
	return s[strings.LastIndex(s, "\n")+1:]
}
