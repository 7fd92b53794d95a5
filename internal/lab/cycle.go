package lab

import (
	"errors"
	"fmt"
	"io"

	"github.com/dzf-go/dzf/lethality"
)

// ReadCycle reads a logger export as lethality.ReadRecord does (see
// lethality.Reader for the format and s for the options), and reports a
// problem as an *Error naming the file, the line and the probe's column.
func ReadCycle(file string, src io.Reader, s *lethality.ReadSettings) (lethality.Record, error) {
	rd, err := lethality.NewReader(src, s)
	if err != nil {
		return lethality.Record{}, cycleError(file, nil, err)
	}
	probes := append([]string(nil), rd.Probes()...)
	rec := lethality.Record{Probes: probes, Comments: rd.Comments()}
	for {
		row, err := rd.Next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return lethality.Record{}, cycleError(file, probes, err)
		}
		row.Celsius = append([]float64(nil), row.Celsius...) // the reader reuses it
		rec.Rows = append(rec.Rows, row)
		rec.Missing = append(rec.Missing, rd.Missing()...)
	}
	if len(rec.Rows) == 0 {
		return lethality.Record{}, &Error{File: file, Err: ErrNoRows}
	}
	if t, ok := rd.Start(); ok {
		rec.Start = &t
	}
	return rec, nil
}

// cycleError converts the reader's *lethality.ParseError, whose column is a
// number, into an *Error naming the column.
func cycleError(file string, probes []string, err error) error {
	var pe *lethality.ParseError
	if !errors.As(err, &pe) {
		return &Error{File: file, Err: fmt.Errorf("%w: %w", ErrSyntax, err)}
	}
	e := &Error{File: file, Line: pe.Line, Err: pe.Err}
	switch {
	case pe.Column == 1 && probes != nil:
		e.Column = "time"
	case pe.Column >= 2 && pe.Column-2 < len(probes):
		e.Column = probes[pe.Column-2]
	default:
		e.Field = pe.Column
	}
	return e
}
