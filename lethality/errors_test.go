package lethality

import (
	"math"
	"strings"
	"testing"

	"github.com/dzf-go/dzf/internal/apicheck"
)

// readOnlyTables are the package-level variables that are not error
// sentinels: lookup tables that nothing writes after initialization, each
// saying so in its doc comment.
var readOnlyTables = map[string]bool{"exp2Table": true, "pow10": true}

// TestSentinels audits the package's errors against its source: every
// package-level variable is a documented error sentinel listed in
// sentinels or a read-only table (no other package state), and each
// sentinel is reached through the public API, with errors.Is, by an input
// whose message names the offending sample, probe, line or column.
// Records are invented.
func TestSentinels(t *testing.T) {
	f := func(s []Sample, set *FSettings) func() error {
		return func() error { _, err := F(s, MoistHeat(), set); return err }
	}
	read := func(text string, set *ReadSettings) func() error {
		return func() error { _, err := ReadRecord(strings.NewReader(text), set); return err }
	}
	sec := &ReadSettings{Time: TimeSeconds}
	cycle := func(rec Record) func() error {
		return func() error { _, err := Cycle(rec, MoistHeat(), nil); return err }
	}
	row := func(line int, m float64, c ...float64) Row { return Row{Line: line, Minutes: m, Celsius: c} }
	cases := []apicheck.Refusal{
		{"ErrInvalidReference", ErrInvalidReference, func() error { _, err := LethalRate(121, Reference{TRef: 121, Z: 0}); return err }, "reference T_ref 121 °C, z 0 °C"},
		{"ErrTooFewSamples", ErrTooFewSamples, f([]Sample{{0, 121}}, nil), "1 samples"},
		{"ErrNonFinite", ErrNonFinite, f([]Sample{{0, 121}, {1, math.NaN()}}, nil), "samples[1] (1 min, NaN °C)"},
		{"ErrTimeOrder", ErrTimeOrder, f([]Sample{{0, 121}, {2, 121}, {1, 121}}, nil), "samples[2] at 1 min after 2 min"},
		{"ErrUnknownRule", ErrUnknownRule, f([]Sample{{0, 121}, {1, 121}}, &FSettings{Rule: "simpson"}), `rule "simpson"`},
		{"ErrGap", ErrGap, f([]Sample{{0, 121}, {10, 121}}, &FSettings{MaxGap: 5}), "samples[1]: 10 min from 0 to 10 min, longer than 5 min"},
		{"ErrOverflow", ErrOverflow, func() error { _, err := LethalRate(1e6, MoistHeat()); return err }, "lethal rate at 1e+06 °C"},
		{"ErrInvalidD", ErrInvalidD, func() error { _, err := Survivors(6, 12, 0); return err }, "D 0 min"},
		{"ErrNegativeF", ErrNegativeF, func() error { _, err := Survivors(6, -1, 1.5); return err }, "F -1 min"},
		{"ErrNothingToKill", ErrNothingToKill, func() error { _, err := RequiredF(2, 1.5, 3); return err }, "log10 SAL 3 ≥ log10 N0 2"},
		{"ErrInvalidSetting", ErrInvalidSetting, f([]Sample{{0, 121}, {1, 121}}, &FSettings{MaxGap: -1}), "max gap -1 min"},
		{"ErrMissing", ErrMissing, cycle(Record{Probes: []string{"P1"}, Rows: []Row{row(3, 0, 121), row(4, 1, math.NaN())}}), `row 1 (line 4, 1 min), probe "P1"`},
		{"ErrNoProbe", ErrNoProbe, func() error {
			_, _, err := Record{Probes: []string{"P1"}, Rows: []Row{row(3, 0, 121)}}.Series(5)
			return err
		}, "probe index 5 of 1 probes"},
		{"ErrRowLength", ErrRowLength, cycle(Record{Probes: []string{"P1"}, Rows: []Row{row(3, 0, 121), row(4, 1, 121, 122)}}), "row 1 (line 4, 1 min): 2 temperatures for 1 probes"},
		{"ErrInvalidProbability", ErrInvalidProbability, func() error { _, err := Log10SurvivorsForPNSU(0.5); return err }, "log10 PNSU 0.5"},
		{"ErrInvalidStudy", ErrInvalidStudy, func() error {
			_, err := HalfCycle(HalfCycleStudy{Log10N0: 6, Units: 10, Negative: 11}, nil)
			return err
		}, "11 negative of 10 units"},
		{"ErrHeader", ErrHeader, read("", nil), "line 1: no header line"},
		{"ErrDelimiter", ErrDelimiter, read("s,a;b\n", nil), "line 1: header has 1 commas, 1 semicolons and 0 tabs"},
		{"ErrFieldCount", ErrFieldCount, read("s,a,b\n0,1,2\n1,2\n", sec), "line 3: 2 fields, the header has 3"},
		{"ErrBlankCell", ErrBlankCell, read("s,a,b\n0,1,2\n1,,2\n", sec), `line 3, column 2: probe "a"`},
		{"ErrBadNumber", ErrBadNumber, read("s,a,b\n0,1,2\n1,2,x7\n", sec), `line 3, column 3: probe "b": "x7"`},
		{"ErrBadTime", ErrBadTime, read("s,a\n0,1\nsoon,2\n", sec), `line 3, column 1: time "soon"`},
		{"ErrTimeUnit", ErrTimeUnit, read("t,a\n0,1\n", nil), `line 2, column 1: numeric time "0"`},
		{"ErrQuote", ErrQuote, read("s,a\n0,\"1\n", sec), "line 2, column 2: unterminated quoted field"},
		{"ErrNoRows", ErrNoRows, read("s,a\n", sec), "line 2: header but no row"},
	}
	apicheck.CheckSentinels(t, ".", sentinels, readOnlyTables, cases)
}
