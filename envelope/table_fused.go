//go:build amd64.v3

package envelope

// goFuses is whether the compiler may fuse a product and a sum into one
// multiply-add (it does for amd64 at GOAMD64=v3 and above).
const goFuses = true
