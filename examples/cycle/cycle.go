package main

import (
	"errors"
	"fmt"
	"math"

	"github.com/tripoint-thermo/tripoint/examples/internal/kit"
	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// Inputs are the design conditions of a single-stage vapour-compression
// cycle, in SI units.
type Inputs struct {
	TEvap     float64 // evaporating (saturation) temperature, K
	TOut      float64 // condenser or gas-cooler outlet temperature, K
	Superheat float64 // suction superheat above TEvap, K
	Subcool   float64 // subcooling below the condensing temperature, K (subcritical only)
	Eta       float64 // compressor isentropic efficiency, 0 < Eta ≤ 1
	PHigh     float64 // fixed high-side pressure, Pa; 0: the optimum (transcritical) or the condensing pressure
	PMax      float64 // highest high-side pressure of the search, Pa
}

// Cycle is a computed cycle. Points: 1 compressor suction (evaporator
// outlet), 2 compressor discharge, 3 condenser or gas-cooler outlet,
// 4 evaporator inlet (after the expansion valve); 2s is the isentropic
// discharge.
type Cycle struct {
	Fluid          *fluid.Fluid
	In             Inputs
	Transcritical  bool
	P1, P2, P3, P4 flash.State
	P2s            flash.State
	PLow, PHigh    float64     // Pa
	QEvap          float64     // refrigerating effect h1 − h4, J/kg
	W              float64     // compressor work h2 − h1, J/kg
	QRej           float64     // heat rejected h2 − h3, J/kg
	COP            float64     // QEvap/W
	Carnot         float64     // T1/(T3 − T1): the second-law bound for heat taken in at ≤ T1 and given off at ≥ T3
	VCC            float64     // volumetric cooling capacity ρ1·QEvap, J/m³
	Scan           []ScanPoint // COP against high-side pressure (transcritical search)
}

// ScanPoint is one point of the high-side pressure search.
type ScanPoint struct{ P, COP float64 }

// PressureRatio is p_high/p_low.
func (c Cycle) PressureRatio() float64 { return c.PHigh / c.PLow }

// errCycle wraps a failure with the fluid and the step.
func errCycle(f *fluid.Fluid, step string, err error) error {
	return fmt.Errorf("%s: %s: %w", f.Name(), step, err)
}

// Transcritical reports whether the cycle of f rejects heat above its
// critical point: when the condensing temperature TOut + Subcool is
// within 1 K of the critical temperature or above it, or a high-side
// pressure above pc is given.
func Transcritical(f *fluid.Fluid, in Inputs) bool {
	if in.PHigh > 0 {
		return in.PHigh >= f.Critical().P
	}
	return in.TOut+in.Subcool >= f.Critical().T-1
}

// Solve computes the cycle of f: at the given high-side pressure, at the
// condensing pressure (subcritical), or at the high-side pressure that
// maximises the COP (transcritical), searched up to in.PMax. prog may be
// nil.
func Solve(f *fluid.Fluid, in Inputs, prog *kit.Progress) (Cycle, error) {
	if in.PHigh > 0 || !Transcritical(f, in) {
		p := in.PHigh
		if p == 0 {
			sat, err := flash.TQ(f, in.TOut+in.Subcool, 0)
			if err != nil {
				return Cycle{}, errCycle(f, "condensing pressure", err)
			}
			p = sat.P
		}
		return At(f, in, p)
	}
	return optimum(f, in, prog)
}

// At computes the cycle of f with the high-side pressure pHigh in Pa.
func At(f *fluid.Fluid, in Inputs, pHigh float64) (Cycle, error) {
	c := Cycle{Fluid: f, In: in, PHigh: pHigh, Transcritical: Transcritical(f, Inputs{PHigh: pHigh})}
	ev, err := flash.TQ(f, in.TEvap, 1)
	if err != nil {
		return c, errCycle(f, "evaporating pressure", err)
	}
	c.PLow = ev.P
	if pHigh <= c.PLow {
		return c, errCycle(f, "high-side pressure", fmt.Errorf("%.4g Pa is not above the evaporating pressure %.4g Pa", pHigh, c.PLow))
	}
	if in.Superheat > 0 {
		c.P1, err = flash.PT(f, c.PLow, in.TEvap+in.Superheat)
	} else {
		c.P1 = ev
	}
	if err != nil {
		return c, errCycle(f, "suction state", err)
	}
	c.P2s, err = flash.PS(f, pHigh, c.P1.S)
	if err != nil {
		return c, errCycle(f, "isentropic discharge", err)
	}
	h2 := c.P1.H + (c.P2s.H-c.P1.H)/in.Eta
	c.P2, err = flash.PH(f, pHigh, h2)
	if err != nil {
		return c, errCycle(f, "discharge state", err)
	}
	if !c.Transcritical && in.Subcool == 0 && in.PHigh == 0 {
		c.P3, err = flash.PQ(f, pHigh, 0)
	} else {
		c.P3, err = flash.PT(f, pHigh, in.TOut)
	}
	if err != nil {
		return c, errCycle(f, "condenser or gas-cooler outlet", err)
	}
	c.P4, err = flash.PH(f, c.PLow, c.P3.H)
	if err != nil {
		return c, errCycle(f, "evaporator inlet", err)
	}
	c.QEvap = c.P1.H - c.P4.H
	c.W = c.P2.H - c.P1.H
	c.QRej = c.P2.H - c.P3.H
	if !(c.QEvap > 0) {
		return c, errCycle(f, "refrigerating effect", fmt.Errorf("h1 - h4 = %.4g J/kg: no cooling at these conditions", c.QEvap))
	}
	c.COP = c.QEvap / c.W
	c.Carnot = c.P1.T / (c.P3.T - c.P1.T)
	if c.P3.T <= c.P1.T {
		c.Carnot = math.Inf(1)
	}
	c.VCC = c.P1.Rho * c.QEvap
	return c, nil
}

// optimum searches the high-side pressure of highest COP: a scan of 48
// pressures from just above the saturation pressure at TOut (or 0.8 pc
// above Tc) to in.PMax, then golden-section refinement around the best
// scan point to 1e-6 relative.
func optimum(f *fluid.Fluid, in Inputs, prog *kit.Progress) (Cycle, error) {
	pc := f.Critical().P
	lo := 0.8 * pc
	if in.TOut < f.Critical().T {
		if s, err := flash.TQ(f, in.TOut, 0); err == nil {
			lo = math.Max(lo, 1.01*s.P)
		}
	}
	hi := in.PMax
	if !(hi > lo) {
		return Cycle{}, errCycle(f, "high-side pressure search", fmt.Errorf("the highest pressure %.4g bar is not above the lowest %.4g bar", hi/1e5, lo/1e5))
	}
	const n = 48
	var scan []ScanPoint
	best := -1
	for i := range n {
		prog.Step("searching the high-side pressure of "+f.Name(), i+1, n)
		p := lo + (hi-lo)*float64(i)/float64(n-1)
		c, err := At(f, in, p)
		if err != nil {
			continue
		}
		scan = append(scan, ScanPoint{p, c.COP})
		if best < 0 || c.COP > scan[best].COP {
			best = len(scan) - 1
		}
	}
	if best < 0 {
		return Cycle{}, errCycle(f, "high-side pressure search", errors.New("no cycle could be computed between these pressures"))
	}
	a, b := lo, hi
	if best > 0 {
		a = scan[best-1].P
	}
	if best < len(scan)-1 {
		b = scan[best+1].P
	}
	cop := func(p float64) float64 {
		c, err := At(f, in, p)
		if err != nil {
			return math.Inf(-1)
		}
		return c.COP
	}
	g := (math.Sqrt(5) - 1) / 2
	x1, x2 := b-g*(b-a), a+g*(b-a)
	f1, f2 := cop(x1), cop(x2)
	for b-a > 1e-6*b {
		if f1 >= f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - g*(b-a)
			f1 = cop(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + g*(b-a)
			f2 = cop(x2)
		}
	}
	c, err := At(f, in, 0.5*(a+b))
	if err != nil {
		return c, err
	}
	c.Scan = scan
	return c, nil
}
