package sparse

import (
	"runtime"
	"sync"
)

// The iterative solvers split their vectors into a fixed number of blocks
// of rows and work on the blocks in parallel. The split depends on the
// length alone, never on the machine, so that sums, and the smoother's
// blocks, are the same on every run and every machine: a solve gives the
// same bits whatever the number of processors.
const (
	// blocks is the number of row blocks.
	blocks = 2
	// parallelRows is the shortest vector worth splitting: below it the
	// cost of starting a goroutine outweighs the work.
	parallelRows = 1 << 14
)

// split returns the bounds of block b of n rows.
func split(n, b int) (lo, hi int) {
	return n * b / blocks, n * (b + 1) / blocks
}

// inBlocks calls f(b, lo, hi) for every block of n rows, in parallel when
// n is long enough and there is more than one processor. f must touch
// only its own block of any vector it writes.
func inBlocks(n int, f func(b, lo, hi int)) {
	if n < parallelRows || runtime.GOMAXPROCS(0) < 2 {
		for b := 0; b < blocks; b++ {
			lo, hi := split(n, b)
			f(b, lo, hi)
		}
		return
	}
	var wg sync.WaitGroup
	for b := 1; b < blocks; b++ {
		lo, hi := split(n, b)
		wg.Add(1)
		go func() {
			defer wg.Done()
			f(b, lo, hi)
		}()
	}
	lo, hi := split(n, 0)
	f(0, lo, hi)
	wg.Wait()
}

// sumBlocks returns Σ_b f(b, lo, hi), the partial sums added in block
// order.
func sumBlocks(n int, f func(lo, hi int) float64) float64 {
	var part [blocks]float64
	inBlocks(n, func(b, lo, hi int) { part[b] = f(lo, hi) })
	s := 0.0
	for _, v := range part {
		s += v
	}
	return s
}

// mulRows sets dst[i] = Σ_k val[k]·x[col[k]] for rows lo ≤ i < hi.
func mulRows[I int | int32](ptr []int, col []I, val, dst, x []float64, lo, hi int) {
	for i := lo; i < hi; i++ {
		s := 0.0
		k0, k1 := ptr[i], ptr[i+1]
		cs, vs := col[k0:k1], val[k0:k1]
		vs = vs[:len(cs)]
		for k, c := range cs {
			s += vs[k] * x[c]
		}
		dst[i] = s
	}
}

// pdot returns a·b, by blocks.
func pdot(a, b []float64) float64 {
	b = b[:len(a)]
	return sumBlocks(len(a), func(lo, hi int) float64 {
		s := 0.0
		for i := lo; i < hi; i++ {
			s += a[i] * b[i]
		}
		return s
	})
}
