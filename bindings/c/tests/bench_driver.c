/*
 * bench_driver.c - driver of `airdata bench` lines 6a and 6b: calls one entry point of
 * the port on inputs read from a file, to count instructions per call under callgrind.
 *
 * An engineering and verification aid, not certified flight software.
 *
 *   bench_driver MODE FILE N   (FILE: 3 N binary64 little-endian arrays a, b, c)
 *   MODE 1: ad_air_data(a, b, c); 2: ad_mach_from_impact_pressure(a, b); 0: the loop alone
 */
#include <stdio.h>
#include <stdlib.h>
#include "airdata.h"

#define NMAX 100000
static double a[NMAX], b[NMAX], c[NMAX];

int main(int argc, char **argv)
{
    FILE *f;
    long i, n, mode;
    double acc = 0.0;
    ad_air_data_t out;
    ad_real mach;
    ad_status st;

    if (argc != 4) { return 2; }
    mode = atol(argv[1]);
    n = atol(argv[3]);
    if (n < 1 || n > NMAX) { return 2; }
    f = fopen(argv[2], "rb");
    if (f == NULL) { return 2; }
    if (fread(a, sizeof a[0], (size_t)n, f) != (size_t)n
        || fread(b, sizeof b[0], (size_t)n, f) != (size_t)n
        || fread(c, sizeof c[0], (size_t)n, f) != (size_t)n) { fclose(f); return 2; }
    fclose(f);
    for (i = 0; i < n; i++) {
        if (mode == 1) {
            st = ad_air_data(a[i], b[i], c[i], 1.0, 0.0, 0, 100.0, &out);
            acc += out.mach + (double)st;
        } else if (mode == 2) {
            st = ad_mach_from_impact_pressure(a[i], b[i], &mach);
            acc += mach + (double)st;
        } else {
            acc += a[i] + b[i] + c[i];
        }
    }
    printf("%.17g\n", acc);
    return 0;
}
