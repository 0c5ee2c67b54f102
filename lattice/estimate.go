package lattice

import (
	"strconv"

	"github.com/ampwalk/ampwalk/internal/fault"
)

// EstimateBytes returns the bytes that a Graph with the given numbers of
// sites, bonds and position coordinates occupies, plus its Hamiltonian in
// CSR form with unit weights. It counts
//
//	positions      8·sites·dim      (float64)
//	bond ends      8·bonds          (two int32 per bond)
//	CSR row starts 4·(sites+1)      (int32)
//	CSR columns    8·bonds          (int32, each bond stored twice)
//
// and no CSR values (unit weights give a pattern-only matrix). Weighted,
// disordered or complex graphs need 8 bytes per bond and 16 per stored
// entry more; propagation vectors are the caller's to add.
// Negative arguments count as zero.
func EstimateBytes(sites, bonds, dim int) int64 {
	n, m, d := int64(max(sites, 0)), int64(max(bonds, 0)), int64(max(dim, 0))
	return 8*n*d + 8*m + 4*(n+1) + 8*m
}

// checkSize refuses a graph of the given size before anything is allocated:
// more than MaxSites sites gives an Invalid error, an estimate above
// fault.MemoryLimit a TooLarge error, both naming field. Sizes are float64
// so that callers can pass counts that would overflow an int.
func checkSize(field string, sites, bonds float64, dim int) error {
	if err := checkSites(field, sites); err != nil {
		return err
	}
	est := EstimateBytes(int(sites), int(bonds), dim)
	if lim := fault.MemoryLimit(); est > lim {
		return fault.Large(field, est, lim)
	}
	return nil
}

// checkSites returns an Invalid error naming field when sites > MaxSites.
func checkSites(field string, sites float64) error {
	if sites > MaxSites {
		return fault.New(field, "gives %.4g sites, more than the largest graph (%d sites)", sites, MaxSites)
	}
	return nil
}

// checkInt returns an Invalid error unless lo ≤ v ≤ hi.
func checkInt(field string, v, lo, hi int) error {
	if v < lo || v > hi {
		return fault.Range(field, "between "+strconv.Itoa(lo)+" and "+strconv.Itoa(hi), v)
	}
	return nil
}

// faultVariant reports an unknown carpet variant.
func faultVariant(v CarpetVariant) error {
	return fault.Range("variant", `CarpetCells ("cells") or CarpetCorners ("corners")`, int(v))
}
