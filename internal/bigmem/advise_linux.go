package bigmem

import (
	"syscall"
	"unsafe"
)

// From <linux/mman.h>, madvise(2): MADV_HUGEPAGE, "enable transparent huge
// pages for the pages in the range", and MADV_POPULATE_WRITE (Linux 5.14),
// "populate (prefault) page tables writable, faulting-in all pages in the
// range just as if manually writing to each page".
const (
	madvHugepage      = 14
	madvPopulateWrite = 23
)

// arena is the size and alignment of the blocks in which the Go runtime
// maps its heap on 64-bit Linux (heapArenaBytes in the runtime's
// malloc.go). It is only used to round the advised range: were it another
// size, the advice would cover a little more or less, nothing else.
const arena = 64 << 20

// page is the smallest page size of Linux on the systems Go runs on.
const page = 4 << 10

// advise asks for huge pages in the heap arenas that hold s (its whole
// capacity): the slice itself, and its neighbours, which in a big solve are
// mostly other large arrays made at the same time. Then it has the kernel
// fault in the pages of the first n elements, the part the caller will
// write, in one call rather than one fault at a time: with huge pages that
// is a few faults either way, without them (a kernel whose huge pages are
// switched off) it took the 1e6-cell bench board from 5.2 s to 3.9 s.
// Parts of the ranges that are not mapped are passed over by the kernel;
// errors (an older kernel, no huge pages) leave the memory as it is.
func advise[T any](s []T, n int) {
	var t T
	size := uintptr(len(s)) * unsafe.Sizeof(t)
	if size < Threshold {
		return
	}
	start := uintptr(unsafe.Pointer(unsafe.SliceData(s)))
	beg := start &^ (arena - 1)
	end := (start + size + arena - 1) &^ (arena - 1)
	_, _, _ = syscall.Syscall(syscall.SYS_MADVISE, beg, end-beg, madvHugepage)
	pb := (start + page - 1) &^ (page - 1)
	pe := (start + uintptr(n)*unsafe.Sizeof(t)) &^ (page - 1)
	if pb < pe {
		_, _, _ = syscall.Syscall(syscall.SYS_MADVISE, pb, pe-pb, madvPopulateWrite)
	}
}
