package main

/*
#define TP_TYPES_ONLY
#include "tripoint.h"
*/
import "C"

import (
	"fmt"
	"math"
	"runtime/cgo"
	"unsafe"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/flash/table"
	"github.com/tripoint-thermo/tripoint/fluid"
)

// The spline tables of package flash/table through the C ABI. A table
// handle is a runtime/cgo.Handle of a tableEntry: the runtime's own
// registry of Go values held for C, which hands out small positive
// integers (1, 2, ...) and keeps the tables alive until tp_table_free.

type tableEntry struct {
	t     *table.Table
	fluid C.int32_t // the fluid handle the tables were built for
}

// lookupTable returns the tables of handle h, or an error for a handle
// that tp_table_new did not return or that was freed.
func lookupTable(op string, h C.int32_t) (ent *tableEntry, err error) {
	bad := fluid.NewError(op, fluid.ErrInvalidInput,
		fmt.Sprintf("table handle must come from tp_table_new and not be freed; got %d", int(h)))
	if h <= 0 {
		return nil, bad
	}
	defer func() {
		if recover() != nil { // cgo.Handle.Value panics on an unknown handle
			ent, err = nil, bad
		}
	}()
	e, ok := cgo.Handle(h).Value().(*tableEntry)
	if !ok {
		return nil, bad
	}
	return e, nil
}

//export tp_table_new
func tp_table_new(h C.int32_t, r *C.tp_table_range, e *C.tp_error) (handle C.int32_t) {
	var status C.int32_t
	defer func() {
		if status != statusOK {
			handle = 0
		}
	}()
	defer guard(e, &status)
	f, err := lookupHandle("tp_table_new", h)
	if err != nil {
		status = C.int32_t(fail(e, err))
		return 0
	}
	var rg table.Range
	if r != nil {
		if uintptr(r.size) < unsafe.Sizeof(C.tp_table_range{}) {
			status = C.int32_t(fail(e, sizeError("tp_table_new", "tp_table_range", unsafe.Sizeof(C.tp_table_range{}))))
			return 0
		}
		rg = table.Range{PMin: float64(r.p_min), PMax: float64(r.p_max), TMin: float64(r.t_min), TMax: float64(r.t_max)}
	}
	t, err := table.New(f, rg)
	if err != nil {
		status = C.int32_t(fail(e, err))
		return 0
	}
	ch := cgo.NewHandle(&tableEntry{t: t, fluid: h})
	if ch > math.MaxInt32 {
		ch.Delete()
		status = C.int32_t(fail(e, fluid.NewError("tp_table_new", fluid.ErrOutOfRange, "no table handle left")))
		return 0
	}
	setErr(e, statusOK, "")
	return C.int32_t(ch)
}

//export tp_table_free
func tp_table_free(h C.int32_t, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	if _, err := lookupTable("tp_table_free", h); err != nil {
		return C.int32_t(fail(e, err))
	}
	cgo.Handle(h).Delete()
	setErr(e, statusOK, "")
	return statusOK
}

//export tp_table_info_get
func tp_table_info_get(h C.int32_t, out *C.tp_table_info, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	ent, err := lookupTable("tp_table_info_get", h)
	if err != nil {
		return C.int32_t(fail(e, err))
	}
	if out == nil || uintptr(out.size) < unsafe.Sizeof(C.tp_table_info{}) {
		return C.int32_t(fail(e, sizeError("tp_table_info_get", "tp_table_info", unsafe.Sizeof(C.tp_table_info{}))))
	}
	t := ent.t
	r := t.Range()
	p1, p2, t1, t2, rho1, rho2 := t.CriticalNeighbourhood()
	out.fluid = ent.fluid
	out.bytes = C.double(t.Bytes())
	out.p_min, out.p_max, out.t_min, out.t_max = C.double(r.PMin), C.double(r.PMax), C.double(r.TMin), C.double(r.TMax)
	out.p1, out.p2, out.t1, out.t2 = C.double(p1), C.double(p2), C.double(t1), C.double(t2)
	out.rho1, out.rho2 = C.double(rho1), C.double(rho2)
	setErr(e, statusOK, "")
	return statusOK
}

// runTable performs one flash of the tables (TP_PT, TP_PH or TP_DU).
func runTable(op string, h, pair C.int32_t, a, b float64) (flash.State, error) {
	ent, err := lookupTable(op, h)
	if err != nil {
		return flash.State{}, err
	}
	switch pair {
	case pairPT:
		return ent.t.PT(a, b)
	case pairPH:
		return ent.t.PH(a, b)
	case pairDU:
		return ent.t.DU(a, b)
	}
	return flash.State{}, tablePairError(op, pair)
}

func tablePairError(op string, pair C.int32_t) error {
	return fluid.NewError(op, fluid.ErrInvalidInput,
		fmt.Sprintf("input pair of the tables must be TP_PT (1), TP_PH (2) or TP_DU (6); got %d", int(pair)))
}

//export tp_table_covers
func tp_table_covers(h, pair C.int32_t, a, b C.double, e *C.tp_error) (covered C.int32_t) {
	var status C.int32_t
	defer func() {
		if status != statusOK {
			covered = -1
		}
	}()
	defer guard(e, &status)
	ent, err := lookupTable("tp_table_covers", h)
	if err != nil {
		status = C.int32_t(fail(e, err))
		return -1
	}
	var ok bool
	switch pair {
	case pairPT:
		ok = ent.t.CoversPT(float64(a), float64(b))
	case pairPH:
		ok = ent.t.CoversPH(float64(a), float64(b))
	case pairDU:
		ok = ent.t.CoversDU(float64(a), float64(b))
	default:
		status = C.int32_t(fail(e, tablePairError("tp_table_covers", pair)))
		return -1
	}
	setErr(e, statusOK, "")
	if ok {
		return 1
	}
	return 0
}

//export tp_table_flash
func tp_table_flash(h, pair C.int32_t, a, b C.double, out *C.tp_state, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	return flashInto("tp_table_flash", out, e, func() (flash.State, error) {
		return runTable("tp_table_flash", h, pair, float64(a), float64(b))
	})
}

//export tp_table_flash_n
func tp_table_flash_n(h, pair, n C.int32_t, a, b *C.double, out *C.tp_state, stat *C.int32_t, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	return flashN("tp_table_flash_n", n, a, b, out, stat, e, func(_ int, a, b float64) (flash.State, error) {
		return runTable("tp_table_flash_n", h, pair, a, b)
	})
}

//export tp_table_prop
func tp_table_prop(h, pair C.int32_t, a, b C.double, prop C.int32_t, e *C.tp_error) C.double {
	return scalarCall(e, func() (float64, error) {
		return propOf(prop, func() (flash.State, error) { return runTable("tp_table_prop", h, pair, float64(a), float64(b)) })
	})
}
