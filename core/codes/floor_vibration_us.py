"""A joist-floor vibration criterion for the US basis: COMMON PRACTICE, not a code clause.

Neither the NDS nor ASCE 7 gives a vibration check for wood joist floors. A criterion
commonly used in practice for them pairs a minimum fundamental frequency of the joist
(simply supported, carrying the permanent mass) with a limit on its deflection under a
concentrated load of 225 lbf (about 1 kN) at midspan. The default limits (15 Hz and
0.04 in, about 1 mm) are recalled from memory of that practice; they are the user's to
change (design.vibration "frequency_min_Hz", "point_load", "point_deflection_limit").
"""

from __future__ import annotations

import math

from ..model.constants import INCH, LBF

#: Default minimum fundamental frequency, Hz (common practice, from memory).
FREQUENCY_MIN_DEFAULT = 15.0
#: Default concentrated load, N (225 lbf; common practice).
POINT_LOAD_DEFAULT = 225.0 * LBF
#: Default deflection limit under that load, m (0.04 in; common practice, from memory).
POINT_DEFLECTION_DEFAULT = 0.04 * INCH


def f_n(span: float, EI: float, mass_per_length: float) -> float:
    """Fundamental frequency of a simply supported uniform beam (handbook formula),
    f_n = (pi / 2) sqrt(EI / (mu L^4)) = (pi / 2) sqrt(g EI / (w L^4)).

    Args:
        span: L, m.
        EI: the joist's bending stiffness, N m^2.
        mass_per_length: mu, the joist's permanent mass per length (its own and the
            floor's over its spacing), kg/m.

    Returns:
        Hz.

    """
    return math.pi / 2 * math.sqrt(EI / (mass_per_length * span**4))


def point_deflection(span: float, EI: float, load: float) -> float:
    """Midspan deflection of a simply supported member under a point load at midspan,
    P L^3 / (48 EI) (handbook formula); the member alone, no lateral distribution to
    neighbouring joists (conservative). m.
    """
    return load * span**3 / (48 * EI)
