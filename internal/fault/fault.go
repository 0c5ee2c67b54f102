// Package fault defines the one error type that ampwalk returns for input a
// user can get wrong. The public packages re-export it as a type alias
// (lattice.InputError, walk.InputError, …) so callers use errors.As with any of
// those names.
package fault

import "fmt"

// Kind classifies an Error the way the job format's error codes do.
type Kind int

const (
	// Invalid is a value out of range or of the wrong type.
	Invalid Kind = iota
	// TooLarge is a job whose estimated memory or time exceeds what is allowed.
	TooLarge
	// Numerical is a computation that failed its own error check.
	Numerical
	// Cancelled is work stopped through its context.
	Cancelled
)

// String returns the job-format error code of k.
func (k Kind) String() string {
	switch k {
	case TooLarge:
		return "too-large"
	case Numerical:
		return "numerical"
	case Cancelled:
		return "cancelled"
	default:
		return "invalid"
	}
}

// Error names the offending field, the accepted range and the value received.
type Error struct {
	Kind Kind
	// Field is the parameter name, dotted for nested values ("disorder.seed").
	Field string
	// Msg is a full sentence: what is accepted and what was received.
	Msg string
}

func (e *Error) Error() string {
	if e.Field == "" {
		return e.Msg
	}
	return e.Field + ": " + e.Msg
}

// New returns an Invalid error for field with a formatted message.
func New(field, format string, args ...any) *Error {
	return &Error{Kind: Invalid, Field: field, Msg: fmt.Sprintf(format, args...)}
}

// Range returns an Invalid error saying field must lie in the stated range.
// accepted is prose such as "between 0 and 16" or "a positive integer".
func Range(field, accepted string, got any) *Error {
	return &Error{Kind: Invalid, Field: field, Msg: fmt.Sprintf("must be %s; got %v", accepted, got)}
}

// Large returns a TooLarge error carrying the memory estimate in bytes.
func Large(field string, bytes, limit int64) *Error {
	return &Error{Kind: TooLarge, Field: field,
		Msg: fmt.Sprintf("estimated memory %d bytes (%.3g GiB) exceeds the limit of %d bytes (%.3g GiB)",
			bytes, float64(bytes)/(1<<30), limit, float64(limit)/(1<<30))}
}

// Prefix returns a copy of err with its field prefixed by p and a dot, when
// err is an *Error; other errors are returned unchanged.
func Prefix(p string, err error) error {
	e, ok := err.(*Error)
	if !ok || p == "" {
		return err
	}
	c := *e
	if c.Field == "" {
		c.Field = p
	} else {
		c.Field = p + "." + c.Field
	}
	return &c
}
