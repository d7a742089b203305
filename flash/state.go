package flash

import (
	"strconv"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// Phase identifies the phase or phase mixture of a state. The values are
// stable (the C ABI exposes them).
type Phase int32

const (
	Unknown       Phase = 0 // not known; in Options: no phase requested
	Liquid        Phase = 1 // below Tc and above the vapour pressure (or Tc and above pc)
	Vapor         Phase = 2 // below the vapour or sublimation pressure, or above Tc at p ≤ pc
	Supercritical Phase = 3 // T > Tc and p > pc
	TwoPhase      Phase = 4 // liquid and vapour in equilibrium
	Solid         Phase = 5 // a solid phase (ice Ih, dry ice)
	SolidVapor    Phase = 6 // solid and vapour in equilibrium (on the sublimation curve)
	SolidLiquid   Phase = 7 // solid and liquid (or dense fluid) in equilibrium (on the melting curve)
	Triple        Phase = 8 // solid, liquid and vapour in equilibrium at the triple point
)

var phaseNames = [...]string{"Unknown", "Liquid", "Vapor", "Supercritical", "TwoPhase",
	"Solid", "SolidVapor", "SolidLiquid", "Triple"}

// String returns the name of p, e.g. "TwoPhase".
func (p Phase) String() string {
	if p >= 0 && int(p) < len(phaseNames) {
		return phaseNames[p]
	}
	return "Phase(" + strconv.Itoa(int(p)) + ")"
}

// Flags qualify a state; they are the bits of fluid.Flags.
type Flags = fluid.Flags

// The flag bits, as in package fluid.
const (
	Saturated     = fluid.Saturated
	Extrapolated  = fluid.Extrapolated
	Metastable    = fluid.Metastable
	AtCritical    = fluid.AtCritical
	Indeterminate = fluid.Indeterminate
)

// PhaseState holds the properties of one phase of a state: its phase, its
// mass fraction of the whole, density in kg/m³, specific enthalpy,
// entropy and internal energy (J/kg, J/(kg·K), J/kg), heat capacities in
// J/(kg·K) and speed of sound in m/s. The layout is frozen (the C ABI
// mirrors it).
type PhaseState struct {
	Phase    Phase
	Fraction float64
	Rho      float64
	H, S, U  float64
	Cp, Cv   float64
	W        float64
}

// State is the result of a flash: a plain value in SI units (K, Pa,
// kg/m³, J/kg, J/(kg·K), m/s), without a pointer to its fluid.
//
// For a mixture of phases T, P, Rho, H, S and U are those of the whole
// (Rho = 1/Σ(xᵢ/ρᵢ), H = Σxᵢhᵢ, …); Cv is the mixture's isochoric heat
// capacity along its equilibrium path, W its homogeneous-equilibrium
// speed of sound, and Cp = +Inf. Quality is the vapour mass fraction (0
// for Liquid, Solid, SolidLiquid and Supercritical states, 1 for Vapor)
// and Solid the solid mass fraction. Phases[:N] are the coexisting
// phases in the order solid, liquid, vapour, each with its own
// properties; a single-phase state has N = 1.
type State struct {
	T, P, Rho float64
	H, S, U   float64
	Cp, Cv, W float64
	Phase     Phase
	Quality   float64
	Solid     float64
	Phases    [3]PhaseState
	N         int
	Flags     Flags
}

// Options modify a flash (the ...With functions).
//
// Guess, if not nil, is a previous state of the same fluid near the
// wanted one: the iterations start from it (a warm start), carried to
// the inputs by its own derivatives. For a simulator's step (0.1 % in
// the inputs) a warm call costs, on the benchmark grids, 0.4–0.85 of a
// cold one for single-phase PH, PS, HS and TS, 0.6–0.9 for DU and PD
// away from saturation and 0.6–0.8 for DU in the dome; where the cold
// path is already one saturation or one density started from the
// cached saturation curve (two-phase PH, PS, HS and PD; DU and PD next
// to saturation; PT: 0.8–1.0; TQ, PQ and DT) it gains little or
// nothing (TestWarmReport). A Guess from another region is harmless:
// where the warm iteration fails, the cold one runs, so a warm start can
// cost more but never fails where a cold one succeeds.
//
// Phase, if not Unknown, requests a phase: Liquid or Vapor for a
// single-phase state of that phase (Supercritical accepts either),
// TwoPhase, or one of the solid phases Solid, SolidVapor, SolidLiquid and
// Triple. If the requested phase is not the stable one at the inputs,
// the flash returns an error wrapping fluid.ErrOutOfRange, unless
// AllowMetastable is set and a metastable state of that phase exists
// (up to the spinodal; a fluid phase, also against the solid): then it is
// returned, flagged Metastable. Next to the spinodal the inverse problems
// are ill-conditioned ((∂p/∂ρ)_T → 0, and h and s grow without bound in
// their slope along an isobar); they are solved in (T, ρ), which still
// resolves them there (tested to 1e-6 of the way from the saturated phase
// to the spinodal). At the spinodal itself, where (∂p/∂ρ)_T = 0, the root
// is double, and a flash other than DT may refuse it with
// fluid.ErrUnstable.
type Options struct {
	Guess           *State
	Phase           Phase
	AllowMetastable bool
}
