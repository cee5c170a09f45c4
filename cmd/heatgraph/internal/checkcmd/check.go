// Package checkcmd implements "heatgraph check".
package checkcmd

import (
	"fmt"
	"io"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/pipeline"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/spf13/cobra"
)

// Options are the inputs of the check command.
type Options struct {
	IO    *iostreams.IOStreams
	Model string
	Set   []string // overrides, PATH=VALUE
	// Jacobian compares the assembled Jacobian with finite differences at
	// the start and at the solution.
	Jacobian bool
	// Tolerance is the largest relative error the Jacobian check accepts.
	Tolerance float64
	// Worst is how many of the worst entries to print.
	Worst int
}

// NewCmd returns the check command.
func NewCmd(ios *iostreams.IOStreams, runF func(*Options) error) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "check MODEL",
		Short: "Check a model file without solving it",
		Long: `Check a model file: syntax, keys, units, names, geometry, and that every
node has a path to a fixed temperature. Every problem is listed as
file:line: field: message. Exit status 0 when the model is valid, 2 when not.

With --jacobian, also solve the model and compare the Jacobian that its
elements stamp with central finite differences of the assembled balances,
at the starting state (moved by a hundredth of a kelvin or so per node,
off the kinks of |ΔT| where every node is at ambient) and at the solution,
printing the worst entries with
the elements that stamp them. A mismatch above --tolerance (relative to the
largest entry of its column) is a defect in heatgraph: exit status 70.`,
		Example: "  heatgraph check my-box.yaml\n  heatgraph check --jacobian examples/heatsink-module.yaml",
		Args:    cobra.ExactArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			o.Model = args[0]
			if runF != nil {
				return runF(o)
			}
			return Run(o)
		},
	}
	cmd.Flags().BoolVar(&o.Jacobian, "jacobian", false, "compare the Jacobian with finite differences at the start and at the solution")
	cmd.Flags().Float64Var(&o.Tolerance, "tolerance", network.DefaultJacobianTolerance, "largest relative error accepted by --jacobian")
	cmd.Flags().IntVar(&o.Worst, "worst", 5, "how many of the worst Jacobian entries to print")
	cmd.Flags().StringArrayVar(&o.Set, "set", nil, pipeline.SetHelp)
	return cmd
}

// Run checks the model and prints a one-line summary when it is valid.
func Run(o *Options) error {
	net, err := pipeline.Load(o.Model, o.Set...)
	if err != nil {
		return err
	}
	fixed := 0
	for _, n := range net.Nodes {
		if n.Kind == network.Fixed {
			fixed++
		}
	}
	plates := ""
	if n := len(net.Model.Plates); n > 0 {
		plates = fmt.Sprintf(", %s meshed into %s", count(n, "plate"), count(net.Model.Cells(), "cell"))
	}
	if _, err = fmt.Fprintf(o.IO.Out, "%s: valid: %s (%d fixed), %s, %s, %s%s\n",
		o.Model, count(len(net.Nodes), "node"), fixed, count(net.Unknowns(), "unknown"),
		count(len(net.Model.Components), "component"), count(len(net.Links), "link"), plates); err != nil {
		return err
	}
	if !o.Jacobian {
		return nil
	}
	if !(o.Tolerance > 0) {
		return exit.With(exit.BadInput, "--tolerance must be a positive number, got %g", o.Tolerance)
	}
	p := net.Steady()
	states := []struct {
		name string
		x    []float64
	}{{"start", p.OffKinks(p.InitialGuess())}}
	res := solve.Newton(p, p.InitialGuess(), solve.Settings{})
	if res.Reason.Converged() {
		states = append(states, struct {
			name string
			x    []float64
		}{"solution", res.X})
	} else {
		fmt.Fprintf(o.IO.Out, "the solve stopped without a solution (%s); checking the start only\n", res.Reason)
	}
	failed := false
	for _, s := range states {
		c, err := net.CheckJacobian(s.x, o.Worst)
		if err != nil {
			return exit.With(exit.Internal, "Jacobian check at the %s: %v", s.name, err)
		}
		verdict := "ok"
		if c.MaxError > o.Tolerance {
			verdict, failed = "FAILED", true
		}
		fmt.Fprintf(o.IO.Out, "Jacobian at the %s: %d unknowns, largest relative error %.2e (tolerance %.0e): %s\n",
			s.name, c.Unknowns, c.MaxError, o.Tolerance, verdict)
		printWorst(o.IO.Out, c)
	}
	if failed {
		return exit.With(exit.Internal, "the Jacobian disagrees with finite differences; this is a defect in heatgraph, please report it with the model file")
	}
	return nil
}

func printWorst(w io.Writer, c *network.JacobianCheck) {
	for _, e := range c.Worst {
		fmt.Fprintf(w, "  ∂(%s)/∂(%s): stamped %.6g, finite difference %.6g, error %.1e",
			e.Equation, e.Variable, e.Analytic, e.Finite, e.Error)
		if len(e.Elements) > 0 {
			fmt.Fprintf(w, "; from %s", e.Elements[0])
			for _, el := range e.Elements[1:] {
				fmt.Fprintf(w, ", %s", el)
			}
		}
		fmt.Fprintln(w)
	}
}

// count writes n with a noun in the singular or plural: "1 component",
// "2 components".
func count(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}
