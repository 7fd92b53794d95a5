package lethality

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"math/rand/v2"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"
)

func TestReadRecordFormats(t *testing.T) {
	// Invented readings, one record written five ways.
	want := []Row{{Minutes: 0, Celsius: []float64{20.5, 21}}, {Minutes: 0.5, Celsius: []float64{100, 99.25}}, {Minutes: 1, Celsius: []float64{121.1, 120}}}
	cases := []struct {
		name string
		text string
		set  *ReadSettings
	}{
		{"comma, seconds", "t_s,P1,P2\n0,20.5,21\n30,100,99.25\n60,121.1,120\n", &ReadSettings{Time: TimeSeconds}},
		{"semicolon, minutes, CRLF", "min;P1;P2\r\n0;20.5;21\r\n0.5;100;99.25\r\n1;121.1;120\r\n", &ReadSettings{Time: TimeMinutes}},
		{"tab, RFC 3339 detected", "when\tP1\tP2\n2031-04-02T10:00:00Z\t20.5\t21\n2031-04-02T10:00:30Z\t100\t99.25\n2031-04-02T12:01:00+02:00\t121.1\t120\n", nil},
		{"fahrenheit", "s,P1,P2\n0,68.9,69.8\n30,212,210.65\n60,249.98,248\n", &ReadSettings{Time: TimeSeconds, Unit: Fahrenheit}},
		{"decimal comma, comments, BOM, blank lines, quotes", "\xef\xbb\xbf# invented\n# second comment\n\n\"time\";\"P1\";\"P2\"\n0;20,5;21\n\n0,5;100;99,25\n1;\"121,1\";120\n",
			&ReadSettings{Time: TimeMinutes, Delimiter: ';', DecimalComma: true}},
		{"spaces around fields", "time , P1 , P2\n 0 , 20.5, 21 \n0.5,100 ,99.25\n1,121.1,120\n", &ReadSettings{Time: TimeMinutes}},
	}
	for _, c := range cases {
		rec, err := ReadRecord(strings.NewReader(c.text), c.set)
		if err != nil {
			t.Errorf("%s: %v", c.name, err)
			continue
		}
		if len(rec.Probes) != 2 || rec.Probes[0] != "P1" || rec.Probes[1] != "P2" || len(rec.Rows) != 3 {
			t.Errorf("%s: probes %q, %d rows", c.name, rec.Probes, len(rec.Rows))
			continue
		}
		for i, r := range rec.Rows {
			near(t, c.name+" minutes", r.Minutes, want[i].Minutes, 1e-12, 0)
			for j := range r.Celsius {
				// °F converted by (°F − 32)·5/9: 249.98 °F = 121.1 °C (hand-worked).
				near(t, c.name+" celsius", r.Celsius[j], want[i].Celsius[j], 1e-12, 0)
			}
		}
	}
	rec, err := ReadRecord(strings.NewReader(cases[4].text), cases[4].set)
	if err != nil || len(rec.Comments) != 2 || rec.Comments[0] != "invented" || rec.Rows[2].Line != 8 {
		t.Errorf("comments %q, line of the last row %d, %v", rec.Comments, rec.Rows[2].Line, err)
	}
	rec, _ = ReadRecord(strings.NewReader(cases[2].text), nil)
	if rec.Start == nil || !rec.Start.Equal(time.Date(2031, 4, 2, 10, 0, 0, 0, time.UTC)) {
		t.Errorf("start %v", rec.Start)
	}
}

func TestReadRecordRoundTrip(t *testing.T) {
	// Write a record with strconv's shortest formatting, read it back:
	// every value comes back bit for bit (seeded, invented values).
	rng := rand.New(rand.NewPCG(5, 6))
	for _, d := range []string{",", ";", "\t"} {
		var b strings.Builder
		b.WriteString("# invented round-trip data\nseconds" + d + "a" + d + "b" + d + "c" + d + "d\n")
		var rows [][]float64
		tm := 0.0
		for range 500 {
			tm += 0.5 + rng.Float64()
			row := []float64{tm}
			for range 4 {
				v := 100 + 30*rng.Float64()
				if rng.IntN(3) == 0 {
					v = math.Round(v*10) / 10 // short decimals: the fast path
				}
				row = append(row, v)
			}
			rows = append(rows, row)
			for j, v := range row {
				if j > 0 {
					b.WriteString(d)
				}
				b.WriteString(strconv.FormatFloat(v, 'g', -1, 64))
			}
			b.WriteString("\n")
		}
		rec, err := ReadRecord(strings.NewReader(b.String()), &ReadSettings{Time: TimeSeconds})
		if err != nil {
			t.Fatal(err)
		}
		for i, r := range rec.Rows {
			if r.Minutes != rows[i][0]/60 {
				t.Fatalf("delimiter %q row %d: minutes %v, want %v", d, i, r.Minutes, rows[i][0]/60)
			}
			for j, v := range r.Celsius {
				if v != rows[i][j+1] {
					t.Fatalf("delimiter %q row %d probe %d: %v, want %v", d, i, j, v, rows[i][j+1])
				}
			}
		}
	}
}

func TestParseNumberMatchesStrconv(t *testing.T) {
	// The fast path against strconv.ParseFloat on random decimals (seeded).
	rng := rand.New(rand.NewPCG(1, 2))
	for range 200000 {
		digits := 1 + rng.IntN(17)
		s := strconv.FormatUint(rng.Uint64N(uint64(math.Pow10(min(digits, 18)))), 10)
		if k := rng.IntN(len(s) + 1); k < len(s) {
			s = s[:k] + "." + s[k:]
		}
		if rng.IntN(2) == 0 {
			s = "-" + s
		}
		want, err := strconv.ParseFloat(s, 64)
		got, ok := parseNumber([]byte(s))
		if err != nil || !ok || math.Float64bits(got) != math.Float64bits(want) {
			t.Fatalf("parseNumber(%q) = %v, %v; strconv %v, %v", s, got, ok, want, err)
		}
	}
	for _, s := range []string{"", "-", "+", ".", "-.", "1.2.3", "12a", "NaN", "Inf", "-inf", "1e400", "0x", "1,5"} {
		if v, ok := parseNumber([]byte(s)); ok {
			t.Errorf("parseNumber(%q) = %v, want a refusal", s, v)
		}
	}
	for s, want := range map[string]float64{"1e3": 1000, ".5": 0.5, "5.": 5, "+2.25": 2.25, "0x1p4": 16, "-0": 0, "000121.10": 121.1} {
		if v, ok := parseNumber([]byte(s)); !ok || v != want {
			t.Errorf("parseNumber(%q) = %v, %v; want %v", s, v, ok, want)
		}
	}
}

func TestReadRecordErrors(t *testing.T) {
	sec := &ReadSettings{Time: TimeSeconds}
	cases := []struct {
		name      string
		text      string
		set       *ReadSettings
		want      error
		line, col int
	}{
		{"empty input", "", nil, ErrHeader, 1, 0},
		{"comments only", "# nothing\n", nil, ErrHeader, 2, 0},
		{"one column", "seconds\n0\n", nil, ErrDelimiter, 1, 0},
		{"one column with delimiter set", "seconds\n0\n", &ReadSettings{Delimiter: ','}, ErrHeader, 1, 0},
		{"ambiguous delimiter", "s,a;b\n", nil, ErrDelimiter, 1, 0},
		{"empty probe name", "s,a,,c\n", sec, ErrHeader, 1, 3},
		{"repeated probe name", "s,a,b,a\n", sec, ErrHeader, 1, 4},
		{"no row", "s,a\n", sec, ErrNoRows, 2, 0},
		{"too few fields", "s,a,b\n0,1,2\n1,2\n", sec, ErrFieldCount, 3, 0},
		{"too many fields", "s,a,b\n0,1,2,3\n", sec, ErrFieldCount, 2, 0},
		{"blank cell", "s,a,b\n0,1,2\n1,,2\n", sec, ErrBlankCell, 3, 2},
		{"bad number", "s,a,b\n0,1,2\n1,2,x7\n", sec, ErrBadNumber, 3, 3},
		{"NaN text", "s,a,b\n0,1,NaN\n", sec, ErrBadNumber, 2, 3},
		{"Inf text", "s,a,b\n0,Inf,1\n", sec, ErrBadNumber, 2, 2},
		{"blank time", "s,a\n0,1\n,2\n", sec, ErrBlankCell, 3, 1},
		{"bad time", "s,a\n0,1\nsoon,2\n", sec, ErrBadTime, 3, 1},
		{"bad timestamp", "t,a\n2031-04-02T10:00:00Z,1\n2031-04-02 10:01,2\n", &ReadSettings{Time: TimeRFC3339}, ErrBadTime, 3, 1},
		{"numeric time, no unit", "t,a\n0,1\n", nil, ErrTimeUnit, 2, 1},
		{"neither number nor timestamp", "t,a\nnoon,1\n", nil, ErrBadTime, 2, 1},
		{"repeated time", "s,a\n0,1\n5,2\n5,3\n", sec, ErrTimeOrder, 4, 1},
		{"time going back", "# c\ns,a\n0,1\n5,2\n4,3\n", sec, ErrTimeOrder, 5, 1},
		{"unterminated quote", "s,a\n0,\"1\n", sec, ErrQuote, 2, 2},
		{"text after quote", "s,a\n0,\"1\"x\n", sec, ErrQuote, 2, 2},
		{"quote inside field", "s,a\n0,1\"2\n", sec, ErrQuote, 2, 2},
		{"decimal comma with comma delimiter", "s,a\n", &ReadSettings{Time: TimeSeconds, DecimalComma: true}, ErrDelimiter, 1, 0},
	}
	for _, c := range cases {
		_, err := ReadRecord(strings.NewReader(c.text), c.set)
		if !errors.Is(err, c.want) {
			t.Errorf("%s: %v, want %v", c.name, err, c.want)
			continue
		}
		var pe *ParseError
		if !errors.As(err, &pe) || pe.Line != c.line || pe.Column != c.col {
			t.Errorf("%s: %v: want line %d, column %d", c.name, err, c.line, c.col)
		}
		if !strings.Contains(err.Error(), fmt.Sprintf("line %d", c.line)) {
			t.Errorf("%s: message %q lacks the line", c.name, err)
		}
	}
	for _, s := range []*ReadSettings{{Delimiter: '|'}, {Time: "hours"}, {Unit: "kelvin"}, {Missing: "drop"}, {Delimiter: ',', DecimalComma: true}} {
		if _, err := ReadRecord(strings.NewReader("s,a\n0,1\n"), s); !errors.Is(err, ErrInvalidSetting) {
			t.Errorf("settings %+v: %v", s, err)
		}
	}
}

func TestReadRecordMissingMarked(t *testing.T) {
	f, err := os.Open("../testdata/lethality/missing_cells.tsv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rec, err := ReadRecord(f, &ReadSettings{Time: TimeMinutes, Missing: MissingMark})
	if err != nil {
		t.Fatal(err)
	}
	// The file has a blank cell (P2 at 1 min, line 6) and "ERR" (P1 at
	// 2 min, line 8): both rows kept, the cells NaN and listed.
	if len(rec.Rows) != 6 || !math.IsNaN(rec.Rows[2].Celsius[1]) || !math.IsNaN(rec.Rows[4].Celsius[0]) {
		t.Fatalf("rows %+v", rec.Rows)
	}
	want := []Cell{
		{Line: 6, Column: 3, Probe: "P2", Minutes: 1, Text: "", Reason: "blank"},
		{Line: 8, Column: 2, Probe: "P1", Minutes: 2, Text: "ERR", Reason: "unreadable"},
	}
	if len(rec.Missing) != 2 || rec.Missing[0] != want[0] || rec.Missing[1] != want[1] {
		t.Errorf("missing %+v, want %+v", rec.Missing, want)
	}
	b, err := json.Marshal(rec)
	if err != nil || !bytes.Contains(b, []byte(`"celsius":[121.5,null]`)) {
		t.Errorf("JSON %s, %v", b, err)
	}
	// Refused by default, naming the line and column.
	f.Seek(0, io.SeekStart)
	_, err = ReadRecord(f, &ReadSettings{Time: TimeMinutes})
	var pe *ParseError
	if !errors.As(err, &pe) || pe.Line != 6 || pe.Column != 3 || !errors.Is(err, ErrBlankCell) {
		t.Errorf("default policy: %v", err)
	}
}

func TestReaderLongLine(t *testing.T) {
	// A line longer than the 64 KiB buffer: 3000 probes.
	var b strings.Builder
	b.WriteString("minutes")
	for j := range 3000 {
		fmt.Fprintf(&b, ",probe-%05d", j)
	}
	b.WriteString("\n")
	for i := range 3 {
		fmt.Fprintf(&b, "%d", i)
		for j := range 3000 {
			fmt.Fprintf(&b, ",%d.%d", 100+j%30, i)
		}
		b.WriteString("\n")
	}
	rec, err := ReadRecord(strings.NewReader(b.String()), &ReadSettings{Time: TimeMinutes})
	if err != nil {
		t.Fatal(err)
	}
	if len(rec.Probes) != 3000 || len(rec.Rows) != 3 || rec.Rows[2].Celsius[2999] != 129.2 {
		t.Errorf("%d probes, %d rows, last %v", len(rec.Probes), len(rec.Rows), rec.Rows[2].Celsius[2999])
	}
}
