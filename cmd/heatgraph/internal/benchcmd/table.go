package benchcmd

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"runtime"
	"strconv"
	"strings"
)

// Target is the project's aim for one case on a 2-core machine: the most
// wall time, seconds, and the most peak memory, MB (10⁶ bytes; 0 when
// there is no aim for memory).
type Target struct {
	Seconds float64
	MB      float64
}

// targets are the aims, by shape and the number of cells asked for.
var targets = map[string]map[float64]Target{
	"board": {1e5: {Seconds: 0.6}, 1e6: {Seconds: 3.9, MB: 1500}},
	"block": {1e5: {Seconds: 4}, 1e6: {Seconds: 10, MB: 1500}},
}

// TargetOf returns the aim for a case, if the project has one.
func TargetOf(c Case) (Target, bool) {
	t, ok := targets[c.Shape][c.Size]
	return t, ok
}

// Met tells whether the measure meets its target: "yes", "no", "-" when
// the case has no target, or "FAILED" when the case failed.
func (m *Measure) Met() string {
	if m.Failed() {
		return "FAILED"
	}
	t, ok := TargetOf(m.Case)
	if !ok {
		return "-"
	}
	if m.Median().Seconds() > t.Seconds {
		return "no"
	}
	if t.MB > 0 && m.PeakBytes >= 0 && float64(m.PeakBytes)/1e6 > t.MB {
		return "no"
	}
	return "yes"
}

// Columns are the headings of the table.
var Columns = []string{"shape", "cells", "unknowns", "time (s)", "peak (MB)", "Newton", "linear", "target (s / MB)", "met"}

// row returns the table's cells for one measure.
func (m *Measure) row() []string {
	dash := func(ok bool, s string) string {
		if !ok {
			return "-"
		}
		return s
	}
	target := "-"
	if t, ok := TargetOf(m.Case); ok {
		target = strconv.FormatFloat(t.Seconds, 'g', -1, 64) + " / " + dash(t.MB > 0, strconv.FormatFloat(t.MB, 'f', 0, 64))
	}
	return []string{
		m.Case.Shape,
		strconv.Itoa(m.Case.Cells()),
		dash(m.Unknowns > 0, strconv.Itoa(m.Unknowns)),
		dash(len(m.Times) > 0, fmt.Sprintf("%.3f", m.Median().Seconds())),
		dash(m.PeakBytes >= 0, fmt.Sprintf("%.0f", float64(m.PeakBytes)/1e6)),
		dash(m.Newton > 0, strconv.Itoa(m.Newton)),
		dash(m.Linear >= 0, strconv.Itoa(m.Linear)),
		target,
		m.Met(),
	}
}

// Machine describes where the bench ran.
type Machine struct {
	CPU        string // model name, "" when unknown
	CPUs       int    // logical CPUs
	GOMAXPROCS int
	GoVersion  string
	OS, Arch   string
	// HugePages is the kernel's transparent huge page mode (always,
	// madvise or never), "" when unknown: with never, a big solve's
	// memory comes in 4 KiB pages and takes longer (see package bigmem).
	HugePages string
}

// ThisMachine describes the machine the bench runs on. The solves are
// children of this process and inherit its environment, GOMAXPROCS
// included.
func ThisMachine() Machine {
	return Machine{CPU: cpuModel("/proc/cpuinfo"), CPUs: runtime.NumCPU(), GOMAXPROCS: runtime.GOMAXPROCS(0),
		GoVersion: runtime.Version(), OS: runtime.GOOS, Arch: runtime.GOARCH,
		HugePages: hugePageMode("/sys/kernel/mm/transparent_hugepage/enabled")}
}

// hugePageMode reads the mode in brackets of the kernel's transparent huge
// page setting ("always [madvise] never" gives madvise), "" when there is
// none.
func hugePageMode(path string) string {
	data, err := os.ReadFile(path)
	if err != nil {
		return ""
	}
	_, rest, ok := strings.Cut(string(data), "[")
	mode, _, ok2 := strings.Cut(rest, "]")
	if !ok || !ok2 {
		return ""
	}
	return mode
}

// cpuModel reads the first "model name" of a cpuinfo file, "" when there is
// none.
func cpuModel(path string) string {
	f, err := os.Open(path)
	if err != nil {
		return ""
	}
	defer f.Close()
	s := bufio.NewScanner(f)
	for s.Scan() {
		k, v, ok := strings.Cut(s.Text(), ":")
		if ok && strings.TrimSpace(k) == "model name" {
			return strings.Join(strings.Fields(v), " ")
		}
	}
	return ""
}

func (m Machine) lines(repeat int) []string {
	cpu := m.CPU
	if cpu == "" {
		cpu = "unknown CPU"
	}
	machine := fmt.Sprintf("machine: %s, %d logical CPUs, GOMAXPROCS %d, %s %s/%s", cpu, m.CPUs, m.GOMAXPROCS, m.GoVersion, m.OS, m.Arch)
	if m.HugePages != "" {
		machine += ", transparent huge pages " + m.HugePages
	}
	return []string{
		machine,
		fmt.Sprintf("time: wall time of 'heatgraph solve MODEL -f json -o RESULT', model file to written results, median of %d run%s", repeat, plural(repeat)),
		fmt.Sprintf("peak: largest peak resident set of the solve's process over the runs, MB = 10^6 bytes"),
		"Newton: Newton iterations; linear: linear solver iterations (- when the report does not give them)",
	}
}

// WriteText writes the table as aligned text, then the failures.
func WriteText(w io.Writer, ms []*Measure, mach Machine, repeat int) error {
	rows := [][]string{Columns}
	for _, m := range ms {
		rows = append(rows, m.row())
	}
	width := make([]int, len(Columns))
	for _, r := range rows {
		for i, c := range r {
			width[i] = max(width[i], len([]rune(c)))
		}
	}
	var b strings.Builder
	for _, r := range rows {
		for i, c := range r {
			pad := strings.Repeat(" ", width[i]-len([]rune(c)))
			switch {
			case i == 0:
				b.WriteString(c + pad)
			default:
				b.WriteString("  " + pad + c)
			}
		}
		b.WriteString("\n")
	}
	b.WriteString("\n")
	for _, l := range mach.lines(repeat) {
		b.WriteString(l + "\n")
	}
	writeFailures(&b, ms)
	_, err := io.WriteString(w, b.String())
	return err
}

// WriteMarkdown writes the table as a Markdown table, then the failures.
func WriteMarkdown(w io.Writer, ms []*Measure, mach Machine, repeat int) error {
	var b strings.Builder
	b.WriteString("| " + strings.Join(Columns, " | ") + " |\n|")
	for i := range Columns {
		if i == 0 {
			b.WriteString("---|")
		} else {
			b.WriteString("---:|")
		}
	}
	b.WriteString("\n")
	for _, m := range ms {
		b.WriteString("| " + strings.Join(m.row(), " | ") + " |\n")
	}
	b.WriteString("\n")
	for _, l := range mach.lines(repeat) {
		b.WriteString("- " + l + "\n")
	}
	writeFailures(&b, ms)
	_, err := io.WriteString(w, b.String())
	return err
}

func writeFailures(b *strings.Builder, ms []*Measure) {
	for _, m := range ms {
		if m.Failed() {
			fmt.Fprintf(b, "\nFAILED %s (%d cells): %v\n", m.Case.Name(), m.Case.Cells(), m.Err)
		}
	}
}

func plural(n int) string {
	if n == 1 {
		return ""
	}
	return "s"
}
