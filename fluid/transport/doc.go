// Package transport provides the transport properties of the fluids of
// package fluid: the dynamic viscosity η(T, ρ) in Pa·s, the thermal
// conductivity λ(T, ρ) in W/(m·K) and the vapour–liquid surface tension
// σ(T) in N/m, each from a published reference correlation.
//
// The correlations are functions of temperature and density, and their
// critical enhancements need the fluid's equation of state (cp, cv and
// (∂p/∂ρ)_T at the state and at a reference temperature far above the
// critical one), which the functions evaluate through package fluid.
// Each correlation is enforced in its published range of temperature and
// pressure; outside it the functions return an error wrapping
// fluid.ErrOutOfRange that names the range. A fluid without a correlation
// gives an error wrapping fluid.ErrUndefined.
//
// Correlations:
//
//	water  viscosity     IAPWS R12-08, with its critical enhancement
//	       conductivity  IAPWS R15-11, with its critical enhancement
//	       surface       IAPWS R1-76(2014)
//	CO2    conductivity  M. L. Huber, E. A. Sykioti, M. J. Assael and
//	                     R. A. Perkins, J. Phys. Chem. Ref. Data 45, 013102
//	                     (2016), with its critical enhancement
//	       surface       A. Mulero, I. Cachadiña and M. I. Parra,
//	                     J. Phys. Chem. Ref. Data 41, 043105 (2012)
//
// Of gives the viscosity and conductivity of each fluid phase of a state
// returned by package flash (which never imports this package).
//
// Every function is safe for concurrent use and allocates nothing unless
// it returns an error.
package transport
