/*
 * inputs.c - the input handling every public function of the port shares, mirroring
 * airdata/_inputs.py (Inputs, then finish):
 *
 *   st = ad_i_inputs2(out, a, AD_DOM_A, b, AD_DOM_B);   the NULL rule, then a, then b
 *   st = ad_i_then(st, c, AD_DOM_C);                      one more argument, in order
 *   if (st == AD_OK) { ... derived checks, result y ... }
 *   return ad_i_finish(st, y, out);                       y, or a NaN, through out
 *
 * The NULL rule: an output pointer passed as NULL gives AD_INVALID_INPUT and nothing
 * is written.  Arguments are checked in the order given; the first bad one decides
 * the status.  These helpers do no arithmetic: the results are those of the kernels.
 *
 * A result y that is plain arithmetic may be formed before the status is known: from a
 * bad argument it is at worst a NaN or an infinity, which ad_i_finish discards.  A
 * result that calls a kernel is formed only when st is AD_OK, as
 * (st == AD_OK) ? kernel(...) : ad_nan(),
 * since the kernels state invariants of checked arguments (AD_ASSERT).
 */
#include "ad_internal.h"

ad_status ad_i_then(ad_status st, ad_real x, ad_domain_id domain)
{
    return (st == AD_OK) ? ad_i_check(x, domain) : st;
}

ad_status ad_i_inputs1(const void *out, ad_real a, ad_domain_id da)
{
    return (out == NULL) ? AD_INVALID_INPUT : ad_i_check(a, da);
}

ad_status ad_i_inputs2(const void *out, ad_real a, ad_domain_id da, ad_real b,
                       ad_domain_id db)
{
    return ad_i_then(ad_i_inputs1(out, a, da), b, db);
}

ad_status ad_i_inputs3(const void *out, ad_real a, ad_domain_id da, ad_real b,
                       ad_domain_id db, ad_real c, ad_domain_id dc)
{
    return ad_i_then(ad_i_inputs2(out, a, da, b, db), c, dc);
}

ad_status ad_i_finish(ad_status st, ad_real y, ad_real *out)
{
    if (out != NULL) {
        *out = (st == AD_OK) ? y : ad_nan();
    }
    return st;
}
