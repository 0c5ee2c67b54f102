package sparse

import (
	"math"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// refRot is the reference loop of ChebFirstRot (prev == nil) and ChebNextRot.
func refRot(m *CSR, dst, cur, prev []complex128, scale, shift float64) {
	tmp := make([]complex128, m.N)
	refMulVec(m, tmp, cur)
	s := scale
	if prev != nil {
		s = 2 * scale
	}
	for i := range dst {
		v := complex(s, 0) * (tmp[i] - complex(shift, 0)*cur[i])
		if prev == nil {
			dst[i] = complex(0, -1) * v
		} else {
			dst[i] = prev[i] - complex(0, 1)*v
		}
	}
}

func TestRotatedKernelsMatchReference(t *testing.T) {
	withSmallBlocks(t)
	rng := rand.New(rand.NewPCG(7, 1))
	for _, n := range []int{1, 9, 1100} {
		for _, kd := range kinds {
			m := randomCSR(rng, n, kd.val, kd.imag, kd.diag)
			cur, prev := randVec(rng, n), randVec(rng, n)
			for _, w := range workerCounts {
				m.Workers = w
				want := make([]complex128, n)
				refRot(m, want, cur, nil, 0.4, 0.1)
				got := make([]complex128, n)
				m.ChebFirstRot(got, cur, 0.4, 0.1)
				require.Equal(t, want, got, "first %s n=%d workers=%d", kd.name, n, w)

				refRot(m, want, cur, prev, 0.4, 0.1)
				p := append([]complex128(nil), prev...)
				m.ChebNextRot(p, cur, p, 0.4, 0.1) // in place, as the propagator uses it
				require.Equal(t, want, p, "next %s n=%d workers=%d", kd.name, n, w)
			}
		}
	}
}

// TestRotatedRecurrenceIsRotatedChebyshev checks S_k = (−i)^k T_k(H̃)ψ
// against the plain recurrence (ChebFirst/ChebNext with a zero
// coefficient) for the first terms.
func TestRotatedRecurrenceIsRotatedChebyshev(t *testing.T) {
	rng := rand.New(rand.NewPCG(8, 1))
	n := 300
	m := randomCSR(rng, n, true, true, true)
	psi := randVec(rng, n)
	acc := make([]complex128, n)
	t0, t1 := append([]complex128(nil), psi...), make([]complex128, n)
	s0, s1 := append([]complex128(nil), psi...), make([]complex128, n)
	m.ChebFirst(t1, t0, acc, 0.3, 0.2, 0)
	m.ChebFirstRot(s1, s0, 0.3, 0.2)
	rot := complex(0, -1)
	for k := 2; k <= 12; k++ {
		for i := range t1 {
			require.InDelta(t, 0, cabs(s1[i]-rot*t1[i]), 1e-11*(1+cabs(t1[i])), "k=%d i=%d", k-1, i)
		}
		m.ChebNext(t0, t1, t0, acc, 0.3, 0.2, 0)
		m.ChebNextRot(s0, s1, s0, 0.3, 0.2)
		t0, t1 = t1, t0
		s0, s1 = s1, s0
		rot *= complex(0, -1)
	}
}

func cabs(z complex128) float64 { return math.Hypot(real(z), imag(z)) }
