package main

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
)

// object is a JSON object that keeps its keys' order and refuses repeated
// keys (encoding/json would silently keep the last one).
type object struct {
	keys   []string
	values map[string]any
}

// parseJSON reads one JSON value from b into a tree of object, []any,
// json.Number, string, bool and nil, refusing repeated keys and trailing
// data.
func parseJSON(b []byte) (any, error) {
	dec := json.NewDecoder(bytes.NewReader(b))
	dec.UseNumber()
	v, err := parseValue(dec)
	if err != nil {
		return nil, err
	}
	if _, err := dec.Token(); !errors.Is(err, io.EOF) {
		return nil, fmt.Errorf("data after the top-level value (byte %d)", dec.InputOffset())
	}
	return v, nil
}

func parseValue(dec *json.Decoder) (any, error) {
	tok, err := dec.Token()
	if err != nil {
		if errors.Is(err, io.EOF) {
			return nil, errors.New("unexpected end of JSON")
		}
		return nil, err
	}
	switch t := tok.(type) {
	case json.Delim:
		switch t {
		case '{':
			o := &object{values: map[string]any{}}
			for dec.More() {
				kt, err := dec.Token()
				if err != nil {
					return nil, err
				}
				k, ok := kt.(string)
				if !ok {
					return nil, fmt.Errorf("object key %v is not a string", kt)
				}
				if _, dup := o.values[k]; dup {
					return nil, fmt.Errorf("key %q repeated in one object (byte %d)", k, dec.InputOffset())
				}
				v, err := parseValue(dec)
				if err != nil {
					return nil, err
				}
				o.keys = append(o.keys, k)
				o.values[k] = v
			}
			if _, err := dec.Token(); err != nil { // '}'
				return nil, err
			}
			return o, nil
		case '[':
			a := []any{}
			for dec.More() {
				v, err := parseValue(dec)
				if err != nil {
					return nil, err
				}
				a = append(a, v)
			}
			if _, err := dec.Token(); err != nil { // ']'
				return nil, err
			}
			return a, nil
		}
		return nil, fmt.Errorf("unexpected %v", t)
	default:
		return tok, nil
	}
}

// jsonType names the JSON type of a parsed value, for messages.
func jsonType(v any) string {
	switch v.(type) {
	case *object:
		return "object"
	case []any:
		return "array"
	case json.Number:
		return "number"
	case string:
		return "string"
	case bool:
		return "boolean"
	case nil:
		return "null"
	}
	return fmt.Sprintf("%T", v)
}
