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

/* SPD-1: after the checks st, the pressure ratio x = a f(m) / b (a/b = ps/p0 from Mach
 * to CAS, p0/ps from CAS to Mach) with the derived check x <= AD_RATIO_LIMIT. */
static ad_status ad_spd1_ratio(ad_status st, ad_real m, ad_real a, ad_real b, ad_real *x)
{
    ad_status out = st;
    if (st == AD_OK) {
        *x = a * ad_i_ratio_from_mach(m) / b;
        out = (*x > AD_RATIO_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
    }
    return out;
}

/*
 * SPD-1: qc = ps f(M), cas = a0 f^-1(qc/p0); below M = 2^-40 the linear limit
 * cas = a0 M sqrt(ps/p0) (ad_i_cas_of_mach, no subnormal intermediate).  Derived check
 * qc/p0 <= AD_RATIO_LIMIT.
 */
ad_status ad_cas_from_mach(ad_real mach, ad_real ps, ad_real *cas)
{
    ad_real x = (ad_real)0;
    const ad_status st = ad_spd1_ratio(ad_i_inputs2(cas, mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE),
                                       mach, ps, AD_P0, &x);
    return ad_i_finish(st, (st == AD_OK) ? ad_i_cas_of_mach(mach, ps / AD_P0, x) : ad_nan(),
                       cas);
}

/*
 * SPD-1 inverted: qc = p0 f(cas/a0), M = f^-1(qc/ps); below cas/a0 = 2^-40 the
 * linear limit M = (cas/a0) sqrt(p0/ps) (ad_i_mach_of_cas, no subnormal intermediate).
 * Derived checks in order: cas/a0 <= AD_MACH_LIMIT, then qc/ps <= AD_RATIO_LIMIT.
 */
ad_status ad_mach_from_cas(ad_real cas, ad_real ps, ad_real *mach)
{
    const ad_real m0 = cas / AD_A0;
    ad_real x = (ad_real)0;
    ad_status st = ad_i_inputs2(mach, cas, AD_DOM_SPEED, ps, AD_DOM_PRESSURE);
    if ((st == AD_OK) && (m0 > AD_MACH_LIMIT)) {
        st = AD_OUT_OF_RANGE;
    }
    st = ad_spd1_ratio(st, m0, AD_P0, ps, &x);
    return ad_i_finish(st, (st == AD_OK) ? ad_i_mach_of_cas(cas, AD_P0 / ps, x) : ad_nan(),
                       mach);
}

/* SPD-2: eas = M a0 sqrt(ps/p0), within 2.5 ulp. */
ad_status ad_eas_from_mach(ad_real mach, ad_real ps, ad_real *eas)
{
    const ad_status st = ad_i_inputs2(eas, mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    return ad_i_finish(st, AD_A0 * mach * ad_sqrt(ps / AD_P0), eas);
}

/* A Mach number m from a speed (checked arguments in st) with the derived check
 * m <= AD_MACH_LIMIT (10), through *mach (SPD-2 and SPD-3 inverted). */
static ad_status ad_mach_of_speed(ad_status st, ad_real m, ad_real *mach)
{
    const ad_status derived = (m > AD_MACH_LIMIT) ? AD_OUT_OF_RANGE : AD_OK;
    return ad_i_finish((st == AD_OK) ? derived : st, m, mach);
}

/* SPD-2 inverted: M = eas/(a0 sqrt(ps/p0)); derived check M <= AD_MACH_LIMIT (10). */
ad_status ad_mach_from_eas(ad_real eas, ad_real ps, ad_real *mach)
{
    const ad_status st = ad_i_inputs2(mach, eas, AD_DOM_SPEED, ps, AD_DOM_PRESSURE);
    return ad_mach_of_speed(st, eas / (AD_A0 * ad_sqrt(ps / AD_P0)), mach);
}

/* SPD-3: tas = M sqrt(gamma R sat), within 2 ulp. */
ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{
    const ad_status st = ad_i_inputs2(tas, mach, AD_DOM_MACH, sat, AD_DOM_TEMPERATURE);
    return ad_i_finish(st, mach * ad_sqrt(AD_GAMMA_R * sat), tas);
}

/* SPD-3 inverted: M = tas/sqrt(gamma R sat); derived check M <= AD_MACH_LIMIT (10). */
ad_status ad_mach_from_tas(ad_real tas, ad_real sat, ad_real *mach)
{
    const ad_status st = ad_i_inputs2(mach, tas, AD_DOM_SPEED, sat, AD_DOM_TEMPERATURE);
    return ad_mach_of_speed(st, tas / ad_sqrt(AD_GAMMA_R * sat), mach);
}

/* SPD-4: q = 0.7 ps M^2, within 2 ulp. */
ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q)
{
    const ad_status st = ad_i_inputs2(q, mach, AD_DOM_MACH, ps, AD_DOM_PRESSURE);
    return ad_i_finish(st, (AD_K_0P7 * ps * (mach * mach)), q);
}
