package lattice

// This file fixes the builder and modifier signatures that the rest of the
// project calls. Each stub is replaced by its real implementation in a file
// named after its family (chain.go, square.go, gasket.go …); delete the stub
// when its implementation lands.

import (
	"errors"
	"math/rand/v2"
)

var errTODO = errors.New("lattice: not implemented yet")

// Law is the distribution of a random perturbation.
type Law int

const (
	// Box is uniform in [−w/2, w/2].
	Box Law = iota
	// Gauss is normal with standard deviation w.
	Gauss
)

// Disorder describes on-site and bond disorder: on-site energies get an
// added draw of width Onsite; each bond weight is multiplied by (1 + δ) with
// δ of width Bond, both from Law.
type Disorder struct {
	Onsite, Bond float64
	Law          Law
}

func (g *Graph) ScaleHopping(s float64) (*Graph, error) { return nil, errTODO }
func (g *Graph) Remove(sites []int) (h *Graph, kept []int, err error) {
	return nil, nil, errTODO
}
func (g *Graph) RemoveIf(drop func(i int, pos []float64) bool) (h *Graph, kept []int, err error) {
	return nil, nil, errTODO
}
func (g *Graph) WithDisorder(d Disorder, rng *rand.Rand) (*Graph, error) { return nil, errTODO }
func (g *Graph) WithFlux(flux float64) (*Graph, error)                   { return nil, errTODO }
