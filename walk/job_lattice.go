package walk

import (
	"encoding/json"
	"math"
	"sort"
	"strings"

	"github.com/ampwalk/ampwalk/internal/fault"
	"github.com/ampwalk/ampwalk/lattice"
)

// kindDef describes one lattice kind of the job format: the parameters it
// takes (any other key is an unknown field) and its builder. Parameter
// ranges are checked by the lattice builders, whose errors name the field.
type kindDef struct {
	params   []param
	build    func(s *LatticeSpec) (*lattice.Graph, error)
	contract bool // fixed by the contract (the others are extensions)
}

type param struct {
	name     string
	typ      byte // 'i' integer, 'b' boolean, 'f' number, 'v' carpet variant
	required bool
	def      float64
}

func req(name string, typ byte) param            { return param{name: name, typ: typ, required: true} }
func opt(name string, typ byte, d float64) param { return param{name: name, typ: typ, def: d} }

// goldenBeta is the default Harper modulation wavenumber, (√5 − 1)/2.
var goldenBeta = (math.Sqrt(5) - 1) / 2

var kinds = map[string]kindDef{
	"chain": {contract: true, params: []param{req("sites", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Chain(s.Sites, s.Periodic) }},
	"square": {contract: true, params: []param{req("width", 'i'), req("height", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Square(s.Width, s.Height, s.Periodic) }},
	"triangle": {contract: true, params: []param{req("side", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Triangle(s.Side) }},
	"gasket": {contract: true, params: []param{req("generation", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Gasket(s.Generation) }},
	"carpet": {contract: true, params: []param{req("generation", 'i'), opt("variant", 'v', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) {
			v := lattice.CarpetCells
			if s.Variant == "corners" {
				v = lattice.CarpetCorners
			}
			return lattice.Carpet(s.Generation, v)
		}},
	"hypercube": {contract: true, params: []param{req("dimension", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Hypercube(s.Dimension) }},
	"graph": {contract: true, build: buildGraph}, // parameters decoded by decodeGraph
	// Lab extension (job_lab.go): parameters decoded by decodePositionsLattice.
	"positions": {build: buildPositions},

	"ring": {params: []param{req("sites", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) {
			if s.Sites < 3 {
				return nil, fault.Range("sites", "at least 3 for a ring", s.Sites)
			}
			return lattice.Chain(s.Sites, true)
		}},
	"triangular": {params: []param{req("width", 'i'), req("height", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) {
			return lattice.TriangularPatch(s.Width, s.Height, s.Periodic)
		}},
	"honeycomb": {params: []param{req("width", 'i'), req("height", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Honeycomb(s.Width, s.Height, s.Periodic) }},
	"kagome": {params: []param{req("width", 'i'), req("height", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Kagome(s.Width, s.Height, s.Periodic) }},
	"lieb": {params: []param{req("width", 'i'), req("height", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Lieb(s.Width, s.Height, s.Periodic) }},
	"cubic": {params: []param{req("width", 'i'), req("height", 'i'), req("depth", 'i'), opt("periodic", 'b', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) {
			return lattice.Cubic(s.Width, s.Height, s.Depth, s.Periodic)
		}},
	"complete": {params: []param{req("sites", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Complete(s.Sites) }},
	"star": {params: []param{req("leaves", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Star(s.Leaves) }},
	"cayley": {params: []param{req("coordination", 'i'), req("shells", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.CayleyTree(s.Coordination, s.Shells) }},
	"vicsek": {params: []param{req("generation", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Vicsek(s.Generation) }},
	"tfractal": {params: []param{req("generation", 'i')},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.TFractal(s.Generation) }},
	"fibonacci": {params: []param{req("sites", 'i'), opt("weak", 'f', 0.5), opt("strong", 'f', 1)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) { return lattice.Fibonacci(s.Sites, s.Weak, s.Strong) }},
	"harper": {params: []param{req("sites", 'i'), opt("lambda", 'f', 2), opt("beta", 'f', goldenBeta), opt("phase", 'f', 0)},
		build: func(s *LatticeSpec) (*lattice.Graph, error) {
			return lattice.Harper(s.Sites, s.Lambda, s.Beta, s.Phase)
		}},
}

// Kinds returns the lattice kinds the job format accepts, sorted.
func Kinds() []string {
	out := make([]string, 0, len(kinds))
	for k := range kinds {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// field returns a pointer to the LatticeSpec field of an int/bool/float
// parameter.
func (s *LatticeSpec) intField(name string) *int {
	switch name {
	case "sites":
		return &s.Sites
	case "width":
		return &s.Width
	case "height":
		return &s.Height
	case "depth":
		return &s.Depth
	case "side":
		return &s.Side
	case "generation":
		return &s.Generation
	case "dimension":
		return &s.Dimension
	case "leaves":
		return &s.Leaves
	case "coordination":
		return &s.Coordination
	case "shells":
		return &s.Shells
	}
	panic("walk: no lattice integer parameter " + name)
}

func (s *LatticeSpec) floatField(name string) *float64 {
	switch name {
	case "weak":
		return &s.Weak
	case "strong":
		return &s.Strong
	case "lambda":
		return &s.Lambda
	case "beta":
		return &s.Beta
	case "phase":
		return &s.Phase
	}
	panic("walk: no lattice number parameter " + name)
}

func decodeLattice(raw json.RawMessage) (*LatticeSpec, error) {
	o, err := parseObject("lattice", raw)
	if err != nil {
		return nil, err
	}
	s := &LatticeSpec{}
	kraw, ok := o.take("kind")
	if !ok {
		return nil, fault.New("lattice.kind", "is required: one of %s", strings.Join(Kinds(), ", "))
	}
	if s.Kind, err = str("lattice.kind", kraw); err != nil {
		return nil, err
	}
	def, ok := kinds[s.Kind]
	if !ok {
		return nil, fault.New("lattice.kind", "must be one of %s; got %q", strings.Join(Kinds(), ", "), s.Kind)
	}
	if s.Kind == "graph" {
		return s, decodeGraph(o, s)
	}
	if s.Kind == "positions" {
		return s, decodePositionsLattice(o, s)
	}
	names := []string{"kind"}
	for _, p := range def.params {
		names = append(names, p.name)
	}
	if err := o.only(names...); err != nil {
		return nil, err
	}
	for _, p := range def.params {
		if p.required && !o.has(p.name) {
			return nil, o.required(p.name, "the "+s.Kind+" lattice takes "+strings.Join(names[1:], ", "))
		}
		switch p.typ {
		case 'i':
			err = o.latticeInt(p.name, s.intField(p.name))
		case 'b':
			err = o.bool(p.name, &s.Periodic)
		case 'f':
			f := s.floatField(p.name)
			*f = p.def
			err = o.num(p.name, f)
		case 'v':
			s.Variant = "cells"
			err = o.choice(p.name, &s.Variant, "cells", "corners")
		}
		if err != nil {
			return nil, err
		}
	}
	return s, nil
}

// decodeGraph reads the graph kind: sites, bonds, positions, onsite.
func decodeGraph(o *object, s *LatticeSpec) error {
	if err := o.only("kind", "sites", "bonds", "positions", "onsite"); err != nil {
		return err
	}
	if !o.has("sites") {
		return o.required("sites", "the number of sites")
	}
	if err := o.graphSites(&s.Sites); err != nil {
		return err
	}
	n := s.Sites
	if raw, ok := o.take("bonds"); ok {
		items, err := list("lattice.bonds", raw)
		if err != nil {
			return err
		}
		if len(items) > maxListLen {
			return fault.New("lattice.bonds", "must have at most %d bonds; got %d", maxListLen, len(items))
		}
		s.Bonds = make([]lattice.Bond, len(items))
		for k, it := range items {
			f := index("lattice.bonds", k)
			v, err := numbers(f, it, 3)
			if err != nil {
				return err
			}
			if len(v) < 2 {
				return fault.New(f, "must be [i, j] or [i, j, w]; got %d values", len(v))
			}
			b := lattice.Bond{W: 1}
			for q := 0; q < 2; q++ {
				if v[q] != math.Trunc(v[q]) || v[q] < 0 || v[q] >= float64(n) {
					return fault.New(f, "site indices must be integers between 0 and %d; got %v", n-1, v[q])
				}
			}
			b.I, b.J = int(v[0]), int(v[1])
			if b.I == b.J {
				return fault.New(f, "must join two different sites; got [%d, %d] (use onsite for diagonal terms)", b.I, b.J)
			}
			if len(v) == 3 {
				b.W = v[2]
			}
			s.Bonds[k] = b
		}
	}
	if raw, ok := o.take("positions"); ok {
		items, err := list("lattice.positions", raw)
		if err != nil {
			return err
		}
		if len(items) != n {
			return fault.New("lattice.positions", "must hold one point per site (%d); got %d", n, len(items))
		}
		for k, it := range items {
			f := index("lattice.positions", k)
			p, err := numbers(f, it, 64)
			if err != nil {
				return err
			}
			if k == 0 {
				if len(p) < 1 {
					return fault.New(f, "must have 1 to 64 coordinates; got 0")
				}
				s.Dim = len(p)
				s.Positions = make([]float64, 0, n*s.Dim)
			} else if len(p) != s.Dim {
				return fault.New(f, "must have %d coordinates like positions[0]; got %d", s.Dim, len(p))
			}
			s.Positions = append(s.Positions, p...)
		}
	}
	if raw, ok := o.take("onsite"); ok {
		var err error
		if s.Onsite, err = numbers("lattice.onsite", raw, n); err != nil {
			return err
		}
		if len(s.Onsite) != n {
			return fault.New("lattice.onsite", "must hold one energy per site (%d); got %d", n, len(s.Onsite))
		}
	}
	if !o.has("bonds") {
		return o.required("bonds", "a list of [i, j] or [i, j, w] ([] for isolated sites)")
	}
	return nil
}

func buildGraph(s *LatticeSpec) (*lattice.Graph, error) {
	dim := s.Dim
	if s.Positions == nil {
		dim = 2
	}
	return lattice.New(s.Sites, dim, s.Positions, s.Bonds, s.Onsite)
}

// Build returns the graph described by s. Errors name the field with the
// prefix "lattice.".
func (s *LatticeSpec) Build() (g *lattice.Graph, err error) {
	def, ok := kinds[s.Kind]
	if !ok {
		return nil, fault.New("lattice.kind", "must be one of %s; got %q", strings.Join(Kinds(), ", "), s.Kind)
	}
	if err := s.checkFormulaSize(); err != nil {
		return nil, err
	}
	g, err = def.build(s)
	if err != nil {
		var fe *fault.Error
		if asFault(err, &fe) {
			return nil, fault.Prefix("lattice", fe)
		}
		return nil, &fault.Error{Kind: fault.Invalid, Field: "lattice.kind",
			Msg: "the " + s.Kind + " lattice cannot be built: " + err.Error()}
	}
	return g, nil
}
