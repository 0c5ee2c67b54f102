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
	TestAddProdMatchesLoops(t)
	hasAVX2FMA = false
	TestGemmAgainstLoop(t)
	TestAddProdMatchesLoops(t)
	TestSymvUpper(t)
	TestHemvSplit(t)
}
