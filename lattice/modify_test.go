package lattice

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestScaleHopping(t *testing.T) {
	g, err := Fibonacci(8, 0.5, 2)
	require.NoError(t, err)
	h, err := g.ScaleHopping(-3)
	require.NoError(t, err)
	for k := 0; k < g.NumBonds(); k++ {
		assert.Equal(t, -3*g.Bond(k).W, h.Bond(k).W)
	}
	c, err := Chain(4, false)
	require.NoError(t, err)
	h, err = c.ScaleHopping(2)
	require.NoError(t, err)
	assert.Equal(t, 2.0, h.Bond(0).W)
	assert.Equal(t, 1.0, c.Bond(0).W) // the original is untouched
	same, err := c.ScaleHopping(1)
	require.NoError(t, err)
	assert.Equal(t, c.Bond(2), same.Bond(2))
	for _, s := range []float64{0, math.NaN(), math.Inf(1)} {
		_, err := c.ScaleHopping(s)
		requireInputError(t, err, fault.Invalid, "hopping")
	}
}

func TestRemove(t *testing.T) {
	g, err := Square(3, 3, false)
	require.NoError(t, err)
	g, err = g.WithDisorder(Disorder{Onsite: 1, Bond: 0.5}, rand.New(rand.NewPCG(1, 2)))
	require.NoError(t, err)
	h, kept, err := g.Remove([]int{4, 0})
	require.NoError(t, err)
	assert.Equal(t, []int{1, 2, 3, 5, 6, 7, 8}, kept)
	assert.Equal(t, 7, h.Len())
	// 12 bonds of the 3×3 square minus 4 at the centre and 2 at the corner.
	assert.Equal(t, 6, h.NumBonds())
	requireValid(t, h)
	for a, i := range kept {
		assert.Equal(t, g.Pos(nil, i), h.Pos(nil, a))
		assert.Equal(t, g.Onsite(i), h.Onsite(a))
	}
	// Every surviving bond is an original bond between kept sites, in the
	// original relative order, with its weight.
	k0 := 0
	for k := 0; k < h.NumBonds(); k++ {
		b := h.Bond(k)
		for ; k0 < g.NumBonds(); k0++ {
			o := g.Bond(k0)
			if o.I == kept[b.I] && o.J == kept[b.J] {
				assert.Equal(t, o.W, b.W)
				break
			}
		}
		require.Less(t, k0, g.NumBonds(), "bond %d not found in order", k)
	}
	same, kept, err := g.Remove(nil)
	require.NoError(t, err)
	assert.Equal(t, g.Len(), same.Len())
	assert.Len(t, kept, g.Len())

	for _, bad := range [][]int{{9}, {-1}, {2, 3, 2}, {0, 1, 2, 3, 4, 5, 6, 7, 8}} {
		_, _, err := g.Remove(bad)
		requireInputError(t, err, fault.Invalid, "remove")
	}
}

func TestRemoveIf(t *testing.T) {
	// A rectangular hole in a 6×6 square lattice.
	g, err := Square(6, 6, false)
	require.NoError(t, err)
	h, kept, err := g.RemoveIf(func(i int, p []float64) bool {
		return p[0] >= 2 && p[0] <= 3 && p[1] >= 2 && p[1] <= 3
	})
	require.NoError(t, err)
	assert.Equal(t, 32, h.Len())
	assert.Len(t, kept, 32)
	// 60 bonds minus the 4 inside the hole and the 8 leading into it.
	assert.Equal(t, 48, h.NumBonds())
	requireValid(t, h)
	_, _, err = g.RemoveIf(nil)
	requireInputError(t, err, fault.Invalid, "remove")
	_, _, err = g.RemoveIf(func(int, []float64) bool { return true })
	requireInputError(t, err, fault.Invalid, "remove")
}
