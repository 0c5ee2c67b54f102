package lattice

import (
	"errors"
	"math"
	"sort"
	"testing"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/stretchr/testify/require"
	"gonum.org/v1/gonum/mat"
)

// requireValid checks that New accepts g's sites, positions and bonds (no
// duplicate bonds, no self-loops, indices in range) and that every bond is
// stored with real unit-free values.
func requireValid(t *testing.T, g *Graph) {
	t.Helper()
	bonds := make([]Bond, g.NumBonds())
	for k := range bonds {
		bonds[k] = g.Bond(k)
	}
	var onsite []float64
	if g.onsite != nil {
		onsite = g.onsite
	}
	_, err := New(g.Len(), g.Dim(), g.Coords(), bonds, onsite)
	require.NoError(t, err)
	require.Len(t, g.Coords(), g.Len()*g.Dim())
}

// degrees returns the number of bonds at each site.
func degrees(g *Graph) []int {
	d := make([]int, g.Len())
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		d[b.I]++
		d[b.J]++
	}
	return d
}

// bondLengths returns the smallest and largest Euclidean bond length.
func bondLengths(g *Graph) (lo, hi float64) {
	lo, hi = math.Inf(1), 0
	var p, q []float64
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		p, q = g.Pos(p, b.I), g.Pos(q, b.J)
		var s float64
		for c := range p {
			s += (p[c] - q[c]) * (p[c] - q[c])
		}
		s = math.Sqrt(s)
		lo, hi = math.Min(lo, s), math.Max(hi, s)
	}
	return lo, hi
}

// eigenvalues returns the ascending eigenvalues of the real symmetric
// Hamiltonian of g (γ = 1), by gonum's mat.EigenSym.
func eigenvalues(t *testing.T, g *Graph) []float64 {
	t.Helper()
	n := g.Len()
	a := mat.NewSymDense(n, nil)
	for i := 0; i < n; i++ {
		a.SetSym(i, i, g.Onsite(i))
	}
	for k := 0; k < g.NumBonds(); k++ {
		b := g.Bond(k)
		a.SetSym(b.I, b.J, a.At(b.I, b.J)+b.W)
	}
	var es mat.EigenSym
	require.True(t, es.Factorize(a, false))
	v := es.Values(nil)
	sort.Float64s(v)
	return v
}

// requireInputError checks that err is an *InputError of kind kind naming
// field.
func requireInputError(t *testing.T, err error, kind fault.Kind, field string) {
	t.Helper()
	var e *InputError
	require.True(t, errors.As(err, &e), "want *InputError, got %v", err)
	require.Equal(t, kind, e.Kind, "%v", err)
	require.Equal(t, field, e.Field, "%v", err)
	require.NotEmpty(t, e.Msg)
}

func sortFloats(v []float64) { sort.Float64s(v) }
