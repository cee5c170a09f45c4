package viz

import (
	"bytes"
	"fmt"
	"html/template"
	"io"
	"regexp"
	"sort"
	"strings"

	"github.com/heatgraph/heatgraph/network"
)

// HTMLReport is everything the review report shows. Build it with
// NewHTMLReport; write it with WriteHTML.
type HTMLReport struct {
	Title       string
	File        string
	Summary     string // what the model holds, in words
	Ambient     string // temperature, pressure and altitude in words
	Margin      string // the required margin in words
	Iterations  int
	Verdict     string
	Warnings    []string
	Nodes       []htmlNode
	Links       []htmlLink
	Correlation []htmlCorrelation
	Kinds       []htmlKind
	Balance     []htmlBalance
	Imbalance   string
	Breakdown   *Breakdown
	Plates      []htmlPlate // every meshed plate: its summary and heat map
	Method      string
	Caution     string
	SVG         template.HTML // the diagram, inline; produced by Graphviz from our own DOT
	// Error, when set, replaces the results: a model that does not read
	// or does not solve (the live view shows it).
	Error string
	// Live adds the script that reloads the page when the model changes
	// (served by the live view only; it loads nothing from elsewhere).
	Live bool
}

type htmlNode struct {
	ID, Kind, Temp, Power, Limit, Margin, Status, Class string
}

type htmlLink struct {
	ID, Kind, From, To, Heat string
}

type htmlCorrelation struct {
	Link, Kind, Basis, Numbers string
}

type htmlKind struct {
	Name    string
	Sources []string
}

type htmlBalance struct {
	What, Heat string
}

// NewHTMLReport gathers the review report of a solution. svg is the
// diagram as Graphviz wrote it (viz.Render with FormatSVG), or nil.
func NewHTMLReport(sol *network.Solution, run Run, svg []byte) *HTMLReport {
	m := sol.Net.Model
	r := &HTMLReport{
		Title:      m.Title,
		File:       m.File,
		Ambient:    fmt.Sprintf("%.2f °C, %s", celsius(m.Ambient.Temperature), pressureText(m.Ambient)),
		Margin:     "none required",
		Iterations: run.Iterations,
		Verdict:    Verdict(sol),
		Warnings:   append(append([]string(nil), sol.Warnings...), NonFinite(sol)...),
		Breakdown:  NewBreakdown(sol),
		Method:     BreakdownMethod,
		Caution:    Caution,
		SVG:        inlineSVG(svg),
	}
	if r.Title == "" {
		r.Title = m.File
	}
	fixed, power := 0, 0.0
	for _, n := range sol.Nodes {
		if n.Kind == network.Fixed {
			fixed++
		}
		power += n.Power
	}
	r.Summary = fmt.Sprintf("%s (%d at a fixed temperature), %s, %s; %s of power in all",
		countOf(len(sol.Nodes), "node"), fixed, countOf(len(m.Components), "component"), countOf(len(sol.Links), "link"), watts(power))
	if m.RequiredMargin > 0 {
		r.Margin = fmt.Sprintf("%s K: limits closer than this are flagged tight", trimK(m.RequiredMargin))
	}
	for _, n := range sol.Nodes {
		hn := htmlNode{ID: n.ID, Kind: string(n.Kind), Temp: fnum("%.2f", celsius(n.Temperature)), Status: statusWord(n), Class: string(n.Status)}
		if n.Power != 0 {
			hn.Power = fnum("%.3f", n.Power)
		}
		if n.HasLimit {
			hn.Limit, hn.Margin = fnum("%.2f", celsius(n.Limit)), fnum("%+.2f", noNegZero(n.Margin, 2))
		}
		r.Nodes = append(r.Nodes, hn)
	}
	kinds := map[string]bool{}
	for _, l := range sol.Links {
		r.Links = append(r.Links, htmlLink{ID: l.ID, Kind: l.Kind, From: l.From, To: l.To, Heat: fnum("%.3f", noNegZero(l.Heat, 3))})
		kinds[l.Kind] = true
		var texts, nums []string
		for _, d := range l.Details {
			if d.Text != "" {
				texts = append(texts, d.Text)
			} else {
				nums = append(nums, detailText(d))
			}
		}
		if len(texts) > 0 {
			r.Correlation = append(r.Correlation, htmlCorrelation{Link: l.ID, Kind: l.Kind, Basis: strings.Join(texts, "; "), Numbers: strings.Join(nums, ", ")})
		}
	}
	names := make([]string, 0, len(kinds))
	for k := range kinds {
		names = append(names, k)
	}
	sort.Strings(names)
	for _, k := range names {
		if doc, ok := network.LinkKind(k); ok && len(doc.Sources) > 0 {
			r.Kinds = append(r.Kinds, htmlKind{Name: k, Sources: doc.Sources})
		}
	}
	r.Balance = append(r.Balance, htmlBalance{"heat in (power of all sources)", fnum("%.4f", sol.Balance.In)})
	for _, o := range sol.Balance.Out {
		if o.Heat != 0 {
			r.Balance = append(r.Balance, htmlBalance{"out through " + o.Node, fnum("%.4f", o.Heat)})
		}
	}
	r.Imbalance = fnum("%.3g", sol.Balance.Imbalance)
	r.Plates = newHTMLPlates(sol)
	return r
}

// NewHTMLError is a report page that shows only an error (a model that
// does not read or does not solve), for the live view.
func NewHTMLError(file, message string) *HTMLReport {
	return &HTMLReport{Title: file, File: file, Error: message, Caution: Caution}
}

var svgStart = regexp.MustCompile(`(?s)^.*?(<svg[\s>])`)

// inlineSVG strips the XML declaration, doctype and comments before the
// <svg> element, so the diagram can stand inside HTML.
func inlineSVG(svg []byte) template.HTML {
	if len(svg) == 0 {
		return ""
	}
	s := svgStart.ReplaceAllString(string(svg), "$1")
	// The diagram is written by Graphviz from DOT we build with every
	// model string quoted; Graphviz escapes text (&lt; &amp;) in SVG.
	return template.HTML(s) //nolint:gosec // see above
}

// WriteHTML writes the report as one self-contained HTML page: inline CSS
// and SVG, no request to anywhere (a live page talks only to the server
// that sent it). Every string from the model is escaped by html/template.
func WriteHTML(w io.Writer, r *HTMLReport) error {
	var buf bytes.Buffer
	if err := reportPage.Execute(&buf, r); err != nil {
		return err
	}
	_, err := w.Write(buf.Bytes())
	return err
}

// countOf writes n with a noun, singular for one.
func countOf(n int, noun string) string {
	if n == 1 {
		return "1 " + noun
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

func pct(x float64) string     { return fmt.Sprintf("%.1f %%", 100*x) }
func wattsF(x float64) string  { return watts(x) }
func kelvinF(x float64) string { return fnum("%.2f", x) + " K" }
func kPerW(x float64) string   { return fnum("%.3g", x) + " K/W" }
func join(a []string) string   { return strings.Join(a, " → ") }
func commas(a []string) string { return strings.Join(a, ", ") }

var reportPage = template.Must(template.New("report").Funcs(template.FuncMap{
	"pct": pct, "watts": wattsF, "kelvin": kelvinF, "kperw": kPerW, "join": join, "commas": commas,
}).Parse(reportHTML))

const reportHTML = `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:;{{if .Live}} script-src 'unsafe-inline'; connect-src 'self';{{end}}">
<title>{{.Title}} — thermal review</title>
<style>
body { font: 14px/1.45 system-ui, -apple-system, "Segoe UI", Helvetica, Arial, sans-serif; color: #1b1b1b; margin: 2em auto; max-width: 70em; padding: 0 1em; }
h1 { font-size: 1.6em; margin-bottom: 0.2em; }
h2 { font-size: 1.2em; border-bottom: 1px solid #bbb; margin-top: 1.8em; }
table { border-collapse: collapse; margin: 0.5em 0; }
th, td { border: 1px solid #ccc; padding: 0.2em 0.6em; text-align: left; vertical-align: top; }
td.n { text-align: right; font-variant-numeric: tabular-nums; }
tr.over td { background: #f6dde4; font-weight: bold; }
tr.tight td { background: #f8ecd2; }
.caution { border: 2px solid #6b3a00; padding: 0.6em 1em; background: #fff8ec; }
.error { border: 2px solid #77184d; padding: 0.6em 1em; background: #fbeef3; white-space: pre-wrap; font-family: ui-monospace, monospace; }
.diagram { overflow-x: auto; }
.diagram svg { max-width: 100%; height: auto; }
.heatmap svg { max-width: 100%; height: auto; }
.verdict { font-weight: bold; }
.small { color: #555; font-size: 0.9em; }
@page { size: auto; margin: 15mm; }
@media print {
  body { margin: 0; max-width: none; font-size: 10pt; }
  h2 { break-after: avoid; }
  table, .diagram, section.source, section.plate { break-inside: avoid; }
  .diagram svg { max-height: 240mm; }
  .noprint { display: none; }
}
</style>
</head>
<body>
<h1>{{.Title}}</h1>
<p class="small">Thermal review of model <code>{{.File}}</code>, written by heatgraph.</p>
<p class="caution"><strong>Caution.</strong> {{.Caution}} Hot surfaces can burn: check touch-temperature limits.</p>
{{if .Error}}
<h2>The model has problems</h2>
<div class="error" id="error">{{.Error}}</div>
{{else}}
<h2>Model and assumptions</h2>
<table id="summary">
<tr><th>model</th><td>{{.Summary}}</td></tr>
<tr><th>ambient</th><td>{{.Ambient}}</td></tr>
<tr><th>required margin</th><td>{{.Margin}}</td></tr>
<tr><th>solve</th><td>steady state, {{.Iterations}} Newton iterations</td></tr>
<tr><th>verdict</th><td class="verdict">{{.Verdict}}</td></tr>
</table>
<p class="small">A lumped thermal network: each node has one temperature; links follow the laws and correlations listed below; properties are taken at the solved temperatures.</p>
{{if .Warnings}}<h2>Warnings</h2>
<ul id="warnings">{{range .Warnings}}<li>{{.}}</li>{{end}}</ul>{{end}}
<h2>Results</h2>
<table id="results">
<thead><tr><th>node</th><th>kind</th><th>T [°C]</th><th>power [W]</th><th>limit [°C]</th><th>margin [K]</th><th>status</th></tr></thead>
<tbody>{{range .Nodes}}<tr class="{{.Class}}"><td>{{.ID}}</td><td>{{.Kind}}</td><td class="n">{{.Temp}}</td><td class="n">{{.Power}}</td><td class="n">{{.Limit}}</td><td class="n">{{.Margin}}</td><td>{{.Status}}</td></tr>
{{end}}</tbody>
</table>
{{if .Plates}}<h2>Meshed plates</h2>
<p class="small">Each plate is one node of the results above, at its hottest cell. Heat maps show the top layer; a block shows the hottest of the cells it covers.</p>
{{range .Plates}}<section class="plate">
<h3>{{.ID}}</h3>
<table class="plate-summary">
<tr><th>size</th><td>{{.Size}}</td></tr>
<tr><th>hottest</th><td class="n">{{.Hottest}} °C</td><td>at {{.Where}}</td></tr>
<tr><th>mean</th><td class="n">{{.Mean}} °C</td><td>weighted by cell volume</td></tr>
<tr><th>coolest</th><td class="n">{{.Coolest}} °C</td><td></td></tr>
<tr class="{{.Class}}"><th>limit</th><td class="n">{{.Limit}}</td><td>{{.Status}}</td></tr>
{{if .Parts}}<tr><th>parts on it</th><td colspan="2">{{.Parts}}</td></tr>{{end}}
</table>
{{if .Joins}}<table class="plate-joins">
<thead><tr><th>join</th><th>node</th><th>heat [W] (positive out of the plate)</th></tr></thead>
<tbody>{{range .Joins}}<tr><td>{{.Name}}</td><td>{{.Node}}</td><td class="n">{{.Heat}}</td></tr>
{{end}}</tbody>
</table>{{end}}
{{if .Error}}<p class="error">{{.Error}}</p>{{else}}<div class="heatmap">{{.SVG}}</div>{{end}}
</section>
{{end}}{{end}}
<h2>Heat paths</h2>
<div class="diagram" id="diagram">{{.SVG}}</div>
<table id="links">
<thead><tr><th>link</th><th>kind</th><th>heat [W]</th><th>from → to (positive heat flows this way)</th></tr></thead>
<tbody>{{range .Links}}<tr><td>{{.ID}}</td><td>{{.Kind}}</td><td class="n">{{.Heat}}</td><td>{{.From}} → {{.To}}</td></tr>
{{end}}</tbody>
</table>
<h2>Where the heat goes</h2>
<p class="small">{{.Method}}</p>
<div id="breakdown">
{{range .Breakdown.Sources}}<section class="source">
<h3>{{.Node}}: {{if .Fixed}}heat given by this fixed temperature{{else}}power{{end}} {{watts .Heat}}</h3>
<p>Ends in: {{range $i, $s := .Sinks}}{{if $i}}, {{end}}{{$s.Name}} {{pct $s.Share}}{{end}}</p>
<table>
<thead><tr><th>share</th><th>heat</th><th>path</th><th>links</th><th>ΔT</th><th>resistance</th></tr></thead>
<tbody>{{range .Paths}}<tr><td class="n">{{pct .Share}}</td><td class="n">{{watts .Heat}}</td><td>{{join .Nodes}}</td><td>{{commas .Links}}</td><td class="n">{{kelvin .DeltaT}}</td><td class="n">{{kperw .Resistance}}</td></tr>
{{end}}</tbody>
</table>
{{if .Drops}}<p>Improve first (temperature drop across each link of the main paths, of a rise of {{kelvin .Rise}} above ambient):</p>
<ol>{{range .Drops}}<li>{{.Links}} ({{.From}} → {{.To}}): {{kelvin .DeltaT}}, {{pct .Share}} of the rise</li>{{end}}</ol>{{end}}
</section>
{{end}}</div>
{{if .Correlation}}<h2>Correlations used</h2>
<table id="correlations">
<thead><tr><th>link</th><th>kind</th><th>basis</th><th>numbers</th></tr></thead>
<tbody>{{range .Correlation}}<tr><td>{{.Link}}</td><td>{{.Kind}}</td><td>{{.Basis}}</td><td class="small">{{.Numbers}}</td></tr>
{{end}}</tbody>
</table>{{end}}
{{if .Kinds}}<h2>Sources of the link kinds</h2>
<ul id="sources">{{range .Kinds}}<li><strong>{{.Name}}</strong>: {{range $i, $s := .Sources}}{{if $i}}; {{end}}{{$s}}{{end}}</li>{{end}}</ul>{{end}}
<h2>Energy balance</h2>
<table id="balance">
{{range .Balance}}<tr><th>{{.What}}</th><td class="n">{{.Heat}} W</td></tr>{{end}}
<tr><th>imbalance</th><td class="n">{{.Imbalance}} W</td></tr>
</table>
{{end}}
<h2>Cautions</h2>
<ul id="cautions">
<li>These results are estimates from a lumped model, as good as the values and correlations put into it.</li>
<li>Confirm them by measurement on the real product before release.</li>
<li>Touch temperatures: surfaces people can reach have limits of their own in product-safety standards.</li>
<li>Defer to local codes, product-safety standards and licensed engineering practice.</li>
</ul>
{{if .Live}}<p class="small noprint" id="live">Live view: this page reloads when the model file is saved.</p>
<script>
(function () {
  var es = new EventSource("events");
  es.onmessage = function () { location.reload(); };
})();
</script>{{end}}
</body>
</html>
`
