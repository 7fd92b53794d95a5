package lethality

import "errors"

// Sentinel errors. Every error returned by this package wraps one of them
// (test with errors.Is), with context naming the offending input: the sample,
// the probe, the line and column of a file.
var (
	// ErrInvalidReference reports a reference temperature or z-value that is
	// not finite, or a z-value ≤ 0.
	ErrInvalidReference = errors.New("lethality: invalid reference (T_ref must be finite, z finite and > 0)")
	// ErrTooFewSamples reports a record with fewer than two samples.
	ErrTooFewSamples = errors.New("lethality: fewer than two samples")
	// ErrNonFinite reports a NaN or infinite time, temperature or argument.
	ErrNonFinite = errors.New("lethality: value is not finite")
	// ErrTimeOrder reports times that do not strictly increase.
	ErrTimeOrder = errors.New("lethality: times do not strictly increase")
	// ErrUnknownRule reports an integration rule other than rectangle,
	// trapezoid and exact.
	ErrUnknownRule = errors.New("lethality: unknown integration rule")
	// ErrGap reports an interval between two samples longer than the
	// permitted gap, when the caller asked for gaps to be refused.
	ErrGap = errors.New("lethality: gap between samples longer than permitted")
	// ErrOverflow reports a result that does not fit a float64 (a lethal
	// rate, an F-value or an exposure time that would be infinite).
	ErrOverflow = errors.New("lethality: result overflows float64")
	// ErrInvalidD reports a D-value ≤ 0 or not finite.
	ErrInvalidD = errors.New("lethality: D must be finite and > 0")
	// ErrNegativeF reports a negative F-value (lethality cannot be negative).
	ErrNegativeF = errors.New("lethality: F must not be negative")
	// ErrNothingToKill reports a target at or above the initial population
	// (log10 SAL ≥ log10 N0).
	ErrNothingToKill = errors.New("lethality: target is not below the initial population")
	// ErrInvalidSetting reports a setting out of its range (a negative gap,
	// a band width ≤ 0, a target ≤ 0, ...).
	ErrInvalidSetting = errors.New("lethality: invalid setting")
	// ErrMissing reports a missing temperature reading (a cell the file
	// reader marked missing) where the caller did not permit bridging.
	ErrMissing = errors.New("lethality: missing reading")
	// ErrNoProbe reports a record or cycle without any probe.
	ErrNoProbe = errors.New("lethality: no probe")
	// ErrRowLength reports a row whose number of temperatures differs from
	// the number of probes.
	ErrRowLength = errors.New("lethality: row length differs from the number of probes")
	// ErrInvalidProbability reports a probability outside (0, 1) where one
	// is required.
	ErrInvalidProbability = errors.New("lethality: probability outside (0, 1)")
	// ErrInvalidStudy reports half-cycle study counts that are impossible
	// (units < 1, negatives outside 0…units).
	ErrInvalidStudy = errors.New("lethality: invalid half-cycle study")
)

// Sentinel errors of the file reader, wrapped in a *ParseError that carries
// the line and column.
var (
	// ErrHeader reports a missing or unusable header line (fewer than two
	// columns, an empty or repeated probe name).
	ErrHeader = errors.New("lethality: bad header")
	// ErrDelimiter reports a header in which no delimiter (comma, semicolon,
	// tab) can be recognised, or a delimiter setting that is not one of them.
	ErrDelimiter = errors.New("lethality: cannot determine the delimiter")
	// ErrFieldCount reports a row with a number of fields different from the
	// header's.
	ErrFieldCount = errors.New("lethality: wrong number of fields")
	// ErrBlankCell reports an empty cell.
	ErrBlankCell = errors.New("lethality: blank cell")
	// ErrBadNumber reports a cell that is not a finite decimal number.
	ErrBadNumber = errors.New("lethality: cell is not a finite number")
	// ErrBadTime reports a time cell that cannot be read in the time format
	// in force (a number, or an RFC 3339 timestamp).
	ErrBadTime = errors.New("lethality: unreadable time")
	// ErrTimeUnit reports a numeric time column whose unit (seconds or
	// minutes) was not given: the reader never guesses it.
	ErrTimeUnit = errors.New("lethality: time unit not given")
	// ErrQuote reports a badly quoted field.
	ErrQuote = errors.New("lethality: bad quoting")
	// ErrNoRows reports a file with a header but no data row.
	ErrNoRows = errors.New("lethality: no data row")
)
