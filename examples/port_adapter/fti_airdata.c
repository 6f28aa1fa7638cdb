/*
 * fti_airdata.c - the invented flight-test instrumentation team's air-data routines.
 * Demo code for `airdata port check`; an engineering and verification aid, not
 * certified flight software.
 *
 * Most routines sit on a vendored copy of the airdata reference C port
 * (bindings/c/src), compiled here in binary64 under the team's own names
 * (fti_ref_*), so its symbols never meet the adapter's ad_* functions.  Two pieces
 * are the team's own code:
 *   - true airspeed <-> Mach with the team's gas constant FTI_R_AIR;
 *   - the Mach number from qc/ps, with the team's own Newton solver for the
 *     supersonic (Rayleigh pitot) branch.
 *
 * Deliberate defects, for showing that the check catches them:
 *   -DDEFECT_GAS_CONSTANT   R = 287.05387 instead of 287.05287 (6th digit)
 *   -DDEFECT_SHORT_SOLVER   one Newton step instead of five
 *   -DDEFECT_UNDERFLOW      subsonic Mach from qc/ps as written, which underflows to
 *                           zero when qc is subnormal (the team's code before 2.0.0
 *                           of the vectors sampled such inputs)
 */

/* The team builds this file in binary64 whatever the adapter's precision. */
#undef AIRDATA_SINGLE

/* Vendored reference port, renamed into the team's namespace. */
#define ad_atmosphere fti_ref_atmosphere
#define ad_geopotential_altitude fti_ref_geopotential_altitude
#define ad_geometric_altitude fti_ref_geometric_altitude
#define ad_pressure_altitude fti_ref_pressure_altitude
#define ad_pressure_at_altitude fti_ref_pressure_at_altitude
#define ad_baro_corrected_altitude fti_ref_baro_corrected_altitude
#define ad_altimeter_setting fti_ref_altimeter_setting
#define ad_density_altitude fti_ref_density_altitude
#define ad_impact_pressure_from_mach fti_ref_impact_pressure_from_mach
#define ad_mach_from_impact_pressure fti_ref_mach_from_impact_pressure
#define ad_impact_pressure_from_cas fti_ref_impact_pressure_from_cas
#define ad_cas_from_impact_pressure fti_ref_cas_from_impact_pressure
#define ad_cas_from_mach fti_ref_cas_from_mach
#define ad_mach_from_cas fti_ref_mach_from_cas
#define ad_eas_from_mach fti_ref_eas_from_mach
#define ad_mach_from_eas fti_ref_mach_from_eas
#define ad_tas_from_mach fti_ref_tas_from_mach
#define ad_mach_from_tas fti_ref_mach_from_tas
#define ad_dynamic_pressure fti_ref_dynamic_pressure
#define ad_sat_from_tat fti_ref_sat_from_tat
#define ad_tat_from_sat fti_ref_tat_from_sat
#define ad_air_data fti_ref_air_data
#define ad_stall_eas fti_ref_stall_eas
#define ad_stall_mach fti_ref_stall_mach
#define ad_stall_cas fti_ref_stall_cas
#define ad_stall_tas fti_ref_stall_tas
#define ad_crossover_altitude fti_ref_crossover_altitude
#define ad_max_operating_cas fti_ref_max_operating_cas
#define ad_max_operating_mach fti_ref_max_operating_mach
#define ad_ceiling_margin fti_ref_ceiling_margin

#include "domains.c"
#include "inputs.c"
#include "dd.c"
#include "atmosphere.c"
#include "altimetry.c"
#include "pitot.c"
#include "speeds.c"
#include "temperature.c"
#include "chain.c"
#include "limits.c"

#include "fti_airdata.h"

/* Gas constant of dry air, J/(kg K): ICAO Doc 7488 (from memory). */
#ifdef DEFECT_GAS_CONSTANT
#define FTI_R_AIR 287.05387
#else
#define FTI_R_AIR 287.05287
#endif
#define FTI_GAMMA 1.4

#ifdef DEFECT_SHORT_SOLVER
#define FTI_SOLVER_STEPS 1
#else
#define FTI_SOLVER_STEPS 5
#endif

static fti_code fti_code_of(ad_status st)
{
    fti_code c = FTI_FAULT_ARGUMENT;
    switch (st) {
    case AD_OK: c = FTI_DONE; break;
    case AD_IMPACT_PRESSURE_ZEROED: c = FTI_NOTE_QC_FLOORED; break;
    case AD_OUT_OF_RANGE: c = FTI_FAULT_LIMIT; break;
    case AD_NO_CONVERGENCE: c = FTI_FAULT_SOLVER; break;
    case AD_INVALID_INPUT: c = FTI_FAULT_ARGUMENT; break;
    default: c = FTI_FAULT_ARGUMENT; break;
    }
    return c;
}

/* Store v in *out unless the code is a fault (the team's convention). */
static fti_code fti_keep(ad_status st, fti_num v, fti_num *out)
{
    fti_code c = fti_code_of(st);
    if (c >= 0) {
        *out = v;
    }
    return c;
}

fti_code fti_isa(fti_num geopotential_m, fti_num isa_offset_k, fti_isa_point *pt)
{
    ad_atmosphere_t a;
    fti_code c = fti_code_of(fti_ref_atmosphere(geopotential_m, isa_offset_k, &a));
    if (c >= 0) {
        pt->t_k = a.temperature;
        pt->p_pa = a.pressure;
        pt->rho = a.density;
        pt->a_mps = a.speed_of_sound;
        pt->mu = a.dynamic_viscosity;
        pt->nu = a.kinematic_viscosity;
    }
    return c;
}

fti_code fti_alt_convert(fti_num alt_m, int direction, fti_num *result)
{
    double v = 0.0;
    ad_status st = AD_INVALID_INPUT;
    if (direction == FTI_TO_GEOMETRIC) {
        st = fti_ref_geometric_altitude(alt_m, &v);
    } else if (direction == FTI_TO_GEOPOTENTIAL) {
        st = fti_ref_geopotential_altitude(alt_m, &v);
    }
    return fti_keep(st, v, result);
}

fti_code fti_hp_of_ps(fti_num ps, fti_num *hp)
{
    double v = 0.0;
    const ad_status st = fti_ref_pressure_altitude(ps, &v);
    return fti_keep(st, v, hp);
}

fti_code fti_ps_of_hp(fti_num hp, fti_num *ps)
{
    double v = 0.0;
    const ad_status st = fti_ref_pressure_at_altitude(hp, &v);
    return fti_keep(st, v, ps);
}

fti_code fti_baro_alt(fti_num ps, fti_num qnh, fti_num *alt)
{
    double v = 0.0;
    const ad_status st = fti_ref_baro_corrected_altitude(ps, qnh, &v);
    return fti_keep(st, v, alt);
}

fti_code fti_qnh(fti_num ps, fti_num field_elevation, fti_num *qnh)
{
    double v = 0.0;
    const ad_status st = fti_ref_altimeter_setting(ps, field_elevation, &v);
    return fti_keep(st, v, qnh);
}

fti_code fti_density_alt(fti_num ps, fti_num t_static, fti_num *hd)
{
    double v = 0.0;
    const ad_status st = fti_ref_density_altitude(ps, t_static, &v);
    return fti_keep(st, v, hd);
}

fti_code fti_qc_of_mach(fti_num ps, fti_num mach, fti_num *qc)
{
    double v = 0.0;
    const ad_status st = fti_ref_impact_pressure_from_mach(mach, ps, &v);
    return fti_keep(st, v, qc);
}

/*
 * The team's supersonic solver: u = M^2 solves the Rayleigh pitot relation (NACA
 * Report 1135, gamma = 1.4)
 *     F(u) = 3.5 ln(1.2 u) - 2.5 ln((7 u - 1)/6) - ln(1 + x) = 0,
 * by Newton steps from u0 = (1 + x)/1.2 * AD_PHI_INF - 5/14 (the large-Mach
 * asymptote of the same relation, shifted; AD_PHI_INF from the vendored constants),
 * each step kept within [1, 2 (1 + x)].
 */
static fti_num fti_supersonic_mach(fti_num x)
{
    const fti_num lr = log1p(x);
    fti_num u = (1.0 + x) / 1.2 * AD_PHI_INF - 5.0 / 14.0;
    const fti_num umax = 2.0 * (1.0 + x);
    int i;
    u = (u < 1.0) ? 1.0 : u;
    for (i = 0; i < FTI_SOLVER_STEPS; ++i) {
        const fti_num f = 3.5 * log(1.2 * u) - 2.5 * log((7.0 * u - 1.0) / 6.0) - lr;
        const fti_num df = 3.5 / u - 17.5 / (7.0 * u - 1.0);
        u = u - f / df;
        u = (u < 1.0) ? 1.0 : ((u > umax) ? umax : u);
    }
    return sqrt(u);
}

fti_code fti_mach_of_qc(fti_num ps, fti_num qc, fti_num *mach)
{
    fti_num x;
    ad_status st = ad_i_check(qc, AD_DOM_IMPACT_PRESSURE);
    if (st == AD_OK) {
        st = ad_i_check(ps, AD_DOM_PRESSURE);
    }
    if (st != AD_OK) {
        return fti_code_of(st);
    }
    x = qc / ps;
    if (x > AD_RATIO_LIMIT) {
        return FTI_FAULT_LIMIT;
    }
    if (x > AD_RATIO_SONIC) {
        *mach = fti_supersonic_mach(x);
#ifndef DEFECT_UNDERFLOW
    } else if (x < 0x1p-60) {
        /* Linear below qc/ps = 2^-60 (M^2 = 5 x / 3.5 to within 1e-18), formed on qc
         * scaled by 2^128: qc/ps itself may underflow or lose digits. */
        *mach = sqrt(5.0 * ((qc * 0x1p128 / ps) / 3.5)) * 0x1p-64;
#endif
    } else {
        *mach = sqrt(5.0 * expm1(log1p(x) / 3.5));
    }
    return FTI_DONE;
}

fti_code fti_qc_of_vc(fti_num vc, fti_num *qc)
{
    double v = 0.0;
    const ad_status st = fti_ref_impact_pressure_from_cas(vc, &v);
    return fti_keep(st, v, qc);
}

fti_code fti_vc_of_qc(fti_num qc, fti_num *vc)
{
    double v = 0.0;
    const ad_status st = fti_ref_cas_from_impact_pressure(qc, &v);
    return fti_keep(st, v, vc);
}

fti_code fti_vc_of_mach(fti_num ps, fti_num mach, fti_num *vc)
{
    double v = 0.0;
    const ad_status st = fti_ref_cas_from_mach(mach, ps, &v);
    return fti_keep(st, v, vc);
}

fti_code fti_mach_of_vc(fti_num ps, fti_num vc, fti_num *mach)
{
    double v = 0.0;
    const ad_status st = fti_ref_mach_from_cas(vc, ps, &v);
    return fti_keep(st, v, mach);
}

fti_code fti_ve_of_mach(fti_num ps, fti_num mach, fti_num *ve)
{
    double v = 0.0;
    const ad_status st = fti_ref_eas_from_mach(mach, ps, &v);
    return fti_keep(st, v, ve);
}

fti_code fti_mach_of_ve(fti_num ps, fti_num ve, fti_num *mach)
{
    double v = 0.0;
    const ad_status st = fti_ref_mach_from_eas(ve, ps, &v);
    return fti_keep(st, v, mach);
}

/* The team's own: vt = M sqrt(gamma R T). */
fti_code fti_vt_of_mach(fti_num mach, fti_num t_static, fti_num *vt)
{
    ad_status st = ad_i_check(mach, AD_DOM_MACH);
    if (st == AD_OK) {
        st = ad_i_check(t_static, AD_DOM_TEMPERATURE);
    }
    if (st != AD_OK) {
        return fti_code_of(st);
    }
    *vt = mach * sqrt(FTI_GAMMA * FTI_R_AIR * t_static);
    return FTI_DONE;
}

/* The team's own: M = vt / sqrt(gamma R T), refused above the Mach limit. */
fti_code fti_mach_of_vt(fti_num vt, fti_num t_static, fti_num *mach)
{
    fti_num m;
    ad_status st = ad_i_check(vt, AD_DOM_SPEED);
    if (st == AD_OK) {
        st = ad_i_check(t_static, AD_DOM_TEMPERATURE);
    }
    if (st != AD_OK) {
        return fti_code_of(st);
    }
    m = vt / sqrt(FTI_GAMMA * FTI_R_AIR * t_static);
    if (m > AD_MACH_LIMIT) {
        return FTI_FAULT_LIMIT;
    }
    *mach = m;
    return FTI_DONE;
}

fti_code fti_q_of_mach(fti_num ps, fti_num mach, fti_num *q)
{
    double v = 0.0;
    const ad_status st = fti_ref_dynamic_pressure(mach, ps, &v);
    return fti_keep(st, v, q);
}

fti_code fti_t_static(fti_num t_total, fti_num mach, fti_num recovery, fti_num *ts)
{
    double v = 0.0;
    const ad_status st = fti_ref_sat_from_tat(t_total, mach, recovery, &v);
    return fti_keep(st, v, ts);
}

fti_code fti_t_total(fti_num t_static, fti_num mach, fti_num recovery, fti_num *tt)
{
    double v = 0.0;
    const ad_status st = fti_ref_tat_from_sat(t_static, mach, recovery, &v);
    return fti_keep(st, v, tt);
}

fti_code fti_air_solve(const fti_probe_sample *s, const fti_probe_config *cfg,
                       fti_air_state *out)
{
    ad_air_data_t d;
    fti_code c = fti_code_of(fti_ref_air_data(s->p_static, s->p_total, s->t_total,
                                              cfg->recovery, cfg->qnh_pa, cfg->qnh_in_use,
                                              cfg->qc_deadband_pa, &d));
    if (c >= 0) {
        out->hp = d.pressure_altitude;
        out->hbaro = d.baro_altitude;
        out->qc = d.impact_pressure;
        out->mach = d.mach;
        out->vc = d.cas;
        out->ve = d.eas;
        out->vt = d.tas;
        out->t_static = d.sat;
        out->rho = d.density;
        out->hd = d.density_altitude;
        out->q = d.dynamic_pressure;
    }
    return c;
}

fti_code fti_stall_ve(const fti_wing *w, fti_num n_load, fti_num *ve)
{
    double v = 0.0;
    const ad_status st = fti_ref_stall_eas(w->weight_n, w->area_m2, w->cl_max, n_load, &v);
    return fti_keep(st, v, ve);
}

fti_code fti_stall_mach(fti_num ps, const fti_wing *w, fti_num n_load, fti_num *mach)
{
    double v = 0.0;
    const ad_status st = fti_ref_stall_mach(w->weight_n, w->area_m2, w->cl_max, ps, n_load,
                                            &v);
    return fti_keep(st, v, mach);
}

fti_code fti_stall_vc(fti_num ps, const fti_wing *w, fti_num n_load, fti_num *vc)
{
    double v = 0.0;
    const ad_status st = fti_ref_stall_cas(w->weight_n, w->area_m2, w->cl_max, ps, n_load,
                                           &v);
    return fti_keep(st, v, vc);
}

fti_code fti_stall_vt(fti_num ps, fti_num t_static, const fti_wing *w, fti_num n_load,
                      fti_num *vt)
{
    double v = 0.0;
    const ad_status st = fti_ref_stall_tas(w->weight_n, w->area_m2, w->cl_max, ps, t_static,
                                           n_load, &v);
    return fti_keep(st, v, vt);
}

fti_code fti_crossover_hp(const fti_envelope *e, fti_num *hp)
{
    double v = 0.0;
    const ad_status st = fti_ref_crossover_altitude(e->vmo, e->mmo, &v);
    return fti_keep(st, v, hp);
}

fti_code fti_vmo_mmo_vc(fti_num ps, const fti_envelope *e, fti_num *vc)
{
    double v = 0.0;
    const ad_status st = fti_ref_max_operating_cas(ps, e->vmo, e->mmo, &v);
    return fti_keep(st, v, vc);
}

fti_code fti_vmo_mmo_mach(fti_num ps, const fti_envelope *e, fti_num *mach)
{
    double v = 0.0;
    const ad_status st = fti_ref_max_operating_mach(ps, e->vmo, e->mmo, &v);
    return fti_keep(st, v, mach);
}

fti_code fti_ceiling_left(fti_num ps, fti_num ceiling_hp, fti_num *margin)
{
    double v = 0.0;
    const ad_status st = fti_ref_ceiling_margin(ps, ceiling_hp, &v);
    return fti_keep(st, v, margin);
}
