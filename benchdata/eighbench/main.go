// Command eighbench times spectra.SymEigen (eigenvalues and eigenvectors) on
// a seeded random symmetric matrix: n sites, about four random bonds per
// site with weights in [0.5, 1.5), on-site energies in [−1, 1). It is the Go
// half of benchdata/eigh_side_by_side.sh.
//
//	eighbench -n 3000 -seed 1 -matrix a.bin   # write the matrix (float64, little endian, row-major)
//	eighbench -n 3000 -seed 1 -values w.bin   # time SymEigen, write the eigenvalues
//
// With -complex each bond carries a random phase e^{iθ} and HermEigen is
// timed instead (the matrix file then holds complex128, real and imaginary
// parts interleaved).
package main

import (
	"encoding/binary"
	"flag"
	"fmt"
	"log"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"os"
	"time"

	"github.com/ampwalk/ampwalk/internal/dense"
	"github.com/ampwalk/ampwalk/spectra"
)

func matrix(n int, seed uint64) []float64 {
	rnd := rand.New(rand.NewPCG(seed, 1))
	a := make([]float64, n*n)
	for i := 0; i < n; i++ {
		a[i*n+i] = 2*rnd.Float64() - 1
	}
	for b := 0; b < 2*n; b++ {
		i, j := rnd.IntN(n), rnd.IntN(n)
		if i == j {
			continue
		}
		w := 0.5 + rnd.Float64()
		a[i*n+j] += w
		a[j*n+i] += w
	}
	return a
}

// complexMatrix is matrix with a seeded random phase on every bond.
func complexMatrix(n int, seed uint64) []complex128 {
	a := matrix(n, seed)
	rnd := rand.New(rand.NewPCG(seed, 2))
	c := make([]complex128, n*n)
	for i := 0; i < n; i++ {
		c[i*n+i] = complex(a[i*n+i], 0)
		for j := 0; j < i; j++ {
			if a[i*n+j] != 0 {
				h := complex(a[i*n+j], 0) * cmplx.Exp(complex(0, 2*math.Pi*rnd.Float64()))
				c[i*n+j], c[j*n+i] = h, cmplx.Conj(h)
			}
		}
	}
	return c
}

func write(name string, x any) {
	f, err := os.Create(name)
	if err != nil {
		log.Fatal(err)
	}
	if err := binary.Write(f, binary.LittleEndian, x); err != nil {
		log.Fatal(err)
	}
	if err := f.Close(); err != nil {
		log.Fatal(err)
	}
}

func main() {
	n := flag.Int("n", 3000, "matrix order")
	seed := flag.Uint64("seed", 1, "random seed")
	mfile := flag.String("matrix", "", "write the matrix to this file and exit")
	vfile := flag.String("values", "", "write the eigenvalues to this file")
	check := flag.Bool("check", false, "report max|AV − VΛ| and max|VᵀV − I| (costs two more n³ products; real case)")
	cplx := flag.Bool("complex", false, "complex Hermitian matrix with random bond phases, timed with HermEigen")
	flag.Parse()
	if *cplx {
		c := complexMatrix(*n, *seed)
		if *mfile != "" {
			write(*mfile, c)
			return
		}
		t0 := time.Now()
		w, _, err := spectra.HermEigen(c, *n, true)
		dt := time.Since(t0).Seconds()
		if err != nil {
			log.Fatal(err)
		}
		fmt.Printf("go_seconds %.3f\n", dt)
		if *vfile != "" {
			write(*vfile, w)
		}
		return
	}
	a := matrix(*n, *seed)
	if *mfile != "" {
		write(*mfile, a)
		return
	}
	var orig []float64
	if *check {
		orig = append([]float64(nil), a...)
	}
	t0 := time.Now()
	w, v, err := spectra.SymEigen(a, *n, true)
	dt := time.Since(t0).Seconds()
	if err != nil {
		log.Fatal(err)
	}
	fmt.Printf("go_seconds %.3f\n", dt)
	if *vfile != "" {
		write(*vfile, w)
	}
	if *check {
		m := *n
		av := make([]float64, m*m)
		dense.Gemm(false, false, m, m, m, 1, orig, m, v, m, 0, av, m)
		res, anorm := 0.0, 0.0
		for i := 0; i < m; i++ {
			for k := 0; k < m; k++ {
				res = math.Max(res, math.Abs(av[i*m+k]-w[k]*v[i*m+k]))
			}
		}
		for _, x := range w {
			anorm = math.Max(anorm, math.Abs(x))
		}
		dense.Gemm(true, false, m, m, m, 1, v, m, v, m, 0, av, m)
		orth := 0.0
		for i := 0; i < m; i++ {
			av[i*m+i]--
		}
		for _, x := range av {
			orth = math.Max(orth, math.Abs(x))
		}
		fmt.Printf("residual_rel %.3g orthogonality %.3g\n", res/anorm, orth)
	}
}
