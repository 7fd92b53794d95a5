package lab

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// table is a CSV file read whole: '#' comment lines, a header row naming
// the columns, then data rows. Column names are matched without regard to
// case or surrounding spaces.
type table struct {
	file   string
	index  map[string]int // column name → field position
	header int            // line of the header
	rows   []row
}

// row is one data row with its line in the file.
type row struct {
	line   int
	fields []string
}

// readTable reads src as a table with the required and optional columns;
// any other column is refused, so that a misspelt name is not ignored.
func readTable(file string, src io.Reader, required, optional []string) (*table, error) {
	data, err := io.ReadAll(src)
	if err != nil {
		return nil, &Error{File: file, Err: fmt.Errorf("%v: %w", err, ErrSyntax)}
	}
	data = bytes.TrimPrefix(data, []byte("\ufeff")) // a byte-order mark some spreadsheets write
	cr := csv.NewReader(bytes.NewReader(data))
	cr.Comment = '#'
	cr.FieldsPerRecord = -1 // checked here, to name the row
	t := &table{file: file, index: map[string]int{}}
	header, line, err := nextRecord(file, cr)
	if err == io.EOF {
		return nil, &Error{File: file, Err: ErrEmpty}
	}
	if err != nil {
		return nil, err
	}
	t.header = line
	if err := t.setHeader(header, required, optional); err != nil {
		return nil, err
	}
	for {
		fields, line, err := nextRecord(file, cr)
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		if len(fields) != len(header) {
			return nil, &Error{File: file, Line: line, Err: fmt.Errorf("%d fields where the header has %d: %w", len(fields), len(header), ErrFieldCount)}
		}
		t.rows = append(t.rows, row{line: line, fields: fields})
	}
	if len(t.rows) == 0 {
		return nil, &Error{File: file, Line: t.header, Err: ErrNoRows}
	}
	return t, nil
}

// nextRecord returns the next record that is not blank, with its line.
func nextRecord(file string, cr *csv.Reader) ([]string, int, error) {
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			return nil, 0, io.EOF
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return nil, 0, &Error{File: file, Line: pe.Line, Err: fmt.Errorf("%v: %w", pe.Err, ErrSyntax)}
			}
			return nil, 0, &Error{File: file, Err: fmt.Errorf("%v: %w", err, ErrSyntax)}
		}
		line, _ := cr.FieldPos(0)
		for i := range rec {
			rec[i] = strings.TrimSpace(rec[i])
		}
		if len(rec) == 1 && rec[0] == "" {
			continue // a line of spaces
		}
		return rec, line, nil
	}
}

// setHeader indexes the header and checks it against the format.
func (t *table) setHeader(header, required, optional []string) error {
	known := map[string]bool{}
	for _, c := range append(append([]string(nil), required...), optional...) {
		known[c] = true
	}
	for i, h := range header {
		name := strings.ToLower(h)
		switch {
		case name == "":
			return &Error{File: t.file, Line: t.header, Field: i + 1, Err: fmt.Errorf("empty column name: %w", ErrUnknownColumn)}
		case !known[name]:
			return &Error{File: t.file, Line: t.header, Column: h, Err: fmt.Errorf("%w (the format has %s)", ErrUnknownColumn, strings.Join(append(append([]string(nil), required...), optional...), ", "))}
		}
		if _, dup := t.index[name]; dup {
			return &Error{File: t.file, Line: t.header, Column: h, Err: ErrDuplicateColumn}
		}
		t.index[name] = i
	}
	for _, c := range required {
		if _, ok := t.index[c]; !ok {
			return &Error{File: t.file, Line: t.header, Column: c, Err: ErrMissingColumn}
		}
	}
	return nil
}

// text returns the cell of column col ("" when the column is absent).
func (t *table) text(r row, col string) string {
	i, ok := t.index[col]
	if !ok {
		return ""
	}
	return r.fields[i]
}

// fail returns an *Error at row r, column col.
func (t *table) fail(r row, col string, err error) error {
	return &Error{File: t.file, Line: r.line, Column: col, Err: err}
}

// num returns the cell as a finite number.
func (t *table) num(r row, col string) (float64, error) {
	s := t.text(r, col)
	if s == "" {
		return 0, t.fail(r, col, fmt.Errorf("blank cell: %w", ErrNumber))
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, t.fail(r, col, fmt.Errorf("%q: %w", s, ErrNumber))
	}
	return v, nil
}

// numIn returns the cell as a number accepted by ok, whose failure is
// described by want ("positive", "in (0, 1]", ...).
func (t *table) numIn(r row, col string, ok func(float64) bool, want string) (float64, error) {
	v, err := t.num(r, col)
	if err != nil {
		return 0, err
	}
	if !ok(v) {
		return 0, t.fail(r, col, fmt.Errorf("%s must be %s: %w", t.text(r, col), want, ErrValue))
	}
	return v, nil
}

// whole returns the cell as a whole number of at least lowest.
func (t *table) whole(r row, col string, lowest int) (int, error) {
	v, err := t.num(r, col)
	if err != nil {
		return 0, err
	}
	if v != math.Trunc(v) || math.Abs(v) > 1e9 {
		return 0, t.fail(r, col, fmt.Errorf("%q: %w", t.text(r, col), ErrWholeNumber))
	}
	if int(v) < lowest {
		return 0, t.fail(r, col, fmt.Errorf("%s must be at least %d: %w", t.text(r, col), lowest, ErrValue))
	}
	return int(v), nil
}

// Predicates of numIn.
func positive(v float64) bool    { return v > 0 }
func nonNegative(v float64) bool { return v >= 0 }
