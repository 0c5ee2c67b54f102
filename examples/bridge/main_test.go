package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// buildBridge compiles this command into a temporary directory.
func buildBridge(t *testing.T) string {
	t.Helper()
	if testing.Short() {
		t.Skip("builds the bridge binary")
	}
	goBin, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command on PATH")
	}
	bin := filepath.Join(t.TempDir(), "ampwalk-bridge")
	out, err := exec.Command(goBin, "build", "-o", bin, ".").CombinedOutput()
	require.NoError(t, err, string(out))
	return bin
}

func TestBridgeExitStatus(t *testing.T) {
	bin := buildBridge(t)

	// Bad lines get error lines; the exit status is still 0 (contract:
	// "The process exits 0 at end of input, even when some requests failed").
	cmd := exec.Command(bin)
	cmd.Stdin = strings.NewReader(`{"id":"a","lattice":{"kind":"chain","sites":9},"start":{"site":4},"times":[0,1]}
not json
{"id":"b","lattice":{"kind":"gasket","generaton":2},"start":{"site":0},"times":[1]}
{"id":"c","lattice":{"kind":"gasket","generation":2},"start":{"site":0},"times":[1]}
`)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	require.NoError(t, cmd.Run(), stderr.String())
	var ids, codes []string
	sc := bufio.NewScanner(&stdout)
	for sc.Scan() {
		var m struct {
			ID    string `json:"id"`
			Error *struct {
				Code string `json:"code"`
			} `json:"error"`
		}
		require.NoError(t, json.Unmarshal(sc.Bytes(), &m), sc.Text())
		ids = append(ids, m.ID)
		code := ""
		if m.Error != nil {
			code = m.Error.Code
		}
		codes = append(codes, code)
	}
	assert.Equal(t, []string{"a", "", "b", "c"}, ids)
	assert.Equal(t, []string{"", "malformed", "unknown-field", ""}, codes)
	// Logs go to stderr only.
	assert.NotEmpty(t, stderr.String())

	// Standard input that cannot be read (a directory): non-zero status.
	dir, err := os.Open(t.TempDir())
	require.NoError(t, err)
	defer dir.Close()
	cmd = exec.Command(bin)
	cmd.Stdin = dir
	stdout.Reset()
	cmd.Stdout = &stdout
	err = cmd.Run()
	var ee *exec.ExitError
	require.True(t, errors.As(err, &ee), "want a non-zero exit, got %v", err)
	assert.Equal(t, 1, ee.ExitCode())
	assert.Empty(t, stdout.String())

	// SIGINT while waiting for input: exit 130 (128 + SIGINT, common practice).
	cmd = exec.Command(bin)
	in, err := cmd.StdinPipe()
	require.NoError(t, err)
	defer in.Close()
	outp, err := cmd.StdoutPipe()
	require.NoError(t, err)
	require.NoError(t, cmd.Start())
	_, err = in.Write([]byte(`{"id":"a","lattice":{"kind":"chain","sites":3},"start":{"site":0},"times":[1]}` + "\n"))
	require.NoError(t, err)
	// Once it has answered, the bridge has installed its signal handler.
	first, err := bufio.NewReader(outp).ReadString('\n')
	require.NoError(t, err)
	assert.Contains(t, first, `"id":"a"`)
	require.NoError(t, cmd.Process.Signal(os.Interrupt))
	err = cmd.Wait()
	require.True(t, errors.As(err, &ee), "want a non-zero exit, got %v", err)
	assert.Equal(t, 130, ee.ExitCode())
}

func TestBridgeAnswersPlanJobs(t *testing.T) {
	// The binary links walk/plan, whose planner answers plan jobs (lab
	// extension): a five-guide row, 10 µm apart, couplings from an
	// exponential law (invented numbers).
	bin := buildBridge(t)
	cmd := exec.Command(bin)
	cmd.Stdin = strings.NewReader(`{"id":"p","lattice":{"kind":"positions","positions":[[0,0],[10,0],[20,0],[30,0],[40,0]],"law":{"type":"exponential","c0":1,"kappa":0.2,"d0":10},"cutoff":15},"start":{"site":2},"plan":{"max_length":6,"samples":9,"points":16}}
`)
	var stdout, stderr bytes.Buffer
	cmd.Stdout, cmd.Stderr = &stdout, &stderr
	require.NoError(t, cmd.Run(), stderr.String())
	var m struct {
		ID    string          `json:"id"`
		Error json.RawMessage `json:"error"`
		Plan  struct {
			Grid    []float64 `json:"grid"`
			Samples []any     `json:"samples"`
		} `json:"plan"`
	}
	require.NoError(t, json.Unmarshal(stdout.Bytes(), &m), stdout.String())
	require.Nil(t, m.Error, string(m.Error))
	assert.Equal(t, "p", m.ID)
	assert.Len(t, m.Plan.Grid, 16)
	assert.Len(t, m.Plan.Samples, 9)
}
