package measure

import (
	"bytes"
	"errors"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestReadCSV(t *testing.T) {
	in := "# chip M-7, synthetic\nLength, site, intensity, uncertainty\n" +
		"2,0,1,0.1\n2,1,3,0.1\n1,1,0.5,0.05\n1,0,1.5,0.05\n"
	m, err := ReadCSV(strings.NewReader(in), 2)
	require.NoError(t, err)
	assert.Equal(t, []float64{1, 2}, m.Lengths)
	assert.Equal(t, [][]float64{{1.5, 0.5}, {1, 3}}, m.Intensity)
	assert.Equal(t, [][]float64{{0.05, 0.05}, {0.1, 0.1}}, m.Uncertainty)
	assert.Equal(t, []int{5, 3}, m.Line)

	var buf bytes.Buffer
	require.NoError(t, m.WriteCSV(&buf))
	m2, err := ReadCSV(&buf, 2)
	require.NoError(t, err)
	assert.Equal(t, m.Intensity, m2.Intensity)
	assert.Equal(t, m.Uncertainty, m2.Uncertainty)

	// No uncertainty column, columns in another order.
	m, err = ReadCSV(strings.NewReader("site,intensity,length\n0,1,0\n1,0,0\n"), 2)
	require.NoError(t, err)
	assert.Nil(t, m.Uncertainty)
	assert.Equal(t, []float64{0}, m.Lengths)
}

func TestReadCSVErrors(t *testing.T) {
	const head = "length,site,intensity\n"
	cases := []struct {
		name, in string
		field    string
		line     string // the message must start with it
	}{
		{"empty", "", "csv", ""},
		{"header only", head, "csv", ""},
		{"missing column", "length,site\n1,0\n", "csv.header", "line 1:"},
		{"unknown column", "length,site,intensity,colour\n", "csv.header", "line 1:"},
		{"repeated column", "length,site,intensity,site\n", "csv.header", "line 1:"},
		{"short row", head + "1,0,1\n1,1\n", "csv", "line 3:"},
		{"negative intensity", head + "1,0,1\n1,1,-0.5\n", "csv.intensity", "line 3:"},
		{"NaN intensity", head + "1,0,NaN\n1,1,1\n", "csv.intensity", "line 2:"},
		{"text intensity", head + "1,0,bright\n", "csv.intensity", "line 2:"},
		{"negative length", head + "-1,0,1\n", "csv.length", "line 2:"},
		{"unknown site", head + "1,0,1\n1,2,1\n", "csv.site", "line 3:"},
		{"fractional site", head + "1,0.5,1\n", "csv.site", "line 2:"},
		{"duplicate", head + "1,0,1\n1,1,1\n# c\n1,0,2\n", "csv.site", "line 5:"},
		{"missing site", head + "1,0,1\n1,1,1\n2,1,1\n", "csv.site", "line 4:"},
		{"all dark", head + "1,0,0\n1,1,0\n", "csv.intensity", "line 2:"},
		{"negative uncertainty", "length,site,intensity,uncertainty\n1,0,1,-1\n", "csv.uncertainty", "line 2:"},
		{"bad quote", head + "1,0,\"1\n", "csv", "line 2:"},
	}
	for _, c := range cases {
		m, err := ReadCSV(strings.NewReader(c.in), 2)
		assert.Nil(t, m, c.name)
		var ie *InputError
		require.True(t, errors.As(err, &ie), "%s: %v", c.name, err)
		assert.Equal(t, c.field, ie.Field, c.name)
		assert.True(t, strings.HasPrefix(ie.Msg, c.line), "%s: %q", c.name, ie.Msg)
	}
	_, err := ReadCSV(strings.NewReader(head), 0)
	var ie *InputError
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "sites", ie.Field)
}
