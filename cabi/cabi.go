// Command cabi is tripoint's C ABI: built with -buildmode=c-shared it is
// the shared library libtripoint.so (tripoint.dll on Windows) declared by
// tripoint.h. See that header for the conventions; this file maps each C
// entry point onto the Go API, recovering from any panic so that none
// crosses the boundary.
package main

/*
#cgo CFLAGS: -I${SRCDIR}
#define TP_TYPES_ONLY
#include <stdlib.h>
#include <string.h>
#include "tripoint.h"
*/
import "C"

import (
	"errors"
	"fmt"
	"math"
	"sync"
	"unsafe"

	"github.com/tripoint-thermo/tripoint/flash"
	"github.com/tripoint-thermo/tripoint/flash/partial"
	"github.com/tripoint-thermo/tripoint/fluid"
)

func main() {}

// Version of the library; keep in step with TP_VERSION_* in tripoint.h.
const (
	versionMajor = 0
	versionMinor = 1
	versionPatch = 0
)

// Status codes, as in tripoint.h.
const (
	statusOK            = 0
	statusInvalidInput  = 1
	statusOutOfRange    = 2
	statusNoConvergence = 3
	statusUnstable      = 4
	statusUndefined     = 5
	statusInternal      = 6
)

// Input pairs, as in tripoint.h.
const (
	pairPT = 1 + iota
	pairPH
	pairPS
	pairPQ
	pairTQ
	pairDU
	pairHS
	pairDT
)

// statusOf maps an error onto its status code, one to one with the
// sentinels of package fluid.
func statusOf(err error) int32 {
	switch {
	case err == nil:
		return statusOK
	case errors.Is(err, fluid.ErrInvalidInput):
		return statusInvalidInput
	case errors.Is(err, fluid.ErrOutOfRange):
		return statusOutOfRange
	case errors.Is(err, fluid.ErrNoConvergence):
		return statusNoConvergence
	case errors.Is(err, fluid.ErrUnstable):
		return statusUnstable
	case errors.Is(err, fluid.ErrUndefined):
		return statusUndefined
	}
	return statusInternal
}

// setErr writes code and message to e, if e is not NULL and large enough.
func setErr(e *C.tp_error, code int32, msg string) {
	if e == nil || uintptr(e.size) < unsafe.Sizeof(C.tp_error{}) {
		return
	}
	e.code = C.int32_t(code)
	buf := unsafe.Slice((*byte)(unsafe.Pointer(&e.message[0])), len(e.message))
	n := 0
	for i := 0; i < len(msg) && n < len(buf)-1; i++ {
		c := msg[i]
		if c < 0x20 || c >= 0x7f {
			c = '?' // ASCII only: spreadsheets do not read UTF-8
		}
		buf[n] = c
		n++
	}
	buf[n] = 0
}

// fail records err in e and returns its status.
func fail(e *C.tp_error, err error) int32 {
	code := statusOf(err)
	setErr(e, code, err.Error())
	return code
}

// guard turns a panic into TP_INTERNAL; deferred by every entry point.
func guard(e *C.tp_error, status *C.int32_t) {
	if r := recover(); r != nil {
		*status = statusInternal
		setErr(e, statusInternal, fmt.Sprintf("internal error: %v", r))
	}
}

// A handle is index*refCount + ref + 1 over fluid.Names(): fixed for the
// life of the process, so no table of handles needs to change.
const refCount = 4

type handleEntry struct {
	f   *fluid.Fluid
	err error
}

var handles = sync.OnceValue(func() []handleEntry {
	names := fluid.Names()
	t := make([]handleEntry, len(names)*refCount)
	for i, n := range names {
		f, err := fluid.Lookup(n)
		for r := 0; r < refCount; r++ {
			if err != nil {
				t[i*refCount+r] = handleEntry{err: err}
				continue
			}
			g, gerr := f.WithReference(fluid.RefState(r))
			t[i*refCount+r] = handleEntry{f: g, err: gerr}
		}
	}
	return t
})

// lookupHandle returns the fluid of handle h, or an error of the entry
// point op for a handle that tp_fluid did not return.
func lookupHandle(op string, h C.int32_t) (*fluid.Fluid, error) {
	t := handles()
	i := int(h) - 1
	if i < 0 || i >= len(t) || t[i].f == nil {
		return nil, fluid.NewError(op, fluid.ErrInvalidInput,
			fmt.Sprintf("fluid handle must come from tp_fluid; got %d", int(h)))
	}
	return t[i].f, nil
}

//export tp_version
func tp_version() C.int32_t {
	return versionMajor*10000 + versionMinor*100 + versionPatch
}

//export tp_fluid_count
func tp_fluid_count() C.int32_t { return C.int32_t(len(fluid.Names())) }

//export tp_fluid_name
func tp_fluid_name(index C.int32_t, buf *C.char, n C.int32_t, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	names := fluid.Names()
	if index < 0 || int(index) >= len(names) {
		return C.int32_t(fail(e, fluid.NewError("tp_fluid_name", fluid.ErrInvalidInput,
			fmt.Sprintf("index must be in 0..%d; got %d", len(names)-1, int(index)))))
	}
	if buf == nil || int(n) <= len(names[index]) {
		return C.int32_t(fail(e, fluid.NewError("tp_fluid_name", fluid.ErrInvalidInput,
			fmt.Sprintf("buffer of %d bytes too small for %q", int(n), names[index]))))
	}
	copyCString(unsafe.Slice((*byte)(unsafe.Pointer(buf)), int(n)), names[index])
	setErr(e, statusOK, "")
	return statusOK
}

func copyCString(dst []byte, s string) {
	n := copy(dst[:len(dst)-1], s)
	dst[n] = 0
}

//export tp_fluid
func tp_fluid(name *C.char, ref C.int32_t, e *C.tp_error) (handle C.int32_t) {
	var status C.int32_t
	defer func() {
		if status != statusOK {
			handle = 0
		}
	}()
	defer guard(e, &status)
	if name == nil {
		status = C.int32_t(fail(e, fluid.NewError("tp_fluid", fluid.ErrInvalidInput, "name is NULL")))
		return 0
	}
	f, err := fluid.Lookup(C.GoString(name))
	if err != nil {
		status = C.int32_t(fail(e, err))
		return 0
	}
	if ref < 0 || ref >= refCount {
		status = C.int32_t(fail(e, fluid.NewError("tp_fluid", fluid.ErrInvalidInput,
			fmt.Sprintf("reference state must be 0..%d; got %d", refCount-1, int(ref)))))
		return 0
	}
	for i, n := range fluid.Names() {
		if n == f.Name() {
			ent := handles()[i*refCount+int(ref)]
			if ent.err != nil {
				status = C.int32_t(fail(e, ent.err))
				return 0
			}
			setErr(e, statusOK, "")
			return C.int32_t(i*refCount + int(ref) + 1)
		}
	}
	status = C.int32_t(fail(e, errors.New("tp_fluid: internal: fluid missing from its own registry")))
	return 0
}

//export tp_fluid_info_get
func tp_fluid_info_get(h C.int32_t, out *C.tp_fluid_info, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	f, err := lookupHandle("tp_fluid_info_get", h)
	if err != nil {
		return C.int32_t(fail(e, err))
	}
	if out == nil || uintptr(out.size) < unsafe.Sizeof(C.tp_fluid_info{}) {
		return C.int32_t(fail(e, sizeError("tp_fluid_info_get", "tp_fluid_info", unsafe.Sizeof(C.tp_fluid_info{}))))
	}
	c, tr, l := f.Critical(), f.Triple(), f.Limits()
	out.handle = h
	out.ref = C.int32_t(f.Reference())
	out.has_solid = 0
	if tr.RhoSolid > 0 {
		out.has_solid = 1
	}
	copyCString(unsafe.Slice((*byte)(unsafe.Pointer(&out.name[0])), len(out.name)), f.Name())
	out.molar_mass = C.double(f.MolarMass())
	out.t_crit, out.p_crit, out.rho_crit = C.double(c.T), C.double(c.P), C.double(c.Rho)
	out.t_triple, out.p_triple = C.double(tr.T), C.double(tr.P)
	out.rho_triple_solid = C.double(tr.RhoSolid)
	out.rho_triple_liquid = C.double(tr.RhoLiquid)
	out.rho_triple_vapor = C.double(tr.RhoVapor)
	out.t_min, out.t_max, out.p_max = C.double(l.TMin), C.double(l.TMax), C.double(l.PMax)
	setErr(e, statusOK, "")
	return statusOK
}

func sizeError(op, typ string, want uintptr) error {
	return fluid.NewError(op, fluid.ErrInvalidInput,
		fmt.Sprintf("%s is NULL or its size field is below sizeof(%s) = %d", typ, typ, want))
}

// run performs one flash.
func run(f *fluid.Fluid, pair C.int32_t, a, b float64, o flash.Options) (flash.State, error) {
	switch pair {
	case pairPT:
		return flash.PTWith(f, a, b, o)
	case pairPH:
		return flash.PHWith(f, a, b, o)
	case pairPS:
		return flash.PSWith(f, a, b, o)
	case pairPQ:
		return flash.PQWith(f, a, b, o)
	case pairTQ:
		return flash.TQWith(f, a, b, o)
	case pairDU:
		return flash.DUWith(f, a, b, o)
	case pairHS:
		return flash.HSWith(f, a, b, o)
	case pairDT:
		return flash.DTWith(f, a, b, o)
	}
	return flash.State{}, fluid.NewError("tp_flash", fluid.ErrInvalidInput,
		fmt.Sprintf("input pair must be TP_PT (1) .. TP_DT (8); got %d", int(pair)))
}

// options converts C options; guess is the i-th warm start, if any.
func options(o *C.tp_options, i int) (flash.Options, error) {
	var fo flash.Options
	if o == nil {
		return fo, nil
	}
	if uintptr(o.size) < unsafe.Sizeof(C.tp_options{}) {
		return fo, sizeError("tp_flash", "tp_options", unsafe.Sizeof(C.tp_options{}))
	}
	fo.Phase = flash.Phase(o.phase)
	fo.AllowMetastable = o.allow_metastable != 0
	if o.guess != nil {
		g := (*C.tp_state)(unsafe.Add(unsafe.Pointer(o.guess), uintptr(i)*unsafe.Sizeof(C.tp_state{})))
		if uintptr(g.size) < unsafe.Sizeof(C.tp_state{}) {
			return fo, sizeError("tp_flash", "tp_state (guess)", unsafe.Sizeof(C.tp_state{}))
		}
		st := fromC(g)
		fo.Guess = &st
	}
	return fo, nil
}

func toC(st *flash.State, out *C.tp_state) {
	size := out.size
	*out = C.tp_state{}
	out.size = size
	out.phase = C.int32_t(st.Phase)
	out.flags = C.uint32_t(st.Flags)
	out.n = C.int32_t(st.N)
	out.t, out.p, out.rho = C.double(st.T), C.double(st.P), C.double(st.Rho)
	out.h, out.s, out.u = C.double(st.H), C.double(st.S), C.double(st.U)
	out.cp, out.cv, out.w = C.double(st.Cp), C.double(st.Cv), C.double(st.W)
	out.quality, out.solid = C.double(st.Quality), C.double(st.Solid)
	for k := 0; k < int(st.N) && k < len(out.phases); k++ {
		ps := &st.Phases[k]
		cp := &out.phases[k]
		cp.phase = C.int32_t(ps.Phase)
		cp.fraction, cp.rho = C.double(ps.Fraction), C.double(ps.Rho)
		cp.h, cp.s, cp.u = C.double(ps.H), C.double(ps.S), C.double(ps.U)
		cp.cp, cp.cv, cp.w = C.double(ps.Cp), C.double(ps.Cv), C.double(ps.W)
	}
}

func fromC(c *C.tp_state) flash.State {
	var st flash.State
	st.Phase = flash.Phase(c.phase)
	st.Flags = fluid.Flags(c.flags)
	st.N = int(c.n)
	if st.N < 0 || st.N > len(st.Phases) {
		st.N = 0
	}
	st.T, st.P, st.Rho = float64(c.t), float64(c.p), float64(c.rho)
	st.H, st.S, st.U = float64(c.h), float64(c.s), float64(c.u)
	st.Cp, st.Cv, st.W = float64(c.cp), float64(c.cv), float64(c.w)
	st.Quality, st.Solid = float64(c.quality), float64(c.solid)
	for k := 0; k < st.N; k++ {
		cp := &c.phases[k]
		st.Phases[k] = flash.PhaseState{
			Phase: flash.Phase(cp.phase), Fraction: float64(cp.fraction), Rho: float64(cp.rho),
			H: float64(cp.h), S: float64(cp.s), U: float64(cp.u),
			Cp: float64(cp.cp), Cv: float64(cp.cv), W: float64(cp.w),
		}
	}
	return st
}

//export tp_flash
func tp_flash(h, pair C.int32_t, a, b C.double, o *C.tp_options, out *C.tp_state, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	return flashInto("tp_flash", out, e, func() (flash.State, error) {
		return flashOne("tp_flash", h, pair, float64(a), float64(b), o, 0)
	})
}

// flashInto runs one flash for an entry point that writes a tp_state:
// out checked, written on success, zeroed (but for its size) on an error.
func flashInto(op string, out *C.tp_state, e *C.tp_error, fn func() (flash.State, error)) C.int32_t {
	if out == nil || uintptr(out.size) < unsafe.Sizeof(C.tp_state{}) {
		return C.int32_t(fail(e, sizeError(op, "tp_state", unsafe.Sizeof(C.tp_state{}))))
	}
	st, err := fn()
	if err != nil {
		size := out.size
		*out = C.tp_state{}
		out.size = size
		return C.int32_t(fail(e, err))
	}
	toC(&st, out)
	setErr(e, statusOK, "")
	return statusOK
}

func flashOne(op string, h, pair C.int32_t, a, b float64, o *C.tp_options, i int) (flash.State, error) {
	f, err := lookupHandle(op, h)
	if err != nil {
		return flash.State{}, err
	}
	fo, err := options(o, i)
	if err != nil {
		return flash.State{}, err
	}
	return run(f, pair, a, b, fo)
}

//export tp_flash_n
func tp_flash_n(h, pair, n C.int32_t, a, b *C.double, o *C.tp_options, out *C.tp_state, stat *C.int32_t, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	return flashN("tp_flash_n", n, a, b, out, stat, e, func(i int, a, b float64) (flash.State, error) {
		return flashOne("tp_flash_n", h, pair, a, b, o, i)
	})
}

// flashN runs n flashes for a vector entry point: out[i] written on
// success and zeroed (but for its size) on an error, stat[i] (if not
// NULL) the status of each; it returns TP_OK or the status of the first
// failure, whose message goes to e.
func flashN(op string, n C.int32_t, a, b *C.double, out *C.tp_state, stat *C.int32_t, e *C.tp_error,
	one func(i int, a, b float64) (flash.State, error)) C.int32_t {
	if n < 0 || (n > 0 && (a == nil || b == nil || out == nil)) {
		return C.int32_t(fail(e, fluid.NewError(op, fluid.ErrInvalidInput,
			fmt.Sprintf("n must be >= 0 and a, b, out non-NULL; got n = %d", int(n)))))
	}
	if n == 0 {
		setErr(e, statusOK, "")
		return statusOK
	}
	if uintptr(out.size) < unsafe.Sizeof(C.tp_state{}) {
		return C.int32_t(fail(e, sizeError(op, "tp_state", unsafe.Sizeof(C.tp_state{}))))
	}
	as, bs := unsafe.Slice(a, int(n)), unsafe.Slice(b, int(n))
	outs := unsafe.Slice(out, int(n))
	var stats []C.int32_t
	if stat != nil {
		stats = unsafe.Slice(stat, int(n))
	}
	size := out.size
	first := C.int32_t(statusOK)
	for i := range outs {
		outs[i].size = size
		st, err := one(i, float64(as[i]), float64(bs[i]))
		code := C.int32_t(statusOf(err))
		if err != nil {
			outs[i] = C.tp_state{size: size}
			if first == statusOK {
				first = C.int32_t(fail(e, err))
			}
		} else {
			toC(&st, &outs[i])
		}
		if stats != nil {
			stats[i] = code
		}
	}
	if first == statusOK {
		setErr(e, statusOK, "")
	}
	return first
}

// Property codes, as in tripoint.h.
const (
	propT = 1 + iota
	propP
	propRho
	propH
	propS
	propU
	propCp
	propCv
	propW
	propQuality
	propSolid
	propPhase
	propFlags
	propV
)

func property(st *flash.State, prop C.int32_t) (float64, error) {
	switch prop {
	case propT:
		return st.T, nil
	case propP:
		return st.P, nil
	case propRho:
		return st.Rho, nil
	case propH:
		return st.H, nil
	case propS:
		return st.S, nil
	case propU:
		return st.U, nil
	case propCp:
		return st.Cp, nil
	case propCv:
		return st.Cv, nil
	case propW:
		return st.W, nil
	case propQuality:
		return st.Quality, nil
	case propSolid:
		return st.Solid, nil
	case propPhase:
		return float64(st.Phase), nil
	case propFlags:
		return float64(st.Flags), nil
	case propV:
		return 1 / st.Rho, nil
	}
	return math.NaN(), fluid.NewError("tp_prop", fluid.ErrInvalidInput,
		fmt.Sprintf("property code must be TP_PROP_T (1) .. TP_PROP_V (14); got %d", int(prop)))
}

func propOne(op string, h, pair C.int32_t, a, b float64, prop C.int32_t) (float64, error) {
	return propOf(prop, func() (flash.State, error) { return flashOne(op, h, pair, a, b, nil, 0) })
}

// propOf returns property prop of the state fn returns, the code checked
// first.
func propOf(prop C.int32_t, fn func() (flash.State, error)) (float64, error) {
	if _, err := property(&flash.State{}, prop); err != nil {
		return math.NaN(), err
	}
	st, err := fn()
	if err != nil {
		return math.NaN(), err
	}
	return property(&st, prop)
}

// scalarCall runs fn for an entry point that returns one double: the
// value, or NaN with the status in e on an error or a panic.
func scalarCall(e *C.tp_error, fn func() (float64, error)) (v C.double) {
	var status C.int32_t
	defer func() {
		if status != statusOK {
			v = C.double(math.NaN())
		}
	}()
	defer guard(e, &status)
	x, err := fn()
	if err != nil {
		status = C.int32_t(fail(e, err))
		return C.double(math.NaN())
	}
	setErr(e, statusOK, "")
	return C.double(x)
}

//export tp_prop
func tp_prop(h, pair C.int32_t, a, b C.double, prop C.int32_t, e *C.tp_error) C.double {
	return scalarCall(e, func() (float64, error) { return propOne("tp_prop", h, pair, float64(a), float64(b), prop) })
}

//export tp_prop_n
func tp_prop_n(h, pair, prop, n C.int32_t, a, b, out *C.double, stat *C.int32_t, e *C.tp_error) (status C.int32_t) {
	defer guard(e, &status)
	if n < 0 || (n > 0 && (a == nil || b == nil || out == nil)) {
		return C.int32_t(fail(e, fluid.NewError("tp_prop_n", fluid.ErrInvalidInput,
			fmt.Sprintf("n must be >= 0 and a, b, out non-NULL; got n = %d", int(n)))))
	}
	as, bs, outs := unsafe.Slice(a, int(n)), unsafe.Slice(b, int(n)), unsafe.Slice(out, int(n))
	var stats []C.int32_t
	if stat != nil {
		stats = unsafe.Slice(stat, int(n))
	}
	first := C.int32_t(statusOK)
	for i := range outs {
		x, err := propOne("tp_prop_n", h, pair, float64(as[i]), float64(bs[i]), prop)
		code := C.int32_t(statusOf(err))
		if err != nil && first == statusOK {
			first = C.int32_t(fail(e, err))
		}
		outs[i] = C.double(x)
		if stats != nil {
			stats[i] = code
		}
	}
	if first == statusOK {
		setErr(e, statusOK, "")
	}
	return first
}

// int32ToC converts a Go int to the C pair type; for the tests, which
// cannot use cgo directly.
func int32ToC(v int) C.int32_t { return C.int32_t(v) }

// quantity converts a TP_Q_* code; the codes are those of partial.Quantity.
func quantity(op string, q C.int32_t) (partial.Quantity, error) {
	if pq := partial.Quantity(q); pq.Valid() {
		return pq, nil
	}
	return 0, fluid.NewError(op, fluid.ErrInvalidInput,
		fmt.Sprintf("quantity code must be TP_Q_T (1) .. TP_Q_F (9); got %d", int(q)))
}

//export tp_derivative
func tp_derivative(h, pair C.int32_t, in1, in2 C.double, a, b, c C.int32_t, e *C.tp_error) C.double {
	return scalarCall(e, func() (float64, error) { return derivativeOne(h, pair, float64(in1), float64(in2), a, b, c) })
}

func derivativeOne(h, pair C.int32_t, in1, in2 float64, a, b, c C.int32_t) (float64, error) {
	var q [3]partial.Quantity
	for i, code := range [3]C.int32_t{a, b, c} {
		var err error
		if q[i], err = quantity("tp_derivative", code); err != nil {
			return math.NaN(), err
		}
	}
	f, err := lookupHandle("tp_derivative", h)
	if err != nil {
		return math.NaN(), err
	}
	st, err := run(f, pair, in1, in2, flash.Options{})
	if err != nil {
		return math.NaN(), err
	}
	return partial.Derivative(f, st, q[0], q[1], q[2])
}

//export tp_curve_derivative
func tp_curve_derivative(h, curve, at C.int32_t, x C.double, phase, a, b C.int32_t, e *C.tp_error) C.double {
	return scalarCall(e, func() (float64, error) { return curveDerivativeOne(h, curve, at, float64(x), phase, a, b) })
}

func curveDerivativeOne(h, curve, at C.int32_t, x float64, phase, a, b C.int32_t) (float64, error) {
	const op = "tp_curve_derivative"
	qa, err := quantity(op, a)
	if err != nil {
		return math.NaN(), err
	}
	qb, err := quantity(op, b)
	if err != nil {
		return math.NaN(), err
	}
	f, err := lookupHandle(op, h)
	if err != nil {
		return math.NaN(), err
	}
	var s partial.Slopes
	switch partial.Quantity(at) {
	case partial.T:
		s, err = partial.SlopesAtT(f, partial.Curve(curve), x)
	case partial.P:
		s, err = partial.SlopesAtP(f, partial.Curve(curve), x)
	default:
		return math.NaN(), fluid.NewError(op, fluid.ErrInvalidInput,
			fmt.Sprintf("at must be TP_Q_T (1) or TP_Q_P (2); got %d", int(at)))
	}
	if err != nil {
		return math.NaN(), err
	}
	return s.Derivative(int(phase), qa, qb)
}

// callResult is what one call through the C entry points returned, for
// the tests (which cannot use cgo types themselves).
type callResult struct {
	handle, status, propStatus int32
	st                         flash.State
	prop                       float64
	msg                        string
}

// callC makes the calls a C program would: tp_fluid, tp_flash and tp_prop,
// through the exported functions themselves, with C structs.
func callC(name string, ref, pair int32, a, b float64, prop int32) callResult {
	var r callResult
	var e C.tp_error
	e.size = C.uint32_t(unsafe.Sizeof(e))
	cname := C.CString(name)
	defer C.free(unsafe.Pointer(cname))
	r.handle = int32(tp_fluid(cname, C.int32_t(ref), &e))
	if r.handle <= 0 {
		r.status = int32(e.code)
		r.msg = C.GoString(&e.message[0])
		return r
	}
	var out C.tp_state
	out.size = C.uint32_t(unsafe.Sizeof(out))
	r.status = int32(tp_flash(C.int32_t(r.handle), C.int32_t(pair), C.double(a), C.double(b), nil, &out, &e))
	r.msg = C.GoString(&e.message[0])
	r.st = fromC(&out)
	r.prop = float64(tp_prop(C.int32_t(r.handle), C.int32_t(pair), C.double(a), C.double(b), C.int32_t(prop), &e))
	r.propStatus = int32(e.code)
	return r
}
