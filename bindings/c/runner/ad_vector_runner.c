/*
 * ad_vector_runner.c - checks a C port of airdata against the golden vectors.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * C99, no heap, no file system, no JSON: the cases come from the generated headers
 * in vectors/c/ (`airdata vectors build`), the port from bindings/c/include/airdata.h.
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
 * numbers must still agree within the bound); AD_VEC_B32_SKIP skips the case.  One summary line per function; the exit status is non-zero on any failure.
 */
#include <math.h>
#include <stdio.h>

#include "airdata.h"
#include "ad_vectors.h"

#if defined(AIRDATA_PROFILE_US1976) && !defined(AD_VEC_PROFILE_US1976)
#error "the port is built for profile us1976 but the vectors are not: rebuild them with --profile us1976"
#endif
#if !defined(AIRDATA_PROFILE_US1976) && !defined(AD_VEC_PROFILE_ICAO)
#error "the port is built for profile icao but the vectors are not"
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
    t->worst = 0.0;
    t->worst_id = "-";
}

static long tally_finish(const tally_t *t)
{
    printf("%-26s %5ld cases %5ld passed %4ld failed %4ld skipped %4ld lenient  worst %.3g of"
           " bound (case %s)\n", t->name, t->cases, t->cases - t->failed - t->skipped,
           t->failed, t->skipped, t->status_skipped, t->worst, t->worst_id);
    return t->failed;
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

/* Compare one case; counts it and at most one failure. */
static void check_case(tally_t *t, const char *id, ad_status got_status, int want_status,
                       int check32, const ad_real *got, const double *want,
                       const double *scale, int nout)
{
    int ok = 1;
    int check_status = !(RUNNER_SINGLE && check32 != AD_VEC_B32_FULL);
    int k;
    t->cases += 1;
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
        if (isnan(w) || isnan(g)) {
            if ((isnan(w) && isnan(g)) || !check_status) {
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

static void run_atmosphere(tally_t *t)
{
    ad_atmosphere_t a;
    ad_real out[6];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_ATMOSPHERE_COUNT; ++i) {
        const ad_vec_atmosphere_case *c = &ad_vec_atmosphere_cases[i];
        a.temperature = 0;
        a.pressure = 0;
        a.density = 0;
        a.speed_of_sound = 0;
        a.dynamic_viscosity = 0;
        a.kinematic_viscosity = 0;
        st = ad_atmosphere((ad_real)c->in[0], (ad_real)c->in[1], &a);
        out[0] = a.temperature;
        out[1] = a.pressure;
        out[2] = a.density;
        out[3] = a.speed_of_sound;
        out[4] = a.dynamic_viscosity;
        out[5] = a.kinematic_viscosity;
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_ATMOSPHERE_NOUT);
    }
}

static void run_geopotential_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_GEOPOTENTIAL_ALTITUDE_COUNT; ++i) {
        const ad_vec_geopotential_altitude_case *c = &ad_vec_geopotential_altitude_cases[i];
        out[0] = 0;
        st = ad_geopotential_altitude((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_GEOPOTENTIAL_ALTITUDE_NOUT);
    }
}

static void run_geometric_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_GEOMETRIC_ALTITUDE_COUNT; ++i) {
        const ad_vec_geometric_altitude_case *c = &ad_vec_geometric_altitude_cases[i];
        out[0] = 0;
        st = ad_geometric_altitude((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_GEOMETRIC_ALTITUDE_NOUT);
    }
}

static void run_pressure_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_PRESSURE_ALTITUDE_COUNT; ++i) {
        const ad_vec_pressure_altitude_case *c = &ad_vec_pressure_altitude_cases[i];
        out[0] = 0;
        st = ad_pressure_altitude((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_PRESSURE_ALTITUDE_NOUT);
    }
}

static void run_pressure_at_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_PRESSURE_AT_ALTITUDE_COUNT; ++i) {
        const ad_vec_pressure_at_altitude_case *c = &ad_vec_pressure_at_altitude_cases[i];
        out[0] = 0;
        st = ad_pressure_at_altitude((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_PRESSURE_AT_ALTITUDE_NOUT);
    }
}

static void run_baro_corrected_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_BARO_CORRECTED_ALTITUDE_COUNT; ++i) {
        const ad_vec_baro_corrected_altitude_case *c = &ad_vec_baro_corrected_altitude_cases[i];
        out[0] = 0;
        st = ad_baro_corrected_altitude((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_BARO_CORRECTED_ALTITUDE_NOUT);
    }
}

static void run_altimeter_setting(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_ALTIMETER_SETTING_COUNT; ++i) {
        const ad_vec_altimeter_setting_case *c = &ad_vec_altimeter_setting_cases[i];
        out[0] = 0;
        st = ad_altimeter_setting((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_ALTIMETER_SETTING_NOUT);
    }
}

static void run_density_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_DENSITY_ALTITUDE_COUNT; ++i) {
        const ad_vec_density_altitude_case *c = &ad_vec_density_altitude_cases[i];
        out[0] = 0;
        st = ad_density_altitude((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_DENSITY_ALTITUDE_NOUT);
    }
}

static void run_impact_pressure_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_IMPACT_PRESSURE_FROM_MACH_COUNT; ++i) {
        const ad_vec_impact_pressure_from_mach_case *c = &ad_vec_impact_pressure_from_mach_cases[i];
        out[0] = 0;
        st = ad_impact_pressure_from_mach((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_IMPACT_PRESSURE_FROM_MACH_NOUT);
    }
}

static void run_mach_from_impact_pressure(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_IMPACT_PRESSURE_COUNT; ++i) {
        const ad_vec_mach_from_impact_pressure_case *c = &ad_vec_mach_from_impact_pressure_cases[i];
        out[0] = 0;
        st = ad_mach_from_impact_pressure((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_IMPACT_PRESSURE_NOUT);
    }
}

static void run_impact_pressure_from_cas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_IMPACT_PRESSURE_FROM_CAS_COUNT; ++i) {
        const ad_vec_impact_pressure_from_cas_case *c = &ad_vec_impact_pressure_from_cas_cases[i];
        out[0] = 0;
        st = ad_impact_pressure_from_cas((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_IMPACT_PRESSURE_FROM_CAS_NOUT);
    }
}

static void run_cas_from_impact_pressure(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CAS_FROM_IMPACT_PRESSURE_COUNT; ++i) {
        const ad_vec_cas_from_impact_pressure_case *c = &ad_vec_cas_from_impact_pressure_cases[i];
        out[0] = 0;
        st = ad_cas_from_impact_pressure((ad_real)c->in[0], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CAS_FROM_IMPACT_PRESSURE_NOUT);
    }
}

static void run_cas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_cas_from_mach_case *c = &ad_vec_cas_from_mach_cases[i];
        out[0] = 0;
        st = ad_cas_from_mach((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CAS_FROM_MACH_NOUT);
    }
}

static void run_mach_from_cas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_CAS_COUNT; ++i) {
        const ad_vec_mach_from_cas_case *c = &ad_vec_mach_from_cas_cases[i];
        out[0] = 0;
        st = ad_mach_from_cas((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_CAS_NOUT);
    }
}

static void run_eas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_EAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_eas_from_mach_case *c = &ad_vec_eas_from_mach_cases[i];
        out[0] = 0;
        st = ad_eas_from_mach((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_EAS_FROM_MACH_NOUT);
    }
}

static void run_mach_from_eas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_EAS_COUNT; ++i) {
        const ad_vec_mach_from_eas_case *c = &ad_vec_mach_from_eas_cases[i];
        out[0] = 0;
        st = ad_mach_from_eas((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_EAS_NOUT);
    }
}

static void run_tas_from_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_TAS_FROM_MACH_COUNT; ++i) {
        const ad_vec_tas_from_mach_case *c = &ad_vec_tas_from_mach_cases[i];
        out[0] = 0;
        st = ad_tas_from_mach((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_TAS_FROM_MACH_NOUT);
    }
}

static void run_mach_from_tas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MACH_FROM_TAS_COUNT; ++i) {
        const ad_vec_mach_from_tas_case *c = &ad_vec_mach_from_tas_cases[i];
        out[0] = 0;
        st = ad_mach_from_tas((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MACH_FROM_TAS_NOUT);
    }
}

static void run_dynamic_pressure(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_DYNAMIC_PRESSURE_COUNT; ++i) {
        const ad_vec_dynamic_pressure_case *c = &ad_vec_dynamic_pressure_cases[i];
        out[0] = 0;
        st = ad_dynamic_pressure((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_DYNAMIC_PRESSURE_NOUT);
    }
}

static void run_sat_from_tat(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_SAT_FROM_TAT_COUNT; ++i) {
        const ad_vec_sat_from_tat_case *c = &ad_vec_sat_from_tat_cases[i];
        out[0] = 0;
        st = ad_sat_from_tat((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_SAT_FROM_TAT_NOUT);
    }
}

static void run_tat_from_sat(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_TAT_FROM_SAT_COUNT; ++i) {
        const ad_vec_tat_from_sat_case *c = &ad_vec_tat_from_sat_cases[i];
        out[0] = 0;
        st = ad_tat_from_sat((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_TAT_FROM_SAT_NOUT);
    }
}

static void run_air_data(tally_t *t)
{
    ad_air_data_t d;
    ad_real out[11];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_AIR_DATA_COUNT; ++i) {
        const ad_vec_air_data_case *c = &ad_vec_air_data_cases[i];
        d.pressure_altitude = 0;
        d.baro_altitude = 0;
        d.impact_pressure = 0;
        d.mach = 0;
        d.cas = 0;
        d.eas = 0;
        d.tas = 0;
        d.sat = 0;
        d.density = 0;
        d.density_altitude = 0;
        d.dynamic_pressure = 0;
        st = ad_air_data((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2],
                         (ad_real)c->in[3], (ad_real)c->in[4], (int)c->in[5],
                         (ad_real)c->in[6], &d);
        out[0] = d.pressure_altitude;
        out[1] = d.baro_altitude;
        out[2] = d.impact_pressure;
        out[3] = d.mach;
        out[4] = d.cas;
        out[5] = d.eas;
        out[6] = d.tas;
        out[7] = d.sat;
        out[8] = d.density;
        out[9] = d.density_altitude;
        out[10] = d.dynamic_pressure;
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_AIR_DATA_NOUT);
    }
}

static void run_stall_eas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_EAS_COUNT; ++i) {
        const ad_vec_stall_eas_case *c = &ad_vec_stall_eas_cases[i];
        out[0] = 0;
        st = ad_stall_eas((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], (ad_real)c->in[3],
                       &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_EAS_NOUT);
    }
}

static void run_stall_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_MACH_COUNT; ++i) {
        const ad_vec_stall_mach_case *c = &ad_vec_stall_mach_cases[i];
        out[0] = 0;
        st = ad_stall_mach((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], (ad_real)c->in[3], (ad_real)c->in[4],
                       &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_MACH_NOUT);
    }
}

static void run_stall_cas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_CAS_COUNT; ++i) {
        const ad_vec_stall_cas_case *c = &ad_vec_stall_cas_cases[i];
        out[0] = 0;
        st = ad_stall_cas((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], (ad_real)c->in[3], (ad_real)c->in[4],
                       &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_CAS_NOUT);
    }
}

static void run_stall_tas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_STALL_TAS_COUNT; ++i) {
        const ad_vec_stall_tas_case *c = &ad_vec_stall_tas_cases[i];
        out[0] = 0;
        st = ad_stall_tas((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], (ad_real)c->in[3], (ad_real)c->in[4], (ad_real)c->in[5],
                       &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_STALL_TAS_NOUT);
    }
}

static void run_crossover_altitude(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CROSSOVER_ALTITUDE_COUNT; ++i) {
        const ad_vec_crossover_altitude_case *c = &ad_vec_crossover_altitude_cases[i];
        out[0] = 0;
        st = ad_crossover_altitude((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CROSSOVER_ALTITUDE_NOUT);
    }
}

static void run_max_operating_cas(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MAX_OPERATING_CAS_COUNT; ++i) {
        const ad_vec_max_operating_cas_case *c = &ad_vec_max_operating_cas_cases[i];
        out[0] = 0;
        st = ad_max_operating_cas((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MAX_OPERATING_CAS_NOUT);
    }
}

static void run_max_operating_mach(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_MAX_OPERATING_MACH_COUNT; ++i) {
        const ad_vec_max_operating_mach_case *c = &ad_vec_max_operating_mach_cases[i];
        out[0] = 0;
        st = ad_max_operating_mach((ad_real)c->in[0], (ad_real)c->in[1], (ad_real)c->in[2], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_MAX_OPERATING_MACH_NOUT);
    }
}

static void run_ceiling_margin(tally_t *t)
{
    ad_real out[1];
    ad_status st;
    int i;
    for (i = 0; i < AD_VEC_CEILING_MARGIN_COUNT; ++i) {
        const ad_vec_ceiling_margin_case *c = &ad_vec_ceiling_margin_cases[i];
        out[0] = 0;
        st = ad_ceiling_margin((ad_real)c->in[0], (ad_real)c->in[1], &out[0]);
        check_case(t, c->id, st, c->status, c->binary32_check, out, c->expected,
                   c->scale, AD_VEC_CEILING_MARGIN_NOUT);
    }
}

int main(void)
{
    tally_t t;
    long failed = 0;
    printf("airdata vector runner: suite %s, profile %s, %s port, bound %g * eps * scale\n",
           AD_VEC_SUITE_VERSION, AD_VEC_PROFILE, RUNNER_PRECISION, AD_VEC_K);
    tally_start(&t, "atmosphere");
    run_atmosphere(&t);
    failed += tally_finish(&t);
    tally_start(&t, "geopotential_altitude");
    run_geopotential_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "geometric_altitude");
    run_geometric_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "pressure_altitude");
    run_pressure_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "pressure_at_altitude");
    run_pressure_at_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "baro_corrected_altitude");
    run_baro_corrected_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "altimeter_setting");
    run_altimeter_setting(&t);
    failed += tally_finish(&t);
    tally_start(&t, "density_altitude");
    run_density_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "impact_pressure_from_mach");
    run_impact_pressure_from_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "mach_from_impact_pressure");
    run_mach_from_impact_pressure(&t);
    failed += tally_finish(&t);
    tally_start(&t, "impact_pressure_from_cas");
    run_impact_pressure_from_cas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "cas_from_impact_pressure");
    run_cas_from_impact_pressure(&t);
    failed += tally_finish(&t);
    tally_start(&t, "cas_from_mach");
    run_cas_from_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "mach_from_cas");
    run_mach_from_cas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "eas_from_mach");
    run_eas_from_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "mach_from_eas");
    run_mach_from_eas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "tas_from_mach");
    run_tas_from_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "mach_from_tas");
    run_mach_from_tas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "dynamic_pressure");
    run_dynamic_pressure(&t);
    failed += tally_finish(&t);
    tally_start(&t, "sat_from_tat");
    run_sat_from_tat(&t);
    failed += tally_finish(&t);
    tally_start(&t, "tat_from_sat");
    run_tat_from_sat(&t);
    failed += tally_finish(&t);
    tally_start(&t, "air_data");
    run_air_data(&t);
    failed += tally_finish(&t);
    tally_start(&t, "stall_eas");
    run_stall_eas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "stall_mach");
    run_stall_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "stall_cas");
    run_stall_cas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "stall_tas");
    run_stall_tas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "crossover_altitude");
    run_crossover_altitude(&t);
    failed += tally_finish(&t);
    tally_start(&t, "max_operating_cas");
    run_max_operating_cas(&t);
    failed += tally_finish(&t);
    tally_start(&t, "max_operating_mach");
    run_max_operating_mach(&t);
    failed += tally_finish(&t);
    tally_start(&t, "ceiling_margin");
    run_ceiling_margin(&t);
    failed += tally_finish(&t);
    printf("%d functions: %s\n", AD_VEC_FUNCTION_COUNT, failed == 0 ? "all passed" : "FAILED");
    return failed == 0 ? 0 : 1;
}
