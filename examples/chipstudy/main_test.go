package main

import (
	"bytes"
	"context"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestStudySmall(t *testing.T) {
	// A small scenario: gasket generation 4 ((3⁵+3)/2 = 123 sites,
	// references.md) and the matched triangle.
	out := filepath.Join(t.TempDir(), "study")
	s := scenario{Generation: 4, TMin: 0.1, TMax: 20, TRef: 5, Points: 24, Tolerance: 1e-10, Coupling: 1.5, Out: out}
	var stdout, stderr bytes.Buffer
	require.NoError(t, study(context.Background(), s, &stdout, &stderr))
	rep := stdout.String()
	for _, want := range []string{"Halvorsen Lab", "invented", "123 waveguides", "GASKET — corner injection",
		"TRIANGLE — bulk injection", "crossover at", "Pólya number", "calibrated against measurements",
		"safety rules"} {
		assert.Contains(t, rep, want)
	}
	assert.Contains(t, stderr.String(), "[8/8]")
	for _, f := range []string{"curves.csv", "regimes.csv", "report.json"} {
		st, err := os.Stat(filepath.Join(out, f))
		require.NoError(t, err)
		assert.Positive(t, st.Size())
	}
	b, err := os.ReadFile(filepath.Join(out, "report.json"))
	require.NoError(t, err)
	var doc struct {
		Runs []struct {
			Geometry string         `json:"geometry"`
			Response map[string]any `json:"response"`
		} `json:"runs"`
	}
	require.NoError(t, json.Unmarshal(b, &doc))
	assert.Len(t, doc.Runs, 8)
	csv, err := os.ReadFile(filepath.Join(out, "curves.csv"))
	require.NoError(t, err)
	assert.Equal(t, 1+8*24, strings.Count(string(csv), "\n")) // header + 8 runs × 24 times
}

func TestScenarioChecks(t *testing.T) {
	bad := []scenario{
		{Generation: 2, TMin: 0.1, TMax: 20, TRef: 5, Points: 24, Tolerance: 1e-10, Coupling: 1},
		{Generation: 4, TMin: 0.1, TMax: 0.5, TRef: 0.2, Points: 24, Tolerance: 1e-10, Coupling: 1},
		{Generation: 4, TMin: 0.1, TMax: 20, TRef: 50, Points: 24, Tolerance: 1e-10, Coupling: 1},
		{Generation: 4, TMin: 0.1, TMax: 20, TRef: 5, Points: 2, Tolerance: 1e-10, Coupling: 1},
		{Generation: 4, TMin: 0.1, TMax: 20, TRef: 5, Points: 24, Tolerance: 0, Coupling: 1},
		{Generation: 4, TMin: 0.1, TMax: 20, TRef: 5, Points: 24, Tolerance: 1e-10, Coupling: -1},
	}
	for _, s := range bad {
		assert.Error(t, s.check(), "%+v", s)
	}
	s := scenario{Generation: 8, TMin: 0.1, TMax: 20, TRef: 5, Points: 24, Tolerance: 1e-10, Coupling: 1}
	require.NoError(t, s.check())
	// (L+1)(L+2)/2 closest to (3⁹+3)/2 = 9843: L = 139 gives 9870.
	assert.Equal(t, 139, s.Side)
}
