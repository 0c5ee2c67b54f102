package walk

import (
	"encoding/json"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// The lab-workflow extensions of the job format: the "positions" lattice
// kind (sites at given points, couplings from a coupling law), "units"
// (physical couplings and times), "fabrication" (an ensemble of fabricated
// devices), plan jobs and measurement jobs. They are documented in
// job_doc.go and examples/notebook/README.md.

// LawSpec is the coupling law of a positions lattice: Type "exponential"
// (lattice.Exponential: C0·exp(−Kappa·(d − D0))) or "table"
// (lattice.NewTable through the pairs (Distance[k], Coupling[k]), log-linear,
// Clamp outside the calibrated range).
type LawSpec struct {
	Type               string
	C0, Kappa, D0      float64
	Distance, Coupling []float64
	Clamp              bool
}

// law returns the lattice coupling law; errors name "law.<field>".
func (l *LawSpec) law() (lattice.CouplingLaw, error) {
	if l == nil {
		return nil, fault.New("law", "is required: {\"type\": \"exponential\", \"c0\", \"kappa\", \"d0\"} or {\"type\": \"table\", \"distance\", \"coupling\"}")
	}
	switch l.Type {
	case "exponential":
		e := lattice.Exponential{C0: l.C0, Kappa: l.Kappa, D0: l.D0}
		if err := e.Validate(); err != nil {
			return nil, err
		}
		return e, nil
	case "table":
		return lattice.NewTable(l.Distance, l.Coupling, l.Clamp)
	}
	return nil, fault.New("law.type", "must be \"exponential\" or \"table\"; got %q", l.Type)
}

// UnitsSpec is the "units" extension: the lattice's couplings (bond weights
// and on-site energies) are in Coupling ("1/cm", "1/mm", "eV" or "meV") and
// Reference is the reference coupling C_ref in that unit. Times (and
// measured lengths) are then in the conjugate unit (cm, mm or fs); the
// response adds the dimensionless times of lattice.Scale, t = C_ref·z (per
// length) or t = E_ref·τ/ħ (energies), in units of 1/C_ref.
type UnitsSpec struct {
	Coupling  string
	Reference float64
}

// scale returns the lattice.Scale of u.
func (u *UnitsSpec) scale() (lattice.Scale, error) {
	unit := map[string]lattice.Unit{"1/cm": lattice.PerCentimetre, "1/mm": lattice.PerMillimetre,
		"eV": lattice.ElectronVolt, "meV": lattice.MilliElectronVolt}[u.Coupling]
	if unit == 0 {
		return lattice.Scale{}, fault.New("units.coupling", "must be one of \"1/cm\", \"1/mm\", \"eV\", \"meV\"; got %q", u.Coupling)
	}
	s, err := lattice.NewScale(u.Reference, unit)
	if err != nil {
		return lattice.Scale{}, within("units", err)
	}
	return s, nil
}

// FabricationSpec is the "fabrication" extension of a positions lattice:
// Realisations devices, device k built by lattice.Fabrication{Jitter,
// Detuning, Law}.Fabricate from the stream lattice.Realisation(Seed, k).
type FabricationSpec struct {
	Jitter, Detuning float64
	Law              string
	Realisations     int
	Seed             uint64
}

func (f *FabricationSpec) fabrication() lattice.Fabrication {
	law := lattice.Gauss
	if f.Law == "box" {
		law = lattice.Box
	}
	return lattice.Fabrication{Jitter: f.Jitter, Detuning: f.Detuning, Law: law}
}

// decodePositionsLattice reads the positions kind: positions, law, cutoff,
// detuning.
func decodePositionsLattice(o *object, s *LatticeSpec) error {
	if err := o.only("kind", "positions", "law", "cutoff", "detuning"); err != nil {
		return err
	}
	raw, ok := o.take("positions")
	if !ok {
		return o.required("positions", "one point [x, y, …] per site")
	}
	var err error
	if s.Positions, s.Dim, err = points("lattice.positions", raw); err != nil {
		return err
	}
	n := len(s.Positions) / s.Dim
	if n > lattice.MaxSites {
		return fault.New("lattice.positions", "must hold at most %d points; got %d", lattice.MaxSites, n)
	}
	lo, err := o.sub("law")
	if err != nil {
		return err
	}
	if lo == nil {
		return o.required("law", "{\"type\": \"exponential\", \"c0\", \"kappa\", \"d0\"} or {\"type\": \"table\", \"distance\", \"coupling\", \"clamp\"}")
	}
	if s.Law, err = decodeLaw(lo); err != nil {
		return err
	}
	if !o.has("cutoff") {
		return o.required("cutoff", "the largest bonded distance, in the unit of the positions")
	}
	if err := o.num("cutoff", &s.Cutoff); err != nil {
		return err
	}
	if s.Cutoff <= 0 {
		return fault.Range("lattice.cutoff", "a distance > 0 in the unit of the positions", s.Cutoff)
	}
	if raw, ok := o.take("detuning"); ok {
		if s.Detuning, err = numbers("lattice.detuning", raw, n); err != nil {
			return err
		}
		if len(s.Detuning) != n {
			return fault.New("lattice.detuning", "must hold one on-site energy per site (%d); got %d", n, len(s.Detuning))
		}
	}
	return nil
}

// decodeLaw reads lattice.law strictly; the parameters are checked by the
// lattice package (errors "lattice.law.kappa" and so on).
func decodeLaw(o *object) (*LawSpec, error) {
	l := &LawSpec{}
	traw, ok := o.take("type")
	if !ok {
		return nil, o.required("type", "\"exponential\" or \"table\"")
	}
	var err error
	if l.Type, err = choice("lattice.law.type", traw, "exponential", "table"); err != nil {
		return nil, err
	}
	if l.Type == "exponential" {
		if err := o.only("type", "c0", "kappa", "d0"); err != nil {
			return nil, err
		}
		for _, k := range []struct {
			name string
			dst  *float64
		}{{"c0", &l.C0}, {"kappa", &l.Kappa}, {"d0", &l.D0}} {
			if !o.has(k.name) {
				return nil, o.required(k.name, "the exponential law C(d) = c0·exp(−kappa·(d − d0)) takes c0, kappa and d0")
			}
			if err := o.num(k.name, k.dst); err != nil {
				return nil, err
			}
		}
	} else {
		if err := o.only("type", "distance", "coupling", "clamp"); err != nil {
			return nil, err
		}
		for _, k := range []struct {
			name string
			dst  *[]float64
		}{{"distance", &l.Distance}, {"coupling", &l.Coupling}} {
			raw, ok := o.take(k.name)
			if !ok {
				return nil, o.required(k.name, "the table law takes lists distance and coupling (calibration pairs) and clamp")
			}
			if *k.dst, err = numbers(join(o.path, k.name), raw, 1<<20); err != nil {
				return nil, err
			}
		}
		if err := o.bool("clamp", &l.Clamp); err != nil {
			return nil, err
		}
	}
	if _, err := l.law(); err != nil {
		return nil, fault.Prefix("lattice", err)
	}
	return l, nil
}

// points reads a list of points with the same number (1…64) of coordinates,
// flattened.
func points(path string, raw json.RawMessage) ([]float64, int, error) {
	items, err := list(path, raw)
	if err != nil {
		return nil, 0, err
	}
	if len(items) == 0 {
		return nil, 0, fault.New(path, "must hold at least one point; got an empty list")
	}
	var out []float64
	dim := 0
	for k, it := range items {
		f := index(path, k)
		p, err := numbers(f, it, 64)
		if err != nil {
			return nil, 0, err
		}
		if k == 0 {
			if len(p) == 0 {
				return nil, 0, fault.New(f, "must have 1 to 64 coordinates; got 0")
			}
			dim = len(p)
			out = make([]float64, 0, len(items)*dim)
		} else if len(p) != dim {
			return nil, 0, fault.New(f, "must have %d coordinates like %s; got %d", dim, index(path, 0), len(p))
		}
		out = append(out, p...)
	}
	return out, dim, nil
}

func buildPositions(s *LatticeSpec) (*lattice.Graph, error) {
	law, err := s.Law.law()
	if err != nil {
		return nil, err
	}
	return lattice.FromPositions(s.Positions, s.Dim, law, s.Cutoff, s.Detuning)
}

// decodeUnits reads the "units" object.
func decodeUnits(o *object) (*UnitsSpec, error) {
	if err := o.only("coupling", "reference"); err != nil {
		return nil, err
	}
	u := &UnitsSpec{}
	if !o.has("coupling") {
		return nil, o.required("coupling", "the unit of the couplings: \"1/cm\", \"1/mm\", \"eV\" or \"meV\"")
	}
	if err := o.choice("coupling", &u.Coupling, "1/cm", "1/mm", "eV", "meV"); err != nil {
		return nil, err
	}
	if !o.has("reference") {
		return nil, o.required("reference", "the reference coupling C_ref, in the coupling unit, that becomes hopping 1")
	}
	if err := o.num("reference", &u.Reference); err != nil {
		return nil, err
	}
	if _, err := u.scale(); err != nil {
		return nil, err
	}
	return u, nil
}

// decodeFabrication reads the "fabrication" object; realisations defaults
// to 16 (1 when both widths are zero) unless def says otherwise (0: leave
// the default to the plan).
func decodeFabrication(o *object, def int) (*FabricationSpec, error) {
	if err := o.only("jitter", "detuning", "law", "realisations", "seed"); err != nil {
		return nil, err
	}
	f := &FabricationSpec{Law: "gauss"}
	if err := o.num("jitter", &f.Jitter); err != nil {
		return nil, err
	}
	if err := o.num("detuning", &f.Detuning); err != nil {
		return nil, err
	}
	if err := o.choice("law", &f.Law, "gauss", "box"); err != nil {
		return nil, err
	}
	if err := f.fabrication().Validate(); err != nil {
		return nil, err
	}
	f.Realisations = def
	if def > 0 && f.Jitter == 0 && f.Detuning == 0 {
		f.Realisations = 1
	}
	if err := o.int("realisations", &f.Realisations, 1, MaxRealisations); err != nil {
		return nil, err
	}
	if raw, ok := o.take("seed"); ok {
		var err error
		if f.Seed, err = uinteger("fabrication.seed", raw); err != nil {
			return nil, err
		}
	}
	return f, nil
}

// decodeLab reads the walk job's lab fields: units and fabrication.
func (job *Job) decodeLab(o *object) error {
	if uo, err := o.sub("units"); err != nil {
		return err
	} else if uo != nil {
		if job.Units, err = decodeUnits(uo); err != nil {
			return err
		}
	}
	if fo, err := o.sub("fabrication"); err != nil {
		return err
	} else if fo != nil {
		if job.Fabrication, err = decodeFabrication(fo, 16); err != nil {
			return err
		}
	}
	return job.checkLab()
}

// checkLab checks the combinations of the lab fields with the rest of a
// walk job.
func (job *Job) checkLab() error {
	if job.Fabrication != nil {
		if job.Lattice == nil || job.Lattice.Kind != "positions" {
			return fault.New("fabrication", "needs a lattice of kind \"positions\" (it rebuilds the couplings from jittered positions)")
		}
		if job.Disorder != nil {
			return fault.New("fabrication", "cannot be combined with disorder: give the fabrication's jitter and detuning instead")
		}
	}
	if job.Units != nil && job.Dynamics == Classical {
		return fault.New("units", "needs quantum dynamics (physical units convert couplings and times of the quantum walk)")
	}
	return nil
}

// finiteLab is finite for the lab outputs.
func (r *Response) finiteLab() string {
	if !allFinite(r.DimensionlessTimes) {
		return "dimensionless_times"
	}
	for _, p := range r.Points {
		if !allFinite([]float64{p.Length, p.MSD, p.MSDErr, p.Spread, p.SpreadErr, p.IPR, p.IPRErr}) {
			return "points"
		}
	}
	for _, c := range r.Comparison {
		if !allFinite([]float64{c.Length, c.Overlap, c.Distance}) {
			return "comparison"
		}
	}
	return ""
}

// fabricate returns fabricated device k of the job's positions lattice at
// the designed positions, with remove applied.
func (j *Job) fabricate(k int) (*lattice.Graph, error) {
	s := j.Lattice
	law, err := s.Law.law()
	if err != nil {
		return nil, fault.Prefix("lattice", err)
	}
	g, _, err := j.Fabrication.fabrication().Fabricate(s.Positions, s.Dim, law, s.Cutoff, s.Detuning, lattice.Realisation(j.Fabrication.Seed, k))
	if err != nil {
		fe, ok := err.(*fault.Error)
		if !ok {
			return nil, err
		}
		if strings.HasPrefix(fe.Field, "fabrication") {
			return nil, fe
		}
		return nil, fault.New("fabrication", "realisation %d cannot be built: %s %s", k, fe.Field, fe.Msg)
	}
	// The device's couplings come from its jittered positions, but its
	// sites are reported at the designed ones: a measurement knows only
	// those (measurement jobs and walk/plan reduce with them too).
	bonds := make([]lattice.Bond, g.NumBonds())
	for b := range bonds {
		bonds[b] = g.Bond(b)
	}
	var onsite []float64
	if s.Detuning != nil || j.Fabrication.Detuning > 0 {
		onsite = make([]float64, g.Len())
		for i := range onsite {
			onsite[i] = g.Onsite(i)
		}
	}
	if g, err = lattice.New(g.Len(), s.Dim, s.Positions, bonds, onsite); err != nil {
		return nil, fault.New("fabrication", "realisation %d cannot be built: %v", k, err)
	}
	if j.Remove != nil {
		if g, _, err = g.Remove(j.Remove); err != nil {
			return nil, within("remove", err)
		}
	}
	return g, nil
}
