// Package modelfile reads a govern model file (TOML) into a frame model,
// its load combinations and the analysis settings.
//
// The format is described in docs/model-format.md. Every number in a file is
// in the units its [units] table declares; the reader does not convert.
//
// Problems are reported all together, each as an [*Error] that carries the
// file name, the line (and column where known) and the thing at fault, and
// wraps one of the sentinel errors (ErrSyntax, ErrUnknownKey, ErrType,
// ErrMissing, ErrValue, ErrReference, ErrDuplicate) so callers can tell them
// apart with errors.Is.
package modelfile
