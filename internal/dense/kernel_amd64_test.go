package dense

import "testing"

// TestPortableKernels runs the product tests with the AVX2 kernels switched
// off, so that the Go fallbacks used on other machines are exercised here.
func TestPortableKernels(t *testing.T) {
	saved := hasAVX2FMA
	hasAVX2FMA = false
	defer func() { hasAVX2FMA = saved }()
	TestGemmAgainstLoop(t)
	TestSymvUpper(t)
}
