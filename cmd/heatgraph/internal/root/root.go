// Package root assembles the heatgraph command and maps its errors to exit
// codes.
package root

import (
	"errors"
	"fmt"
	"strings"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/benchcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/checkcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/comparecmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/graphcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/historycmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/kindscmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/materialscmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/mergecmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/montecarlocmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/reportcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/seekcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/sensitivitycmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/solvecmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/sweepcmd"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/watchcmd"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
)

// Version is the program version.
const Version = "0.2.0"

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
		reportcmd.NewCmd(ios, nil),
		watchcmd.NewCmd(ios, nil),
		materialscmd.NewCmd(ios),
		kindscmd.NewCmd(ios),
		historycmd.NewCmd(ios, nil),
		sensitivitycmd.NewCmd(ios, nil),
		seekcmd.NewCmd(ios, nil),
		sweepcmd.NewCmd(ios, nil),
		mergecmd.NewCmd(ios, nil),
		montecarlocmd.NewCmd(ios, nil),
		comparecmd.NewCmd(ios, nil),
		benchcmd.NewCmd(ios, nil),
	)
	for _, sub := range cmd.Commands() {
		classify(sub)
	}
	return cmd
}

// classify wraps a command's RunE so that every error it returns carries an
// exit code. Errors from the command line itself (unknown commands and
// flags, wrong argument counts) come from cobra before RunE runs and get
// the usage hint in Main; an error from RunE is never a usage mistake, so
// one without a code (a bug: every foreseen failure has one) becomes an
// internal error.
func classify(c *cobra.Command) {
	run := c.RunE
	if run == nil {
		return
	}
	c.RunE = func(c *cobra.Command, args []string) error {
		err := run(c, args)
		var ps network.Problems
		var ee *exit.Error
		if err == nil || errors.As(err, &ps) || errors.As(err, &ee) {
			return err
		}
		return &exit.Error{Code: exit.Internal, Err: fmt.Errorf("internal error: %w\n%s", err, reportRequest)}
	}
}

// reportRequest asks the user to report a bug.
const reportRequest = "this is a bug in heatgraph: please report it together with the model file and the command line"

// Main runs heatgraph with args and returns the exit code. It never lets a
// panic through: a bug is reported in one line, with a request to report
// it, and exit code Internal. Only command-line mistakes get the hint to
// run --help.
func Main(args []string, ios *iostreams.IOStreams) int {
	return guard(ios, func() int { return execute(args, ios) })
}

// guard runs f and turns a panic into a one-line internal error.
func guard(ios *iostreams.IOStreams, f func() int) (code int) {
	defer func() {
		if r := recover(); r != nil {
			msg := strings.Join(strings.Fields(fmt.Sprint(r)), " ")
			fmt.Fprintf(ios.ErrOut, "heatgraph: internal error: %s\n%s\n", msg, reportRequest)
			code = exit.Internal
		}
	}()
	return f()
}

func execute(args []string, ios *iostreams.IOStreams) int {
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
