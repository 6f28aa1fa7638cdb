"""Flight-envelope limits: stall speed, the maximum operating CAS/Mach pair and its
crossover altitude, the maximum altitude, and the envelope table of an aircraft.

Equations LIM-1 .. LIM-5 (gamma = 1.4; f(M) = qc/ps of PIT-1; F^-1 its inverse, PIT-2):

LIM-1  stall EAS from lift = weight: eas = sqrt(2 n W / (rho0 S CLmax)).
LIM-2  stall Mach, CAS and TAS at static pressure ps: M = eas / (a0 sqrt(ps/p0))
       (SPD-2 inverted), cas = a0 F^-1(ps f(M)/p0) (SPD-1), tas = M sqrt(gamma R sat)
       (SPD-3).  EAS does not change with altitude; CAS does, through compressibility.
LIM-3  crossover altitude of a (CAS limit, Mach limit) pair: qc = p0 f(cas/a0) (PIT-3),
       ps = qc / f(M), h = H(ps) (ALT-1).
LIM-4  maximum operating CAS and Mach at ps: the lower of the two limits, compared
       through impact pressure: qc_cas = p0 f(cas/a0), qc_mach = ps f(M).  Where the
       CAS limit governs (qc_cas <= qc_mach) the maximum CAS *is* the CAS limit and the
       maximum Mach is F^-1(qc_cas/ps); where the Mach limit governs the maximum Mach
       *is* the Mach limit and the maximum CAS is a0 F^-1(qc_mach/p0).
LIM-5  maximum altitude as a fixed pressure altitude: the margin to it is
       ceiling - H(ps), whatever the temperature or the altimeter setting.

Tiny speeds: below Mach 2^-40 (``pitot.TINY_MACH``) a Mach <-> CAS conversion takes
its linear limit (``pitot.tiny_linear``, ``pitot.tiny_mach_of_cas``, as SPD-1 does,
with no subnormal intermediate), and where both limits of LIM-3 or LIM-4 are that
small, where their impact pressures may underflow, the comparison and the crossover
pressure take the linear limit qc = 0.7 p M^2 too: M sqrt(ps/p0) against cas/a0 (both
scaled by ``pitot.TINY_SCALE``), ps = p0 ((cas/M)/a0)^2.

The kernels follow the pattern of :mod:`airdata.speeds` (argument order, statuses,
``strict``) so that they port one to one to C.

References
----------
NACA Report 1135 (1953), eqs. 44 and 100 (pitot relations); ICAO Doc 7488/3 (1993)
(standard atmosphere); lift equation L = q S CL with q = rho0 eas^2 / 2 (definition of
equivalent airspeed).
"""

from __future__ import annotations

# Each module's __all__ is the one list of its public names; the package re-exports both.
from .envelope import *  # noqa: F403
from .envelope import __all__ as _envelope_names
from .equations import *  # noqa: F403
from .equations import __all__ as _equation_names

__all__ = [*_equation_names, *_envelope_names]
