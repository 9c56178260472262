//go:build !(linux && (amd64 || arm64))

package files

import "os"

// dropCached does nothing where there is no call to drop a file's cached
// pages: the rename over it frees them.
func dropCached(*os.File) {}
