package spectra

import (
	"encoding/json"
	"os"
	"testing"

	"github.com/ampwalk/ampwalk/lattice"
	"github.com/stretchr/testify/require"
)

// TestReferenceRandomGraph compares Eigensystem, IPR and WindowMap on a
// random complex graph with numpy 1.24.2's linalg.eigh (the data and the
// script that made it are in testdata/).
func TestReferenceRandomGraph(t *testing.T) {
	raw, err := os.ReadFile("testdata/reference_random_graph.json")
	require.NoError(t, err)
	var ref struct {
		N         int         `json:"n"`
		Gamma     float64     `json:"gamma"`
		Bonds     [][]float64 `json:"bonds"`
		Onsite    []float64   `json:"onsite"`
		Values    []float64   `json:"values"`
		IPR       []float64   `json:"ipr"`
		Window    []float64   `json:"window"`
		WindowMap []float64   `json:"window_map"`
	}
	require.NoError(t, json.Unmarshal(raw, &ref))
	var bonds []lattice.Bond
	for _, b := range ref.Bonds {
		bonds = append(bonds, lattice.Bond{I: int(b[0]), J: int(b[1]), W: b[2], Phase: b[3]})
	}
	g, err := lattice.New(ref.N, 1, nil, bonds, ref.Onsite)
	require.NoError(t, err)
	e, err := Eigensystem(g, ref.Gamma)
	require.NoError(t, err)
	require.InDeltaSlice(t, ref.Values, e.Values, 1e-11)
	// The spectrum is non-degenerate, so each eigenstate's IPR is defined.
	require.InDeltaSlice(t, ref.IPR, IPR(nil, e), 1e-9)
	m, err := WindowMap(nil, e, ref.Window[0], ref.Window[1])
	require.NoError(t, err)
	require.InDeltaSlice(t, ref.WindowMap, m, 1e-9)
}
