/*
 * fti_airdata.h - air-data routines of an invented flight-test instrumentation team's
 * firmware ("fti").  Demo code for `airdata port check`; an engineering and
 * verification aid, not certified flight software.
 *
 * Conventions of this team (deliberately unlike airdata.h):
 *   - one numeric type, fti_num, always binary64 (their data-acquisition unit has a
 *     double-precision FPU);
 *   - their own result codes: 0 done, a positive note when the result is usable,
 *     negative faults; on a fault the output is left untouched;
 *   - static pressure usually comes first; the probe readings and the configuration
 *     of the chain travel in structs;
 *   - the atmosphere record and the chain's outputs use their own field names.
 * SI units throughout (Pa, m, m/s, K).
 */
#ifndef FTI_AIRDATA_H
#define FTI_AIRDATA_H

typedef double fti_num;

typedef enum {
    FTI_DONE = 0,
    FTI_NOTE_QC_FLOORED = 1,     /* usable; a small negative impact pressure read as 0 */
    FTI_FAULT_ARGUMENT = -10,    /* NaN, infinite, or of the wrong sign */
    FTI_FAULT_LIMIT = -11,       /* outside the valid range (argument or derived) */
    FTI_FAULT_SOLVER = -12       /* an iteration did not converge */
} fti_code;

/* Direction of fti_alt_convert. */
#define FTI_TO_GEOMETRIC 1
#define FTI_TO_GEOPOTENTIAL 2

typedef struct {
    fti_num t_k;        /* temperature, K */
    fti_num p_pa;       /* pressure, Pa */
    fti_num rho;        /* density, kg/m3 */
    fti_num a_mps;      /* speed of sound, m/s */
    fti_num mu;         /* dynamic viscosity, Pa s */
    fti_num nu;         /* kinematic viscosity, m2/s */
} fti_isa_point;

typedef struct {
    fti_num p_static;   /* Pa */
    fti_num p_total;    /* Pa */
    fti_num t_total;    /* K */
} fti_probe_sample;

typedef struct {
    fti_num recovery;        /* probe recovery factor */
    fti_num qnh_pa;          /* altimeter setting, Pa */
    int qnh_in_use;          /* 0: no baro-corrected altitude */
    fti_num qc_deadband_pa;  /* negative impact pressure read as zero within this band */
} fti_probe_config;

typedef struct {
    fti_num hp, hbaro, qc, mach, vc, ve, vt, t_static, rho, hd, q;
} fti_air_state;

fti_code fti_isa(fti_num geopotential_m, fti_num isa_offset_k, fti_isa_point *pt);
fti_code fti_alt_convert(fti_num alt_m, int direction, fti_num *result);

fti_code fti_hp_of_ps(fti_num ps, fti_num *hp);
fti_code fti_ps_of_hp(fti_num hp, fti_num *ps);
fti_code fti_baro_alt(fti_num ps, fti_num qnh, fti_num *alt);
fti_code fti_qnh(fti_num ps, fti_num field_elevation, fti_num *qnh);
fti_code fti_density_alt(fti_num ps, fti_num t_static, fti_num *hd);

fti_code fti_qc_of_mach(fti_num ps, fti_num mach, fti_num *qc);
fti_code fti_mach_of_qc(fti_num ps, fti_num qc, fti_num *mach);
fti_code fti_qc_of_vc(fti_num vc, fti_num *qc);
fti_code fti_vc_of_qc(fti_num qc, fti_num *vc);

fti_code fti_vc_of_mach(fti_num ps, fti_num mach, fti_num *vc);
fti_code fti_mach_of_vc(fti_num ps, fti_num vc, fti_num *mach);
fti_code fti_ve_of_mach(fti_num ps, fti_num mach, fti_num *ve);
fti_code fti_mach_of_ve(fti_num ps, fti_num ve, fti_num *mach);
fti_code fti_vt_of_mach(fti_num mach, fti_num t_static, fti_num *vt);
fti_code fti_mach_of_vt(fti_num vt, fti_num t_static, fti_num *mach);
fti_code fti_q_of_mach(fti_num ps, fti_num mach, fti_num *q);

fti_code fti_t_static(fti_num t_total, fti_num mach, fti_num recovery, fti_num *ts);
fti_code fti_t_total(fti_num t_static, fti_num mach, fti_num recovery, fti_num *tt);

/* Flight-envelope limits (the team's names): the wing of one loading case, and the
 * airframe's speed limits (VMO as CAS in m/s, MMO as a Mach number). */
typedef struct {
    fti_num weight_n;    /* N */
    fti_num area_m2;     /* m2 */
    fti_num cl_max;      /* maximum lift coefficient */
} fti_wing;

typedef struct {
    fti_num vmo;         /* m/s, calibrated */
    fti_num mmo;         /* Mach */
} fti_envelope;

fti_code fti_stall_ve(const fti_wing *w, fti_num n_load, fti_num *ve);
fti_code fti_stall_mach(fti_num ps, const fti_wing *w, fti_num n_load, fti_num *mach);
fti_code fti_stall_vc(fti_num ps, const fti_wing *w, fti_num n_load, fti_num *vc);
fti_code fti_stall_vt(fti_num ps, fti_num t_static, const fti_wing *w, fti_num n_load,
                      fti_num *vt);
fti_code fti_crossover_hp(const fti_envelope *e, fti_num *hp);
fti_code fti_vmo_mmo_vc(fti_num ps, const fti_envelope *e, fti_num *vc);
fti_code fti_vmo_mmo_mach(fti_num ps, const fti_envelope *e, fti_num *mach);
fti_code fti_ceiling_left(fti_num ps, fti_num ceiling_hp, fti_num *margin);

fti_code fti_air_solve(const fti_probe_sample *s, const fti_probe_config *cfg,
                       fti_air_state *out);

#endif /* FTI_AIRDATA_H */
