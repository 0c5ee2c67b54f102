package walk

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
	"strconv"
	"strings"
	"unicode/utf8"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// Strict decoding of job requests.
//
// encoding/json's DisallowUnknownFields names an unknown key but not its path,
// and cannot tell which keys a lattice kind takes. The job decoder therefore
// reads each JSON object into an ordered list of (key, raw value) pairs and
// consumes keys one by one; whatever is left at the end is reported as
// "unknown-field" with its dotted path ("lattice.generaton"). Values are
// converted by the typed readers below, which name the field path
// ("times[3]") and the accepted range in their errors.

// codeUnknownField and codeMalformed are the two job-format error codes that
// have no fault.Kind: they arise only while decoding.
const (
	codeUnknownField = "unknown-field"
	codeMalformed    = "malformed"
)

// decodeError is an error of the decoding stage that carries its own code.
type decodeError struct {
	code, field, msg string
}

func (e *decodeError) Error() string {
	if e.field == "" {
		return e.msg
	}
	return e.field + ": " + e.msg
}

func unknownField(path string) error {
	return &decodeError{code: codeUnknownField, field: path, msg: "unknown field " + strconv.Quote(lastName(path))}
}

func lastName(path string) string {
	if i := strings.LastIndexByte(path, '.'); i >= 0 {
		return path[i+1:]
	}
	return path
}

// member is one key of a JSON object with its raw value.
type member struct {
	key  string
	raw  json.RawMessage
	used bool
}

// object is a JSON object whose keys are consumed by the typed readers.
type object struct {
	path    string
	members []member
}

// join returns the dotted path of key inside the object at path.
func join(path, key string) string {
	if path == "" {
		return key
	}
	return path + "." + key
}

// parseObject reads raw as a JSON object. path names it in errors.
func parseObject(path string, raw json.RawMessage) (*object, error) {
	dec := json.NewDecoder(bytes.NewReader(raw))
	dec.UseNumber()
	tok, err := dec.Token()
	if err != nil {
		return nil, &decodeError{code: codeMalformed, field: path, msg: "not valid JSON: " + err.Error()}
	}
	if d, ok := tok.(json.Delim); !ok || d != '{' {
		return nil, fault.New(path, "must be a JSON object; got %s", describe(raw))
	}
	o := &object{path: path}
	for dec.More() {
		tok, err := dec.Token()
		if err != nil {
			return nil, &decodeError{code: codeMalformed, field: path, msg: "not valid JSON: " + err.Error()}
		}
		key, _ := tok.(string)
		var v json.RawMessage
		if err := dec.Decode(&v); err != nil {
			return nil, &decodeError{code: codeMalformed, field: join(path, key), msg: "not valid JSON: " + err.Error()}
		}
		for _, m := range o.members {
			if m.key == key {
				return nil, fault.New(join(path, key), "appears more than once in the same object")
			}
		}
		o.members = append(o.members, member{key: key, raw: v})
	}
	return o, nil
}

// has reports whether key is present (and not null).
func (o *object) has(key string) bool {
	for _, m := range o.members {
		if m.key == key {
			return !isNull(m.raw)
		}
	}
	return false
}

// take returns the raw value of key and marks it used; ok is false when the
// key is absent or null (null means "use the default").
func (o *object) take(key string) (json.RawMessage, bool) {
	for i := range o.members {
		if o.members[i].key == key {
			o.members[i].used = true
			if isNull(o.members[i].raw) {
				return nil, false
			}
			return o.members[i].raw, true
		}
	}
	return nil, false
}

// unused returns an unknown-field error for the first key (in document
// order) that no reader consumed, or nil.
func (o *object) unused() error {
	for _, m := range o.members {
		if !m.used {
			return unknownField(join(o.path, m.key))
		}
	}
	return nil
}

// allow marks keys as consumed without reading them (for keys read later by
// another stage) and returns an unknown-field error for any other key.
func (o *object) only(keys ...string) error {
	for _, m := range o.members {
		ok := false
		for _, k := range keys {
			if m.key == k {
				ok = true
				break
			}
		}
		if !ok {
			return unknownField(join(o.path, m.key))
		}
	}
	return nil
}

func isNull(raw json.RawMessage) bool {
	return string(bytes.TrimSpace(raw)) == "null"
}

// describe renders a raw JSON value for an error message, shortened.
func describe(raw json.RawMessage) string {
	s := string(bytes.TrimSpace(raw))
	if len(s) > 40 {
		s = s[:37] + "..."
	}
	switch {
	case s == "":
		return "nothing"
	case s[0] == '"':
		return "the string " + s
	case s[0] == '{':
		return "an object " + s
	case s[0] == '[':
		return "a list " + s
	case s == "true" || s == "false":
		return "the boolean " + s
	default:
		return s
	}
}

// number parses raw as a finite JSON number.
func number(path string, raw json.RawMessage) (float64, error) {
	s := string(bytes.TrimSpace(raw))
	if s == "" || !(s[0] == '-' || (s[0] >= '0' && s[0] <= '9')) {
		return 0, fault.New(path, "must be a number; got %s", describe(raw))
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, fault.New(path, "must be a finite number; got %s", s)
	}
	return v, nil
}

// integer parses raw as a JSON number with an integral value in [lo, hi].
func integer(path string, raw json.RawMessage, lo, hi int) (int, error) {
	v, err := number(path, raw)
	if err != nil {
		return 0, fault.New(path, "must be an integer between %d and %d; got %s", lo, hi, describe(raw))
	}
	if v != math.Trunc(v) {
		return 0, fault.New(path, "must be an integer between %d and %d; got %s", lo, hi, strings.TrimSpace(string(raw)))
	}
	if v < float64(lo) || v > float64(hi) {
		return 0, fault.New(path, "must be an integer between %d and %d; got %s", lo, hi, strings.TrimSpace(string(raw)))
	}
	return int(v), nil
}

// uinteger parses raw as an integral JSON number in [0, 2⁶⁴). Values above
// 2⁵³ must be written exactly (as integers), since they are read exactly.
func uinteger(path string, raw json.RawMessage) (uint64, error) {
	s := strings.TrimSpace(string(raw))
	if u, err := strconv.ParseUint(s, 10, 64); err == nil {
		return u, nil
	}
	v, err := number(path, raw)
	if err != nil || v != math.Trunc(v) || v < 0 || v >= 1<<63 {
		return 0, fault.New(path, "must be a non-negative integer below 2^64; got %s", describe(raw))
	}
	return uint64(v), nil
}

// boolean parses raw as true or false.
func boolean(path string, raw json.RawMessage) (bool, error) {
	switch strings.TrimSpace(string(raw)) {
	case "true":
		return true, nil
	case "false":
		return false, nil
	}
	return false, fault.New(path, "must be true or false; got %s", describe(raw))
}

// str parses raw as a JSON string.
func str(path string, raw json.RawMessage) (string, error) {
	var s string
	t := bytes.TrimSpace(raw)
	if len(t) == 0 || t[0] != '"' || json.Unmarshal(t, &s) != nil {
		return "", fault.New(path, "must be a string; got %s", describe(raw))
	}
	if !utf8.Valid(t) {
		// encoding/json would replace the bytes by U+FFFD silently (and an
		// id would then be echoed differently from the request).
		return "", fault.New(path, "must be valid UTF-8 text; got a string with invalid bytes")
	}
	return s, nil
}

// choice parses raw as one of the accepted strings.
func choice(path string, raw json.RawMessage, accepted ...string) (string, error) {
	s, err := str(path, raw)
	if err == nil {
		for _, a := range accepted {
			if s == a {
				return s, nil
			}
		}
	}
	q := make([]string, len(accepted))
	for i, a := range accepted {
		q[i] = strconv.Quote(a)
	}
	return "", fault.New(path, "must be one of %s; got %s", strings.Join(q, ", "), describe(raw))
}

// list parses raw as a JSON list of raw elements.
func list(path string, raw json.RawMessage) ([]json.RawMessage, error) {
	t := bytes.TrimSpace(raw)
	var out []json.RawMessage
	if len(t) == 0 || t[0] != '[' || json.Unmarshal(t, &out) != nil {
		return nil, fault.New(path, "must be a list; got %s", describe(raw))
	}
	return out, nil
}

// index returns path[k].
func index(path string, k int) string { return fmt.Sprintf("%s[%d]", path, k) }

// numbers parses raw as a list of at most max finite numbers.
func numbers(path string, raw json.RawMessage, max int) ([]float64, error) {
	items, err := list(path, raw)
	if err != nil {
		return nil, err
	}
	if len(items) > max {
		return nil, fault.New(path, "must have at most %d entries; got %d", max, len(items))
	}
	out := make([]float64, len(items))
	for k, it := range items {
		if out[k], err = number(index(path, k), it); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// integers parses raw as a list of at most max integers in [lo, hi].
func integers(path string, raw json.RawMessage, max, lo, hi int) ([]int, error) {
	items, err := list(path, raw)
	if err != nil {
		return nil, err
	}
	if len(items) > max {
		return nil, fault.New(path, "must have at most %d entries; got %d", max, len(items))
	}
	out := make([]int, len(items))
	for k, it := range items {
		if out[k], err = integer(index(path, k), it, lo, hi); err != nil {
			return nil, err
		}
	}
	return out, nil
}

// Typed readers on an object: each consumes the key and leaves the
// destination unchanged (the default) when the key is absent or null.

func (o *object) num(key string, dst *float64) error {
	raw, ok := o.take(key)
	if !ok {
		return nil
	}
	v, err := number(join(o.path, key), raw)
	if err == nil {
		*dst = v
	}
	return err
}

func (o *object) int(key string, dst *int, lo, hi int) error {
	raw, ok := o.take(key)
	if !ok {
		return nil
	}
	v, err := integer(join(o.path, key), raw, lo, hi)
	if err == nil {
		*dst = v
	}
	return err
}

func (o *object) bool(key string, dst *bool) error {
	raw, ok := o.take(key)
	if !ok {
		return nil
	}
	v, err := boolean(join(o.path, key), raw)
	if err == nil {
		*dst = v
	}
	return err
}

func (o *object) choice(key string, dst *string, accepted ...string) error {
	raw, ok := o.take(key)
	if !ok {
		return nil
	}
	v, err := choice(join(o.path, key), raw, accepted...)
	if err == nil {
		*dst = v
	}
	return err
}

// sub returns the nested object at key, or nil when absent.
func (o *object) sub(key string) (*object, error) {
	raw, ok := o.take(key)
	if !ok {
		return nil, nil
	}
	return parseObject(join(o.path, key), raw)
}

// required returns an invalid error for a missing required key.
func (o *object) required(key, what string) error {
	return fault.New(join(o.path, key), "is required: %s", what)
}
