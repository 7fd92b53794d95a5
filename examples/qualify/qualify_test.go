package main

// The demo scenario these tests run on is invented: testdata/demo/generate.go
// drew it with a seeded PCG generator from N0 = 2.0e6 spores per unit,
// D121 = 1.90 min and z = 10.5 °C (first-order inactivation, Poisson
// survivors, Poisson plate counts, a 0.04 log10 spread between units), and
// simulated the logger record as five first-order lags behind a chamber
// held at 122 °C. "Sane" below means near those true values, with margins
// wide enough for the draws.

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"

	"github.com/dzf-go/dzf/internal/lab"
	"gonum.org/v1/gonum/floats/scalar"
)

// demoDir is the module's demo folder, seen from this package.
const demoDir = "../../testdata/demo"

// runQualify runs the program's entry function.
func runQualify(t *testing.T, args ...string) (int, string, string) {
	t.Helper()
	var out, errOut bytes.Buffer
	code := run(args, &out, &errOut)
	return code, out.String(), errOut.String()
}

// demoJSON runs the demo with -json and decodes it.
func demoJSON(t *testing.T, args ...string) map[string]any {
	t.Helper()
	code, out, errOut := runQualify(t, append(args, "-json")...)
	require.Equal(t, 0, code, errOut)
	var v map[string]any
	require.NoError(t, json.Unmarshal([]byte(out), &v))
	return v
}

// at walks a decoded JSON value by keys and indexes.
func at(t *testing.T, v any, path ...any) any {
	t.Helper()
	for _, p := range path {
		switch k := p.(type) {
		case string:
			m, ok := v.(map[string]any)
			require.True(t, ok, "at %v: not an object", p)
			v, ok = m[k]
			require.True(t, ok, "no key %q", k)
		case int:
			a, ok := v.([]any)
			require.True(t, ok, "at %v: not an array", p)
			require.Less(t, k, len(a))
			v = a[k]
		}
	}
	return v
}

func num(t *testing.T, v any, path ...any) float64 {
	t.Helper()
	x, ok := at(t, v, path...).(float64)
	require.True(t, ok, "%v is not a number", path)
	return x
}

// near checks got against want within abs or rel (scalar.EqualWithinAbsOrRel).
func near(t *testing.T, name string, got, want, abs, rel float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, abs, rel) {
		t.Errorf("%s = %.10g, want %.10g (abs %g, rel %g)", name, got, want, abs, rel)
	}
}

func TestDemoTextHasEverySection(t *testing.T) {
	code, out, errOut := runQualify(t)
	require.Equal(t, 0, code, errOut)
	require.Empty(t, errOut)
	for _, s := range []string{
		title, "Inputs", "Population (plate counts)", "D-value at 121.0 °C", "z-value",
		"Label check (criterion by criterion)", "Cycle", "This indicator at the cold spot (pack-core)",
		"Overkill and half cycle", "Cautions",
		// Each D method, the agreement verdict, the label check's sources and summary.
		"survivor curve", "HSK", "limited HSK", "SMC", "MLE", "agreement rule:", "=> the methods agree",
		"sources:", "summary:", "cold spot: pack-core", "equilibration:", "hold (every probe",
		"overkill:", "half cycle:", "patient safety", "verify", "WARNING: every input is the invented demo",
	} {
		require.Contains(t, out, s)
	}
	for _, l := range strings.Split(out, "\n") {
		require.LessOrEqual(t, len([]rune(strings.TrimRight(l, " "))), width+2, "line too long: %q", l)
	}
}

func TestDemoNumbersAreSane(t *testing.T) {
	v := demoJSON(t)

	// Population: hand-worked from the closed form Σc/Σ(d·v)·V on the
	// demo's countable plates (30–300 colonies): U1 422/0.002·10, U2
	// 412/0.002·10, U3 474/0.0021·10, U4 336/0.002·10; mean of the four.
	wantMean := (2110000 + 2060000 + 474/0.0021*10 + 1680000) / 4.0
	near(t, "population mean", num(t, v, "population", "assay", "mean"), wantMean, 0, 1e-12)
	near(t, "ratio to label", num(t, v, "population", "ratio_to_label"), wantMean/2.3e6, 0, 1e-12)

	// D by each method: the demo's true D is 1.90 min; every method must
	// land within ±10 % (the draws put them within 1 %).
	methods := at(t, v, "resistance", "methods").([]any)
	require.Len(t, methods, 5)
	for i, name := range []string{nameSurvivor, "HSK", "limited HSK", "SMC", "MLE"} {
		require.Equal(t, name, at(t, methods[i], "name"))
		near(t, name+" D", num(t, methods[i], "estimate", "value"), 1.90, 0, 0.10)
	}
	require.Equal(t, true, at(t, v, "resistance", "agreement", "agree"))
	// Limited HSK equals general HSK on this equal-spaced design (the
	// fraction package's documented property).
	near(t, "limited = general HSK", num(t, methods[2], "estimate", "value"), num(t, methods[1], "estimate", "value"), 0, 1e-12)

	// z: true 10.5 °C; three points give wide limits, so ±15 %.
	near(t, "z", num(t, v, "z", "result", "z", "value"), 10.5, 0, 0.15)

	// Cycle: the cold spot is the pack-core probe by construction (the
	// longest lag and the largest offset); its F0 is checked against an
	// independent trapezoid sum over the demo file.
	require.Equal(t, "pack-core", at(t, v, "cycle", "result", "cold_spot_probe"))
	f0 := num(t, v, "cycle", "result", "min_f")
	near(t, "cold-spot F0", f0, trapezoidF0(t, filepath.Join(demoDir, "cycle.csv"), "pack-core", 121.1, 10), 0, 2e-3)
	// F at the label's 121 °C is F0 scaled by 10^(0.1/10) (closed form).
	near(t, "F at 121 °C", num(t, v, "indicator", "f", "f"), f0*math.Pow(10, 0.01), 0, 1e-9)

	// Log reduction at the cold spot by the survivor-curve D: F/D (closed form).
	row := at(t, v, "indicator", "rows", 0)
	near(t, "log reduction", num(t, row, "assessment", "central", "log_reduction"),
		num(t, v, "indicator", "f", "f")/num(t, methods[0], "estimate", "value"), 0, 1e-12)
	require.Equal(t, true, at(t, v, "claims", "overkill", "meets"))
	require.Equal(t, true, at(t, v, "claims", "half_cycle", "meets"))
	require.Equal(t, float64(0), num(t, v, "label_check", "failed"))

	// SMC gives no limits: the JSON writes them as the string "NaN".
	require.Equal(t, "NaN", at(t, methods[3], "estimate", "lower"))
	require.Equal(t, "NaN", at(t, methods[3], "relative_half_width"))
}

// trapezoidF0 integrates 10^((T − tRef)/z) over one probe of a logger file
// by the trapezoid rule, independently of the lethality package.
func trapezoidF0(t *testing.T, path, probe string, tRef, z float64) float64 {
	t.Helper()
	b, err := os.ReadFile(path)
	require.NoError(t, err)
	r := csv.NewReader(bytes.NewReader(b))
	r.Comment = '#'
	recs, err := r.ReadAll()
	require.NoError(t, err)
	col := -1
	for i, h := range recs[0] {
		if h == probe {
			col = i
		}
	}
	require.GreaterOrEqual(t, col, 1)
	var f, prevT, prevL float64
	var start time.Time
	for i, rec := range recs[1:] {
		ts, err := time.Parse(time.RFC3339, rec[0])
		require.NoError(t, err)
		if i == 0 {
			start = ts
		}
		temp, err := strconv.ParseFloat(rec[col], 64)
		require.NoError(t, err)
		m, l := ts.Sub(start).Minutes(), math.Pow(10, (temp-tRef)/z)
		if i > 0 {
			f += (l + prevL) / 2 * (m - prevT)
		}
		prevT, prevL = m, l
	}
	return f
}

// numberToken matches a number standing on its own (not part of a word
// such as log10, F0 or U1).
var numberToken = regexp.MustCompile(`(?:^|[^A-Za-z0-9_.+\-])([-+]?\d+(?:\.\d+)?(?:e[-+]\d+)?)`)

func tokens(s string) []string {
	var out []string
	for _, m := range numberToken.FindAllStringSubmatch(s, -1) {
		out = append(out, m[1])
	}
	return out
}

// jsonValues collects the numbers of a decoded JSON value and the number
// tokens of its strings.
func jsonValues(v any, nums *[]float64, texts map[string]bool) {
	switch x := v.(type) {
	case float64:
		*nums = append(*nums, x)
	case string:
		for _, tok := range tokens(x) {
			texts[tok] = true
		}
	case []any:
		for _, e := range x {
			jsonValues(e, nums, texts)
		}
	case map[string]any:
		for _, e := range x {
			jsonValues(e, nums, texts)
		}
	}
}

// formatLike formats v as the token tok is formatted: fixed decimals or
// e-notation with the same digits, a zero without its sign.
func formatLike(v float64, tok string) string {
	tok = strings.TrimLeft(tok, "+-")
	var s string
	if i := strings.IndexByte(tok, 'e'); i >= 0 {
		mant := tok[:i]
		d := 0
		if j := strings.IndexByte(mant, '.'); j >= 0 {
			d = len(mant) - j - 1
		}
		s = strconv.FormatFloat(math.Abs(v), 'e', d, 64)
	} else {
		d := 0
		if j := strings.IndexByte(tok, '.'); j >= 0 {
			d = len(tok) - j - 1
		}
		s = strconv.FormatFloat(math.Abs(v), 'f', d, 64)
	}
	return s
}

// signOK reports whether the token's sign fits v (a zero has no sign).
func signOK(v float64, tok string) bool {
	neg := strings.HasPrefix(tok, "-")
	return neg == (v < 0) || strings.Trim(tok, "+-0.") == ""
}

// missingNumbers returns the number tokens of text found nowhere in the
// JSON value v, and how many tokens were checked.
func missingNumbers(text string, v any) ([]string, int) {
	var nums []float64
	texts := map[string]bool{}
	jsonValues(v, &nums, texts)
	var missing []string
	toks := tokens(text)
	for _, tok := range toks {
		if texts[tok] || texts[strings.TrimPrefix(tok, "+")] {
			continue
		}
		found := false
		for _, x := range nums {
			for _, y := range []float64{x, 100 * x} {
				if signOK(y, tok) && formatLike(y, tok) == strings.TrimLeft(tok, "+-") {
					found = true
				}
			}
			if found {
				break
			}
		}
		if !found && !slices.Contains(missing, tok) {
			missing = append(missing, tok)
		}
	}
	return missing, len(toks)
}

// TestJSONHoldsEveryNumberOfTheText checks that every number the text
// shows is in the JSON: as a number (rounded as the text rounds it, or as
// a percentage of it) or inside one of its strings.
func TestJSONHoldsEveryNumberOfTheText(t *testing.T) {
	code, text, errOut := runQualify(t)
	require.Equal(t, 0, code, errOut)
	v := demoJSON(t)
	missing, checked := missingNumbers(text, v)
	require.Greater(t, checked, 300, "the text should show hundreds of numbers")
	require.Empty(t, missing, "numbers of the text not in the JSON")
	// The check can fail: invented numbers are found missing, a number of
	// the JSON at another precision is found.
	missing, _ = missingNumbers("D 31.41593 min, 7.78e+09 per unit, z 10.54 °C", v)
	require.Equal(t, []string{"31.41593", "7.78e+09"}, missing)

	// A few numbers that must appear in both, spelled out.
	for _, want := range []struct {
		path []any
		text string
	}{
		{[]any{"resistance", "methods", 0, "estimate", "value"}, "survivor curve  %.3f"},
		{[]any{"cycle", "result", "min_f"}, "cold spot: pack-core, F0 %.2f min"},
		{[]any{"z", "result", "z", "value"}, "z %.2f °C"},
		{[]any{"population", "assay", "log10_mean"}, "log10 %.3f"},
		{[]any{"indicator", "f", "f"}, "at the cold spot: %.2f min"},
	} {
		require.Contains(t, text, fmt.Sprintf(want.text, num(t, v, want.path...)))
	}
}

// demoFile returns the path of a testdata/demo file.
func demoFile(name string) string { return filepath.Join(demoDir, name) }

// Each file flag reads its sample file in testdata/demo; the results equal
// those of the embedded demo, and the report says the input came from the
// file.
func TestEachFileFlag(t *testing.T) {
	base := demoJSON(t)
	for i, spec := range inputSpecs() {
		t.Run(spec.name, func(t *testing.T) {
			path := demoFile(spec.demo)
			v := demoJSON(t, "-"+spec.name, path, "-demo-fill")
			require.Equal(t, map[string]any{"input": spec.name, "from": fromFile, "name": path}, at(t, v, "inputs", i))
			for _, part := range []string{"population", "resistance", "z", "indicator", "claims"} {
				require.Equal(t, at(t, base, part), at(t, v, part), part)
			}
			require.Equal(t, at(t, base, "label_check", "findings"), at(t, v, "label_check", "findings"))
			require.Contains(t, at(t, v, "warnings", 0), "mixed with your files")
		})
	}
}

func TestAllFilesGiven(t *testing.T) {
	var args []string
	for _, spec := range inputSpecs() {
		args = append(args, "-"+spec.name, demoFile(spec.demo))
	}
	code, out, errOut := runQualify(t, args...)
	require.Equal(t, 0, code, errOut)
	require.NotContains(t, out, "WARNING: every input is the invented demo")
	require.NotContains(t, out, "mixed with your files")
	require.Contains(t, out, "cycle         file  "+demoFile(lab.DemoCycle))
}

func TestInputsNeededOnceAFileIsGiven(t *testing.T) {
	code, _, errOut := runQualify(t, "-cycle", demoFile(lab.DemoCycle))
	require.Equal(t, exitUsage, code)
	require.Contains(t, errOut, "missing inputs -label, -population, -survivor, -fraction, -temperatures, -outcomes")
	require.Contains(t, errOut, "-demo-fill")
	code, _, errOut = runQualify(t, "-label", "none")
	require.Equal(t, exitUsage, code)
	require.Contains(t, errOut, "this input is required")
}

func TestOptionalInputsNone(t *testing.T) {
	code, out, errOut := runQualify(t, "-temperatures", "none", "-outcomes", "none", "-demo-fill")
	require.Equal(t, 0, code, errOut)
	require.Contains(t, out, "z not determined: no D at other temperatures given")
	require.Contains(t, out, "half cycle: not assessed: no half-cycle run in the outcomes")
	require.Regexp(t, `NOT ASSESSED +survival test`, out)
	require.Regexp(t, `NOT ASSESSED +minimum z \(measured\)`, out)
}

func TestBadFlags(t *testing.T) {
	for _, args := range [][]string{
		{"-level", "1.5"}, {"-level", "0"}, {"-band", "-1"}, {"-sal", "2"}, {"-zref", "0"},
		{"-profile", "steam"}, {"-z-from", "curve"}, {"-cycle-time", "hours"}, {"-cycle-unit", "kelvin"},
		{"-nonesuch"}, {"stray"},
	} {
		code, _, errOut := runQualify(t, args...)
		require.Equal(t, exitUsage, code, "%v: %s", args, errOut)
		require.NotEmpty(t, errOut)
	}
	code, _, _ := runQualify(t, "-help")
	require.Equal(t, exitOK, code)
}

// writeFile writes a temporary file and returns its path.
func writeFile(t *testing.T, name, body string) string {
	t.Helper()
	p := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(p, []byte(body), 0o644))
	return p
}

// A malformed file stops the program with exit status 2 and a message
// naming the file, the line and the column.
func TestMalformedFiles(t *testing.T) {
	for _, c := range []struct {
		flag, name, body string
		want             []string // parts of the message after the path
	}{
		{"population", "bad_number.csv", "# plates\nunit,suspension_ml,dilution,plated_ml,colonies\nU1,10,1e-3,1,2l4\n", []string{"line 3", `column "colonies"`, `"2l4"`}},
		{"population", "missing_column.csv", "unit,suspension_ml,dilution,colonies\nU1,10,1e-3,214\n", []string{"line 1", `column "plated_ml"`, "missing"}},
		{"population", "empty.csv", "", []string{"no header row"}},
		{"survivor", "bad_number.csv", "minutes,count\n0,1.5e6\n1.6,three\n", []string{"line 3", `column "count"`}},
		{"survivor", "missing_column.csv", "time,count\n0,1.5e6\n", []string{"line 1", `column "time"`}},
		{"survivor", "empty.csv", "# nothing yet\n", []string{"no header row"}},
		{"fraction", "bad_number.csv", "minutes,units,negative\n9,20,0\n10.5,20,x\n", []string{"line 3", `column "negative"`}},
		{"fraction", "missing_column.csv", "minutes,negative\n9,0\n", []string{"line 1", `column "units"`}},
		{"fraction", "empty.csv", "", []string{"no header row"}},
		{"temperatures", "bad_number.csv", "celsius,d,lower,upper,level\n118,3.6,3.5,3.7,0.95\n124,0,0.9,1.0,0.95\n", []string{"line 3", `column "d"`}},
		{"temperatures", "missing_column.csv", "celsius,d,lower,upper\n118,3.6,3.5,3.7\n", []string{"line 1", `column "level"`}},
		{"temperatures", "empty.csv", "", []string{"no header row"}},
		{"outcomes", "bad_number.csv", "test,minutes,units,growth\nsurvival,9,50,fifty\n", []string{"line 2", `column "growth"`}},
		{"outcomes", "missing_column.csv", "test,minutes,growth\nsurvival,9,50\n", []string{"line 1", `column "units"`}},
		{"outcomes", "empty.csv", "", []string{"no header row"}},
		{"label", "bad_number.json", "{\n  \"population\": 2.3e6,\n  \"d\": 1.8x,\n  \"celsius\": 121\n}\n", []string{"line 3", `field "d"`, "invalid character"}},
		{"label", "missing_field.json", "{\n  \"population\": 2.3e6,\n  \"celsius\": 121\n}\n", []string{`field "d"`, "required"}},
		{"label", "empty.json", "", []string{"no JSON object"}},
		{"cycle", "bad_number.csv", "time,P1,P2\n2031-05-20T08:00:00Z,100,101\n2031-05-20T08:00:10Z,110,1O2\n", []string{"line 3", `column "P2"`}},
		{"cycle", "missing_column.csv", "time\n2031-05-20T08:00:00Z\n", []string{"line 1", "header"}},
		{"cycle", "empty.csv", "", []string{"header"}},
	} {
		t.Run(c.flag+"/"+c.name, func(t *testing.T) {
			path := writeFile(t, c.name, c.body)
			code, out, errOut := runQualify(t, "-"+c.flag, path, "-demo-fill")
			require.Equal(t, exitUsage, code, "output:\n%s", out)
			require.Empty(t, out)
			require.Contains(t, errOut, path)
			for _, w := range c.want {
				require.Contains(t, errOut, w)
			}
		})
	}
}

// A numeric time column needs its unit: the reader never guesses it.
func TestCycleTimeUnit(t *testing.T) {
	body := "seconds,P1,P2\n0,120,121\n60,122,121.5\n120,122,121.6\n180,110,108\n"
	path := writeFile(t, "numeric.csv", body)
	code, _, errOut := runQualify(t, "-cycle", path, "-demo-fill")
	require.Equal(t, exitUsage, code)
	require.Contains(t, errOut, "-cycle-time seconds")
	code, out, errOut := runQualify(t, "-cycle", path, "-cycle-time", "seconds", "-demo-fill")
	require.Equal(t, exitOK, code, errOut)
	require.Contains(t, out, "cold spot: P2")
}

// Data that give no report at all exit with status 1.
func TestRefusalExitsOne(t *testing.T) {
	path := writeFile(t, "uncountable.csv", "unit,suspension_ml,dilution,plated_ml,colonies\nU1,10,1e-3,1,400\nU2,10,1e-3,1,500\n")
	code, out, errOut := runQualify(t, "-population", path, "-demo-fill")
	require.Equal(t, exitRefused, code)
	require.Empty(t, out)
	require.Contains(t, errOut, path)
	require.Contains(t, errOut, "countable")
}

// A method that refuses the data is reported, and the rest of the report
// goes on.
func TestMethodRefusalIsReported(t *testing.T) {
	path := writeFile(t, "unequal.csv", "minutes,units,negative\n9,20,0\n10.5,20,0\n12,20,7\n13.5,20,17\n15.5,20,20\n16.5,20,20\n")
	code, out, errOut := runQualify(t, "-fraction", path, "-demo-fill")
	require.Equal(t, exitOK, code, errOut)
	require.Contains(t, out, "limited HSK refused:")
	require.Contains(t, out, "=> the methods agree")
}
