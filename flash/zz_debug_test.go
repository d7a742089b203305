package flash

import (
	"fmt"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

func TestZZDebug(t *testing.T) {
	f := mustFluid(t, "water")
	p, rho := 611.6547710075598, 999.7925200316149
	var k call
	k.init(f, "x", fluid.Input{}, fluid.Input{}, nil, 0)
	tp, _ := k.triple()
	fmt.Printf("%.17g %.17g %v %v\n", tp.Liquid.Rho, tp.P, k.onTripleP(p), k.belowTripleP(p))
	st, err := k.pdSolid(p, rho)
	fmt.Println(st.Phase, err)
	k.init(f, "x", fluid.Input{}, fluid.Input{}, nil, 0)
	st, err = k.pd(p, rho)
	fmt.Println(st.Phase, err)
}
