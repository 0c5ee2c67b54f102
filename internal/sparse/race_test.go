//go:build race

package sparse

// raceEnabled: the race detector makes sync.Pool drop items, so the
// allocation test does not apply.
const raceEnabled = true
