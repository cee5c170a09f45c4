// A Matrix is built in two phases, as in circuit simulators: a Builder
// collects the structural non-zeros once (which node touches which), then the
// numeric values are cleared and re-stamped at every Newton iteration without
// allocating.

package sparse

import (
	"fmt"
	"slices"
	"sort"
)

// Builder collects the structural non-zeros of a square matrix.
type Builder struct {
	n    int
	rows []int
	cols []int
}

// NewBuilder returns a builder for an n×n matrix.
func NewBuilder(n int) *Builder {
	return &Builder{n: n}
}

// Grow makes room for k more marks, so that marking a known number of
// entries does not reallocate.
func (b *Builder) Grow(k int) {
	b.rows = slices.Grow(b.rows, k)
	b.cols = slices.Grow(b.cols, k)
}

// Mark records that entry (i, j) may be non-zero. Marking an entry twice is
// harmless.
func (b *Builder) Mark(i, j int) {
	if i < 0 || i >= b.n || j < 0 || j >= b.n {
		panic(fmt.Sprintf("sparse: entry (%d, %d) outside %d×%d", i, j, b.n, b.n))
	}
	b.rows = append(b.rows, i)
	b.cols = append(b.cols, j)
}

// Build returns a matrix with the marked pattern plus the full diagonal, all
// values zero.
func (b *Builder) Build() *Matrix {
	n := b.n
	// Bucket the marks by row (counting sort), diagonal included.
	count := make([]int, n+1)
	for _, i := range b.rows {
		count[i+1]++
	}
	for i := 0; i < n; i++ {
		count[i+1]++ // the diagonal
	}
	for i := 0; i < n; i++ {
		count[i+1] += count[i]
	}
	cols := make([]int, count[n])
	next := append([]int(nil), count[:n]...)
	for i := 0; i < n; i++ {
		cols[next[i]] = i
		next[i]++
	}
	for k, i := range b.rows {
		cols[next[i]] = b.cols[k]
		next[i]++
	}
	// Sort and de-duplicate each row in place, compacting as we go.
	m := &Matrix{N: n, RowPtr: make([]int, n+1)}
	out := 0
	for i := 0; i < n; i++ {
		row := cols[count[i]:count[i+1]]
		sort.Ints(row)
		for k, c := range row {
			if k > 0 && c == row[k-1] {
				continue
			}
			cols[out] = c
			out++
		}
		m.RowPtr[i+1] = out
	}
	m.Col = cols[:out:out]
	m.Val = make([]float64, out)
	return m
}

// Matrix is a square matrix in compressed sparse row form. Row i's column
// indices are Col[RowPtr[i]:RowPtr[i+1]], sorted ascending, with values at
// the same positions of Val.
type Matrix struct {
	N      int
	RowPtr []int
	Col    []int
	Val    []float64
}

// NNZ returns the number of stored entries.
func (m *Matrix) NNZ() int { return len(m.Col) }

// Zero sets every stored value to zero, keeping the pattern.
func (m *Matrix) Zero() {
	clear(m.Val)
}

// Index returns the position of entry (i, j) in Val, or -1 if it is not in
// the pattern.
func (m *Matrix) Index(i, j int) int {
	lo, hi := m.RowPtr[i], m.RowPtr[i+1]
	cols := m.Col[lo:hi]
	// Rows of a thermal network are short: a linear scan beats a binary
	// search below a few dozen entries.
	if len(cols) <= 16 {
		for k, c := range cols {
			if c == j {
				return lo + k
			}
		}
		return -1
	}
	k := sort.SearchInts(cols, j)
	if k < len(cols) && cols[k] == j {
		return lo + k
	}
	return -1
}

// Add adds v to entry (i, j), which must be in the pattern.
func (m *Matrix) Add(i, j int, v float64) {
	k := m.Index(i, j)
	if k < 0 {
		panic(fmt.Sprintf("sparse: entry (%d, %d) is not in the pattern", i, j))
	}
	m.Val[k] += v
}

// At returns entry (i, j), zero when it is outside the pattern.
func (m *Matrix) At(i, j int) float64 {
	if k := m.Index(i, j); k >= 0 {
		return m.Val[k]
	}
	return 0
}

// MulVec sets dst = m·x, splitting long matrices into blocks of rows
// done in parallel (each row's sum is the same either way).
func (m *Matrix) MulVec(dst, x []float64) {
	inBlocks(m.N, func(_, lo, hi int) { mulRows(m.RowPtr, m.Col, m.Val, dst, x, lo, hi) })
}

// Clone returns a deep copy of m.
func (m *Matrix) Clone() *Matrix {
	return &Matrix{
		N:      m.N,
		RowPtr: append([]int(nil), m.RowPtr...),
		Col:    append([]int(nil), m.Col...),
		Val:    append([]float64(nil), m.Val...),
	}
}
