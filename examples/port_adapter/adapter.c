/*
 * adapter.c - implements airdata.h on top of the (invented) flight-test
 * instrumentation team's fti_* routines, so that `airdata port check` can judge them.
 * Demo code; an engineering and verification aid, not certified flight software.
 *
 * What the adapter does, function by function:
 *   - refuses a NULL output pointer with AD_INVALID_INPUT (airdata.h contract);
 *   - widens ad_real (float under -DAIRDATA_SINGLE) to the team's fti_num (double),
 *     reorders the arguments and packs the chain's inputs into the team's structs;
 *   - maps the team's result codes onto ad_status;
 *   - writes NaN on a fault (the team leaves its outputs untouched), and narrows
 *     results back to ad_real.
 */
#include <math.h>
#include <stddef.h>

#include "airdata.h"
#include "fti_airdata.h"

static ad_status status_of(fti_code c)
{
    ad_status st = AD_INVALID_INPUT;
    switch (c) {
    case FTI_DONE: st = AD_OK; break;
    case FTI_NOTE_QC_FLOORED: st = AD_IMPACT_PRESSURE_ZEROED; break;
    case FTI_FAULT_LIMIT: st = AD_OUT_OF_RANGE; break;
    case FTI_FAULT_SOLVER: st = AD_NO_CONVERGENCE; break;
    case FTI_FAULT_ARGUMENT: st = AD_INVALID_INPUT; break;
    default: st = AD_INVALID_INPUT; break;
    }
    return st;
}

static int usable(ad_status st)
{
    return (st == AD_OK) || (st == AD_IMPACT_PRESSURE_ZEROED);
}

/* Result of a one-output routine: the value, or NaN on a fault. */
static ad_status finish(fti_code c, fti_num v, ad_real *out)
{
    const ad_status st = status_of(c);
    *out = usable(st) ? (ad_real)v : (ad_real)NAN;
    return st;
}

ad_status ad_atmosphere(ad_real h, ad_real dT, ad_atmosphere_t *out)
{
    fti_isa_point p = {0.0, 0.0, 0.0, 0.0, 0.0, 0.0};
    ad_status st;
    if (out == NULL) {
        return AD_INVALID_INPUT;
    }
    st = status_of(fti_isa((fti_num)h, (fti_num)dT, &p));
    if (!usable(st)) {
        p.t_k = p.p_pa = p.rho = p.a_mps = p.mu = p.nu = (fti_num)NAN;
    }
    out->temperature = (ad_real)p.t_k;
    out->pressure = (ad_real)p.p_pa;
    out->density = (ad_real)p.rho;
    out->speed_of_sound = (ad_real)p.a_mps;
    out->dynamic_viscosity = (ad_real)p.mu;
    out->kinematic_viscosity = (ad_real)p.nu;
    return st;
}

ad_status ad_geopotential_altitude(ad_real z, ad_real *h)
{
    fti_num v = 0.0;
    fti_code c;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_alt_convert((fti_num)z, FTI_TO_GEOPOTENTIAL, &v);
    return finish(c, v, h);
}

ad_status ad_geometric_altitude(ad_real h, ad_real *z)
{
    fti_num v = 0.0;
    fti_code c;
    if (z == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_alt_convert((fti_num)h, FTI_TO_GEOMETRIC, &v);
    return finish(c, v, z);
}

ad_status ad_pressure_altitude(ad_real ps, ad_real *h)
{
    fti_num v = 0.0;
    fti_code c;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_hp_of_ps((fti_num)ps, &v);
    return finish(c, v, h);
}

ad_status ad_pressure_at_altitude(ad_real h, ad_real *ps)
{
    fti_num v = 0.0;
    fti_code c;
    if (ps == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_ps_of_hp((fti_num)h, &v);
    return finish(c, v, ps);
}

ad_status ad_baro_corrected_altitude(ad_real ps, ad_real setting, ad_real *h)
{
    fti_num v = 0.0;
    fti_code c;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_baro_alt((fti_num)ps, (fti_num)setting, &v);
    return finish(c, v, h);
}

ad_status ad_altimeter_setting(ad_real ps, ad_real elevation, ad_real *setting)
{
    fti_num v = 0.0;
    fti_code c;
    if (setting == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_qnh((fti_num)ps, (fti_num)elevation, &v);
    return finish(c, v, setting);
}

ad_status ad_density_altitude(ad_real ps, ad_real sat, ad_real *h)
{
    fti_num v = 0.0;
    fti_code c;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_density_alt((fti_num)ps, (fti_num)sat, &v);
    return finish(c, v, h);
}

ad_status ad_impact_pressure_from_mach(ad_real mach, ad_real ps, ad_real *qc)
{
    fti_num v = 0.0;
    fti_code c;
    if (qc == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_qc_of_mach((fti_num)ps, (fti_num)mach, &v);
    return finish(c, v, qc);
}

ad_status ad_mach_from_impact_pressure(ad_real qc, ad_real ps, ad_real *mach)
{
    fti_num v = 0.0;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_mach_of_qc((fti_num)ps, (fti_num)qc, &v);
    return finish(c, v, mach);
}

ad_status ad_impact_pressure_from_cas(ad_real cas, ad_real *qc)
{
    fti_num v = 0.0;
    fti_code c;
    if (qc == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_qc_of_vc((fti_num)cas, &v);
    return finish(c, v, qc);
}

ad_status ad_cas_from_impact_pressure(ad_real qc, ad_real *cas)
{
    fti_num v = 0.0;
    fti_code c;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_vc_of_qc((fti_num)qc, &v);
    return finish(c, v, cas);
}

ad_status ad_cas_from_mach(ad_real mach, ad_real ps, ad_real *cas)
{
    fti_num v = 0.0;
    fti_code c;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_vc_of_mach((fti_num)ps, (fti_num)mach, &v);
    return finish(c, v, cas);
}

ad_status ad_mach_from_cas(ad_real cas, ad_real ps, ad_real *mach)
{
    fti_num v = 0.0;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_mach_of_vc((fti_num)ps, (fti_num)cas, &v);
    return finish(c, v, mach);
}

ad_status ad_eas_from_mach(ad_real mach, ad_real ps, ad_real *eas)
{
    fti_num v = 0.0;
    fti_code c;
    if (eas == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_ve_of_mach((fti_num)ps, (fti_num)mach, &v);
    return finish(c, v, eas);
}

ad_status ad_mach_from_eas(ad_real eas, ad_real ps, ad_real *mach)
{
    fti_num v = 0.0;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_mach_of_ve((fti_num)ps, (fti_num)eas, &v);
    return finish(c, v, mach);
}

ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas)
{
    fti_num v = 0.0;
    fti_code c;
    if (tas == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_vt_of_mach((fti_num)mach, (fti_num)sat, &v);
    return finish(c, v, tas);
}

ad_status ad_mach_from_tas(ad_real tas, ad_real sat, ad_real *mach)
{
    fti_num v = 0.0;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_mach_of_vt((fti_num)tas, (fti_num)sat, &v);
    return finish(c, v, mach);
}

ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q)
{
    fti_num v = 0.0;
    fti_code c;
    if (q == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_q_of_mach((fti_num)ps, (fti_num)mach, &v);
    return finish(c, v, q);
}

ad_status ad_sat_from_tat(ad_real tat, ad_real mach, ad_real recovery, ad_real *sat)
{
    fti_num v = 0.0;
    fti_code c;
    if (sat == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_t_static((fti_num)tat, (fti_num)mach, (fti_num)recovery, &v);
    return finish(c, v, sat);
}

ad_status ad_tat_from_sat(ad_real sat, ad_real mach, ad_real recovery, ad_real *tat)
{
    fti_num v = 0.0;
    fti_code c;
    if (tat == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_t_total((fti_num)sat, (fti_num)mach, (fti_num)recovery, &v);
    return finish(c, v, tat);
}

ad_status ad_air_data(ad_real ps, ad_real pt, ad_real tat, ad_real recovery,
                      ad_real setting, int use_setting, ad_real noise_band,
                      ad_air_data_t *out)
{
    fti_probe_sample s;
    fti_probe_config cfg;
    fti_air_state r = {0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0};
    ad_status st;
    if (out == NULL) {
        return AD_INVALID_INPUT;
    }
    s.p_static = (fti_num)ps;
    s.p_total = (fti_num)pt;
    s.t_total = (fti_num)tat;
    cfg.recovery = (fti_num)recovery;
    cfg.qnh_pa = (fti_num)setting;
    cfg.qnh_in_use = use_setting;
    cfg.qc_deadband_pa = (fti_num)noise_band;
    st = status_of(fti_air_solve(&s, &cfg, &r));
    if (!usable(st)) {
        r.hp = r.hbaro = r.qc = r.mach = r.vc = r.ve = r.vt = (fti_num)NAN;
        r.t_static = r.rho = r.hd = r.q = (fti_num)NAN;
    }
    out->pressure_altitude = (ad_real)r.hp;
    out->baro_altitude = (ad_real)r.hbaro;
    out->impact_pressure = (ad_real)r.qc;
    out->mach = (ad_real)r.mach;
    out->cas = (ad_real)r.vc;
    out->eas = (ad_real)r.ve;
    out->tas = (ad_real)r.vt;
    out->sat = (ad_real)r.t_static;
    out->density = (ad_real)r.rho;
    out->density_altitude = (ad_real)r.hd;
    out->dynamic_pressure = (ad_real)r.q;
    return st;
}

/* The team's wing record from the limit functions' first three arguments. */
static fti_wing wing_of(ad_real weight, ad_real wing_area, ad_real cl_max)
{
    fti_wing w;
    w.weight_n = (fti_num)weight;
    w.area_m2 = (fti_num)wing_area;
    w.cl_max = (fti_num)cl_max;
    return w;
}

static fti_envelope envelope_of(ad_real cas_limit, ad_real mach_limit)
{
    fti_envelope e;
    e.vmo = (fti_num)cas_limit;
    e.mmo = (fti_num)mach_limit;
    return e;
}

ad_status ad_stall_eas(ad_real weight, ad_real wing_area, ad_real cl_max,
                       ad_real load_factor, ad_real *eas)
{
    fti_num v = 0.0;
    fti_wing w;
    fti_code c;
    if (eas == NULL) {
        return AD_INVALID_INPUT;
    }
    w = wing_of(weight, wing_area, cl_max);
    c = fti_stall_ve(&w, (fti_num)load_factor, &v);
    return finish(c, v, eas);
}

ad_status ad_stall_mach(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                        ad_real load_factor, ad_real *mach)
{
    fti_num v = 0.0;
    fti_wing w;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    w = wing_of(weight, wing_area, cl_max);
    c = fti_stall_mach((fti_num)ps, &w, (fti_num)load_factor, &v);
    return finish(c, v, mach);
}

ad_status ad_stall_cas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real load_factor, ad_real *cas)
{
    fti_num v = 0.0;
    fti_wing w;
    fti_code c;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    w = wing_of(weight, wing_area, cl_max);
    c = fti_stall_vc((fti_num)ps, &w, (fti_num)load_factor, &v);
    return finish(c, v, cas);
}

ad_status ad_stall_tas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real sat, ad_real load_factor, ad_real *tas)
{
    fti_num v = 0.0;
    fti_wing w;
    fti_code c;
    if (tas == NULL) {
        return AD_INVALID_INPUT;
    }
    w = wing_of(weight, wing_area, cl_max);
    c = fti_stall_vt((fti_num)ps, (fti_num)sat, &w, (fti_num)load_factor, &v);
    return finish(c, v, tas);
}

ad_status ad_crossover_altitude(ad_real cas_limit, ad_real mach_limit, ad_real *h)
{
    fti_num v = 0.0;
    fti_envelope e;
    fti_code c;
    if (h == NULL) {
        return AD_INVALID_INPUT;
    }
    e = envelope_of(cas_limit, mach_limit);
    c = fti_crossover_hp(&e, &v);
    return finish(c, v, h);
}

ad_status ad_max_operating_cas(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                               ad_real *cas)
{
    fti_num v = 0.0;
    fti_envelope e;
    fti_code c;
    if (cas == NULL) {
        return AD_INVALID_INPUT;
    }
    e = envelope_of(cas_limit, mach_limit);
    c = fti_vmo_mmo_vc((fti_num)ps, &e, &v);
    return finish(c, v, cas);
}

ad_status ad_max_operating_mach(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                                ad_real *mach)
{
    fti_num v = 0.0;
    fti_envelope e;
    fti_code c;
    if (mach == NULL) {
        return AD_INVALID_INPUT;
    }
    e = envelope_of(cas_limit, mach_limit);
    c = fti_vmo_mmo_mach((fti_num)ps, &e, &v);
    return finish(c, v, mach);
}

ad_status ad_ceiling_margin(ad_real ps, ad_real ceiling, ad_real *margin)
{
    fti_num v = 0.0;
    fti_code c;
    if (margin == NULL) {
        return AD_INVALID_INPUT;
    }
    c = fti_ceiling_left((fti_num)ps, (fti_num)ceiling, &v);
    return finish(c, v, margin);
}
