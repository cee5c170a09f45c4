package viz

import (
	"math"

	"github.com/heatgraph/heatgraph/network"
)

// testBoard is an invented board of w × l mm meshed at nx × ny × nz cells,
// 1.6 mm thick, with a regulator and a processor on its top face. Its
// temperatures are a made-up field, not a solution: a mild slope from the
// cool edge at x = 0 and a bump under the processor, hottest at the centre
// of the processor's footprint and in the top layer. The summary fields
// are computed from the cells as the network will.
func testBoard(wmm, lmm float64, nx, ny, nz int) network.PlateResult {
	p := network.PlateResult{
		ID: "main-board", Line: 12, NX: nx, NY: ny, NZ: nz,
		Width: wmm / 1e3, Length: lmm / 1e3, Thickness: 1.6e-3,
		Limit: 105 + kelvin, HasLimit: true,
		Joins: []network.PlateJoinResult{
			{Name: "top to box-air (convection)", Face: "top", Node: "box-air", Kind: "convection", Heat: 5.62},
			{Name: "bottom to box-air (convection)", Face: "bottom", Node: "box-air", Kind: "convection", Heat: 3.91},
			{Name: "x_min to chassis (contact)", Face: "x_min", Node: "chassis", Kind: "contact", Heat: 4.47},
		},
		Parts: []network.PlateFootprint{
			{Name: "cpu", Face: "top", X0: 0.055, Y0: 0.030, X1: 0.075, Y1: 0.050, Power: 11},
			{Name: "vreg", Face: "top", X0: 0.015, Y0: 0.055, X1: 0.025, Y1: 0.065, Power: 2.5},
			{Name: "heater pad", Face: "bottom", X0: 0.080, Y0: 0.005, X1: 0.095, Y1: 0.020, Power: 0.5},
		},
	}
	p.ZEdges = make([]float64, nz+1)
	for k := range p.ZEdges {
		p.ZEdges[k] = p.Thickness * float64(k) / float64(nz)
	}
	p.T = make([]float64, nx*ny*nz)
	dx, dy := p.Width/float64(nx), p.Length/float64(ny)
	sumV, sum := 0.0, 0.0
	p.Hottest, p.Coolest = math.Inf(-1), math.Inf(1)
	for k := range nz {
		for j := range ny {
			for i := range nx {
				x, y := (float64(i)+0.5)*dx, (float64(j)+0.5)*dy
				r2 := (x-0.065)*(x-0.065) + (y-0.040)*(y-0.040)
				t := 40 + kelvin + 150*x + 58*math.Exp(-r2/(2*0.008*0.008)) + 0.5*float64(k)
				t += 9 * math.Exp(-((x-0.020)*(x-0.020)+(y-0.060)*(y-0.060))/(2*0.004*0.004))
				p.T[i+nx*(j+ny*k)] = t
				z0, z1 := zSpan(&p, k)
				vol := (z1 - z0)
				sumV += vol
				sum += vol * t
				if t > p.Hottest {
					p.Hottest = t
					p.HotX, p.HotY, p.HotZ = x, y, zCentre(&p, k)
				}
				p.Coolest = math.Min(p.Coolest, t)
			}
		}
	}
	p.Mean = sum / sumV
	p.Margin = p.Limit - p.Hottest
	switch {
	case p.Margin < 0:
		p.Status = network.Over
	case p.Margin < 5:
		p.Status = network.Tight
	default:
		p.Status = network.OK
	}
	return p
}
