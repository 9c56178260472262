//go:build !amd64.v3

package envelope

// goFuses is whether the compiler may fuse a product and a sum into one
// multiply-add: not for amd64 below GOAMD64=v3 (and on other machines
// the kernels are not used).
const goFuses = false
