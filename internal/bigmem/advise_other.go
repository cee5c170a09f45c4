//go:build !linux

package bigmem

func advise[T any](s []T, n int) {}
