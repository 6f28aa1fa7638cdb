/*
 * ad_dd.h - double-double arithmetic (binary32 build: float-float) for the kernels
 * that must round about once (atmosphere.c), mirroring airdata/_dd.py.
 *
 * A value is hi + lo with |lo| <= ulp(hi)/2.  Only IEEE addition, subtraction,
 * multiplication, division and square root are used, through error-free
 * transformations: two-sum (Knuth), split and two-product (Dekker, "A
 * floating-point technique for extending the available precision", Numerische
 * Mathematik 18 (1971) 224-242).
 *
 * BUILD: dd.c is compiled without floating-point contraction (gcc/clang:
 * -ffp-contract=off, as the Makefile and airdata/_cport_build.py do).  A fused
 * multiply-add substituted for a product and a sum can break Dekker's split
 * (c - (c - a) with c = s a), and the transformations are then no longer error-free
 * by construction.  Measured (tests/test_cross_matrix.py): with -ffp-contract=fast on
 * x86-64 FMA and on aarch64 the port's objects hold 20 fused instructions, 254 of
 * 36 754 binary64 results (179 binary32) differ in the last bits from the unfused
 * build, and every vector still passes.  C99's "#pragma STDC FP_CONTRACT OFF" would
 * say the same in the source, but gcc ignores it (with a warning under -Wall), so the
 * flag is the only portable control.
 *
 * Splitter 2^ceil(p/2) + 1 for p significand bits: 134217729 = 2^27 + 1 (binary64),
 * 4097 = 2^12 + 1 (binary32).  No input here comes near overflow of splitter * a.
 */
#ifndef AD_DD_H
#define AD_DD_H

#include "airdata.h"

#if defined(AIRDATA_SINGLE)
#define AD_DD_SPLITTER 0x1.001p+12f /* 4097 = 2^12 + 1 */
#else
#define AD_DD_SPLITTER 0x1.0000002p+27 /* 134217729 = 2^27 + 1 */
#endif

/* A double-double (float-float) number hi + lo. */
typedef struct {
    ad_real hi;
    ad_real lo;
} ad_dd;

/* hi + 0. */
ad_dd ad_i_dd_of(ad_real x);
/* hi + lo as given (a constant and its generated low part). */
ad_dd ad_i_dd_pair(ad_real hi, ad_real lo);
/* s + e == a + b exactly, s = fl(a + b) (Knuth two-sum). */
ad_dd ad_i_dd_two_sum(ad_real a, ad_real b);
/* p + e == a * b exactly, p = fl(a * b) (Dekker two-product). */
ad_dd ad_i_dd_two_prod(ad_real a, ad_real b);
/* Double-double sum, product, quotient and square root (of a positive value). */
ad_dd ad_i_dd_add(ad_dd a, ad_dd b);
ad_dd ad_i_dd_mul(ad_dd a, ad_dd b);
ad_dd ad_i_dd_div(ad_dd a, ad_dd b);
ad_dd ad_i_dd_sqrt(ad_dd a);

#endif /* AD_DD_H */
