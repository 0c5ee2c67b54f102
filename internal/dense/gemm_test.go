package dense

import (
	"math"
	"math/rand/v2"
	"testing"
)

// refGemm is the reference triple loop.
func refGemm(tA, tB bool, m, n, k int, alpha float64, a []float64, lda int, b []float64, ldb int, beta float64, c []float64, ldc int) {
	for i := 0; i < m; i++ {
		for j := 0; j < n; j++ {
			s := 0.0
			for p := 0; p < k; p++ {
				x := a[i*lda+p]
				if tA {
					x = a[p*lda+i]
				}
				y := b[p*ldb+j]
				if tB {
					y = b[j*ldb+p]
				}
				s += x * y
			}
			if beta == 0 {
				c[i*ldc+j] = alpha * s
			} else {
				c[i*ldc+j] = alpha*s + beta*c[i*ldc+j]
			}
		}
	}
}

func TestGemmAgainstLoop(t *testing.T) {
	rnd := rand.New(rand.NewPCG(7, 1))
	fill := func(n int) []float64 {
		s := make([]float64, n)
		for i := range s {
			s[i] = 2*rnd.Float64() - 1
		}
		return s
	}
	// Sizes straddle the micro-tile (6×8) and block (120×256) edges.
	sizes := [][3]int{{1, 1, 1}, {6, 8, 1}, {7, 9, 3}, {13, 17, 300}, {130, 70, 257}, {40, 300, 60}, {250, 30, 20}, {300, 290, 40}, {20, 600, 30}, {600, 20, 30}, {5, 0, 3}, {3, 4, 0}}
	for _, s := range sizes {
		m, n, k := s[0], s[1], s[2]
		for _, tA := range []bool{false, true} {
			for _, tB := range []bool{false, true} {
				for _, beta := range []float64{0, 1, -0.5} {
					lda, ldb, ldc := k+2, n+1, n+3
					if tA {
						lda = m + 2
					}
					if tB {
						ldb = k + 1
					}
					a := fill(max(m, k) * (lda + 1))
					b := fill(max(n, k) * (ldb + 1))
					c := fill(m*ldc + 1)
					want := append([]float64(nil), c...)
					refGemm(tA, tB, m, n, k, 1.5, a, lda, b, ldb, beta, want, ldc)
					Gemm(tA, tB, m, n, k, 1.5, a, lda, b, ldb, beta, c, ldc)
					for i := range c {
						// 1e-13: k ≤ 300 terms of size ≤ 1.5 in float64 (common practice).
						if math.Abs(c[i]-want[i]) > 1e-13*float64(k+1) {
							t.Fatalf("m,n,k=%d,%d,%d tA=%v tB=%v β=%g: c[%d]=%g want %g", m, n, k, tA, tB, beta, i, c[i], want[i])
						}
					}
				}
			}
		}
	}
}

func TestKernelGoMatchesDispatch(t *testing.T) {
	rnd := rand.New(rand.NewPCG(8, 1))
	k := 37
	a := make([]float64, 6*k)
	b := make([]float64, 8*k)
	for i := range a {
		a[i] = rnd.Float64()
	}
	for i := range b {
		b[i] = rnd.Float64()
	}
	c1 := make([]float64, 6*10)
	c2 := make([]float64, 6*10)
	kern6x8(k, a, b, 8, c1, 10)
	kern6x8go(k, a, b, 8, c2, 10)
	for i := range c1 {
		// Both sum k = 37 products of numbers in [0,1): FMA vs separate rounding (common practice).
		if math.Abs(c1[i]-c2[i]) > 1e-13 {
			t.Fatalf("c[%d]: %g vs %g", i, c1[i], c2[i])
		}
	}
}

func BenchmarkGemm1000(b *testing.B) { benchGemm(b, 1000) }

func benchGemm(b *testing.B, n int) {
	x := make([]float64, n*n)
	for i := range x {
		x[i] = float64(i%7) - 3
	}
	c := make([]float64, n*n)
	b.ReportAllocs()
	for b.Loop() {
		Gemm(false, false, n, n, n, 1, x, n, x, n, 0, c, n)
	}
	b.ReportMetric(2*float64(n)*float64(n)*float64(n)*float64(b.N)/b.Elapsed().Seconds()/1e9, "GFlop/s")
}

func TestSymvUpper(t *testing.T) {
	rnd := rand.New(rand.NewPCG(9, 1))
	for _, m := range []int{1, 5, 255, 256, 700} {
		lda := m + 3
		a := make([]float64, m*lda)
		for i := range a {
			a[i] = 2*rnd.Float64() - 1
		}
		x := make([]float64, m)
		for i := range x {
			x[i] = rnd.Float64()
		}
		y := make([]float64, m)
		SymvUpper(m, a, lda, x, y, make([]float64, 8*m))
		for i := 0; i < m; i++ {
			s := 0.0
			for j := 0; j < m; j++ {
				if j >= i {
					s += a[i*lda+j] * x[j]
				} else {
					s += a[j*lda+i] * x[j]
				}
			}
			// m ≤ 700 terms of size ≤ 1 (common practice).
			if math.Abs(s-y[i]) > 1e-12 {
				t.Fatalf("m=%d: y[%d]=%g want %g", m, i, y[i], s)
			}
		}
	}
}

func TestHemvSplit(t *testing.T) {
	rnd := rand.New(rand.NewPCG(10, 1))
	for _, m := range []int{1, 4, 191, 192, 500} {
		lda := m + 1
		ar := make([]float64, m*lda)
		ai := make([]float64, m*lda)
		for i := range ar {
			ar[i] = 2*rnd.Float64() - 1
			ai[i] = 2*rnd.Float64() - 1
		}
		xr := make([]float64, m)
		xi := make([]float64, m)
		for i := range xr {
			xr[i], xi[i] = rnd.Float64(), rnd.Float64()
		}
		yr := make([]float64, m)
		yi := make([]float64, m)
		HemvSplit(m, ar, ai, lda, xr, xi, yr, yi, make([]float64, 16*m))
		for r := 0; r < m; r++ {
			var s complex128
			for c := 0; c < m; c++ {
				var h complex128
				switch {
				case c == r:
					h = complex(ar[r*lda+r], 0)
				case c > r: // H[r][c] = conj(H[c][r]) = conj(a[r][c])
					h = complex(ar[r*lda+c], -ai[r*lda+c])
				default: // H[r][c] = a[c][r]
					h = complex(ar[c*lda+r], ai[c*lda+r])
				}
				s += h * complex(xr[c], xi[c])
			}
			// m ≤ 500 terms of modulus ≤ 2 (common practice).
			if math.Abs(real(s)-yr[r]) > 1e-12 || math.Abs(imag(s)-yi[r]) > 1e-12 {
				t.Fatalf("m=%d: y[%d] = %g%+gi, want %v", m, r, yr[r], yi[r], s)
			}
		}
	}
}
