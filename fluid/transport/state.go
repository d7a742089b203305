package transport

import (
	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// PhaseCoefficients are the transport coefficients of one fluid phase of
// a flash state.
type PhaseCoefficients struct {
	Phase    flash.Phase // Liquid, Vapor or Supercritical
	Fraction float64     // mass fraction of the phase in the state
	Rho      float64     // density of the phase, kg/m³
	Coefficients
}

// StateCoefficients are the transport coefficients of the fluid phases of
// a flash state: Phases[:N], in the state's order (liquid before vapour).
// Solid phases are left out, so N counts only the fluid ones.
type StateCoefficients struct {
	N      int
	Phases [3]PhaseCoefficients
}

// Of returns the viscosity and thermal conductivity of each fluid phase
// of st, a state of fluid f returned by package flash, at the state's
// temperature and the phase's density (see At). The solid phases of a
// state in a solid region are left out of the result.
//
// Special cases are:
//
//	st with no fluid phase (Phase Solid): error wrapping fluid.ErrUndefined
//	st.N outside 1..3, or a phase of unknown kind: fluid.ErrInvalidInput
//	f without a viscosity or a conductivity correlation: fluid.ErrUndefined
//	  (use Viscosity or Conductivity with st.T and the phase densities)
//	a phase outside a correlation's range: the error of At for that
//	  phase (its message gives the phase's density)
//
// Of allocates nothing unless it returns an error.
func Of(f *fluid.Fluid, st flash.State) (StateCoefficients, error) {
	const op = "transport.Of"
	var r StateCoefficients
	if st.N < 1 || st.N > len(st.Phases) {
		return r, fluid.NewError(op, fluid.ErrInvalidInput, "the state has "+fmtG(float64(st.N))+
			" phases; a flash state has 1 to 3", fluid.Input{Name: "T", Value: st.T, Unit: "K"})
	}
	for i := range st.N {
		ph := &st.Phases[i]
		switch ph.Phase {
		case flash.Solid:
			continue
		case flash.Liquid, flash.Vapor, flash.Supercritical:
		default:
			return StateCoefficients{}, fluid.NewError(op, fluid.ErrInvalidInput,
				"Phases["+fmtG(float64(i))+"] is "+ph.Phase.String()+
					"; want Liquid, Vapor, Supercritical or Solid", fluid.Input{Name: "T", Value: st.T, Unit: "K"})
		}
		c, err := eval(op, f, st.T, ph.Rho, wantViscosity|wantConductivity)
		if err != nil {
			return StateCoefficients{}, err
		}
		r.Phases[r.N] = PhaseCoefficients{Phase: ph.Phase, Fraction: ph.Fraction, Rho: ph.Rho, Coefficients: c}
		r.N++
	}
	if r.N == 0 {
		return StateCoefficients{}, fluid.NewError(op, fluid.ErrUndefined,
			"the state is solid: viscosity and thermal conductivity are defined here for fluid phases only",
			fluid.Input{Name: "T", Value: st.T, Unit: "K"}, fluid.Input{Name: "p", Value: st.P, Unit: "Pa"})
	}
	return r, nil
}
