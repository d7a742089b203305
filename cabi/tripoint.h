/*
 * tripoint.h - C interface of the tripoint fluid-property library.
 *
 * Real-fluid thermodynamic properties (water, carbon dioxide, R-134a) from
 * their published equations of state, for C and C++ programs, Python
 * (ctypes) and spreadsheets. Build the shared library with
 *
 *     go build -buildmode=c-shared -o libtripoint.so ./cabi        (Linux)
 *     CGO_ENABLED=1 GOOS=windows GOARCH=amd64 CC=x86_64-w64-mingw32-gcc \
 *         go build -buildmode=c-shared -o tripoint.dll ./cabi      (Windows)
 *
 * or with cabi/build.sh, which does both.
 *
 * Conventions
 *   - Units are SI base units everywhere: K, Pa, kg/m3, J/kg, J/(kg K), m/s.
 *     Conversions: T[K] = t[degC] + 273.15; p[Pa] = p[bar] * 1e5;
 *     h[J/kg] = h[kJ/kg] * 1000.
 *   - Every function is safe to call from many threads at once. Results do
 *     not depend on the calling thread or on earlier calls.
 *   - Errors are reported through a per-call out-parameter, tp_error*, which
 *     may be NULL. Functions that return a status return one of TP_OK ...
 *     TP_INTERNAL; the single-property functions return NaN on error.
 *     Messages are plain ASCII.
 *   - Every public struct begins with a uint32_t size field. The caller sets
 *     it to sizeof(the struct) before the call (tp_init_* helpers are not
 *     needed: use sizeof). Later versions append fields; a library reads and
 *     writes only the fields that fit within the size the caller gave, so old
 *     callers keep working. A size smaller than version 1 of the struct gives
 *     TP_INVALID_INPUT.
 *   - Fluid handles are small positive integers, one per (fluid, reference
 *     state), valid in the process that obtained them. No pointer into the
 *     library's memory is ever returned.
 *   - The library cannot be unloaded once loaded (its Go runtime cannot
 *     stop): do not call dlclose/FreeLibrary on it; load it once per process.
 *
 * Results feed the design of pressure equipment, relief systems and
 * refrigeration plants: check them against your own codes and standards, and
 * defer to local codes and licensed engineering practice.
 */
#ifndef TRIPOINT_H
#define TRIPOINT_H

#include <stdint.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Library version: compile-time macros; tp_version() gives the version of
 * the library actually loaded, as MAJOR*10000 + MINOR*100 + PATCH. */
#define TP_VERSION_MAJOR 0
#define TP_VERSION_MINOR 1
#define TP_VERSION_PATCH 0
#define TP_VERSION_STRING "0.1.0"

/* Status codes (one to one with the Go sentinel errors). */
#define TP_OK               0
#define TP_INVALID_INPUT    1 /* NaN, Inf, p <= 0, q outside [0,1], bad code, bad size */
#define TP_OUT_OF_RANGE     2 /* outside the region the models cover */
#define TP_NO_CONVERGENCE   3 /* an iterative solver failed */
#define TP_UNSTABLE         4 /* mechanically unstable state */
#define TP_UNDEFINED        5 /* quantity, fluid or reference state does not exist */
#define TP_INTERNAL         6 /* a defect in the library; please report it */

/* Phases (values are stable). */
#define TP_PHASE_UNKNOWN       0 /* in tp_options: no request */
#define TP_PHASE_LIQUID        1
#define TP_PHASE_VAPOR         2
#define TP_PHASE_SUPERCRITICAL 3
#define TP_PHASE_TWO_PHASE     4
#define TP_PHASE_SOLID         5
#define TP_PHASE_SOLID_VAPOR   6
#define TP_PHASE_SOLID_LIQUID  7
#define TP_PHASE_TRIPLE        8

/* State flags (bits; values are stable). */
#define TP_FLAG_SATURATED     1  /* on a coexistence curve */
#define TP_FLAG_EXTRAPOLATED  2  /* beyond the published range of the equation */
#define TP_FLAG_METASTABLE    4  /* metastable state, returned on request */
#define TP_FLAG_AT_CRITICAL   8  /* exactly the critical point */
#define TP_FLAG_INDETERMINATE 16 /* inputs do not fix the state; documented choice */

/* Reference states of enthalpy and entropy. */
#define TP_REF_DEFAULT 0 /* the fluid's published equation's own */
#define TP_REF_IIR     1 /* h = 200 kJ/kg, s = 1 kJ/(kg K), saturated liquid at 0 degC */
#define TP_REF_ASHRAE  2 /* h = 0, s = 0, saturated liquid at -40 degC */
#define TP_REF_NBP     3 /* h = 0, s = 0, saturated liquid at 101.325 kPa */

/* Input pairs: the two inputs a, b of a flash, in the order of the name.
 * Spreadsheets may store these numbers; they never change. */
#define TP_PT 1 /* a = p [Pa],      b = T [K]      */
#define TP_PH 2 /* a = p [Pa],      b = h [J/kg]   */
#define TP_PS 3 /* a = p [Pa],      b = s [J/(kg K)] */
#define TP_PQ 4 /* a = p [Pa],      b = q [-], vapour mass fraction 0..1 */
#define TP_TQ 5 /* a = T [K],       b = q [-]      */
#define TP_DU 6 /* a = rho [kg/m3], b = u [J/kg]   */
#define TP_HS 7 /* a = h [J/kg],    b = s [J/(kg K)] */
#define TP_DT 8 /* a = rho [kg/m3], b = T [K]      */

/* Property codes for the single-property functions (stable values). */
#define TP_PROP_T        1  /* K */
#define TP_PROP_P        2  /* Pa */
#define TP_PROP_RHO      3  /* kg/m3 */
#define TP_PROP_H        4  /* J/kg */
#define TP_PROP_S        5  /* J/(kg K) */
#define TP_PROP_U        6  /* J/kg */
#define TP_PROP_CP       7  /* J/(kg K); +Inf in two-phase states */
#define TP_PROP_CV       8  /* J/(kg K) */
#define TP_PROP_W        9  /* m/s */
#define TP_PROP_QUALITY  10 /* vapour mass fraction */
#define TP_PROP_SOLID    11 /* solid mass fraction */
#define TP_PROP_PHASE    12 /* TP_PHASE_* as a double */
#define TP_PROP_FLAGS    13 /* TP_FLAG_* bits as a double */
#define TP_PROP_V        14 /* specific volume 1/rho, m3/kg */

/* Quantity codes of the partial derivatives (stable values). */
#define TP_Q_T   1 /* K */
#define TP_Q_P   2 /* Pa */
#define TP_Q_RHO 3 /* kg/m3 */
#define TP_Q_V   4 /* m3/kg */
#define TP_Q_U   5 /* J/kg */
#define TP_Q_H   6 /* J/kg */
#define TP_Q_S   7 /* J/(kg K) */
#define TP_Q_G   8 /* J/kg, Gibbs energy h - Ts */
#define TP_Q_F   9 /* J/kg, Helmholtz energy u - Ts */

/* Coexistence curves. */
#define TP_CURVE_SATURATION  1 /* liquid-vapour */
#define TP_CURVE_SUBLIMATION 2 /* solid-vapour */
#define TP_CURVE_MELTING     3 /* solid-liquid (and solid-dense fluid) */

/* Error out-parameter. */
typedef struct tp_error {
    uint32_t size;      /* set to sizeof(tp_error) */
    int32_t  code;      /* TP_OK ... TP_INTERNAL */
    char     message[256]; /* NUL-terminated ASCII; truncated if longer */
} tp_error;

/* One coexisting phase of a state. */
typedef struct tp_phase_state {
    int32_t phase;      /* TP_PHASE_LIQUID, _VAPOR, _SUPERCRITICAL or _SOLID */
    int32_t reserved;   /* zero */
    double  fraction;   /* mass fraction of this phase */
    double  rho, h, s, u, cp, cv, w;
} tp_phase_state;

/* A state returned by a flash. */
typedef struct tp_state {
    uint32_t size;      /* set to sizeof(tp_state) */
    int32_t  phase;     /* TP_PHASE_* */
    uint32_t flags;     /* TP_FLAG_* bits */
    int32_t  n;         /* number of coexisting phases in use in phases[] */
    double   t, p, rho, h, s, u, cp, cv, w;
    double   quality;   /* vapour mass fraction */
    double   solid;     /* solid mass fraction */
    tp_phase_state phases[3]; /* order: solid, liquid, vapour; first n used */
} tp_state;

/* Options of a flash; pass NULL for the defaults. */
typedef struct tp_options {
    uint32_t size;            /* set to sizeof(tp_options) */
    int32_t  phase;           /* requested phase, TP_PHASE_UNKNOWN for none */
    int32_t  allow_metastable;/* nonzero: return metastable states up to the spinodal */
    int32_t  reserved;        /* zero */
    const tp_state* guess;    /* warm start from a previous state, or NULL;
                                 in the _n functions, an array of n states */
} tp_options;

/* Information about a fluid handle. */
typedef struct tp_fluid_info {
    uint32_t size;            /* set to sizeof(tp_fluid_info) */
    int32_t  handle;
    int32_t  ref;             /* TP_REF_* of this handle */
    int32_t  has_solid;       /* nonzero if the fluid has a solid model */
    char     name[32];        /* canonical name, e.g. "CO2" */
    double   molar_mass;      /* kg/mol */
    double   t_crit, p_crit, rho_crit;        /* the equation's critical point */
    double   t_triple, p_triple;              /* where this library's phase models meet */
    double   rho_triple_solid, rho_triple_liquid, rho_triple_vapor;
    double   t_min, t_max, p_max;             /* published range of the equation */
} tp_fluid_info;

/* The range of spline tables (tp_table_new); a zero field takes the
 * fluid's default (CO2: 1 kPa to 100 MPa, up from its solid curves to
 * 1100 K; water: 611 Pa to 100 MPa, 273.16 K to 1273 K; R-134a: its
 * triple point to 70 MPa and 455 K). */
typedef struct tp_table_range {
    uint32_t size;            /* set to sizeof(tp_table_range) */
    int32_t  reserved;        /* zero */
    double   p_min, p_max;    /* Pa */
    double   t_min, t_max;    /* K */
} tp_table_range;

/* Information about spline tables. */
typedef struct tp_table_info {
    uint32_t size;            /* set to sizeof(tp_table_info) */
    int32_t  fluid;           /* the fluid handle the tables were built for */
    double   bytes;           /* memory of the tables */
    double   p_min, p_max, t_min, t_max;  /* the range, defaults filled in */
    double   p1, p2, t1, t2;  /* critical neighbourhood of PT and PH: p1 <= p <= p2
                                 and t1 <= T <= t2 are left to the equation */
    double   rho1, rho2;      /* DU: densities rho1..rho2 below t2 likewise */
} tp_table_info;

#ifndef TP_TYPES_ONLY

/* Version of the loaded library: MAJOR*10000 + MINOR*100 + PATCH. */
int32_t tp_version(void);

/* Number of fluids, and the canonical name of fluid index 0..count-1
 * written to buf (len bytes, NUL-terminated). Returns a status. */
int32_t tp_fluid_count(void);
int32_t tp_fluid_name(int32_t index, char* buf, int32_t len, tp_error* err);

/* Handle for a fluid by name or alias (case-insensitive: "CO2", "R744",
 * "water", "R134a", ...) and reference state TP_REF_*. Returns a positive
 * handle, or 0 on error (TP_UNDEFINED for an unknown fluid or a reference
 * state that does not exist for it). */
int32_t tp_fluid(const char* name, int32_t ref, tp_error* err);

/* Fluid information. Returns a status. */
int32_t tp_fluid_info_get(int32_t handle, tp_fluid_info* out, tp_error* err);

/* Flash: the state of fluid handle at inputs (a, b) of input pair TP_*.
 * opt may be NULL. Returns a status; *out is written on TP_OK and zeroed
 * (but for size) otherwise. */
int32_t tp_flash(int32_t handle, int32_t pair, double a, double b,
                 const tp_options* opt, tp_state* out, tp_error* err);

/* Vector flash: n states for inputs a[i], b[i]. out[] has n elements, each
 * with its size set (only out[0].size is read; all must be equal). status[]
 * (n elements, may be NULL) receives each element's status. Returns TP_OK
 * if every element succeeded, else the status of the first failure, whose
 * message goes to err. */
int32_t tp_flash_n(int32_t handle, int32_t pair, int32_t n,
                   const double* a, const double* b, const tp_options* opt,
                   tp_state* out, int32_t* status, tp_error* err);

/* Single property TP_PROP_* of the state at (a, b): one spreadsheet cell,
 * one call. Returns NaN on error (and the status in err if given). */
double tp_prop(int32_t handle, int32_t pair, double a, double b,
               int32_t prop, tp_error* err);

/* Vector single property: out[i] = property of state (a[i], b[i]), NaN for
 * a failed element; status[] may be NULL. Returns as tp_flash_n. */
int32_t tp_prop_n(int32_t handle, int32_t pair, int32_t prop, int32_t n,
                  const double* a, const double* b, double* out,
                  int32_t* status, tp_error* err);

/* Partial derivative (da/db)_c, with a, b, c among TP_Q_*, of the state at
 * inputs (in1, in2) of input pair TP_*, in every region (two-phase, solid,
 * solid-vapour, solid-liquid and triple included), in SI units. A
 * derivative that is infinite or does not exist there (cp of a mixture, cv
 * on the triple line, kappa_T at the critical point) gives NaN with
 * TP_UNDEFINED. Returns NaN on any error. */
double tp_derivative(int32_t handle, int32_t pair, double in1, double in2,
                     int32_t a, int32_t b, int32_t c, tp_error* err);

/* Derivative da/db along coexistence curve TP_CURVE_* of coexisting phase
 * `phase` (0 or 1: for saturation the liquid and the vapour; for
 * sublimation and melting the solid and the fluid), at the curve's point of
 * temperature x (at = TP_Q_T) or pressure x (at = TP_Q_P); a is any TP_Q_*
 * and b is TP_Q_T or TP_Q_P. For the curve itself, a = TP_Q_P and b =
 * TP_Q_T give dp/dT (the same for both phases). Returns NaN on error. */
double tp_curve_derivative(int32_t handle, int32_t curve, int32_t at, double x,
                           int32_t phase, int32_t a, int32_t b, tp_error* err);

/* Spline tables: PT, PH and DU answered without the equation of state,
 * every field of the state from tables built once (about 0.3-1 s and
 * 9-17 MB per fluid), to within 1e-6 of the equation in T, rho, h and s
 * outside a small critical neighbourhood (see the Go package flash/table).
 * Outside the range, in the critical neighbourhood and in the solid
 * regions the equation's flash answers instead (tp_table_covers tells).
 *
 * tp_table_new builds the tables of fluid handle `fluid` (its reference
 * state included) over range (NULL: the defaults) and returns a table
 * handle > 0, or 0 and err. Handles are small positive integers, valid in
 * the process until tp_table_free; the tables are immutable and may be
 * used from many threads at once. */
int32_t tp_table_new(int32_t fluid, const tp_table_range* range, tp_error* err);
int32_t tp_table_free(int32_t table, tp_error* err);
int32_t tp_table_info_get(int32_t table, tp_table_info* out, tp_error* err);

/* 1 if the tables answer inputs (a, b) of pair TP_PT, TP_PH or TP_DU
 * themselves, 0 if the equation does; -1 on an error (bad handle or
 * pair). */
int32_t tp_table_covers(int32_t table, int32_t pair, double a, double b, tp_error* err);

/* The flashes of the tables, as tp_flash, tp_flash_n and tp_prop: pair is
 * TP_PT, TP_PH or TP_DU (others: TP_INVALID_INPUT). */
int32_t tp_table_flash(int32_t table, int32_t pair, double a, double b,
                       tp_state* out, tp_error* err);
int32_t tp_table_flash_n(int32_t table, int32_t pair, int32_t n,
                         const double* a, const double* b,
                         tp_state* out, int32_t* status, tp_error* err);
double  tp_table_prop(int32_t table, int32_t pair, double a, double b,
                      int32_t prop, tp_error* err);

#endif /* TP_TYPES_ONLY */

#ifdef __cplusplus
}
#endif

#endif /* TRIPOINT_H */
