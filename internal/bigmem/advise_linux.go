package bigmem

import (
	"syscall"
	"unsafe"
)

// madvHugepage is MADV_HUGEPAGE from <linux/mman.h>: "enable transparent
// huge pages for the pages in the range" (madvise(2)).
const madvHugepage = 14

// arena is the size and alignment of the blocks in which the Go runtime
// maps its heap on 64-bit Linux (heapArenaBytes in the runtime's
// malloc.go). It is only used to round the advised range: were it another
// size, the advice would cover a little more or less, nothing else.
const arena = 64 << 20

// advise asks for huge pages in the heap arenas that hold s: the slice
// itself, and its neighbours, which in a big solve are mostly other large
// arrays made at the same time. Parts of the range that are not mapped
// are passed over by the kernel; an error (a kernel without transparent
// huge pages) leaves the memory as it is.
func advise[T any](s []T) {
	var t T
	size := uintptr(len(s)) * unsafe.Sizeof(t)
	if size < Threshold {
		return
	}
	start := uintptr(unsafe.Pointer(unsafe.SliceData(s)))
	beg := start &^ (arena - 1)
	end := (start + size + arena - 1) &^ (arena - 1)
	_, _, _ = syscall.Syscall(syscall.SYS_MADVISE, beg, end-beg, madvHugepage)
}
