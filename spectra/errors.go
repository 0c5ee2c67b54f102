package spectra

import "github.com/ampwalk/ampwalk/internal/fault"

// InputError is the error returned for input outside its accepted range. It
// names the field, the accepted range and the value received. Use errors.As
// with *InputError (or *lattice.InputError, the same type).
type InputError = fault.Error
