/*
 * Test port wrong by a constant: pressure altitude with the weather-service formula
 * h = 44307.7 m * (1 - (p / 1013.25 hPa)^0.190284), the well-known approximate form
 * (common practice, no source), in place of the layered standard atmosphere.  In the
 * troposphere it is about 15 ft low near 36 000 ft; above the tropopause it has no
 * isothermal layer and is hundreds of ft off.  It exists so that tests/test_evidence.py
 * can show a requirement failing in the right altitude band.  Not flight software.
 *
 * C99, no heap, no loops.
 */
#include <math.h>
#include "airdata.h"

ad_status ad_pressure_altitude(ad_real ps, ad_real *h)
{
    if (ps != ps || ps <= 0 || ps > 1.0e300 || ps < -1.0e300) {
        *h = (ad_real)NAN;
        return AD_INVALID_INPUT;
    }
    if (ps < 0.3733803018821499 || ps > 177687.04571454573) {
        *h = (ad_real)NAN;
        return AD_OUT_OF_RANGE;
    }
    *h = (ad_real)(44307.7 * (1.0 - pow((double)ps / 101325.0, 0.190284)));
    return AD_OK;
}
