// Package lab holds what the example programs (qualify, f0, fractionstudy)
// share: readers of the plain laboratory files they accept, the embedded
// demo scenario, the fraction-negative estimates side by side, and a few
// text helpers.
//
// # Files
//
// The CSV files have '#' comment lines (a '#' at the start of the line),
// then a header row naming the columns (any order, any case, surrounding
// spaces ignored), then one data row per record. Blank lines are skipped,
// fields may be quoted ("..."), a byte-order mark is ignored, numbers are
// decimal with a point (1e-3 allowed), and a column the format does not
// define is refused so that a misspelt name is caught. The formats (units
// in brackets):
//
//	population   unit, suspension_ml [mL], dilution [10^-k, in (0, 1]], plated_ml [mL], colonies
//	survivor     minutes [min], count [survivors per unit]
//	fraction     minutes [min], units, negative [units with no growth]
//	temperatures celsius [°C], d, lower, upper [min], level [in (0, 1)], method (optional)
//	outcomes     test [survival, kill or half-cycle], minutes [min], units, growth [units that grew]
//
// The label is a JSON object with the fields of resistance.Label; lines
// whose first non-blank character is '#' are comments. The cycle is a
// logger export as lethality.Reader reads it. The package documentation of
// examples/qualify describes every column.
//
// Every problem is an *Error naming the file, the line (counting every
// line from 1, comments included) and the column by its header name,
// wrapping one of the sentinels ErrEmpty, ErrNoRows, ErrMissingColumn,
// ErrUnknownColumn, ErrDuplicateColumn, ErrFieldCount, ErrNumber,
// ErrWholeNumber, ErrValue, ErrSyntax (test with errors.Is); a problem of
// a logger export wraps the lethality reader's sentinel instead. The
// readers check what a file can show (numbers finite and in range, whole
// counts, negatives not above units); the estimators check the rest and
// name the offending observation by its position.
//
// # Demo scenario
//
// The embedded demo (Demo, DemoNames) is a byte-identical copy of the
// module's testdata/demo files, kept so by a test: an invented lot of a
// fictional supplier tested by a fictional contract laboratory, and a
// production cycle of a fictional sterilizer, drawn by
// testdata/demo/generate.go from N0 = 2.0e6 spores per unit, D121 =
// 1.90 min and z = 10.5 °C.
//
// # Cautions
//
// These numbers feed decisions about patient safety. The programs compute;
// acceptance of an indicator lot or a process is decided by the
// laboratory's qualified people under the standards and regulations that
// apply to them.
package lab
