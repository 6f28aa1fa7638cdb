/*
 * airdata.h - the C99 interface of the airdata port.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * Every function mirrors the Python reference function of the same name (without the
 * "ad_" prefix) in the package `airdata`; docs/equations.md gives the equation ids.
 *
 * Contract shared by every function:
 *   - SI units in and out (Pa, m, m/s, K); Mach and recovery factor dimensionless.
 *   - The return value is the status; outputs are written only through pointers.
 *   - Arguments are checked in the order they are declared; the first failing check
 *     decides the status (INVALID_INPUT before OUT_OF_RANGE for the same argument).
 *     Derived quantities (for example the Mach number a CAS reaches at a given static
 *     pressure) are checked after every argument.
 *   - On any status other than AD_OK and AD_IMPACT_PRESSURE_ZEROED every output is NaN.
 *   - Output pointers must not be NULL; a NULL output pointer returns
 *     AD_INVALID_INPUT and writes nothing.
 *   - No heap, no global mutable state, no recursion; every loop has a fixed bound.
 *
 * Precision: ad_real is double, or float when the port is compiled with
 * -DAIRDATA_SINGLE.  The constants profile is ICAO Doc 7488 (R = 287.05287), or the
 * U.S. Standard Atmosphere 1976 (R = 8314.32/28.9644) with -DAIRDATA_PROFILE_US1976.
 */
#ifndef AIRDATA_H
#define AIRDATA_H

#ifdef AIRDATA_SINGLE
typedef float ad_real;
#else
typedef double ad_real;
#endif

/* Status codes: the same numeric values as airdata.Status and the vectors. */
typedef enum {
    AD_OK = 0,
    AD_INVALID_INPUT = 1,
    AD_OUT_OF_RANGE = 2,
    AD_NO_CONVERGENCE = 3,
    AD_IMPACT_PRESSURE_ZEROED = 4
} ad_status;

/* Standard atmosphere state, ATM-2 .. ATM-6. */
typedef struct {
    ad_real temperature;         /* K */
    ad_real pressure;            /* Pa */
    ad_real density;             /* kg/m3 */
    ad_real speed_of_sound;      /* m/s */
    ad_real dynamic_viscosity;   /* Pa s */
    ad_real kinematic_viscosity; /* m2/s */
} ad_atmosphere_t;

/* Outputs of the air-data chain, CHN-1. */
typedef struct {
    ad_real pressure_altitude;   /* m */
    ad_real baro_altitude;       /* m; NaN when use_setting == 0 */
    ad_real impact_pressure;     /* Pa */
    ad_real mach;
    ad_real cas;                 /* m/s */
    ad_real eas;                 /* m/s */
    ad_real tas;                 /* m/s */
    ad_real sat;                 /* K */
    ad_real density;             /* kg/m3 */
    ad_real density_altitude;    /* m */
    ad_real dynamic_pressure;    /* Pa */
} ad_air_data_t;

/* atmosphere.c */
ad_status ad_atmosphere(ad_real h, ad_real dT, ad_atmosphere_t *out);
/* ATM-7: geopotential altitude h (m) of geometric altitude z (m). */
ad_status ad_geopotential_altitude(ad_real z, ad_real *h);
/* ATM-8: geometric altitude z (m) of geopotential altitude h (m). */
ad_status ad_geometric_altitude(ad_real h, ad_real *z);

/* altimetry.c */
/* ALT-1: pressure altitude h (m) of static pressure ps (Pa). */
ad_status ad_pressure_altitude(ad_real ps, ad_real *h);
/* ATM-3: standard static pressure ps (Pa) at pressure altitude h (m). */
ad_status ad_pressure_at_altitude(ad_real h, ad_real *ps);
/* ALT-2: altitude h (m) above the altimeter setting (Pa) at static pressure ps (Pa). */
ad_status ad_baro_corrected_altitude(ad_real ps, ad_real setting, ad_real *h);
/* ALT-3: altimeter setting (Pa) from station pressure ps (Pa) at elevation (m). */
ad_status ad_altimeter_setting(ad_real ps, ad_real elevation, ad_real *setting);
/* ALT-4: density altitude h (m) of static pressure ps (Pa) and SAT (K). */
ad_status ad_density_altitude(ad_real ps, ad_real sat, ad_real *h);

/* pitot.c */
/* PIT-1: impact pressure qc (Pa) of Mach number and static pressure ps (Pa). */
ad_status ad_impact_pressure_from_mach(ad_real mach, ad_real ps, ad_real *qc);
/* PIT-2: Mach number of impact pressure qc and static pressure ps (Pa). */
ad_status ad_mach_from_impact_pressure(ad_real qc, ad_real ps, ad_real *mach);
/* PIT-3: impact pressure qc (Pa) of calibrated airspeed cas (m/s). */
ad_status ad_impact_pressure_from_cas(ad_real cas, ad_real *qc);
/* PIT-4: calibrated airspeed cas (m/s) of impact pressure qc (Pa). */
ad_status ad_cas_from_impact_pressure(ad_real qc, ad_real *cas);

/* speeds.c */
/* SPD-1: CAS (m/s) of Mach number at static pressure ps (Pa), and the inverse. */
ad_status ad_cas_from_mach(ad_real mach, ad_real ps, ad_real *cas);
ad_status ad_mach_from_cas(ad_real cas, ad_real ps, ad_real *mach);
/* SPD-2: EAS (m/s) of Mach number at static pressure ps (Pa), and the inverse. */
ad_status ad_eas_from_mach(ad_real mach, ad_real ps, ad_real *eas);
ad_status ad_mach_from_eas(ad_real eas, ad_real ps, ad_real *mach);
/* SPD-3: TAS (m/s) of Mach number at static air temperature sat (K), and the inverse. */
ad_status ad_tas_from_mach(ad_real mach, ad_real sat, ad_real *tas);
ad_status ad_mach_from_tas(ad_real tas, ad_real sat, ad_real *mach);
/* SPD-4: dynamic pressure q (Pa) of Mach number at static pressure ps (Pa). */
ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q);

/* temperature.c: TMP-1, SAT (K) from TAT (K) at a Mach number and probe recovery
 * factor, and the inverse. */
ad_status ad_sat_from_tat(ad_real tat, ad_real mach, ad_real recovery, ad_real *sat);
ad_status ad_tat_from_sat(ad_real sat, ad_real mach, ad_real recovery, ad_real *tat);

/* chain.c: setting is used only when use_setting != 0; noise_band as in Python
 * (default 100 Pa, valid 0 .. 10000 Pa).  noise_band is a configuration value, not a
 * sensor reading: it is checked FIRST, before ps, pt, tat, recovery and setting (NaN,
 * infinite or negative: AD_INVALID_INPUT; above 10000 Pa: AD_OUT_OF_RANGE), as the
 * Python reference refuses it before looking at the samples. */
ad_status ad_air_data(ad_real ps, ad_real pt, ad_real tat, ad_real recovery,
                      ad_real setting, int use_setting, ad_real noise_band,
                      ad_air_data_t *out);

/* limits.c: flight-envelope limits (LIM-1 .. LIM-5), mirroring airdata/limits/equations.py.
 * weight N, wing_area m2, cl_max and load_factor dimensionless (load_factor = 1 for
 * level flight; Python's default), cas_limit m/s, mach_limit dimensionless, ceiling m
 * (geopotential pressure altitude).  crossover_altitude takes a subsonic Mach limit,
 * in (0, 1); the maximum operating functions take one in (0, 10]. */
ad_status ad_stall_eas(ad_real weight, ad_real wing_area, ad_real cl_max,
                       ad_real load_factor, ad_real *eas);
ad_status ad_stall_mach(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                        ad_real load_factor, ad_real *mach);
ad_status ad_stall_cas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real load_factor, ad_real *cas);
ad_status ad_stall_tas(ad_real weight, ad_real wing_area, ad_real cl_max, ad_real ps,
                       ad_real sat, ad_real load_factor, ad_real *tas);
ad_status ad_crossover_altitude(ad_real cas_limit, ad_real mach_limit, ad_real *h);
ad_status ad_max_operating_cas(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                               ad_real *cas);
ad_status ad_max_operating_mach(ad_real ps, ad_real cas_limit, ad_real mach_limit,
                                ad_real *mach);
ad_status ad_ceiling_margin(ad_real ps, ad_real ceiling, ad_real *margin);

#endif /* AIRDATA_H */
