package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// Draw is where the outflow leaves the vessel.
type Draw int

const (
	// DrawVapour takes the outflow from the top: the vapour of a
	// multiphase content.
	DrawVapour Draw = iota
	// DrawLiquid takes it through a dip tube from the bottom: the liquid
	// until the contents first run out of liquid, the vapour afterwards.
	// (Vapour expanding in the vessel may condense again; that mist is
	// taken to stay in the vessel, since drawing it as it forms would
	// hold the contents on the dew line. The solid of solid–vapour
	// contents does not flow: it settles and stays.)
	DrawLiquid
)

func (d Draw) String() string {
	if d == DrawLiquid {
		return "liquid (dip tube)"
	}
	return "vapour (from the top)"
}

// Vessel is a closed rigid vessel of our own emptied through an orifice
// to the atmosphere. All quantities in SI units.
type Vessel struct {
	F       *fluid.Fluid
	Volume  float64 // internal volume, m³
	Orifice float64 // orifice diameter, m
	Cd      float64 // discharge coefficient of the orifice
	PAmb    float64 // back pressure (atmosphere), Pa
	TAmb    float64 // ambient temperature, K
	HTC     float64 // wall heat-transfer coefficient, W/(m²·K); 0: adiabatic
	Wall    float64 // inner wall area, m²
	Draw    Draw
}

// Area returns the orifice's flow area in m².
func (v *Vessel) Area() float64 { return math.Pi / 4 * v.Orifice * v.Orifice }

// Point is the vessel at one instant.
type Point struct {
	Time float64     // s from the start of the vent
	M, U float64     // contents: mass in kg, internal energy in J
	St   flash.State // the contents (a DU flash)
	In   Stagnation  // the fluid drawn into the orifice
	Flow Flow        // the nozzle's flow
	MDot float64     // mass flow out, kg/s
	Q    float64     // heat flow through the wall into the contents, W
	// DM and DU are dm/dt in kg/s and dU/dt in W.
	DM, DU float64
	Event  string // why the point was recorded, if it ends a phase or the run
	Dry    bool   // the dip tube has run dry (DrawLiquid): vapour is drawn
}

// eval is the right-hand side of the vessel's balances, with the warm
// starts of its flashes.
type eval struct {
	v     *Vessel
	noz   Nozzle
	guess flash.State
	dry   bool // a dip tube has run out of liquid: it draws vapour
	n     int  // right-hand-side evaluations
	ps    int  // PS flashes in them
}

func newEval(v *Vessel) *eval {
	return &eval{v: v, noz: Nozzle{F: v.F, PBack: v.PAmb}}
}

// at evaluates the contents and flows at mass m and energy U.
func (e *eval) at(t, m, U float64) (Point, error) {
	e.n++
	v := e.v
	pt := Point{Time: t, M: m, U: U, Dry: e.dry}
	if !(m > 0) {
		return pt, fmt.Errorf("vessel empty (mass %g kg)", m)
	}
	var opt flash.Options
	if e.guess.T > 0 {
		opt.Guess = &e.guess
	}
	st, err := flash.DUWith(v.F, m/v.Volume, U/m, opt)
	if err != nil && opt.Guess != nil {
		// A warm start should never hurt, but near the critical point
		// one has failed to converge where a cold start succeeds.
		st, err = flash.DU(v.F, m/v.Volume, U/m)
	}
	if err != nil {
		return pt, fmt.Errorf("contents at %.10g kg/m3, %.10g J/kg: %w", m/v.Volume, U/m, err)
	}
	e.guess = st
	pt.St = st
	d := v.Draw
	if e.dry {
		d = DrawVapour
	}
	pt.In, err = drawn(st, d)
	if err != nil {
		return pt, err
	}
	pt.Q = v.HTC * v.Wall * (v.TAmb - st.T)
	if st.P > v.PAmb {
		fl, err := e.noz.Flux(pt.In)
		e.ps += fl.Evals
		if err != nil {
			return pt, err
		}
		pt.Flow = fl
		pt.MDot = v.Cd * v.Area() * fl.G
	}
	pt.DM = -pt.MDot
	pt.DU = -pt.MDot*pt.In.H + pt.Q
	return pt, nil
}

// drawn returns the fluid that enters the orifice from contents st.
func drawn(st flash.State, d Draw) (Stagnation, error) {
	if st.N <= 1 {
		if st.Phase == flash.Solid {
			return Stagnation{}, errors.New("the contents are all solid: nothing flows")
		}
		return Stagnation{P: st.P, H: st.H, S: st.S, Phase: st.Phase}, nil
	}
	want := flash.Vapor
	if d == DrawLiquid {
		want = flash.Liquid
	}
	var vap *flash.PhaseState
	for i := range st.Phases[:st.N] {
		ph := &st.Phases[i]
		if ph.Phase == want && ph.Fraction > 0 {
			return Stagnation{P: st.P, H: ph.H, S: ph.S, Phase: ph.Phase}, nil
		}
		if ph.Phase == flash.Vapor {
			vap = ph
		}
	}
	if vap == nil { // solid and liquid: the liquid flows
		for i := range st.Phases[:st.N] {
			if ph := &st.Phases[i]; ph.Phase == flash.Liquid {
				return Stagnation{P: st.P, H: ph.H, S: ph.S, Phase: ph.Phase}, nil
			}
		}
		return Stagnation{}, fmt.Errorf("no phase that flows in the %v contents", st.Phase)
	}
	return Stagnation{P: st.P, H: vap.H, S: vap.S, Phase: flash.Vapor}, nil
}

// hasLiquid reports whether st holds liquid.
func hasLiquid(st flash.State) bool {
	for _, ph := range st.Phases[:st.N] {
		if ph.Phase == flash.Liquid && ph.Fraction > 0 {
			return true
		}
	}
	return false
}

// Run is the result of a vent.
type Run struct {
	Points []Point // every accepted step, the events among them
	Reason string  // why the run ended
	Evals  int     // right-hand-side evaluations
	PS     int     // PS flashes of the nozzle
	Reject int     // rejected steps
}

// Settings control the integration.
type Settings struct {
	TEnd   float64 // latest end time, s
	PEnd   float64 // the run ends when the vessel pressure falls to PEnd, Pa
	RTol   float64 // relative tolerance per step
	MaxDt  float64 // largest step, s (0: no limit)
	OnStep func(Point)
}

// Integrate vents the vessel from the fill mass m0 in kg at temperature
// T0 in K: the mass and energy balances
//
//	dm/dt = −ṁ,   dU/dt = −ṁ h0 + Q,   ṁ = Cd·A·G,   Q = hA·(T_amb − T),
//
// with the contents a DU flash at (m/V, U/m) each evaluation, h0 the
// stagnation enthalpy of the drawn phase and G the nozzle's mass flux.
// The step is adapted by the embedded Bogacki–Shampine 3(2) pair, and
// each change of the contents' phase (into and out of the triple point,
// say) is located by bisection of the step, so that a point lies just
// past it, as is the end pressure.
func (v *Vessel) Integrate(m0, T0 float64, set Settings) (run Run, err error) {
	st0, err := flash.DT(v.F, m0/v.Volume, T0)
	if err != nil {
		return run, fmt.Errorf("initial contents: %w", err)
	}
	if st0.P <= set.PEnd {
		return run, fmt.Errorf("initial pressure %.6g Pa is not above the end pressure %.6g Pa", st0.P, set.PEnd)
	}
	e := newEval(v)
	defer func() { run.Evals, run.PS = e.n, e.ps }()
	p, err := e.at(0, m0, m0*st0.U)
	if err != nil {
		return run, err
	}
	run.Points = append(run.Points, p)
	if set.OnStep != nil {
		set.OnStep(p)
	}
	rtol := set.RTol
	if !(rtol > 0) {
		rtol = 1e-6
	}
	escale := [2]float64{rtol * m0, rtol * m0 * v.F.GasConstant() * v.F.Critical().T}
	h := 1e-3 * m0 / math.Max(p.MDot, 1e-12)
	if set.MaxDt > 0 {
		h = math.Min(h, set.MaxDt)
	}
	// step takes a Bogacki–Shampine step of length h from p; it returns
	// the new point and the scaled error estimate.
	step := func(p Point, h float64) (Point, float64, error) {
		t, m, U := p.Time, p.M, p.U
		k1 := [2]float64{p.DM, p.DU}
		p2, err := e.at(t+h/2, m+h/2*k1[0], U+h/2*k1[1])
		if err != nil {
			return Point{}, 0, err
		}
		k2 := [2]float64{p2.DM, p2.DU}
		p3, err := e.at(t+3*h/4, m+3*h/4*k2[0], U+3*h/4*k2[1])
		if err != nil {
			return Point{}, 0, err
		}
		k3 := [2]float64{p3.DM, p3.DU}
		var y [2]float64
		for i := range y {
			y[i] = [2]float64{m, U}[i] + h*(2*k1[i]+3*k2[i]+4*k3[i])/9
		}
		q, err := e.at(t+h, y[0], y[1])
		if err != nil {
			return Point{}, 0, err
		}
		k4 := [2]float64{q.DM, q.DU}
		errn := 0.0
		for i := range y {
			d := h * (-5*k1[i]/72 + k2[i]/12 + k3[i]/9 - k4[i]/8)
			sc := escale[i] + rtol*math.Abs(y[i])
			errn = math.Max(errn, math.Abs(d)/sc)
		}
		return q, errn, nil
	}
	changed := func(a, b Point) bool {
		return a.St.Phase != b.St.Phase || b.St.P <= set.PEnd
	}
	const maxSteps = 50000
	for n := 0; ; n++ {
		if n == maxSteps {
			run.Reason = "too many steps"
			return run, fmt.Errorf("vent: %d steps without reaching the end (t = %.6g s)", maxSteps, p.Time)
		}
		last := false
		if p.Time+h >= set.TEnd {
			h, last = set.TEnd-p.Time, true
		}
		q, errn, err := step(p, h)
		if err != nil || errn > 1 {
			run.Reject++
			if err != nil && h < 1e-9*math.Max(1, p.Time) {
				return run, fmt.Errorf("vent at t = %.6g s: %w", p.Time, err)
			}
			if err != nil {
				h /= 4
			} else {
				h *= math.Max(0.2, 0.9*math.Pow(errn, -1.0/3))
			}
			continue
		}
		if changed(p, q) {
			// Locate the first change by bisection of the step.
			// The point just before it ends the smooth piece; the one
			// just past it starts the next.
			lo, hi := 0.0, h
			qh := q
			var ql Point
			for hi-lo > 1e-9*math.Max(1, p.Time)+1e-7 {
				mid := 0.5 * (lo + hi)
				qm, _, err := step(p, mid)
				if err != nil {
					return run, fmt.Errorf("vent at t = %.6g s: locating a phase change: %w", p.Time, err)
				}
				if changed(p, qm) {
					hi, qh = mid, qm
				} else {
					lo, ql = mid, qm
				}
			}
			if lo > 0 {
				run.Points = append(run.Points, ql)
				if set.OnStep != nil {
					set.OnStep(ql)
				}
			}
			q, last = qh, false
			if q.St.P <= set.PEnd {
				q.Event = "end pressure"
				run.Reason = "the vessel pressure fell to the end pressure"
				last = true
			} else {
				q.Event = p.St.Phase.String() + " -> " + q.St.Phase.String()
				if v.Draw == DrawLiquid && !e.dry && p.In.Phase == flash.Liquid && !hasLiquid(q.St) {
					// The dip tube runs dry: re-evaluate the point
					// with the vapour draw-off.
					e.dry = true
					tq := q.Time
					if q, err = e.at(tq, q.M, q.U); err != nil {
						return run, err
					}
					q.Event = p.St.Phase.String() + " -> " + q.St.Phase.String() + ", dip tube dry"
				}
			}
		} else if last {
			run.Reason = "end time reached"
		}
		run.Points = append(run.Points, q)
		if set.OnStep != nil {
			set.OnStep(q)
		}
		if q.St.Phase == flash.Solid {
			run.Reason = "the contents are all solid"
			return run, nil
		}
		if last {
			return run, nil
		}
		dt := q.Time - p.Time
		fac := 5.0
		if errn > 0 {
			fac = math.Min(5, 0.9*math.Pow(errn, -1.0/3))
		}
		h = math.Max(dt, h) * fac
		if q.Event != "" {
			h = math.Max(dt, 1e-3*h) // restart gently past an event
		}
		if set.MaxDt > 0 {
			h = math.Min(h, set.MaxDt)
		}
		p = q
	}
}
