// Package bigmem makes the large slices of a big solve: the matrices,
// vectors and index arrays of a meshed model of 1e5 to 1e6 cells.
//
// A slice of many megabytes is first written page by page, and on Linux
// every first write to a 4 KiB page is a page fault. A solve of a million
// cells touches about 200,000 fresh pages; on a virtual machine a fault can
// cost 10 µs, so the faults alone took seconds (measured with heatgraph
// bench: 200,000 faults and 1.9 s of system time in a 5 s solve). Make asks
// the kernel for transparent huge pages (2 MiB) for the heap around a large
// slice before anything writes to it, which makes 512 faults into one, and
// has the kernel fault in the pages the caller will write in one call. The
// advice is only advice: where the kernel has no huge pages to give, or on
// another system, Make is the built-in make.
//
// The cost is resident memory in long-lived processes: once the runtime
// returns part of an advised arena to the kernel, the kernel may fill a
// huge page around what is still in use again (khugepaged), so a process
// that solves many large models one after the other can keep more memory
// resident than it uses. A solve from the command line, which exits when
// done, does not see it.
package bigmem

// Threshold is the size in bytes from which Make advises huge pages. The
// advice covers the heap arena around the slice (see advise), so one
// quarter-mebibyte array of a mesh of 1e5 cells is enough to bring its
// neighbours under it: on the 1e5-cell board of heatgraph bench, faults
// fell from 15,000 to 2,000 and the solve from 0.55 s to 0.42 s against a
// threshold of 4 MiB. Smaller slices, those of models of a few thousand
// nodes, are left alone, so small runs keep their small footprint.
const Threshold = 256 << 10

// Make returns make([]T, n), with huge pages advised for a large slice.
func Make[T any](n int) []T {
	return MakeCap[T](n, n)
}

// MakeCap returns make([]T, n, c), with huge pages advised for a large
// capacity and the first n elements' pages faulted in at once.
func MakeCap[T any](n, c int) []T {
	s := make([]T, n, c)
	advise(s[:c], n)
	return s
}
