/*
 * ad_internal.h - internals shared by the source files of the airdata port.
 *
 * The real-type switch lives here: with -DAIRDATA_SINGLE every wrapper below calls
 * the f-suffixed libm function on float, so nothing is promoted to double.  The
 * wrappers add no rounding of their own: their error is that of the libm function
 * (glibc documents at most a few ulp for exp, log, log1p, expm1; sqrt is correctly
 * rounded by IEEE 754).
 */
#ifndef AD_INTERNAL_H
#define AD_INTERNAL_H

/*
 * Refuse value-unsafe optimisation: -ffast-math and -ffinite-math-only (gcc, clang)
 * let the compiler assume that no NaN or infinity occurs, which deletes the input
 * checks the statuses rely on (measured: in such a build every NaN input of all 30
 * functions came back AD_OK).  Both compilers define __FINITE_MATH_ONLY__ to 1 then.
 */
#if defined(__FAST_MATH__) || (defined(__FINITE_MATH_ONLY__) && __FINITE_MATH_ONLY__)
#error "airdata port: built with -ffast-math or -ffinite-math-only, which remove its NaN and infinity checks; build without them (value-safe options only)"
#endif

#include <math.h>

/*
 * AD_ASSERT(cond): an invariant the code relies on, stated where it matters.  Checked
 * only in a debug build (-DAIRDATA_DEBUG_ASSERT, as the sanitizer driver and the
 * runner's assertion build in tests/test_cport_build.py are built); in a release build
 * it compiles to nothing, so it costs nothing and adds no branch to the port.
 */
#if defined(AIRDATA_DEBUG_ASSERT)
#include <assert.h>
#define AD_ASSERT(cond) assert(cond)
#else
#define AD_ASSERT(cond) ((void)0)
#endif

#include "airdata.h"
#include "airdata_batch.h"
#include "ad_constants.h"
#include "ad_dd.h"

/* Number of layers of the standard atmosphere. */
#define AD_NLAYERS 7

/* Per-layer constants (the LayerTable of airdata/atmosphere.py). */
typedef struct {
    ad_real hb;     /* base geopotential altitude, m */
    ad_real lapse;  /* temperature gradient L, K/m */
    ad_real tb;     /* base temperature, K */
    ad_real pb;     /* base pressure, Pa */
    ad_real m;      /* L/Tb (gradient layers), else 0 */
    ad_real k;      /* g0/(R L) (gradient layers), else 0 */
    ad_real c;      /* g0/(R Tb) (isothermal layers), else 0 */
    ad_real n;      /* -R L/g0 (gradient layers), else 0 */
    ad_real sh;     /* -R Tb/g0 */
    ad_real rho_b;  /* base density pb/(R Tb), kg/m3 */
    ad_real kd;     /* -R L/(g0 + R L) (gradient layers), else 0 */
    ad_real tb_lo;    /* low part of tb (double-double, ad_dd.h) */
    ad_real lapse_lo; /* low part of lapse */
    ad_real pb_lo;    /* low part of pb */
    int gradient;   /* 1 for a gradient layer, 0 for an isothermal one */
} ad_layer;

/* The layer table, defined once in atmosphere.c (read only). */
extern const ad_layer ad_i_layer[AD_NLAYERS];

/* The libm functions of the real type: the f-suffixed ones on float. */
#if defined(AIRDATA_SINGLE)
#define AD_LIBM_EXP expf
#define AD_LIBM_LOG logf
#define AD_LIBM_LOG1P log1pf
#define AD_LIBM_EXPM1 expm1f
#define AD_LIBM_SQRT sqrtf
#else
#define AD_LIBM_EXP exp
#define AD_LIBM_LOG log
#define AD_LIBM_LOG1P log1p
#define AD_LIBM_EXPM1 expm1
#define AD_LIBM_SQRT sqrt
#endif

static inline ad_real ad_exp(ad_real x) { return AD_LIBM_EXP(x); }
static inline ad_real ad_log(ad_real x) { return AD_LIBM_LOG(x); }
static inline ad_real ad_log1p(ad_real x) { return AD_LIBM_LOG1P(x); }
static inline ad_real ad_expm1(ad_real x) { return AD_LIBM_EXPM1(x); }
static inline ad_real ad_sqrt(ad_real x) { return AD_LIBM_SQRT(x); }

/* A quiet NaN of the real type. */
static inline ad_real ad_nan(void) { return (ad_real)NAN; }

/* domains.c: status of x against an argument domain (airdata/_inputs.py classify). */
ad_status ad_i_check(ad_real x, ad_domain_id domain);

/* inputs.c: the input handling of every public function (airdata/_inputs.py). */
/* AD_INVALID_INPUT when out is NULL, else the status of a in domain da. */
ad_status ad_i_inputs1(const void *out, ad_real a, ad_domain_id da);
/* The same, then b in db (the first bad argument decides). */
ad_status ad_i_inputs2(const void *out, ad_real a, ad_domain_id da, ad_real b,
                       ad_domain_id db);
/* The same, then c in dc. */
ad_status ad_i_inputs3(const void *out, ad_real a, ad_domain_id da, ad_real b,
                       ad_domain_id db, ad_real c, ad_domain_id dc);
/* st when it is not AD_OK, else the status of x in domain. */
ad_status ad_i_then(ad_status st, ad_real x, ad_domain_id domain);
/* Writes y (st AD_OK) or a NaN through out, nothing when out is NULL; returns st. */
ad_status ad_i_finish(ad_status st, ad_real y, ad_real *out);

/* atmosphere.c */
int ad_i_layer_of_altitude(ad_real h);
ad_dd ad_i_pressure_dd(ad_real h, int i);
ad_real ad_i_standard_pressure(ad_real h, int i);

/* altimetry.c */
ad_real ad_i_altitude_of_pressure(ad_real p);
ad_real ad_i_altitude_of_density(ad_real p, ad_real temp, ad_real rho);

/* pitot.c */
ad_real ad_i_ratio_from_mach(ad_real m);
ad_real ad_i_impact_from_mach(ad_real m, ad_real p);
ad_real ad_i_mach_from_ratio(ad_real x);
ad_real ad_i_tiny_up(ad_real v);
ad_real ad_i_mach_from_pressures(ad_real qc, ad_real p);
ad_real ad_i_cas_of_mach(ad_real m, ad_real k, ad_real x);
ad_real ad_i_mach_of_cas(ad_real cas, ad_real k, ad_real x);

#endif /* AD_INTERNAL_H */
