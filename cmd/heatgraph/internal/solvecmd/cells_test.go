package solvecmd

import (
	"encoding/csv"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// cameraBoard is the example with two meshed plates: a board of 110 × 80
// cells of 1 mm, one cell thick, and a spreader of 50 × 40 cells.
var cameraBoard = filepath.Join("..", "..", "..", "..", "examples", "camera-board.yaml")

const cameraCells = 110*80 + 50*40

// slab is testdata/slab-and-lid.yaml: a plate three cells thick heated in
// one corner of its bottom face, and a copper lid one cell thick.
var slab = readTestdata("slab-and-lid.yaml")

// noPlates is a model of nodes and links only.
const noPlates = `
title: no plates
ambient: {temperature: 25 degC}
nodes:
  - {id: chip, power: 1 W, limit: 100 degC}
links:
  - {id: sink, kind: lumped, from: chip, to: ambient, resistance: 10 K/W}
`

func writeModel(t *testing.T, dir, text string) string {
	t.Helper()
	path := filepath.Join(dir, "m.yaml")
	require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
	return path
}

// run runs "heatgraph solve" with args and returns its standard output,
// standard error and error.
func run(t *testing.T, args ...string) (string, string, error) {
	t.Helper()
	ios, _, out, errOut := iostreams.Test()
	cmd := NewCmd(ios, nil)
	cmd.SetArgs(args)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.Execute()
	return out.String(), errOut.String(), err
}

func code(err error) int {
	var ee *exit.Error
	if errors.As(err, &ee) {
		return ee.Code
	}
	return -1
}

func TestCellsCSV(t *testing.T) {
	cells := filepath.Join(t.TempDir(), "cells.csv")
	report, msg, err := run(t, cameraBoard, "--cells", cells)
	require.NoError(t, err)
	assert.Contains(t, report, "energy balance", "the report is written as well")
	assert.Equal(t, "wrote "+cells+"; 10800 cells of 2 plates\n", msg)

	f, err := os.Open(cells)
	require.NoError(t, err)
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	require.NoError(t, err)
	require.Len(t, rows, 1+cameraCells, "a header and a row a cell")
	assert.Equal(t, []string{"plate", "i", "j", "k", "x_mm", "y_mm", "z_mm", "temperature_degC"}, rows[0])
	perPlate := map[string]int{}
	for _, r := range rows[1:] {
		perPlate[r[0]]++
		// The maximum principle of steady conduction (a field with
		// sources only has no point below its coolest boundary, e.g.
		// Evans, Partial Differential Equations, §6.4; from memory): every
		// source of the model puts heat in, so no cell is below the 55 °C
		// ambient, the one fixed temperature.
		temp, err := strconv.ParseFloat(r[7], 64)
		require.NoError(t, err, r)
		require.Greater(t, temp, 55.0, r)
	}
	assert.Equal(t, map[string]int{"board": 110 * 80, "spreader": 50 * 40}, perPlate)
	// The first row is the board's corner cell, its centre half a cell in;
	// positions show no round-off of the arithmetic (the cell at i = 3 is
	// at 3.5 mm, the board's cells are 1 mm).
	assert.Equal(t, []string{"board", "0", "0", "0", "0.5", "0.5", "0.8"}, rows[1][:7])
	assert.Equal(t, []string{"board", "3", "0", "0", "3.5", "0.5", "0.8"}, rows[4][:7])
	for _, r := range rows[1:] {
		for _, v := range r[4:7] {
			if _, frac, ok := strings.Cut(v, "."); ok && len(frac) > 9 {
				t.Fatalf("position %s shows round-off: %v", v, r)
			}
		}
	}
}

// plateCells is one plate of the JSON cells file.
type plateCells struct {
	Plate  string     `json:"plate"`
	NX     int        `json:"nx"`
	NY     int        `json:"ny"`
	NZ     int        `json:"nz"`
	DX     float64    `json:"dx_mm"`
	DY     float64    `json:"dy_mm"`
	ZEdges []float64  `json:"z_edges_mm"`
	Temps  []*float64 `json:"temperature_degC"`
}

func readCellsJSON(t *testing.T, path string) []plateCells {
	t.Helper()
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	require.True(t, json.Valid(data))
	var plates []plateCells
	require.NoError(t, json.Unmarshal(data, &plates))
	return plates
}

func TestCellsJSON(t *testing.T) {
	dir := t.TempDir()
	model := writeModel(t, dir, slab)
	cells := filepath.Join(dir, "cells.JSON") // the extension in any case
	_, msg, err := run(t, model, "--format", "json", "-o", filepath.Join(dir, "r.json"), "--cells", cells)
	require.NoError(t, err)
	assert.Contains(t, msg, "28 cells of 2 plates")
	plates := readCellsJSON(t, cells)
	require.Len(t, plates, 2)
	s, l := plates[0], plates[1]
	assert.Equal(t, "slab", s.Plate)
	assert.Equal(t, [3]int{4, 2, 3}, [3]int{s.NX, s.NY, s.NZ})
	assert.Equal(t, []float64{0, 0.5, 1, 3}, s.ZEdges)
	assert.Equal(t, 5.0, s.DX)
	require.Len(t, s.Temps, 4*2*3)
	// The heated corner (i = 0, j = 0) of the bottom layer is the
	// hottest cell of the slab.
	hot := *s.Temps[0]
	for c, v := range s.Temps {
		require.NotNil(t, v, c)
		assert.LessOrEqual(t, *v, hot, "cell %d", c)
		assert.Greater(t, *v, 20.0, "cell %d: heat comes in only", c)
	}
	// The lid has no heat of its own and joins nothing but ambient: in
	// equilibrium every cell is at the ambient 20 °C (zeroth law).
	assert.Equal(t, "lid", l.Plate)
	require.Len(t, l.Temps, 4)
	for _, v := range l.Temps {
		require.NotNil(t, v)
		assert.InDelta(t, 20.0, *v, 1e-9)
	}
}

// CSV and JSON carry the same temperatures in the same order.
func TestCellsFormatsAgree(t *testing.T) {
	dir := t.TempDir()
	model := writeModel(t, dir, slab)
	_, _, err := run(t, model, "--cells", filepath.Join(dir, "c.csv"))
	require.NoError(t, err)
	_, _, err = run(t, model, "--cells", filepath.Join(dir, "c.json"))
	require.NoError(t, err)
	f, err := os.Open(filepath.Join(dir, "c.csv"))
	require.NoError(t, err)
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	require.NoError(t, err)
	var fromJSON []string
	for _, p := range readCellsJSON(t, filepath.Join(dir, "c.json")) {
		for _, v := range p.Temps {
			fromJSON = append(fromJSON, p.Plate+" "+strconv.FormatFloat(*v, 'g', -1, 64))
		}
	}
	var fromCSV []string
	for _, r := range rows[1:] {
		fromCSV = append(fromCSV, r[0]+" "+r[7])
	}
	assert.Equal(t, fromJSON, fromCSV)
	assert.Len(t, fromCSV, 28)
}

func TestCellsErrors(t *testing.T) {
	dir := t.TempDir()
	model := writeModel(t, dir, slab)

	_, _, err := run(t, model, "--cells", filepath.Join(dir, "cells.txt"))
	assert.Equal(t, exit.BadInput, code(err))
	assert.ErrorContains(t, err, "cells.txt: cannot tell the format from the name (use a name ending in .csv or .json)")
	_, _, err = run(t, model, "--cells", filepath.Join(dir, "cells"))
	assert.ErrorContains(t, err, ".csv or .json")

	// The model itself, by its own name or another spelling.
	before, err := os.ReadFile(model)
	require.NoError(t, err)
	_, _, err = run(t, model, "--cells", filepath.Join(dir, ".", "m.yaml"))
	assert.Equal(t, exit.BadInput, code(err))
	assert.ErrorContains(t, err, "refusing to write over the input file")
	require.NoError(t, os.Symlink("m.yaml", filepath.Join(dir, "link.json")))
	_, _, err = run(t, model, "--cells", filepath.Join(dir, "link.json"))
	assert.ErrorContains(t, err, "refusing to write over the input file")
	after, err := os.ReadFile(model)
	require.NoError(t, err)
	assert.Equal(t, string(before), string(after))

	// The report and the cells in one file.
	_, _, err = run(t, model, "-f", "csv", "-o", filepath.Join(dir, "both.csv"), "--cells", filepath.Join(dir, "both.csv"))
	assert.Equal(t, exit.BadInput, code(err))
	assert.ErrorContains(t, err, "name the same file")

	// A model without plates: a usage error before anything is solved or
	// written.
	bare := filepath.Join(t.TempDir(), "bare.yaml")
	require.NoError(t, os.WriteFile(bare, []byte(noPlates), 0o644))
	cells := filepath.Join(dir, "bare.csv")
	report, _, err := run(t, bare, "--cells", cells)
	assert.Equal(t, exit.BadInput, code(err))
	assert.ErrorContains(t, err, "has no plates")
	assert.Empty(t, report)
	assert.NoFileExists(t, cells)

	// A folder that does not exist: the cells cannot be written.
	_, _, err = run(t, model, "--cells", filepath.Join(dir, "missing", "c.csv"))
	assert.Equal(t, exit.OutputFailed, code(err))
	assert.ErrorContains(t, err, "cannot write")
}

// A model over its limit still gets its cells, and exit status 1.
func TestCellsOverLimit(t *testing.T) {
	dir := t.TempDir()
	model := writeModel(t, dir, strings.Replace(slab, "faces:", "limit: 25 degC\n    faces:", 1))
	cells := filepath.Join(dir, "c.csv")
	_, _, err := run(t, model, "--cells", cells)
	if err != nil && code(err) != exit.LimitExceeded {
		t.Fatalf("unexpected error: %v", err)
	}
	assert.Equal(t, exit.LimitExceeded, code(err))
	assert.FileExists(t, cells)
}

// readTestdata returns a file of the repository's testdata folder.
func readTestdata(name string) string {
	data, err := os.ReadFile(filepath.Join("..", "..", "..", "..", "testdata", name))
	if err != nil {
		panic(err)
	}
	return string(data)
}
