package lab

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"math"
	"regexp"

	"github.com/dzf-go/dzf/resistance"
)

// ReadLabel reads an indicator lot's label (certificate) from a JSON object
// with the fields of resistance.Label: supplier, product, lot, organism
// (text), modality ("moist heat", "ethylene oxide", "dry heat", "other"),
// population (spores per unit, a count), d (minutes at celsius), celsius,
// z (°C), survival_time and kill_time (minutes at celsius). Lines whose
// first non-blank character is '#' are comments. population, d and
// celsius are required; a z or time left out (or 0) is not stated.
func ReadLabel(file string, src io.Reader) (resistance.Label, error) {
	data, err := io.ReadAll(src)
	if err != nil {
		return resistance.Label{}, &Error{File: file, Err: fmt.Errorf("%v: %w", err, ErrSyntax)}
	}
	text := blankComments(bytes.TrimPrefix(data, []byte("\ufeff")))
	if len(bytes.TrimSpace(text)) == 0 {
		return resistance.Label{}, &Error{File: file, Err: fmt.Errorf("no JSON object: %w", ErrEmpty)}
	}
	dec := json.NewDecoder(bytes.NewReader(text))
	dec.DisallowUnknownFields()
	var l resistance.Label
	if err := dec.Decode(&l); err != nil {
		return resistance.Label{}, jsonError(file, text, err)
	}
	if dec.More() {
		return resistance.Label{}, &Error{File: file, Line: lineAt(text, dec.InputOffset()), Err: fmt.Errorf("text after the label's object: %w", ErrSyntax)}
	}
	return l, checkLabel(file, text, l)
}

// blankComments replaces every comment line by spaces, keeping the offsets
// and line numbers of the rest.
func blankComments(data []byte) []byte {
	out := append([]byte(nil), data...)
	start := 0
	for start < len(out) {
		end := bytes.IndexByte(out[start:], '\n')
		if end < 0 {
			end = len(out)
		} else {
			end += start
		}
		if line := bytes.TrimLeft(out[start:end], " \t\r"); len(line) > 0 && line[0] == '#' {
			for i := start; i < end; i++ {
				out[i] = ' '
			}
		}
		start = end + 1
	}
	return out
}

// lineAt returns the line (from 1) holding byte offset off of text.
func lineAt(text []byte, off int64) int {
	off = min(max(off, 0), int64(len(text)))
	return 1 + bytes.Count(text[:off], []byte("\n"))
}

// lineOf returns the line of the first "key": in text, 0 if none.
func lineOf(text []byte, key string) int {
	loc := regexp.MustCompile(`"` + regexp.QuoteMeta(key) + `"\s*:`).FindIndex(text)
	if loc == nil {
		return 0
	}
	return lineAt(text, int64(loc[0]))
}

var anyKey = regexp.MustCompile(`"((?:[^"\\]|\\.)*)"\s*:`)

// keyBefore returns the last field name whose key starts before offset off
// of text, on the line of off: the field a syntax error is in ("" if none).
func keyBefore(text []byte, off int64) string {
	off = min(max(off, 0), int64(len(text)))
	start := int64(bytes.LastIndexByte(text[:off], '\n') + 1)
	key := ""
	for _, m := range anyKey.FindAllSubmatchIndex(text[start:off], -1) {
		key = string(text[start+int64(m[2]) : start+int64(m[3])])
	}
	return key
}

var unknownField = regexp.MustCompile(`unknown field "([^"]*)"`)

// jsonError turns a decoding error into an *Error naming the line and the
// field.
func jsonError(file string, text []byte, err error) error {
	var syn *json.SyntaxError
	var typ *json.UnmarshalTypeError
	switch {
	case errors.As(err, &syn):
		return &Error{File: file, Line: lineAt(text, syn.Offset), Key: keyBefore(text, syn.Offset), Err: fmt.Errorf("%v: %w", syn, ErrSyntax)}
	case errors.As(err, &typ):
		return &Error{File: file, Line: lineAt(text, typ.Offset), Key: typ.Field, Err: fmt.Errorf("a %s where the field needs a %v: %w", typ.Value, typ.Type, ErrValue)}
	case errors.Is(err, io.ErrUnexpectedEOF):
		end := int64(len(bytes.TrimRight(text, " \t\r\n")))
		return &Error{File: file, Line: lineAt(text, end), Err: fmt.Errorf("the JSON object is not closed: %w", ErrSyntax)}
	}
	if m := unknownField.FindStringSubmatch(err.Error()); m != nil {
		return &Error{File: file, Line: lineOf(text, m[1]), Key: m[1], Err: fmt.Errorf("%w (the label has supplier, product, lot, organism, modality, population, d, celsius, z, survival_time, kill_time)", ErrUnknownColumn)}
	}
	return &Error{File: file, Err: fmt.Errorf("%v: %w", err, ErrSyntax)}
}

// checkLabel checks the label's numbers, naming the field and its line.
func checkLabel(file string, text []byte, l resistance.Label) error {
	fail := func(field, msg string, sentinel error) error {
		return &Error{File: file, Line: lineOf(text, field), Key: field, Err: fmt.Errorf("%s: %w", msg, sentinel)}
	}
	required := []struct {
		field string
		v     float64
	}{{"population", l.Population}, {"d", l.D}}
	for _, r := range required {
		switch {
		case lineOf(text, r.field) == 0:
			return fail(r.field, "required, and not in the file", ErrMissingColumn)
		case !(r.v > 0) || math.IsInf(r.v, 0):
			return fail(r.field, fmt.Sprintf("%g: must be positive", r.v), ErrValue)
		}
	}
	if lineOf(text, "celsius") == 0 {
		return fail("celsius", "required: the temperature of the labelled D", ErrMissingColumn)
	}
	for _, o := range []struct {
		field string
		v     float64
	}{{"z", l.Z}, {"survival_time", l.SurvivalTime}, {"kill_time", l.KillTime}} {
		if o.v < 0 || math.IsInf(o.v, 0) {
			return fail(o.field, fmt.Sprintf("%g: must be positive, or 0 when the label does not state it", o.v), ErrValue)
		}
	}
	if l.KillTime > 0 && l.KillTime <= l.SurvivalTime {
		return fail("kill_time", fmt.Sprintf("%g min is not after the survival time %g min", l.KillTime, l.SurvivalTime), ErrValue)
	}
	switch l.Modality {
	case "", resistance.MoistHeat, resistance.EthyleneOxide, resistance.DryHeat, resistance.OtherModality:
	default:
		return fail("modality", fmt.Sprintf("%q is not one of %q, %q, %q, %q", l.Modality,
			resistance.MoistHeat, resistance.EthyleneOxide, resistance.DryHeat, resistance.OtherModality), ErrValue)
	}
	return nil
}
