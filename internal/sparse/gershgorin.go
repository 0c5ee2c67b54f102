package sparse

import "math"

// Gershgorin returns the hull of the Gershgorin discs of m: every
// eigenvalue of the Hermitian m lies in [min_i (d_i − r_i), max_i (d_i + r_i)],
// with d_i the diagonal entry and r_i the sum of the moduli of the stored
// off-diagonal entries of row i (Gershgorin, Izv. Akad. Nauk SSSR 6, 749
// (1931); from memory). An empty matrix gives (+Inf, −Inf).
func (m *CSR) Gershgorin() (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for i := 0; i < m.N; i++ {
		var r float64
		for k := m.RowPtr[i]; k < m.RowPtr[i+1]; k++ {
			e := m.Entry(int(k))
			r += math.Hypot(real(e), imag(e))
		}
		var d float64
		if m.Diag != nil {
			d = m.Diag[i]
		}
		lo = math.Min(lo, d-r)
		hi = math.Max(hi, d+r)
	}
	return lo, hi
}
