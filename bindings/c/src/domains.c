/*
 * domains.c - argument checks shared by every function (airdata/_inputs.py,
 * Domain.classify, with the ranges of airdata/_domains.py).
 *
 * Special cases, in the order they are decided:
 *   unknown domain id, NaN or +-inf               -> AD_INVALID_INPUT
 *   wrong sign for the quantity (see sign below)  -> AD_INVALID_INPUT
 *   finite, right sign, outside [lo, hi]          -> AD_OUT_OF_RANGE
 *   otherwise                                     -> AD_OK
 * Exact comparisons only: no rounding error.
 */
#include "ad_internal.h"

/* Which proper numbers are invalid rather than out of range. */
typedef enum {
    AD_SIGN_ANY = 0,          /* only NaN and infinities are invalid */
    AD_SIGN_NONNEGATIVE = 1,  /* negative values are invalid too */
    AD_SIGN_POSITIVE = 2,     /* zero and negative values are invalid too */
    AD_SIGN_NONE = 3          /* unknown domain id: every value is invalid */
} ad_sign;

typedef struct {
    ad_real lo;
    ad_real hi;
    ad_sign sign;
} ad_domain;

/* The limit functions' argument domains (airdata/limits.py): all positive. */
static ad_domain ad_limit_domain_of(ad_domain_id id)
{
    ad_domain d = { (ad_real)0, (ad_real)0, AD_SIGN_POSITIVE };
    switch (id) {
    case AD_DOM_WEIGHT: d.lo = AD_WEIGHT_LO; d.hi = AD_WEIGHT_HI; break;
    case AD_DOM_WING_AREA: d.lo = AD_WING_AREA_LO; d.hi = AD_WING_AREA_HI; break;
    case AD_DOM_CL_MAX: d.lo = AD_CL_MAX_LO; d.hi = AD_CL_MAX_HI; break;
    case AD_DOM_LOAD_FACTOR: d.lo = AD_LOAD_FACTOR_LO; d.hi = AD_LOAD_FACTOR_HI; break;
    case AD_DOM_CAS_LIMIT: d.lo = AD_CAS_LIMIT_LO; d.hi = AD_CAS_LIMIT_HI; break;
    case AD_DOM_MACH_LIMIT: d.lo = AD_MACH_LIMIT_LO; d.hi = AD_MACH_LIMIT_HI; break;
    case AD_DOM_SUBSONIC_MACH_LIMIT:
        d.lo = AD_SUBSONIC_MACH_LIMIT_LO; d.hi = AD_SUBSONIC_MACH_LIMIT_HI; break;
    default: d.sign = AD_SIGN_NONE; break;
    }
    return d;
}

static ad_domain ad_domain_of(ad_domain_id id)
{
    ad_domain d = { AD_ALTITUDE_LO, AD_ALTITUDE_HI, AD_SIGN_ANY };
    switch (id) {
    case AD_DOM_MACH: d.lo = AD_MACH_LO; d.hi = AD_MACH_HI; d.sign = AD_SIGN_NONNEGATIVE; break;
    case AD_DOM_SPEED: d.lo = AD_SPEED_LO; d.hi = AD_SPEED_HI; d.sign = AD_SIGN_NONNEGATIVE; break;
    case AD_DOM_TEMPERATURE:
        d.lo = AD_TEMPERATURE_LO; d.hi = AD_TEMPERATURE_HI; d.sign = AD_SIGN_POSITIVE; break;
    case AD_DOM_DELTA_T: d.lo = AD_DELTA_T_LO; d.hi = AD_DELTA_T_HI; break;
    case AD_DOM_RECOVERY:
        d.lo = AD_RECOVERY_LO; d.hi = AD_RECOVERY_HI; d.sign = AD_SIGN_NONNEGATIVE; break;
    case AD_DOM_IMPACT_PRESSURE:
        d.lo = AD_IMPACT_PRESSURE_LO; d.hi = AD_IMPACT_PRESSURE_HI;
        d.sign = AD_SIGN_NONNEGATIVE; break;
    case AD_DOM_ELEVATION: d.lo = AD_ELEVATION_LO; d.hi = AD_ELEVATION_HI; break;
    case AD_DOM_GEOMETRIC: d.lo = AD_GEOMETRIC_LO; d.hi = AD_GEOMETRIC_HI; break;
    case AD_DOM_PRESSURE:
        d.lo = AD_PRESSURE_LO; d.hi = AD_PRESSURE_HI; d.sign = AD_SIGN_POSITIVE; break;
    case AD_DOM_SETTING:
        d.lo = AD_SETTING_LO; d.hi = AD_SETTING_HI; d.sign = AD_SIGN_POSITIVE; break;
    case AD_DOM_TOTAL_PRESSURE:
        d.lo = AD_TOTAL_PRESSURE_LO; d.hi = AD_TOTAL_PRESSURE_HI;
        d.sign = AD_SIGN_POSITIVE; break;
    case AD_DOM_NOISE_BAND:
        d.lo = AD_NOISE_BAND_LO; d.hi = AD_NOISE_BAND_HI; d.sign = AD_SIGN_NONNEGATIVE; break;
    case AD_DOM_ALTITUDE: break;
    default: d = ad_limit_domain_of(id); break;
    }
    return d;
}

ad_status ad_i_check(ad_real x, ad_domain_id domain)
{
    const ad_domain d = ad_domain_of(domain);
    ad_status st = AD_OK;
    if ((d.sign == AD_SIGN_NONE) || !isfinite(x)) {
        st = AD_INVALID_INPUT;
    } else if ((d.sign == AD_SIGN_POSITIVE) && (x <= (ad_real)0)) {
        st = AD_INVALID_INPUT;
    } else if ((d.sign == AD_SIGN_NONNEGATIVE) && (x < (ad_real)0)) {
        st = AD_INVALID_INPUT;
    } else if ((x < d.lo) || (x > d.hi)) {
        st = AD_OUT_OF_RANGE;
    } else {
        st = AD_OK;
    }
    return st;
}
