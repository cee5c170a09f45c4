package study

import (
	"fmt"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/units"
)

// ParseAxis reads a swept value from the command line, PATH=VALUES, where
// VALUES is a list (20degC,30degC,45degC), or FROM:TO:STEP with a step
// with its unit (20degC:60degC:5K), or FROM:TO:N with a count of evenly
// spaced values (1W:10W:10), or FROM:TO:Nlog for geometric spacing.
func (m *Model) ParseAxis(spec string) (Axis, error) {
	path, vals, ok := strings.Cut(spec, "=")
	if !ok || path == "" || vals == "" {
		return Axis{}, fmt.Errorf("--vary %q: expected PATH=FROM:TO:STEP, PATH=FROM:TO:COUNT[log] or PATH=V1,V2,...", spec)
	}
	q, err := m.Parameter(strings.TrimSpace(path))
	if err != nil {
		return Axis{}, fmt.Errorf("--vary %v", err)
	}
	ax := Axis{Param: q}
	parse := func(s string, k units.Kind) (float64, error) {
		v, err := units.Parse(strings.TrimSpace(s), k)
		if err != nil {
			return 0, fmt.Errorf("--vary %s: %v", q.Path, err)
		}
		return v, nil
	}
	if parts := strings.Split(vals, ":"); len(parts) == 3 {
		from, err := parse(parts[0], q.Kind)
		if err != nil {
			return ax, err
		}
		to, err := parse(parts[1], q.Kind)
		if err != nil {
			return ax, err
		}
		last := strings.TrimSpace(parts[2])
		log := strings.HasSuffix(last, "log")
		if n, err := strconv.Atoi(strings.TrimSuffix(last, "log")); err == nil {
			ax.Values, err = Range(from, to, 0, n, log)
			if err != nil {
				return ax, fmt.Errorf("--vary %s: %v", q.Path, err)
			}
			return ax, nil
		}
		kind := q.Kind
		if kind == units.Temperature {
			kind = units.TemperatureDifference
		}
		step, err := parse(last, kind)
		if err != nil {
			return ax, err
		}
		if ax.Values, err = Range(from, to, step, 0, false); err != nil {
			return ax, fmt.Errorf("--vary %s: %v", q.Path, err)
		}
		return ax, nil
	}
	for _, s := range strings.Split(vals, ",") {
		v, err := parse(s, q.Kind)
		if err != nil {
			return ax, err
		}
		ax.Values = append(ax.Values, v)
	}
	return ax, nil
}
