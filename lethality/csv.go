package lethality

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"
)

// TimeFormat names how the first column of a logger export gives time.
type TimeFormat string

// The time formats. The empty TimeFormat (TimeAuto) accepts RFC 3339
// timestamps and refuses numbers with ErrTimeUnit: the reader never guesses
// whether a number is seconds or minutes, since the two differ by a factor
// of 60 in F.
const (
	TimeAuto    TimeFormat = ""
	TimeSeconds TimeFormat = "seconds"
	TimeMinutes TimeFormat = "minutes"
	// TimeRFC3339 reads timestamps such as 2031-04-02T10:15:00Z or
	// 2031-04-02T10:15:00.5+02:00; times become minutes since the first row.
	TimeRFC3339 TimeFormat = "rfc3339"
)

// TempUnit names the unit of the probe columns.
type TempUnit string

// The temperature units. The empty TempUnit means Celsius. Fahrenheit
// readings are converted to °C as (°F − 32)·5/9.
const (
	Celsius    TempUnit = "celsius"
	Fahrenheit TempUnit = "fahrenheit"
)

// MissingPolicy says what the reader does with a blank or unreadable probe
// cell.
type MissingPolicy string

// The missing-cell policies. The empty MissingPolicy means MissingRefuse.
const (
	// MissingRefuse stops with a *ParseError wrapping ErrBlankCell or
	// ErrBadNumber.
	MissingRefuse MissingPolicy = "refuse"
	// MissingMark keeps the row, sets the cell to NaN and lists it (Row
	// cells marked missing are listed by Reader.Missing and in
	// Record.Missing). A time cell is never marked: a row without a time
	// is refused.
	MissingMark MissingPolicy = "mark"
)

// ReadSettings configures the logger-export reader. A nil *ReadSettings and
// every zero field mean the defaults.
type ReadSettings struct {
	// Delimiter is ',', ';' or '\t'; 0 detects it from the header line
	// (the candidate that occurs most often; a tie is refused).
	Delimiter rune `json:"delimiter,omitempty"`
	// Time is the time column's format; default TimeAuto.
	Time TimeFormat `json:"time,omitempty"`
	// Unit is the unit of the probe columns; default Celsius.
	Unit TempUnit `json:"unit,omitempty"`
	// Missing is the policy for blank or unreadable probe cells; default
	// MissingRefuse.
	Missing MissingPolicy `json:"missing,omitempty"`
	// DecimalComma reads "121,3" as 121.3 (with a ';' or tab delimiter).
	DecimalComma bool `json:"decimal_comma,omitempty"`
}

// ParseError is a problem at a line and column of a logger export. Line
// counts every line of the input from 1 (comments and blank lines
// included); Column is the field number from 1, as a spreadsheet shows it
// (0 when the problem concerns the whole line). Err wraps one of the
// reader's sentinels (ErrHeader, ErrFieldCount, ErrBlankCell, ...), tested
// with errors.Is.
type ParseError struct {
	Line   int
	Column int
	Err    error
}

// Error formats the error as "line L, column C: ...".
func (e *ParseError) Error() string {
	if e.Column == 0 {
		return fmt.Sprintf("line %d: %v", e.Line, e.Err)
	}
	return fmt.Sprintf("line %d, column %d: %v", e.Line, e.Column, e.Err)
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

// Row is one data line of a logger export: its line number, the time in
// minutes (since the first row for timestamps) and one temperature per probe
// in °C, NaN where the cell was marked missing.
type Row struct {
	Line    int       `json:"line"`
	Minutes float64   `json:"minutes"`
	Celsius []float64 `json:"celsius"`
}

// MarshalJSON implements json.Marshaler, writing a missing (NaN) reading as
// null.
func (r Row) MarshalJSON() ([]byte, error) {
	cs := make([]*float64, len(r.Celsius))
	for i := range r.Celsius {
		if finite(r.Celsius[i]) {
			cs[i] = &r.Celsius[i]
		}
	}
	return json.Marshal(struct {
		Line    int        `json:"line"`
		Minutes float64    `json:"minutes"`
		Celsius []*float64 `json:"celsius"`
	}{r.Line, r.Minutes, cs})
}

// Cell is a probe cell marked missing, with the reason.
type Cell struct {
	Line    int     `json:"line"`
	Column  int     `json:"column"`
	Probe   string  `json:"probe"`
	Minutes float64 `json:"minutes"`
	Text    string  `json:"text"`
	Reason  string  `json:"reason"`
}

// Reader reads a logger export row by row in bounded memory: a header line
// naming the time column and one column per probe, then one line per
// reading. Lines starting with '#' are comments (kept by Comments when they
// come before the header) and blank lines are skipped; every other line is a
// row or an error. Fields may be quoted with '"' (a quote inside a quoted
// field is doubled); a field cannot span lines. Surrounding spaces are
// trimmed. A Reader is not safe for concurrent use.
type Reader struct {
	br       *bufio.Reader
	set      ReadSettings
	delim    byte
	timeFmt  TimeFormat
	probes   []string
	comments []string
	line     int
	rows     int
	start    time.Time
	hasStart bool
	prev     float64
	row      Row
	missing  []Cell
	fields   [][]byte
	long     []byte // a line longer than the bufio buffer
	scratch  []byte
	err      error // sticky
}

// NewReader reads the comment lines and the header of src and returns a
// Reader positioned at the first row. It refuses invalid settings
// (ErrInvalidSetting), a missing or bad header and an undetectable
// delimiter (*ParseError wrapping ErrHeader or ErrDelimiter).
func NewReader(src io.Reader, s *ReadSettings) (*Reader, error) {
	var set ReadSettings
	if s != nil {
		set = *s
	}
	switch set.Delimiter {
	case 0, ',', ';', '\t':
	default:
		return nil, fmt.Errorf("delimiter %q (want ',', ';' or tab): %w", set.Delimiter, ErrInvalidSetting)
	}
	if set.DecimalComma && set.Delimiter == ',' {
		return nil, fmt.Errorf("decimal comma with a comma delimiter: %w", ErrInvalidSetting)
	}
	switch set.Time {
	case TimeAuto, TimeSeconds, TimeMinutes, TimeRFC3339:
	default:
		return nil, fmt.Errorf("time format %q (want %q, %q or %q): %w", set.Time, TimeSeconds, TimeMinutes, TimeRFC3339, ErrInvalidSetting)
	}
	switch set.Unit {
	case "", Celsius, Fahrenheit:
	default:
		return nil, fmt.Errorf("temperature unit %q (want %q or %q): %w", set.Unit, Celsius, Fahrenheit, ErrInvalidSetting)
	}
	switch set.Missing {
	case "", MissingRefuse, MissingMark:
	default:
		return nil, fmt.Errorf("missing-cell policy %q (want %q or %q): %w", set.Missing, MissingRefuse, MissingMark, ErrInvalidSetting)
	}
	if src == nil {
		return nil, &ParseError{Line: 1, Err: fmt.Errorf("no input: %w", ErrHeader)}
	}
	r := &Reader{br: bufio.NewReaderSize(src, 64<<10), set: set, timeFmt: set.Time}
	if err := r.readHeader(); err != nil {
		return nil, err
	}
	return r, nil
}

// Probes returns the probe names of the header, in column order.
func (r *Reader) Probes() []string { return append([]string(nil), r.probes...) }

// Comments returns the comment lines before the header, without their '#'.
func (r *Reader) Comments() []string { return append([]string(nil), r.comments...) }

// Rows returns the number of rows read so far.
func (r *Reader) Rows() int { return r.rows }

// Start returns the timestamp of the first row, for RFC 3339 time columns
// (ok false otherwise or before the first row).
func (r *Reader) Start() (t time.Time, ok bool) { return r.start, r.hasStart }

// Missing returns the cells of the last row returned by Next that were
// marked missing. The slice is reused by the next call to Next.
func (r *Reader) Missing() []Cell { return r.missing }

// Next returns the next row, or io.EOF after the last. The returned Row's
// Celsius slice is reused by the next call to Next: copy it to keep it. An
// error other than io.EOF is a *ParseError (or a read error of the
// underlying reader) and is returned again by every later call.
func (r *Reader) Next() (Row, error) {
	if r.err != nil {
		return Row{}, r.err
	}
	row, err := r.next()
	if err != nil {
		r.err = err
		return Row{}, err
	}
	return row, nil
}

// readLine returns the next line without its line ending, or io.EOF.
func (r *Reader) readLine() ([]byte, error) {
	b, err := r.br.ReadSlice('\n')
	if err == bufio.ErrBufferFull {
		r.long = append(r.long[:0], b...)
		for err == bufio.ErrBufferFull {
			b, err = r.br.ReadSlice('\n')
			r.long = append(r.long, b...)
		}
		b = r.long
	}
	if err != nil && err != io.EOF {
		return nil, err
	}
	if len(b) == 0 && err == io.EOF {
		return nil, io.EOF
	}
	r.line++
	b = bytes.TrimSuffix(b, []byte{'\n'})
	b = bytes.TrimSuffix(b, []byte{'\r'})
	if r.line == 1 {
		b = bytes.TrimPrefix(b, []byte("\xef\xbb\xbf")) // UTF-8 byte order mark
	}
	return b, nil
}

func (r *Reader) readHeader() error {
	for {
		b, err := r.readLine()
		if err == io.EOF {
			return &ParseError{Line: r.line + 1, Err: fmt.Errorf("no header line: %w", ErrHeader)}
		}
		if err != nil {
			return err
		}
		if len(bytes.TrimSpace(b)) == 0 {
			continue
		}
		if b[0] == '#' {
			r.comments = append(r.comments, strings.TrimSpace(string(b[1:])))
			continue
		}
		if r.set.Delimiter != 0 {
			r.delim = byte(r.set.Delimiter)
		} else {
			d, err := detectDelimiter(b)
			if err != nil {
				return &ParseError{Line: r.line, Err: err}
			}
			r.delim = d
		}
		if r.set.DecimalComma && r.delim == ',' {
			return &ParseError{Line: r.line, Err: fmt.Errorf("decimal comma with a comma delimiter: %w", ErrDelimiter)}
		}
		fields, col, err := r.split(b)
		if err != nil {
			return &ParseError{Line: r.line, Column: col, Err: err}
		}
		if len(fields) < 2 {
			return &ParseError{Line: r.line, Err: fmt.Errorf("%d column(s), want a time column and at least one probe: %w", len(fields), ErrHeader)}
		}
		seen := map[string]int{}
		for j, f := range fields[1:] {
			name := string(f)
			if name == "" {
				return &ParseError{Line: r.line, Column: j + 2, Err: fmt.Errorf("empty probe name: %w", ErrHeader)}
			}
			if k, dup := seen[name]; dup {
				return &ParseError{Line: r.line, Column: j + 2, Err: fmt.Errorf("probe name %q repeats column %d: %w", name, k, ErrHeader)}
			}
			seen[name] = j + 2
			r.probes = append(r.probes, name)
		}
		r.row.Celsius = make([]float64, len(r.probes))
		return nil
	}
}

// detectDelimiter picks the delimiter that occurs most often in the header
// line (outside quotes).
func detectDelimiter(b []byte) (byte, error) {
	var n [3]int
	cand := [3]byte{',', ';', '\t'}
	inQuote := false
	for _, c := range b {
		if c == '"' {
			inQuote = !inQuote
			continue
		}
		if inQuote {
			continue
		}
		for i, d := range cand {
			if c == d {
				n[i]++
			}
		}
	}
	best, tie := 0, false
	for i := 1; i < 3; i++ {
		switch {
		case n[i] > n[best]:
			best, tie = i, false
		case n[i] == n[best]:
			tie = true
		}
	}
	if n[best] == 0 {
		return 0, fmt.Errorf("no comma, semicolon or tab in the header: %w", ErrDelimiter)
	}
	if tie {
		return 0, fmt.Errorf("header has %d commas, %d semicolons and %d tabs: set ReadSettings.Delimiter: %w", n[0], n[1], n[2], ErrDelimiter)
	}
	return cand[best], nil
}

// split cuts a line into trimmed fields (reusing r.fields), returning the
// column of a quoting error.
func (r *Reader) split(b []byte) ([][]byte, int, error) {
	r.fields = r.fields[:0]
	if bytes.IndexByte(b, '"') < 0 {
		for {
			i := bytes.IndexByte(b, r.delim)
			if i < 0 {
				r.fields = append(r.fields, bytes.TrimSpace(b))
				return r.fields, 0, nil
			}
			r.fields = append(r.fields, bytes.TrimSpace(b[:i]))
			b = b[i+1:]
		}
	}
	// Quoted fields: unquote into a fresh buffer (rare; headers mostly).
	var out []byte
	var starts []int
	col := 1
	for {
		b = bytes.TrimLeft(b, " ")
		starts = append(starts, len(out))
		if len(b) > 0 && b[0] == '"' {
			b = b[1:]
			for {
				i := bytes.IndexByte(b, '"')
				if i < 0 {
					return nil, col, fmt.Errorf("unterminated quoted field: %w", ErrQuote)
				}
				out = append(out, b[:i]...)
				b = b[i+1:]
				if len(b) > 0 && b[0] == '"' {
					out = append(out, '"')
					b = b[1:]
					continue
				}
				break
			}
			b = bytes.TrimLeft(b, " ")
			if len(b) > 0 && b[0] != r.delim {
				return nil, col, fmt.Errorf("text after a closing quote: %w", ErrQuote)
			}
		} else {
			i := bytes.IndexByte(b, r.delim)
			end := len(b)
			if i >= 0 {
				end = i
			}
			if bytes.IndexByte(b[:end], '"') >= 0 {
				return nil, col, fmt.Errorf("quote inside an unquoted field: %w", ErrQuote)
			}
			out = append(out, bytes.TrimSpace(b[:end])...)
			b = b[end:]
		}
		if len(b) == 0 {
			break
		}
		b = b[1:] // the delimiter
		col++
	}
	starts = append(starts, len(out))
	for i := 0; i+1 < len(starts); i++ {
		r.fields = append(r.fields, out[starts[i]:starts[i+1]])
	}
	return r.fields, 0, nil
}

func (r *Reader) next() (Row, error) {
	for {
		b, err := r.readLine()
		if err != nil {
			return Row{}, err
		}
		if len(b) == 0 || b[0] == '#' || len(bytes.TrimSpace(b)) == 0 {
			continue
		}
		fields, col, err := r.split(b)
		if err != nil {
			return Row{}, &ParseError{Line: r.line, Column: col, Err: err}
		}
		if len(fields) != len(r.probes)+1 {
			return Row{}, &ParseError{Line: r.line, Err: fmt.Errorf("%d fields, the header has %d: %w", len(fields), len(r.probes)+1, ErrFieldCount)}
		}
		minutes, err := r.parseTime(fields[0])
		if err != nil {
			return Row{}, &ParseError{Line: r.line, Column: 1, Err: err}
		}
		if r.rows > 0 && !(minutes > r.prev) {
			return Row{}, &ParseError{Line: r.line, Column: 1, Err: fmt.Errorf("time %g min after %g min: %w", minutes, r.prev, ErrTimeOrder)}
		}
		r.missing = r.missing[:0]
		for j, f := range fields[1:] {
			v, err := r.parseTemp(f)
			if err != nil {
				if r.set.Missing != MissingMark {
					return Row{}, &ParseError{Line: r.line, Column: j + 2, Err: fmt.Errorf("probe %q: %w", r.probes[j], err)}
				}
				reason := "blank"
				if errors.Is(err, ErrBadNumber) {
					reason = "unreadable"
				}
				r.missing = append(r.missing, Cell{Line: r.line, Column: j + 2, Probe: r.probes[j], Minutes: minutes, Text: string(f), Reason: reason})
				v = math.NaN()
			}
			r.row.Celsius[j] = v
		}
		r.prev = minutes
		r.rows++
		r.row.Line = r.line
		r.row.Minutes = minutes
		return r.row, nil
	}
}

func (r *Reader) parseTime(f []byte) (float64, error) {
	if len(f) == 0 {
		return 0, fmt.Errorf("time: %w", ErrBlankCell)
	}
	format := r.timeFmt
	if format == TimeAuto {
		if _, err := time.Parse(time.RFC3339Nano, string(f)); err == nil {
			format = TimeRFC3339
		} else if _, ok := r.number(f); ok {
			return 0, fmt.Errorf("numeric time %q: set ReadSettings.Time to %q or %q: %w", f, TimeSeconds, TimeMinutes, ErrTimeUnit)
		} else {
			return 0, fmt.Errorf("time %q is neither a number nor an RFC 3339 timestamp: %w", f, ErrBadTime)
		}
		r.timeFmt = format
	}
	switch format {
	case TimeRFC3339:
		t, err := time.Parse(time.RFC3339Nano, string(f))
		if err != nil {
			return 0, fmt.Errorf("time %q is not an RFC 3339 timestamp: %w", f, ErrBadTime)
		}
		if !r.hasStart {
			r.start, r.hasStart = t, true
		}
		return t.Sub(r.start).Minutes(), nil
	case TimeSeconds:
		v, ok := r.number(f)
		if !ok {
			return 0, fmt.Errorf("time %q is not a finite number of seconds: %w", f, ErrBadTime)
		}
		return v / 60, nil
	}
	v, ok := r.number(f)
	if !ok {
		return 0, fmt.Errorf("time %q is not a finite number of minutes: %w", f, ErrBadTime)
	}
	return v, nil
}

// number parses a numeric cell, with a decimal comma when so set.
func (r *Reader) number(f []byte) (float64, bool) {
	if r.set.DecimalComma {
		if i := bytes.IndexByte(f, ','); i >= 0 {
			r.scratch = append(r.scratch[:0], f...)
			r.scratch[i] = '.'
			f = r.scratch
		}
	}
	return parseNumber(f)
}

func (r *Reader) parseTemp(f []byte) (float64, error) {
	if len(f) == 0 {
		return 0, ErrBlankCell
	}
	v, ok := r.number(f)
	if !ok {
		return 0, fmt.Errorf("%q: %w", f, ErrBadNumber)
	}
	if r.set.Unit == Fahrenheit {
		v = (v - 32) * 5 / 9
	}
	return v, nil
}

// pow10 holds the exactly representable powers 10⁰…10²². It is read only.
var pow10 = [...]float64{1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10,
	1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22}

// parseNumber parses a finite decimal number. Plain decimals of up to 15
// significant digits ([+-]ddd[.ddd]) are converted directly: the integer
// mantissa and the power of ten are exact in float64, so one division gives
// the correctly rounded value (the fast path of correct decimal conversion).
// Anything else goes to strconv.ParseFloat; non-finite results are refused.
func parseNumber(b []byte) (float64, bool) {
	i, neg := 0, false
	if len(b) > 0 && (b[0] == '-' || b[0] == '+') {
		neg, i = b[0] == '-', 1
	}
	var m uint64
	sig, frac, dot, digit := 0, 0, false, false
	for ; i < len(b); i++ {
		c := b[i]
		if c >= '0' && c <= '9' {
			digit = true
			if m != 0 || c != '0' {
				sig++ // significant digits; m may wrap past 19, then unused
			}
			m = m*10 + uint64(c-'0')
			if dot {
				frac++
			}
			continue
		}
		if c == '.' && !dot {
			dot = true
			continue
		}
		break
	}
	if i == len(b) && digit && sig <= 15 && frac < len(pow10) {
		v := float64(m) / pow10[frac]
		if neg {
			v = -v
		}
		return v, true
	}
	v, err := strconv.ParseFloat(string(b), 64)
	if err != nil || !finite(v) {
		return 0, false
	}
	return v, true
}
