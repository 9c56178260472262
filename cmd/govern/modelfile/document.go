package modelfile

import (
	"errors"
	"fmt"

	"github.com/BurntSushi/toml"

	"govern/frame/units"
)

// doc is one TOML document being read, a model file or a rule file: its
// name in messages, where its keys are, and the problems found in it. Both
// readers walk it through the tables of walk.go.
type doc struct {
	file string
	loc  *locator
	errs ErrorList
	more int // problems found past MaxProblems: counted, not listed

	// failed, when not nil, records the keys at which each table has
	// reported a problem (the rule file reader's, so that a problem the
	// checks of the set find again is reported once).
	failed map[*table][]string

	// units is the model's system of units, to which values written with
	// a unit are converted; nil for a rule file (whose numbers have no
	// unit) and while [units] is not known. unitsBad: [units] has a
	// problem, already reported, so that a value with a unit cannot be
	// converted and is passed over in silence.
	units    *units.System
	unitsBad bool
}

// MaxProblems is the most problems a file's [ErrorList] lists; the rest
// are counted.
const MaxProblems = 100

// decode checks src against the limits of guard.go and decodes it, for the
// file called name. A document past a limit or with a syntax error gives
// that one problem as an [ErrorList]: the rest of it cannot be understood.
func decode(name string, src []byte) (*doc, map[string]any, error) {
	text := string(src)
	line, off, msg, entries := guard(text)
	if line > 0 {
		return nil, nil, syntaxError(name, text, line, off, msg)
	}
	if entries > MaxEntries {
		var l ErrorList
		l.Add(Pos{File: name}, "", ErrTooLarge, fmt.Sprintf("the file has %s entries (keys and tables, an inline table counting as %d); the limit is %s",
			Thousands(entries), inlineEntries, Thousands(MaxEntries)))
		return nil, nil, l
	}
	var raw map[string]any
	md, err := toml.Decode(text, &raw)
	if err != nil {
		var pe toml.ParseError
		if errors.As(err, &pe) {
			line, off := syntaxPosition(text, pe.Position)
			return nil, nil, syntaxError(name, text, line, off, pe.Message)
		}
		var l ErrorList
		l.Add(Pos{File: name}, "", ErrSyntax, err.Error())
		return nil, nil, l
	}
	return &doc{file: name, loc: newLocator(text, md.Keys())}, raw, nil
}

// syntaxError is the problem msg at byte offset off of line n, with its
// column and excerpt.
func syntaxError(name, text string, n, off int, msg string) ErrorList {
	col, ex := excerpt(text, n, off)
	return ErrorList{{Pos: Pos{File: name, Line: n, Column: col}, Msg: msg, Excerpt: ex, Err: ErrSyntax}}
}

// fail records a problem at line (0 for the whole file) of the thing
// where names; past MaxProblems it is only counted.
func (d *doc) fail(line int, where string, err error) {
	if len(d.errs) >= MaxProblems {
		d.more++
		return
	}
	msg, kind := split(err)
	d.errs.Add(Pos{File: d.file, Line: line}, where, kind, msg)
}

// table returns the table m at block, a block path such as
// "case[1].load[0]" ("" for the top level), named where in messages.
func (d *doc) table(m map[string]any, block, where string) *table {
	return &table{d: d, m: m, pos: *blockPlace(block), where: where}
}

// finish sorts the problems found and counts those not listed; it returns
// them as an [ErrorList], or nil when there are none.
func (d *doc) finish() error {
	if len(d.errs) == 0 {
		return nil
	}
	d.errs.Sort()
	if d.more > 0 {
		d.errs.Add(Pos{File: d.file}, "", ErrTooMany, fmt.Sprintf("%d more problems not listed; correct these first", d.more))
	}
	return d.errs
}
