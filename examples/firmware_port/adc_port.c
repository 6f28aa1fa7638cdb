/*
 * Example firmware port: an invented avionics bench team's binary32 air-data routines,
 * written the way embedded code commonly is (rounded constants, single-precision power
 * laws), behind the project's airdata.h.  It exists to show `airdata port check
 * --requirements`: it is far outside the reference-equivalent roundoff bound, yet meets
 * its own requirements (examples/requirements/firmware_port.toml).
 *
 * Equations: U.S. Standard Atmosphere 1976 eqs. 33a/33b (pressure altitude), NACA
 * Report 1135 eqs. 43, 44 and 100 (temperature recovery, isentropic and Rayleigh pitot
 * relations).  Constants rounded to 6 significant digits, as is common practice (no
 * source).  Not flight software: an example for a verification tool.
 *
 * C99, no heap, no recursion, every loop has a fixed bound.
 */
#include <math.h>
#include "airdata.h"

#define P0      101325.0f     /* Pa, sea-level pressure */
#define A0      340.294f      /* m/s, sea-level speed of sound (rounded) */
#define P11     22632.1f      /* Pa, pressure at 11 000 m (rounded) */
#define P20     5474.89f      /* Pa, pressure at 20 000 m (rounded) */
#define H_T0_L  44330.8f      /* m, T0 / L of the troposphere (rounded) */
#define EXP_TRO 0.190263f     /* R L / g0 (rounded) */
#define H_ISO   6341.62f      /* m, R T11 / g0 of the isothermal layer (rounded) */
#define H_L20   216650.0f     /* m, T20 / L20 */
#define EXP_20  0.0292712f    /* R L20 / g0 (rounded) */
#define GAMMA_R 401.874f      /* gamma R, J/(kg K) (rounded) */
#define QC_SONIC 0.892929f    /* qc/p at M = 1: 1.2^3.5 - 1 (rounded) */
#define SUPERSONIC_PASSES 3   /* fixed-point passes of the Rayleigh inverse */

static int bad(ad_real x) { return x != x || x > 3.0e38f || x < -3.0e38f; }

ad_status ad_pressure_altitude(ad_real ps, ad_real *h)
{
    float p = (float)ps;
    if (bad(ps) || p <= 0.0f) { *h = (ad_real)NAN; return AD_INVALID_INPUT; }
    if (p < 0.373380f || p > 177687.0f) { *h = (ad_real)NAN; return AD_OUT_OF_RANGE; }
    if (p >= P11) {
        *h = (ad_real)(H_T0_L * (1.0f - powf(p / P0, EXP_TRO)));
    } else if (p >= P20) {
        *h = (ad_real)(11000.0f - H_ISO * logf(p / P11));
    } else {
        *h = (ad_real)(20000.0f + H_L20 * (powf(p / P20, -EXP_20) - 1.0f));
    }
    return AD_OK;
}

ad_status ad_pressure_at_altitude(ad_real h, ad_real *ps)
{
    float z = (float)h;
    if (bad(h)) { *ps = (ad_real)NAN; return AD_INVALID_INPUT; }
    if (z < -5000.0f || z > 84852.0f) { *ps = (ad_real)NAN; return AD_OUT_OF_RANGE; }
    if (z <= 11000.0f) {
        *ps = (ad_real)(P0 * powf(1.0f - z / H_T0_L, 1.0f / EXP_TRO));
    } else if (z <= 20000.0f) {
        *ps = (ad_real)(P11 * expf(-(z - 11000.0f) / H_ISO));
    } else {
        *ps = (ad_real)(P20 * powf(1.0f + (z - 20000.0f) / H_L20, -1.0f / EXP_20));
    }
    return AD_OK;
}

/* qc/p of Mach m: NACA Report 1135 eqs. 44 (m <= 1) and 100 (m > 1). */
static float qc_ratio(float m)
{
    float m2 = m * m;
    if (m <= 1.0f) {
        return powf(1.0f + 0.2f * m2, 3.5f) - 1.0f;
    }
    return 1.2f * m2 * powf(7.2f * m2 / (7.0f * m2 - 1.0f), 2.5f) - 1.0f;
}

/* Mach of qc/p: closed form below M = 1, three fixed-point passes above it. */
static float mach_of_ratio(float r)
{
    float m;
    int i;
    if (r <= QC_SONIC) {
        return sqrtf(5.0f * (powf(r + 1.0f, 0.285714f) - 1.0f));
    }
    m = sqrtf(5.0f * (powf(r + 1.0f, 0.285714f) - 1.0f));
    for (i = 0; i < SUPERSONIC_PASSES; ++i) {
        m = 0.881285f * sqrtf((r + 1.0f) * powf(1.0f - 1.0f / (7.0f * m * m), 2.5f));
    }
    return m;
}

ad_status ad_impact_pressure_from_cas(ad_real cas, ad_real *qc)
{
    float v = (float)cas;
    if (bad(cas) || v < 0.0f) { *qc = (ad_real)NAN; return AD_INVALID_INPUT; }
    if (v > 4000.0f) { *qc = (ad_real)NAN; return AD_OUT_OF_RANGE; }
    *qc = (ad_real)(P0 * qc_ratio(v / A0));
    return AD_OK;
}

ad_status ad_cas_from_impact_pressure(ad_real qc, ad_real *cas)
{
    float q = (float)qc;
    if (bad(qc) || q < 0.0f) { *cas = (ad_real)NAN; return AD_INVALID_INPUT; }
    if (q > 1.0e8f) { *cas = (ad_real)NAN; return AD_OUT_OF_RANGE; }
    *cas = (ad_real)(A0 * mach_of_ratio(q / P0));
    return AD_OK;
}

ad_status ad_mach_from_impact_pressure(ad_real qc, ad_real ps, ad_real *mach)
{
    float q = (float)qc, p = (float)ps;
    if (bad(qc) || q < 0.0f || bad(ps) || p <= 0.0f) {
        *mach = (ad_real)NAN;
        return AD_INVALID_INPUT;
    }
    if (q > 1.0e8f || p < 0.373380f || p > 177687.0f) {
        *mach = (ad_real)NAN;
        return AD_OUT_OF_RANGE;
    }
    *mach = (ad_real)mach_of_ratio(q / p);
    return AD_OK;
}

ad_status ad_impact_pressure_from_mach(ad_real mach, ad_real ps, ad_real *qc)
{
    float m = (float)mach, p = (float)ps;
    if (bad(mach) || m < 0.0f || bad(ps) || p <= 0.0f) {
        *qc = (ad_real)NAN;
        return AD_INVALID_INPUT;
    }
    if (m > 10.0f || p < 0.373380f || p > 177687.0f) {
        *qc = (ad_real)NAN;
        return AD_OUT_OF_RANGE;
    }
    *qc = (ad_real)(p * qc_ratio(m));
    return AD_OK;
}

ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{
    float m = (float)mach, t = (float)sat;
    if (bad(mach) || m < 0.0f || bad(sat) || t <= 0.0f) {
        *tas = (ad_real)NAN;
        return AD_INVALID_INPUT;
    }
    if (m > 10.0f || t < 50.0f || t > 5000.0f) { *tas = (ad_real)NAN; return AD_OUT_OF_RANGE; }
    *tas = (ad_real)(m * sqrtf(GAMMA_R * t));
    return AD_OK;
}

ad_status ad_sat_from_tat(ad_real tat, ad_real mach, ad_real recovery, ad_real *sat)
{
    float t = (float)tat, m = (float)mach, r = (float)recovery;
    if (bad(tat) || t <= 0.0f || bad(mach) || m < 0.0f || bad(recovery) || r < 0.0f) {
        *sat = (ad_real)NAN;
        return AD_INVALID_INPUT;
    }
    if (t < 50.0f || t > 5000.0f || m > 10.0f || r > 1.0f) {
        *sat = (ad_real)NAN;
        return AD_OUT_OF_RANGE;
    }
    *sat = (ad_real)(t / (1.0f + 0.2f * r * m * m));
    return AD_OK;
}
