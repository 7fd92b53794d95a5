package fraction

import (
	"bufio"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// near reports a failure unless got is within max(abs, rel·|want|) of want;
// an infinite or NaN want needs the same got.
func near(t *testing.T, what string, got, want, abs, rel float64) {
	t.Helper()
	switch {
	case math.IsNaN(want):
		if !math.IsNaN(got) {
			t.Errorf("%s = %.12g, want NaN", what, got)
		}
		return
	case math.IsInf(want, 0):
		if got != want {
			t.Errorf("%s = %.12g, want %g", what, got, want)
		}
		return
	}
	if !scalar.EqualWithinAbsOrRel(got, want, abs, rel) {
		t.Errorf("%s = %.12g, want %.12g (abs %g, rel %g)", what, got, want, abs, rel)
	}
}

// study is one study of testdata/fraction/studies.tsv.
type study struct {
	name    string
	log10N0 float64
	exp     []Exposure
	where   string // FILE:LINE of its first row
}

// tsvRows reads a tab-separated file with '#' header lines and one line of
// column names, returning each row with its FILE:LINE.
func tsvRows(t *testing.T, path string) (rows [][]string, where []string) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	line, header := 0, false
	for sc.Scan() {
		line++
		s := sc.Text()
		if strings.HasPrefix(s, "#") || strings.TrimSpace(s) == "" {
			continue
		}
		if !header {
			header = true
			continue
		}
		rows = append(rows, strings.Split(s, "\t"))
		where = append(where, path+":"+strconv.Itoa(line))
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return rows, where
}

func parseNum(t *testing.T, where, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("%s: %v", where, err)
	}
	return v
}

func parseInt(t *testing.T, where, s string) int {
	t.Helper()
	v, err := strconv.Atoi(s)
	if err != nil {
		t.Fatalf("%s: %v", where, err)
	}
	return v
}

const studiesFile = "../testdata/fraction/studies.tsv"

// loadStudies reads testdata/fraction/studies.tsv (invented data).
func loadStudies(t *testing.T) map[string]*study {
	t.Helper()
	rows, where := tsvRows(t, studiesFile)
	out := map[string]*study{}
	for i, r := range rows {
		if len(r) != 5 {
			t.Fatalf("%s: %d columns, want 5", where[i], len(r))
		}
		s := out[r[0]]
		if s == nil {
			s = &study{name: r[0], log10N0: parseNum(t, where[i], r[1]), where: where[i]}
			out[r[0]] = s
		}
		s.exp = append(s.exp, Exposure{parseNum(t, where[i], r[2]), parseInt(t, where[i], r[3]), parseInt(t, where[i], r[4])})
	}
	return out
}
