package flash

import (
	"errors"
	"strings"
	"testing"

	"github.com/tripoint-thermo/tripoint/fluid"
)

// highIceCase is a state of liquid water above 208.566 MPa, the end of
// ice Ih's melting curve, against the melting curves of the high-pressure
// ices (IAPWS R14-08, package sublimation): ice names the ice whose curve
// bounds the liquid at that pressure, beyond whether (p, T) lies beyond
// it. The temperatures are ours, chosen about a kelvin on either side of
// the curves (sublimation.TestHighIceR14 proves them).
type highIceCase struct {
	p, T   float64 // Pa, K
	ice    string
	beyond bool
}

var highIceCases = []highIceCase{
	{300e6, 254, "ice III", true},    // ice III melts at 254.96 K there
	{300e6, 256, "ice III", false},   //
	{250e6, 260, "ice III", false},   // above ice III, below ice Ih's 273.16 K
	{450e6, 262, "ice V", true},      // ice V melts at 263.16 K there
	{450e6, 265, "ice V", false},     //
	{1e9, 290, "ice VI", true},       // ice VI melts at 300.24 K there
	{1e9, 310, "ice VI", false},      //
	{2.5e9, 300, "ice VII", true},    // ice VII melts at 377.0 K there
	{2.5e9, 400, "ice VII", false},   //
	{10e9, 550, "ice VII", true},     // ice VII melts at 610 K there
	{10e9, 650, "ice VII", false},    //
	{30e9, 700, "ice VII", true},     // beyond the end of ice VII's curve, below 715 K
	{30e9, 800, "ice VII", false},    // above 715 K the liquid is accepted
	{220e6, 250, "ice III", true},    // below ice III's curve (251.165 K at 208.566 MPa)
	{209e6, 251.18, "ice III", true}, // ice III melts at 251.194 K there
	{209e6, 251.21, "ice III", false},
}

// TestHighPressureIces checks liquid water above the end of ice Ih:
// stable where it lies above the melting curves of ices III, V, VI and
// VII (IAPWS R14-08), and every flash reproduces it; beyond them PT and
// every flash on the metastable liquid's quantities return ErrOutOfRange
// naming the ice and saying it is outside the model, and with
// AllowMetastable PT, PH, PS, DU, DT, HS and TS return the liquid
// flagged Metastable, as for supercooled water below ice Ih's melting
// curve.
func TestHighPressureIces(t *testing.T) {
	t.Parallel()
	w := mustFluid(t, "water")
	meta := Options{Phase: Liquid, AllowMetastable: true}
	for _, c := range highIceCases {
		st, err := PT(w, c.p, c.T)
		if !c.beyond {
			if err != nil || (st.Phase != Liquid && st.Phase != Supercritical) || st.Flags&Metastable != 0 {
				t.Errorf("PT(%v, %v): %v %v %v, want a stable liquid", c.p, c.T, st.Phase, st.Flags, err)
				continue
			}
			roundTrip(t, w, "PT", &st, Options{}, nil)
			continue
		}
		checkBeyond := func(name string, err error) {
			t.Helper()
			var fe *fluid.Error
			if !errors.Is(err, fluid.ErrOutOfRange) || !errors.As(err, &fe) ||
				!strings.Contains(err.Error(), c.ice) || !strings.Contains(err.Error(), "outside the model") {
				t.Errorf("%s at (%v Pa, %v K): %v, want ErrOutOfRange naming %s outside the model", name, c.p, c.T, err, c.ice)
			}
		}
		checkBeyond("PT", err)
		m, err := PTWith(w, c.p, c.T, meta)
		if err != nil || m.Phase == Vapor || m.Flags&Metastable == 0 {
			t.Errorf("PT metastable at (%v, %v): %v %v %v", c.p, c.T, m.Phase, m.Flags, err)
			continue
		}
		for _, fc := range flashCases {
			a, b := quantityOf(&m, fc.a), quantityOf(&m, fc.b)
			_, err := fc.fn(w, a, b, Options{})
			if fc.name == "TS" && err == nil {
				// (T, s) of a liquid colder than 273.16 K is also that of
				// ice Ih with vapour (TS returns the state of lowest
				// pressure).
				continue
			}
			checkBeyond(fc.name, err)
			if fc.name == "PD" {
				continue // no metastable liquid by PD (as below ice Ih)
			}
			g, err := fc.fn(w, a, b, meta)
			if err != nil || g.Flags&Metastable == 0 || g.Phase == Vapor {
				t.Errorf("%s metastable at (%v, %v): %v %v %v", fc.name, c.p, c.T, g.Phase, g.Flags, err)
			}
		}
	}
}
