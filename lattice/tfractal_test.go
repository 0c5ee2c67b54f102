package lattice

import (
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestTFractal(t *testing.T) {
	for g := 0; g <= 7; g++ {
		gr, err := TFractal(g)
		require.NoError(t, err)
		// 3^g + 1 sites and 3^g bonds (Agliari, Phys. Rev. E 77, 011128
		// (2008), from memory; also the recursion N_g = 3N_{g−1} − 2).
		m := ipow(3, g)
		require.Equal(t, m+1, gr.Len())
		require.Equal(t, m, gr.NumBonds())
		requireValid(t, gr)
		requireDistinctPositions(t, gr)
		lo, hi := bondLengths(gr)
		assert.Equal(t, 1.0, lo)
		assert.Equal(t, 1.0, hi)
		assert.Equal(t, []float64{float64(ipow(2, g)), 0}, gr.Pos(nil, 1))
		// Degrees: a tree whose sites have degree 1 or 3 (the T's), except
		// the two ends of generation 0.
		for i, d := range degrees(gr) {
			assert.Contains(t, []int{1, 3}, d, "site %d", i)
		}
	}
	_, err := TFractal(-1)
	requireInputError(t, err, fault.Invalid, "generation")
	_, err = TFractal(MaxTFractalGeneration + 1)
	requireInputError(t, err, fault.Invalid, "generation")
}
