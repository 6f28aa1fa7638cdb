/*
 * dd.c - double-double (binary32: float-float) arithmetic, see ad_dd.h; the same
 * operations in the same order as airdata/_dd.py, so the binary64 build gives the
 * reference's bits wherever libm does.
 *
 * Compiled with -ffp-contract=off (see ad_dd.h): the algorithms below are exact by
 * construction only when every product and sum is rounded separately.
 *
 * Error bounds (Dekker 1971; binary64 u = 2^-53, binary32 u = 2^-24): two-sum and
 * two-product are exact; add, mul, div and sqrt are accurate to a few u^2 relative
 * for the well-scaled positive operands used here, far below the final rounding to
 * ad_real.  Special cases: none arise (finite positive operands of moderate size);
 * the functions propagate NaN and do not check.
 */
#include "ad_internal.h"

ad_dd ad_i_dd_of(ad_real x)
{
    ad_dd r;
    r.hi = x;
    r.lo = (ad_real)0;
    return r;
}

ad_dd ad_i_dd_pair(ad_real hi, ad_real lo)
{
    ad_dd r;
    r.hi = hi;
    r.lo = lo;
    return r;
}

ad_dd ad_i_dd_two_sum(ad_real a, ad_real b)
{
    ad_dd r;
    const ad_real s = a + b;
    const ad_real bb = s - a;
    r.hi = s;
    r.lo = (a - (s - bb)) + (b - bb);
    return r;
}

/* s + e == a + b exactly when |a| >= |b| or a == 0 (Dekker's fast two-sum). */
static ad_dd ad_dd_fast_two_sum(ad_real a, ad_real b)
{
    ad_dd r;
    const ad_real s = a + b;
    r.hi = s;
    r.lo = b - (s - a);
    return r;
}

/* a == hi + lo with hi and lo of at most half the significand bits (Veltkamp). */
static ad_dd ad_dd_split(ad_real a)
{
    ad_dd r;
    const ad_real c = AD_DD_SPLITTER * a;
    r.hi = c - (c - a);
    r.lo = a - r.hi;
    return r;
}

ad_dd ad_i_dd_two_prod(ad_real a, ad_real b)
{
    ad_dd r;
    const ad_real p = a * b;
    const ad_dd as = ad_dd_split(a);
    const ad_dd bs = ad_dd_split(b);
    r.hi = p;
    r.lo = (((as.hi * bs.hi - p) + as.hi * bs.lo) + as.lo * bs.hi) + as.lo * bs.lo;
    return r;
}

ad_dd ad_i_dd_add(ad_dd a, ad_dd b)
{
    const ad_dd s = ad_i_dd_two_sum(a.hi, b.hi);
    return ad_dd_fast_two_sum(s.hi, s.lo + (a.lo + b.lo));
}

ad_dd ad_i_dd_mul(ad_dd a, ad_dd b)
{
    const ad_dd p = ad_i_dd_two_prod(a.hi, b.hi);
    return ad_dd_fast_two_sum(p.hi, p.lo + (a.hi * b.lo + a.lo * b.hi));
}

ad_dd ad_i_dd_div(ad_dd a, ad_dd b)
{
    const ad_real q1 = a.hi / b.hi;
    const ad_dd p = ad_i_dd_mul(ad_i_dd_of(q1), b);
    const ad_real r = ((a.hi - p.hi) - p.lo) + a.lo;
    return ad_dd_fast_two_sum(q1, r / b.hi);
}

ad_dd ad_i_dd_sqrt(ad_dd a)
{
    const ad_real s = ad_sqrt(a.hi);
    const ad_dd p = ad_i_dd_two_prod(s, s);
    const ad_real corr = (((a.hi - p.hi) - p.lo) + a.lo) / ((ad_real)2 * s);
    return ad_dd_fast_two_sum(s, corr);
}
