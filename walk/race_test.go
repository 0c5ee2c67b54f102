//go:build race

package walk

// raceEnabled: the race detector makes sync.Pool drop items, so the
// allocation tests do not apply.
const raceEnabled = true
