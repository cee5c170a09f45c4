// Package root assembles the heatgraph command and maps its errors to exit
// codes.
package root

import (
	"errors"
	"fmt"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/checkcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/graphcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/historycmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/kindscmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/materialscmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/solvecmd"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
)

// Version is the program version.
const Version = "0.1.0"

// NewCmd returns the root command with every subcommand.
func NewCmd(ios *iostreams.IOStreams) *cobra.Command {
	cmd := &cobra.Command{
		Use:   "heatgraph",
		Short: "Thermal networks of electronics enclosures",
		Long: `heatgraph models an electronics box as a lumped thermal network, solves it,
checks every component against its temperature limit, and draws the heat
paths for design reviews.

Results are estimates: confirm them by measurement, and defer to local
codes, product-safety standards and licensed engineering practice.`,
		Version:       Version,
		SilenceUsage:  true,
		SilenceErrors: true,
	}
	cmd.SetIn(ios.In)
	cmd.SetOut(ios.Out)
	cmd.SetErr(ios.ErrOut)
	cmd.SetFlagErrorFunc(func(c *cobra.Command, err error) error {
		return &exit.Error{Code: exit.BadInput, Err: fmt.Errorf("%w\nrun '%s --help' for usage", err, c.CommandPath())}
	})
	cmd.AddCommand(
		solvecmd.NewCmd(ios, nil),
		checkcmd.NewCmd(ios, nil),
		graphcmd.NewCmd(ios, nil),
		materialscmd.NewCmd(ios),
		kindscmd.NewCmd(ios),
		historycmd.NewCmd(ios, nil),
	)
	return cmd
}

// Main runs heatgraph with args and returns the exit code. It never lets a
// panic through: a bug is reported in one line with exit code Internal.
func Main(args []string, ios *iostreams.IOStreams) (code int) {
	defer func() {
		if r := recover(); r != nil {
			fmt.Fprintf(ios.ErrOut, "heatgraph: internal error: %v\nplease report this together with the model file\n", r)
			code = exit.Internal
		}
	}()
	cmd := NewCmd(ios)
	cmd.SetArgs(args)
	err := cmd.Execute()
	if err == nil {
		return exit.OK
	}
	var ps network.Problems
	var ee *exit.Error
	switch {
	case errors.As(err, &ps):
		fmt.Fprintln(ios.ErrOut, ps.Error())
		fmt.Fprintf(ios.ErrOut, "%d problem%s found\n", len(ps), plural(len(ps)))
		return exit.BadInput
	case errors.As(err, &ee):
		if ee.Err != nil {
			fmt.Fprintf(ios.ErrOut, "heatgraph: %v\n", ee.Err)
		}
		return ee.Code
	default:
		// Cobra's own errors: unknown command, wrong number of arguments.
		fmt.Fprintf(ios.ErrOut, "heatgraph: %v\nrun 'heatgraph --help' for usage\n", err)
		return exit.BadInput
	}
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
