//go:build !race

package dense

const raceEnabled = false
