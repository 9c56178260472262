package modelfile

import (
	"cmp"
	"errors"
	"fmt"
	"slices"
	"strings"
)

// Sentinel errors wrapped by [Error], for errors.Is: what kind of problem
// it is.
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

// Pos is a position in a file: a model file or a rule file.
type Pos struct {
	File   string
	Line   int // 1-based; 0 when unknown or when the problem is of the whole file
	Column int // 1-based, in characters; 0 when not given
}

// String returns "file:line:column", "file:line" or "file", as much as is
// known.
func (p Pos) String() string {
	s := p.File
	if p.Line > 0 {
		s += fmt.Sprintf(":%d", p.Line)
		if p.Column > 0 {
			s += fmt.Sprintf(":%d", p.Column)
		}
	}
	return s
}

// Error is one problem in a file, at a position.
//
// A syntax error has a column and an excerpt: the line, with a caret
// under the column. Any other problem names its key in Msg and has the
// line of the key (or of its table) only.
type Error struct {
	Pos     Pos
	Where   string // the thing at fault, such as `case "L", load 1` or `rule "2.3.1-3", term 2`; "" for the file or its top level
	Msg     string // the problem
	Excerpt string // the line at Pos and a caret under its column, each indented by four spaces; "" when not shown
	Err     error  // the kind of problem: one of the sentinel errors
}

func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.Pos.String())
	b.WriteString(": ")
	if e.Where != "" {
		b.WriteString(e.Where)
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	if e.Excerpt != "" {
		b.WriteString("\n")
		b.WriteString(e.Excerpt)
	}
	return b.String()
}

// Unwrap returns the sentinel error, so that errors.Is tells the kinds of
// problem apart.
func (e *Error) Unwrap() error { return e.Err }

// ErrorList is every problem found in a file (and in the rule file it
// names). Its Error method lists them one to a line (an excerpt taking
// two more).
type ErrorList []*Error

// Add appends a problem at pos: where names the thing at fault, kind is
// one of the sentinel errors and msg says what is wrong.
func (l *ErrorList) Add(pos Pos, where string, kind error, msg string) {
	*l = append(*l, &Error{Pos: pos, Where: where, Msg: msg, Err: kind})
}

// Sort sorts the list by file, line and column. It is stable: problems at
// one position keep the order they were found in, problems of a whole file
// (line 0) come first, and the count of problems not listed (ErrTooMany)
// last in its file.
func (l ErrorList) Sort() {
	last := func(e *Error) int {
		if e.Err == ErrTooMany {
			return 1
		}
		return 0
	}
	slices.SortStableFunc(l, func(a, b *Error) int {
		return cmp.Or(strings.Compare(a.Pos.File, b.Pos.File), cmp.Compare(last(a), last(b)),
			cmp.Compare(a.Pos.Line, b.Pos.Line), cmp.Compare(a.Pos.Column, b.Pos.Column))
	})
}

// Err returns the list as an error, or nil when it is empty.
func (l ErrorList) Err() error {
	if len(l) == 0 {
		return nil
	}
	return l
}

func (l ErrorList) Error() string {
	s := make([]string, len(l))
	for i, e := range l {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// Unwrap returns the individual errors.
func (l ErrorList) Unwrap() []error {
	out := make([]error, len(l))
	for i, e := range l {
		out[i] = e
	}
	return out
}

// problem builds a problem of the kind sentinel with a message, for
// table.fail and doc.fail.
func problem(sentinel error, format string, args ...any) error {
	return &wrapped{msg: fmt.Sprintf(format, args...), err: sentinel}
}

type wrapped struct {
	msg string
	err error
}

func (w *wrapped) Error() string { return w.msg }
func (w *wrapped) Unwrap() error { return w.err }

// split returns the message and the sentinel of a problem.
func split(err error) (msg string, kind error) {
	if w, ok := err.(*wrapped); ok {
		return w.msg, w.err
	}
	return err.Error(), err
}
