package spectra

import (
	"context"
	"math"
	"math/cmplx"
	"math/rand/v2"
	"runtime"
	"sync"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/internal/sparse"
)

// KPMSettings configures the kernel polynomial method. The zero value means
// 512 moments, 10 random vectors, seed 0, 200 bins, Lanczos bounds and
// GOMAXPROCS workers.
type KPMSettings struct {
	// Moments is the number M of Chebyshev moments μ_0 … μ_{M−1}; the
	// energy resolution is about π·a/M for a spectrum of half-width a.
	Moments int
	// Vectors is the number R of random vectors of the stochastic trace.
	Vectors int
	// Seed fixes the random vectors: vector r draws from PCG(Seed, r), so the
	// result does not depend on the number of workers.
	Seed uint64
	// Bins is the number of energy bins of the returned DOS.
	Bins int
	// Lo and Hi, when Lo < Hi, are known bounds of the spectrum; otherwise
	// Bounds estimates them with LanczosSteps steps (0 means 40).
	Lo, Hi       float64
	LanczosSteps int
	// Workers caps the goroutines (one random vector each); 0 means
	// GOMAXPROCS.
	Workers int
}

const (
	maxMoments = 1 << 16
	maxVectors = 1 << 14
	maxStored  = 1 << 24 // vectors × moments
	maxBinWork = 1 << 30 // bins × moments
)

func (s *KPMSettings) fill() error {
	if s.Moments == 0 {
		s.Moments = 512
	}
	if s.Vectors == 0 {
		s.Vectors = 10
	}
	if s.Bins == 0 {
		s.Bins = 200
	}
	if s.Moments < 2 || s.Moments > maxMoments {
		return fault.Range("dos.moments", "between 2 and 65536", s.Moments)
	}
	if s.Vectors < 1 || s.Vectors > maxVectors {
		return fault.Range("dos.vectors", "between 1 and 16384", s.Vectors)
	}
	if err := checkBins(s.Bins); err != nil {
		return err
	}
	// The moments of every vector are kept (for the error bars), and each
	// bin costs one pass over the moments.
	if s.Vectors*s.Moments > maxStored {
		return fault.Range("dos.vectors", "at most "+itoa(maxStored/s.Moments)+" with "+itoa(s.Moments)+" moments", s.Vectors)
	}
	if int64(s.Bins)*int64(s.Moments) > maxBinWork {
		return fault.Range("dos.bins", "at most "+itoa(int(maxBinWork/int64(s.Moments)))+" with "+itoa(s.Moments)+" moments", s.Bins)
	}
	if s.Workers <= 0 {
		s.Workers = runtime.GOMAXPROCS(0)
	}
	if math.IsNaN(s.Lo) || math.IsNaN(s.Hi) || math.IsInf(s.Lo, 0) || math.IsInf(s.Hi, 0) {
		return fault.New("dos.bounds", "must be finite; got [%v, %v]", s.Lo, s.Hi)
	}
	if (s.Lo != 0 || s.Hi != 0) && !(s.Lo < s.Hi) {
		return fault.New("dos.bounds", "must satisfy lo < hi (or both be 0 for Lanczos bounds); got [%v, %v]", s.Lo, s.Hi)
	}
	return nil
}

// Jackson returns the Jackson kernel coefficients g_0 … g_{M−1} for M
// moments (Weiße, Wellein, Alvermann, Fehske, Rev. Mod. Phys. 78, 275
// (2006), eq. 71):
//
//	g_n = [(M−n+1) cos(πn/(M+1)) + sin(πn/(M+1)) cot(π/(M+1))] / (M+1).
//
// It damps the Gibbs oscillations of the truncated Chebyshev series and
// keeps the reconstructed density positive. m < 1 gives nil.
func Jackson(m int) []float64 {
	if m < 1 {
		return nil
	}
	g := make([]float64, m)
	q := math.Pi / float64(m+1)
	cot := math.Cos(q) / math.Sin(q)
	for n := range g {
		g[n] = (float64(m-n+1)*math.Cos(q*float64(n)) + math.Sin(q*float64(n))*cot) / float64(m+1)
	}
	return g
}

// KPM returns the density of states per site of the Hermitian matrix h by
// the kernel polynomial method with the Jackson kernel (Weiße et al., Rev.
// Mod. Phys. 78, 275 (2006)). The moments μ_n = Tr T_n(H̃)/N, H̃ = (H − b)/a
// mapped into (−1, 1), are estimated by a stochastic trace over R random
// vectors (Hutchinson, Commun. Stat. Simul. Comput. 18, 1059 (1989)):
// random signs ±1 for a real h, random phases e^{iφ} for a complex one.
// Each vector costs about M/2 products (the doubling μ_{2n} = 2⟨α_n|α_n⟩ − μ_0,
// μ_{2n+1} = 2⟨α_{n+1}|α_n⟩ − μ_1) and three vectors of memory per worker.
//
// The bins span [b − a, b + a]; each bin holds the exact integral of the
// kernel-damped series over it divided by its width, so the density
// integrates to 1 over the bins. Error gives the standard error of each bin
// over the vectors (R ≥ 2, and bins·M·R ≤ 2³¹, else nil) and Nominal the
// expected relative error 1/√(R·N).
//
// Limits (errors name the field): 2 ≤ M ≤ 65536, 1 ≤ R ≤ 16384 with
// R·M ≤ 2²⁴, 1 ≤ bins ≤ 2²⁰ with bins·M ≤ 2³⁰.
func KPM(h *sparse.CSR, s KPMSettings) (DOS, error) {
	return KPMContext(context.Background(), h, s)
}

// KPMContext is KPM checked against ctx between Chebyshev steps; a
// cancelled run returns an error wrapping the context's error
// (errors.Is(err, context.Canceled)) and a *fault.Error of kind Cancelled.
func KPMContext(ctx context.Context, h *sparse.CSR, s KPMSettings) (DOS, error) {
	if err := s.fill(); err != nil {
		return DOS{}, err
	}
	mu, err := kpmMoments(ctx, h, &s, -1)
	if err != nil {
		return DOS{}, err
	}
	d := kpmDensity(mu, &s)
	d.Nominal = 1 / math.Sqrt(float64(s.Vectors)*float64(h.N))
	return d, nil
}

// LocalDOS returns the local density of states ρ_i(E) = Σ_n |⟨i|n⟩|² δ(E − E_n)
// at site i by KPM with the Jackson kernel: the moments ⟨i|T_n(H̃)|i⟩ are
// exact (no stochastic trace), so Error is nil. s.Vectors and s.Seed are
// ignored except for the Lanczos start vector.
func LocalDOS(h *sparse.CSR, site int, s KPMSettings) (DOS, error) {
	if site < 0 || site >= h.N {
		return DOS{}, fault.Range("dos.site", "between 0 and "+itoa(h.N-1), site)
	}
	s.Vectors = 1
	if err := s.fill(); err != nil {
		return DOS{}, err
	}
	mu, err := kpmMoments(context.Background(), h, &s, site)
	if err != nil {
		return DOS{}, err
	}
	d := kpmDensity(mu, &s)
	d.Error = nil
	d.Vectors = 0
	return d, nil
}

// kpmMoments fills s.Lo, s.Hi (when unset) and returns the moments of each
// vector, mu[r][n]; site ≥ 0 selects the single basis vector e_site.
func kpmMoments(ctx context.Context, h *sparse.CSR, s *KPMSettings, site int) ([][]float64, error) {
	known := s.Lo < s.Hi
	if !known {
		lo, hi, err := Bounds(h, s.LanczosSteps, s.Seed)
		if err != nil {
			return nil, err
		}
		s.Lo, s.Hi = lo, hi
	}
	for attempt := 0; ; attempt++ {
		mu, ok := kpmRun(ctx, h, s, site)
		if err := ctx.Err(); err != nil {
			return nil, &cancelError{err}
		}
		if ok {
			return mu, nil
		}
		if known || attempt > 0 {
			return nil, &fault.Error{Kind: fault.Numerical, Field: "dos",
				Msg: "Chebyshev moments grew beyond 1: the spectrum leaves the bounds [" +
					ftoa(s.Lo) + ", " + ftoa(s.Hi) + "]"}
		}
		s.Lo, s.Hi = h.Gershgorin() // the Lanczos bounds were too tight
	}
}

// kpmRun computes the moments of every vector with the current bounds; it
// reports false when a moment exceeds 1 in modulus by more than rounding
// (an eigenvalue outside the bounds).
func kpmRun(ctx context.Context, h *sparse.CSR, s *KPMSettings, site int) ([][]float64, bool) {
	lo, hi := s.Lo, s.Hi
	if hi-lo < 1e-12*(1+math.Abs(lo)+math.Abs(hi)) {
		lo, hi = lo-0.5, hi+0.5 // a spectrum of one point
	}
	const eps = 0.01 // keep H̃ inside [−0.99, 0.99]: Weiße et al. 2006, sec. II.C
	a := (hi - lo) / (2 - eps)
	b := (hi + lo) / 2
	s.Lo, s.Hi = b-a, b+a
	mu := make([][]float64, s.Vectors)
	bad := make([]bool, s.Vectors)
	var wg sync.WaitGroup
	jobs := make(chan int)
	for w := 0; w < min(s.Workers, s.Vectors); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var ws kpmWork
			for r := range jobs {
				if ctx.Err() != nil {
					continue // drain: the caller reports the cancellation
				}
				mu[r], bad[r] = ws.moments(ctx, h, s, site, r, 1/a, b)
			}
		}()
	}
	for r := 0; r < s.Vectors; r++ {
		jobs <- r
	}
	close(jobs)
	wg.Wait()
	for _, x := range bad {
		if x {
			return nil, false
		}
	}
	return mu, true
}

// kpmWork holds one worker's three vectors, reused across random vectors.
type kpmWork struct {
	r0, r1, r2 []float64
	c0, c1, c2 []complex128
}

// moments returns μ_0 … μ_{M−1} of vector r, normalised by ⟨v|v⟩, and
// whether any exceeded 1 + 1e-6 in modulus.
func (w *kpmWork) moments(ctx context.Context, h *sparse.CSR, s *KPMSettings, site, r int, scale, shift float64) ([]float64, bool) {
	n, m := h.N, s.Moments
	mu := make([]float64, m)
	rng := rand.New(rand.NewPCG(s.Seed, uint64(r)))
	var norm float64
	var dot func(first bool) (cc, dc float64)
	var swap func()
	if h.IsReal() {
		if w.r0 == nil {
			w.r0, w.r1, w.r2 = make([]float64, n), make([]float64, n), make([]float64, n)
		}
		for i := range w.r0 {
			switch {
			case site >= 0:
				w.r0[i] = 0
			case rng.Uint64()&1 == 0:
				w.r0[i] = 1
			default:
				w.r0[i] = -1
			}
		}
		if site >= 0 {
			w.r0[site] = 1
		}
		// r0 = α_{n−1}, r1 = α_n; a step writes α_{n+1} into r2.
		dot = func(first bool) (float64, float64) {
			if first {
				return chebStepReal(h, w.r1, w.r0, w.r2, scale, shift, true)
			}
			return chebStepReal(h, w.r2, w.r1, w.r0, scale, shift, false)
		}
		swap = func() { w.r0, w.r1, w.r2 = w.r1, w.r2, w.r0 }
	} else {
		if w.c0 == nil {
			w.c0, w.c1, w.c2 = make([]complex128, n), make([]complex128, n), make([]complex128, n)
		}
		for i := range w.c0 {
			if site >= 0 {
				w.c0[i] = 0
			} else {
				w.c0[i] = cmplx.Rect(1, 2*math.Pi*rng.Float64())
			}
		}
		if site >= 0 {
			w.c0[site] = 1
		}
		dot = func(first bool) (float64, float64) {
			if first {
				return chebStepComplex(h, w.c1, w.c0, w.c2, scale, shift, true)
			}
			return chebStepComplex(h, w.c2, w.c1, w.c0, scale, shift, false)
		}
		swap = func() { w.c0, w.c1, w.c2 = w.c1, w.c2, w.c0 }
	}
	// α_0 = v, α_1 = H̃v: μ_0 = ⟨α_0|α_0⟩, μ_1 = ⟨α_1|α_0⟩.
	cc, dc := dot(true)
	norm = cc
	mu[0] = 1
	if m > 1 {
		mu[1] = dc / norm
	}
	// Step k computes α_{k+1} from α_k, α_{k−1} with ⟨α_k|α_k⟩ and
	// ⟨α_{k+1}|α_k⟩: μ_{2k} = 2⟨α_k|α_k⟩ − μ_0, μ_{2k+1} = 2⟨α_{k+1}|α_k⟩ − μ_1.
	for k := 1; 2*k < m; k++ {
		if k%32 == 0 && ctx.Err() != nil {
			return mu, false
		}
		cc, dc := dot(false)
		mu[2*k] = 2*cc/norm - mu[0]
		if 2*k+1 < m {
			mu[2*k+1] = 2*dc/norm - mu[1]
		}
		swap()
	}
	for _, v := range mu {
		if !(math.Abs(v) <= 1+1e-6) {
			return mu, true
		}
	}
	return mu, false
}

// kpmDensity turns the moments of each vector into the binned density with
// the Jackson kernel, exactly integrated over each bin: with x = cos θ,
// ∫ T_n(x)/(π√(1−x²)) dx over a bin is [sin nθ]/(nπ) between its edges.
func kpmDensity(mu [][]float64, s *KPMSettings) DOS {
	m, bins, R := s.Moments, s.Bins, len(mu)
	g := Jackson(m)
	width := (s.Hi - s.Lo) / float64(bins)
	// Per-vector densities (for the error bars) cost bins·M·R; beyond 2³¹
	// operations only the mean is formed and Error stays nil.
	r0 := 0
	if R < 2 || int64(bins)*int64(m)*int64(R+1) > 1<<31 {
		r0 = R
	}
	// c[n·(R+1) + r] = g_n μ_n^{(r)} (twice that for n ≥ 1); r = R is the mean.
	w := R + 1
	c := make([]float64, m*w)
	for r := 0; r < R; r++ {
		for n := 0; n < m; n++ {
			f := g[n] * mu[r][n]
			if n > 0 {
				f *= 2
			}
			c[n*w+r] = f
			c[n*w+R] += f / float64(R)
		}
	}
	d := DOS{Energy: make([]float64, bins), Density: make([]float64, bins), Width: width,
		Moments: m, Vectors: R, Lo: s.Lo, Hi: s.Hi}
	if r0 == 0 {
		d.Error = make([]float64, bins)
	}
	// F_r(θ) = (1/π)[c_0 θ + Σ_{n≥1} c_n sin(nθ)/n] at every edge; the mass
	// of a bin is F(θ_left) − F(θ_right). Edges are visited in order, keeping
	// the previous edge's values.
	prev, cur := make([]float64, w), make([]float64, w)
	for e := 0; e <= bins; e++ {
		x := -1 + 2*float64(e)/float64(bins)
		th := math.Acos(math.Max(-1, math.Min(1, x)))
		s1, s0 := math.Sin(th), 0.0 // sin(nθ), sin((n−1)θ)
		c2 := 2 * math.Cos(th)
		for r := r0; r <= R; r++ {
			cur[r] = c[r] * th
		}
		for n := 1; n < m; n++ {
			t := s1 / float64(n)
			cn := c[n*w : (n+1)*w]
			for r := r0; r <= R; r++ {
				cur[r] += cn[r] * t
			}
			s0, s1 = s1, c2*s1-s0
		}
		if e > 0 {
			b := e - 1
			d.Energy[b] = s.Lo + (float64(b)+0.5)*width
			d.Density[b] = (prev[R] - cur[R]) / math.Pi / width
			if d.Error != nil {
				var v float64
				for r := 0; r < R; r++ {
					t := (prev[r]-cur[r])/math.Pi/width - d.Density[b]
					v += t * t
				}
				d.Error[b] = math.Sqrt(v / float64(R-1) / float64(R))
			}
		}
		prev, cur = cur, prev
	}
	return d
}

// cancelError wraps the context's error so that errors.Is(err,
// context.Canceled) holds and errors.As finds a *fault.Error of kind
// Cancelled.
type cancelError struct{ err error }

func (c *cancelError) Error() string { return "spectra: cancelled: " + c.err.Error() }
func (c *cancelError) Unwrap() []error {
	return []error{c.err, &fault.Error{Kind: fault.Cancelled, Msg: "cancelled: " + c.err.Error()}}
}
