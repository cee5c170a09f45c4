// Package kindscmd implements "heatgraph kinds".
package kindscmd

import (
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
	"text/tabwriter"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/heatgraph/heatgraph/network"
	"github.com/spf13/cobra"
	"golang.org/x/term"
)

// Options are the inputs of the kinds command.
type Options struct {
	IO    *iostreams.IOStreams
	Kind  string // "" lists every kind
	Width int    // wrap width; 0 means the terminal's, else 80
}

// NewCmd returns the kinds command.
func NewCmd(ios *iostreams.IOStreams) *cobra.Command {
	o := &Options{IO: ios}
	cmd := &cobra.Command{
		Use:   "kinds [KIND]",
		Short: "List the link kinds a model may use, or describe one",
		Long: `Without an argument, list every link kind with its keys. With a kind's name,
describe it: what it models, its ends, every key with its unit, whether it is
required and its default, a short example, and the published sources of its
physics.`,
		Example: "  heatgraph kinds\n  heatgraph kinds channel",
		Args:    cobra.MaximumNArgs(1),
		RunE: func(_ *cobra.Command, args []string) error {
			if len(args) == 1 {
				o.Kind = args[0]
			}
			return Run(o)
		},
	}
	cmd.Flags().IntVar(&o.Width, "width", 0, "wrap the text at this many columns (default: the terminal's width, or 80)")
	return cmd
}

// Run prints the list of kinds or one kind's description.
func Run(o *Options) error {
	width := o.Width
	if width <= 0 {
		width = terminalWidth(o.IO.Out)
	}
	if o.Kind == "" {
		return list(o.IO.Out, width)
	}
	doc, ok := network.LinkKind(o.Kind)
	if !ok {
		return exit.With(exit.BadInput, "unknown link kind %q (valid: %s)", o.Kind, strings.Join(network.LinkKindNames(), ", "))
	}
	return describe(o.IO.Out, doc, width)
}

func terminalWidth(w io.Writer) int {
	if f, ok := w.(*os.File); ok && term.IsTerminal(int(f.Fd())) {
		if cols, _, err := term.GetSize(int(f.Fd())); err == nil && cols >= 40 {
			return cols
		}
	}
	if c, err := strconv.Atoi(os.Getenv("COLUMNS")); err == nil && c >= 40 {
		return c
	}
	return 80
}

func list(w io.Writer, width int) error {
	tw := tabwriter.NewWriter(w, 0, 4, 2, ' ', 0)
	fmt.Fprintln(tw, "kind\twhat it models")
	for _, k := range network.LinkKinds() {
		fmt.Fprintf(tw, "%s\t%s\n", k.Name, k.Summary)
	}
	if err := tw.Flush(); err != nil {
		return err
	}
	_, err := fmt.Fprintln(w, "\nrun 'heatgraph kinds KIND' for a kind's keys, units, defaults, an example and its sources")
	return err
}

func describe(w io.Writer, k network.KindDoc, width int) error {
	var b strings.Builder
	b.WriteString(wrap(k.Name+": "+k.Summary, width, "", "  ") + "\n\n")
	b.WriteString(wrap(k.Doc, width, "", "") + "\n\n")
	b.WriteString("ends\n")
	for _, e := range k.Ends {
		line := fmt.Sprintf("%s: %s (%s node)", e.Key, e.Role, strings.Join(e.Kinds, " or "))
		if e.Default != "" {
			line += "; default " + e.Default
		}
		b.WriteString(wrap(line, width, "  ", "    ") + "\n")
	}
	b.WriteString("\nkeys (besides id, kind, from, to and note)\n")
	for _, key := range k.Keys {
		line := fmt.Sprintf("%s: %s; %s", key.Name, key.Value, key.Need)
		if key.Default != "" {
			line += ", default " + key.Default
		}
		if key.Help != "" {
			line += " — " + key.Help
		}
		b.WriteString(wrap(line, width, "  ", "    ") + "\n")
	}
	b.WriteString("\nexample\n  - " + strings.ReplaceAll(k.Example, "\n", "\n  ") + "\n")
	b.WriteString("\nsources\n")
	for _, s := range k.Sources {
		b.WriteString(wrap(s, width, "  ", "    ") + "\n")
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// wrap breaks text into lines of at most width columns (counted in runes),
// the first starting with first and the others with rest.
func wrap(text string, width int, first, rest string) string {
	var out strings.Builder
	line := first
	empty := true
	for _, word := range strings.Fields(text) {
		n := len([]rune(line)) + len([]rune(word))
		if !empty {
			n++
		}
		if !empty && n > width {
			out.WriteString(line + "\n")
			line, empty = rest, true
		}
		if !empty {
			line += " "
		}
		line += word
		empty = false
	}
	out.WriteString(line)
	return out.String()
}
