package sparse

import (
	"fmt"
	"math"

	"github.com/heatgraph/heatgraph/internal/bigmem"
)

// op is a square matrix in compressed rows with 4-byte column indices:
// the form in which the Krylov solvers and the multigrid levels sweep a
// matrix several times an iteration. At a million rows the sweeps are
// bound by memory traffic, and 12 bytes an entry instead of 16 is a
// quarter less of it (a five-point product on a 1000 × 1000 grid: 6.3 ms
// with 8-byte indices, 5.0 ms with 4-byte ones, measured on one core).
type op struct {
	N      int
	RowPtr []int
	Col    []int32
	Val    []float64
}

// narrowCols returns a's column indices as int32, in a new slice: the
// multigrid hierarchy knows its pattern by the address of its indices.
func narrowCols(a *Matrix) ([]int32, error) {
	if a.N > math.MaxInt32 {
		return nil, fmt.Errorf("%w: order %d is beyond the iterative solvers' 32-bit column indices", ErrPattern, a.N)
	}
	cols := bigmem.Make[int32](len(a.Col))
	inBlocks(a.N, func(_, lo, hi int) {
		for k := a.RowPtr[lo]; k < a.RowPtr[hi]; k++ {
			cols[k] = int32(a.Col[k])
		}
	})
	return cols, nil
}

// narrowing keeps the 4-byte column indices of the last pattern it was
// given, so that a new set of values of the same pattern costs nothing.
type narrowing struct {
	cols []int32
	of   *int // &Col[0] of the pattern cols holds
	n    int
}

// op returns a with 4-byte column indices; its values are a's, not a copy.
func (c *narrowing) op(a *Matrix) (*op, error) {
	if len(a.Col) == 0 || &a.Col[0] != c.of || len(a.Col) != c.n {
		cols, err := narrowCols(a)
		if err != nil {
			return nil, err
		}
		c.cols, c.n = cols, len(a.Col)
		c.of = nil
		if len(a.Col) > 0 {
			c.of = &a.Col[0]
		}
	}
	return &op{N: a.N, RowPtr: a.RowPtr, Col: c.cols, Val: a.Val}, nil
}

// Index returns the position of entry (i, j), or -1 when it is not stored.
func (m *op) Index(i, j int) int { return findCol(m.RowPtr, m.Col, i, j) }

// At returns entry (i, j), zero when it is not stored.
func (m *op) At(i, j int) float64 {
	if k := m.Index(i, j); k >= 0 {
		return m.Val[k]
	}
	return 0
}

// MulVec sets dst = m·x, in parallel blocks of rows on long matrices.
func (m *op) MulVec(dst, x []float64) {
	inBlocks(m.N, func(_, lo, hi int) { mulRows(m.RowPtr, m.Col, m.Val, dst, x, lo, hi) })
}

// matrix returns m with the package's usual indices (a copy).
func (m *op) matrix() *Matrix {
	w := &Matrix{N: m.N, RowPtr: append([]int(nil), m.RowPtr...), Col: make([]int, len(m.Col)), Val: append([]float64(nil), m.Val...)}
	for k, c := range m.Col {
		w.Col[k] = int(c)
	}
	return w
}
