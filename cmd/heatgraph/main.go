// Command heatgraph models electronics enclosures as thermal networks,
// solves them and draws their heat paths. Run "heatgraph --help".
package main

import (
	"os"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/root"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/tempfiles"
)

func main() {
	// An interrupted run removes its temporary output files and exits
	// with 130 (SIGINT) or 143 (SIGTERM).
	stop := tempfiles.HandleSignals(os.Exit)
	code := root.Main(os.Args[1:], iostreams.System())
	stop()
	os.Exit(code)
}
