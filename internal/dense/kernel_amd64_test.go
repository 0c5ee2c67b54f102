package dense

import "testing"

// TestPortableKernels runs the product tests with the AVX2 kernels switched
// off, so that the Go fallbacks used on other machines are exercised here.
func TestPortableKernels(t *testing.T) {
	s1, s2 := hasAVX2FMA, panelWidth
	defer func() { hasAVX2FMA, panelWidth = s1, s2 }()
	// AVX2 only (8-wide tiles), then no vector kernels at all.
	panelWidth = 8
	TestGemmAgainstLoop(t)
	hasAVX2FMA = false
	TestGemmAgainstLoop(t)
	TestSymvUpper(t)
	TestHemvSplit(t)
}

// TestAddProdPortable runs TestAddProdMatchesLoops with the vector kernels
// switched off (the Go fallback other machines use) and with 8-wide tiles.
func TestAddProdPortable(t *testing.T) {
	s1, s2 := hasAVX2FMA, panelWidth
	defer func() { hasAVX2FMA, panelWidth = s1, s2 }()
	panelWidth = 8
	TestAddProdMatchesLoops(t)
	hasAVX2FMA = false
	TestAddProdMatchesLoops(t)
}
