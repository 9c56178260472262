// Package modelfile reads a govern model file (TOML) into a frame model,
// its load combinations and the analysis settings.
//
// The format is described in docs/model-format.md. Every number in a file is
// in the units its [units] table declares; the reader does not convert.
//
// Problems are reported all together, each as an [*Error] that carries the
// file name, the line (and column where known) and the thing at fault, and
// wraps one of the sentinel errors (ErrSyntax, ErrUnknownKey, ErrType,
// ErrMissing, ErrValue, ErrReference, ErrDuplicate, ErrTooLarge, ErrTooMany)
// so callers can tell them apart with errors.Is. A syntax error stops the
// reading, since the rest of the file cannot be understood; any other
// problem does not, and at most [MaxProblems] are listed. The reader itself
// makes every check of frame.Model.Validate, with the line at fault, so a
// model it accepts is valid; Validate runs afterwards as a safeguard.
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
