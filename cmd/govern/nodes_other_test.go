//go:build !unix

package main

import "testing"

func makeDevice(t *testing.T, dir, name string, minor int) string {
	t.Skip("no device nodes here")
	return ""
}

func makePipe(t *testing.T, dir, name string) string {
	t.Skip("no named pipes here")
	return ""
}
