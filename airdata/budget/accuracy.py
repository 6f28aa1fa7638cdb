"""The accuracy of a sensor set: bias and noise of each sensor, absolute, in % of reading or
of full scale, and their valid ranges."""

from __future__ import annotations

from dataclasses import dataclass, fields

import numpy as np
from numpy.typing import NDArray

from .._inputs import Domain
from ..status import DomainError, Status

__all__ = ["ACCURACY_LIMITS", "SensorAccuracy"]

F64 = NDArray[np.float64]

#: Sensor bias (either sign) and noise standard deviation; Pa or K.
#: Valid ranges of the sensor accuracies: fixed parts in Pa or K; parts proportional to
#: the reading as fractions (0.0002 is 0.02 % of reading; a tenth of the reading is far
#: beyond any air-data sensor and catches a percent slip).
ACCURACY_LIMITS = {"bias": (-1.0e4, 1.0e4), "noise": (0.0, 1.0e4),
                   "bias_rel": (-0.1, 0.1), "noise_rel": (0.0, 0.1)}


_BIAS = Domain(*ACCURACY_LIMITS["bias"], "Pa or K", "any", 0.0)


_NOISE = Domain(*ACCURACY_LIMITS["noise"], "Pa or K", "nonnegative", 0.0)


_BIAS_REL = Domain(*ACCURACY_LIMITS["bias_rel"], "of reading", "any", 0.0)


_NOISE_REL = Domain(*ACCURACY_LIMITS["noise_rel"], "of reading", "nonnegative", 0.0)


@dataclass(frozen=True)
class SensorAccuracy:
    """Accuracy of the three air-data sensors: a fixed bias and a random noise each.

    Each pressure sensor's bias and noise may also have a part proportional to its
    reading (the static pressure, and the impact or total pressure of ``pitot``), as
    data sheets give "0.01 % of reading"; the error at a grid point is the absolute
    part plus the fraction times the true reading there.  A percentage of full scale is
    a fixed amount: give it as the absolute part.

    Attributes
    ----------
    ps_bias, ps_noise : float
        Static pressure sensor: bias (either sign) and noise standard deviation, Pa.
    pitot_bias, pitot_noise : float
        Second pressure sensor (impact pressure or total pressure, see ``pitot`` of
        :func:`error_budget`): bias and noise standard deviation, Pa.
    tat_bias, tat_noise : float
        Total-air-temperature probe: bias and noise standard deviation, K.
    ps_bias_rel, ps_noise_rel, pitot_bias_rel, pitot_noise_rel : float
        Parts proportional to the reading, as fractions of it (0.0002 = 0.02 %).

    Biases lie in [-1e4, 1e4], noises in [0, 1e4] (Pa or K); the fractions of reading
    in [-0.1, 0.1] (biases) and [0, 0.1] (noises).
    """

    ps_bias: float = 0.0
    ps_noise: float = 0.0
    pitot_bias: float = 0.0
    pitot_noise: float = 0.0
    tat_bias: float = 0.0
    tat_noise: float = 0.0
    ps_bias_rel: float = 0.0
    ps_noise_rel: float = 0.0
    pitot_bias_rel: float = 0.0
    pitot_noise_rel: float = 0.0

    def __post_init__(self) -> None:
        for f in fields(self):
            v = getattr(self, f.name)
            rel = f.name.endswith("_rel")
            noise = f.name.removesuffix("_rel").endswith("noise")
            d = (_NOISE_REL if noise else _BIAS_REL) if rel else (_NOISE if noise else _BIAS)
            st = d.classify(np.atleast_1d(np.float64(v)))[0]
            if st != Status.OK:
                raise DomainError(f.name, float(v), None, d.describe(), Status(int(st)))

    @property
    def bias(self) -> F64:
        """(ps, pitot, tat) absolute biases."""
        return np.array([self.ps_bias, self.pitot_bias, self.tat_bias])

    @property
    def noise(self) -> F64:
        """(ps, pitot, tat) absolute noise standard deviations."""
        return np.array([self.ps_noise, self.pitot_noise, self.tat_noise])

    @property
    def relative(self) -> bool:
        """True when some part is proportional to the reading."""
        return any((self.ps_bias_rel, self.ps_noise_rel, self.pitot_bias_rel,
                    self.pitot_noise_rel))

    def at(self, ps: F64, pitot_reading: F64) -> tuple[F64, F64]:
        """Bias and noise of (ps, pitot, tat) at each point, shape ``ps.shape + (3,)``.

        Parameters
        ----------
        ps : ndarray
            True static pressure, Pa.
        pitot_reading : ndarray
            True reading of the second pressure sensor (impact or total pressure), Pa.
        """
        b = np.stack(np.broadcast_arrays(self.ps_bias + self.ps_bias_rel * ps,
                                         self.pitot_bias + self.pitot_bias_rel * pitot_reading,
                                         np.full(np.shape(ps), self.tat_bias)), axis=-1)
        s = np.stack(np.broadcast_arrays(self.ps_noise + self.ps_noise_rel * ps,
                                         self.pitot_noise + self.pitot_noise_rel * pitot_reading,
                                         np.full(np.shape(ps), self.tat_noise)), axis=-1)
        return b, s

    def as_dict(self) -> dict[str, float]:
        """Every field, JSON-ready."""
        return {f.name: float(getattr(self, f.name)) for f in fields(self)}

    def describe(self, pressure_unit: str = "Pa") -> str:
        """The accuracies in words, pressures in ``pressure_unit`` (e.g. for a chart).

        Parameters
        ----------
        pressure_unit : str
            Unit of the absolute pressure parts (a pressure unit of :mod:`airdata.units`).

        Returns
        -------
        str
            E.g. ``"static 0 / 0.5 hPa + 0.01 % rdg, pitot 0 / 0.3 hPa, TAT 0 / 0.5 K"``
            (bias / sd for each sensor).
        """
        from ..units import from_si

        def part(absolute: float, rel: float, unit: str, convert: bool = True) -> str:
            v = float(from_si(absolute, unit)) if convert else absolute
            text = f"{v:.6g} {unit}"
            if rel:
                text += f" {'+' if rel > 0 else '-'} {abs(rel) * 100.0:.6g} % rdg"
            return text

        pu = pressure_unit
        return (f"static {part(self.ps_bias, self.ps_bias_rel, pu)} / "
                f"{part(self.ps_noise, self.ps_noise_rel, pu)}, "
                f"pitot {part(self.pitot_bias, self.pitot_bias_rel, pu)} / "
                f"{part(self.pitot_noise, self.pitot_noise_rel, pu)}, "
                f"TAT {part(self.tat_bias, 0.0, 'K', False)} / "
                f"{part(self.tat_noise, 0.0, 'K', False)}")
