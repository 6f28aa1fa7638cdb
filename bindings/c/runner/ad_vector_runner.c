/*
 * ad_vector_runner.c - checks a C port of airdata against the golden vectors.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * C99, no heap, no file system, no JSON: the cases come from the generated headers
 * in vectors/c/ (`airdata vectors build`), the port from bindings/c/include/airdata.h
 * and bindings/c/include/airdata_batch.h.
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

/* Functions built in: all of them, or with -DRUNNER_SUBSET only those named by
 * -DRUNNER_WITH_<NAME> (upper-case reference name, e.g. -DRUNNER_WITH_PRESSURE_ALTITUDE);
 * the port then needs to define only those functions. */
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_ATMOSPHERE)
#define RUNNER_DO_ATMOSPHERE 1
#else
#define RUNNER_DO_ATMOSPHERE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_GEOPOTENTIAL_ALTITUDE)
#define RUNNER_DO_GEOPOTENTIAL_ALTITUDE 1
#else
#define RUNNER_DO_GEOPOTENTIAL_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_GEOMETRIC_ALTITUDE)
#define RUNNER_DO_GEOMETRIC_ALTITUDE 1
#else
#define RUNNER_DO_GEOMETRIC_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_PRESSURE_ALTITUDE)
#define RUNNER_DO_PRESSURE_ALTITUDE 1
#else
#define RUNNER_DO_PRESSURE_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_PRESSURE_AT_ALTITUDE)
#define RUNNER_DO_PRESSURE_AT_ALTITUDE 1
#else
#define RUNNER_DO_PRESSURE_AT_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_BARO_CORRECTED_ALTITUDE)
#define RUNNER_DO_BARO_CORRECTED_ALTITUDE 1
#else
#define RUNNER_DO_BARO_CORRECTED_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_ALTIMETER_SETTING)
#define RUNNER_DO_ALTIMETER_SETTING 1
#else
#define RUNNER_DO_ALTIMETER_SETTING 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_DENSITY_ALTITUDE)
#define RUNNER_DO_DENSITY_ALTITUDE 1
#else
#define RUNNER_DO_DENSITY_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_IMPACT_PRESSURE_FROM_MACH)
#define RUNNER_DO_IMPACT_PRESSURE_FROM_MACH 1
#else
#define RUNNER_DO_IMPACT_PRESSURE_FROM_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MACH_FROM_IMPACT_PRESSURE)
#define RUNNER_DO_MACH_FROM_IMPACT_PRESSURE 1
#else
#define RUNNER_DO_MACH_FROM_IMPACT_PRESSURE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_IMPACT_PRESSURE_FROM_CAS)
#define RUNNER_DO_IMPACT_PRESSURE_FROM_CAS 1
#else
#define RUNNER_DO_IMPACT_PRESSURE_FROM_CAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_CAS_FROM_IMPACT_PRESSURE)
#define RUNNER_DO_CAS_FROM_IMPACT_PRESSURE 1
#else
#define RUNNER_DO_CAS_FROM_IMPACT_PRESSURE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_CAS_FROM_MACH)
#define RUNNER_DO_CAS_FROM_MACH 1
#else
#define RUNNER_DO_CAS_FROM_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MACH_FROM_CAS)
#define RUNNER_DO_MACH_FROM_CAS 1
#else
#define RUNNER_DO_MACH_FROM_CAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_EAS_FROM_MACH)
#define RUNNER_DO_EAS_FROM_MACH 1
#else
#define RUNNER_DO_EAS_FROM_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MACH_FROM_EAS)
#define RUNNER_DO_MACH_FROM_EAS 1
#else
#define RUNNER_DO_MACH_FROM_EAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_TAS_FROM_MACH)
#define RUNNER_DO_TAS_FROM_MACH 1
#else
#define RUNNER_DO_TAS_FROM_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MACH_FROM_TAS)
#define RUNNER_DO_MACH_FROM_TAS 1
#else
#define RUNNER_DO_MACH_FROM_TAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_DYNAMIC_PRESSURE)
#define RUNNER_DO_DYNAMIC_PRESSURE 1
#else
#define RUNNER_DO_DYNAMIC_PRESSURE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_SAT_FROM_TAT)
#define RUNNER_DO_SAT_FROM_TAT 1
#else
#define RUNNER_DO_SAT_FROM_TAT 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_TAT_FROM_SAT)
#define RUNNER_DO_TAT_FROM_SAT 1
#else
#define RUNNER_DO_TAT_FROM_SAT 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_AIR_DATA)
#define RUNNER_DO_AIR_DATA 1
#else
#define RUNNER_DO_AIR_DATA 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_STALL_EAS)
#define RUNNER_DO_STALL_EAS 1
#else
#define RUNNER_DO_STALL_EAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_STALL_MACH)
#define RUNNER_DO_STALL_MACH 1
#else
#define RUNNER_DO_STALL_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_STALL_CAS)
#define RUNNER_DO_STALL_CAS 1
#else
#define RUNNER_DO_STALL_CAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_STALL_TAS)
#define RUNNER_DO_STALL_TAS 1
#else
#define RUNNER_DO_STALL_TAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_CROSSOVER_ALTITUDE)
#define RUNNER_DO_CROSSOVER_ALTITUDE 1
#else
#define RUNNER_DO_CROSSOVER_ALTITUDE 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MAX_OPERATING_CAS)
#define RUNNER_DO_MAX_OPERATING_CAS 1
#else
#define RUNNER_DO_MAX_OPERATING_CAS 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_MAX_OPERATING_MACH)
#define RUNNER_DO_MAX_OPERATING_MACH 1
#else
#define RUNNER_DO_MAX_OPERATING_MACH 0
#endif
#if !defined(RUNNER_SUBSET) || defined(RUNNER_WITH_CEILING_MARGIN)
#define RUNNER_DO_CEILING_MARGIN 1
#else
#define RUNNER_DO_CEILING_MARGIN 0
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

#if RUNNER_DO_GEOPOTENTIAL_ALTITUDE
static void run_geopotential_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_GEOPOTENTIAL_ALTITUDE_COUNT; ++i) {
        const ad_vec_geopotential_altitude_case *c = &ad_vec_geopotential_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_geopotential_altitude(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_geopotential_altitude_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_GEOPOTENTIAL_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_GEOPOTENTIAL_ALTITUDE_NOUT));
    }
}

static void null_geopotential_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_geopotential_altitude(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_geopotential_altitude_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_geopotential_altitude_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_geopotential_altitude_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_GEOPOTENTIAL_ALTITUDE */

#if RUNNER_DO_GEOMETRIC_ALTITUDE
static void run_geometric_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_GEOMETRIC_ALTITUDE_COUNT; ++i) {
        const ad_vec_geometric_altitude_case *c = &ad_vec_geometric_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_geometric_altitude(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_geometric_altitude_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_GEOMETRIC_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_GEOMETRIC_ALTITUDE_NOUT));
    }
}

static void null_geometric_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_geometric_altitude(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_geometric_altitude_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_geometric_altitude_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_geometric_altitude_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_GEOMETRIC_ALTITUDE */

#if RUNNER_DO_PRESSURE_ALTITUDE
static void run_pressure_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_PRESSURE_ALTITUDE_COUNT; ++i) {
        const ad_vec_pressure_altitude_case *c = &ad_vec_pressure_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_pressure_altitude(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_pressure_altitude_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_PRESSURE_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_PRESSURE_ALTITUDE_NOUT));
    }
}

static void null_pressure_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_pressure_altitude(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_pressure_altitude_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_pressure_altitude_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_pressure_altitude_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_PRESSURE_ALTITUDE */

#if RUNNER_DO_PRESSURE_AT_ALTITUDE
static void run_pressure_at_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_PRESSURE_AT_ALTITUDE_COUNT; ++i) {
        const ad_vec_pressure_at_altitude_case *c = &ad_vec_pressure_at_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_pressure_at_altitude(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_pressure_at_altitude_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_PRESSURE_AT_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_PRESSURE_AT_ALTITUDE_NOUT));
    }
}

static void null_pressure_at_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_pressure_at_altitude(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_pressure_at_altitude_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_pressure_at_altitude_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_pressure_at_altitude_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_PRESSURE_AT_ALTITUDE */

#if RUNNER_DO_BARO_CORRECTED_ALTITUDE
static void run_baro_corrected_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_BARO_CORRECTED_ALTITUDE_COUNT; ++i) {
        const ad_vec_baro_corrected_altitude_case *c = &ad_vec_baro_corrected_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_baro_corrected_altitude(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_baro_corrected_altitude_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_BARO_CORRECTED_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_BARO_CORRECTED_ALTITUDE_NOUT));
    }
}

static void null_baro_corrected_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_baro_corrected_altitude(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_baro_corrected_altitude_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_baro_corrected_altitude_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_baro_corrected_altitude_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_baro_corrected_altitude_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_BARO_CORRECTED_ALTITUDE */

#if RUNNER_DO_ALTIMETER_SETTING
static void run_altimeter_setting(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_ALTIMETER_SETTING_COUNT; ++i) {
        const ad_vec_altimeter_setting_case *c = &ad_vec_altimeter_setting_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_altimeter_setting(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_altimeter_setting_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_ALTIMETER_SETTING_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_ALTIMETER_SETTING_NOUT));
    }
}

static void null_altimeter_setting(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_altimeter_setting(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_altimeter_setting_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_altimeter_setting_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_altimeter_setting_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_altimeter_setting_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_ALTIMETER_SETTING */

#if RUNNER_DO_DENSITY_ALTITUDE
static void run_density_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_DENSITY_ALTITUDE_COUNT; ++i) {
        const ad_vec_density_altitude_case *c = &ad_vec_density_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_density_altitude(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_density_altitude_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_DENSITY_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_DENSITY_ALTITUDE_NOUT));
    }
}

static void null_density_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_density_altitude(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_density_altitude_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_density_altitude_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_density_altitude_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_density_altitude_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_DENSITY_ALTITUDE */

#if RUNNER_DO_IMPACT_PRESSURE_FROM_MACH
static void run_impact_pressure_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_IMPACT_PRESSURE_FROM_MACH_COUNT; ++i) {
        const ad_vec_impact_pressure_from_mach_case *c = &ad_vec_impact_pressure_from_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_impact_pressure_from_mach(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_impact_pressure_from_mach_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_IMPACT_PRESSURE_FROM_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_IMPACT_PRESSURE_FROM_MACH_NOUT));
    }
}

static void null_impact_pressure_from_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_impact_pressure_from_mach(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_impact_pressure_from_mach_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_impact_pressure_from_mach_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_impact_pressure_from_mach_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_impact_pressure_from_mach_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_IMPACT_PRESSURE_FROM_MACH */

#if RUNNER_DO_MACH_FROM_IMPACT_PRESSURE
static void run_mach_from_impact_pressure(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_IMPACT_PRESSURE_COUNT; ++i) {
        const ad_vec_mach_from_impact_pressure_case *c = &ad_vec_mach_from_impact_pressure_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_mach_from_impact_pressure(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_mach_from_impact_pressure_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_IMPACT_PRESSURE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MACH_FROM_IMPACT_PRESSURE_NOUT));
    }
}

static void null_mach_from_impact_pressure(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_mach_from_impact_pressure(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_mach_from_impact_pressure_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_impact_pressure_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_impact_pressure_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_impact_pressure_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MACH_FROM_IMPACT_PRESSURE */

#if RUNNER_DO_IMPACT_PRESSURE_FROM_CAS
static void run_impact_pressure_from_cas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_IMPACT_PRESSURE_FROM_CAS_COUNT; ++i) {
        const ad_vec_impact_pressure_from_cas_case *c = &ad_vec_impact_pressure_from_cas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_impact_pressure_from_cas(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_impact_pressure_from_cas_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_IMPACT_PRESSURE_FROM_CAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_IMPACT_PRESSURE_FROM_CAS_NOUT));
    }
}

static void null_impact_pressure_from_cas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_impact_pressure_from_cas(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_impact_pressure_from_cas_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_impact_pressure_from_cas_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_impact_pressure_from_cas_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_IMPACT_PRESSURE_FROM_CAS */

#if RUNNER_DO_CAS_FROM_IMPACT_PRESSURE
static void run_cas_from_impact_pressure(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CAS_FROM_IMPACT_PRESSURE_COUNT; ++i) {
        const ad_vec_cas_from_impact_pressure_case *c = &ad_vec_cas_from_impact_pressure_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_cas_from_impact_pressure(x0, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_cas_from_impact_pressure_n(&x0, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CAS_FROM_IMPACT_PRESSURE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_CAS_FROM_IMPACT_PRESSURE_NOUT));
    }
}

static void null_cas_from_impact_pressure(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_cas_from_impact_pressure(a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_cas_from_impact_pressure_n(NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_cas_from_impact_pressure_n(&a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_cas_from_impact_pressure_n(&a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_CAS_FROM_IMPACT_PRESSURE */

#if RUNNER_DO_CAS_FROM_MACH
static void run_cas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_cas_from_mach_case *c = &ad_vec_cas_from_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_cas_from_mach(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_cas_from_mach_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CAS_FROM_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_CAS_FROM_MACH_NOUT));
    }
}

static void null_cas_from_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_cas_from_mach(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_cas_from_mach_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_cas_from_mach_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_cas_from_mach_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_cas_from_mach_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_CAS_FROM_MACH */

#if RUNNER_DO_MACH_FROM_CAS
static void run_mach_from_cas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_CAS_COUNT; ++i) {
        const ad_vec_mach_from_cas_case *c = &ad_vec_mach_from_cas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_mach_from_cas(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_mach_from_cas_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_CAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MACH_FROM_CAS_NOUT));
    }
}

static void null_mach_from_cas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_mach_from_cas(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_mach_from_cas_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_cas_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_cas_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_cas_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MACH_FROM_CAS */

#if RUNNER_DO_EAS_FROM_MACH
static void run_eas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_EAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_eas_from_mach_case *c = &ad_vec_eas_from_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_eas_from_mach(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_eas_from_mach_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_EAS_FROM_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_EAS_FROM_MACH_NOUT));
    }
}

static void null_eas_from_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_eas_from_mach(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_eas_from_mach_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_eas_from_mach_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_eas_from_mach_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_eas_from_mach_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_EAS_FROM_MACH */

#if RUNNER_DO_MACH_FROM_EAS
static void run_mach_from_eas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_EAS_COUNT; ++i) {
        const ad_vec_mach_from_eas_case *c = &ad_vec_mach_from_eas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_mach_from_eas(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_mach_from_eas_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_EAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MACH_FROM_EAS_NOUT));
    }
}

static void null_mach_from_eas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_mach_from_eas(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_mach_from_eas_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_eas_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_eas_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_eas_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MACH_FROM_EAS */

#if RUNNER_DO_TAS_FROM_MACH
static void run_tas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_TAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_tas_from_mach_case *c = &ad_vec_tas_from_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_tas_from_mach(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_tas_from_mach_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_TAS_FROM_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_TAS_FROM_MACH_NOUT));
    }
}

static void null_tas_from_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_tas_from_mach(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_tas_from_mach_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tas_from_mach_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tas_from_mach_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tas_from_mach_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_TAS_FROM_MACH */

#if RUNNER_DO_MACH_FROM_TAS
static void run_mach_from_tas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_TAS_COUNT; ++i) {
        const ad_vec_mach_from_tas_case *c = &ad_vec_mach_from_tas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_mach_from_tas(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_mach_from_tas_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_TAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MACH_FROM_TAS_NOUT));
    }
}

static void null_mach_from_tas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_mach_from_tas(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_mach_from_tas_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_tas_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_tas_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_mach_from_tas_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MACH_FROM_TAS */

#if RUNNER_DO_DYNAMIC_PRESSURE
static void run_dynamic_pressure(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_DYNAMIC_PRESSURE_COUNT; ++i) {
        const ad_vec_dynamic_pressure_case *c = &ad_vec_dynamic_pressure_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_dynamic_pressure(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_dynamic_pressure_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_DYNAMIC_PRESSURE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_DYNAMIC_PRESSURE_NOUT));
    }
}

static void null_dynamic_pressure(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_dynamic_pressure(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_dynamic_pressure_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_dynamic_pressure_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_dynamic_pressure_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_dynamic_pressure_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_DYNAMIC_PRESSURE */

#if RUNNER_DO_SAT_FROM_TAT
static void run_sat_from_tat(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_SAT_FROM_TAT_COUNT; ++i) {
        const ad_vec_sat_from_tat_case *c = &ad_vec_sat_from_tat_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_sat_from_tat(x0, x1, x2, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_sat_from_tat_n(&x0, &x1, &x2, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_SAT_FROM_TAT_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_SAT_FROM_TAT_NOUT));
    }
}

static void null_sat_from_tat(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_sat_from_tat(a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_sat_from_tat_n(NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_sat_from_tat_n(&a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_sat_from_tat_n(&a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_sat_from_tat_n(&a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_sat_from_tat_n(&a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_SAT_FROM_TAT */

#if RUNNER_DO_TAT_FROM_SAT
static void run_tat_from_sat(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_TAT_FROM_SAT_COUNT; ++i) {
        const ad_vec_tat_from_sat_case *c = &ad_vec_tat_from_sat_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_tat_from_sat(x0, x1, x2, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_tat_from_sat_n(&x0, &x1, &x2, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_TAT_FROM_SAT_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_TAT_FROM_SAT_NOUT));
    }
}

static void null_tat_from_sat(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_tat_from_sat(a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_tat_from_sat_n(NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tat_from_sat_n(&a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tat_from_sat_n(&a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tat_from_sat_n(&a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_tat_from_sat_n(&a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_TAT_FROM_SAT */

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

#if RUNNER_DO_STALL_EAS
static void run_stall_eas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_EAS_COUNT; ++i) {
        const ad_vec_stall_eas_case *c = &ad_vec_stall_eas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        const ad_real x3 = (ad_real)c->in[3];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_stall_eas(x0, x1, x2, x3, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_stall_eas_n(&x0, &x1, &x2, &x3, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_EAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_STALL_EAS_NOUT));
    }
}

static void null_stall_eas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_stall_eas(a, a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_stall_eas_n(NULL, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_eas_n(&a, NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_eas_n(&a, &a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_eas_n(&a, &a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_eas_n(&a, &a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_eas_n(&a, &a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_STALL_EAS */

#if RUNNER_DO_STALL_MACH
static void run_stall_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_MACH_COUNT; ++i) {
        const ad_vec_stall_mach_case *c = &ad_vec_stall_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        const ad_real x3 = (ad_real)c->in[3];
        const ad_real x4 = (ad_real)c->in[4];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_stall_mach(x0, x1, x2, x3, x4, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_stall_mach_n(&x0, &x1, &x2, &x3, &x4, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_STALL_MACH_NOUT));
    }
}

static void null_stall_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_stall_mach(a, a, a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_stall_mach_n(NULL, &a, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, NULL, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, &a, NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, &a, &a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, &a, &a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, &a, &a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_mach_n(&a, &a, &a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_STALL_MACH */

#if RUNNER_DO_STALL_CAS
static void run_stall_cas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_CAS_COUNT; ++i) {
        const ad_vec_stall_cas_case *c = &ad_vec_stall_cas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        const ad_real x3 = (ad_real)c->in[3];
        const ad_real x4 = (ad_real)c->in[4];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_stall_cas(x0, x1, x2, x3, x4, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_stall_cas_n(&x0, &x1, &x2, &x3, &x4, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_CAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_STALL_CAS_NOUT));
    }
}

static void null_stall_cas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_stall_cas(a, a, a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_stall_cas_n(NULL, &a, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, NULL, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, &a, NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, &a, &a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, &a, &a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, &a, &a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_cas_n(&a, &a, &a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_STALL_CAS */

#if RUNNER_DO_STALL_TAS
static void run_stall_tas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_TAS_COUNT; ++i) {
        const ad_vec_stall_tas_case *c = &ad_vec_stall_tas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        const ad_real x3 = (ad_real)c->in[3];
        const ad_real x4 = (ad_real)c->in[4];
        const ad_real x5 = (ad_real)c->in[5];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_stall_tas(x0, x1, x2, x3, x4, x5, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_stall_tas_n(&x0, &x1, &x2, &x3, &x4, &x5, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_TAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_STALL_TAS_NOUT));
    }
}

static void null_stall_tas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_stall_tas(a, a, a, a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_stall_tas_n(NULL, &a, &a, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, NULL, &a, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, NULL, &a, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, &a, NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, &a, &a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, &a, &a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, &a, &a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_stall_tas_n(&a, &a, &a, &a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_STALL_TAS */

#if RUNNER_DO_CROSSOVER_ALTITUDE
static void run_crossover_altitude(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CROSSOVER_ALTITUDE_COUNT; ++i) {
        const ad_vec_crossover_altitude_case *c = &ad_vec_crossover_altitude_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_crossover_altitude(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_crossover_altitude_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CROSSOVER_ALTITUDE_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_CROSSOVER_ALTITUDE_NOUT));
    }
}

static void null_crossover_altitude(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_crossover_altitude(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_crossover_altitude_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_crossover_altitude_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_crossover_altitude_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_crossover_altitude_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_CROSSOVER_ALTITUDE */

#if RUNNER_DO_MAX_OPERATING_CAS
static void run_max_operating_cas(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MAX_OPERATING_CAS_COUNT; ++i) {
        const ad_vec_max_operating_cas_case *c = &ad_vec_max_operating_cas_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_max_operating_cas(x0, x1, x2, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_max_operating_cas_n(&x0, &x1, &x2, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MAX_OPERATING_CAS_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MAX_OPERATING_CAS_NOUT));
    }
}

static void null_max_operating_cas(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_max_operating_cas(a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_max_operating_cas_n(NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_cas_n(&a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_cas_n(&a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_cas_n(&a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_cas_n(&a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MAX_OPERATING_CAS */

#if RUNNER_DO_MAX_OPERATING_MACH
static void run_max_operating_mach(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MAX_OPERATING_MACH_COUNT; ++i) {
        const ad_vec_max_operating_mach_case *c = &ad_vec_max_operating_mach_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        const ad_real x2 = (ad_real)c->in[2];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_max_operating_mach(x0, x1, x2, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_max_operating_mach_n(&x0, &x1, &x2, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MAX_OPERATING_MACH_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_MAX_OPERATING_MACH_NOUT));
    }
}

static void null_max_operating_mach(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_max_operating_mach(a, a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_max_operating_mach_n(NULL, &a, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_mach_n(&a, NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_mach_n(&a, &a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_mach_n(&a, &a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_max_operating_mach_n(&a, &a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_MAX_OPERATING_MACH */

#if RUNNER_DO_CEILING_MARGIN
static void run_ceiling_margin(tally_t *t)
{
    ad_real out[1];
    ad_real out_n[1];
    unsigned char st_n[1];
    size_t bad;
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CEILING_MARGIN_COUNT; ++i) {
        const ad_vec_ceiling_margin_case *c = &ad_vec_ceiling_margin_cases[i];
        const ad_real x0 = (ad_real)c->in[0];
        const ad_real x1 = (ad_real)c->in[1];
        out[0] = 0;
        fill(out_n, sizeof out_n, 0x5aU);
        st = ad_ceiling_margin(x0, x1, &out[0]);
#if RUNNER_BATCH
        st_n[0] = 0xffU;
        bad = ad_ceiling_margin_n(&x0, &x1, out_n, st_n, 1U);
#else
        out_n[0] = out[0];
        st_n[0] = (unsigned char)st;
        bad = is_error(st);
#endif
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CEILING_MARGIN_NOUT,
                   batch_same(st, st_n[0], bad, out, out_n, AD_VEC_CEILING_MARGIN_NOUT));
    }
}

static void null_ceiling_margin(tally_t *t)
{
    const ad_real a = (ad_real)1;
    int bad = 0;
    bad += (ad_ceiling_margin(a, a, NULL) != AD_INVALID_INPUT);
#if RUNNER_BATCH
    {
        ad_real y = (ad_real)7;
        ad_real y0;
        unsigned char s = 0xa5U;
        y0 = y;
        bad += (ad_ceiling_margin_n(NULL, &a, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_ceiling_margin_n(&a, NULL, &y, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_ceiling_margin_n(&a, &a, NULL, &s, 1U) != AD_BATCH_NULL);
        bad += (ad_ceiling_margin_n(&a, &a, &y, NULL, 1U) != AD_BATCH_NULL);
        bad += (memcmp(&y, &y0, sizeof y) != 0) || (s != 0xa5U);
    }
#endif
    contract(t, bad, "a NULL pointer is refused and nothing is written");
}
#endif /* RUNNER_DO_CEILING_MARGIN */

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
#if RUNNER_DO_ATMOSPHERE
    tally_start(&t, "atmosphere");
    run_atmosphere(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_atmosphere(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_GEOPOTENTIAL_ALTITUDE
    tally_start(&t, "geopotential_altitude");
    run_geopotential_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_geopotential_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_GEOMETRIC_ALTITUDE
    tally_start(&t, "geometric_altitude");
    run_geometric_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_geometric_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_PRESSURE_ALTITUDE
    tally_start(&t, "pressure_altitude");
    run_pressure_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_pressure_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_PRESSURE_AT_ALTITUDE
    tally_start(&t, "pressure_at_altitude");
    run_pressure_at_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_pressure_at_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_BARO_CORRECTED_ALTITUDE
    tally_start(&t, "baro_corrected_altitude");
    run_baro_corrected_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_baro_corrected_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_ALTIMETER_SETTING
    tally_start(&t, "altimeter_setting");
    run_altimeter_setting(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_altimeter_setting(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_DENSITY_ALTITUDE
    tally_start(&t, "density_altitude");
    run_density_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_density_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_IMPACT_PRESSURE_FROM_MACH
    tally_start(&t, "impact_pressure_from_mach");
    run_impact_pressure_from_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_impact_pressure_from_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MACH_FROM_IMPACT_PRESSURE
    tally_start(&t, "mach_from_impact_pressure");
    run_mach_from_impact_pressure(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_mach_from_impact_pressure(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_IMPACT_PRESSURE_FROM_CAS
    tally_start(&t, "impact_pressure_from_cas");
    run_impact_pressure_from_cas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_impact_pressure_from_cas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_CAS_FROM_IMPACT_PRESSURE
    tally_start(&t, "cas_from_impact_pressure");
    run_cas_from_impact_pressure(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_cas_from_impact_pressure(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_CAS_FROM_MACH
    tally_start(&t, "cas_from_mach");
    run_cas_from_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_cas_from_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MACH_FROM_CAS
    tally_start(&t, "mach_from_cas");
    run_mach_from_cas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_mach_from_cas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_EAS_FROM_MACH
    tally_start(&t, "eas_from_mach");
    run_eas_from_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_eas_from_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MACH_FROM_EAS
    tally_start(&t, "mach_from_eas");
    run_mach_from_eas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_mach_from_eas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_TAS_FROM_MACH
    tally_start(&t, "tas_from_mach");
    run_tas_from_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_tas_from_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MACH_FROM_TAS
    tally_start(&t, "mach_from_tas");
    run_mach_from_tas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_mach_from_tas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_DYNAMIC_PRESSURE
    tally_start(&t, "dynamic_pressure");
    run_dynamic_pressure(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_dynamic_pressure(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_SAT_FROM_TAT
    tally_start(&t, "sat_from_tat");
    run_sat_from_tat(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_sat_from_tat(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_TAT_FROM_SAT
    tally_start(&t, "tat_from_sat");
    run_tat_from_sat(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_tat_from_sat(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_AIR_DATA
    tally_start(&t, "air_data");
    run_air_data(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_air_data(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_STALL_EAS
    tally_start(&t, "stall_eas");
    run_stall_eas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_stall_eas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_STALL_MACH
    tally_start(&t, "stall_mach");
    run_stall_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_stall_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_STALL_CAS
    tally_start(&t, "stall_cas");
    run_stall_cas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_stall_cas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_STALL_TAS
    tally_start(&t, "stall_tas");
    run_stall_tas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_stall_tas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_CROSSOVER_ALTITUDE
    tally_start(&t, "crossover_altitude");
    run_crossover_altitude(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_crossover_altitude(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MAX_OPERATING_CAS
    tally_start(&t, "max_operating_cas");
    run_max_operating_cas(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_max_operating_cas(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_MAX_OPERATING_MACH
    tally_start(&t, "max_operating_mach");
    run_max_operating_mach(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_max_operating_mach(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
#if RUNNER_DO_CEILING_MARGIN
    tally_start(&t, "ceiling_margin");
    run_ceiling_margin(&t);
    if (t.failed == 0 && !RUNNER_RESULTS) {
        null_ceiling_margin(&t);
    }
    failed += tally_finish(&t);
    functions += 1;
    cases += t.cases;
#endif
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

