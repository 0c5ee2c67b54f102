package observables

import (
	"encoding/binary"
	"math"
	"testing"
)

// FuzzFitRegimes feeds arbitrary series: FitRegimes either returns an
// *InputError or a result free of NaN and Inf, and never panics.
func FuzzFitRegimes(f *testing.F) {
	f.Add([]byte{1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15, 16}, uint8(4))
	f.Add(make([]byte, 64), uint8(2))
	f.Fuzz(func(t *testing.T, data []byte, segs uint8) {
		n := len(data) / 8
		if n > 200 {
			n = 200
		}
		ts := make([]float64, n)
		ys := make([]float64, n)
		tt := 0.0
		for i := range n {
			u := binary.LittleEndian.Uint64(data[8*i:])
			tt += 1e-3 + float64(u&0xffff)/1000
			ts[i] = tt
			ys[i] = math.Float64frombits(u>>1 | 0x3000000000000000) // positive, finite, wide range
			if u&1 == 1 {
				ys[i] = math.Float64frombits(u) // anything, including NaN and negatives
			}
		}
		fit, err := FitRegimes(ts, ys, nil, RegimeSettings{MaxSegments: int(segs % 10), Replicates: 10})
		if err != nil {
			if _, ok := err.(*InputError); !ok {
				t.Fatalf("error of type %T: %v", err, err)
			}
			return
		}
		check := func(v float64) {
			if !finite(v) {
				t.Fatalf("non-finite value in %+v", fit)
			}
		}
		for _, v := range fit.LocalExponent {
			check(v)
		}
		for _, r := range fit.Regimes {
			check(r.Exponent)
			check(r.Error)
			check(r.From)
			check(r.To)
			check(r.Prefactor)
		}
		for _, c := range fit.Crossovers {
			check(c.Time)
			check(c.Low)
			check(c.High)
		}
	})
}
