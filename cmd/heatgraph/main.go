// Command heatgraph models electronics enclosures as thermal networks,
// solves them and draws their heat paths. Run "heatgraph --help".
package main

import (
	"os"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/root"
)

func main() {
	os.Exit(root.Main(os.Args[1:], iostreams.System()))
}
