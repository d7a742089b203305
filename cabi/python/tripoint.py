"""tripoint: real-fluid thermodynamic properties through the tripoint C ABI.

Only the standard library is used (ctypes). Load the shared library built by
cabi/build.sh (or `go build -buildmode=c-shared -o libtripoint.so ./cabi`):

    import tripoint
    lib = tripoint.Library("/path/to/libtripoint.so")   # or $TRIPOINT_LIB
    co2 = lib.fluid("CO2")
    st = co2.ph(3.0e6, 250e3)          # SI units: Pa, J/kg
    print(st.T, st.phase_name, st.quality)
    rho = co2.prop(tripoint.PT, 1e5, 300.0, tripoint.PROP_RHO)
    rhos = co2.prop_n(tripoint.PT, tripoint.PROP_RHO, [1e5, 2e5], [300.0, 310.0])
    with co2.table() as tab:           # spline tables: PT, PH, DU without the equation
        st = tab.ph(3.0e6, 250e3)      # within 1e-6 of co2.ph(...) in T, rho, h, s

Errors raise tripoint.Error (with .code and .message), or a subclass per
status code. The library cannot be unloaded once loaded; load it once.
Results feed the design of pressure equipment: defer to local codes and
licensed engineering practice.
"""

import ctypes
import math
import os

# Status codes (tripoint.h).
OK, INVALID_INPUT, OUT_OF_RANGE, NO_CONVERGENCE, UNSTABLE, UNDEFINED, INTERNAL = range(7)

# Phases.
PHASE_NAMES = {0: "unknown", 1: "liquid", 2: "vapor", 3: "supercritical", 4: "two-phase",
               5: "solid", 6: "solid-vapor", 7: "solid-liquid", 8: "triple"}
LIQUID, VAPOR, SUPERCRITICAL, TWO_PHASE, SOLID, SOLID_VAPOR, SOLID_LIQUID, TRIPLE = range(1, 9)

# Flags.
SATURATED, EXTRAPOLATED, METASTABLE, AT_CRITICAL, INDETERMINATE = 1, 2, 4, 8, 16

# Reference states.
REF_DEFAULT, REF_IIR, REF_ASHRAE, REF_NBP = range(4)

# Input pairs.
PT, PH, PS, PQ, TQ, DU, HS, DT = range(1, 9)

# Quantity codes of the partial derivatives, and coexistence curves.
Q_T, Q_P, Q_RHO, Q_V, Q_U, Q_H, Q_S, Q_G, Q_F = range(1, 10)
CURVE_SATURATION, CURVE_SUBLIMATION, CURVE_MELTING = 1, 2, 3

# Property codes.
(PROP_T, PROP_P, PROP_RHO, PROP_H, PROP_S, PROP_U, PROP_CP, PROP_CV, PROP_W,
 PROP_QUALITY, PROP_SOLID, PROP_PHASE, PROP_FLAGS, PROP_V) = range(1, 15)


class Error(Exception):
    """A tripoint error: code is the status code, message the library's text."""

    def __init__(self, code, message):
        super().__init__(message)
        self.code = code
        self.message = message


class InvalidInputError(Error, ValueError):
    pass


class OutOfRangeError(Error, ValueError):
    pass


class NoConvergenceError(Error, ArithmeticError):
    pass


class UnstableError(Error, ValueError):
    pass


class UndefinedError(Error, LookupError):
    pass


class InternalError(Error, RuntimeError):
    pass


_ERRORS = {INVALID_INPUT: InvalidInputError, OUT_OF_RANGE: OutOfRangeError,
           NO_CONVERGENCE: NoConvergenceError, UNSTABLE: UnstableError,
           UNDEFINED: UndefinedError, INTERNAL: InternalError}


def _raise(code, message):
    raise _ERRORS.get(code, Error)(code, message)


class _Error(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("code", ctypes.c_int32), ("message", ctypes.c_char * 256)]


class _Phase(ctypes.Structure):
    _fields_ = [("phase", ctypes.c_int32), ("reserved", ctypes.c_int32)] + [
        (n, ctypes.c_double) for n in ("fraction", "rho", "h", "s", "u", "cp", "cv", "w")]


class _State(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("phase", ctypes.c_int32), ("flags", ctypes.c_uint32),
                ("n", ctypes.c_int32)] + [
        (n, ctypes.c_double) for n in ("t", "p", "rho", "h", "s", "u", "cp", "cv", "w", "quality", "solid")] + [
        ("phases", _Phase * 3)]


class _Options(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("phase", ctypes.c_int32), ("allow_metastable", ctypes.c_int32),
                ("reserved", ctypes.c_int32), ("guess", ctypes.POINTER(_State))]


class _FluidInfo(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("handle", ctypes.c_int32), ("ref", ctypes.c_int32),
                ("has_solid", ctypes.c_int32), ("name", ctypes.c_char * 32)] + [
        (n, ctypes.c_double) for n in ("molar_mass", "t_crit", "p_crit", "rho_crit", "t_triple", "p_triple",
                                       "rho_triple_solid", "rho_triple_liquid", "rho_triple_vapor",
                                       "t_min", "t_max", "p_max")]


class _TableRange(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("reserved", ctypes.c_int32)] + [
        (n, ctypes.c_double) for n in ("p_min", "p_max", "t_min", "t_max")]


class _TableInfo(ctypes.Structure):
    _fields_ = [("size", ctypes.c_uint32), ("fluid", ctypes.c_int32)] + [
        (n, ctypes.c_double) for n in ("bytes", "p_min", "p_max", "t_min", "t_max",
                                       "p1", "p2", "t1", "t2", "rho1", "rho2")]


class PhaseState:
    """One coexisting phase of a State (SI units)."""

    __slots__ = ("phase", "fraction", "rho", "h", "s", "u", "cp", "cv", "w")

    def __init__(self, c):
        self.phase = c.phase
        for n in self.__slots__[1:]:
            setattr(self, n, getattr(c, n))

    def __repr__(self):
        return "PhaseState(%s, fraction=%g, rho=%g)" % (PHASE_NAMES.get(self.phase, self.phase), self.fraction, self.rho)


class State:
    """A state returned by a flash: T [K], P [Pa], rho [kg/m3], h, u [J/kg],
    s, cp, cv [J/(kg K)], w [m/s], quality, solid, phase, flags, phases."""

    __slots__ = ("T", "P", "rho", "h", "s", "u", "cp", "cv", "w", "quality", "solid", "phase", "flags",
                 "phases", "_c")

    def __init__(self, c):
        self._c = c
        self.T, self.P, self.rho = c.t, c.p, c.rho
        self.h, self.s, self.u = c.h, c.s, c.u
        self.cp, self.cv, self.w = c.cp, c.cv, c.w
        self.quality, self.solid = c.quality, c.solid
        self.phase, self.flags = c.phase, c.flags
        self.phases = [PhaseState(c.phases[k]) for k in range(c.n)]

    @property
    def phase_name(self):
        return PHASE_NAMES.get(self.phase, str(self.phase))

    def __repr__(self):
        return "State(%s, T=%.6g K, P=%.6g Pa, rho=%.6g kg/m3, h=%.6g J/kg, quality=%g, solid=%g)" % (
            self.phase_name, self.T, self.P, self.rho, self.h, self.quality, self.solid)


class Library:
    """The loaded shared library. path defaults to $TRIPOINT_LIB."""

    def __init__(self, path=None):
        path = path or os.environ.get("TRIPOINT_LIB")
        if not path:
            raise ValueError("give the path of libtripoint.so / tripoint.dll or set TRIPOINT_LIB")
        lib = ctypes.CDLL(path)
        P = ctypes.POINTER
        i32, dbl = ctypes.c_int32, ctypes.c_double
        sig = {
            "tp_version": (i32, []),
            "tp_fluid_count": (i32, []),
            "tp_fluid_name": (i32, [i32, ctypes.c_char_p, i32, P(_Error)]),
            "tp_fluid": (i32, [ctypes.c_char_p, i32, P(_Error)]),
            "tp_fluid_info_get": (i32, [i32, P(_FluidInfo), P(_Error)]),
            "tp_flash": (i32, [i32, i32, dbl, dbl, P(_Options), P(_State), P(_Error)]),
            "tp_flash_n": (i32, [i32, i32, i32, P(dbl), P(dbl), P(_Options), P(_State), P(i32), P(_Error)]),
            "tp_prop": (dbl, [i32, i32, dbl, dbl, i32, P(_Error)]),
            "tp_prop_n": (i32, [i32, i32, i32, i32, P(dbl), P(dbl), P(dbl), P(i32), P(_Error)]),
            "tp_derivative": (dbl, [i32, i32, dbl, dbl, i32, i32, i32, P(_Error)]),
            "tp_curve_derivative": (dbl, [i32, i32, i32, dbl, i32, i32, i32, P(_Error)]),
            "tp_table_new": (i32, [i32, P(_TableRange), P(_Error)]),
            "tp_table_free": (i32, [i32, P(_Error)]),
            "tp_table_info_get": (i32, [i32, P(_TableInfo), P(_Error)]),
            "tp_table_covers": (i32, [i32, i32, dbl, dbl, P(_Error)]),
            "tp_table_flash": (i32, [i32, i32, dbl, dbl, P(_State), P(_Error)]),
            "tp_table_flash_n": (i32, [i32, i32, i32, P(dbl), P(dbl), P(_State), P(i32), P(_Error)]),
            "tp_table_prop": (dbl, [i32, i32, dbl, dbl, i32, P(_Error)]),
        }
        for name, (res, args) in sig.items():
            fn = getattr(lib, name)
            fn.restype, fn.argtypes = res, args
        self._lib = lib

    @property
    def version(self):
        v = self._lib.tp_version()
        return (v // 10000, v // 100 % 100, v % 100)

    def names(self):
        out = []
        buf = ctypes.create_string_buffer(64)
        for i in range(self._lib.tp_fluid_count()):
            err = _err()
            if self._lib.tp_fluid_name(i, buf, len(buf), ctypes.byref(err)) != OK:
                _raise(err.code, err.message.decode("ascii"))
            out.append(buf.value.decode("ascii"))
        return out

    def fluid(self, name, ref=REF_DEFAULT):
        """A Fluid by name or alias ("CO2", "R744", "water", "R134a") and reference state."""
        err = _err()
        h = self._lib.tp_fluid(name.encode("ascii"), ref, ctypes.byref(err))
        if h <= 0:
            _raise(err.code, err.message.decode("ascii"))
        return Fluid(self, h)


def _err():
    e = _Error()
    e.size = ctypes.sizeof(_Error)
    return e


def _flash_n(call, a, b):
    """Runs a vector flash call(n, a, b, out, status, err) on the lists a and
    b: returns (states, statuses), a failed element None."""
    n = len(a)
    if len(b) != n:
        raise ValueError("a and b differ in length")
    A, B = (ctypes.c_double * n)(*a), (ctypes.c_double * n)(*b)
    out = (_State * n)()
    for s in out:
        s.size = ctypes.sizeof(_State)
    stat = (ctypes.c_int32 * n)()
    err = _err()
    call(n, A, B, out, stat, ctypes.byref(err))
    return [State(out[i]) if stat[i] == OK else None for i in range(n)], list(stat)


def _options(phase, allow_metastable, guess):
    if not phase and not allow_metastable and guess is None:
        return None
    o = _Options()
    o.size = ctypes.sizeof(_Options)
    o.phase = phase or 0
    o.allow_metastable = 1 if allow_metastable else 0
    if guess is not None:
        o.guess = ctypes.pointer(guess._c)
    return ctypes.byref(o)


class Fluid:
    """A fluid handle of a Library. Flash methods take SI inputs and return State."""

    def __init__(self, lib, handle):
        self._lib, self._h = lib, handle
        info = _FluidInfo()
        info.size = ctypes.sizeof(_FluidInfo)
        err = _err()
        if lib._lib.tp_fluid_info_get(handle, ctypes.byref(info), ctypes.byref(err)) != OK:
            _raise(err.code, err.message.decode("ascii"))
        self.name = info.name.decode("ascii")
        self.molar_mass = info.molar_mass
        self.critical = (info.t_crit, info.p_crit, info.rho_crit)
        self.triple = (info.t_triple, info.p_triple)
        self.has_solid = bool(info.has_solid)

    def flash(self, pair, a, b, phase=0, allow_metastable=False, guess=None):
        st = _State()
        st.size = ctypes.sizeof(_State)
        err = _err()
        s = self._lib._lib.tp_flash(self._h, pair, a, b, _options(phase, allow_metastable, guess),
                                    ctypes.byref(st), ctypes.byref(err))
        if s != OK:
            _raise(err.code, err.message.decode("ascii"))
        return State(st)

    def pt(self, p, T, **kw): return self.flash(PT, p, T, **kw)
    def ph(self, p, h, **kw): return self.flash(PH, p, h, **kw)
    def ps(self, p, s, **kw): return self.flash(PS, p, s, **kw)
    def pq(self, p, q, **kw): return self.flash(PQ, p, q, **kw)
    def tq(self, T, q, **kw): return self.flash(TQ, T, q, **kw)
    def du(self, rho, u, **kw): return self.flash(DU, rho, u, **kw)
    def hs(self, h, s, **kw): return self.flash(HS, h, s, **kw)
    def dt(self, rho, T, **kw): return self.flash(DT, rho, T, **kw)

    def flash_n(self, pair, a, b, phase=0, allow_metastable=False):
        """Vector flash: returns (states, statuses); a failed element is None."""
        opt = _options(phase, allow_metastable, None)
        return _flash_n(lambda n, A, B, out, stat, err: self._lib._lib.tp_flash_n(
            self._h, pair, n, A, B, opt, out, stat, err), a, b)

    def prop(self, pair, a, b, prop):
        """One property of the state at (a, b); raises on error."""
        err = _err()
        v = self._lib._lib.tp_prop(self._h, pair, a, b, prop, ctypes.byref(err))
        if math.isnan(v) and err.code != OK:
            _raise(err.code, err.message.decode("ascii"))
        return v

    def derivative(self, pair, a, b, qa, qb, qc):
        """(d qa / d qb) at constant qc of the state at (a, b), e.g.
        derivative(PH, p, h, Q_RHO, Q_H, Q_P); raises UndefinedError where it
        is infinite or does not exist."""
        err = _err()
        v = self._lib._lib.tp_derivative(self._h, pair, a, b, qa, qb, qc, ctypes.byref(err))
        if err.code != OK:
            _raise(err.code, err.message.decode("ascii"))
        return v

    def curve_derivative(self, curve, at, x, phase, qa, qb):
        """d qa / d qb of coexisting phase 0 or 1 along a curve at T = x
        (at=Q_T) or p = x (at=Q_P)."""
        err = _err()
        v = self._lib._lib.tp_curve_derivative(self._h, curve, at, x, phase, qa, qb, ctypes.byref(err))
        if err.code != OK:
            _raise(err.code, err.message.decode("ascii"))
        return v

    def prop_n(self, pair, prop, a, b):
        """Vector property: a list with NaN where an element failed."""
        n = len(a)
        if len(b) != n:
            raise ValueError("a and b differ in length")
        A, B, out = (ctypes.c_double * n)(*a), (ctypes.c_double * n)(*b), (ctypes.c_double * n)()
        self._lib._lib.tp_prop_n(self._h, pair, prop, n, A, B, out, None, None)
        return list(out)

    def table(self, p_min=0.0, p_max=0.0, t_min=0.0, t_max=0.0):
        """Spline tables of this fluid over a range (Pa, K; 0 for the
        fluid's defaults): PT, PH and DU without the equation of state.
        Building takes about a second; free them with close() (or use a
        with block)."""
        r = _TableRange()
        r.size = ctypes.sizeof(_TableRange)
        r.p_min, r.p_max, r.t_min, r.t_max = p_min, p_max, t_min, t_max
        err = _err()
        h = self._lib._lib.tp_table_new(self._h, ctypes.byref(r), ctypes.byref(err))
        if h <= 0:
            _raise(err.code, err.message.decode("ascii"))
        return Table(self._lib, h)


class Table:
    """Spline tables of a fluid (Fluid.table). pt, ph and du return State as
    the fluid's flashes do, from the tables where covers() is true and from
    the equation elsewhere (the critical neighbourhood, outside the range,
    the solid regions). Attributes: bytes, range (p_min, p_max, t_min,
    t_max) and neighbourhood (p1, p2, t1, t2, rho1, rho2)."""

    def __init__(self, lib, handle):
        self._lib, self._h = lib, handle
        info = _TableInfo()
        info.size = ctypes.sizeof(_TableInfo)
        err = _err()
        if lib._lib.tp_table_info_get(handle, ctypes.byref(info), ctypes.byref(err)) != OK:
            _raise(err.code, err.message.decode("ascii"))
        self.bytes = int(info.bytes)
        self.range = (info.p_min, info.p_max, info.t_min, info.t_max)
        self.neighbourhood = (info.p1, info.p2, info.t1, info.t2, info.rho1, info.rho2)

    def close(self):
        """Frees the tables; the Table may not be used afterwards."""
        if self._h > 0:
            err = _err()
            s = self._lib._lib.tp_table_free(self._h, ctypes.byref(err))
            self._h = 0
            if s != OK:
                _raise(err.code, err.message.decode("ascii"))

    def __enter__(self):
        return self

    def __exit__(self, *exc):
        self.close()
        return False

    def flash(self, pair, a, b):
        st = _State()
        st.size = ctypes.sizeof(_State)
        err = _err()
        if self._lib._lib.tp_table_flash(self._h, pair, a, b, ctypes.byref(st), ctypes.byref(err)) != OK:
            _raise(err.code, err.message.decode("ascii"))
        return State(st)

    def pt(self, p, T): return self.flash(PT, p, T)
    def ph(self, p, h): return self.flash(PH, p, h)
    def du(self, rho, u): return self.flash(DU, rho, u)

    def covers(self, pair, a, b):
        """True if the tables answer (a, b) of pair PT, PH or DU themselves."""
        err = _err()
        c = self._lib._lib.tp_table_covers(self._h, pair, a, b, ctypes.byref(err))
        if c < 0:
            _raise(err.code, err.message.decode("ascii"))
        return c == 1

    def prop(self, pair, a, b, prop):
        """One property of the state at (a, b); raises on error."""
        err = _err()
        v = self._lib._lib.tp_table_prop(self._h, pair, a, b, prop, ctypes.byref(err))
        if math.isnan(v) and err.code != OK:
            _raise(err.code, err.message.decode("ascii"))
        return v

    def flash_n(self, pair, a, b):
        """Vector flash: returns (states, statuses); a failed element is None."""
        return _flash_n(lambda n, A, B, out, stat, err: self._lib._lib.tp_table_flash_n(
            self._h, pair, n, A, B, out, stat, err), a, b)
