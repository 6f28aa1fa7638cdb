/*
 * batch.c - array entry points (airdata_batch.h): one call evaluates n elements.
 * Each loop is bounded by n and
 * calls the scalar function of airdata.h, so results are bit-identical to it.
 */
#include "ad_internal.h"

/* 1 when st is an error status (not AD_OK, not AD_IMPACT_PRESSURE_ZEROED). */
static size_t ad_is_error(ad_status st)
{
    return ((st == AD_OK) || (st == AD_IMPACT_PRESSURE_ZEROED)) ? 0U : 1U;
}

size_t ad_check_n(ad_domain_id domain, const ad_real *x, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((x == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_i_check(x[i], domain);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_geopotential_altitude_n(const ad_real *z, ad_real *h, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((z == NULL) || (h == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_geopotential_altitude(z[i], &h[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_geometric_altitude_n(const ad_real *h, ad_real *z, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((h == NULL) || (z == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_geometric_altitude(h[i], &z[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_pressure_altitude_n(const ad_real *ps, ad_real *h, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (h == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_pressure_altitude(ps[i], &h[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_pressure_at_altitude_n(const ad_real *h, ad_real *ps, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((h == NULL) || (ps == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_pressure_at_altitude(h[i], &ps[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_impact_pressure_from_cas_n(const ad_real *cas, ad_real *qc, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((cas == NULL) || (qc == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_impact_pressure_from_cas(cas[i], &qc[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_cas_from_impact_pressure_n(const ad_real *qc, ad_real *cas, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((qc == NULL) || (cas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_cas_from_impact_pressure(qc[i], &cas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_baro_corrected_altitude_n(const ad_real *ps, const ad_real *setting, ad_real *h,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (setting == NULL) || (h == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_baro_corrected_altitude(ps[i], setting[i], &h[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_altimeter_setting_n(const ad_real *ps, const ad_real *elevation, ad_real *setting,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (elevation == NULL) || (setting == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_altimeter_setting(ps[i], elevation[i], &setting[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_density_altitude_n(const ad_real *ps, const ad_real *sat, ad_real *h,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (sat == NULL) || (h == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_density_altitude(ps[i], sat[i], &h[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_impact_pressure_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *qc,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((mach == NULL) || (ps == NULL) || (qc == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_impact_pressure_from_mach(mach[i], ps[i], &qc[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_mach_from_impact_pressure_n(const ad_real *qc, const ad_real *ps, ad_real *mach,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((qc == NULL) || (ps == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_mach_from_impact_pressure(qc[i], ps[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_cas_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *cas,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((mach == NULL) || (ps == NULL) || (cas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_cas_from_mach(mach[i], ps[i], &cas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_mach_from_cas_n(const ad_real *cas, const ad_real *ps, ad_real *mach,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((cas == NULL) || (ps == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_mach_from_cas(cas[i], ps[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_eas_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *eas,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((mach == NULL) || (ps == NULL) || (eas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_eas_from_mach(mach[i], ps[i], &eas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_mach_from_eas_n(const ad_real *eas, const ad_real *ps, ad_real *mach,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((eas == NULL) || (ps == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_mach_from_eas(eas[i], ps[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_tas_from_mach_n(const ad_real *mach, const ad_real *sat, ad_real *tas,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((mach == NULL) || (sat == NULL) || (tas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_tas_from_mach(mach[i], sat[i], &tas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_mach_from_tas_n(const ad_real *tas, const ad_real *sat, ad_real *mach,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((tas == NULL) || (sat == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_mach_from_tas(tas[i], sat[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_dynamic_pressure_n(const ad_real *mach, const ad_real *ps, ad_real *q,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((mach == NULL) || (ps == NULL) || (q == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_dynamic_pressure(mach[i], ps[i], &q[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_sat_from_tat_n(const ad_real *tat, const ad_real *mach, const ad_real *recovery,
    ad_real *sat, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((tat == NULL) || (mach == NULL) || (recovery == NULL) || (sat == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_sat_from_tat(tat[i], mach[i], recovery[i], &sat[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_tat_from_sat_n(const ad_real *sat, const ad_real *mach, const ad_real *recovery,
    ad_real *tat, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((sat == NULL) || (mach == NULL) || (recovery == NULL) || (tat == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_tat_from_sat(sat[i], mach[i], recovery[i], &tat[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_atmosphere_n(const ad_real *h, const ad_real *dT, ad_atmosphere_t *out,
    unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((h == NULL) || (dT == NULL) || (out == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_atmosphere(h[i], dT[i], &out[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_air_data_n(const ad_real *ps, const ad_real *pt, const ad_real *tat,
    const ad_real *recovery, const ad_real *setting, int use_setting,
    ad_real noise_band, ad_air_data_t *out, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (pt == NULL) || (tat == NULL) || (recovery == NULL)
        || ((use_setting != 0) && (setting == NULL)) || (out == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_real s = (use_setting != 0) ? setting[i] : (ad_real)0;
        const ad_status st = ad_air_data(ps[i], pt[i], tat[i], recovery[i], s, use_setting,
                                         noise_band, &out[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_stall_eas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max, const ad_real *load_factor,
    ad_real *eas, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((weight == NULL) || (wing_area == NULL) || (cl_max == NULL) || (load_factor == NULL) || (eas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_stall_eas(weight[i], wing_area[i], cl_max[i], load_factor[i], &eas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_stall_mach_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max, const ad_real *ps, const ad_real *load_factor,
    ad_real *mach, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((weight == NULL) || (wing_area == NULL) || (cl_max == NULL) || (ps == NULL) || (load_factor == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_stall_mach(weight[i], wing_area[i], cl_max[i], ps[i], load_factor[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_stall_cas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max, const ad_real *ps, const ad_real *load_factor,
    ad_real *cas, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((weight == NULL) || (wing_area == NULL) || (cl_max == NULL) || (ps == NULL) || (load_factor == NULL) || (cas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_stall_cas(weight[i], wing_area[i], cl_max[i], ps[i], load_factor[i], &cas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_stall_tas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max, const ad_real *ps, const ad_real *sat, const ad_real *load_factor,
    ad_real *tas, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((weight == NULL) || (wing_area == NULL) || (cl_max == NULL) || (ps == NULL) || (sat == NULL) || (load_factor == NULL) || (tas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_stall_tas(weight[i], wing_area[i], cl_max[i], ps[i], sat[i], load_factor[i], &tas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_crossover_altitude_n(const ad_real *cas_limit, const ad_real *mach_limit,
    ad_real *h, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((cas_limit == NULL) || (mach_limit == NULL) || (h == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_crossover_altitude(cas_limit[i], mach_limit[i], &h[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_max_operating_cas_n(const ad_real *ps, const ad_real *cas_limit, const ad_real *mach_limit,
    ad_real *cas, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (cas_limit == NULL) || (mach_limit == NULL) || (cas == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_max_operating_cas(ps[i], cas_limit[i], mach_limit[i], &cas[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_max_operating_mach_n(const ad_real *ps, const ad_real *cas_limit, const ad_real *mach_limit,
    ad_real *mach, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (cas_limit == NULL) || (mach_limit == NULL) || (mach == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_max_operating_mach(ps[i], cas_limit[i], mach_limit[i], &mach[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}

size_t ad_ceiling_margin_n(const ad_real *ps, const ad_real *ceiling,
    ad_real *margin, unsigned char *status, size_t n)
{
    size_t bad = 0U;
    size_t i;
    if ((ps == NULL) || (ceiling == NULL) || (margin == NULL) || (status == NULL)) {
        return AD_BATCH_NULL;
    }
    for (i = 0U; i < n; i++) {
        const ad_status st = ad_ceiling_margin(ps[i], ceiling[i], &margin[i]);
        status[i] = (unsigned char)st;
        bad += ad_is_error(st);
    }
    return bad;
}
