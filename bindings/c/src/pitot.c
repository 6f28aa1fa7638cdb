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
 * one gives its status and a NaN output.  Arguments are checked against their ranges
 * exactly; derived Mach numbers and qc/ps, qc/p0 ratios against AD_MACH_LIMIT and
 * AD_RATIO_LIMIT, the limits widened by 8 binary64 ulp (airdata/_domains.py
 * DERIVED_SLACK; binary32 uses that value rounded to binary32, see ad_constants.h).
 */
#include "ad_internal.h"

/* Newton steps of the supersonic inversion: 3 suffice over 1 <= M <= 10 (shown for
 * binary64 by tests/test_pitot_solver.py); one in reserve.  The loop bound. */
#define AD_NEWTON_STEPS 4

/* Below this Mach number a Mach-to-Mach conversion is linear (ad_i_cas_of_mach,
 * ad_i_mach_of_cas): 2^-40, exact in both precisions (airdata/pitot.py TINY_MACH). */
#define AD_TINY_MACH ((ad_real)0x1p-40)

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

/* max(x, lo) (numpy maximum for non-NaN x). */
static ad_real ad_at_least(ad_real x, ad_real lo)
{
    return (x < lo) ? lo : x;
}

/*
 * PIT-2 solver: u = M^2 >= 1 with Rayleigh pitot ratio pt/ps = r >= 1.2^3.5.
 * h(u) = u - phi(u) is increasing and convex on u >= 1; the root lies in the
 * bracket [lo, u_max], u_max = (r/1.2)(7/7.2)^2.5, lo = 1 at first.  Start
 * u0 = u_max - 2.5/7 + x (-0.11 + x (0.0752 - 0.2316 x)), x = 1/u_max (relative
 * error at most 5.5e-4, at M = 1; below u_max since the correction is negative for
 * every x > 0), raised to lo.  AD_NEWTON_STEPS Newton steps; each raises lo to the
 * iterate when it lies below the root and is clamped at lo (in rounded arithmetic a
 * step can fall a few ulp below lo when the root lies there, M just above 1; the
 * clamp keeps the step's progress).  No iterate exceeds u_max (convexity; checked
 * over the whole sweep of tests/test_pitot_solver.py), so there is no upper clamp.
 * Result phi(u_N), which damps the error of u_N by phi'(u) <= 0.42: M within 2 ulp
 * (airdata/pitot.py).  Fixed loop bound, no early exit.
 */
static ad_real ad_supersonic_mach_squared(ad_real r)
{
    const ad_real a = r / AD_K_1P2;
    const ad_real u_max = a * AD_PHI_INF;
    const ad_real x = AD_K_1 / u_max;
    ad_real lo = AD_K_1;
    ad_real u = ad_at_least((u_max - AD_K_5_14) + x * (AD_K_S1 + x * (AD_K_S2 + x * AD_K_S3)),
                            lo);
    int step;
    for (step = 0; step < AD_NEWTON_STEPS; step++) {
        const ad_real phi = ad_phi(a, u);
        const ad_real g = u - phi;
        const ad_real dphi = phi * AD_K_2P5 / (u * (AD_K_7 * u - AD_K_1));
        lo = (g < (ad_real)0) ? u : lo;
        u = ad_at_least(u - g / (AD_K_1 - dphi), lo);
        /* No upper clamp: by convexity no iterate passes u_max (see above). */
        AD_ASSERT((u >= AD_K_1) && (u <= u_max));
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

/*
 * Tiny-speed scaling (airdata/pitot.py TINY_SCALE): a power of two that lifts the
 * intermediates of the tiny branches out of the subnormal range, 2^128 in binary64 and
 * 2^64 in binary32 (the smallest subnormal times it, divided by a pressure ratio of
 * the model, stays normal); the one rounding into the subnormal range is the last
 * product.  Exact scaling: bit-identical results where nothing was subnormal.
 */
#if defined(AIRDATA_SINGLE)
#define AD_TINY_SCALE ((ad_real)0x1p64)
#define AD_TINY_UNSCALE ((ad_real)0x1p-64)
#define AD_TINY_ROOT_UNSCALE ((ad_real)0x1p-32)
#else
#define AD_TINY_SCALE ((ad_real)0x1p128)
#define AD_TINY_UNSCALE ((ad_real)0x1p-128)
#define AD_TINY_ROOT_UNSCALE ((ad_real)0x1p-64)
#endif
/* Below this qc/p the closed form of PIT-2 is linear to within roundoff (2^-60). */
#define AD_TINY_RATIO ((ad_real)0x1p-60)

/* v times AD_TINY_SCALE: a tiny speed or ratio lifted out of the subnormal range. */
ad_real ad_i_tiny_up(ad_real v)
{
    return v * AD_TINY_SCALE;
}

/* PIT-2 kernel on qc and p (airdata/pitot.py mach_from_pressures): the Mach number
 * of qc/p, and below qc/p = 2^-60 the linear form sqrt(5 (x/3.5)) on qc 2^128/p,
 * scaled back by 2^-64 (binary32: 2^64 and 2^-32). */
ad_real ad_i_mach_from_pressures(ad_real qc, ad_real p)
{
    const ad_real x = qc / p;
    ad_real m;
    if (x < AD_TINY_RATIO) {
        m = ad_sqrt(AD_K_5 * ((ad_i_tiny_up(qc) / p) / AD_K_3P5)) * AD_TINY_ROOT_UNSCALE;
    } else {
        m = ad_i_mach_from_ratio(x);
    }
    return m;
}

/* SPD-1 kernel to a CAS (airdata/speeds.py cas_from_mach): a0 f^-1(x), x = k f(m),
 * and below m = 2^-40 the linear a0 m sqrt(k) with no subnormal intermediate. */
ad_real ad_i_cas_of_mach(ad_real m, ad_real k, ad_real x)
{
    ad_real cas;
    if (m < AD_TINY_MACH) {
        cas = (AD_A0 * (ad_i_tiny_up(m) * ad_sqrt(k))) * AD_TINY_UNSCALE;
    } else {
        cas = AD_A0 * ad_i_mach_from_ratio(x);
    }
    return cas;
}

/* SPD-1 kernel to a Mach number from a CAS (airdata/speeds.py mach_from_cas):
 * f^-1(x), and below cas/a0 = 2^-40 the linear (cas/a0) sqrt(k) with no subnormal
 * intermediate. */
ad_real ad_i_mach_of_cas(ad_real cas, ad_real k, ad_real x)
{
    ad_real m;
    if ((cas / AD_A0) < AD_TINY_MACH) {
        m = ((ad_i_tiny_up(cas) / AD_A0) * ad_sqrt(k)) * AD_TINY_UNSCALE;
    } else {
        m = ad_i_mach_from_ratio(x);
    }
    return m;
}

/*
 * PIT-1 times a pressure: qc = p f(M) (airdata/pitot.py impact_from_mach).  Below
 * AD_TINY_MACH f(M) = 0.7 M^2 to within roundoff (next term 0.25 M^2 relative), taken
 * as ((0.7 p) M) M so that no intermediate is subnormal where qc itself is normal.
 */
ad_real ad_i_impact_from_mach(ad_real m, ad_real p)
{
    ad_real qc;
    if (m < AD_TINY_MACH) {
        qc = ((AD_K_0P7 * p) * m) * m;
    } else {
        qc = p * ad_i_ratio_from_mach(m);
    }
    return qc;
}

/* PIT-1: qc = ps f(M). */
ad_status ad_impact_pressure_from_mach(ad_real mach, ad_real ps, ad_real *qc)
{
    const ad_status st = ad_i_inputs2(qc, mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    return ad_i_finish(st, (st == AD_OK) ? ad_i_impact_from_mach(mach, ps) : ad_nan(), qc);
}

/* PIT-2: Mach number of (qc, ps); derived check qc/ps <= AD_RATIO_LIMIT (Mach 10). */
ad_status ad_mach_from_impact_pressure(ad_real qc, ad_real ps, ad_real *mach)
{
    ad_status st = ad_i_inputs2(mach, qc, AD_DOM_IMPACT_PRESSURE, ps, AD_DOM_PRESSURE);
    if ((st == AD_OK) && ((qc / ps) > AD_RATIO_LIMIT)) {
        st = AD_OUT_OF_RANGE;
    }
    return ad_i_finish(st, (st == AD_OK) ? ad_i_mach_from_pressures(qc, ps) : ad_nan(),
                       mach);
}

/* PIT-3: qc = p0 f(cas/a0); derived check cas/a0 <= AD_MACH_LIMIT (10). */
ad_status ad_impact_pressure_from_cas(ad_real cas, ad_real *qc)
{
    const ad_real m = cas / AD_A0;
    ad_status st = ad_i_inputs1(qc, cas, AD_DOM_SPEED);
    if ((st == AD_OK) && (m > AD_MACH_LIMIT)) {
        st = AD_OUT_OF_RANGE;
    }
    return ad_i_finish(st, (st == AD_OK) ? ad_i_impact_from_mach(m, AD_P0) : ad_nan(), qc);
}

/* PIT-4: cas = a0 f^-1(qc/p0); derived check qc/p0 <= AD_RATIO_LIMIT (CAS <= 10 a0). */
ad_status ad_cas_from_impact_pressure(ad_real qc, ad_real *cas)
{
    ad_status st = ad_i_inputs1(cas, qc, AD_DOM_IMPACT_PRESSURE);
    if ((st == AD_OK) && ((qc / AD_P0) > AD_RATIO_LIMIT)) {
        st = AD_OUT_OF_RANGE;
    }
    return ad_i_finish(st, (st == AD_OK) ? (AD_A0 * ad_i_mach_from_pressures(qc, AD_P0))
                                         : ad_nan(), cas);
}
