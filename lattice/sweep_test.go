package lattice

import (
	"errors"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestBuilderSweep calls every builder with seeded random small parameters,
// some out of range, and checks that each call either returns an
// *InputError or a graph that New accepts, never panicking (common
// practice: a randomised sweep over sizes).
func TestBuilderSweep(t *testing.T) {
	rng := rand.New(rand.NewPCG(2026, 12))
	small := func() int { return rng.IntN(9) - 2 } // −2 … 6
	bool1 := func() bool { return rng.IntN(2) == 1 }
	builds := []func() (*Graph, error){
		func() (*Graph, error) { return Chain(small(), bool1()) },
		func() (*Graph, error) { return Square(small(), small(), bool1()) },
		func() (*Graph, error) { return Triangle(small()) },
		func() (*Graph, error) { return TriangularPatch(small(), small(), bool1()) },
		func() (*Graph, error) { return Honeycomb(small(), small(), bool1()) },
		func() (*Graph, error) { return Kagome(small(), small(), bool1()) },
		func() (*Graph, error) { return Lieb(small(), small(), bool1()) },
		func() (*Graph, error) { return Cubic(small(), small(), small(), bool1()) },
		func() (*Graph, error) { return Hypercube(small()) },
		func() (*Graph, error) { return Complete(small()) },
		func() (*Graph, error) { return Star(small()) },
		func() (*Graph, error) { return CayleyTree(small(), small()) },
		func() (*Graph, error) { return Gasket(small()) },
		func() (*Graph, error) { return Carpet(small()%4, CarpetVariant(small()%3)) },
		func() (*Graph, error) { return Vicsek(small()) },
		func() (*Graph, error) { return TFractal(small()) },
		func() (*Graph, error) { return Fibonacci(small(), float64(small()), float64(small())) },
		func() (*Graph, error) { return Harper(small(), rng.Float64(), rng.Float64(), rng.Float64()) },
	}
	for round := 0; round < 40; round++ {
		for k, b := range builds {
			g, err := b()
			if err != nil {
				var e *InputError
				require.True(t, errors.As(err, &e), "builder %d: %v", k, err)
				require.NotEmpty(t, e.Field)
				continue
			}
			requireValid(t, g)
			// Modifiers on the result: remove a random site when more than one.
			if g.Len() > 1 {
				h, kept, err := g.Remove([]int{rng.IntN(g.Len())})
				require.NoError(t, err)
				require.Len(t, kept, g.Len()-1)
				requireValid(t, h)
			}
		}
	}
}
