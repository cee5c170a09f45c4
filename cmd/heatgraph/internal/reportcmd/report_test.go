package reportcmd

import (
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

const hostile = `
title: <script>alert("x")</script> & <b>bold</b>
ambient: {temperature: 30 degC, altitude: 1500 m}
required_margin: 10 K
nodes:
  - {id: board, power: 2 W, limit: 60 degC, note: "<img src=x onerror=alert(1)>"}
components:
  - {id: cpu, power: 4 W, r_jb: 2 K/W, board: board, limit: 80 degC}
links:
  - {id: film, kind: natural, from: board, orientation: vertical, height: 10 cm, width: 10 cm}
  - {id: glow, kind: radiation, from: board, emissivity: 0.9, area: 0.02 m2}
`

func build(t *testing.T, model string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), "m.yaml")
	require.NoError(t, os.WriteFile(path, []byte(model), 0o644))
	page, _, err := Build(path, 0, false)
	require.NoError(t, err)
	return string(page)
}

func TestReportEscapesModelText(t *testing.T) {
	page := build(t, hostile)
	assert.NotContains(t, page, "<script", "a title holding <script> is text, and the static report has no script")
	assert.NotContains(t, page, "<b>bold")
	assert.NotContains(t, page, "<img")
	assert.Contains(t, page, "&lt;script&gt;alert(&#34;x&#34;)&lt;/script&gt; &amp; &lt;b&gt;bold&lt;/b&gt;")
}

func TestReportIsSelfContained(t *testing.T) {
	page := build(t, hostile)
	// No request to anywhere: no src or href attributes, no stylesheet
	// links, no url(...) in styles; the only addresses are XML
	// namespace names inside the diagram.
	assert.NotRegexp(t, `(?i)\ssrc\s*=`, page)
	assert.NotRegexp(t, `(?i)<link\b`, page)
	assert.NotRegexp(t, `(?i)url\(`, page)
	assert.NotRegexp(t, `(?i)@import`, page)
	for _, u := range regexp.MustCompile(`https?://[^"'\s<>]+`).FindAllString(page, -1) {
		assert.Contains(t, []string{"http://www.w3.org/2000/svg", "http://www.w3.org/1999/xlink"}, u)
	}
	for _, href := range regexp.MustCompile(`href="([^"]*)"`).FindAllStringSubmatch(page, -1) {
		assert.False(t, strings.Contains(href[1], "//"), "link %q", href[1])
	}
	assert.Contains(t, page, "<svg")
	assert.Contains(t, page, "@media print")
	assert.Contains(t, page, "default-src 'none'")
}

func TestReportContents(t *testing.T) {
	page := build(t, hostile)
	for _, want := range []string{
		"30.00 °C", "standard atmosphere at 1500 m", // ambient, altitude and pressure
		"3 nodes (1 at a fixed temperature), 1 component, 3 links; 6 W of power in all", // board, cpu, ambient; cpu.jb, film, glow,
		"10 K: limits closer than this are flagged tight",
		`id="results"`, "<td>cpu</td>",
		`id="breakdown"`, "Improve first",
		"proportion to the heat entering it",
		`id="correlations"`, "Churchill", // the natural-convection correlation
		`id="sources"`, "radiation",
		`id="balance"`, "imbalance",
		"Confirm them by measurement", "Touch temperatures", "product-safety standards", "licensed engineering practice",
	} {
		assert.Contains(t, page, want)
	}
}

func TestReportCommand(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "m.yaml")
	require.NoError(t, os.WriteFile(path, []byte(hostile), 0o644))
	ios, _, _, errOut := iostreams.Test()
	cmd := NewCmd(ios, nil)
	out := filepath.Join(dir, "review.html")
	cmd.SetArgs([]string{path, "-o", out})
	_ = cmd.Execute() // exit 1 when a limit is exceeded
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.True(t, strings.HasPrefix(string(data), "<!DOCTYPE html>"))
	assert.Contains(t, errOut.String(), "wrote "+out)
	cmd = NewCmd(ios, nil)
	cmd.SetArgs([]string{path})
	assert.ErrorContains(t, cmd.Execute(), "-o FILE.html")
}
