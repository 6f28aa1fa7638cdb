/*
 * pitot.c - impact pressure from Mach number or calibrated airspeed and the inverses
 * (PIT-1 .. PIT-4), mirroring airdata/pitot.py; gamma = 1.4.
 *
 * Subsonic, M <= 1 (NACA Report 1135, eq. 44):  qc/ps = (1 + 0.2 M^2)^3.5 - 1.
 * Supersonic, M > 1 (NACA Report 1135, eq. 100, Rayleigh pitot formula):
 *   pt/ps = 1.2 u (7.2 u/(7 u - 1))^2.5,  u = M^2.
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; arguments are checked in order, then derived quantities; a bad
 * one gives its status and a NaN output.
 */
#include "ad_internal.h"

/* Newton steps of the supersonic inversion: 3 suffice over 1 <= M <= 10 (shown for
 * binary64 by tests/test_pitot_solver.py); one in reserve.  The loop bound. */
#define AD_NEWTON_STEPS 4

/*
 * PIT-1 kernel: qc/ps at Mach m >= 0.  Subsonic expm1(3.5 log1p(0.2 u)) and
 * supersonic 1.2 u exp(2.5 log1p((0.2 u + 1)/(7 u - 1))) - 1, each within a few ulp
 * (the log1p/expm1 forms avoid cancellation at small M).
 */
ad_real ad_i_ratio_from_mach(ad_real m)
{
    const ad_real u = m * m;
    ad_real r;
    if (m <= AD_K_1) {
        r = ad_expm1(AD_K_3P5 * ad_log1p(AD_K_0P2 * u));
    } else {
        r = (AD_K_1P2 * u)
            * ad_exp(AD_K_2P5 * ad_log1p((AD_K_0P2 * u + AD_K_1) / (AD_K_7 * u - AD_K_1)))
            - AD_K_1;
    }
    return r;
}

/* phi(u) = a ((7 - 1/u)/7.2)^2.5, the fixed-point map of the supersonic inversion. */
static ad_real ad_phi(ad_real a, ad_real u)
{
    return a * ad_exp(AD_K_2P5 * ad_log1p(-(AD_K_0P2 + AD_K_1 / u) / AD_K_7P2));
}

/*
 * PIT-2 solver: u = M^2 >= 1 with Rayleigh pitot ratio pt/ps = r >= 1.2^3.5.
 * h(u) = u - phi(u) is increasing and convex on u >= 1; the root lies in
 * [1, u_max], u_max = (r/1.2)(7/7.2)^2.5.  Start u0 = u_max - 2.5/7 - 0.15/u_max
 * clipped to the bracket; AD_NEWTON_STEPS Newton steps, each replaced by bisection
 * when it leaves the bracket; result phi(u_N), which damps the error of u_N by
 * phi'(u) <= 0.42: within about 1 ulp.  Fixed loop bound, no early exit.
 * Binary32 caveat (the same algorithm as the reference): for the first few binary32
 * ratios above the sonic ratio the root rounds to the bracket end u = 1, Newton
 * candidates land just below it, every step falls back to bisection and M is off by
 * up to about 15 ulp (tests/test_cport_diff.py, strict xfail).
 */
static ad_real ad_supersonic_mach_squared(ad_real r)
{
    const ad_real a = r / AD_K_1P2;
    ad_real hi = a * AD_PHI_INF;
    ad_real lo = AD_K_1;
    ad_real u = hi - AD_K_5_14 - AD_K_0P15 / hi;
    int step;
    u = (u < lo) ? lo : u;
    u = (u > hi) ? hi : u;
    for (step = 0; step < AD_NEWTON_STEPS; step++) {
        const ad_real phi = ad_phi(a, u);
        const ad_real g = u - phi;
        const ad_real dphi = phi * AD_K_2P5 / (u * (AD_K_7 * u - AD_K_1));
        ad_real cand;
        hi = (g > (ad_real)0) ? u : hi;
        lo = (g < (ad_real)0) ? u : lo;
        cand = u - g / (AD_K_1 - dphi);
        u = ((cand >= lo) && (cand <= hi)) ? cand : AD_K_0P5 * (lo + hi);
    }
    return ad_phi(a, u);
}

/*
 * PIT-2 kernel: Mach number from qc/ps = x in [0, RATIO_MAX].  Closed form
 * sqrt(5 expm1(log1p(x)/3.5)) up to the sonic ratio, the solver above it.
 */
ad_real ad_i_mach_from_ratio(ad_real x)
{
    ad_real m;
    if (x > AD_RATIO_SONIC) {
        m = ad_sqrt(ad_supersonic_mach_squared(AD_K_1 + x));
    } else {
        m = ad_sqrt(AD_K_5 * ad_expm1(ad_log1p(x) / AD_K_3P5));
    }
    return m;
}

/* PIT-1: qc = ps f(M). */
ad_status ad_impact_pressure_from_mach(ad_real mach, ad_real ps, ad_real *qc)
{
    ad_status st;
    if (qc == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(mach, AD_DOM_MACH);
    if (st == AD_OK) {
        st = ad_i_check(ps, AD_DOM_PRESSURE);
    }
    *qc = (st == AD_OK) ? (ps * ad_i_ratio_from_mach(mach)) : ad_nan();
    return st;
}

/* PIT-2: Mach number of (qc, ps); derived check qc/ps <= RATIO_MAX (Mach 10). */
ad_status ad_mach_from_impact_pressure(ad_real qc, ad_real ps, ad_real *mach)
{
    ad_status st;
    ad_real x = (ad_real)0;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(qc, AD_DOM_IMPACT_PRESSURE);
    if (st == AD_OK) {
        st = ad_i_check(ps, AD_DOM_PRESSURE);
    }
    if (st == AD_OK) {
        x = qc / ps;
        st = (x > AD_RATIO_MAX) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *mach = (st == AD_OK) ? ad_i_mach_from_ratio(x) : ad_nan();
    return st;
}

/* PIT-3: qc = p0 f(cas/a0); derived check cas/a0 <= 10. */
ad_status ad_impact_pressure_from_cas(ad_real cas, ad_real *qc)
{
    ad_status st;
    ad_real m = (ad_real)0;
    if (qc == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(cas, AD_DOM_SPEED);
    if (st == AD_OK) {
        m = cas / AD_A0;
        st = (m > AD_MACH_HI) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *qc = (st == AD_OK) ? (AD_P0 * ad_i_ratio_from_mach(m)) : ad_nan();
    return st;
}

/* PIT-4: cas = a0 f^-1(qc/p0); derived check qc/p0 <= RATIO_MAX (CAS <= 10 a0). */
ad_status ad_cas_from_impact_pressure(ad_real qc, ad_real *cas)
{
    ad_status st;
    ad_real x = (ad_real)0;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(qc, AD_DOM_IMPACT_PRESSURE);
    if (st == AD_OK) {
        x = qc / AD_P0;
        st = (x > AD_RATIO_MAX) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *cas = (st == AD_OK) ? (AD_A0 * ad_i_mach_from_ratio(x)) : ad_nan();
    return st;
}
