/*
 * A small user port for tests/test_port_coverage.py: dynamic pressure q = 0.7 ps M^2
 * (q = gamma/2 ps M^2, gamma = 1.4; NACA Report 1135, from memory) behind airdata.h, with the
 * argument rules of airdata.h written out (domain limits from the bundled
 * ad_constants.h).  One decision is deliberately out of reach of every vector: it
 * tests for a negative q after q = 0.7 ps M^2 has been formed from checked,
 * non-negative arguments.  `airdata port coverage` must list that line, and only it.
 * With -DCOVERAGE_NO_NULL_GUARD the NULL-output rule of airdata.h is left out: the
 * runner's NULL check then ends the run with SIGSEGV, which the report must say.
 *
 * An engineering and verification aid, not certified flight software.
 */
#include <math.h>
#include <stddef.h>

#include "airdata.h"
#include "ad_constants.h"

/* Status of x against [lo, hi]: NaN or infinity invalid, then the sign rule (positive:
 * x > 0; otherwise x >= 0), then the range. */
static ad_status cov_check(ad_real x, ad_real lo, ad_real hi, int positive)
{
    ad_status st = AD_OK;
    if (!isfinite(x)) {
        st = AD_INVALID_INPUT;
    } else if ((positive != 0) ? (x <= (ad_real)0) : (x < (ad_real)0)) {
        st = AD_INVALID_INPUT;
    } else if ((x < lo) || (x > hi)) {
        st = AD_OUT_OF_RANGE;
    } else {
        st = AD_OK;
    }
    return st;
}

ad_status ad_dynamic_pressure(ad_real mach, ad_real ps, ad_real *q)
{
    ad_status st;
#ifndef COVERAGE_NO_NULL_GUARD
    if (q == NULL) {
        return AD_INVALID_INPUT;
    }
#endif
    st = cov_check(mach, AD_MACH_LO, AD_MACH_HI, 0);
    if (st == AD_OK) {
        st = cov_check(ps, AD_PRESSURE_LO, AD_PRESSURE_HI, 1);
    }
    if (st != AD_OK) {
        *q = (ad_real)NAN;
        return st;
    }
    *q = (ad_real)0.7 * ps * (mach * mach);
    if ((*q < (ad_real)0) && (*q > (ad_real)-1e-30)) { *q = (ad_real)0; } /* COVERAGE-DEAD */
    return AD_OK;
}
