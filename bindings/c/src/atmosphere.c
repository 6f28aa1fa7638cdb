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
 * ATM-3 kernel as a double-double: p = (pb + pb_lo) exp(e), e = -(k log1p(m dh) + c dh),
 * one expression for both layer kinds (the unused term adds an exact zero).  log1p
 * keeps m dh (|m dh| < 0.25) accurate.  The product with the double-double base
 * pressure leaves the rounding of exp (a few ulp of exp's result, |e| <= 3 over the
 * model, absorbed by the condition scale |dp/dh h| >= |e| p) besides the final one.
 */
ad_dd ad_i_pressure_dd(ad_real h, int i)
{
    const ad_layer *L = &ad_i_layer[i];
    const ad_real dh = h - L->hb;
    const ad_real e = ad_exp(-(L->k * ad_log1p(L->m * dh) + L->c * dh));
    AD_ASSERT((L->m * dh > (ad_real)-0.25) && (L->m * dh < (ad_real)0.25));
    return ad_i_dd_mul(ad_i_dd_pair(L->pb, L->pb_lo), ad_i_dd_of(e));
}

/* ATM-3: the standard pressure at geopotential altitude h in layer i, Pa (the hi part). */
ad_real ad_i_standard_pressure(ad_real h, int i)
{
    return ad_i_pressure_dd(h, i).hi;
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
 * ATM-2 .. ATM-6 kernel in double-double (airdata/atmosphere.py state_dd):
 * T = Tb + L (h - hb) + dT; p (ATM-3); rho = p/(R T); mu = beta T sqrt(T)/(T + S)
 * (Sutherland); nu = mu R T/p; a = sqrt(gamma R T) from the rounded T.  Every
 * constant is a double-double (ad_constants.h *_LO parts), h - hb is exact
 * (Sterbenz: each layer spans less than a factor 2 in h), so each output is rounded
 * about once: within about 1 ulp plus, for p, rho, mu and nu, the exp rounding of p.
 */
static void ad_state_dd(ad_real h, ad_real dT, int i, ad_atmosphere_t *out)
{
    const ad_layer *L = &ad_i_layer[i];
    const ad_dd r_gas = ad_i_dd_pair(AD_R, AD_R_LO);
    const ad_dd lapse_dh = ad_i_dd_mul(ad_i_dd_pair(L->lapse, L->lapse_lo),
                                       ad_i_dd_of(h - L->hb));
    const ad_dd temp = ad_i_dd_add(ad_i_dd_add(ad_i_dd_pair(L->tb, L->tb_lo), lapse_dh),
                                   ad_i_dd_of(dT));
    const ad_dd p = ad_i_pressure_dd(h, i);
    const ad_dd beta_t = ad_i_dd_mul(ad_i_dd_pair(AD_SUTH_BETA, AD_SUTH_BETA_LO), temp);
    const ad_dd mu = ad_i_dd_div(ad_i_dd_mul(beta_t, ad_i_dd_sqrt(temp)),
                                 ad_i_dd_add(temp, ad_i_dd_of(AD_SUTH_S)));
    out->temperature = temp.hi;
    out->pressure = p.hi;
    out->density = ad_i_dd_div(p, ad_i_dd_mul(r_gas, temp)).hi;
    out->speed_of_sound = ad_sqrt(AD_GAMMA_R * temp.hi);
    out->dynamic_viscosity = mu.hi;
    out->kinematic_viscosity = ad_i_dd_div(ad_i_dd_mul(ad_i_dd_mul(mu, r_gas), temp), p).hi;
}

/* ATM-2 .. ATM-6: the atmosphere at geopotential altitude h and deviation dT. */
ad_status ad_atmosphere(ad_real h, ad_real dT, ad_atmosphere_t *out)
{
    const ad_status st = ad_i_inputs2(out, h, AD_DOM_ALTITUDE, dT, AD_DOM_DELTA_T);
    if (st == AD_OK) {
        ad_state_dd(h, dT, ad_i_layer_of_altitude(h), out);
    } else if (out != NULL) {
        ad_atmosphere_nan(out);
    }
    return st;
}

/* ATM-7: h = r0 z/(r0 + z), within 1.5 ulp (three correctly rounded operations). */
ad_status ad_geopotential_altitude(ad_real z, ad_real *h)
{
    const ad_status st = ad_i_inputs1(h, z, AD_DOM_GEOMETRIC);
    return ad_i_finish(st, AD_R0 * z / (AD_R0 + z), h);
}

/* ATM-8: z = r0 h/(r0 - h), within 1.5 ulp (three correctly rounded operations). */
ad_status ad_geometric_altitude(ad_real h, ad_real *z)
{
    const ad_status st = ad_i_inputs1(z, h, AD_DOM_ALTITUDE);
    return ad_i_finish(st, AD_R0 * h / (AD_R0 - h), z);
}
