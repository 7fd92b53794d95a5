package lab

import (
	"errors"
	"fmt"
	"strings"
)

// Sentinel errors of the file readers. Every error a reader returns is an
// *Error (file, line, column) wrapping one of them; test with errors.Is.
var (
	// ErrEmpty reports a file with no header row: empty, or only comments
	// and blank lines.
	ErrEmpty = errors.New("no header row (the file is empty or holds only comments)")
	// ErrNoRows reports a file with a header but no data row.
	ErrNoRows = errors.New("no data row after the header")
	// ErrMissingColumn reports a required column absent from the header.
	ErrMissingColumn = errors.New("required column missing from the header")
	// ErrUnknownColumn reports a header column (or JSON field) that the
	// format does not define, often a misspelt name.
	ErrUnknownColumn = errors.New("column not defined by the format")
	// ErrDuplicateColumn reports a column named twice in the header.
	ErrDuplicateColumn = errors.New("column named twice in the header")
	// ErrFieldCount reports a row with more or fewer fields than the header.
	ErrFieldCount = errors.New("wrong number of fields")
	// ErrNumber reports a blank cell or one that is not a finite decimal
	// number where a number is required.
	ErrNumber = errors.New("not a finite number")
	// ErrWholeNumber reports a count that is not a whole number.
	ErrWholeNumber = errors.New("not a whole number")
	// ErrValue reports a value outside its documented range or set.
	ErrValue = errors.New("value out of range")
	// ErrSyntax reports a file that cannot be read as CSV or JSON at all
	// (bad quoting, a JSON syntax error).
	ErrSyntax = errors.New("malformed file")
	// ErrDemo reports a demo file name that the embedded scenario does not
	// hold.
	ErrDemo = errors.New("no such demo file")
)

// Error is a problem at a place in a laboratory file. File is the name the
// caller gave (a path, or "demo:NAME" for an embedded demo file). Line
// counts every line of the file from 1, comments included (0 when the
// problem concerns the whole file). Column is the CSV column's name in the
// header, empty when the problem concerns a whole line; Field is the
// column's position from 1 when its name is not known (0 otherwise). Key is
// the JSON field's name. Err wraps one of the sentinels.
type Error struct {
	File   string
	Line   int
	Column string
	Field  int
	Key    string
	Err    error
}

// Error formats the problem as `FILE, line L, column "NAME": message`
// (`field "KEY"` for a JSON field).
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ", line %d", e.Line)
	}
	switch {
	case e.Column != "":
		fmt.Fprintf(&b, ", column %q", e.Column)
	case e.Field > 0:
		fmt.Fprintf(&b, ", column %d", e.Field)
	case e.Key != "":
		fmt.Fprintf(&b, ", field %q", e.Key)
	}
	b.WriteString(": ")
	b.WriteString(e.Err.Error())
	return b.String()
}

// Unwrap returns the underlying error.
func (e *Error) Unwrap() error { return e.Err }
