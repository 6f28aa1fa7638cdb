/*
 * domains.c - argument checks shared by every function (airdata/_inputs.py,
 * Domain.classify, with the ranges of airdata/_domains.py).
 *
 * Special cases, in the order they are decided:
 *   domain id outside the table, NaN or +-inf     -> AD_INVALID_INPUT
 *   wrong sign for the quantity (see ad_sign)     -> AD_INVALID_INPUT
 *   finite, right sign, outside [lo, hi]          -> AD_OUT_OF_RANGE
 *   otherwise                                     -> AD_OK
 * Exact comparisons only: no rounding error.
 *
 * The domains are a table indexed by ad_domain_id (airdata_batch.h), so there is no
 * branch per domain; the only id check is the table bound, which a caller of
 * ad_check_n can reach with an id outside the enumeration.
 */
#include "ad_internal.h"

/* The last domain id of airdata_batch.h; the table has one row per id 0..AD_DOM_LAST. */
#define AD_DOM_LAST AD_DOM_SUBSONIC_MACH_LIMIT

/* Which proper numbers are invalid rather than out of range. */
typedef enum {
    AD_SIGN_ANY = 0,          /* only NaN and infinities are invalid */
    AD_SIGN_NONNEGATIVE = 1,  /* negative values are invalid too */
    AD_SIGN_POSITIVE = 2      /* zero and negative values are invalid too */
} ad_sign;

typedef struct {
    ad_real lo;
    ad_real hi;
    ad_sign sign;
} ad_domain;

/* One row per ad_domain_id, in the enumeration's order (checked by the vectors: every
 * argument of every function is classified through this table). */
static const ad_domain ad_domains[AD_DOM_LAST + 1] = {
    { AD_MACH_LO, AD_MACH_HI, AD_SIGN_NONNEGATIVE },                       /* MACH */
    { AD_SPEED_LO, AD_SPEED_HI, AD_SIGN_NONNEGATIVE },                     /* SPEED */
    { AD_TEMPERATURE_LO, AD_TEMPERATURE_HI, AD_SIGN_POSITIVE },            /* TEMPERATURE */
    { AD_DELTA_T_LO, AD_DELTA_T_HI, AD_SIGN_ANY },                         /* DELTA_T */
    { AD_RECOVERY_LO, AD_RECOVERY_HI, AD_SIGN_NONNEGATIVE },               /* RECOVERY */
    { AD_IMPACT_PRESSURE_LO, AD_IMPACT_PRESSURE_HI, AD_SIGN_NONNEGATIVE }, /* IMPACT_PRESSURE */
    { AD_ELEVATION_LO, AD_ELEVATION_HI, AD_SIGN_ANY },                     /* ELEVATION */
    { AD_ALTITUDE_LO, AD_ALTITUDE_HI, AD_SIGN_ANY },                       /* ALTITUDE */
    { AD_GEOMETRIC_LO, AD_GEOMETRIC_HI, AD_SIGN_ANY },                     /* GEOMETRIC */
    { AD_PRESSURE_LO, AD_PRESSURE_HI, AD_SIGN_POSITIVE },                  /* PRESSURE */
    { AD_SETTING_LO, AD_SETTING_HI, AD_SIGN_POSITIVE },                    /* SETTING */
    { AD_TOTAL_PRESSURE_LO, AD_TOTAL_PRESSURE_HI, AD_SIGN_POSITIVE },      /* TOTAL_PRESSURE */
    { AD_NOISE_BAND_LO, AD_NOISE_BAND_HI, AD_SIGN_NONNEGATIVE },           /* NOISE_BAND */
    { AD_WEIGHT_LO, AD_WEIGHT_HI, AD_SIGN_POSITIVE },                      /* WEIGHT */
    { AD_WING_AREA_LO, AD_WING_AREA_HI, AD_SIGN_POSITIVE },                /* WING_AREA */
    { AD_CL_MAX_LO, AD_CL_MAX_HI, AD_SIGN_POSITIVE },                      /* CL_MAX */
    { AD_LOAD_FACTOR_LO, AD_LOAD_FACTOR_HI, AD_SIGN_POSITIVE },            /* LOAD_FACTOR */
    { AD_CAS_LIMIT_LO, AD_CAS_LIMIT_HI, AD_SIGN_POSITIVE },                /* CAS_LIMIT */
    { AD_MACH_LIMIT_LO, AD_MACH_LIMIT_HI, AD_SIGN_POSITIVE },              /* MACH_LIMIT */
    { AD_SUBSONIC_MACH_LIMIT_LO, AD_SUBSONIC_MACH_LIMIT_HI,
      AD_SIGN_POSITIVE }                                                   /* SUBSONIC_MACH_LIMIT */
};

/* Classify a finite x against one domain. */
static ad_status ad_classify(ad_real x, const ad_domain *d)
{
    ad_status st = AD_OK;
    if ((d->sign == AD_SIGN_POSITIVE) && (x <= (ad_real)0)) {
        st = AD_INVALID_INPUT;
    } else if ((d->sign == AD_SIGN_NONNEGATIVE) && (x < (ad_real)0)) {
        st = AD_INVALID_INPUT;
    } else if ((x < d->lo) || (x > d->hi)) {
        st = AD_OUT_OF_RANGE;
    } else {
        st = AD_OK;
    }
    return st;
}

ad_status ad_i_check(ad_real x, ad_domain_id domain)
{
    const unsigned int id = (unsigned int)domain;
    ad_status st = AD_INVALID_INPUT;
    if ((id <= (unsigned int)AD_DOM_LAST) && isfinite(x)) {
        st = ad_classify(x, &ad_domains[id]);
    }
    return st;
}
