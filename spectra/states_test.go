package spectra

import (
	"math"
	"testing"

	"github.com/stretchr/testify/require"
)

func TestIPRPath(t *testing.T) {
	for _, n := range []int{6, 9, 15} {
		e, err := Eigensystem(pathGraph(t, n), 1)
		require.NoError(t, err)
		ipr := IPR(nil, e)
		p := Participation(nil, e)
		for k, v := range ipr {
			// Path eigenstates sin(πjk/(N+1)): IPR 3/(2(N+1)), and 2/(N+1) for
			// the middle state (E = 0) when N is odd; references.md [derived].
			want := 3 / (2 * float64(n+1))
			if n%2 == 1 && math.Abs(e.Values[k]) < 1e-9 {
				want = 2 / float64(n+1)
			}
			require.InDelta(t, want, v, 1e-12, "N=%d k=%d", n, k)
			require.InDelta(t, 1/want, p[k], 1e-9)
		}
	}
}

func TestWindowMap(t *testing.T) {
	g := gasketGraph(t, 3)
	e, err := Eigensystem(g, 1)
	require.NoError(t, err)
	// The whole spectrum: completeness gives 1 on every site (common practice).
	m, err := WindowMap(nil, e, -10, 10)
	require.NoError(t, err)
	for _, v := range m {
		require.InDelta(t, 1, v, 1e-12)
	}
	// A window holding q states sums to q.
	m, err = WindowMap(m, e, -2.5, 0)
	require.NoError(t, err)
	var q int
	for _, v := range e.Values {
		if v >= -2.5 && v <= 0 {
			q++
		}
	}
	var s float64
	for _, v := range m {
		s += v
	}
	require.InDelta(t, float64(q), s, 1e-10)
	_, err = WindowMap(nil, e, 1, 0)
	require.Error(t, err)
}

func TestGasketSpectralDecimation(t *testing.T) {
	// Normalised Laplacian 4(I − D⁻¹A) of the gasket graph. Fukushima & Shima,
	// Potential Anal. 1, 1 (1992) (from memory); references.md [derived]. The
	// graph as built here (corners of degree 2, no boundary condition imposed)
	// is the Neumann case, and its spectrum matches the listed multisets.
	s13 := math.Sqrt(13)
	cases := []struct {
		g    int
		want map[float64]int
	}{
		{0, map[float64]int{0: 1, 6: 2}},
		{1, map[float64]int{0: 1, 3: 2, 6: 3}},
		{2, map[float64]int{0: 1, (5 - s13) / 2: 2, 3: 3, (5 + s13) / 2: 2, 5: 1, 6: 6}},
	}
	for _, c := range cases {
		gr := gasketGraph(t, c.g)
		n := gr.Len()
		// D^{−1/2} A D^{−1/2} is similar to D⁻¹A.
		deg := make([]float64, n)
		for k := 0; k < gr.NumBonds(); k++ {
			b := gr.Bond(k)
			deg[b.I]++
			deg[b.J]++
		}
		a := make([]float64, n*n)
		for k := 0; k < gr.NumBonds(); k++ {
			b := gr.Bond(k)
			v := 1 / math.Sqrt(deg[b.I]*deg[b.J])
			a[b.I*n+b.J], a[b.J*n+b.I] = v, v
		}
		vals, _, err := SymEigen(a, n, false)
		require.NoError(t, err)
		var want []float64
		for v, m := range c.want {
			for range m {
				want = append(want, v)
			}
		}
		got := make([]float64, n)
		for k, v := range vals {
			got[k] = 4 * (1 - v)
		}
		requireClose(t, want, got, 1e-10)
	}
}
