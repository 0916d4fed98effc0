package main

import (
	"runtime"
	"syscall"
	"unsafe"
)

// hugePages asks the kernel to back the heap the solve will use with 2 MB
// pages (transparent huge pages, given on request: madvise): one fault
// each instead of 512. The heap grows by mappings of its own, so the
// memory is first made part of it: one allocation of need bytes, which
// the runtime maps without touching, advised together with the heap's
// first chunk, then collected, so that the solve's allocations reuse it.
// Only a hint: where the kernel has no large pages, nothing changes.
func hugePages(need int64) {
	const (
		page  = 2 << 20  // a large page
		chunk = 4 << 20  // the heap grows in chunks of this size, aligned to it
		arena = 64 << 20 // within an arena of this size, the heap's mappings follow one another
	)
	heapMark = new([64]byte) // kept, so that it is on the heap
	first := uintptr(unsafe.Pointer(heapMark)) &^ (chunk - 1)
	b := make([]byte, need)
	start := uintptr(unsafe.Pointer(unsafe.SliceData(b)))
	advise := func(from, to uintptr) {
		from, to = (from+page-1)&^(page-1), to&^(page-1)
		if to > from {
			// an error (no such advice on this kernel) leaves the pages as they were
			syscall.Syscall(syscall.SYS_MADVISE, from, to-from, syscall.MADV_HUGEPAGE)
		}
	}
	end := start + uintptr(need)
	if first <= start && start-first <= arena {
		advise(first, end) // the heap so far and the new memory, one mapping after another
	} else {
		advise(first, first+chunk)
		advise(start, end)
	}
	runtime.KeepAlive(b)
	runtime.GC()
}

// heapMark is an object in the heap's first chunk.
var heapMark *[64]byte
