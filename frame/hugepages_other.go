//go:build !linux

package frame

// adviseHuge does nothing where there is no advice to give the system
// (see the Linux version).
func adviseHuge([]float64) {}
