package fault

import (
	"os"
	"strconv"
	"strings"
)

// DefaultMemoryLimit is used when the machine's memory cannot be read.
const DefaultMemoryLimit = 8 << 30

// MemoryLimit returns the bytes a single job may use: the environment
// variable AMPWALK_MEMORY_LIMIT (bytes) when set, otherwise 80% of MemTotal
// from /proc/meminfo, otherwise DefaultMemoryLimit.
func MemoryLimit() int64 {
	if s := os.Getenv("AMPWALK_MEMORY_LIMIT"); s != "" {
		if v, err := strconv.ParseInt(s, 10, 64); err == nil && v > 0 {
			return v
		}
	}
	b, err := os.ReadFile("/proc/meminfo")
	if err != nil {
		return DefaultMemoryLimit
	}
	for _, line := range strings.Split(string(b), "\n") {
		if !strings.HasPrefix(line, "MemTotal:") {
			continue
		}
		f := strings.Fields(line)
		if len(f) >= 2 {
			if kb, err := strconv.ParseInt(f[1], 10, 64); err == nil {
				return kb * 1024 * 8 / 10
			}
		}
	}
	return DefaultMemoryLimit
}
