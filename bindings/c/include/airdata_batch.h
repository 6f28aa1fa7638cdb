/*
 * airdata_batch.h - array entry points of the airdata port, for bindings.
 *
 * An engineering and verification aid, not certified flight software.
 *
 * Each ad_<name>_n applies ad_<name> of airdata.h to n elements: input arrays of
 * length n (read only), output arrays of length n, and status[i] receives the status
 * of element i.  The arrays must not overlap.  The single loop is bounded by n.
 *
 * Return value: the number of elements whose status is an error (neither AD_OK nor
 * AD_IMPACT_PRESSURE_ZEROED), or AD_BATCH_NULL if a required pointer is NULL (then
 * nothing is written).
 *
 * ad_check_n classifies values against one of the port's argument domains, exactly as
 * the functions check their arguments (AD_OK, AD_INVALID_INPUT or AD_OUT_OF_RANGE).
 */
#ifndef AIRDATA_BATCH_H
#define AIRDATA_BATCH_H

#include <stddef.h>

#include "airdata.h"

/* Returned when a required pointer is NULL: the largest size_t. */
#define AD_BATCH_NULL ((size_t)-1)

/* Argument domains (airdata/_domains.py, the chain's own inputs and the limit
 * functions' inputs, airdata/limits.py). */
typedef enum {
    AD_DOM_MACH = 0,
    AD_DOM_SPEED = 1,
    AD_DOM_TEMPERATURE = 2,
    AD_DOM_DELTA_T = 3,
    AD_DOM_RECOVERY = 4,
    AD_DOM_IMPACT_PRESSURE = 5,
    AD_DOM_ELEVATION = 6,
    AD_DOM_ALTITUDE = 7,
    AD_DOM_GEOMETRIC = 8,
    AD_DOM_PRESSURE = 9,
    AD_DOM_SETTING = 10,
    AD_DOM_TOTAL_PRESSURE = 11,
    AD_DOM_NOISE_BAND = 12,
    AD_DOM_WEIGHT = 13,
    AD_DOM_WING_AREA = 14,
    AD_DOM_CL_MAX = 15,
    AD_DOM_LOAD_FACTOR = 16,
    AD_DOM_CAS_LIMIT = 17,
    AD_DOM_MACH_LIMIT = 18,
    AD_DOM_SUBSONIC_MACH_LIMIT = 19
} ad_domain_id;

size_t ad_check_n(ad_domain_id domain, const ad_real *x, unsigned char *status, size_t n);

/* atmosphere */
size_t ad_atmosphere_n(const ad_real *h, const ad_real *dT, ad_atmosphere_t *out,
                       unsigned char *status, size_t n);
size_t ad_geopotential_altitude_n(const ad_real *z, ad_real *h, unsigned char *status,
                                  size_t n);
size_t ad_geometric_altitude_n(const ad_real *h, ad_real *z, unsigned char *status,
                               size_t n);

/* altimetry */
size_t ad_pressure_altitude_n(const ad_real *ps, ad_real *h, unsigned char *status,
                              size_t n);
size_t ad_pressure_at_altitude_n(const ad_real *h, ad_real *ps, unsigned char *status,
                                 size_t n);
size_t ad_baro_corrected_altitude_n(const ad_real *ps, const ad_real *setting, ad_real *h,
                                    unsigned char *status, size_t n);
size_t ad_altimeter_setting_n(const ad_real *ps, const ad_real *elevation,
                              ad_real *setting, unsigned char *status, size_t n);
size_t ad_density_altitude_n(const ad_real *ps, const ad_real *sat, ad_real *h,
                             unsigned char *status, size_t n);

/* pitot */
size_t ad_impact_pressure_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *qc,
                                      unsigned char *status, size_t n);
size_t ad_mach_from_impact_pressure_n(const ad_real *qc, const ad_real *ps, ad_real *mach,
                                      unsigned char *status, size_t n);
size_t ad_impact_pressure_from_cas_n(const ad_real *cas, ad_real *qc, unsigned char *status,
                                     size_t n);
size_t ad_cas_from_impact_pressure_n(const ad_real *qc, ad_real *cas, unsigned char *status,
                                     size_t n);

/* speeds */
size_t ad_cas_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *cas,
                          unsigned char *status, size_t n);
size_t ad_mach_from_cas_n(const ad_real *cas, const ad_real *ps, ad_real *mach,
                          unsigned char *status, size_t n);
size_t ad_eas_from_mach_n(const ad_real *mach, const ad_real *ps, ad_real *eas,
                          unsigned char *status, size_t n);
size_t ad_mach_from_eas_n(const ad_real *eas, const ad_real *ps, ad_real *mach,
                          unsigned char *status, size_t n);
size_t ad_tas_from_mach_n(const ad_real *mach, const ad_real *sat, ad_real *tas,
                          unsigned char *status, size_t n);
size_t ad_mach_from_tas_n(const ad_real *tas, const ad_real *sat, ad_real *mach,
                          unsigned char *status, size_t n);
size_t ad_dynamic_pressure_n(const ad_real *mach, const ad_real *ps, ad_real *q,
                             unsigned char *status, size_t n);

/* temperature */
size_t ad_sat_from_tat_n(const ad_real *tat, const ad_real *mach, const ad_real *recovery,
                         ad_real *sat, unsigned char *status, size_t n);
size_t ad_tat_from_sat_n(const ad_real *sat, const ad_real *mach, const ad_real *recovery,
                         ad_real *tat, unsigned char *status, size_t n);

/* chain: setting may be NULL when use_setting == 0 */
size_t ad_air_data_n(const ad_real *ps, const ad_real *pt, const ad_real *tat,
                     const ad_real *recovery, const ad_real *setting, int use_setting,
                     ad_real noise_band, ad_air_data_t *out, unsigned char *status,
                     size_t n);

/* limits */
size_t ad_stall_eas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max,
                      const ad_real *load_factor, ad_real *eas, unsigned char *status,
                      size_t n);
size_t ad_stall_mach_n(const ad_real *weight, const ad_real *wing_area,
                       const ad_real *cl_max, const ad_real *ps, const ad_real *load_factor,
                       ad_real *mach, unsigned char *status, size_t n);
size_t ad_stall_cas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max,
                      const ad_real *ps, const ad_real *load_factor, ad_real *cas,
                      unsigned char *status, size_t n);
size_t ad_stall_tas_n(const ad_real *weight, const ad_real *wing_area, const ad_real *cl_max,
                      const ad_real *ps, const ad_real *sat, const ad_real *load_factor,
                      ad_real *tas, unsigned char *status, size_t n);
size_t ad_crossover_altitude_n(const ad_real *cas_limit, const ad_real *mach_limit,
                               ad_real *h, unsigned char *status, size_t n);
size_t ad_max_operating_cas_n(const ad_real *ps, const ad_real *cas_limit,
                              const ad_real *mach_limit, ad_real *cas,
                              unsigned char *status, size_t n);
size_t ad_max_operating_mach_n(const ad_real *ps, const ad_real *cas_limit,
                               const ad_real *mach_limit, ad_real *mach,
                               unsigned char *status, size_t n);
size_t ad_ceiling_margin_n(const ad_real *ps, const ad_real *ceiling, ad_real *margin,
                           unsigned char *status, size_t n);

#endif /* AIRDATA_BATCH_H */
