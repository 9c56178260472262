// Package modelfile reads a govern model file (TOML) into a frame model,
// its load combinations and the analysis settings.
//
// The format is described in docs/model-format.md. A plain number in a
// file is in the units its [units] table declares; a value may also be a
// string of a number and a unit, such as "2.4 kip/ft", which the reader
// converts to them (package frame/units). Each key with a dimension is
// read with its quantity (walk.go: table.qty, qtyOK, qtys), so that a
// unit of another dimension is refused at its line.
//
// [ReadSet] reads a combination rule file (docs/combinations.md) into a
// combos.Set; [Read] calls it for the file a model's [combinations] table
// names. Both formats are read by one walker (walk.go: typed keys, unknown
// keys with the nearest known one), one position finder (keypos.go: the
// line of every key, from the decoder's own list of keys) and one error
// type.
//
// Problems are reported all together, as an [ErrorList] of [*Error]s, in
// the manner of go/scanner: each carries its [Pos] (file name, line, and
// for a syntax error the column and an excerpt of the line with a caret
// under it), the thing at fault and the message, and wraps one of the
// sentinel errors (ErrSyntax, ErrUnknownKey, ErrType, ErrMissing, ErrValue,
// ErrReference, ErrDuplicate, ErrTooLarge, ErrTooMany, ErrUnused) so
// callers can tell them apart with errors.Is. A syntax error stops the
// reading, since the rest of the file cannot be understood; any other
// problem does not, and at most [MaxProblems] are listed. The reader itself
// makes every check of frame.Model.Validate, with the line at fault, so a
// model it accepts is valid; Validate runs afterwards as a safeguard. In
// the same way a rule file's set is checked with combos.Set.Validate, each
// problem at its key.
//
// The built-in sets of package combos are Go values generated from their
// rule files (combos/sets) by this package's test TestBuiltinSetsAreCurrent,
// run with -update; without it the test fails when they differ.
//
// A file larger than [MaxFileSize], with more entries (keys and tables)
// than [MaxEntries], nested deeper than [MaxNesting], or describing more
// degrees of freedom than frame.MaxEquations, or more member loads than
// [MaxMemberLoads], is refused before it can exhaust memory. Each decoded
// table is let go once it is read. Docs/errors.md lists every limit and
// the memory reading takes.
//
// Nothing passed to [Read] is modified.
package modelfile
