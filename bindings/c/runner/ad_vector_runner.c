/*
 * ad_vector_runner.c - checks a C port of airdata against the golden vectors.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * C99, no heap, no file system, no JSON: the cases come from the generated headers
 * in vectors/c/ (`airdata vectors build`), the port from bindings/c/include/airdata.h
 * and bindings/c/include/airdata_batch.h.  The routine of each one-output function
 * is generated from the function table into ad_runner_functions.h beside this file
 * (bindings/c/tools/generate.py); this file holds the checks they share, the routines
 * of the two functions whose outputs are records, and main.
 * Build (binary64, then binary32):
 *
 *   cc -std=c99 -Wall -Wextra -Wpedantic -Werror -Ibindings/c/include -Ivectors/c \
 *      bindings/c/runner/ad_vector_runner.c <port sources> -lm
 *   cc ... -DAIRDATA_SINGLE ...
 *
 * For every case the inputs are converted to ad_real (float under AIRDATA_SINGLE), the
 * port is called, and each output is accepted when
 *
 *   |got - expected| <= AD_VEC_K * eps * scale,   eps = 2^-52 (binary64) or 2^-23 (binary32)
 *
 * NaN is expected exactly where the expected value is NaN, and the returned status
 * must equal the expected one.  Under AIRDATA_SINGLE each case's binary32_check
 * applies: AD_VEC_B32_LENIENT skips the status and accepts NaN on either side (two
 * numbers must still agree within the bound); AD_VEC_B32_SKIP skips the case.
 *
 * The interface the vectors test includes the batch entry points and the NULL rule:
 *   - every case is also run through the batch entry point of airdata_batch.h
 *     (ad_<name>_n with the same inputs as 1-element arrays; ad_air_data_n gets a
 *     NULL setting array when use_setting is 0): its status byte must equal the
 *     scalar call's status, its return value the error count (0 or 1), and every
 *     output must be bit-identical to the scalar call's, in every precision and for
 *     every case, skipped or lenient ones included.  A difference fails the case;
 *   - once per function, the NULL rule: the scalar function with a NULL output
 *     pointer returns AD_INVALID_INPUT (airdata.h), and the batch entry point returns
 *     AD_BATCH_NULL for each NULL array pointer in turn (airdata_batch.h); in neither
 *     case is anything written.  A violation is reported as "FAIL <name> contract".
 *     The rule is checked only for a function whose cases all passed: a function
 *     that already failed is not handed NULL pointers (it might write through them
 *     and end the run before the other functions are reported);
 *   - once, ad_check_n: NaN and +inf are AD_INVALID_INPUT in every domain, so is any
 *     value for a domain id outside ad_domain_id, and NULL arrays give AD_BATCH_NULL.
 * A port that implements only airdata.h builds the runner with -DRUNNER_SCALAR_ONLY:
 * then the batch checks are left out (the scalar NULL rule is still checked).
 *
 * One summary line per function (its cases and failed cases); contract failures are
 * printed below it.  The exit status is non-zero on any failure.
 */
/* The runner's own NaN and bound comparisons need value-safe floating point. */
#if defined(__FAST_MATH__) || (defined(__FINITE_MATH_ONLY__) && __FINITE_MATH_ONLY__)
#error "airdata vector runner: built with -ffast-math or -ffinite-math-only, under which its NaN checks cannot work; build it without them"
#endif

#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

#include "airdata.h"
#include "ad_vectors.h"

#if defined(AIRDATA_PROFILE_US1976) && !defined(AD_VEC_PROFILE_US1976)
#error "the port is built for profile us1976 but the vectors are not: rebuild them with --profile us1976"
#endif
#if !defined(AIRDATA_PROFILE_US1976) && !defined(AD_VEC_PROFILE_ICAO)
#error "the port is built for profile icao but the vectors are not"
#endif

/* -DRUNNER_RESULTS: the result-stream mode.  Nothing is judged; one airdata-results line
 * per case (docs/exchange.md) goes to stdout, to be judged on the host by
 * `airdata port verify`.  Only the scalar entry points are called. */
#ifdef RUNNER_RESULTS
#undef RUNNER_RESULTS
#define RUNNER_RESULTS 1
#define RUNNER_SCALAR_ONLY 1
#else
#define RUNNER_RESULTS 0
#endif

#ifdef RUNNER_SCALAR_ONLY
#define RUNNER_BATCH 0
#define RUNNER_BATCH_NOTE ", scalar entry points only"
#else
#include "airdata_batch.h"
#define RUNNER_BATCH 1
#define RUNNER_BATCH_NOTE ", scalar and batch entry points"
#endif

#ifdef AIRDATA_SINGLE
#define RUNNER_EPS AD_VEC_EPS_BINARY32
#define RUNNER_PRECISION "binary32"
#define RUNNER_SINGLE 1
#else
#define RUNNER_EPS AD_VEC_EPS_BINARY64
#define RUNNER_PRECISION "binary64"
#define RUNNER_SINGLE 0
#endif

/* Failures printed per function; the rest are only counted (-DRUNNER_MAX_REPORTS=n). */
#ifndef RUNNER_MAX_REPORTS
#define RUNNER_MAX_REPORTS 8
#endif

typedef struct {
    const char *name;
    long cases;
    long failed;
    long status_skipped;
    long skipped;
    long contract_failed;  /* NULL-rule checks failed (not cases) */
    double worst;          /* largest |got - expected| / bound over compared outputs */
    const char *worst_id;
} tally_t;

static void tally_start(tally_t *t, const char *name)
{
    t->name = name;
    t->cases = 0;
    t->failed = 0;
    t->status_skipped = 0;
    t->skipped = 0;
    t->contract_failed = 0;
    t->worst = 0.0;
    t->worst_id = "-";
}

static long tally_finish(const tally_t *t)
{
    if (RUNNER_RESULTS) {
        return 0;
    }
    printf("%-26s %5ld cases %5ld passed %4ld failed %4ld skipped %4ld lenient  worst %.3g of"
           " bound (case %s)\n", t->name, t->cases, t->cases - t->failed - t->skipped,
           t->failed, t->skipped, t->status_skipped, t->worst, t->worst_id);
    return t->failed + t->contract_failed;
}

static void report(const tally_t *t, const char *id, const char *what)
{
    if (t->failed < RUNNER_MAX_REPORTS) {
        printf("  FAIL %s case %s: %s\n", t->name, id, what);
    }
}

static void report_value(const tally_t *t, const char *id, int k, double got, double want,
                         double ratio)
{
    if (t->failed < RUNNER_MAX_REPORTS) {
        printf("  FAIL %s case %s: output %d: got %a, expected %a (%.3g of bound)\n",
               t->name, id, k, got, want, ratio);
    }
}

/* 1 when x is a NaN, from its bit pattern (exponent all ones, fraction not zero): unlike
 * isnan() or x != x this cannot be folded away by -ffast-math / -ffinite-math-only. */
static int nan_bits(double x)
{
    uint64_t u;
    (void)memcpy(&u, &x, sizeof u);
    return ((u & 0x7ff0000000000000ULL) == 0x7ff0000000000000ULL)
           && ((u & 0x000fffffffffffffULL) != 0U);
}

/* 1 when x is +-infinity, from its bit pattern. */
static int inf_bits(double x)
{
    uint64_t u;
    (void)memcpy(&u, &x, sizeof u);
    return (u & 0x7fffffffffffffffULL) == 0x7ff0000000000000ULL;
}

/* x as a C99 hex float, " [-]0x1.<13 hex digits>p<exp>" (subnormals 0x0.<...>p-1022),
 * built from the bit pattern: a target's printf may lack %a (newlib built without C99
 * I/O formats prints "a"), but %lx and %d are everywhere. */
static void put_hex(double x)
{
    uint64_t u;
    unsigned long hi;
    unsigned long lo;
    int e;
    (void)memcpy(&u, &x, sizeof u);
    e = (int)((u >> 52) & 0x7ffU);
    hi = (unsigned long)((u >> 32) & 0xfffffU);
    lo = (unsigned long)(u & 0xffffffffU);
    printf((u >> 63) != 0U ? " -" : " ");
    if (e == 0 && hi == 0U && lo == 0U) {
        printf("0x0p+0");
    } else if (e == 0) {
        printf("0x0.%05lx%08lxp-1022", hi, lo);
    } else {
        printf("0x1.%05lx%08lxp%+d", hi, lo, e - 1023);
    }
}

/* One results line: id, status, every output as a C99 hex float (nan, inf, -inf). */
static void emit(const char *id, ad_status st, const ad_real *got, int nout)
{
    int k;
    printf("%s %d", id, (int)st);
    for (k = 0; k < nout && k < 11; ++k) {
        double g = (double)got[k];
        if (nan_bits(g)) {
            printf(" nan");
        } else if (inf_bits(g)) {
            printf(g > 0.0 ? " inf" : " -inf");
        } else {
            put_hex(g);
        }
    }
    printf("\n");
}

/* Set n bytes at p to v (sentinels for outputs that must be overwritten). */
static void fill(void *p, size_t n, unsigned int v)
{
    (void)memset(p, (int)v, n);
}

/* 1 when st is an error status (neither AD_OK nor AD_IMPACT_PRESSURE_ZEROED). */
static size_t is_error(ad_status st)
{
    return ((st == AD_OK) || (st == AD_IMPACT_PRESSURE_ZEROED)) ? 0U : 1U;
}

/* 1 when the batch call agreed with the scalar call: same status, error count 0 or 1
 * as the status says, every output bit-identical. */
static int batch_same(ad_status st, unsigned char st_n, size_t bad, const ad_real *out,
                      const ad_real *out_n, int nout)
{
    int same = ((int)st_n == (int)st) && (bad == is_error(st));
    int k;
    for (k = 0; k < nout && k < 11; ++k) {
        if (memcmp(&out[k], &out_n[k], sizeof out[k]) != 0) {
            same = 0;
        }
    }
    return same;
}

/* Count failed NULL-rule checks of the current function. */
static void contract(tally_t *t, int bad, const char *what)
{
    if (bad != 0) {
        t->contract_failed += bad;
        printf("  FAIL %s contract: %s (%d check(s) failed)\n", t->name, what, bad);
    }
}

/* Compare one case; counts it and at most one failure.  batch_ok: the batch entry
 * point agreed with the scalar call (checked whatever the precision rules say). */
static void check_case(tally_t *t, const char *id, ad_status got_status, int want_status,
                       int check32, const ad_real *got, const double *want,
                       const double *scale, int nout, int batch_ok)
{
    int ok = 1;
    int check_status = !(RUNNER_SINGLE && check32 != AD_VEC_B32_FULL);
    int k;
    t->cases += 1;
    if (RUNNER_RESULTS) {
        emit(id, got_status, got, nout);
        return;
    }
    if (!batch_ok) {
        report(t, id, "the batch entry point differs from the scalar call");
        t->failed += 1;
        return;
    }
    if (RUNNER_SINGLE && check32 == AD_VEC_B32_SKIP) {
        t->skipped += 1;
        return;
    }
    if (!check_status) {
        t->status_skipped += 1;
    } else if ((int)got_status != want_status) {
        char msg[96];
        (void)snprintf(msg, sizeof msg, "status %d, expected %d", (int)got_status, want_status);
        report(t, id, msg);
        ok = 0;
    }
    for (k = 0; k < nout && k < 11; ++k) {
        double g = (double)got[k];
        double w = want[k];
        double bound;
        double err;
        double ratio;
        if (nan_bits(w) || nan_bits(g)) {
            if ((nan_bits(w) && nan_bits(g)) || !check_status) {
                continue;
            }
            if (ok) {
                report_value(t, id, k, g, w, HUGE_VAL);
            }
            ok = 0;
            continue;
        }
        bound = AD_VEC_K * RUNNER_EPS * scale[k];
        err = fabs(g - w);
        if (err <= bound) {
            ratio = (bound > 0.0) ? err / bound : 0.0;
        } else {
            ratio = (bound > 0.0) ? err / bound : HUGE_VAL;
        }
        if (ratio > t->worst) {
            t->worst = ratio;
            t->worst_id = id;
        }
        if (!(err <= bound)) {
            if (ok) {
                report_value(t, id, k, g, w, ratio);
            }
            ok = 0;
        }
    }
    if (!ok) {
        t->failed += 1;
    }
}


#if RUNNER_BATCH
/* ad_check_n (airdata_batch.h): NaN and +inf are invalid in every domain; a domain id
 * outside ad_domain_id makes every value invalid; a NULL array gives AD_BATCH_NULL and
 * writes nothing.  Returns the number of failed checks. */
static long check_domains(void)
{
    const ad_real x[2] = { (ad_real)NAN, (ad_real)INFINITY };
    const ad_real one[1] = { (ad_real)1 };
    unsigned char st[2];
    long bad = 0;
    int d;
    for (d = 0; d <= (int)AD_DOM_SUBSONIC_MACH_LIMIT; ++d) {
        st[0] = 0xffU;
        st[1] = 0xffU;
        bad += (ad_check_n((ad_domain_id)d, x, st, 2U) != 2U);
        bad += (st[0] != (unsigned char)AD_INVALID_INPUT)
               || (st[1] != (unsigned char)AD_INVALID_INPUT);
    }
    st[0] = 0xffU;
    bad += (ad_check_n((ad_domain_id)((int)AD_DOM_SUBSONIC_MACH_LIMIT + 1), one, st, 1U) != 1U);
    bad += (st[0] != (unsigned char)AD_INVALID_INPUT);
    st[0] = 0xa5U;
    bad += (ad_check_n(AD_DOM_MACH, NULL, st, 1U) != AD_BATCH_NULL);
    bad += (ad_check_n(AD_DOM_MACH, one, NULL, 1U) != AD_BATCH_NULL);
    bad += (st[0] != 0xa5U);
    if (bad != 0) {
        printf("  FAIL ad_check_n contract: %ld check(s) failed\n", bad);
    }
    return bad;
}
#endif

/* The per-function part, generated from the function table. */
#include "ad_runner_functions.h"

#if RUNNER_DO_ATMOSPHERE
static void run_atmosphere(tally_t *t)
{
    ad_atmosphere_t y;
    ad_atmosphere_t y_n[1];
    ad_real out[6];
    ad_real out_n[6];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_ATMOSPHERE_COUNT; ++i) {
        const ad_vec_atmosphere_case *c = &ad_vec_atmosphere_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        fill(&y, sizeof y, 0x00U);
        fill(y_n, sizeof y_n, 0x5aU);
        st = ad_atmosphere(x0, x1, &y);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_atmosphere_n(&x0, &x1, y_n, st_n, 1U);
#else
        y_n[0] = y;
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        out[0] = y.temperature;
        out[1] = y.pressure;
        out[2] = y.density;
        out[3] = y.speed_of_sound;
        out[4] = y.dynamic_viscosity;
        out[5] = y.kinematic_viscosity;
        out_n[0] = y_n[0].temperature;
        out_n[1] = y_n[0].pressure;
        out_n[2] = y_n[0].density;
        out_n[3] = y_n[0].speed_of_sound;
        out_n[4] = y_n[0].dynamic_viscosity;
        out_n[5] = y_n[0].kinematic_viscosity;
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_ATMOSPHERE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_ATMOSPHERE_NOUT));
    }
}

static void null_atmosphere(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_atmosphere(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_atmosphere_t y;
        ad_atmosphere_t y0;
        unsigned char s = 0xa5U;
        fill(&y, sizeof y, 0x5aU);
        y0 = y;
        bad += (ad_atmosphere_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_atmosphere_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_atmosphere_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_atmosphere_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_ATMOSPHERE */

#if RUNNER_DO_AIR_DATA
static void run_air_data(tally_t *t)
{
    ad_air_data_t y;
    ad_air_data_t y_n[1];
    ad_real out[11];
    ad_real out_n[11];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_AIR_DATA_COUNT; ++i) {
        const ad_vec_air_data_case *c = &ad_vec_air_data_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        const ad_real x3 = (ad_real)c->in[3];
        const ad_real x4 = (ad_real)c->in[4];
        const int x5 = (int)c->in[5];
        const ad_real x6 = (ad_real)c->in[6];
        fill(&y, sizeof y, 0x00U);
        fill(y_n, sizeof y_n, 0x5aU);
        st = ad_air_data(x0, x1, x2, x3, x4, x5, x6, &y);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_air_data_n(&x0, &x1, &x2, &x3, (x5 != 0) ? &x4 : NULL, x5, x6, y_n, st_n, 1U);
#else
        y_n[0] = y;
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        out[0] = y.pressure_altitude;
        out[1] = y.baro_altitude;
        out[2] = y.impact_pressure;
        out[3] = y.mach;
        out[4] = y.cas;
        out[5] = y.eas;
        out[6] = y.tas;
        out[7] = y.sat;
        out[8] = y.density;
        out[9] = y.density_altitude;
        out[10] = y.dynamic_pressure;
        out_n[0] = y_n[0].pressure_altitude;
        out_n[1] = y_n[0].baro_altitude;
        out_n[2] = y_n[0].impact_pressure;
        out_n[3] = y_n[0].mach;
        out_n[4] = y_n[0].cas;
        out_n[5] = y_n[0].eas;
        out_n[6] = y_n[0].tas;
        out_n[7] = y_n[0].sat;
        out_n[8] = y_n[0].density;
        out_n[9] = y_n[0].density_altitude;
        out_n[10] = y_n[0].dynamic_pressure;
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_AIR_DATA_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_AIR_DATA_NOUT));
    }
}

static void null_air_data(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_air_data(a, a, a, a, a, 1, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_air_data_t y;
        ad_air_data_t y0;
        unsigned char s = 0xa5U;
        fill(&y, sizeof y, 0x5aU);
        y0 = y;
        bad += (ad_air_data_n(NULL, &a, &a, &a, &a, 1, a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, NULL, &a, &a, &a, 1, a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, &a, NULL, &a, &a, 1, a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, &a, &a, NULL, &a, 1, a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, &a, &a, &a, NULL, 1, a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, &a, &a, &a, &a, 1, a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_air_data_n(&a, &a, &a, &a, &a, 1, a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_AIR_DATA */

int main(void)
{
    tally_t t;
    long failed = 0;
    long cases = 0;
    int functions = 0;
    if (RUNNER_RESULTS) {
        printf("airdata-results 1 precision %s\n# airdata vector runner: suite %s, profile %s"
               "\n", RUNNER_PRECISION, AD_VEC_SUITE_VERSION, AD_VEC_PROFILE);
    } else {
        printf("airdata vector runner: suite %s, profile %s, %s port, bound %g * eps * "
               "scale%s\n", AD_VEC_SUITE_VERSION, AD_VEC_PROFILE, RUNNER_PRECISION, AD_VEC_K,
               RUNNER_BATCH_NOTE);
    }
    run_every_function(&t, &failed, &cases, &functions);
#if RUNNER_BATCH
    failed += check_domains();
#endif
    if (RUNNER_RESULTS) {
        printf("end %ld\n", cases);
        return 0;
    }
    printf("%ld cases of %d of the suite's %d functions\n", cases, functions,
           AD_VEC_FUNCTION_COUNT);
    printf("%d functions: %s\n", functions, failed == 0 ? "all passed" : "FAILED");
    return failed == 0 ? 0 : 1;
}

