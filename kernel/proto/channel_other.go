//go:build !unix

package proto

// prepare does nothing: handles are not inherited unless asked for.
func prepare(uintptr) {}
