/*
 * atmosphere.c - the standard atmosphere (ATM-1 .. ATM-8), mirroring
 * airdata/atmosphere.py.  Sources: ICAO Doc 7488/3 (1993); U.S. Standard Atmosphere
 * 1976 (NOAA-S/T 76-1562), sections 1.2-1.3.
 *
 * Special cases (every function): a NULL output pointer gives AD_INVALID_INPUT and
 * nothing is written; a bad argument gives its status and NaN outputs.
 */
#include "ad_internal.h"

const ad_layer ad_i_layer[AD_NLAYERS] = {
    AD_LAYER_0, AD_LAYER_1, AD_LAYER_2, AD_LAYER_3, AD_LAYER_4, AD_LAYER_5, AD_LAYER_6
};

/*
 * Layer of geopotential altitude h: the last layer whose base is <= h; layer 0 also
 * holds h < 0 (numpy searchsorted(hb, h, "right") - 1, clipped).  Exact; loop bound
 * AD_NLAYERS - 1.
 */
int ad_i_layer_of_altitude(ad_real h)
{
    int i = 0;
    int j;
    for (j = 1; j < AD_NLAYERS; j++) {
        if (ad_i_layer[j].hb <= h) {
            i = j;
        }
    }
    return i;
}

/*
 * ATM-3: p = pb exp(-(k log1p(m dh) + c dh)), one expression for both layer kinds
 * (the unused term adds an exact zero).  log1p keeps m dh (|m dh| < 0.25) accurate.
 * Relative error about (2 |e| + 3) ulp for the exponent e = k log1p(m dh) + c dh,
 * |e| <= 3 over the model; the condition scale of the result (|dp/dh h| is about
 * |e| p or more) absorbs the |e| part.
 */
ad_real ad_i_standard_pressure(ad_real h, int i)
{
    const ad_layer *L = &ad_i_layer[i];
    const ad_real dh = h - L->hb;
    return L->pb * ad_exp(-(L->k * ad_log1p(L->m * dh) + L->c * dh));
}

static void ad_atmosphere_nan(ad_atmosphere_t *out)
{
    out->temperature = ad_nan();
    out->pressure = ad_nan();
    out->density = ad_nan();
    out->speed_of_sound = ad_nan();
    out->dynamic_viscosity = ad_nan();
    out->kinematic_viscosity = ad_nan();
}

/*
 * ATM-2 .. ATM-6: T = Tb + L (h - hb) + dT; p (ATM-3); rho = p/(R T);
 * a = sqrt(gamma R T); mu = beta T sqrt(T)/(T + S) (Sutherland); nu = mu/rho.
 * Each output within a few ulp of the exact function of the rounded inputs.
 */
ad_status ad_atmosphere(ad_real h, ad_real dT, ad_atmosphere_t *out)
{
    ad_status st;
    int i;
    ad_real temp;
    ad_real p;
    ad_real rho;
    ad_real mu;
    if (out == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(h, AD_DOM_ALTITUDE);
    if (st == AD_OK) {
        st = ad_i_check(dT, AD_DOM_DELTA_T);
    }
    if (st != AD_OK) {
        ad_atmosphere_nan(out);
        return st;
    }
    i = ad_i_layer_of_altitude(h);
    temp = ad_i_layer[i].tb + ad_i_layer[i].lapse * (h - ad_i_layer[i].hb) + dT;
    p = ad_i_standard_pressure(h, i);
    rho = p / (AD_R * temp);
    mu = AD_SUTH_BETA * temp * ad_sqrt(temp) / (temp + AD_SUTH_S);
    out->temperature = temp;
    out->pressure = p;
    out->density = rho;
    out->speed_of_sound = ad_sqrt(AD_GAMMA_R * temp);
    out->dynamic_viscosity = mu;
    out->kinematic_viscosity = mu / rho;
    return AD_OK;
}

/* ATM-7: h = r0 z/(r0 + z), within 1.5 ulp (three correctly rounded operations). */
ad_status ad_geopotential_altitude(ad_real z, ad_real *h)
{
    ad_status st;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(z, AD_DOM_GEOMETRIC);
    *h = (st == AD_OK) ? (AD_R0 * z / (AD_R0 + z)) : ad_nan();
    return st;
}

/* ATM-8: z = r0 h/(r0 - h), within 1.5 ulp (three correctly rounded operations). */
ad_status ad_geometric_altitude(ad_real h, ad_real *z)
{
    ad_status st;
    if (z == NULL) {
        return AD_INVALID_INPUT;
    }
    st = ad_i_check(h, AD_DOM_ALTITUDE);
    *z = (st == AD_OK) ? (AD_R0 * h / (AD_R0 - h)) : ad_nan();
    return st;
}
