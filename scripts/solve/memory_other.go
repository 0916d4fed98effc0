//go:build !linux

package main

// hugePages does nothing where large pages are not asked for this way.
func hugePages(need int64) {}
