package graphcmd

import (
	"bytes"
	"encoding/xml"
	"errors"
	"image/png"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/exit"
	"github.com/heatgraph/heatgraph/cmd/heatgraph/internal/iostreams"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// cameraBoard is the example with two plates, board and spreader, each one
// cell thick.
var cameraBoard = filepath.Join("..", "..", "..", "..", "examples", "camera-board.yaml")

// slab is testdata/slab-and-lid.yaml: a plate three cells thick heated in
// one corner of its bottom face, and a copper lid one cell thick.
var slab = readTestdata("slab-and-lid.yaml")

// plateGraph runs "heatgraph graph" and returns the file written to out
// (nil when there is none), standard error and the error.
func plateGraph(t *testing.T, out string, args ...string) ([]byte, string, error) {
	t.Helper()
	ios, _, _, errOut := iostreams.Test()
	cmd := NewCmd(ios, nil)
	cmd.SetArgs(args)
	cmd.SilenceUsage, cmd.SilenceErrors = true, true
	err := cmd.Execute()
	data, rerr := os.ReadFile(out)
	if rerr != nil {
		data = nil
	}
	return data, errOut.String(), err
}

func slabModel(t *testing.T) (model, dir string) {
	t.Helper()
	dir = t.TempDir()
	model = filepath.Join(dir, "slab.yaml")
	require.NoError(t, os.WriteFile(model, []byte(slab), 0o644))
	return model, dir
}

// checkSVG reads an SVG document to its end as XML and returns its text.
func checkSVG(t *testing.T, data []byte) string {
	t.Helper()
	require.NotEmpty(t, data)
	d := xml.NewDecoder(bytes.NewReader(data))
	root := ""
	var text bytes.Buffer
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		require.NoError(t, err)
		switch v := tok.(type) {
		case xml.StartElement:
			if root == "" {
				root = v.Name.Local
				assert.Equal(t, "http://www.w3.org/2000/svg", v.Name.Space)
			}
		case xml.CharData:
			text.Write(v)
			text.WriteByte('\n')
		}
	}
	assert.Equal(t, "svg", root)
	return text.String()
}

func code(err error) int {
	var ee *exit.Error
	if errors.As(err, &ee) {
		return ee.Code
	}
	return -1
}

func TestPlateHeatMapSVG(t *testing.T) {
	out := filepath.Join(t.TempDir(), "map.svg")
	data, msg, err := plateGraph(t, out, cameraBoard, "--plate", "board", "-o", out)
	require.NoError(t, err)
	text := checkSVG(t, data)
	assert.Contains(t, text, "heat map of plate board")
	assert.Contains(t, text, "top layer")
	for _, part := range []string{"isp", "ddr", "emmc", "pmic", "sensor"} {
		assert.Contains(t, text, part, "the parts on the board are named")
	}
	assert.NotContains(t, text, "spreader", "one plate only")
	assert.Regexp(t, `^wrote .*map\.svg; plate board, top layer drawn; its hottest cell [0-9.]+ °C at \([0-9.]+, [0-9.]+\) mm; all 7 limits hold`, msg)
}

func TestPlateHeatMapPNG(t *testing.T) {
	out := filepath.Join(t.TempDir(), "map.png")
	data, msg, err := plateGraph(t, out, cameraBoard, "--plate", "spreader", "-o", out)
	require.NoError(t, err)
	img, err := png.Decode(bytes.NewReader(data))
	require.NoError(t, err)
	assert.Equal(t, 900, img.Bounds().Dx())
	assert.Equal(t, 640, img.Bounds().Dy())
	assert.Contains(t, msg, "plate spreader, top layer drawn")
}

// The layer drawn follows --layer and --through; a plate over its limit
// is drawn and the exit status says so.
func TestPlateHeatMapViews(t *testing.T) {
	model, dir := slabModel(t)
	out := filepath.Join(dir, "s.svg")
	views := map[string]string{}
	for _, c := range []struct {
		args  []string
		words string // in the success line
		view  string // in the picture
	}{
		{nil, "top layer drawn", "top layer (k = 2"},
		{[]string{"--layer", "0"}, "bottom layer drawn", "bottom layer (k = 0"},
		{[]string{"--layer", "1"}, "layer 1 drawn", "layer k = 1"},
		{[]string{"--through", "hottest"}, "hottest of each column drawn", "hottest cell through the thickness"},
	} {
		data, msg, err := plateGraph(t, out, append([]string{model, "--plate", "slab", "-o", out}, c.args...)...)
		require.NoError(t, err, c.args)
		text := checkSVG(t, data)
		assert.Contains(t, msg, c.words, c.args)
		assert.Contains(t, text, c.view, c.args)
		// The slab is three cells thick: the position has a height.
		assert.Contains(t, msg, "at (2.5, 2.5, 0.25) mm", c.args)
		views[c.words] = string(data)
	}
	assert.NotEqual(t, views["top layer drawn"], views["bottom layer drawn"])

	over := filepath.Join(dir, "over.yaml")
	require.NoError(t, os.WriteFile(over, []byte(strings.Replace(slab, "    faces:", "    limit: 21 degC\n    faces:", 1)), 0o644))
	require.NoError(t, os.Remove(out))
	data, msg, err := plateGraph(t, out, over, "--plate", "lid", "-o", out)
	assert.Equal(t, exit.LimitExceeded, code(err))
	checkSVG(t, data)
	assert.Contains(t, msg, "OVER LIMIT: slab")
}

func TestPlateHeatMapErrors(t *testing.T) {
	model, dir := slabModel(t)
	bare := filepath.Join(dir, "bare.yaml")
	require.NoError(t, os.WriteFile(bare, []byte(grouped), 0o644))
	for _, c := range []struct {
		model, out string
		args       []string
		want       string
	}{
		{cameraBoard, "m.svg", []string{"--plate", "bord"}, `--plate "bord": no plate has this id (did you mean "board"?) (plates: board, spreader)`},
		{cameraBoard, "m.svg", []string{"--plate", "heatsink"}, `--plate "heatsink": no plate has this id (plates: board, spreader)`},
		{bare, "m.svg", []string{"--plate", "board"}, "has no plates to draw"},
		{model, "m.dot", []string{"--plate", "slab"}, "must end in .svg or .png"},
		{model, "m.gv", []string{"--plate", "slab"}, "must end in .svg or .png"},
		{model, "m.svg", []string{"--layer", "1"}, "name the plate with --plate ID"},
		{model, "m.svg", []string{"--through", "hottest"}, "name the plate with --plate ID"},
		{model, "m.svg", []string{"--plate", "slab", "--layer", "3"}, `--layer 3: plate "slab" has layers 0 (bottom) to 2 (top)`},
		{model, "m.svg", []string{"--plate", "slab", "--layer", "-1"}, "layers count from 0"},
		{model, "m.svg", []string{"--plate", "lid", "--layer", "1"}, `plate "lid" is one cell thick`},
		{model, "m.svg", []string{"--plate", "slab", "--layer", "0", "--through", "hottest"}, "give one of them"},
		{model, "m.svg", []string{"--plate", "slab", "--through", "coolest"}, `--through "coolest" is not a choice`},
		{model, "m.svg", []string{"--plate", "slab", "--source", "x"}, "--source is for the heat-path diagram"},
		{model, "m.svg", []string{"--plate", "slab", "--colour", "temperature"}, "--colour temperature is for the heat-path diagram"},
		{model, "", []string{"--plate", "slab"}, "graph --plate needs an output file: -o FILE with .svg or .png"},
	} {
		out := ""
		args := append([]string{c.model}, c.args...)
		if c.out != "" {
			out = filepath.Join(dir, c.out)
			args = append(args, "-o", out)
		}
		data, _, err := plateGraph(t, out, args...)
		assert.Equal(t, exit.BadInput, code(err), c.args)
		assert.ErrorContains(t, err, c.want, c.args)
		assert.Nil(t, data, "nothing is written: %v", c.args)
	}
	// The model cannot be its own heat map.
	before, err := os.ReadFile(model)
	require.NoError(t, err)
	link := filepath.Join(dir, "link.svg")
	require.NoError(t, os.Symlink("slab.yaml", link))
	_, _, err = plateGraph(t, link, model, "--plate", "slab", "-o", link)
	assert.Equal(t, exit.BadInput, code(err))
	assert.ErrorContains(t, err, "refusing to write over the input file")
	after, err := os.ReadFile(model)
	require.NoError(t, err)
	assert.Equal(t, string(before), string(after))
}

// --layer is told apart from its default: 0 is the bottom layer, not "the
// top layer".
func TestPlateFlagsToOptions(t *testing.T) {
	for _, c := range []struct {
		args     []string
		layer    int
		layerSet bool
		through  string
	}{
		{[]string{"m.yaml", "--plate", "board", "-o", "b.svg"}, 0, false, ""},
		{[]string{"m.yaml", "--plate", "board", "-o", "b.svg", "--layer", "0"}, 0, true, ""},
		{[]string{"m.yaml", "--plate", "board", "-o", "b.svg", "--layer", "2"}, 2, true, ""},
		{[]string{"m.yaml", "--plate", "board", "-o", "b.svg", "--through", "hottest"}, 0, false, "hottest"},
	} {
		ios, _, _, _ := iostreams.Test()
		var got *Options
		cmd := NewCmd(ios, func(o *Options) error { got = o; return nil })
		cmd.SetArgs(c.args)
		require.NoError(t, cmd.Execute())
		assert.Equal(t, "board", got.Plate)
		assert.Equal(t, c.layer, got.Layer, c.args)
		assert.Equal(t, c.layerSet, got.LayerSet, c.args)
		assert.Equal(t, c.through, got.Through, c.args)
	}
}

// readTestdata returns a file of the repository's testdata folder.
func readTestdata(name string) string {
	data, err := os.ReadFile(filepath.Join("..", "..", "..", "..", "testdata", name))
	if err != nil {
		panic(err)
	}
	return string(data)
}
