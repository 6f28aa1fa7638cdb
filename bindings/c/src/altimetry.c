/*
 * altimetry.c - pressure altitude, its inverse, baro-corrected altitude, altimeter
 * setting and density altitude (ALT-1 .. ALT-5), mirroring airdata/altimetry.py.
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; arguments are checked in order, then derived quantities; a bad
 * one gives its status and a NaN output.
 */
#include "ad_internal.h"

/*
 * Layer of a quantity decreasing with altitude (pressure or density): the last layer
 * whose base value is >= x; layer 0 also holds x above the sea-level value (numpy
 * searchsorted(-base, -x, "right") - 1, clipped).  Exact; loop bound AD_NLAYERS - 1.
 */
static int ad_layer_of_pressure(ad_real x)
{
    int i = 0;
    int j;
    for (j = 1; j < AD_NLAYERS; j++) {
        if (ad_i_layer[j].pb >= x) {
            i = j;
        }
    }
    return i;
}

static int ad_layer_of_density(ad_real x)
{
    int i = 0;
    int j;
    for (j = 1; j < AD_NLAYERS; j++) {
        if (ad_i_layer[j].rho_b >= x) {
            i = j;
        }
    }
    return i;
}

/*
 * ALT-1 kernel.  Gradient layer: h = hb + expm1(n ln(p/pb))/m; isothermal layer:
 * h = hb + sh ln(p/pb).  expm1 keeps the step accurate near the layer base; the
 * step's relative error is a few ulp, plus one rounding for the sum.
 */
ad_real ad_i_altitude_of_pressure(ad_real p)
{
    const ad_layer *L = &ad_i_layer[ad_layer_of_pressure(p)];
    const ad_real lr = ad_log(p / L->pb);
    ad_real step;
    if (L->gradient != 0) {
        step = ad_expm1(L->n * lr) / L->m;
    } else {
        step = L->sh * lr;
    }
    return L->hb + step;
}

/*
 * ALT-4 kernel: rho/rho_b = (p/pb)(Tb/temp).  Gradient layer:
 * h = hb + expm1(kd ln(rho/rho_b))/m; isothermal: h = hb + sh ln(rho/rho_b).
 * The layer is chosen by rho; the ratio is formed from p and temp (error a few ulp).
 */
ad_real ad_i_altitude_of_density(ad_real p, ad_real temp, ad_real rho)
{
    const ad_layer *L = &ad_i_layer[ad_layer_of_density(rho)];
    const ad_real lr = ad_log((p / L->pb) * (L->tb / temp));
    ad_real step;
    if (L->gradient != 0) {
        step = ad_expm1(L->kd * lr) / L->m;
    } else {
        step = L->sh * lr;
    }
    return L->hb + step;
}

/* ALT-1: pressure altitude of static pressure ps. */
ad_status ad_pressure_altitude(ad_real ps, ad_real *h)
{
    ad_status st;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(ps, AD_DOM_PRESSURE);
    *h = (st == AD_OK) ? ad_i_altitude_of_pressure(ps) : ad_nan();
    return st;
}

/* ATM-3 as a function of pressure altitude. */
ad_status ad_pressure_at_altitude(ad_real h, ad_real *ps)
{
    ad_status st;
    if (ps == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(h, AD_DOM_ALTITUDE);
    *ps = (st == AD_OK) ? ad_i_standard_pressure(h, ad_i_layer_of_altitude(h)) : ad_nan();
    return st;
}

/* ALT-2: H(ps) - H(setting); the difference adds one rounding. */
ad_status ad_baro_corrected_altitude(ad_real ps, ad_real setting, ad_real *h)
{
    ad_status st;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(ps, AD_DOM_PRESSURE);
    if (st == AD_OK) {
        st = ad_i_check(setting, AD_DOM_SETTING);
    }
    *h = (st == AD_OK)
        ? (ad_i_altitude_of_pressure(ps) - ad_i_altitude_of_pressure(setting)) : ad_nan();
    return st;
}

/*
 * ALT-3: setting = ps (1 + (p0/ps)^n (L e/T0))^(1/n), n = R L/g0 (troposphere),
 * as ps exp(log1p(x)/n) with x = exp(n ln(p0/ps)) (-m0 e).  Derived check first:
 * H(ps) - e must lie in [h_min, 11000] m.  Relative error a few ulp.
 */
ad_status ad_altimeter_setting(ad_real ps, ad_real elevation, ad_real *setting)
{
    ad_status st;
    ad_real x;
    if (setting == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(ps, AD_DOM_SETTING);
    if (st == AD_OK) {
        st = ad_i_check(elevation, AD_DOM_ELEVATION);
    }
    if (st == AD_OK) {
        const ad_real h_setting = ad_i_altitude_of_pressure(ps) - elevation;
        if ((h_setting < AD_SETTING_ALT_LO) || (h_setting > AD_SETTING_ALT_HI)) {
            st = AD_OUT_OF_RANGE;
        }
    }
    if (st != AD_OK) {
        *setting = ad_nan();
        return st;
    }
    x = ad_exp(ad_i_layer[0].n * ad_log(AD_P0 / ps)) * (-ad_i_layer[0].m * elevation);
    *setting = ps * ad_exp(ad_log1p(x) / ad_i_layer[0].n);
    return AD_OK;
}

/*
 * ALT-4: density altitude of (ps, sat).  Derived check: rho = ps/(R sat) must lie in
 * [rho(h_max), rho(h_min)].
 */
ad_status ad_density_altitude(ad_real ps, ad_real sat, ad_real *h)
{
    ad_status st;
    ad_real rho = (ad_real)0;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(ps, AD_DOM_PRESSURE);
    if (st == AD_OK) {
        st = ad_i_check(sat, AD_DOM_TEMPERATURE);
    }
    if (st == AD_OK) {
        rho = ps / (AD_R * sat);
        if ((rho < AD_RHO_MIN) || (rho > AD_RHO_MAX)) {
            st = AD_OUT_OF_RANGE;
        }
    }
    *h = (st == AD_OK) ? ad_i_altitude_of_density(ps, sat, rho) : ad_nan();
    return st;
}
