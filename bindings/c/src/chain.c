/*
 * chain.c - the air-data computer chain (CHN-1), mirroring airdata/chain.py.
 *
 * Order of the checks (the first failing one decides the status):
 *   noise_band (in [0, 10000] Pa), ps, pt, tat, recovery, setting (if use_setting);
 *   qc = pt - ps >= -noise_band (else AD_INVALID_INPUT);
 *   qc/ps <= AD_RATIO_LIMIT (Mach 10), qc/p0 <= AD_RATIO_LIMIT (CAS 10 a0), the
 *   limit widened by 8 binary64 ulp (airdata/_domains.py DERIVED_SLACK);
 *   rho = ps/(R sat) within the model's densities (else AD_OUT_OF_RANGE).
 * A negative qc within the noise band is read as zero and the status is
 * AD_IMPACT_PRESSURE_ZEROED, with valid outputs.  A NULL output pointer gives
 * AD_INVALID_INPUT and nothing is written; any error gives NaN in every output.
 * Errors: each output inherits the bound of the kernel that computes it (see
 * altimetry.c, pitot.c, speeds.c, temperature.c) applied to rounded intermediates.
 */
#include "ad_internal.h"

static void ad_air_data_nan(ad_air_data_t *out)
{
    out->pressure_altitude = ad_nan();
    out->baro_altitude = ad_nan();
    out->impact_pressure = ad_nan();
    out->mach = ad_nan();
    out->cas = ad_nan();
    out->eas = ad_nan();
    out->tas = ad_nan();
    out->sat = ad_nan();
    out->density = ad_nan();
    out->density_altitude = ad_nan();
    out->dynamic_pressure = ad_nan();
}

/* The NULL rule, then the argument checks, in order. */
static ad_status ad_chain_arguments(ad_real ps, ad_real pt, ad_real tat, ad_real recovery,
                                    ad_real setting, int use_setting, ad_real noise_band,
                                    const ad_air_data_t *out)
{
    ad_status st = ad_i_inputs3(out, noise_band, AD_DOM_NOISE_BAND, ps, AD_DOM_PRESSURE, pt,
                                AD_DOM_TOTAL_PRESSURE);
    st = ad_i_then(ad_i_then(st, tat, AD_DOM_TEMPERATURE), recovery, AD_DOM_RECOVERY);
    return (use_setting != 0) ? ad_i_then(st, setting, AD_DOM_SETTING) : st;
}

/* The impact-pressure checks; *qc receives pt - ps, zeroed inside the noise band. */
static ad_status ad_chain_impact(ad_real ps, ad_real pt, ad_real noise_band, ad_real *qc)
{
    ad_status st = AD_OK;
    ad_real q = pt - ps;
    if (q < -noise_band) {
        st = AD_INVALID_INPUT;
    } else {
        if (q < (ad_real)0) {
            st = AD_IMPACT_PRESSURE_ZEROED;
            q = (ad_real)0;
        }
        if (((q / ps) > AD_RATIO_LIMIT) || ((q / AD_P0) > AD_RATIO_LIMIT)) {
            st = AD_OUT_OF_RANGE;
        }
    }
    *qc = q;
    return st;
}

/* Every output from valid inputs; returns the density check's status. */
static ad_status ad_chain_outputs(ad_real ps, ad_real qc, ad_real tat, ad_real recovery,
                                  ad_air_data_t *out)
{
    const ad_real mach = ad_i_mach_from_ratio(qc / ps);
    const ad_real m2 = mach * mach;
    const ad_real sat = tat / (AD_K_1 + AD_K_0P2 * recovery * m2);
    const ad_real rho = ps / (AD_R * sat);
    if ((rho < AD_RHO_MIN) || (rho > AD_RHO_MAX)) {
        return AD_OUT_OF_RANGE;
    }
    out->pressure_altitude = ad_i_altitude_of_pressure(ps);
    out->impact_pressure = qc;
    out->mach = mach;
    out->cas = AD_A0 * ad_i_mach_from_ratio(qc / AD_P0);
    out->eas = AD_A0 * mach * ad_sqrt(ps / AD_P0);
    out->tas = mach * ad_sqrt(AD_GAMMA_R * sat);
    out->sat = sat;
    out->density = rho;
    out->density_altitude = ad_i_altitude_of_density(ps, sat, rho);
    out->dynamic_pressure = AD_K_0P7 * ps * m2;
    return AD_OK;
}

/* CHN-1: every air-data output from ps, pt and tat. */
ad_status ad_air_data(ad_real ps, ad_real pt, ad_real tat, ad_real recovery,
                      ad_real setting, int use_setting, ad_real noise_band,
                      ad_air_data_t *out)
{
    ad_status flag = AD_OK;
    ad_real qc = (ad_real)0;
    ad_status st = ad_chain_arguments(ps, pt, tat, recovery, setting, use_setting, noise_band,
                                      out);
    if (st == AD_OK) {
        st = ad_chain_impact(ps, pt, noise_band, &qc);
    }
    if (st == AD_IMPACT_PRESSURE_ZEROED) {
        flag = st;
        st = AD_OK;
    }
    if (st == AD_OK) {
        st = ad_chain_outputs(ps, qc, tat, recovery, out);
    }
    if (st != AD_OK) {
        if (out != NULL) {
            ad_air_data_nan(out);
        }
        return st;
    }
    out->baro_altitude = (use_setting != 0)
        ? (out->pressure_altitude - ad_i_altitude_of_pressure(setting)) : ad_nan();
    return flag;
}
