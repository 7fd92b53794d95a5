package lab

import (
	"bytes"
	"encoding/json"
	"errors"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/dzf-go/dzf/lethality"
	"github.com/dzf-go/dzf/resistance"
)

// The embedded demo must be the module's testdata/demo, byte for byte,
// file for file (generate.go, the generator, is not embedded).
func TestDemoCopyIsIdentical(t *testing.T) {
	dir := filepath.Join("..", "..", "testdata", "demo")
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	var names []string
	for _, e := range entries {
		if n := e.Name(); strings.HasSuffix(n, ".csv") || strings.HasSuffix(n, ".json") {
			names = append(names, n)
		}
	}
	require.Equal(t, names, DemoNames(), "the same files in both places")
	for _, n := range names {
		want, err := os.ReadFile(filepath.Join(dir, n))
		require.NoError(t, err)
		got, err := Demo(n)
		require.NoError(t, err)
		require.True(t, bytes.Equal(want, got), "%s differs between testdata/demo and the embedded copy: copy it again", n)
	}
	_, err = Demo("nonesuch.csv")
	require.ErrorIs(t, err, ErrDemo)
}

// Every demo file reads without error, with the counts the generator wrote.
func TestDemoFilesRead(t *testing.T) {
	read := func(name string) *bytes.Reader {
		b, err := Demo(name)
		require.NoError(t, err)
		return bytes.NewReader(b)
	}
	units, err := ReadPopulation(DemoPopulation, read(DemoPopulation))
	require.NoError(t, err)
	require.Len(t, units, 4)
	require.Len(t, units[0].Plates, 4)
	obs, err := ReadSurvivor(DemoSurvivor, read(DemoSurvivor))
	require.NoError(t, err)
	require.Len(t, obs, 18)
	ex, err := ReadFraction(DemoFraction, read(DemoFraction))
	require.NoError(t, err)
	require.Len(t, ex, 7)
	pts, err := ReadTemperatures(DemoTemperatures, read(DemoTemperatures))
	require.NoError(t, err)
	require.Len(t, pts, 2)
	out, err := ReadOutcomes(DemoOutcomes, read(DemoOutcomes))
	require.NoError(t, err)
	require.NotNil(t, out.Survival)
	require.NotNil(t, out.Kill)
	require.NotNil(t, out.HalfCycle)
	l, err := ReadLabel(DemoLabel, read(DemoLabel))
	require.NoError(t, err)
	require.Equal(t, resistance.MoistHeat, l.Modality)
	rs := DemoCycleSettings()
	rec, err := ReadCycle(DemoCycle, read(DemoCycle), &rs)
	require.NoError(t, err)
	require.Len(t, rec.Probes, 5)
	require.Len(t, rec.Rows, 337)
	require.NotNil(t, rec.Start)
}

// fileErr asserts that err is an *Error at the line and column, wrapping
// the sentinel.
func fileErr(t *testing.T, err error, line int, column string, sentinel error) {
	t.Helper()
	require.Error(t, err)
	var e *Error
	require.True(t, errors.As(err, &e), "not an *Error: %v", err)
	require.Equal(t, "f.csv", e.File, err.Error())
	require.Equal(t, line, e.Line, err.Error())
	require.Equal(t, column, e.Column+e.Key, err.Error())
	require.ErrorIs(t, err, sentinel)
	require.Contains(t, err.Error(), "f.csv")
}

func TestReaderErrors(t *testing.T) {
	fraction := func(s string) error {
		_, err := ReadFraction("f.csv", strings.NewReader(s))
		return err
	}
	population := func(s string) error {
		_, err := ReadPopulation("f.csv", strings.NewReader(s))
		return err
	}
	temps := func(s string) error {
		_, err := ReadTemperatures("f.csv", strings.NewReader(s))
		return err
	}
	outcomes := func(s string) error {
		_, err := ReadOutcomes("f.csv", strings.NewReader(s))
		return err
	}
	survivorCurve := func(s string) error {
		_, err := ReadSurvivor("f.csv", strings.NewReader(s))
		return err
	}
	for _, c := range []struct {
		name     string
		read     func(string) error
		file     string
		line     int
		column   string
		sentinel error
	}{
		{"empty", fraction, "", 0, "", ErrEmpty},
		{"only comments", fraction, "# a\n# b\n\n", 0, "", ErrEmpty},
		{"header only", fraction, "# c\nminutes,units,negative\n", 2, "", ErrNoRows},
		{"missing column", fraction, "# c\nminutes,units\n1,2\n", 2, "negative", ErrMissingColumn},
		{"unknown column", fraction, "minutes,units,negative,minuts\n1,2,3,4\n", 1, "minuts", ErrUnknownColumn},
		{"duplicate column", fraction, "minutes,units,negative,Units\n1,2,3,4\n", 1, "Units", ErrDuplicateColumn},
		{"bad number after comments", fraction, "# c\n# d\nminutes,units,negative\n9,20,0\n# e\n10.5,2O,0\n", 6, "units", ErrNumber},
		{"blank cell", fraction, "minutes,units,negative\n9,,0\n", 2, "units", ErrNumber},
		{"NaN refused", fraction, "minutes,units,negative\nNaN,20,0\n", 2, "minutes", ErrNumber},
		{"not whole", fraction, "minutes,units,negative\n9,20,1.5\n", 2, "negative", ErrWholeNumber},
		{"negatives above units", fraction, "minutes,units,negative\n9,20,21\n", 2, "negative", ErrValue},
		{"negative time", fraction, "minutes,units,negative\n-1,20,0\n", 2, "minutes", ErrValue},
		{"field count", fraction, "minutes,units,negative\n9,20\n", 2, "", ErrFieldCount},
		{"bad quoting", fraction, "minutes,units,negative\n9,\"20,0\n", 2, "", ErrSyntax},
		{"dilution as reciprocal", population, "unit,suspension_ml,dilution,plated_ml,colonies\nU1,10,1000,1,200\n", 2, "dilution", ErrValue},
		{"suspension differs", population, "unit,suspension_ml,dilution,plated_ml,colonies\nU1,10,1e-3,1,200\nU2,10,1e-3,1,200\nU1,9,1e-3,1,200\n", 4, "suspension_ml", ErrValue},
		{"blank unit", population, "unit,suspension_ml,dilution,plated_ml,colonies\n,10,1e-3,1,200\n", 2, "unit", ErrValue},
		{"lower above d", temps, "celsius,d,lower,upper,level\n118,3.6,3.7,3.8,0.95\n", 2, "lower", ErrValue},
		{"level as percent", temps, "celsius,d,lower,upper,level\n118,3.6,3.5,3.8,95\n", 2, "level", ErrValue},
		{"unknown test", outcomes, "test,minutes,units,growth\nsurvive,9,50,50\n", 2, "test", ErrValue},
		{"test twice", outcomes, "test,minutes,units,growth\nkill,18,50,0\nkill,18,50,0\n", 3, "test", ErrValue},
		{"growth above units", outcomes, "test,minutes,units,growth\nkill,18,50,51\n", 2, "growth", ErrValue},
		{"negative count", survivorCurve, "minutes,count\n0,-5\n", 2, "count", ErrValue},
	} {
		t.Run(c.name, func(t *testing.T) {
			fileErr(t, c.read(c.file), c.line, c.column, c.sentinel)
		})
	}
}

func TestReaderAccepts(t *testing.T) {
	// A byte-order mark, header case and spaces, quoted fields, a line of
	// spaces and rows of one unit apart.
	src := "\ufeff# plates\n Unit , SUSPENSION_ML,dilution,plated_ml,colonies\n\"U 1\",10,1e-3,1,200\n   \nU2,10,0.001,1,190\nU 1,10,1e-4,1,21\n"
	units, err := ReadPopulation("f.csv", strings.NewReader(src))
	require.NoError(t, err)
	require.Len(t, units, 2)
	require.Equal(t, "U 1", units[0].Label)
	require.Len(t, units[0].Plates, 2)
	require.Equal(t, 1e-4, units[0].Plates[1].Dilution)
	pts, err := ReadTemperatures("f.csv", strings.NewReader("celsius,d,lower,upper,level\n118,3.6,3.5,3.8,0.95\n"))
	require.NoError(t, err)
	require.Equal(t, "as given in f.csv", pts[0].D.Method)
}

func TestLabelErrors(t *testing.T) {
	label := func(s string) error {
		_, err := ReadLabel("f.csv", strings.NewReader(s))
		return err
	}
	good := "# certificate\n{\n  \"lot\": \"A1\",\n  \"population\": 2e6,\n  \"d\": 1.8,\n  \"celsius\": 121\n}\n"
	l, err := ReadLabel("f.csv", strings.NewReader(good))
	require.NoError(t, err)
	require.Equal(t, 2e6, l.Population)
	for _, c := range []struct {
		name     string
		file     string
		line     int
		column   string
		sentinel error
	}{
		{"empty", "", 0, "", ErrEmpty},
		{"only a comment", "# nothing\n", 0, "", ErrEmpty},
		{"syntax", "# c\n{\n  \"d\": 1.8,,\n}\n", 3, "d", ErrSyntax},
		{"bad number", "{\n  \"population\": 2e6,\n  \"d\": 1.8x,\n  \"celsius\": 121\n}", 3, "d", ErrSyntax},
		{"not closed", "{\n  \"d\": 1.8\n", 2, "", ErrSyntax},
		{"string for a number", "{\n \"population\": 2e6,\n \"d\": \"1.8\",\n \"celsius\": 121\n}", 3, "d", ErrValue},
		{"unknown field", "{\n \"population\": 2e6,\n \"D121\": 1.8,\n \"celsius\": 121\n}", 3, "D121", ErrUnknownColumn},
		{"missing population", "{\n \"d\": 1.8,\n \"celsius\": 121\n}", 0, "population", ErrMissingColumn},
		{"zero population", "{\n \"population\": 0,\n \"d\": 1.8,\n \"celsius\": 121\n}", 2, "population", ErrValue},
		{"negative D", "{\n \"population\": 2e6,\n \"d\": -1.8,\n \"celsius\": 121\n}", 3, "d", ErrValue},
		{"missing celsius", "{\n \"population\": 2e6,\n \"d\": 1.8\n}", 0, "celsius", ErrMissingColumn},
		{"kill before survival", "{\n \"population\": 2e6, \"d\": 1.8, \"celsius\": 121,\n \"survival_time\": 9,\n \"kill_time\": 8\n}", 4, "kill_time", ErrValue},
		{"modality", "{\n \"population\": 2e6, \"d\": 1.8, \"celsius\": 121,\n \"modality\": \"steam\"\n}", 3, "modality", ErrValue},
		{"two objects", "{\"population\": 2e6, \"d\": 1.8, \"celsius\": 121}\n{}\n", 2, "", ErrSyntax},
	} {
		t.Run(c.name, func(t *testing.T) {
			fileErr(t, label(c.file), c.line, c.column, c.sentinel)
		})
	}
}

func TestCycleErrorsNameTheProbe(t *testing.T) {
	rs := lethality.ReadSettings{Time: lethality.TimeSeconds}
	src := "# logger\nseconds,P1,P2\n0,100,101\n10,120,12l\n"
	_, err := ReadCycle("f.csv", strings.NewReader(src), &rs)
	fileErr(t, err, 4, "P2", lethality.ErrBadNumber)
	_, err = ReadCycle("f.csv", strings.NewReader("seconds,P1\n"), &rs)
	require.ErrorIs(t, err, ErrNoRows)
	_, err = ReadCycle("f.csv", strings.NewReader(""), &rs)
	var e *Error
	require.True(t, errors.As(err, &e))
	require.ErrorIs(t, err, lethality.ErrHeader)
	_, err = ReadCycle("f.csv", strings.NewReader("seconds,P1\n0,100\n5,101\n5,102\n"), &rs)
	fileErr(t, err, 4, "time", lethality.ErrTimeOrder)
}

func TestNumJSON(t *testing.T) {
	for _, c := range []struct {
		v    float64
		want string
	}{{1.5, "1.5"}, {math.NaN(), `"NaN"`}, {math.Inf(1), `"+Inf"`}, {math.Inf(-1), `"-Inf"`}} {
		b, err := json.Marshal(Num(c.v))
		require.NoError(t, err)
		require.Equal(t, c.want, string(b))
		var back Num
		require.NoError(t, json.Unmarshal(b, &back))
		if math.IsNaN(c.v) {
			require.True(t, math.IsNaN(float64(back)))
		} else {
			require.Equal(t, c.v, float64(back))
		}
	}
	var n Num
	require.Error(t, json.Unmarshal([]byte(`"many"`), &n))
}

func TestFormatAndWrap(t *testing.T) {
	require.Equal(t, "0.0", Format(-0.0004, 1), "no sign on a value that rounds to zero")
	require.Equal(t, "-0.5", Format(-0.5, 1))
	require.Equal(t, "—", Format(math.NaN(), 2))
	require.Equal(t, "+Inf", Format(math.Inf(1), 2))
	require.Equal(t, "12.5 %", Percent(0.125, 1))
	got := Wrap("aaa bbb ccc 12 % ddd", 10, "  ")
	require.Equal(t, "aaa bbb\n  ccc 12 %\n  ddd", got)
	for _, l := range strings.Split(Wrap(strings.Repeat("word ", 50), 30, "    "), "\n") {
		require.LessOrEqual(t, len(l), 30)
	}
}

func TestEstimateFractionKeepsRefusals(t *testing.T) {
	// Unequal spacing: the limited procedure refuses, the others estimate
	// (invented study).
	ex, err := ReadFraction("f.csv", strings.NewReader("minutes,units,negative\n8,20,0\n10,20,0\n12,20,6\n14,20,17\n17,20,20\n18,20,20\n"))
	require.NoError(t, err)
	r := EstimateFraction(6, ex, 0.95)
	require.Len(t, r.Methods, 4)
	names := []string{}
	for _, m := range r.Methods {
		names = append(names, m.Name)
	}
	require.Equal(t, []string{NameHSK, NameLimitedHSK, NameSMC, NameMLE}, names)
	require.Nil(t, r.LimitedHSK)
	require.Nil(t, r.Methods[1].Estimate)
	require.Contains(t, r.Methods[1].Refused, "interval")
	require.True(t, slices.ContainsFunc(r.Methods, func(m Method) bool { return m.Estimate != nil }))
	var b bytes.Buffer
	WriteMethods(&b, "", r.Methods)
	require.Contains(t, b.String(), "limited HSK refused:")
}
