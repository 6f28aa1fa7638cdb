/*
 * limits.c - flight-envelope limits (LIM-1 .. LIM-5), mirroring airdata/limits/;
 * gamma = 1.4.  f(M) = qc/ps of PIT-1 (ad_i_ratio_from_mach), F^-1 its inverse
 * (ad_i_mach_from_ratio), H(ps) the pressure altitude of ALT-1
 * (ad_i_altitude_of_pressure).
 *
 *   LIM-1  eas = sqrt(2 n W / (rho0 S CLmax))              (lift equation, EAS)
 *   LIM-2  M = eas / (a0 sqrt(ps/p0)), cas = a0 F^-1(ps f(M)/p0), tas = M sqrt(gamma R sat)
 *   LIM-3  crossover: qc = p0 f(cas/a0), ps = qc / f(M), h = H(ps)
 *   LIM-4  maximum operating CAS/Mach: the lower limit, compared through impact pressure
 *   LIM-5  ceiling margin = ceiling - H(ps)
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; arguments are checked in the order they are declared, then the
 * derived quantities, in this order: stall EAS <= 4000 m/s (AD_SPEED_HI), stall Mach
 * <= 10 (AD_MACH_HI), stall qc/p0 <= AD_RATIO_MAX (CAS <= 10 a0); crossover Mach limit
 * < 1, cas_limit/a0 <= 10, crossover pressure within [AD_PRESSURE_LO, AD_PRESSURE_HI];
 * maximum operating cas_limit/a0 <= 10.  As in the reference, these derived checks
 * are exact (no slack).  A bad one gives its status and a NaN output.
 *
 * Tiny speeds (airdata/limits/): below Mach 2^-40 a Mach <-> CAS conversion takes
 * its linear limit (ad_i_cas_of_mach, ad_i_mach_of_cas, as SPD-1 does), and where
 * both limits of LIM-3 or LIM-4 are that small (their impact pressures may underflow)
 * the comparison and the crossover pressure take the linear limit qc = 0.7 p M^2 as
 * well: M sqrt(ps/p0) against cas/a0, both scaled by AD_TINY_SCALE (pitot.c) so that
 * subnormal limits are compared at full precision, and ps = p0 ((cas/M)/a0)^2.
 *
 * Rounding: each result is a handful of correctly rounded operations plus the
 * kernels of pitot.c and altimetry.c (their bounds are written there); the vectors
 * bound the whole within k = 8 condition-scaled units.
 */
#include "ad_internal.h"

/* 2^-40, exact in both precisions: pitot.c AD_TINY_MACH, airdata/pitot.py TINY_MACH. */
#define AD_LIM_TINY_MACH ((ad_real)0x1p-40)

/* 1 when both Mach numbers are below AD_LIM_TINY_MACH. */
static int ad_both_tiny(ad_real m0, ad_real m)
{
    return ((m0 < AD_LIM_TINY_MACH) && (m < AD_LIM_TINY_MACH)) ? 1 : 0;
}

/* The NULL rule, then weight, wing area and CLmax, the first three arguments of every
 * stall function. */
static ad_status ad_wing_inputs(const ad_real *out, ad_real w, ad_real s, ad_real cl)
{
    return ad_i_inputs3(out, w, AD_DOM_WEIGHT, s, AD_DOM_WING_AREA, cl, AD_DOM_CL_MAX);
}

/* Smallest normal number of the real type (below it a product loses precision). */
#if defined(AIRDATA_SINGLE)
#define AD_LIM_NORMAL_MIN ((ad_real)0x1p-126)
#else
#define AD_LIM_NORMAL_MIN ((ad_real)0x1p-1022)
#endif

/* LIM-1 on checked arguments; derived check eas <= AD_SPEED_HI.  Where 2 n W,
 * rho0 S CL or their quotient is below the smallest normal number (tiny valid
 * inputs), the same from square roots of the factors, which has no subnormal
 * intermediate while the result is normal (airdata/limits/equations.py). */
static ad_status ad_stall_eas_i(ad_real w, ad_real s, ad_real cl, ad_real n, ad_real *eas)
{
    const ad_real num = (AD_K_2 * n) * w;
    const ad_real den = (AD_RHO0 * s) * cl;
    const ad_real q = num / den;
    if ((num < AD_LIM_NORMAL_MIN) || (den < AD_LIM_NORMAL_MIN) || (q < AD_LIM_NORMAL_MIN)) {
        *eas = (ad_sqrt(AD_K_2 * n) / (ad_sqrt(AD_RHO0) * ad_sqrt(s)))
               * (ad_sqrt(w) / ad_sqrt(cl));
    } else {
        *eas = ad_sqrt(q);
    }
    return (*eas > AD_SPEED_HI) ? AD_OUT_OF_RANGE : AD_OK;
}

/* LIM-2 Mach number on checked arguments; derived checks of LIM-1, then M <= 10. */
static ad_status ad_stall_mach_i(ad_real w, ad_real s, ad_real cl, ad_real n, ad_real ps,
                                 ad_real *mach)
{
    ad_real eas = (ad_real)0;
    ad_status st = ad_stall_eas_i(w, s, cl, n, &eas);
    *mach = (ad_real)0;
    if (st == AD_OK) {
        *mach = eas / (AD_A0 * ad_sqrt(ps / AD_P0));
        st = (*mach > AD_MACH_HI) ? AD_OUT_OF_RANGE : AD_OK;
    }
    return st;
}

/* LIM-1: stall EAS, the same at every altitude. */
ad_status ad_stall_eas(ad_real weight, ad_real wing_area, ad_real cl_max,
                       ad_real load_factor, ad_real *eas)
{
    ad_real y = (ad_real)0;
    ad_status st = ad_i_then(ad_wing_inputs(eas, weight, wing_area, cl_max), load_factor,
                             AD_DOM_LOAD_FACTOR);
    if (st == AD_OK) {
        st = ad_stall_eas_i(weight, wing_area, cl_max, load_factor, &y);
    }
    return ad_i_finish(st, y, eas);
}

/* The stall functions at ps: the NULL rule, the arguments in order (ps, then sat when
 * with_sat, then load_factor), then the stall Mach number m (LIM-2). */
static ad_status ad_stall_at(ad_real w, ad_real s, ad_real cl, ad_real ps, int with_sat,
                             ad_real sat, ad_real n, const ad_real *out, ad_real *m)
{
    ad_status st = ad_i_then(ad_wing_inputs(out, w, s, cl), ps, AD_DOM_PRESSURE);
    if (with_sat != 0) {
        st = ad_i_then(st, sat, AD_DOM_TEMPERATURE);
    }
    st = ad_i_then(st, n, AD_DOM_LOAD_FACTOR);
    return (st == AD_OK) ? ad_stall_mach_i(w, s, cl, n, ps, m) : st;
}

/* LIM-2: stall Mach number at ps (SPD-2 inverted). */
ad_status ad_stall_mach(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                        ad_real load_factor, ad_real *mach)
{
    ad_real m = (ad_real)0;
    const ad_status st = ad_stall_at(weight, wing_area, cl_max, ps, 0, (ad_real)0,
                                     load_factor, mach, &m);
    return ad_i_finish(st, m, mach);
}

/* LIM-2: stall CAS at ps, cas = a0 F^-1(ps f(M)/p0) (SPD-1, linear below M = 2^-40);
 * derived check last: qc/p0 <= AD_RATIO_MAX. */
ad_status ad_stall_cas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real load_factor, ad_real *cas)
{
    ad_real m = (ad_real)0;
    ad_real x = (ad_real)0;
    ad_status st = ad_stall_at(weight, wing_area, cl_max, ps, 0, (ad_real)0, load_factor,
                               cas, &m);
    if (st == AD_OK) {
        x = ps * ad_i_ratio_from_mach(m) / AD_P0;
        st = (x > AD_RATIO_MAX) ? AD_OUT_OF_RANGE : AD_OK;
    }
    return ad_i_finish(st, (st == AD_OK) ? ad_i_cas_of_mach(m, ps / AD_P0, x) : ad_nan(), cas);
}

/* LIM-2: stall TAS at ps and sat, tas = M sqrt(gamma R sat) (SPD-3). */
ad_status ad_stall_tas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real sat, ad_real load_factor, ad_real *tas)
{
    ad_real m = (ad_real)0;
    const ad_status st = ad_stall_at(weight, wing_area, cl_max, ps, 1, sat, load_factor, tas,
                                     &m);
    return ad_i_finish(st, m * ad_sqrt(AD_GAMMA_R * sat), tas);
}

/* PIT-3 on a checked CAS limit: qc = p0 f(cas/a0); derived check cas/a0 <= 10. */
static ad_status ad_cas_limit_qc(ad_real cas_limit, ad_real *qc)
{
    const ad_real m0 = cas_limit / AD_A0;
    const ad_status st = (m0 > AD_MACH_HI) ? AD_OUT_OF_RANGE : AD_OK;
    *qc = (st == AD_OK) ? ad_i_impact_from_mach(m0, AD_P0) : (ad_real)0;
    return st;
}

/* LIM-3: pressure altitude where a CAS limit and a subsonic Mach limit coincide.
 * Derived checks in order: mach_limit < 1, cas_limit/a0 <= 10, crossover pressure in
 * the pressure range. */
ad_status ad_crossover_altitude(ad_real cas_limit, ad_real mach_limit, ad_real *h)
{
    ad_real qc = (ad_real)0;
    ad_real ps = (ad_real)0;
    ad_status st = ad_i_inputs2(h, cas_limit, AD_DOM_CAS_LIMIT, mach_limit,
                                AD_DOM_SUBSONIC_MACH_LIMIT);
    if ((st == AD_OK) && (mach_limit >= AD_K_1)) {
        st = AD_OUT_OF_RANGE;
    }
    if (st == AD_OK) {
        st = ad_cas_limit_qc(cas_limit, &qc);
    }
    if (st == AD_OK) {
        const ad_real m0 = cas_limit / AD_A0;
        const ad_real r = (cas_limit / mach_limit) / AD_A0;
        ps = ad_both_tiny(m0, mach_limit) ? (AD_P0 * (r * r))
                                          : (qc / ad_i_ratio_from_mach(mach_limit));
        st = ((ps < AD_PRESSURE_LO) || (ps > AD_PRESSURE_HI)) ? AD_OUT_OF_RANGE : AD_OK;
    }
    return ad_i_finish(st, (st == AD_OK) ? ad_i_altitude_of_pressure(ps) : ad_nan(), h);
}

/* LIM-4 arguments (ps, cas_limit, mach_limit) checked in order, then cas_limit/a0;
 * the impact pressures of the two limits at ps. */
static ad_status ad_limit_qc(const ad_real *out, ad_real ps, ad_real cas_limit,
                             ad_real mach_limit, ad_real *qc_cas, ad_real *qc_mach)
{
    ad_status st = ad_i_inputs3(out, ps, AD_DOM_PRESSURE, cas_limit, AD_DOM_CAS_LIMIT,
                                mach_limit, AD_DOM_MACH_LIMIT);
    *qc_cas = (ad_real)0;
    *qc_mach = (ad_real)0;
    if (st == AD_OK) {
        st = ad_cas_limit_qc(cas_limit, qc_cas);
    }
    if (st == AD_OK) {
        *qc_mach = ad_i_impact_from_mach(mach_limit, ps);
    }
    return st;
}

/* LIM-4: 1 where the limit asked for governs at ps (ties go to it): the CAS limit
 * where qc_cas <= qc_mach, the Mach limit (want_mach) where qc_mach <= qc_cas; both
 * limits below Mach 2^-40, the same comparison of cas/a0 and M sqrt(ps/p0). */
static int ad_governs(ad_real ps, ad_real cas_limit, ad_real mach_limit, ad_real qc_cas,
                      ad_real qc_mach, int want_mach)
{
    ad_real side_cas = qc_cas;
    ad_real side_mach = qc_mach;
    if (ad_both_tiny(cas_limit / AD_A0, mach_limit) != 0) {
        side_cas = ad_i_tiny_up(cas_limit) / AD_A0;
        side_mach = ad_i_tiny_up(mach_limit) * ad_sqrt(ps / AD_P0);
    }
    if (want_mach != 0) {
        return (side_mach <= side_cas) ? 1 : 0;
    }
    return (side_cas <= side_mach) ? 1 : 0;
}

/* LIM-4: the maximum operating speed at ps, the Mach number (want_mach) or the CAS:
 * - CAS: cas_limit where it governs, else the CAS of the Mach limit, a0 F^-1(qc_mach/p0)
 *   (SPD-1, linear below M = 2^-40; then qc_mach/p0 < qc_cas/p0 <= AD_RATIO_MAX);
 * - Mach: mach_limit where it governs, else the Mach number of the CAS limit,
 *   F^-1(qc_cas/ps) (SPD-1 inverted, linear below cas/a0 = 2^-40; then
 *   qc_cas/ps < qc_mach/ps <= AD_RATIO_MAX). */
static ad_status ad_max_operating(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                                  int want_mach, ad_real *out)
{
    ad_real qc_cas = (ad_real)0;
    ad_real qc_mach = (ad_real)0;
    ad_real y = (ad_real)0;
    const ad_status st = ad_limit_qc(out, ps, cas_limit, mach_limit, &qc_cas, &qc_mach);
    if ((st == AD_OK) && (want_mach != 0)) {
        y = (ad_governs(ps, cas_limit, mach_limit, qc_cas, qc_mach, 1) != 0)
                ? mach_limit
                : ad_i_mach_of_cas(cas_limit, AD_P0 / ps, qc_cas / ps);
    } else if (st == AD_OK) {
        y = (ad_governs(ps, cas_limit, mach_limit, qc_cas, qc_mach, 0) != 0)
                ? cas_limit
                : ad_i_cas_of_mach(mach_limit, ps / AD_P0, qc_mach / AD_P0);
    }
    return ad_i_finish(st, y, out);
}

/* LIM-4: maximum operating CAS at ps. */
ad_status ad_max_operating_cas(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                               ad_real *cas)
{
    return ad_max_operating(ps, cas_limit, mach_limit, 0, cas);
}

/* LIM-4: maximum operating Mach number at ps. */
ad_status ad_max_operating_mach(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                                ad_real *mach)
{
    return ad_max_operating(ps, cas_limit, mach_limit, 1, mach);
}

/* LIM-5: margin to a maximum altitude given as a pressure altitude, ceiling - H(ps). */
ad_status ad_ceiling_margin(ad_real ps, ad_real ceiling, ad_real *margin)
{
    const ad_status st = ad_i_inputs2(margin, ps, AD_DOM_PRESSURE, ceiling, AD_DOM_ALTITUDE);
    return ad_i_finish(st, (st == AD_OK) ? (ceiling - ad_i_altitude_of_pressure(ps)) : ad_nan(),
                       margin);
}
