package viz

import (
	"bytes"
	"errors"
	"fmt"
	"html/template"
	"math"
	"strings"

	"github.com/heatgraph/heatgraph/network"
)

// A meshed plate is one node of the network (its temperature is that of
// its hottest cell) and a network.PlateResult: the summary the reports
// print, and every cell's temperature, which the heat maps draw and
// WritePlateCells writes on request. No report copies the cells.

// plateKind is the node kind of a meshed plate.
const plateKind = network.Plate

// plateNodes returns the ids of the nodes that stand for meshed plates: a
// link from one of them is the plate's own element, whose joins the
// plates section lists.
func plateNodes(sol *network.Solution) map[string]bool {
	ids := map[string]bool{}
	for _, n := range sol.Nodes {
		if n.Kind == plateKind {
			ids[n.ID] = true
		}
	}
	return ids
}

// checkPlate reports what makes a plate result unfit to draw or write.
func checkPlate(p *network.PlateResult) error {
	if p == nil {
		return errors.New("no plate")
	}
	switch {
	case p.NX < 1 || p.NY < 1 || p.NZ < 1:
		return fmt.Errorf("plate %q: grid %d × %d × %d has no cells", p.ID, p.NX, p.NY, p.NZ)
	case len(p.T) != p.NX*p.NY*p.NZ:
		return fmt.Errorf("plate %q: %d cell temperatures for a grid of %d × %d × %d", p.ID, len(p.T), p.NX, p.NY, p.NZ)
	case !(p.Width > 0) || !(p.Length > 0) || math.IsInf(p.Width, 0) || math.IsInf(p.Length, 0):
		return fmt.Errorf("plate %q: size %g × %g m is not a positive finite size", p.ID, p.Width, p.Length)
	}
	return nil
}

// zCentre is the height of the centre of layer k, m.
func zCentre(p *network.PlateResult, k int) float64 {
	if len(p.ZEdges) == p.NZ+1 {
		return (p.ZEdges[k] + p.ZEdges[k+1]) / 2
	}
	return (float64(k) + 0.5) * p.Thickness / float64(p.NZ)
}

// zSpan is the bottom and top of layer k, m.
func zSpan(p *network.PlateResult, k int) (float64, float64) {
	if len(p.ZEdges) == p.NZ+1 {
		return p.ZEdges[k], p.ZEdges[k+1]
	}
	h := p.Thickness / float64(p.NZ)
	return float64(k) * h, float64(k+1) * h
}

// plateField is what a heat map shows of a plate: one value per column
// (i, j) of cells, K, and where its hottest cell is.
type plateField struct {
	p      *network.PlateResult
	nx, ny int
	v      []float64 // v[i + nx·j], K; a view into the solution for one layer
	layer  int       // the layer shown, or -1: the hottest through the thickness
	// hotI, hotJ, hotK locate the hottest cell shown (hotK the layer it
	// is in); lo and hi are the coolest and hottest finite values shown.
	hotI, hotJ, hotK int
	lo, hi           float64
	nonFinite        int // values that are not finite numbers
	overCells        int // values above the plate's limit
}

// newPlateField takes layer k of a plate, or with k < 0 the hottest cell
// through the thickness of every column.
func newPlateField(p *network.PlateResult, k int) (*plateField, error) {
	if err := checkPlate(p); err != nil {
		return nil, err
	}
	if k >= p.NZ {
		return nil, fmt.Errorf("plate %q has layers 0 to %d, not %d", p.ID, p.NZ-1, k)
	}
	n := p.NX * p.NY
	f := &plateField{p: p, nx: p.NX, ny: p.NY, layer: k, lo: math.Inf(1), hi: math.Inf(-1), hotI: -1}
	var layerOf []int32
	if k >= 0 {
		f.v = p.T[n*k : n*(k+1)]
	} else {
		f.v = make([]float64, n)
		layerOf = make([]int32, n)
		for c := range f.v {
			f.v[c] = math.NaN()
		}
		for kk := 0; kk < p.NZ; kk++ {
			layer := p.T[n*kk : n*(kk+1)]
			for c, t := range layer {
				if finite(t) && !(t <= f.v[c]) { // NaN compares false: the first finite value wins
					f.v[c], layerOf[c] = t, int32(kk)
				}
			}
		}
	}
	best := -1
	for c, t := range f.v {
		if !finite(t) {
			f.nonFinite++
			continue
		}
		if t > f.hi || best < 0 {
			f.hi, best = t, c
		}
		f.lo = math.Min(f.lo, t)
		if p.HasLimit && t > p.Limit {
			f.overCells++
		}
	}
	if best >= 0 {
		f.hotI, f.hotJ = best%p.NX, best/p.NX
		f.hotK = k
		if k < 0 {
			f.hotK = int(layerOf[best])
		}
	}
	return f, nil
}

// blockMax returns the value of every block of bx × by cells (the last
// ones in each direction smaller): the hottest finite cell of the block, or
// NaN when it has none. Taking the maximum keeps every hot spot, however
// small, in the picture.
func (f *plateField) blockMax(bx, by int) (nbx, nby int, v []float64) {
	nbx, nby = (f.nx+bx-1)/bx, (f.ny+by-1)/by
	v = make([]float64, nbx*nby)
	for i := range v {
		v[i] = math.NaN()
	}
	for j := 0; j < f.ny; j++ {
		row := f.v[j*f.nx : (j+1)*f.nx]
		out := v[(j/by)*nbx : (j/by+1)*nbx]
		for b := range out {
			m := out[b]
			for _, t := range row[b*bx : min((b+1)*bx, f.nx)] {
				if finite(t) && !(t <= m) { // m is NaN until a finite cell
					m = t
				}
			}
			out[b] = m
		}
	}
	return nbx, nby, v
}

// position returns the centre of cell (i, j, k), m.
func (f *plateField) position(i, j, k int) (x, y, z float64) {
	p := f.p
	return (float64(i) + 0.5) * p.Width / float64(p.NX), (float64(j) + 0.5) * p.Length / float64(p.NY), zCentre(p, k)
}

// mmText formats a position in mm with one decimal: (x, y) for a plate one
// cell thick, (x, y, z) otherwise.
func mmText(p *network.PlateResult, x, y, z float64) string {
	if p.NZ > 1 {
		return fmt.Sprintf("(%s, %s, %s) mm", fnum("%.1f", 1e3*x), fnum("%.1f", 1e3*y), fnum("%.2f", 1e3*z))
	}
	return fmt.Sprintf("(%s, %s) mm", fnum("%.1f", 1e3*x), fnum("%.1f", 1e3*y))
}

// plateByID indexes the plates of a solution.
func plateByID(sol *network.Solution) map[string]*network.PlateResult {
	m := map[string]*network.PlateResult{}
	for i := range sol.Plates {
		m[sol.Plates[i].ID] = &sol.Plates[i]
	}
	return m
}

// plateStatus is the status word of a plate's hottest cell, as the node
// table writes it.
func plateStatus(p *network.PlateResult) string {
	if !p.HasLimit {
		return "no limit"
	}
	return statusText(p.Status)
}

// plateWarnings returns a warning for every number of a plate that is not
// finite, counting the cells rather than naming each.
func plateWarnings(p *network.PlateResult) []string {
	var w []string
	item := "plate " + p.ID
	check := func(quantity string, x float64) {
		if !finite(x) {
			w = append(w, nonFiniteWarning(item, quantity, x, "its value is left out"))
		}
	}
	check("hottest temperature", p.Hottest)
	check("mean temperature", p.Mean)
	check("coolest temperature", p.Coolest)
	if p.HasLimit {
		check("limit", p.Limit)
		check("margin", p.Margin)
	}
	for _, j := range p.Joins {
		check("heat through "+j.Name, j.Heat)
	}
	bad := 0
	for _, t := range p.T {
		if !finite(t) {
			bad++
		}
	}
	if bad > 0 {
		w = append(w, fmt.Sprintf("%s: %s without a finite temperature; heat maps leave them grey and cell tables empty", item, countOf(bad, "cell")))
	}
	return w
}

// writePlates writes the text report's section on meshed plates: for each,
// its hottest cell and where it is, its mean and coolest, its limit, and
// the heat through each of its joins.
func writePlates(tw *textWriter, sol *network.Solution) {
	if len(sol.Plates) == 0 {
		return
	}
	tw.printf("\nplates (each is one node above, at its hottest cell)\n")
	for i := range sol.Plates {
		p := &sol.Plates[i]
		tw.printf("  %s: %s × %s × %s mm, %d × %d × %d cells\n", p.ID, fnum("%.1f", 1e3*p.Width), fnum("%.1f", 1e3*p.Length),
			fnum("%.2f", 1e3*p.Thickness), p.NX, p.NY, p.NZ)
		tw.printf("    hottest  %9s °C at %s\n", fnum("%.2f", celsius(p.Hottest)), mmText(p, p.HotX, p.HotY, p.HotZ))
		tw.printf("    mean     %9s °C\n", fnum("%.2f", celsius(p.Mean)))
		tw.printf("    coolest  %9s °C\n", fnum("%.2f", celsius(p.Coolest)))
		if p.HasLimit {
			tw.printf("    limit    %9s °C, margin %s K  %s\n", fnum("%.2f", celsius(p.Limit)), fnum("%+.2f", noNegZero(p.Margin, 2)), statusText(p.Status))
		} else {
			tw.printf("    limit            - (none set)\n")
		}
		if len(p.Parts) > 0 {
			items := make([]string, len(p.Parts))
			for k, fp := range p.Parts {
				items[k] = fp.Name + " " + watts(fp.Power)
				if fp.Face != "" && fp.Face != "top" {
					items[k] += " (" + fp.Face + ")"
				}
			}
			tw.printf("    parts on it: %s\n", strings.Join(items, ", "))
		}
		if len(p.Joins) == 0 {
			continue
		}
		nw := len("join")
		for _, j := range p.Joins {
			nw = max(nw, len(j.Name))
		}
		tw.printf("    %-*s  %10s  %s\n", nw, "join", "heat [W]", "to node (positive heat leaves the plate)")
		total := 0.0
		for _, j := range p.Joins {
			tw.printf("    %-*s  %10s  %s\n", nw, j.Name, fnum("%.3f", noNegZero(j.Heat, 3)), j.Node)
			total += j.Heat
		}
		tw.printf("    %-*s  %10s\n", nw, "all joins", fnum("%.3f", noNegZero(total, 3)))
		for _, j := range p.Joins {
			if j.Correlation != "" {
				tw.printf("    %s: h %s W/(m2 K) at the region's mean temperature, %s\n", j.Name, fnum("%.3g", j.Coefficient), j.Correlation)
			}
		}
	}
}

// PlateReport is the JSON summary of one meshed plate: its grid and size,
// its hottest cell and where it is, its mean and coolest temperatures, its
// limit, the heat through each join and the parts on it. The cells are
// not in it (see WritePlateCells).
type PlateReport struct {
	ID         string `json:"id"`
	NX         int    `json:"nx"`
	NY         int    `json:"ny"`
	NZ         int    `json:"nz"`
	WidthM     Number `json:"width_m"`
	LengthM    Number `json:"length_m"`
	ThicknessM Number `json:"thickness_m"`
	HottestC   Number `json:"hottest_degC"`
	// HottestXM, HottestYM and HottestZM locate the centre of the hottest
	// cell from the corner at x = 0, y = 0 of the bottom face.
	HottestXM Number                 `json:"hottest_x_m"`
	HottestYM Number                 `json:"hottest_y_m"`
	HottestZM Number                 `json:"hottest_z_m"`
	MeanC     Number                 `json:"mean_degC"`
	CoolestC  Number                 `json:"coolest_degC"`
	LimitC    *Number                `json:"limit_degC,omitempty"`
	MarginK   *Number                `json:"margin_K,omitempty"`
	Status    string                 `json:"status,omitempty"`
	Joins     []PlateJoinReport      `json:"joins"`
	Parts     []PlateFootprintReport `json:"parts,omitempty"`
}

// PlateJoinReport is the heat through one join of a plate, positive out of
// the plate into the node.
type PlateJoinReport struct {
	Name  string `json:"name"`
	Face  string `json:"face"`
	Node  string `json:"node"`
	Kind  string `json:"kind"`
	HeatW Number `json:"heat_W"`
	// HW and Correlation: a natural-convection join's coefficient at the
	// region's mean temperature and the correlation behind it.
	HW          *Number `json:"h_W_m2K,omitempty"`
	Correlation string  `json:"correlation,omitempty"`
}

// PlateFootprintReport is a part's footprint on a face of a plate, m from the
// corner at x = 0, y = 0, and the power that enters the plate there.
type PlateFootprintReport struct {
	Name   string `json:"name"`
	Face   string `json:"face"`
	X0M    Number `json:"x0_m"`
	Y0M    Number `json:"y0_m"`
	X1M    Number `json:"x1_m"`
	Y1M    Number `json:"y1_m"`
	PowerW Number `json:"power_W"`
}

func newPlateReports(sol *network.Solution) []PlateReport {
	var out []PlateReport
	for i := range sol.Plates {
		p := &sol.Plates[i]
		r := PlateReport{ID: p.ID, NX: p.NX, NY: p.NY, NZ: p.NZ,
			WidthM: Number(p.Width), LengthM: Number(p.Length), ThicknessM: Number(p.Thickness),
			HottestC: Number(celsius(p.Hottest)), HottestXM: Number(p.HotX), HottestYM: Number(p.HotY), HottestZM: Number(p.HotZ),
			MeanC: Number(celsius(p.Mean)), CoolestC: Number(celsius(p.Coolest)), Joins: []PlateJoinReport{}}
		if p.HasLimit {
			r.LimitC, r.MarginK, r.Status = num(celsius(p.Limit)), num(p.Margin), string(p.Status)
		}
		for _, j := range p.Joins {
			jr := PlateJoinReport{Name: j.Name, Face: j.Face, Node: j.Node, Kind: j.Kind, HeatW: Number(j.Heat), Correlation: j.Correlation}
			if j.Correlation != "" {
				h := Number(j.Coefficient)
				jr.HW = &h
			}
			r.Joins = append(r.Joins, jr)
		}
		for _, fp := range p.Parts {
			r.Parts = append(r.Parts, PlateFootprintReport{Name: fp.Name, Face: fp.Face, X0M: Number(fp.X0), Y0M: Number(fp.Y0),
				X1M: Number(fp.X1), Y1M: Number(fp.Y1), PowerW: Number(fp.Power)})
		}
		out = append(out, r)
	}
	return out
}

// htmlPlate is a plate's section of the HTML report.
type htmlPlate struct {
	ID, Size, Hottest, Where, Mean, Coolest, Limit, Status, Class, Parts string
	Joins                                                                []htmlJoin
	SVG                                                                  template.HTML // the heat map, written by WritePlateSVG
	Error                                                                string        // why there is no heat map
}

type htmlJoin struct{ Name, Node, Heat string }

func newHTMLPlates(sol *network.Solution) []htmlPlate {
	var out []htmlPlate
	for i := range sol.Plates {
		p := &sol.Plates[i]
		hp := htmlPlate{ID: p.ID,
			Size: fmt.Sprintf("%s × %s × %s mm, %d × %d × %d cells", fnum("%.1f", 1e3*p.Width), fnum("%.1f", 1e3*p.Length),
				fnum("%.2f", 1e3*p.Thickness), p.NX, p.NY, p.NZ),
			Hottest: fnum("%.2f", celsius(p.Hottest)), Where: mmText(p, p.HotX, p.HotY, p.HotZ),
			Mean: fnum("%.2f", celsius(p.Mean)), Coolest: fnum("%.2f", celsius(p.Coolest)),
			Limit: "none set", Status: "no limit", Class: string(p.Status)}
		if p.HasLimit {
			hp.Limit = fnum("%.2f", celsius(p.Limit)) + " °C"
			hp.Status = "margin " + fnum("%+.2f", noNegZero(p.Margin, 2)) + " K " + statusText(p.Status)
		}
		var parts []string
		for _, fp := range p.Parts {
			parts = append(parts, fp.Name+" "+watts(fp.Power))
		}
		hp.Parts = strings.Join(parts, ", ")
		for _, j := range p.Joins {
			name := j.Name
			if j.Correlation != "" {
				name += fmt.Sprintf(": h %s W/(m² K), %s", fnum("%.3g", j.Coefficient), j.Correlation)
			}
			hp.Joins = append(hp.Joins, htmlJoin{Name: name, Node: j.Node, Heat: fnum("%.3f", noNegZero(j.Heat, 3))})
		}
		var svg bytes.Buffer
		if err := WritePlateSVG(&svg, p, HeatMapOptions{}); err != nil {
			hp.Error = "no heat map: " + err.Error()
		} else {
			// Our own SVG: every string in it is escaped (WritePlateSVG).
			hp.SVG = template.HTML(svg.String()) //nolint:gosec // see above
		}
		out = append(out, hp)
	}
	return out
}

// plateNodeAttrs draws a meshed plate's node as one slab (a 3-D box, not
// rounded) with its hottest cell and mean in its label. p is nil when the
// solution has no summary of the plate.
func plateNodeAttrs(attrs map[string]string, n network.NodeResult, p *network.PlateResult, opt DiagramOptions) {
	style := "filled"
	if n.Status == network.Tight {
		style += ",dashed"
	}
	attrs["style"] = q(style)
	label := n.ID
	tip := fmt.Sprintf("%s (meshed plate): hottest cell %.2f °C", n.ID, celsius(n.Temperature))
	if p != nil {
		label += fmt.Sprintf("\nplate, %d × %d × %d cells", p.NX, p.NY, p.NZ)
		tip += " at " + mmText(p, p.HotX, p.HotY, p.HotZ) + ", mean " + fnum("%.2f", celsius(p.Mean)) + " °C"
	}
	label += fmt.Sprintf("\nhottest %.1f °C", celsius(n.Temperature))
	if p != nil && finite(p.Mean) {
		label += fmt.Sprintf("\nmean %.1f °C", celsius(p.Mean))
	}
	if n.HasLimit {
		label += fmt.Sprintf("\nmargin %s K %s", signed(n.Margin), statusWord(n))
	} else {
		label += "\nno limit"
	}
	if n.Power != 0 {
		label += "\npower " + watts(n.Power)
	}
	attrs["label"] = q(compareLabel(label, n, opt))
	attrs["tooltip"] = q(tip + ", " + statusWord(n))
}

// plateJoinEdges adds the heat through each join of a meshed plate to the
// arrows, from the plate to the node joined, where no link of the
// solution already joins the two (a plate's joins may be links of their
// own; then they are counted once, as links). add is heatEdges' merge.
func plateJoinEdges(sol *network.Solution, linked map[[2]string]bool, add func(from, to string, heat float64, air bool, what, kind string) int) {
	for _, p := range sol.Plates {
		for _, j := range p.Joins {
			if linked[[2]string{p.ID, j.Node}] || j.Node == "" || j.Node == p.ID {
				continue
			}
			add(p.ID, j.Node, j.Heat, false, fmt.Sprintf("%s: %s (%s)", p.ID, j.Name, j.Kind), j.Kind)
		}
	}
}
