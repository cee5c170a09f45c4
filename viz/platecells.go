package viz

import (
	"bufio"
	"bytes"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"github.com/heatgraph/heatgraph/network"
)

// PlateCellsHeader is the header row of WritePlateCells as CSV: one row a
// cell, the centre of the cell in mm from the plate's corner at x = 0,
// y = 0 of its bottom face.
var PlateCellsHeader = []string{"plate", "i", "j", "k", "x_mm", "y_mm", "z_mm", "temperature_degC"}

// Cell formats of WritePlateCells.
const (
	CellsCSV  = "csv"
	CellsJSON = "json"
)

// WritePlateCells writes the temperature of every cell of every meshed
// plate of a solution, as CSV (one row a cell, PlateCellsHeader) or as
// compact JSON: an array with one object a plate,
//
//	[{"plate":"board","nx":50,"ny":40,"nz":2,"dx_mm":2,"dy_mm":2,
//	  "z_edges_mm":[0,0.8,1.6],"temperature_degC":[41.2,...]}]
//
// where the temperature of cell (i, j, k) is at index i + nx·(j + ny·k).
// Numbers are written in the shortest form that reads back to the same
// float64. A temperature that is not finite is null in JSON and an empty
// cell in CSV (NonFinite counts them). The cells are streamed: memory does
// not grow with their number.
func WritePlateCells(w io.Writer, sol *network.Solution, format string) error {
	for i := range sol.Plates {
		if err := checkPlate(&sol.Plates[i]); err != nil {
			return err
		}
	}
	bw := bufio.NewWriterSize(w, 64<<10)
	var err error
	switch format {
	case CellsCSV:
		err = writeCellsCSV(bw, sol.Plates)
	case CellsJSON:
		err = writeCellsJSON(bw, sol.Plates)
	default:
		return fmt.Errorf("unknown cell format %q (use %s or %s)", format, CellsCSV, CellsJSON)
	}
	if err != nil {
		return err
	}
	return bw.Flush()
}

// appendNum appends x in the shortest form that reads back exactly, or
// null (JSON) / nothing (CSV) when it is not finite.
func appendNum(b []byte, x float64, null string) []byte {
	if !finite(x) {
		return append(b, null...)
	}
	if x == 0 {
		x = 0 // no "-0"
	}
	return strconv.AppendFloat(b, x, 'g', -1, 64)
}

// mm rounds a length in millimetres to 1e-9 mm, far below any cell, so
// that the round-off of the arithmetic that found it does not show (0.3,
// not 0.30000000000000004).
func mm(v float64) float64 { return math.Round(v*1e9) / 1e9 }

// csvField quotes a field as RFC 4180 asks when it holds a comma, a quote,
// a line break or leading space.
func csvField(s string) string {
	if s == "" || !strings.ContainsAny(s, ",\"\r\n") && s[0] != ' ' && s[0] != '\t' {
		return s
	}
	return `"` + strings.ReplaceAll(s, `"`, `""`) + `"`
}

func writeCellsCSV(bw *bufio.Writer, plates []network.PlateResult) error {
	bw.WriteString(strings.Join(PlateCellsHeader, ",") + "\n")
	b := make([]byte, 0, 256)
	for pi := range plates {
		p := &plates[pi]
		id := csvField(p.ID)
		dx, dy := 1e3*p.Width/float64(p.NX), 1e3*p.Length/float64(p.NY)
		// The text of each column's "i,x_mm" once, at xs[xo[i]:xo[i+1]]:
		// rows differ only in j, k and the temperature.
		xo := make([]int, p.NX+1)
		xs := make([]byte, 0, 40*p.NX) // an int, a zero byte and a float: at most 40 bytes
		for i := 0; i < p.NX; i++ {
			xs = strconv.AppendInt(xs, int64(i), 10)
			xs = append(xs, 0) // stands for j, k
			xs = appendNum(xs, mm((float64(i)+0.5)*dx), "")
			xo[i+1] = len(xs)
		}
		jk := make([]byte, 0, 80)
		c := 0
		for k := 0; k < p.NZ; k++ {
			z := mm(1e3 * zCentre(p, k))
			for j := 0; j < p.NY; j++ {
				jk = append(jk[:0], ',')
				jk = strconv.AppendInt(jk, int64(j), 10)
				jk = append(jk, ',')
				jk = strconv.AppendInt(jk, int64(k), 10)
				jk = append(jk, ',')
				yz := len(jk)
				jk = appendNum(jk, mm((float64(j)+0.5)*dy), "")
				jk = append(jk, ',')
				jk = appendNum(jk, z, "")
				for i := 0; i < p.NX; i++ {
					col := xs[xo[i]:xo[i+1]]
					cut := bytes.IndexByte(col, 0)
					b = append(b[:0], id...)
					b = append(b, ',')
					b = append(b, col[:cut]...) // i
					b = append(b, jk[:yz]...)   // ,j,k,
					b = append(b, col[cut+1:]...)
					b = append(b, jk[yz-1:]...) // ,y,z
					b = append(b, ',')
					b = appendNum(b, celsius(p.T[c]), "")
					b = append(b, '\n')
					c++
					if _, err := bw.Write(b); err != nil {
						return err
					}
				}
			}
		}
	}
	return nil
}

func writeCellsJSON(bw *bufio.Writer, plates []network.PlateResult) error {
	b := make([]byte, 0, 64)
	bw.WriteByte('[')
	for pi := range plates {
		p := &plates[pi]
		if pi > 0 {
			bw.WriteByte(',')
		}
		id, err := json.Marshal(p.ID)
		if err != nil {
			return err
		}
		bw.WriteString(`{"plate":`)
		bw.Write(id)
		fmt.Fprintf(bw, `,"nx":%d,"ny":%d,"nz":%d,"dx_mm":`, p.NX, p.NY, p.NZ)
		bw.Write(appendNum(b[:0], mm(1e3*p.Width/float64(p.NX)), "null"))
		bw.WriteString(`,"dy_mm":`)
		bw.Write(appendNum(b[:0], mm(1e3*p.Length/float64(p.NY)), "null"))
		bw.WriteString(`,"z_edges_mm":[`)
		for k := 0; k <= p.NZ; k++ {
			if k > 0 {
				bw.WriteByte(',')
			}
			z0, z1 := zSpan(p, min(k, p.NZ-1))
			z := z0
			if k == p.NZ {
				z = z1
			}
			bw.Write(appendNum(b[:0], mm(1e3*z), "null"))
		}
		bw.WriteString(`],"temperature_degC":[`)
		for c, t := range p.T {
			b = b[:0]
			if c > 0 {
				b = append(b, ',')
			}
			if _, err := bw.Write(appendNum(b, celsius(t), "null")); err != nil {
				return err
			}
		}
		bw.WriteString("]}")
	}
	_, err := bw.WriteString("]\n")
	return err
}
