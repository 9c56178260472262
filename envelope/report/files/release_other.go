//go:build !(linux && (amd64 || arm64))

package files

import "os"

// dropCached does nothing but on Linux on amd64 and arm64, where the
// call's 64-bit arguments are passed in single registers (release_linux.go;
// elsewhere they are split, and the call is left out): the rename over
// the file frees its cached pages.
func dropCached(*os.File) {}
