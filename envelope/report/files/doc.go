// Package files writes a program's output files as one set (Commit):
// each regular file to a temporary file beside it, synced, and all
// renamed into place together under a lock on their folders, so that a
// failed, interrupted or concurrent run never leaves a partial file nor
// mixes the files of two runs; devices, named pipes and standard output
// are written through. As a temporary file grows, the system is asked (on
// Linux) to start writing it to disk, so that its sync waits for little;
// Release asks it beforehand to drop its cached copy of the files a run
// will replace, so that their renames have little to free. It keeps the
// temporary files and new folders of the run, so that a signal can remove
// them (RemoveTemporaries). Every output is capped at report.MaxOutput
// bytes. See the "Output files" part of docs/errors.md.
//
// What it writes is given to it as functions of an io.Writer; it never
// reads or changes the results they write. The govern command commits its
// report, JSON and CSV through it; any program writing the outputs of
// package report can do the same.
package files
