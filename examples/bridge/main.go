// Command bridge is the JSON-lines bridge of ampwalk: it reads one job per
// line on standard input and writes one JSON answer per line on standard
// output, in order, each carrying the request's id. Progress and log
// messages go to standard error. The wire contract is
// ../shared/spec/job-format.md; the project's extensions are documented in
// examples/notebook/README.md and in the walk package (go doc ./walk).
//
//	go build -o ampwalk-bridge ./examples/bridge
//	echo '{"id":"a","lattice":{"kind":"gasket","generation":6},"start":{"near":[0,0]},"times":[0.5,1,2]}' | ./ampwalk-bridge
//
// Exit status: 0 at the end of input, even when some requests failed (they
// get error lines); 1 when standard input cannot be read or standard output
// cannot be written; 130 when interrupted (SIGINT or SIGTERM), after
// answering the job in flight with a "cancelled" error line.
package main

import (
	"context"
	"errors"
	"fmt"
	"os"
	"os/signal"
	"syscall"

	"github.com/ampwalk/ampwalk/walk"
	// Plan jobs (lab extension): walk/plan registers its planner with walk.
	_ "github.com/ampwalk/ampwalk/walk/plan"
)

func main() {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt, syscall.SIGTERM)
	defer stop()
	err := walk.Serve(ctx, os.Stdin, os.Stdout, os.Stderr)
	switch {
	case err == nil:
		return
	case errors.Is(err, context.Canceled):
		fmt.Fprintln(os.Stderr, "ampwalk-bridge: interrupted")
		os.Exit(130)
	default:
		fmt.Fprintln(os.Stderr, "ampwalk-bridge:", err)
		os.Exit(1)
	}
}
