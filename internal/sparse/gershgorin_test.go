package sparse

import (
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
)

func TestGershgorin(t *testing.T) {
	// Rows: {d = 1, entries 2 and 3+4i: r = 2 + 5}, {d = −2, entry 0.5},
	// {d = 0, no entries}: discs [−6, 8], [−2.5, −1.5], [0, 0].
	m := &CSR{N: 3, RowPtr: []int32{0, 2, 3, 3}, Col: []int32{1, 2, 0},
		Val: []float64{2, 3, 0.5}, Imag: []float64{0, 4, 0}, Diag: []float64{1, -2, 0}}
	assert.Equal(t, complex(3, 4), m.Entry(1))
	lo, hi := m.Gershgorin()
	assert.Equal(t, -6.0, lo)
	assert.Equal(t, 8.0, hi)
	// Pattern-only storage: every entry is Unit (a 4-cycle with unit
	// hopping: discs [−2, 2], the spectrum is {−2, 0, 0, 2}).
	c := &CSR{N: 4, RowPtr: []int32{0, 2, 4, 6, 8}, Col: []int32{1, 3, 0, 2, 1, 3, 2, 0}, Unit: 1}
	assert.Equal(t, complex(1, 0), c.Entry(5))
	lo, hi = c.Gershgorin()
	assert.Equal(t, -2.0, lo)
	assert.Equal(t, 2.0, hi)
	lo, hi = (&CSR{RowPtr: []int32{0}}).Gershgorin()
	assert.True(t, math.IsInf(lo, 1) && math.IsInf(hi, -1))
}
