package walk

// JobFormatExtensions documents the JSON job format as this package
// implements it: the contract in ../shared/spec/job-format.md (binding; every
// field, default, output and error code listed there works exactly as
// written) and the extensions below. The same text, with examples, is in
// examples/notebook/README.md for notebook users.
//
// # Transport
//
// Serve(ctx, r, w, log) reads one JSON object per line and writes one per
// line, in request order, each with the request's "id" (also on error lines
// whenever the id could be read; "" otherwise). Blank lines are skipped. A
// bad line produces an error line and the loop goes on. Logs and progress go
// to log only. The bridge binary (examples/bridge) runs Serve on
// stdin/stdout/stderr and exits 0 at end of input, 1 when stdin cannot be
// read (or stdout written), 130 on SIGINT/SIGTERM after answering the job in
// flight with "cancelled".
//
// # Decoding
//
// Decoding is strict: a key the format does not define is "unknown-field",
// named with its dotted path ("lattice.generaton", "disorder.onsit"); a
// lattice parameter the kind does not take is also "unknown-field". Values
// of the wrong type or out of range are "invalid" with the path
// ("lattice.generation", "times[3]", "start.near[1]", "lattice.bonds[2]").
// Integer fields accept JSON numbers only when integral (3, 3.0, 3e0). A key
// given twice in one object is "invalid", naming the key's path (the id is
// echoed unless the id itself repeats). null means "the default". A line
// that is not JSON, or not a JSON object, is "malformed". A UTF-8 byte order
// mark at the start of a line is ignored; a string with invalid UTF-8 bytes
// is "invalid" (it would otherwise be altered).
//
// Lattice sizes: a size parameter (sites, width, height, depth, side,
// generation, dimension, leaves, shells) whose closed-form site count
// exceeds lattice.MaxSites, that goes beyond the builder's own cap (gasket
// generation 16, carpet 9, vicsek 12, tfractal 17, hypercube dimension 26,
// triangle side 32768), or whose graph alone (lattice.EstimateBytes of the
// closed-form counts) exceeds the memory limit is "too-large", refused
// before anything is built, with the estimate in bytes in the message.
// Negative, zero (where the builder needs ≥ 1) or non-integral values are
// "invalid". The memory check of a walk job counts, with method "auto", the
// Krylov basis Auto may build; when only Chebyshev's few vectors fit, the
// job runs with "chebyshev" (diagnostics.method says so).
//
// # Request fields (walk jobs)
//
//	id         string, default ""
//	lattice    required; {"kind": …, parameters} (kinds below)
//	hopping    γ, finite, default 1 (classical: ≥ 0, it is a rate; listed
//	           graph bond weights are rates too: a negative one is
//	           "invalid", "lattice.bonds[k]"; 0 is accepted and carries no
//	           transfer. Graph onsite energies do not enter the classical
//	           generator −L, L = D − W)
//	start      required; {"site": i} or {"near": [x, y, …]} (nearest site,
//	           ties to the lowest index); extension: "second": j and
//	           "statistics": "bosons" (default) | "fermions" |
//	           "distinguishable" for the "correlations" report
//	dynamics   "quantum" (default) | "classical"
//	times      list of non-negative non-decreasing times (at most 100000), or
//	           {"from": a, "to": b, "count": n, "spacing": "linear"|"log"}
//	           (count default 50, spacing default "linear"; log needs a > 0;
//	           both include a and b exactly, and log grid points at
//	           integral decimal exponents are exact powers of ten; the
//	           response echoes the expanded list)
//	tolerance  target 2-norm error of the state, in (0, 0.1], default 1e-10
//	method     "auto" (default) | "exact" | "krylov" | "chebyshev"
//	report     default ["msd", "return"]; names below
//	remove     site indices deleted first; response gets "kept"
//	disorder   {"onsite": W, "bond": V, "law": "box"|"gauss",
//	           "realisations": n (1…100000, default 1), "seed": s (default 0),
//	           "first": k (extension, default 0)}; realisation k draws from
//	           rand.New(rand.NewPCG(seed, k)), realisations first … first+n−1,
//	           so {"first": k, "realisations": 1} recomputes realisation k
//	           alone, bit for bit. Disorder jobs run each realisation on one
//	           thread and realisations in parallel (GOMAXPROCS), combined in
//	           realisation order. Classical dynamics refuses bond disorder
//	           that can make a rate negative (gauss, or box with V > 2),
//	           and on-site disorder ("disorder.onsite": −L has no on-site
//	           term, so it would be a silent no-op).
//	fit        {"quantity": "msd"|"spread", "from": t1, "to": t2,
//	           "segments": 1…8}; default msd, all reported t > 0, 4
//	window     extension: {"to": T, "samples": m (default 200)} turns the
//	           "average" report into the finite-time average (1/T)∫₀^T p dt by
//	           the trapezoidal rule on m+1 equally spaced times
//	units      extension: physical couplings and times (lab workflow, below)
//	fabrication  extension: fabricated-device ensemble (lab workflow, below)
//
// # Lattice kinds
//
// Contract kinds: chain {sites, periodic}, square {width, height, periodic},
// triangle {side}, gasket {generation}, carpet {generation, variant:
// "cells"|"corners"}, hypercube {dimension}, graph {sites, bonds [[i,j]] or
// [[i,j,w]] (required; [] for isolated sites), positions (optional;
// default site i at (i, 0)), onsite (optional)}. Extension kinds (site
// order and positions as documented by the lattice builder named): ring
// {sites ≥ 3} (Chain periodic);
// triangular {width, height, periodic} (TriangularPatch); honeycomb, kagome,
// lieb {width, height, periodic}; cubic {width, height, depth, periodic};
// complete {sites}; star {leaves}; cayley {coordination, shells}
// (CayleyTree); vicsek {generation}; tfractal {generation}; fibonacci
// {sites, weak (default 0.5), strong (default 1)}; harper {sites, lambda
// (default 2), beta (default (√5−1)/2), phase (default 0)}; positions
// {positions, law, cutoff, detuning} (lab workflow, below). Ranges are the
// builders'; their errors name "lattice.<parameter>".
//
// # Report names and response fields
//
//	msd            "msd": Σ_j p_j ‖r_j − r_start‖² per time
//	return         "return": p_start(t)
//	populations    "populations": p_j(t) per time (refused with too-large
//	               beyond MaxPopulationValues = 4194304 numbers)
//	spread         "spread": Σ_j p_j ‖r_j − r̄‖²
//	ipr            "ipr": Σ_j p_j²
//	entropy        "entropy": −Σ_j p_j ln p_j
//	participation  extension "participation": 1/Σ_j p_j²
//	polya          "polya": 1 − Π_k (1 − p_start(t_k)) over reported t_k > 0
//	regimes        "regimes" [{from, to, exponent, error, kind, prefactor}],
//	               "crossovers" [{time, low, high}] (95% intervals),
//	               "local_exponent" (smoothed d ln y/d ln t) and extension
//	               "fit_times" (the times it is given at: the reported times
//	               t > 0 with y > 0 inside the fit window). The number of
//	               regimes: BIC with a relative noise floor of 10⁻³, then
//	               neighbours whose exponents differ by less than
//	               max(0.05, 2·combined error) merged (observables.FitRegimes),
//	               so a pure power law is one regime; crossover intervals are
//	               never of zero width. Fewer than 4 usable times: "invalid",
//	               field "times" (or "fit" when the window holds too few).
//	               Kinds: decreasing,
//	               saturated, sub-diffusive, diffusive, super-diffusive,
//	               ballistic, super-ballistic (observables.Classify).
//	average        "average": {"return": p̄_start} plus "populations" when
//	               populations are reported. Quantum: exact infinite-time
//	               average from the eigensystem (degenerate levels summed as
//	               projections), refused with too-large above MaxExactSites =
//	               4096 sites unless "window" is given. Classical: the uniform
//	               distribution on the start's connected component (exact).
//	               With a window: also "window" and "samples".
//	correlations   extension "correlations": per time the n×n matrix Γ_qr of
//	               two particles injected on start and start.second (quantum
//	               only; refused above 4194304 numbers n²·times)
//
// Every response of a walk job has "id", "sites", "bonds", "times" and
// "diagnostics" {method, products, norm_drift, error_bound, seconds,
// reason (extension: why auto chose the method)}; over realisations products
// are summed, drift and bound are maxima, and method is "mixed" if they
// differ. Probabilities are clamped to [0, 1] before the reductions (a
// state within tolerance can give 1 + 10⁻⁹; norm_drift still reports the
// deviation). error_bound is at least the rounding error double precision
// cannot avoid at long times: 2⁻⁵²·‖H‖·t_max for quantum walks (‖H‖ by
// Gershgorin's bound), 10·2⁻⁵² per product for classical ones (known limit:
// at ‖γL‖·t_max ≳ 10⁶ with rates spanning many decades, Krylov's rounding
// can exceed its bound at tolerances ≲ 1e-11); a bound above max(10⁻³, 10⁴·tolerance) is "numerical",
// field "tolerance". "chebyshev" needing more than 10⁹ products (about
// ‖H‖·t_max) is refused as "too-large", field "method". A reported time
// with ‖H‖·t < 2⁻⁵³ is propagated as t = 0 (the propagator is the identity
// to rounding; the response echoes the time as given), and when the method
// "auto" chose fails its own check, or returns an error bound above that
// threshold, the walk runs once more with "krylov".
// With disorder, "realisations" gives the count and, when it is above 1,
// every output X gets "X_err", the standard error of the mean
// (populations_err, polya_err, average_err, correlations_err,
// local_exponent_err); regimes are fitted per realisation and averaged
// (observables.AverageRegimes), so each regime's "error" is the spread over
// realisations.
//
// # Series and spectrum jobs
//
// {"series": {"times", "values", "errors"?}, "report": ["regimes"], "fit":
// {"from", "to", "segments"}} runs the regime analysis on a given curve (a
// "quantity" in fit, as in a walk job's fit object, is checked and ignored);
// times strictly increasing and positive, values positive and finite,
// errors (optional) positive and finite, at least 2 points (the fit itself
// needs 4 per segment); errors name the lowest offending index over the
// lists, "series.values[k]" etc. A spectrum job has "spectrum" and a lattice
// (optionally hopping, remove, disorder with one realisation) and no
// start/times: eigenvalues (ascending; refused above MaxEigenvalueSites =
// 8192 sites), dos {bins (200), method "exact"|"kpm" (default kpm),
// moments (512), vectors (10), seed (0)} → {"energy", "density", "method"},
// ratio → {mean, used, degenerate} (spacings below 1e-9 of the spectral
// width are degeneracies), box_dimension → {dimension, error, smallest,
// largest} (fitted from the spacing scale up to boxes of a quarter of the
// extent; "error" is the fit's statistical error only and does not include
// the finite-size bias of a small sample, e.g. a compact triangle patch of
// side 64 gives about 1.74, not 2).
//
// Spectrum extensions (job_spectrum_ext.go): ipr: true → "ipr" (Σ_r |ψ_n(r)|⁴
// of every eigenstate, ascending energy; within a degenerate eigenspace the
// basis, hence the value, is the solver's choice) and "participation"
// (1/ipr);
// window {from, to} (both required, to ≥ from) → "window_map" (Σ over
// eigenstates with from ≤ E_n ≤ to of |ψ_n(r)|², one value per site) and
// "window_states" (their number); ldos {site (required), bins (200), method
// "exact"|"kpm" (default kpm), moments (512)} → "ldos" {energy, density,
// method}, integrating to 1; ipr, window and ldos method exact need all
// eigenstates and are refused (too-large) above MaxExactSites = 4096 sites.
// sectors: true (ring, periodic chain, periodic square, gasket, carpet; not
// with remove, and refused when disorder breaks the symmetry) → "sectors"
// [{momentum [k…], orders [N…], parity?, copies, size, eigenvalues,
// ratio?}]: for the periodic lattices one entry per translation sector
// (phase 2πk/N per step along each translation, copies 1); for the gasket
// (C3v about its centre) and the carpet (C4v) the rotation sectors with the
// vertical mirror (spectra.DihedralSectors): a pair q, −q is merged into one
// entry with copies 2, and q = −q is split into parity +1 and −1, so level
// statistics within one entry see no symmetry degeneracy. ratio as above,
// present for sectors of at least 3 levels. spectral_dimension:
// true → {value, error, from, to, points}: d_s = 2·slope of the integrated
// DOS N(E) ∝ (E − E_min)^{d_s/2} over the lowest 10% of the levels of H
// (spectra.SpectralDimensionLevels; eigenvalues limited as above). bands
// {cell "square"|"triangular"|"honeycomb"|"kagome"|"lieb" (default the
// lattice kind, when it is one of these), path (2 to 64 named points: "G" or
// "Γ", and "K", "M", "X" where the cell has them), points per segment
// (50, at most 10000)} → "bands" {k (cumulative path length), wavevectors,
// energies (ascending per k), corners (index of each named point)}: the
// Bloch bands of H = γA of the infinite lattice (the job's lattice is built
// but not used). Errors name the nested field, e.g. "spectrum.window.to",
// "spectrum.ldos.site", "spectrum.bands.path[1]".
//
// # Lab workflow extensions
//
// Lattice kind positions (lattice.FromPositions): {"kind": "positions",
// "positions": [[x, y], …] (one point per site, 1 to 64 coordinates, in any
// length unit, µm say; site i is the i-th point), "law": {"type":
// "exponential", "c0", "kappa", "d0"} (C(d) = c0·exp(−kappa·(d − d0)),
// kappa ≥ 0, all three required) or {"type": "table", "distance": [...],
// "coupling": [...], "clamp": false} (log-linear interpolation of the
// calibration pairs; distances strictly increasing, couplings > 0; outside
// the calibrated range refused unless clamp), "cutoff": r (required, > 0:
// every pair at distance ≤ r is bonded with C(d); place it between
// neighbour shells), "detuning": [ε_i, …] (optional on-site energies)}.
// Couplings and detunings carry the law's unit; MSD and spread are in the
// positions' unit squared. Errors name "lattice.positions[k]",
// "lattice.law.kappa", "lattice.law.distance[k]", "lattice.law" (a
// distance outside a table's range), "lattice.cutoff", "lattice.detuning".
//
// units (walk and measurement jobs, quantum dynamics): {"coupling": "1/cm" |
// "1/mm" | "eV" | "meV", "reference": C_ref > 0}. The lattice's couplings
// and on-site energies are in that unit and times (measured lengths) in
// the conjugate one: cm, mm or fs. The walk is the same as i dψ/dz = Hψ
// (per length) or iħ dψ/dτ = Hψ (energies, ħ = HbarEVfs eV·fs). The
// response echoes "times" as requested, adds "time_unit" ("cm", "mm",
// "fs") and "dimensionless_times" t = C_ref·z or E_ref·τ/ħ
// (lattice.Scale: time in units of 1/C_ref), and gives regimes,
// crossovers, fit_times, fit.from/to and window.to in the requested unit
// (prefactors for y ≈ A·x^α in that unit).
//
// fabrication (walk and plan jobs with a positions lattice; not with
// disorder): {"jitter": σ (position unit), "detuning": w (coupling unit),
// "law": "gauss" (default) | "box", "realisations": n, "seed": s}. Device k
// is rebuilt from positions jittered by lattice.Fabrication.Fabricate with
// the stream lattice.Realisation(seed, k) = rand.NewPCG(seed, k), so device
// k depends on (seed, k) alone; remove is applied to each device. Outputs
// are combined exactly as for disorder: "realisations", means and "X_err"
// standard errors. Sites keep their designed positions (what a
// measurement knows; walk/plan does the same), so MSD and spread are about
// the design. Default n: 16 (1 when jitter and detuning are 0; in a plan
// job the planner's default).
//
// Plan jobs (walk/plan.Make; the program must import walk/plan, which
// registers itself with RegisterPlanner; the bridge binary does): {"lattice":
// positions lattice, "start": {"site"} or {"near"}, "plan": {"max_length":
// z_max (required), "min_length" (0: max/50), "samples": n (required,
// 3…10000, at least 3 per predicted regime), "precision" (target standard
// error of each exponent, 0: 0.05), "noise" (relative MSD error of one
// sample), "points" (simulated lengths, 0: 48, else 8…1000)},
// "fabrication", "tolerance", "method"}. Lengths are in the reciprocal unit
// of the couplings (the walk runs with hopping 1, time = length). The
// response has "sites", "bonds", "diagnostics" (first device) and "plan":
// {"grid", "msd", "msd_err", "msd_spread", "regimes": [{from, to, exponent,
// kind, scatter, samples, predicted_error, meets}], "samples": [{length,
// regime, kind, msd, msd_spread}], "needed", "precision", "realisations",
// "rationale"} (walk/plan.Plan as WriteJSON writes it). Errors name
// "plan.samples" and so on.
//
// Measurement jobs (observables/measure): {"lattice": the measured array,
// "measurement": {"csv": text, "start": i (required, the input site),
// "quantity": "msd" (default) | "spread"}, "compare": false, "units",
// "fit": {"from", "to", "segments", "quantity"} (fit.quantity may name the
// curve instead; given both, they must agree), "hopping", "remove",
// "tolerance", "method"}. The CSV (measure.ReadCSV) has a header naming length, site,
// intensity and optionally uncertainty, '#' comment lines, one row per
// (length, site) with every site at every length, sites in the built
// lattice's numbering. Any CSV error is "invalid" with field
// "measurement.csv" and a message "measurement.csv line N: …" (N the
// 1-based line of the text, comments included). The response has "points"
// [{length, msd, msd_err, spread, spread_err, ipr, ipr_err}] (intensities
// normalised per length; errors propagated to first order from the
// uncertainties, 0 without them), the regime analysis of the quantity
// ("regimes", "crossovers", "local_exponent", "fit_times", lengths as the
// time; weighted by the propagated errors when all are positive; omitted
// with fewer than 4 lengths > 0) and, with compare, "comparison" [{length,
// overlap, distance}]: Σ_j √(p_j q_j) and ½Σ_j |p_j − q_j| against the
// quantum walk of the same lattice from the input site at the measured
// lengths (converted with units), with "diagnostics". With units the
// response also has "time_unit" and "dimensionless_times" (one per point).
// A Go program filling a Job directly sets Measurement (and Compare); the
// lab specs are LawSpec, UnitsSpec, FabricationSpec, PlanSpec and
// MeasurementSpec.
//
// Predicted couplings, lengths and times are model results: calibrate them
// against measurements on the real device, and the laboratory's own laser
// and fabrication safety rules apply.
//
// # Errors and limits
//
// Codes: invalid, unknown-field, too-large (the message gives the estimate
// in bytes), malformed, numerical (a propagation or fit failed its own
// check, a value came out non-finite, or an internal failure was
// recovered), cancelled. too-large applies to "exact" above MaxExactSites,
// the memory estimate (graph + propagator + outputs, for every realisation
// running at once) above fault.MemoryLimit (AMPWALK_MEMORY_LIMIT bytes, or
// 80% of the machine's memory), and the output limits above. No response
// ever holds NaN or a partial result.
const JobFormatExtensions = "ampwalk job format: ../shared/spec/job-format.md plus the extensions documented in walk/job_doc.go and examples/notebook/README.md"
