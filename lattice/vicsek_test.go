package lattice

import (
	"math"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestVicsek(t *testing.T) {
	for g := 0; g <= 4; g++ {
		gr, err := Vicsek(g)
		require.NoError(t, err)
		// 5^g sites, 5^g − 1 bonds (a tree; common practice).
		n := ipow(5, g)
		require.Equal(t, n, gr.Len())
		require.Equal(t, n-1, gr.NumBonds())
		requireValid(t, gr)
		requireDistinctPositions(t, gr)
		// Every site is the centre of a cell kept by the documented digit
		// rule, and the bonds are exactly the edge-sharing pairs.
		var p []float64
		for i := 0; i < n; i++ {
			p = gr.Pos(p, i)
			x, y := int(math.Floor(p[0])), int(math.Floor(p[1]))
			assert.Equal(t, float64(x)+0.5, p[0])
			assert.Equal(t, float64(y)+0.5, p[1])
			for k := 0; k < g; k++ {
				assert.True(t, x%3 == 1 || y%3 == 1, "site %d at %v", i, p)
				x, y = x/3, y/3
			}
			assert.Zero(t, x)
			assert.Zero(t, y)
		}
		if g <= 3 {
			assert.Equal(t, unitPairs(gr), gr.NumBonds())
		}
	}
	for _, g := range []int{-1, MaxVicsekGeneration + 1} {
		_, err := Vicsek(g)
		requireInputError(t, err, fault.Invalid, "generation")
	}
}
