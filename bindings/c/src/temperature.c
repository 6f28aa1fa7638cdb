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

static ad_status ad_check_tmr(ad_real temp, ad_real mach, ad_real recovery)
{
    ad_status st = ad_i_check(temp, AD_DOM_TEMPERATURE);
    if (st == AD_OK) {
        st = ad_i_check(mach, AD_DOM_MACH);
    }
    if (st == AD_OK) {
        st = ad_i_check(recovery, AD_DOM_RECOVERY);
    }
    return st;
}

/* TMP-1 solved for SAT: sat = tat/(1 + 0.2 recovery M^2). */
ad_status ad_sat_from_tat(ad_real tat, ad_real mach, ad_real recovery, ad_real *sat)
{
    ad_status st;
    if (sat == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check_tmr(tat, mach, recovery);
    *sat = (st == AD_OK) ? (tat / (AD_K_1 + AD_K_0P2 * recovery * (mach * mach))) : ad_nan();
    return st;
}

/* TMP-1: tat = sat (1 + 0.2 recovery M^2). */
ad_status ad_tat_from_sat(ad_real sat, ad_real mach, ad_real recovery, ad_real *tat)
{
    ad_status st;
    if (tat == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_check_tmr(sat, mach, recovery);
    *tat = (st == AD_OK) ? (sat * (AD_K_1 + AD_K_0P2 * recovery * (mach * mach))) : ad_nan();
    return st;
}
