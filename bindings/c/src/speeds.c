/*
 * speeds.c - calibrated, equivalent and true airspeed, Mach number and dynamic
 * pressure (SPD-1 .. SPD-4), mirroring airdata/speeds.py; gamma = 1.4.
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; arguments are checked in order, then derived quantities; a bad
 * one gives its status and a NaN output.  Arguments are checked exactly; derived
 * Mach numbers and qc/ps, qc/p0 ratios against AD_MACH_LIMIT and AD_RATIO_LIMIT
 * (widened by 8 binary64 ulp, airdata/_domains.py DERIVED_SLACK; see pitot.c).
 */
#include "ad_internal.h"

/* Status of the two arguments (a, in domain da) then (b, in domain db). */
static ad_status ad_check2(ad_real a, ad_domain_id da, ad_real b, ad_domain_id db)
{
    ad_status st = ad_i_check(a, da);
    if (st == AD_OK) {
        st = ad_i_check(b, db);
    }
    return st;
}

/*
 * SPD-1: qc = ps f(M), cas = a0 f^-1(qc/p0); below M = 2^-40 the linear limit
 * cas = a0 M sqrt(ps/p0) (ad_i_cas_of_mach, no subnormal intermediate).  Derived check
 * qc/p0 <= AD_RATIO_LIMIT.
 */
ad_status ad_cas_from_mach(ad_real mach, ad_real ps, ad_real *cas)
{
    ad_status st;
    ad_real x = (ad_real)0;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    if (st == AD_OK) {
        x = ps * ad_i_ratio_from_mach(mach) / AD_P0;
        st = (x > AD_RATIO_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *cas = (st == AD_OK) ? ad_i_cas_of_mach(mach, ps / AD_P0, x) : ad_nan();
    return st;
}

/*
 * SPD-1 inverted: qc = p0 f(cas/a0), M = f^-1(qc/ps); below cas/a0 = 2^-40 the
 * linear limit M = (cas/a0) sqrt(p0/ps) (ad_i_mach_of_cas, no subnormal intermediate).
 * Derived checks in order: cas/a0 <= AD_MACH_LIMIT, then qc/ps <= AD_RATIO_LIMIT.
 */
ad_status ad_mach_from_cas(ad_real cas, ad_real ps, ad_real *mach)
{
    ad_status st;
    ad_real x = (ad_real)0;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(cas, AD_DOM_SPEED, ps, AD_DOM_PRESSURE);
    if (st == AD_OK) {
        const ad_real m0 = cas / AD_A0;
        st = (m0 > AD_MACH_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
        if (st == AD_OK) {
            x = AD_P0 * ad_i_ratio_from_mach(m0) / ps;
            st = (x > AD_RATIO_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
        }
    }
    *mach = (st == AD_OK) ? ad_i_mach_of_cas(cas, AD_P0 / ps, x) : ad_nan();
    return st;
}

/* SPD-2: eas = M a0 sqrt(ps/p0), within 2.5 ulp. */
ad_status ad_eas_from_mach(ad_real mach, ad_real ps, ad_real *eas)
{
    ad_status st;
    if (eas == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    *eas = (st == AD_OK) ? (AD_A0 * mach * ad_sqrt(ps / AD_P0)) : ad_nan();
    return st;
}

/* SPD-2 inverted: M = eas/(a0 sqrt(ps/p0)); derived check M <= AD_MACH_LIMIT (10). */
ad_status ad_mach_from_eas(ad_real eas, ad_real ps, ad_real *mach)
{
    ad_status st;
    ad_real m = (ad_real)0;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(eas, AD_DOM_SPEED, ps, AD_DOM_PRESSURE);
    if (st == AD_OK) {
        m = eas / (AD_A0 * ad_sqrt(ps / AD_P0));
        st = (m > AD_MACH_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *mach = (st == AD_OK) ? m : ad_nan();
    return st;
}

/* SPD-3: tas = M sqrt(gamma R sat), within 2 ulp. */
ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{
    ad_status st;
    if (tas == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(mach, AD_DOM_MACH, sat, AD_DOM_TEMPERATURE);
    *tas = (st == AD_OK) ? (mach * ad_sqrt(AD_GAMMA_R * sat)) : ad_nan();
    return st;
}

/* SPD-3 inverted: M = tas/sqrt(gamma R sat); derived check M <= AD_MACH_LIMIT (10). */
ad_status ad_mach_from_tas(ad_real tas, ad_real sat, ad_real *mach)
{
    ad_status st;
    ad_real m = (ad_real)0;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(tas, AD_DOM_SPEED, sat, AD_DOM_TEMPERATURE);
    if (st == AD_OK) {
        m = tas / ad_sqrt(AD_GAMMA_R * sat);
        st = (m > AD_MACH_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
    }
    *mach = (st == AD_OK) ? m : ad_nan();
    return st;
}

/* SPD-4: q = 0.7 ps M^2, within 2 ulp. */
ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q)
{
    ad_status st;
    if (q == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check2(mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    *q = (st == AD_OK) ? (AD_K_0P7 * ps * (mach * mach)) : ad_nan();
    return st;
}
