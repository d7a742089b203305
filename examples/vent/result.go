package main

import (
	"fmt"
	"math"
	"sort"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"gonum.org/v1/gonum/integrate"
)

// Result is a vent with what follows from it.
type Result struct {
	V    *Vessel
	Run  Run
	Jets []flash.State // the jet at ambient pressure, one per point

	MassOut      float64 // ∫ṁ dt, kg
	EnthalpyOut  float64 // ∫ṁ h0 dt, J
	HeatIn       float64 // ∫Q dt, J
	JetSolidMass float64 // ∫ṁ x_solid,jet dt, kg: dry ice carried out
	PeakFlow     float64 // kg/s
	TMin         float64 // lowest temperature of the contents, K
	JetTMin      float64 // lowest temperature of the jet, K

	// TripleStart and TripleEnd bound the time the contents spend at
	// the triple point, s (−1 if they never reach it).
	TripleStart, TripleEnd float64
}

// Summarise computes the jets and the integrals of a run.
func Summarise(v *Vessel, r Run) (*Result, error) {
	res := &Result{V: v, Run: r, TMin: math.Inf(1), JetTMin: math.Inf(1), TripleStart: -1, TripleEnd: -1}
	noz := Nozzle{F: v.F, PBack: v.PAmb}
	for i, p := range r.Points {
		jet, err := noz.Jet(p.In)
		if err != nil {
			return nil, fmt.Errorf("jet at t = %.6g s: %w", p.Time, err)
		}
		res.Jets = append(res.Jets, jet)
		res.PeakFlow = math.Max(res.PeakFlow, p.MDot)
		res.TMin = math.Min(res.TMin, p.St.T)
		if p.MDot > 0 {
			res.JetTMin = math.Min(res.JetTMin, jet.T)
		}
		if p.St.Phase == flash.Triple {
			if res.TripleStart < 0 {
				res.TripleStart = p.Time
			}
			if i+1 < len(r.Points) {
				res.TripleEnd = r.Points[i+1].Time
			}
		}
	}
	pts := r.Points
	res.MassOut = Integral(pts, func(i int) float64 { return pts[i].MDot })
	res.EnthalpyOut = Integral(pts, func(i int) float64 { return pts[i].MDot * pts[i].In.H })
	res.HeatIn = Integral(pts, func(i int) float64 { return pts[i].Q })
	res.JetSolidMass = Integral(pts, func(i int) float64 { return pts[i].MDot * res.Jets[i].Solid })
	return res, nil
}

// Integral integrates y(i) over the times of the points by Simpson's
// rule for irregular spacing, piece by piece between the events (where
// the flows may jump or kink), the trapezoidal rule on pieces of two
// points.
func Integral(pts []Point, y func(i int) float64) float64 {
	sum := 0.0
	start := 0
	for i := 1; i < len(pts); i++ {
		if pts[i].Event == "" && i < len(pts)-1 {
			continue
		}
		// The event point lies just past the change, the point before
		// it just before: the piece ends there, and [i−1, i] is a tiny
		// step of its own.
		end := i
		if pts[i].Event != "" && i-1 > start {
			end = i - 1
		}
		sum += piece(pts, y, start, end)
		if end < i {
			sum += piece(pts, y, end, i)
		}
		start = i
	}
	return sum
}

func piece(pts []Point, y func(i int) float64, a, b int) float64 {
	n := b - a + 1
	if n < 2 {
		return 0
	}
	if n == 2 {
		return 0.5 * (y(a) + y(b)) * (pts[b].Time - pts[a].Time)
	}
	x := make([]float64, n)
	f := make([]float64, n)
	for i := range x {
		x[i] = pts[a+i].Time
		f[i] = y(a + i)
	}
	return integrate.Simpsons(x, f)
}

// Row is one row of the time table: the vessel and its jet.
type Row struct {
	P   Point
	Jet flash.State
}

// Table returns the rows of the time table: about n at even times,
// interpolated between the steps, and every event and the end.
func (res *Result) Table(n int) ([]Row, error) {
	pts := res.Run.Points
	tEnd := pts[len(pts)-1].Time
	step := kit.NiceStep(tEnd, n)
	return res.sample(kit.Steps(0, tEnd, step), func(i int) bool { return pts[i].Event != "" || i == len(pts)-1 })
}

// Dense returns the rows of every step and of n even times between them,
// for plotting.
func (res *Result) Dense(n int) ([]Row, error) {
	pts := res.Run.Points
	return res.sample(kit.LinSpace(0, pts[len(pts)-1].Time, n), func(int) bool { return true })
}

// sample returns the rows at the times (ascending), interpolated between
// the steps (cubic Hermite in mass and energy, of the integrator's
// order, then a DU flash), and at the steps that keep says, in order.
func (res *Result) sample(times []float64, keep func(i int) bool) ([]Row, error) {
	pts := res.Run.Points
	e := newEval(res.V)
	var rows []Row
	j := 0
	for _, t := range times {
		for j+1 < len(pts) && pts[j+1].Time <= t {
			j++
		}
		if j+1 >= len(pts) || t == pts[j].Time {
			if t == pts[j].Time && !keep(j) {
				rows = append(rows, Row{pts[j], res.Jets[j]})
			}
			continue
		}
		a, b := pts[j], pts[j+1]
		m, U := hermite(a, b, t)
		e.dry = b.Dry
		p, err := e.at(t, m, U)
		if err != nil {
			return nil, fmt.Errorf("state at t = %.6g s: %w", t, err)
		}
		jet, err := e.noz.Jet(p.In)
		if err != nil {
			return nil, fmt.Errorf("jet at t = %.6g s: %w", t, err)
		}
		rows = append(rows, Row{p, jet})
	}
	for i, p := range pts {
		if keep(i) {
			rows = append(rows, Row{p, res.Jets[i]})
		}
	}
	sort.SliceStable(rows, func(i, k int) bool { return rows[i].P.Time < rows[k].P.Time })
	return rows, nil
}

// hermite interpolates the mass and energy between two points at t by
// the cubic Hermite polynomial of their values and rates.
func hermite(a, b Point, t float64) (m, U float64) {
	h := b.Time - a.Time
	s := (t - a.Time) / h
	h00 := (1 + 2*s) * (1 - s) * (1 - s)
	h10 := s * (1 - s) * (1 - s)
	h01 := s * s * (3 - 2*s)
	h11 := s * s * (s - 1)
	m = h00*a.M + h10*h*a.DM + h01*b.M + h11*h*b.DM
	U = h00*a.U + h10*h*a.DU + h01*b.U + h11*h*b.DU
	return m, U
}
