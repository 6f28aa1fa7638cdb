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
 * Layer of a quantity decreasing with altitude: the last layer whose base value (its
 * pressure pb, or with by_density its density rho_b) is >= x; layer 0 also holds x
 * above the sea-level value (numpy searchsorted(-base, -x, "right") - 1, clipped).
 * Exact; loop bound AD_NLAYERS - 1.
 */
static int ad_layer_of_decreasing(ad_real x, int by_density)
{
    int i = 0;
    int j;
    for (j = 1; j < AD_NLAYERS; j++) {
        const ad_real base = (by_density != 0) ? ad_i_layer[j].rho_b : ad_i_layer[j].pb;
        if (base >= x) {
            i = j;
        }
    }
    return i;
}

/*
 * The altitude in layer L of a log ratio lr: gradient layer hb + expm1(e lr)/m (e the
 * exponent of the quantity), isothermal layer hb + sh lr.  expm1 keeps the step
 * accurate near the layer base; the step's relative error is a few ulp, plus one
 * rounding for the sum.
 */
static ad_real ad_altitude_in_layer(const ad_layer *L, ad_real e, ad_real lr)
{
    const ad_real step = (L->gradient != 0) ? (ad_expm1(e * lr) / L->m) : (L->sh * lr);
    return L->hb + step;
}

/* ALT-1 kernel: h of pressure p, with lr = ln(p/pb) and e = n. */
ad_real ad_i_altitude_of_pressure(ad_real p)
{
    const ad_layer *L = &ad_i_layer[ad_layer_of_decreasing(p, 0)];
    return ad_altitude_in_layer(L, L->n, ad_log(p / L->pb));
}

/*
 * ALT-4 kernel: rho/rho_b = (p/pb)(Tb/temp), lr = ln(rho/rho_b), e = kd.  The layer
 * is chosen by rho; the ratio is formed from p and temp (error a few ulp).
 */
ad_real ad_i_altitude_of_density(ad_real p, ad_real temp, ad_real rho)
{
    const ad_layer *L = &ad_i_layer[ad_layer_of_decreasing(rho, 1)];
    return ad_altitude_in_layer(L, L->kd, ad_log((p / L->pb) * (L->tb / temp)));
}

/* ALT-1: pressure altitude of static pressure ps. */
ad_status ad_pressure_altitude(ad_real ps, ad_real *h)
{
    const ad_status st = ad_i_inputs1(h, ps, AD_DOM_PRESSURE);
    return ad_i_finish(st, (st == AD_OK) ? ad_i_altitude_of_pressure(ps) : ad_nan(), h);
}

/* ATM-3 as a function of pressure altitude. */
ad_status ad_pressure_at_altitude(ad_real h, ad_real *ps)
{
    const ad_status st = ad_i_inputs1(ps, h, AD_DOM_ALTITUDE);
    return ad_i_finish(st, (st == AD_OK) ? ad_i_standard_pressure(h, ad_i_layer_of_altitude(h))
                                         : ad_nan(), ps);
}

/* ALT-2: H(ps) - H(setting); the difference adds one rounding. */
ad_status ad_baro_corrected_altitude(ad_real ps, ad_real setting, ad_real *h)
{
    const ad_status st = ad_i_inputs2(h, ps, AD_DOM_PRESSURE, setting, AD_DOM_SETTING);
    return ad_i_finish(st, (st == AD_OK) ? (ad_i_altitude_of_pressure(ps)
                                            - ad_i_altitude_of_pressure(setting))
                                         : ad_nan(), h);
}

/*
 * ALT-3: setting = ps (1 + (p0/ps)^n (L e/T0))^(1/n), n = R L/g0 (troposphere),
 * as ps exp(log1p(x)/n) with x = exp(n ln(p0/ps)) (-m0 e).  Derived check first:
 * H(ps) - e must lie in [h_min, 11000] m.  Relative error a few ulp.
 */
ad_status ad_altimeter_setting(ad_real ps, ad_real elevation, ad_real *setting)
{
    ad_real y = (ad_real)0;
    ad_status st = ad_i_inputs2(setting, ps, AD_DOM_SETTING, elevation, AD_DOM_ELEVATION);
    if (st == AD_OK) {
        const ad_real h_setting = ad_i_altitude_of_pressure(ps) - elevation;
        if ((h_setting < AD_SETTING_ALT_LO) || (h_setting > AD_SETTING_ALT_HI)) {
            st = AD_OUT_OF_RANGE;
        }
    }
    if (st == AD_OK) {
        const ad_real x = ad_exp(ad_i_layer[0].n * ad_log(AD_P0 / ps))
                          * (-ad_i_layer[0].m * elevation);
        y = ps * ad_exp(ad_log1p(x) / ad_i_layer[0].n);
    }
    return ad_i_finish(st, y, setting);
}

/*
 * ALT-4: density altitude of (ps, sat).  Derived check: rho = ps/(R sat) must lie in
 * [rho(h_max), rho(h_min)].
 */
ad_status ad_density_altitude(ad_real ps, ad_real sat, ad_real *h)
{
    const ad_real rho = ps / (AD_R * sat);
    ad_status st = ad_i_inputs2(h, ps, AD_DOM_PRESSURE, sat, AD_DOM_TEMPERATURE);
    if ((st == AD_OK) && ((rho < AD_RHO_MIN) || (rho > AD_RHO_MAX))) {
        st = AD_OUT_OF_RANGE;
    }
    return ad_i_finish(st, (st == AD_OK) ? ad_i_altitude_of_density(ps, sat, rho) : ad_nan(),
                       h);
}
