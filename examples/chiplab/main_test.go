package main

import (
	"context"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/ampwalk/ampwalk/observables/measure"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestLoop runs the whole example and checks its outputs exist, the
// synthetic label and the caution are present, and the synthetic data read
// back strictly.
func TestLoop(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the full loop (a few seconds)")
	}
	dir := t.TempDir()
	var sb strings.Builder
	require.NoError(t, run(context.Background(), dir, 7, 12, io.MultiWriter(&sb)))
	for _, f := range []string{"design.txt", "plan.csv", "plan.json", "measured_synthetic.csv", "reduction.csv", "comparison.csv", "report.txt"} {
		_, err := os.Stat(filepath.Join(dir, f))
		assert.NoError(t, err, f)
	}
	assert.Contains(t, sb.String(), "SYNTHETIC")
	assert.Contains(t, sb.String(), "safety rules")
	rep, err := os.ReadFile(filepath.Join(dir, "report.txt"))
	require.NoError(t, err)
	assert.Contains(t, string(rep), "SYNTHETIC")
	f, err := os.Open(filepath.Join(dir, "measured_synthetic.csv"))
	require.NoError(t, err)
	defer f.Close()
	m, err := measure.ReadCSV(f, m7.Side*m7.Side)
	require.NoError(t, err)
	assert.Len(t, m.Lengths, 12)
}
