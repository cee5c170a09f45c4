package network

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strings"

	"github.com/heatgraph/heatgraph/units"
	"gopkg.in/yaml.v3"
)

// The model file gives a quantity that changes with time as a mapping in
// place of the value:
//
//	power: {step: {before: 2 W, after: 12 W, at: 5 min}}
//	power: {pulse: {base: 2 W, peak: 40 W, start: 10 s, width: 2 s}, repeat: 30 s}
//	power: {duty: {period: 1 min, on_fraction: 25 %, on: 40 W, off: 2 W}}
//	temperature: {table: [[0 h, 15 degC], [14 h, 32 degC], [24 h, 15 degC]], repeat: 24 h}
//	irradiance: {file: sun.csv, repeat: 24 h}
//
// A CSV file has a header naming each column with its unit in brackets
// ("time [h], irradiance [W/m2]"), one row per point; a path is relative to
// the model file. With more than two columns, column: names the one to use.

var (
	profileShapes = []string{"step", "pulse", "duty", "table", "file"}
	profileKeys   = append(append([]string{}, profileShapes...), "repeat", "column")
)

// profileHint is the hint for a profile mapping.
const profileHint = "the shape of the quantity in time, e.g. {step: {before: 0 W, after: 5 W, at: 1 min}}"

// varying reads key as a constant of the given kind or as a profile in
// time. It returns the value at t = 0 (what a steady solve uses), the
// profile (nil for a constant), and ok false when the key is absent or
// invalid (which is reported). With need, an absent key is reported.
func (o *object) varying(key string, kind units.Kind, need bool) (float64, Profile, bool) {
	v, ok := o.values[key]
	if !ok {
		if need {
			o.missing(key, fmt.Sprintf("%s, e.g. %s", withArticle(kind.String()), example(kind)))
		}
		return 0, nil, false
	}
	if v.Kind != yaml.MappingNode {
		var x float64
		var ok bool
		switch kind {
		case units.Temperature:
			x, ok = o.temperature(key, need)
		case units.Power:
			x, ok = o.power(key, need)
		default:
			x, ok = o.quantity(key, kind)
		}
		return x, nil, ok
	}
	po := o.r.newObject(v, o.field(key))
	if po == nil {
		return 0, nil, false
	}
	p := po.profile(kind)
	if p == nil {
		return 0, nil, false
	}
	// The same ranges as constants.
	lo, hi := profileLowest(p, 0), profileHighest(p, 0)
	switch {
	case kind == units.Temperature && (lo < minTemperature || hi > maxTemperature):
		o.r.addf(v, o.field(key), "the profile reaches %g K to %g K; a temperature in a model must lie between %g K and %g K", lo, hi, float64(minTemperature), float64(maxTemperature))
		return 0, nil, false
	case kind == units.Power && (math.Abs(lo) > maxPower || math.Abs(hi) > maxPower):
		o.r.addf(v, o.field(key), "the profile reaches %g W to %g W, outside the range a model takes for a heat input, -1 MW to 1 MW", lo, hi)
		return 0, nil, false
	}
	return p.At(0), p, true
}

// profile reads a profile mapping.
func (o *object) profile(kind units.Kind) Profile {
	o.checkKeys(profileKeys, "a profile")
	shape := o.oneOf(profileHint, profileShapes...)
	var p Profile
	switch shape {
	case "step":
		p = o.stepProfile(kind)
	case "pulse":
		p = o.pulseProfile(kind)
	case "duty":
		p = o.dutyProfile(kind)
	case "table":
		p = o.tableProfile(kind)
	case "file":
		p = o.fileProfile(kind)
	}
	if o.has("column") && shape != "file" {
		o.r.addf(o.values["column"], o.field("column"), "column is only for a profile read from a file")
	}
	if !o.has("repeat") {
		return p
	}
	period, ok := o.positive("repeat", units.Time, true)
	if !ok || p == nil {
		return nil
	}
	switch q := p.(type) {
	case *StepProfile, *DutyProfile:
		o.r.addf(o.values["repeat"], o.field("repeat"), "a %s does not repeat (repeat a pulse or a table; a duty cycle has its own period)", shape)
		return nil
	case *PulseProfile:
		if q.Start+q.Width > period {
			o.r.addf(o.values["repeat"], o.field("repeat"), "the pulse (start %s + width %s) does not fit in the period %s", seconds(q.Start), seconds(q.Width), seconds(period))
			return nil
		}
	case *TableProfile:
		if q.T[0] < 0 || q.T[len(q.T)-1] > period {
			o.r.addf(o.values["repeat"], o.field("repeat"), "a repeated table must lie within one period: its times run from %s to %s, the period is %s", seconds(q.T[0]), seconds(q.T[len(q.T)-1]), seconds(period))
			return nil
		}
	}
	return &RepeatProfile{Of: p, Period: period}
}

func seconds(t float64) string { return fmt.Sprintf("%g s", t) }

// sub returns the mapping under key, or nil after reporting.
func (o *object) sub(key, hint string) *object {
	v := o.values[key]
	if v.Kind != yaml.MappingNode {
		o.r.addf(v, o.field(key), "expected a mapping (%s), got %s", hint, describe(v))
		return nil
	}
	return o.r.newObject(v, o.field(key))
}

func (o *object) stepProfile(kind units.Kind) Profile {
	s := o.sub("step", "before, after and at, e.g. {before: 2 W, after: 12 W, at: 5 min}")
	if s == nil {
		return nil
	}
	s.checkKeys([]string{"before", "after", "at"}, "a step")
	before, ok1 := s.required("before", kind)
	after, ok2 := s.required("after", kind)
	at, ok3 := s.required("at", units.Time)
	if ok3 && at < 0 {
		s.r.addf(s.values["at"], s.field("at"), "a step must come at or after the start (t ≥ 0)")
		ok3 = false
	}
	if !(ok1 && ok2 && ok3) {
		return nil
	}
	return &StepProfile{Before: before, After: after, Time: at}
}

func (o *object) pulseProfile(kind units.Kind) Profile {
	s := o.sub("pulse", "base, peak, start and width, e.g. {base: 2 W, peak: 40 W, start: 10 s, width: 2 s}")
	if s == nil {
		return nil
	}
	s.checkKeys([]string{"base", "peak", "start", "width"}, "a pulse")
	base, okB := 0.0, true
	if s.has("base") {
		base, okB = s.quantity("base", kind)
	}
	peak, okP := s.required("peak", kind)
	start, okS := 0.0, true
	if s.has("start") {
		start, okS = s.quantity("start", units.Time)
		if okS && start < 0 {
			s.r.addf(s.values["start"], s.field("start"), "a pulse must start at or after t = 0")
			okS = false
		}
	}
	width, okW := s.positive("width", units.Time, true)
	if !(okB && okP && okS && okW) {
		return nil
	}
	return &PulseProfile{Base: base, Peak: peak, Start: start, Width: width}
}

func (o *object) dutyProfile(kind units.Kind) Profile {
	s := o.sub("duty", "period, on_fraction, on and off, e.g. {period: 1 min, on_fraction: 25 %, on: 40 W, off: 2 W}")
	if s == nil {
		return nil
	}
	s.checkKeys([]string{"period", "on_fraction", "on", "off", "start"}, "a duty cycle")
	period, ok1 := s.positive("period", units.Time, true)
	frac, ok2 := s.fraction("on_fraction", true)
	on, ok3 := s.required("on", kind)
	off, ok4 := 0.0, true
	if s.has("off") {
		off, ok4 = s.quantity("off", kind)
	}
	start, ok5 := 0.0, true
	if s.has("start") {
		start, ok5 = s.quantity("start", units.Time)
		if ok5 && start < 0 {
			s.r.addf(s.values["start"], s.field("start"), "a duty cycle must start at or after t = 0")
			ok5 = false
		}
	}
	if !(ok1 && ok2 && ok3 && ok4 && ok5) {
		return nil
	}
	return &DutyProfile{Period: period, Fraction: frac, On: on, Off: off, Start: start}
}

func (o *object) tableProfile(kind units.Kind) Profile {
	v := o.values["table"]
	if v.Kind != yaml.SequenceNode || len(v.Content) == 0 {
		o.r.addf(v, o.field("table"), "expected a list of [time, value] pairs, e.g. [[0 min, 5 W], [10 min, 20 W]], got %s", describe(v))
		return nil
	}
	tb := &TableProfile{}
	ok := true
	for i, item := range v.Content {
		field := fmt.Sprintf("%s[%d]", o.field("table"), i)
		if item.Kind != yaml.SequenceNode || len(item.Content) != 2 || item.Content[0].Kind != yaml.ScalarNode || item.Content[1].Kind != yaml.ScalarNode {
			o.r.addf(item, field, "expected a [time, value] pair such as [10 min, 20 W], got %s", describe(item))
			ok = false
			continue
		}
		t, err1 := units.Parse(item.Content[0].Value, units.Time)
		x, err2 := units.Parse(item.Content[1].Value, kind)
		if err1 != nil {
			o.r.addf(item.Content[0], field, "time: %v", unitMessage(err1))
			ok = false
		}
		if err2 != nil {
			o.r.addf(item.Content[1], field, "value: %v", unitMessage(err2))
			ok = false
		}
		if err1 == nil && err2 == nil {
			if msg := tb.add(t, x); msg != "" {
				o.r.addf(item, field, "%s", msg)
				ok = false
			}
		}
	}
	if !ok {
		return nil
	}
	return tb
}

// add appends a point, checking the order of the times; it returns a
// message when the point is out of order.
func (tb *TableProfile) add(t, x float64) string {
	n := len(tb.T)
	switch {
	case t < 0:
		return fmt.Sprintf("time %g s is before the start (t ≥ 0)", t)
	case n > 0 && t < tb.T[n-1]:
		return fmt.Sprintf("time %g s comes before the previous point's %g s (times must not decrease)", t, tb.T[n-1])
	case n > 1 && t == tb.T[n-1] && t == tb.T[n-2]:
		return fmt.Sprintf("three points at %g s (two at the same time make a jump; a third is one too many)", t)
	}
	tb.T = append(tb.T, t)
	tb.V = append(tb.V, x)
	return ""
}

func unitMessage(err error) string {
	var ue *units.Error
	if errors.As(err, &ue) {
		return ue.Error()
	}
	return err.Error()
}

var csvHeader = regexp.MustCompile(`^\s*([^\[\]]*?)\s*\[([^\[\]]*)\]\s*$`)

func (o *object) fileProfile(kind units.Kind) Profile {
	name, ok := o.str("file")
	if !ok {
		return nil
	}
	path := name
	if !filepath.IsAbs(path) {
		path = filepath.Join(filepath.Dir(o.r.file), name)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		o.r.addf(o.values["file"], o.field("file"), "cannot read %s: %s", name, readError(err))
		return nil
	}
	column := ""
	if o.has("column") {
		column, _ = o.str("column")
	}
	tb, problems := readProfileCSV(path, data, kind, column)
	if len(problems) > 0 {
		for i := range problems {
			if problems[i].Field == "" {
				problems[i].Field = o.field("file")
			}
		}
		o.r.problems = append(o.r.problems, problems...)
		return nil
	}
	tb.Source = name
	return tb
}

// readProfileCSV reads a table from CSV text whose header names every
// column with its unit in brackets; the first column is the time. Problems
// carry the CSV file's own lines.
func readProfileCSV(path string, data []byte, kind units.Kind, column string) (*TableProfile, Problems) {
	var ps Problems
	bad := func(line int, format string, args ...any) {
		ps = append(ps, Problem{File: path, Line: line, Message: fmt.Sprintf(format, args...)})
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	line := 0
	var units_ []string
	col := -1
	tb := &TableProfile{}
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || strings.HasPrefix(text, "#") {
			continue
		}
		cells := strings.Split(text, ",")
		if units_ == nil {
			// The header.
			var names []string
			for _, c := range cells {
				m := csvHeader.FindStringSubmatch(c)
				if m == nil {
					bad(line, "header cell %q has no unit in brackets (write e.g. \"time [min], power [W]\")", strings.TrimSpace(c))
					return nil, ps
				}
				names = append(names, m[1])
				units_ = append(units_, m[2])
			}
			if len(cells) < 2 {
				bad(line, "the header names %d column; a profile needs a time column and a value column", len(cells))
				return nil, ps
			}
			switch {
			case column != "":
				for i, n := range names[1:] {
					if n == column {
						col = i + 1
					}
				}
				if col < 0 {
					bad(line, "no column %q%s (the header names %s)", column, suggest(column, names[1:]), strings.Join(names, ", "))
					return nil, ps
				}
			case len(cells) == 2:
				col = 1
			default:
				bad(line, "the file has %d value columns; say which with column: (one of %s)", len(cells)-1, strings.Join(names[1:], ", "))
				return nil, ps
			}
			if _, err := units.Parse("1 "+units_[0], units.Time); err != nil {
				bad(line, "time column: %s", unitMessage(err))
				return nil, ps
			}
			if _, err := units.Parse("1 "+units_[col], kind); err != nil {
				bad(line, "column %q: %s", names[col], unitMessage(err))
				return nil, ps
			}
			continue
		}
		if len(cells) != len(units_) {
			bad(line, "%d cells, the header has %d", len(cells), len(units_))
			continue
		}
		t, err1 := units.Parse(strings.TrimSpace(cells[0])+" "+units_[0], units.Time)
		x, err2 := units.Parse(strings.TrimSpace(cells[col])+" "+units_[col], kind)
		if err1 != nil {
			bad(line, "time %q: %s", strings.TrimSpace(cells[0]), unitMessage(err1))
			continue
		}
		if err2 != nil {
			bad(line, "value %q: %s", strings.TrimSpace(cells[col]), unitMessage(err2))
			continue
		}
		if msg := tb.add(t, x); msg != "" {
			bad(line, "%s", msg)
		}
	}
	if len(ps) == 0 && len(tb.T) == 0 {
		bad(line, "no points (a header line and at least one row are needed)")
	}
	return tb, ps
}
