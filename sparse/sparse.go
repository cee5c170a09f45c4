// A Matrix is built in two phases, as in circuit simulators: a Builder
// collects the structural non-zeros once (which node touches which), then the
// numeric values are cleared and re-stamped at every Newton iteration without
// allocating.

package sparse

import (
	"fmt"
	"math"
	"slices"

	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// Builder collects the structural non-zeros of a square matrix.
//
// A caller that knows its marks ahead may Count the row of every mark
// before making the first one: the marks then go straight into their rows,
// with no list of them kept (a meshed plate has millions).
type Builder struct {
	n     int
	rows  []int32
	cols  []int32
	marks int
	// When counted: keys holds each row's bucketed marks (see build),
	// rows start[i] ≤ k < start[i+1], filled up to next[i].
	start, next []int
	keys        []uint64
	counted     bool
}

// NewBuilder returns a builder for an n×n matrix.
func NewBuilder(n int) *Builder {
	if n > math.MaxInt32 {
		panic(fmt.Sprintf("sparse: %d rows are too many for a builder", n))
	}
	return &Builder{n: n}
}

// Count announces a mark in row i, to be made later. Either every mark's
// row is counted before the first Mark, or none is.
func (b *Builder) Count(i int) {
	if b.marks > 0 {
		panic("sparse: Count after Mark")
	}
	if uint(i) >= uint(b.n) {
		panic(fmt.Sprintf("sparse: row %d outside %d×%d", i, b.n, b.n))
	}
	if b.start == nil {
		b.start = make([]int, b.n+1)
	}
	b.start[i+1]++
}

// Mark records that entry (i, j) may be non-zero. Marking an entry twice is
// harmless. Marks are numbered from 0 in the order they are made (see
// BuildSlots).
func (b *Builder) Mark(i, j int) {
	if uint(i) >= uint(b.n) || uint(j) >= uint(b.n) {
		panic(fmt.Sprintf("sparse: entry (%d, %d) outside %d×%d", i, j, b.n, b.n))
	}
	if b.start != nil {
		if !b.counted {
			b.bucket()
		}
		if b.next[i] == b.start[i+1] {
			panic(fmt.Sprintf("sparse: more marks in row %d than counted", i))
		}
		b.keys[b.next[i]] = uint64(j)<<32 | uint64(b.marks+1)
		b.next[i]++
		b.marks++
		return
	}
	b.rows = append(b.rows, int32(i))
	b.cols = append(b.cols, int32(j))
	b.marks++
}

// Marks returns the number of marks made so far.
func (b *Builder) Marks() int { return b.marks }

// Build returns a matrix with the marked pattern plus the full diagonal, all
// values zero.
func (b *Builder) Build() *Matrix {
	m, _ := b.build(false)
	return m
}

// BuildSlots is Build that also returns where each mark landed: slot[k]
// is the position in the matrix's Val of the entry of mark k. It spares a
// search per entry when the same entries are later stamped by position.
func (b *Builder) BuildSlots() (*Matrix, []int32) {
	return b.build(true)
}

// build buckets the marks by row (a counting sort, diagonal included),
// then sorts and de-duplicates each row. A bucketed mark is its column in
// the high 32 bits and one more than its number in the low ones (0 for
// the diagonal), so that one sort of integers orders a row by column.
func (b *Builder) build(slots bool) (*Matrix, []int32) {
	n := b.n
	var start []int
	var keys []uint64
	if b.start != nil {
		// Counted: the marks are in their rows already (sorting them
		// below in place changes nothing for a later Build).
		if !b.counted {
			b.bucket()
		}
		for i := range n {
			if b.next[i] != b.start[i+1] {
				panic(fmt.Sprintf("sparse: fewer marks in row %d than counted", i))
			}
		}
		start, keys = b.start, b.keys
	} else {
		// Listed: bucket them here, leaving the builder as it is.
		start = make([]int, n+1)
		for _, i := range b.rows {
			start[i+1]++
		}
		var next []int
		keys, next = layout(start)
		for k, i := range b.rows {
			keys[next[i]] = uint64(b.cols[k])<<32 | uint64(k+1)
			next[i]++
		}
	}
	var slot []int32
	if slots {
		slot = bigmem.Make[int32](b.marks)
	}
	m := &Matrix{N: n, RowPtr: bigmem.Make[int](n + 1)}
	cols := bigmem.MakeCap[int](0, start[n])
	for i := range n {
		row := keys[start[i]:start[i+1]]
		sortKeys(row)
		last := -1
		for _, key := range row {
			c := int(key >> 32)
			if c != last {
				cols = append(cols, c)
				last = c
			}
			if mk := uint32(key); slots && mk > 0 {
				slot[mk-1] = int32(len(cols) - 1)
			}
		}
		m.RowPtr[i+1] = len(cols)
	}
	m.Col = cols[:len(cols):len(cols)]
	m.Val = bigmem.Make[float64](len(cols))
	return m, slot
}

// bucket lays out a counted builder's rows.
func (b *Builder) bucket() {
	b.keys, b.next = layout(b.start)
	b.counted = true
}

// layout turns start from the marks per row (start[i+1] for row i) into
// the rows' first positions among the keys, diagonal included, and
// returns the keys with each row's diagonal first and, per row, the
// position of its next mark.
func layout(start []int) (keys []uint64, next []int) {
	n := len(start) - 1
	for i := range n {
		start[i+1] += start[i] + 1 // the diagonal
	}
	if start[n]-n >= math.MaxUint32-1 {
		panic(fmt.Sprintf("sparse: %d marks are too many for a builder", start[n]-n))
	}
	keys = bigmem.Make[uint64](start[n])
	next = bigmem.Make[int](n)
	for i := range n {
		keys[start[i]] = uint64(i) << 32
		next[i] = start[i] + 1
	}
	return keys, next
}

// sortKeys sorts a row's keys: by insertion when short, as the rows of a
// thermal network mostly are.
func sortKeys(row []uint64) {
	if len(row) > 24 {
		slices.Sort(row)
		return
	}
	for k := 1; k < len(row); k++ {
		v := row[k]
		j := k
		for ; j > 0 && row[j-1] > v; j-- {
			row[j] = row[j-1]
		}
		row[j] = v
	}
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
func (m *Matrix) Index(i, j int) int { return findCol(m.RowPtr, m.Col, i, j) }

// findCol returns the position of column j in row i of a pattern with
// sorted rows, or -1. Rows of a thermal network are short: a linear scan
// beats a binary search below a few dozen entries.
func findCol[I int | int32](ptr []int, col []I, i, j int) int {
	lo, hi := ptr[i], ptr[i+1]
	cols := col[lo:hi]
	if len(cols) <= 16 {
		for k, c := range cols {
			if int(c) == j {
				return lo + k
			}
		}
		return -1
	}
	k, found := slices.BinarySearch(cols, I(j))
	if found {
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

// Transpose returns mᵀ, its rows sorted as every matrix's are.
func (m *Matrix) Transpose() *Matrix {
	t := &Matrix{N: m.N, RowPtr: bigmem.Make[int](m.N + 1), Col: bigmem.Make[int](len(m.Col)), Val: bigmem.Make[float64](len(m.Val))}
	for _, c := range m.Col {
		t.RowPtr[c+1]++
	}
	for j := 0; j < m.N; j++ {
		t.RowPtr[j+1] += t.RowPtr[j]
	}
	next := append([]int(nil), t.RowPtr[:m.N]...)
	for i := 0; i < m.N; i++ {
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			c := m.Col[k]
			t.Col[next[c]], t.Val[next[c]] = i, m.Val[k]
			next[c]++
		}
	}
	return t
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
