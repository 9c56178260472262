package modelfile

import (
	"errors"
	"fmt"
	"strings"
)

// Sentinel errors wrapped by [Error].
var (
	ErrSyntax     = errors.New("syntax error")
	ErrUnknownKey = errors.New("unknown key")
	ErrType       = errors.New("wrong type")
	ErrMissing    = errors.New("missing value")
	ErrValue      = errors.New("invalid value")
	ErrReference  = errors.New("unknown reference")
	ErrDuplicate  = errors.New("duplicate name")
	ErrTooLarge   = errors.New("model too large")
	ErrTooMany    = errors.New("too many problems")
	ErrUnused     = errors.New("case in no combination")
)

// Error is a problem in a model file at a position.
type Error struct {
	File   string
	Line   int // 1-based; 0 when unknown
	Column int // 1-based; 0 when unknown
	Where  string
	Err    error // wraps a sentinel
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
		if e.Column > 0 {
			fmt.Fprintf(&b, ":%d", e.Column)
		}
	}
	b.WriteString(": ")
	if e.Where != "" {
		b.WriteString(e.Where)
		b.WriteString(": ")
	}
	b.WriteString(e.Err.Error())
	return b.String()
}

func (e *Error) Unwrap() error { return e.Err }

// Errors is every problem found in one file, in file order.
type Errors []*Error

func (es Errors) Error() string {
	s := make([]string, len(es))
	for i, e := range es {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// Unwrap returns the individual errors.
func (es Errors) Unwrap() []error {
	out := make([]error, len(es))
	for i, e := range es {
		out[i] = e
	}
	return out
}

// problem builds an error wrapping sentinel with a message.
func problem(sentinel error, format string, args ...any) error {
	return &wrapped{msg: fmt.Sprintf(format, args...), err: sentinel}
}

type wrapped struct {
	msg string
	err error
}

func (w *wrapped) Error() string { return w.msg }
func (w *wrapped) Unwrap() error { return w.err }
