package main

import (
	"bytes"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"testing"

	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/floats/scalar"
)

func runStudy(args ...string) (int, string, string) {
	var out, errOut bytes.Buffer
	code := run(args, &out, &errOut)
	return code, out.String(), errOut.String()
}

// dOf returns the D printed for a method in the side-by-side table.
func dOf(t *testing.T, out, method string) float64 {
	t.Helper()
	m := regexp.MustCompile(`(?m)^  ` + regexp.QuoteMeta(method) + ` +(\d+\.\d+) `).FindStringSubmatch(out)
	require.NotNil(t, m, "no row for %s in\n%s", method, out)
	d, err := strconv.ParseFloat(m[1], 64)
	require.NoError(t, err)
	return d
}

// The demo study is invented (testdata/demo/generate.go: true D 1.90 min,
// N0 2.0e6 per unit): every procedure must give D within ±10 % of it.
func TestDemo(t *testing.T) {
	code, out, errOut := runStudy()
	require.Equal(t, 0, code, errOut)
	for _, s := range []string{"demo:fraction.csv", "mean of 4 units of demo:population.csv", "Ū", "deviance", "patient safety", "verify"} {
		require.Contains(t, out, s)
	}
	for _, m := range []string{"HSK", "limited HSK", "SMC", "MLE"} {
		if d := dOf(t, out, m); !scalar.EqualWithinRel(d, 1.90, 0.10) {
			t.Errorf("%s: D %g, want 1.90 ± 10 %%", m, d)
		}
	}
}

// The fraction package's example study (invented lot QX-5817, N0 10^6):
// its documented example output gives HSK D 2.0478 min and SMC 2.0947 min.
func TestFileFlag(t *testing.T) {
	path := filepath.Join(t.TempDir(), "study.csv")
	require.NoError(t, os.WriteFile(path, []byte("# invented\nminutes,units,negative\n8,20,0\n10,20,0\n12,20,6\n14,20,17\n16,20,19\n18,20,20\n20,20,20\n"), 0o644))
	code, out, errOut := runStudy("-fraction", path, "-n0", "1e6")
	require.Equal(t, 0, code, errOut)
	require.Equal(t, 2.048, dOf(t, out, "HSK"))
	require.Equal(t, 2.048, dOf(t, out, "limited HSK"))
	require.Equal(t, 2.095, dOf(t, out, "SMC"))

	// The demo's own files through the flags give the demo's numbers.
	demo := filepath.Join("..", "..", "testdata", "demo")
	_, want, _ := runStudy()
	code, got, errOut := runStudy("-fraction", filepath.Join(demo, "fraction.csv"), "-population", filepath.Join(demo, "population.csv"))
	require.Equal(t, 0, code, errOut)
	require.Equal(t, dOf(t, want, "MLE"), dOf(t, got, "MLE"))
}

func TestBadInput(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("minutes,units,negative\n9,20,0\n10,20,-\n"), 0o644))
	code, _, errOut := runStudy("-fraction", bad, "-n0", "2e6")
	require.Equal(t, 2, code)
	require.Contains(t, errOut, bad+`, line 3, column "negative"`)
	for _, args := range [][]string{
		{"-fraction", bad},                     // no population for the user's study
		{"-n0", "1e6", "-population", "x.csv"}, // both
		{"-n0", "-3"}, {"-level", "2"}, {"stray"},
	} {
		code, _, _ := runStudy(args...)
		require.Equal(t, 2, code, "%v", args)
	}
}
