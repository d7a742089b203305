/* ctest: the C caller used by cabi's Go tests.
 *
 *   ctest table    reads "fluid ref pair a b" lines (a, b as 16-digit hex
 *                  bits) from stdin and prints each state's status and
 *                  fields as hex bits, for comparison with the Go API.
 *   ctest threads N  runs 8 threads x N tp_prop calls each over a fixed set
 *                  of states and prints "mismatches M" against one thread.
 *   ctest errors   prints the status of a catalogue of bad calls.
 *   ctest tables   reads "fluid pair a b" lines (a, b as hex bits), builds
 *                  each fluid's spline tables once (default range) and
 *                  prints tp_table_covers and the state of tp_table_flash
 *                  as "table" does; then the statuses of bad table calls.
 *   ctest tablethreads N  runs 8 threads x N tp_table_prop calls of CO2's
 *                  tables and prints "mismatches M" against one thread.
 */
#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "tripoint.h"

static double frombits(unsigned long long u) { double d; memcpy(&d, &u, 8); return d; }
static unsigned long long bits(double d) { unsigned long long u; memcpy(&u, &d, 8); return u; }

/* printstate prints status, phase, flags, n and the fields as hex bits. */
static void printstate(int32_t s, const tp_state *st) {
    printf("%d %d %u %d", s, st->phase, st->flags, st->n);
    double v[] = {st->t, st->p, st->rho, st->h, st->s, st->u, st->cp, st->cv, st->w, st->quality, st->solid};
    for (int i = 0; i < 11; i++) printf(" %016llx", bits(v[i]));
    for (int k = 0; k < st->n; k++) {
        const tp_phase_state *q = &st->phases[k];
        double w[] = {q->fraction, q->rho, q->h, q->s, q->u, q->cp, q->cv, q->w};
        printf(" %d", q->phase);
        for (int i = 0; i < 8; i++) printf(" %016llx", bits(w[i]));
    }
}

static int table(void) {
    char name[64];
    int ref, pair;
    unsigned long long ua, ub;
    while (scanf("%63s %d %d %llx %llx", name, &ref, &pair, &ua, &ub) == 5) {
        tp_error err;
        err.size = sizeof err;
        int32_t h = tp_fluid(name, ref, &err);
        if (h <= 0) { printf("handle %d\n", err.code); continue; }
        tp_state st;
        st.size = sizeof st;
        int32_t s = tp_flash(h, pair, frombits(ua), frombits(ub), NULL, &st, &err);
        printstate(s, &st);
        /* The single-property call must agree with the flash. */
        double hp = tp_prop(h, pair, frombits(ua), frombits(ub), TP_PROP_H, NULL);
        if (s == TP_OK && bits(hp) != bits(st.h)) printf(" PROP-MISMATCH");
        if (s != TP_OK && !isnan(hp)) printf(" PROP-NOT-NAN");
        printf("\n");
    }
    return 0;
}

/* deriv: reads "fluid pair a b qa qb qc" lines (a, b as hex bits) and
 * prints the status and the bits of tp_derivative; then one curve slope. */
static int deriv(void) {
    char name[64];
    int pair, qa, qb, qc;
    unsigned long long ua, ub;
    while (scanf("%63s %d %llx %llx %d %d %d", name, &pair, &ua, &ub, &qa, &qb, &qc) == 7) {
        tp_error err;
        err.size = sizeof err;
        int32_t h = tp_fluid(name, TP_REF_DEFAULT, &err);
        double d = tp_derivative(h, pair, frombits(ua), frombits(ub), qa, qb, qc, &err);
        printf("%d %016llx\n", err.code, bits(d));
    }
    return 0;
}

enum { NSTATES = 6 };
static int32_t th_handle;
static const double th_p[NSTATES] = {1e5, 5e5, 2e6, 6e6, 9e6, 2e7};
static const double th_t[NSTATES] = {250, 280, 300, 320, 350, 400};
static double th_ref[NSTATES];
static long th_calls;

static void *worker(void *arg) {
    long *bad = arg;
    for (long i = 0; i < th_calls; i++) {
        int k = (int)(i % NSTATES);
        double v = tp_prop(th_handle, TP_PT, th_p[k], th_t[k], TP_PROP_H, NULL);
        if (bits(v) != bits(th_ref[k])) (*bad)++;
    }
    return NULL;
}

static int threads(long n) {
    th_calls = n;
    th_handle = tp_fluid("CO2", TP_REF_DEFAULT, NULL);
    if (th_handle <= 0) { printf("no handle\n"); return 1; }
    for (int k = 0; k < NSTATES; k++) th_ref[k] = tp_prop(th_handle, TP_PT, th_p[k], th_t[k], TP_PROP_H, NULL);
    pthread_t t[8];
    long bad[8] = {0};
    for (int i = 0; i < 8; i++) pthread_create(&t[i], NULL, worker, &bad[i]);
    long total = 0;
    for (int i = 0; i < 8; i++) { pthread_join(t[i], NULL); total += bad[i]; }
    printf("mismatches %ld\n", total);
    return 0;
}

static void report(const char *what, int32_t status, const tp_error *err) {
    printf("%s %d %s\n", what, status, err ? err->message : "");
}

static int errors(void) {
    tp_error err;
    err.size = sizeof err;
    tp_state st;
    st.size = sizeof st;
    int32_t h = tp_fluid("water", TP_REF_DEFAULT, &err);
    report("water-handle", h > 0 ? 0 : err.code, &err);
    report("nan-pressure", tp_flash(h, TP_PT, NAN, 300, NULL, &st, &err), &err);
    report("negative-pressure", tp_flash(h, TP_PT, -1, 300, NULL, &st, &err), &err);
    report("bad-quality", tp_flash(h, TP_TQ, 300, 1.5, NULL, &st, &err), &err);
    report("bad-pair", tp_flash(h, 99, 1e5, 300, NULL, &st, &err), &err);
    report("bad-handle", tp_flash(12345, TP_PT, 1e5, 300, NULL, &st, &err), &err);
    report("out-of-range", tp_flash(h, TP_PT, 1e5, 1e5, NULL, &st, &err), &err);
    report("null-err", tp_flash(h, TP_PT, NAN, 300, NULL, &st, NULL), NULL);
    tp_state small;
    small.size = 8;
    report("small-state", tp_flash(h, TP_PT, 1e5, 300, NULL, &small, &err), &err);
    double v = tp_prop(h, TP_PT, 1e5, 300, 999, &err);
    report("bad-prop", isnan(v) ? err.code : -1, &err);
    int32_t u = tp_fluid("no-such-fluid", 0, &err);
    report("unknown-fluid", u == 0 ? err.code : -1, &err);
    int32_t r = tp_fluid("CO2", TP_REF_NBP, &err);
    report("co2-nbp", r == 0 ? err.code : -1, &err);
    double a[3] = {1e5, NAN, 2e5}, b[3] = {300, 300, 320};
    double out[3];
    int32_t stat[3];
    int32_t s = tp_prop_n(h, TP_PT, TP_PROP_RHO, 3, a, b, out, stat, &err);
    printf("vector %d %d %d %d %d\n", s, stat[0], stat[1], stat[2], isnan(out[1]) ? 1 : 0);
    printf("version %d %d\n", tp_version(), TP_VERSION_MAJOR * 10000 + TP_VERSION_MINOR * 100 + TP_VERSION_PATCH);
    return 0;
}

/* tables: as table, through the spline tables of each fluid. */
static int tables(void) {
    char name[64], names[4][64];
    int32_t handles[4];
    int nt = 0, pair;
    unsigned long long ua, ub;
    tp_error err;
    err.size = sizeof err;
    while (scanf("%63s %d %llx %llx", name, &pair, &ua, &ub) == 4) {
        int32_t t = 0;
        for (int i = 0; i < nt; i++)
            if (strcmp(names[i], name) == 0) t = handles[i];
        if (t == 0 && nt < 4) {
            int32_t f = tp_fluid(name, TP_REF_DEFAULT, &err);
            t = tp_table_new(f, NULL, &err);
            if (t <= 0) { printf("table %d %s\n", err.code, err.message); continue; }
            strcpy(names[nt], name);
            handles[nt++] = t;
        }
        tp_state st;
        st.size = sizeof st;
        int32_t c = tp_table_covers(t, pair, frombits(ua), frombits(ub), &err);
        int32_t s = tp_table_flash(t, pair, frombits(ua), frombits(ub), &st, &err);
        printf("%d ", c);
        printstate(s, &st);
        double hp = tp_table_prop(t, pair, frombits(ua), frombits(ub), TP_PROP_H, NULL);
        if (s == TP_OK && bits(hp) != bits(st.h)) printf(" PROP-MISMATCH");
        printf("\n");
    }
    /* Bad calls, with the first fluid's tables. */
    if (nt == 0) return 0;
    int32_t t = handles[0];
    tp_state st;
    st.size = sizeof st;
    report("tbl-bad-pair", tp_table_flash(t, TP_PS, 1e5, 300, &st, &err), &err);
    report("tbl-bad-handle", tp_table_flash(987654, TP_PT, 1e5, 300, &st, &err), &err);
    report("tbl-zero-handle", tp_table_flash(0, TP_PT, 1e5, 300, &st, &err), &err);
    report("tbl-covers-bad-pair", tp_table_covers(t, TP_HS, 1, 1, &err) == -1 ? err.code : -1, &err);
    tp_table_info info;
    info.size = sizeof info;
    int32_t s = tp_table_info_get(t, &info, &err);
    printf("tbl-info %d %d %d\n", s, info.bytes > 0, info.p_min < info.p1 && info.p1 < info.p2 && info.p2 < info.p_max);
    int32_t f = tp_fluid(names[0], TP_REF_DEFAULT, &err);
    tp_table_range r = {sizeof r, 0, 2e5, 1e4, 0, 0}; /* p_min > p_max */
    report("tbl-bad-range", tp_table_new(f, &r, &err) == 0 ? err.code : -1, &err);
    r.size = 8;
    report("tbl-small-range", tp_table_new(f, &r, &err) == 0 ? err.code : -1, &err);
    double a[3] = {1e6, NAN, 2e6}, b[3] = {300, 300, 320};
    tp_state out[3];
    int32_t stat[3];
    for (int i = 0; i < 3; i++) out[i].size = sizeof out[i];
    int32_t v = tp_table_flash_n(t, TP_PT, 3, a, b, out, stat, &err);
    printf("tbl-vector %d %d %d %d\n", v, stat[0], stat[1], stat[2]);
    report("tbl-free", tp_table_free(t, &err), &err);
    report("tbl-freed", tp_table_flash(t, TP_PT, 1e5, 300, &st, &err), &err);
    report("tbl-double-free", tp_table_free(t, &err), &err);
    return 0;
}

static int32_t tt_handle;
static const double tt_p[NSTATES] = {1e5, 5e5, 2e6, 6e6, 9e6, 2e7};
static const double tt_t[NSTATES] = {250, 280, 300, 320, 350, 400};

static void *tworker(void *arg) {
    long *bad = arg;
    for (long i = 0; i < th_calls; i++) {
        int k = (int)(i % NSTATES);
        double v = tp_table_prop(tt_handle, TP_PT, tt_p[k], tt_t[k], TP_PROP_H, NULL);
        if (bits(v) != bits(th_ref[k])) (*bad)++;
    }
    return NULL;
}

static int tablethreads(long n) {
    th_calls = n;
    int32_t f = tp_fluid("CO2", TP_REF_DEFAULT, NULL);
    tt_handle = tp_table_new(f, NULL, NULL);
    if (tt_handle <= 0) { printf("no table\n"); return 1; }
    for (int k = 0; k < NSTATES; k++) th_ref[k] = tp_table_prop(tt_handle, TP_PT, tt_p[k], tt_t[k], TP_PROP_H, NULL);
    pthread_t t[8];
    long bad[8] = {0};
    for (int i = 0; i < 8; i++) pthread_create(&t[i], NULL, tworker, &bad[i]);
    long total = 0;
    for (int i = 0; i < 8; i++) { pthread_join(t[i], NULL); total += bad[i]; }
    printf("mismatches %ld\n", total);
    return 0;
}

static double now_ns(void) {
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return ts.tv_sec * 1e9 + ts.tv_nsec;
}

/* bench: best-of-7 ns per PH flash of CO2 at (p, h), scalar calls and one
 * vector call of n states. */
static int bench(long n, double p, double h) {
    int32_t fl = tp_fluid("CO2", TP_REF_DEFAULT, NULL);
    double *a = malloc(n * sizeof *a), *b = malloc(n * sizeof *b);
    tp_state *out = malloc(n * sizeof *out);
    for (long i = 0; i < n; i++) { a[i] = p; b[i] = h; out[i].size = sizeof *out; }
    double best_s = 1e300, best_v = 1e300;
    for (int r = 0; r < 7; r++) {
        tp_state st;
        st.size = sizeof st;
        double t0 = now_ns();
        for (long i = 0; i < n; i++) tp_flash(fl, TP_PH, p, h, NULL, &st, NULL);
        double t1 = now_ns();
        tp_flash_n(fl, TP_PH, (int32_t)n, a, b, NULL, out, NULL, NULL);
        double t2 = now_ns();
        if ((t1 - t0) / n < best_s) best_s = (t1 - t0) / n;
        if ((t2 - t1) / n < best_v) best_v = (t2 - t1) / n;
    }
    /* The cost of crossing the boundary itself: a call that does nothing. */
    double best_x = 1e300;
    for (int r = 0; r < 7; r++) {
        double t0 = now_ns();
        for (long i = 0; i < n; i++) (void)tp_version();
        double t1 = now_ns();
        if ((t1 - t0) / n < best_x) best_x = (t1 - t0) / n;
    }
    printf("scalar %.1f vector %.1f crossing %.1f\n", best_s, best_v, best_x);
    free(a); free(b); free(out);
    return 0;
}

int main(int argc, char **argv) {
    if (argc >= 5 && strcmp(argv[1], "bench") == 0) return bench(atol(argv[2]), atof(argv[3]), atof(argv[4]));
    if (argc >= 2 && strcmp(argv[1], "table") == 0) return table();
    if (argc >= 2 && strcmp(argv[1], "deriv") == 0) return deriv();
    if (argc >= 3 && strcmp(argv[1], "threads") == 0) return threads(atol(argv[2]));
    if (argc >= 2 && strcmp(argv[1], "errors") == 0) return errors();
    if (argc >= 2 && strcmp(argv[1], "tables") == 0) return tables();
    if (argc >= 3 && strcmp(argv[1], "tablethreads") == 0) return tablethreads(atol(argv[2]));
    fprintf(stderr, "usage: ctest table|deriv|threads N|errors|tables|tablethreads N|bench N p h\n");
    return 2;
}
