package graphcmd

import (
	"fmt"
	"sort"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/network"
	"github.com/heatgraph/heatgraph/viz"
)

// ParseHideBelow reads --hide-below: heat with a unit of watts ("0.1W",
// "0.1 W", "50 mW") or a bare fraction of the largest arrow in [0, 1).
func ParseHideBelow(s string) (w, fraction float64, err error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, 0, nil
	}
	for _, u := range []struct {
		suffix string
		factor float64
	}{{"mW", 1e-3}, {"kW", 1e3}, {"W", 1}} {
		if num, ok := strings.CutSuffix(s, u.suffix); ok {
			v, perr := strconv.ParseFloat(strings.TrimSpace(num), 64)
			if perr != nil || v < 0 || v != v {
				return 0, 0, fmt.Errorf("--hide-below %q: give heat such as 0.1W or a fraction of the largest flow such as 0.02", s)
			}
			return v * u.factor, 0, nil
		}
	}
	v, perr := strconv.ParseFloat(s, 64)
	if perr != nil || !(v >= 0 && v < 1) {
		return 0, 0, fmt.Errorf("--hide-below %q: give heat such as 0.1W or a fraction of the largest flow from 0 to 1 such as 0.02", s)
	}
	return 0, v, nil
}

// checkNames checks that --collapse names groups and --source a source.
func checkNames(sol *network.Solution, opt viz.DiagramOptions) error {
	groups := map[string]bool{}
	for _, g := range viz.NodeGroups(sol.Net.Model) {
		groups[g] = true
	}
	for _, c := range opt.Collapse {
		if !groups[c] {
			return fmt.Errorf("--collapse %q: no node names this group (groups: %s)", c, list(groups))
		}
	}
	if opt.Source != "" && viz.NewBreakdown(sol).Source(opt.Source) == nil {
		sources := map[string]bool{}
		for _, s := range viz.NewBreakdown(sol).Sources {
			sources[s.Node] = true
		}
		return fmt.Errorf("--source %q: not a heat source of this model (sources: %s)", opt.Source, list(sources))
	}
	return nil
}

func list(set map[string]bool) string {
	if len(set) == 0 {
		return "none"
	}
	names := make([]string, 0, len(set))
	for n := range set {
		names = append(names, n)
	}
	sort.Strings(names)
	return strings.Join(names, ", ")
}
