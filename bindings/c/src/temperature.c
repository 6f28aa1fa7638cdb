/*
 * temperature.c - total and static air temperature (TMP-1), mirroring
 * airdata/temperature.py: TAT = SAT (1 + recovery 0.2 M^2) (NACA Report 1135, eq. 43).
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; arguments are checked in order (temperature, Mach, recovery);
 * a bad one gives its status and a NaN output.  Four correctly rounded operations:
 * within 2.5 ulp.
 */
#include "ad_internal.h"

/* The NULL rule, then temperature, Mach and recovery, in order. */
static ad_status ad_tmr_inputs(const ad_real *out, ad_real temp, ad_real mach,
                               ad_real recovery)
{
    return ad_i_inputs3(out, temp, AD_DOM_TEMPERATURE, mach, AD_DOM_MACH, recovery,
                        AD_DOM_RECOVERY);
}

/* TMP-1: the factor 1 + 0.2 recovery M^2 (three correctly rounded operations). */
static ad_real ad_tmr_factor(ad_real mach, ad_real recovery)
{
    return AD_K_1 + AD_K_0P2 * recovery * (mach * mach);
}

/* TMP-1 solved for SAT: sat = tat/(1 + 0.2 recovery M^2). */
ad_status ad_sat_from_tat(ad_real tat, ad_real mach, ad_real recovery, ad_real *sat)
{
    const ad_status st = ad_tmr_inputs(sat, tat, mach, recovery);
    return ad_i_finish(st, tat / ad_tmr_factor(mach, recovery), sat);
}

/* TMP-1: tat = sat (1 + 0.2 recovery M^2). */
ad_status ad_tat_from_sat(ad_real sat, ad_real mach, ad_real recovery, ad_real *tat)
{
    const ad_status st = ad_tmr_inputs(tat, sat, mach, recovery);
    return ad_i_finish(st, sat * ad_tmr_factor(mach, recovery), tat);
}
