"""Sensor error budgets: analytic sensitivities of every air-data output to the
sensors, and the propagation of sensor accuracies over an altitude by speed grid.

Sensitivities (BUD-1), with x = qc/ps, f(M) = qc/ps of PIT-1 and its derivative

    f'(M) = 1.4 M (1 + 0.2 M^2)^2.5                          M <= 1 (NACA 1135 eq. 44)
    f'(M) = (1 + f(M)) (7/M - 35 M/(7 M^2 - 1))               M > 1  (NACA 1135 eq. 100)

(both 7/6 (1 + f(1)) at M = 1: the relation is C1 there), and with T(H) the standard
temperature at the pressure altitude H:

    dH/dps      = -R T(H) / (g0 ps)                    (hydrostatic equation, ALT-1)
    dCAS/dqc    = a0 / (p0 f'(CAS/a0))                 (PIT-4)
    dM/dqc      = 1 / (ps f'(M));  dM/dps = -x / (ps f'(M))          (PIT-2)
    D = 1 + 0.2 r M^2:  dSAT/dTAT = 1/D;  dSAT/dM = -SAT 0.4 r M / D   (TMP-1)
    dTAS/dM     = a + (TAS / (2 SAT)) dSAT/dM;  dTAS/dTAT = (TAS/(2 SAT)) dSAT/dTAT (SPD-3)
    dEAS/dps    = a0 sqrt(ps/p0) dM/dps + EAS/(2 ps);  dEAS/dqc = a0 sqrt(ps/p0) dM/dqc

CAS depends on qc alone and pressure altitude on ps alone; SAT, TAS depend on all three.
With an absolute total-pressure sensor (``pitot="pt"``) instead of a differential one,
qc = pt - ps, so d/dpt = d/dqc and d/dps (pt fixed) = d/dps (qc fixed) - d/dqc.

Propagation (BUD-2): each sensor reads truth + bias + noise, the noise normal with the
given standard deviation, the three sensors independent.  To first order each output
error has mean J b (the *shift*) and standard deviation sqrt(sum_j (J_j sigma_j)^2) (the
*sd*); their root-sum-square is the *rms* error.  ``method="monte_carlo"`` instead runs
the full non-linear chain :func:`airdata.air_data` on seeded random sensor errors, which
checks the linear figures and shows where linearisation stops being good enough.

References
----------
NACA Report 1135 (1953), eqs. 44 and 100; ICAO Doc 7488/3 (1993); first-order error
propagation (JCGM 100:2008, "GUM", eq. 10, from memory).
"""

from __future__ import annotations

from .accuracy import ACCURACY_LIMITS, SensorAccuracy
from .plot import plot_budget
from .propagation import ErrorBudget, error_budget
from .sensitivity import DISPLAY_UNITS, OUTPUTS, Sensitivities, ratio_slope, sensitivities

__all__ = [
    "OUTPUTS", "DISPLAY_UNITS", "ACCURACY_LIMITS", "Sensitivities", "sensitivities",
    "SensorAccuracy", "ErrorBudget", "error_budget", "plot_budget", "ratio_slope",
]
