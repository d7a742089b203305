package transport

// R-134a: the surface tension of Mulero et al. (2012). No viscosity or
// thermal-conductivity correlation is offered: none could be recalled
// together with check values that would prove it.
var r134aModel = model{
	fluid: "R134a",
	sigmaDoc: "Mulero, Cachadina and Parra, J. Phys. Chem. Ref. Data 41, 043105 (2012); " +
		"169.85 K <= T <= 374.18 K",
	// Mulero et al. (2012), σ = σ0 (1 − T/Tc)^n with Tc = 374.18 K,
	// σ0 = 0.05801 N/m, n = 1.241 (recalled from memory); used from the
	// triple point, 169.85 K.
	sigma:     func(T float64) float64 { return mulero(T, 374.18, 0.05801, 1.241) },
	sigmaName: "Mulero et al. (2012)",
	sigmaLo:   169.85, sigmaHi: 374.18,
}
