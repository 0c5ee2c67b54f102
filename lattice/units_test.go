package lattice

import (
	"errors"
	"math"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestScale(t *testing.T) {
	cases := []struct {
		name  string
		ref   float64
		unit  Unit
		x     float64 // physical length or time
		t     float64 // expected dimensionless time
		tunit string
	}{
		// t = C·z (coupled-mode theory, common practice).
		{"per cm", 1.5, PerCentimetre, 4, 6, "cm"},
		{"per mm", 0.15, PerMillimetre, 40, 6, "mm"},
		// t = E·τ/ħ with ħ = 0.6582119569 eV·fs (CODATA 2018): 1 eV for
		// ħ/eV fs gives t = 1.
		{"eV", 1, ElectronVolt, HbarEVfs, 1, "fs"},
		{"meV", 10, MilliElectronVolt, 100 * HbarEVfs, 1, "fs"},
	}
	for _, c := range cases {
		s, err := NewScale(c.ref, c.unit)
		require.NoError(t, err, c.name)
		assert.InDelta(t, c.t, s.Time(c.x), 1e-12, c.name)
		assert.InDelta(t, c.x, s.Physical(c.t), 1e-12*c.x, c.name)
		assert.InDelta(t, c.x, s.Physical(s.Time(c.x)), 1e-12*c.x, c.name)
		assert.InDelta(t, 2.0, s.Weight(2*c.ref), 1e-15, c.name)
		assert.InDelta(t, 3*c.ref, s.Coupling(3), 1e-15, c.name)
		assert.Equal(t, c.tunit, c.unit.TimeUnit())
	}
	// 1 meV hopping: 1/γ = ħ/E = 658.2119569 fs (CODATA 2018).
	s, err := NewScale(1, MilliElectronVolt)
	require.NoError(t, err)
	assert.InDelta(t, 658.2119569, s.Physical(1), 1e-9)
}

func TestConvert(t *testing.T) {
	for _, c := range []struct {
		c        float64
		from, to Unit
		want     float64
	}{
		{0.15, PerMillimetre, PerCentimetre, 1.5}, // 1 mm⁻¹ = 10 cm⁻¹ (SI)
		{1.5, PerCentimetre, PerMillimetre, 0.15},
		{0.02, ElectronVolt, MilliElectronVolt, 20}, // 1 eV = 1000 meV (SI)
		{20, MilliElectronVolt, ElectronVolt, 0.02},
		{7, PerCentimetre, PerCentimetre, 7},
	} {
		got, err := Convert(c.c, c.from, c.to)
		require.NoError(t, err)
		assert.InDelta(t, c.want, got, 1e-14*c.want)
	}
	var ie *InputError
	_, err := Convert(1, PerCentimetre, ElectronVolt)
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "to", ie.Field)
	_, err = Convert(math.NaN(), PerCentimetre, PerMillimetre)
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "coupling", ie.Field)
	_, err = NewScale(0, PerCentimetre)
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "reference", ie.Field)
	_, err = NewScale(1, Unit(99))
	require.True(t, errors.As(err, &ie))
	assert.Equal(t, "unit", ie.Field)
}
