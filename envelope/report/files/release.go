package files

import "os"

// Release asks the system to let go of its cached copy of each of paths
// that is a regular file already: the file a Commit would rename a new one
// over. Its clean pages leave the page cache (on Linux); the file itself,
// on disk, is unchanged, and still read as it was.
//
// A rename over a file frees the pages the system holds of it, at once and
// in the renaming process: for the JSON of a 30 × 60 frame (88 MB) some 20
// ms at the end of a run, after everything else is done. Released first,
// beside the analysis, it leaves the rename little to free. Release is for
// a program about to replace its outputs (govern run, at its start); it
// ignores errors (a missing file, one it cannot open): it changes no
// result, only when the system does its work.
func Release(paths ...string) {
	for _, p := range paths {
		if p == "" || p == "-" {
			continue
		}
		st, err := os.Stat(p)
		if err != nil || !st.Mode().IsRegular() {
			continue
		}
		f, err := os.Open(p)
		if err != nil {
			continue
		}
		dropCached(f)
		f.Close()
	}
}
