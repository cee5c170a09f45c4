// Package pipeline joins the library's steps for the commands: read and
// check a model, solve it, and write output files safely.
package pipeline

import (
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/tempfiles"
	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/solve"
	"github.com/heatgraph/heatgraph/viz"
)

// Outcome is a solved (or failed) model.
type Outcome struct {
	Net      *network.Network
	Result   solve.Result
	Run      viz.Run
	Solution *network.Solution // nil unless the solve converged
}

// Load reads, checks and assembles a model with the overrides sets
// ("PATH=VALUE", see network.Override), turning invalid input into an
// exit.Error with code BadInput whose message lists every problem.
func Load(path string, sets ...string) (*network.Network, error) {
	ovs, err := network.ParseOverrides(sets)
	if err != nil {
		return nil, &exit.Error{Code: exit.BadInput, Err: err}
	}
	net, err := network.LoadWith(path, ovs)
	if err != nil {
		return nil, BadInput(err, "")
	}
	return net, nil
}

// BadInput turns an error from reading a model or a study into an
// exit.Error with code BadInput: a list of problems as it is, any other
// error after the name of the file it concerns (when file is not "").
func BadInput(err error, file string) error {
	var ps network.Problems
	if errors.As(err, &ps) {
		return &exit.Error{Code: exit.BadInput, Err: ps}
	}
	if file != "" {
		err = fmt.Errorf("%s: %w", file, err)
	}
	return &exit.Error{Code: exit.BadInput, Err: err}
}

// Solve loads a model with the overrides sets and solves it for the
// steady state.
func Solve(path string, settings solve.Settings, sets ...string) (*Outcome, error) {
	net, err := Load(path, sets...)
	if err != nil {
		return nil, err
	}
	return SolveNetwork(net, settings), nil
}

// SolveNetwork solves a loaded network for the steady state, for commands
// that check the command line against the model before solving.
func SolveNetwork(net *network.Network, settings solve.Settings) *Outcome {
	p := net.Steady()
	res := solve.Newton(p, p.InitialGuess(), settings)
	out := &Outcome{Net: net, Result: res, Run: RunOf(p, res)}
	if out.Run.Converged {
		out.Solution = net.Solution(res.X)
	}
	return out
}

// SetHelp is the help of the --set option every command that reads a model
// has.
const SetHelp = "change a value of the model, PATH=VALUE (repeatable): ambient.temperature=45degC, nodes.cpu.power=7W, components.soc.r_jc=0.5K/W, links.fins.flow=20CFM"

// RunOf describes a solve of p for the reports: the worst equation and
// the convergence of each kind of unknown the model has.
func RunOf(p *network.Steady, res solve.Result) viz.Run {
	r := viz.Run{
		Converged:        res.Reason.Converged(),
		Reason:           res.Reason.String(),
		Iterations:       res.Iterations,
		LinearIterations: res.LinearIterations,
		Residual:         res.Residual,
		Scaled:           res.Scaled,
	}
	if res.Worst >= 0 && res.Worst < p.Size() {
		r.Worst = p.EquationName(res.Worst)
		r.WorstUnit = p.Kinds()[p.KindOf(res.Worst)].EquationUnit
		r.Residual = math.Abs(res.WorstValue)
	}
	for _, k := range res.Kinds {
		if k.Unknowns == 0 {
			continue
		}
		r.Kinds = append(r.Kinds, viz.KindRun{Name: k.Kind.Name, Unit: k.Kind.Unit, Equation: k.Kind.Equation,
			EquationUnit: k.Kind.EquationUnit, Unknowns: k.Unknowns, Step: k.Step, Residual: k.Residual,
			Scaled: k.Scaled, Converged: k.Converged})
	}
	return r
}

// NotConverged returns the error for a solve that found no solution.
func (o *Outcome) NotConverged() error {
	msg := fmt.Sprintf("%s: no solution: the solver stopped after %d iterations (%s", o.Net.Model.File, o.Result.Iterations, o.Result.Reason)
	if o.Run.Worst != "" {
		msg += fmt.Sprintf("; worst imbalance %.3g %s, %.2g of the flows there, in the %s", o.Run.Residual, o.Run.WorstUnit, o.Run.Scaled, o.Run.Worst)
	}
	msg += ")"
	if o.Result.Err != nil {
		msg += ": " + o.Result.Err.Error()
	}
	switch o.Result.Reason {
	case solve.LeftDomain:
	case solve.SingularJacobian:
		msg += "\nhint: give every node named above a path for its heat to a fixed temperature or ambient"
	default:
		msg += "\nhint: check for links far stronger or weaker than the rest, and for temperatures or powers with wrong units"
	}
	return &exit.Error{Code: exit.NotConverged, Err: errors.New(msg)}
}

// Code returns the exit code for a converged outcome: LimitExceeded when a
// node is above its limit, else OK.
func (o *Outcome) Code() int {
	if o.Solution != nil && len(o.Solution.Exceeded()) > 0 {
		return exit.LimitExceeded
	}
	return exit.OK
}

// WriteFile writes data to path safely:
//
//   - It refuses to write over any of inputs (compared with os.SameFile,
//     so other spellings of the path and hard or symbolic links are
//     caught): that is a command-line mistake, exit code BadInput.
//   - A symbolic link is written through: the file it points to gets the
//     data, and the link stays.
//   - A regular file (or a new one) is written to a temporary file in the
//     same folder, flushed to disk, and renamed into place when complete,
//     so that a failed or interrupted write never leaves a half-written
//     file over a good one; the folder is flushed after the rename. The
//     temporary file is tracked (package tempfiles) so that a signal
//     handler can remove it.
//   - An existing file keeps its permissions; a new one gets 0644 less the
//     umask.
//   - Anything else that exists (a device such as /dev/null, a named pipe)
//     is written directly, since it cannot be replaced by a rename.
//
// Failures other than the first are exit code OutputFailed.
func WriteFile(path string, data []byte, inputs ...string) error {
	return WriteStream(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	}, inputs...)
}

// WriteStream is WriteFile for output too large to hold in memory: write
// produces the data into the (temporary) file. An error from write
// discards the temporary file and leaves path as it was; it is exit code
// OutputFailed.
func WriteStream(path string, write func(io.Writer) error, inputs ...string) error {
	if err := notAnInput(path, inputs); err != nil {
		return err
	}
	fail := func(err error) error {
		return &exit.Error{Code: exit.OutputFailed, Err: fmt.Errorf("cannot write %s: %w", path, unwrapPath(err))}
	}
	// A device or pipe (also behind a link, such as /dev/stdout) is
	// written as it is, through its own path.
	if fi, err := os.Stat(path); err == nil && fi.IsDir() {
		return fail(errors.New("it is a folder"))
	} else if err == nil && !fi.Mode().IsRegular() {
		return writeDirect(path, write, fail)
	}
	target, err := resolveLinks(path)
	if err != nil {
		return fail(err)
	}
	perm := os.FileMode(0o644)
	explicit := false // perm is an existing file's and must be kept exactly
	switch fi, err := os.Stat(target); {
	case err == nil && !fi.Mode().IsRegular():
		return writeDirect(target, write, fail)
	case err == nil:
		perm, explicit = fi.Mode().Perm(), true
	case !errors.Is(err, fs.ErrNotExist):
		return fail(err)
	}
	dir := filepath.Dir(target)
	tmp, name, untrack, err := createTemp(dir, filepath.Base(target), perm)
	if err != nil {
		return fail(err)
	}
	defer untrack()
	if TestHookWriting != nil {
		TestHookWriting(name)
	}
	werr := write(tmp)
	if werr == nil && explicit {
		// The umask may have taken bits away from the existing mode.
		werr = tmp.Chmod(perm)
	}
	if werr == nil {
		werr = tmp.Sync()
	}
	if cerr := tmp.Close(); werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Rename(name, target)
	}
	if werr != nil {
		os.Remove(name)
		return fail(werr)
	}
	syncDir(dir)
	return nil
}

// TestHookWriting, when not nil, is called by WriteFile with the name of
// its temporary file once the file exists. Tests use it to interrupt a
// write; it is nil in the program.
var TestHookWriting func(tmp string)

// notAnInput refuses an output path that is one of the input files.
func notAnInput(path string, inputs []string) error {
	out, err := os.Stat(path)
	if err != nil {
		return nil // does not exist (yet): cannot be an input
	}
	for _, in := range inputs {
		if fi, err := os.Stat(in); err == nil && os.SameFile(out, fi) {
			return exit.With(exit.BadInput, "refusing to write over the input file %s: -o %s names the same file; choose another output file", in, path)
		}
	}
	return nil
}

// resolveLinks returns the file a path finally names: path itself unless it
// is a symbolic link, else the link's target, also when that does not
// exist yet.
func resolveLinks(path string) (string, error) {
	for range 40 {
		fi, err := os.Lstat(path)
		if err != nil || fi.Mode()&fs.ModeSymlink == 0 {
			return path, nil
		}
		if real, err := filepath.EvalSymlinks(path); err == nil {
			return real, nil
		}
		// A dangling link: follow it one step and try again.
		dest, err := os.Readlink(path)
		if err != nil {
			return "", err
		}
		if !filepath.IsAbs(dest) {
			dest = filepath.Join(filepath.Dir(path), dest)
		}
		path = dest
	}
	return "", errors.New("too many levels of symbolic links")
}

// createTemp creates a new file ".base.<random>.tmp" in dir with perm
// (less the umask), tracked for removal on a signal.
func createTemp(dir, base string, perm os.FileMode) (*os.File, string, func(), error) {
	var b [6]byte
	for range 100 {
		if _, err := rand.Read(b[:]); err != nil {
			return nil, "", nil, err
		}
		name := filepath.Join(dir, "."+base+"."+hex.EncodeToString(b[:])+".tmp")
		untrack := tempfiles.Track(name)
		f, err := os.OpenFile(name, os.O_WRONLY|os.O_CREATE|os.O_EXCL, perm)
		if err == nil {
			return f, name, untrack, nil
		}
		untrack()
		if !errors.Is(err, fs.ErrExist) {
			return nil, "", nil, err
		}
	}
	return nil, "", nil, errors.New("cannot find an unused temporary file name")
}

// writeDirect writes into an existing file that is not a regular file (a
// device, a named pipe): such files cannot be replaced.
func writeDirect(path string, write func(io.Writer) error, fail func(error) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return fail(err)
	}
	err = write(f)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return fail(err)
	}
	return nil
}

// syncDir flushes a folder so that a rename in it survives a crash. Some
// systems cannot sync folders; that is not worth failing the write for.
func syncDir(dir string) {
	if d, err := os.Open(dir); err == nil {
		d.Sync()
		d.Close()
	}
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
