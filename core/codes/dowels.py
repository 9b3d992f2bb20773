"""Laterally loaded bolts: NDS 2018 12.3.1 yield limit equations and EN 1995-1-1 8.2.3
(Johansen) steel-to-timber equations, both from memory.

Lengths in m, stresses in Pa, forces in N (the yield limit equations are dimensionally
consistent; only the empirical dowel bearing strengths need their own units).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ..model.constants import INCH, PSI


@dataclass(frozen=True)
class YieldModes:
    """Values of every yield mode, N; ``governing`` names the lowest."""

    modes: dict[str, float]

    @property
    def governing(self) -> str:
        """The mode with the lowest value."""
        return min(self.modes, key=self.modes.__getitem__)

    @property
    def value(self) -> float:
        """The lowest value, N."""
        return self.modes[self.governing]


def Fe_perpendicular(G: float, D: float) -> float:
    """NDS 2018 Table 12.3.3 footnote: Fe_perp = 6100 G^1.45 / sqrt(D) psi, D in in. Pa."""
    return float(6100.0 * G**1.45 / math.sqrt(D / INCH) * PSI)


def Fe_steel(Fu: float) -> float:
    """Dowel bearing strength of a steel member, Fe = 1.5 Fu (NDS 2018 Table 12.3.3
    footnote for hot-rolled steel, from memory). Pa.
    """
    return 1.5 * Fu


def K_theta(theta_deg: float) -> float:
    """NDS 2018 Table 12.3.1B: K_theta = 1 + 0.25 (theta / 90)."""
    return 1.0 + 0.25 * (theta_deg / 90.0)


def R_d(mode: str, theta_deg: float) -> float:
    """NDS 2018 Table 12.3.1B reduction term for 1/4 in <= D <= 1 in: modes Im, Is 4 K_theta;
    II 3.6 K_theta; IIIm, IIIs, IV 3.2 K_theta.
    """
    k = K_theta(theta_deg)
    return {"Im": 4.0, "Is": 4.0, "II": 3.6}.get(mode, 3.2) * k


def nds_single_shear(D: float, lm: float, Fem: float, ls: float, Fes: float, Fyb: float,
                     theta_deg: float) -> YieldModes:
    """NDS 2018 Table 12.3.1A single-shear yield limit equations (from memory)."""
    Re = Fem / Fes
    Rt = lm / ls
    k1 = (math.sqrt(Re + 2 * Re**2 * (1 + Rt + Rt**2) + Rt**2 * Re**3) - Re * (1 + Rt)) / (
        1 + Re)
    k2 = -1 + math.sqrt(2 * (1 + Re) + 2 * Fyb * (1 + 2 * Re) * D**2 / (3 * Fem * lm**2))
    k3 = -1 + math.sqrt(2 * (1 + Re) / Re + 2 * Fyb * (2 + Re) * D**2 / (3 * Fem * ls**2))
    return YieldModes({
        "Im": D * lm * Fem / R_d("Im", theta_deg),
        "Is": D * ls * Fes / R_d("Is", theta_deg),
        "II": k1 * D * ls * Fes / R_d("II", theta_deg),
        "IIIm": k2 * D * lm * Fem / ((1 + 2 * Re) * R_d("IIIm", theta_deg)),
        "IIIs": k3 * D * ls * Fem / ((2 + Re) * R_d("IIIs", theta_deg)),
        "IV": D**2 / R_d("IV", theta_deg) * math.sqrt(2 * Fem * Fyb / (3 * (1 + Re))),
    })


def nds_double_shear(D: float, lm: float, Fem: float, ls: float, Fes: float, Fyb: float,
                     theta_deg: float) -> YieldModes:
    """NDS 2018 Table 12.3.1A double-shear yield limit equations (from memory): modes Im,
    Is, IIIs and IV; ls is the thinner side member.
    """
    Re = Fem / Fes
    k3 = -1 + math.sqrt(2 * (1 + Re) / Re + 2 * Fyb * (2 + Re) * D**2 / (3 * Fem * ls**2))
    return YieldModes({
        "Im": D * lm * Fem / R_d("Im", theta_deg),
        "Is": 2 * D * ls * Fes / R_d("Is", theta_deg),
        "IIIs": 2 * k3 * D * ls * Fem / ((2 + Re) * R_d("IIIs", theta_deg)),
        "IV": 2 * D**2 / R_d("IV", theta_deg) * math.sqrt(2 * Fem * Fyb / (3 * (1 + Re))),
    })


def en_f_h_k(rho_k: float, d: float, alpha_deg: float) -> float:
    """EN 1995-1-1 (8.32), (8.31), (8.33) embedment strength of bolts in softwood:
    f_h,0,k = 0.082 (1 - 0.01 d) rho_k, f_h,alpha = f_h,0 / (k90 sin^2 + cos^2),
    k90 = 1.35 + 0.015 d (d in mm, rho_k in kg/m3, result N/mm2). Returns Pa.
    """
    dm = d * 1000.0
    f0 = 0.082 * (1 - 0.01 * dm) * rho_k
    k90 = 1.35 + 0.015 * dm
    a = math.radians(alpha_deg)
    return float(f0 / (k90 * math.sin(a) ** 2 + math.cos(a) ** 2) * 1e6)


def en_M_y(fu: float, d: float) -> float:
    """EN 1995-1-1 (8.30) yield moment of a bolt: M_y,Rk = 0.3 f_u,k d^2.6 (N mm, d mm).
    Returns N m.
    """
    return float(0.3 * (fu / 1e6) * (d * 1000.0) ** 2.6 / 1000.0)


def en_steel_centre(f_h: float, t1: float, d: float, M_y: float) -> YieldModes:
    """EN 1995-1-1 (8.11) steel plate as the central member of a double-shear joint, per
    shear plane, rope effect left out (conservative): modes f, g, h. N.
    """
    return YieldModes({
        "f": f_h * t1 * d,
        "g": f_h * t1 * d * (math.sqrt(2 + 4 * M_y / (f_h * d * t1**2)) - 1),
        "h": 2.3 * math.sqrt(M_y * f_h * d),
    })


def en_thin_steel_single(f_h: float, t1: float, d: float, M_y: float) -> YieldModes:
    """EN 1995-1-1 (8.9) thin steel plate in single shear, rope effect left out: modes
    a, b. N.
    """
    return YieldModes({"a": 0.4 * f_h * t1 * d, "b": 1.15 * math.sqrt(2 * M_y * f_h * d)})


def en_thick_steel_single(f_h: float, t1: float, d: float, M_y: float) -> YieldModes:
    """EN 1995-1-1 (8.10) thick steel plate (t >= d) in single shear, rope effect left
    out: modes c, d, e with t1 the timber thickness. N.
    """
    return YieldModes({
        "c": f_h * t1 * d,
        "d": f_h * t1 * d * (math.sqrt(2 + 4 * M_y / (f_h * d * t1**2)) - 1),
        "e": 2.3 * math.sqrt(M_y * f_h * d),
    })


def en_thin_steel_outer(f_h: float, t2: float, d: float, M_y: float) -> YieldModes:
    """EN 1995-1-1 (8.12) thin steel plates (t <= 0.5 d) as the outer members of a
    double-shear joint, per shear plane, rope effect left out: modes j, k with t2 the
    timber (central member) thickness (from memory). N.
    """
    return YieldModes({"j": 0.5 * f_h * t2 * d, "k": 1.15 * math.sqrt(2 * M_y * f_h * d)})


def en_thick_steel_outer(f_h: float, t2: float, d: float, M_y: float) -> YieldModes:
    """EN 1995-1-1 (8.13) thick steel plates (t >= d) as the outer members of a
    double-shear joint, per shear plane, rope effect left out: modes l, m (from
    memory). N.
    """
    return YieldModes({"l": 0.5 * f_h * t2 * d, "m": 2.3 * math.sqrt(M_y * f_h * d)})


def en_steel_outer(f_h: float, t2: float, d: float, M_y: float,
                   t_steel: float, hole: float | None = None) -> tuple[float, str]:
    """EN 1995-1-1 8.2.3 steel plates on both faces of one timber (steel-timber-steel),
    per shear plane, by the plate thickness t as :func:`en_steel_single` (thin (8.12),
    thick (8.13), linear between; thin where the holes are not tight enough for a thick
    plate); t2 is the timber's thickness. Returns (F_v,Rk per shear plane, N; which rule).
    """
    return _by_thickness(en_thin_steel_outer(f_h, t2, d, M_y).value,
                         en_thick_steel_outer(f_h, t2, d, M_y).value, d, t_steel, hole,
                         ("thin plates (8.12)", "thick plates (8.13)", "(8.12) and (8.13)"))


def _by_thickness(thin: float, thick: float, d: float, t_steel: float, hole: float | None,
                  names: tuple[str, str, str]) -> tuple[float, str]:
    """EN 1995-1-1 8.2.3 (from memory): the thin plate's value for t <= 0.5 d (or holes
    too loose for a thick plate), the thick plate's for t >= d, linear between; with the
    rule's words (``names``: thin, thick, the pair).
    """
    if loose_holes(d, hole) and t_steel > 0.5 * d:
        return thin, f"{names[0]}: {LOOSE_HOLES}"
    if t_steel <= 0.5 * d:
        return thin, names[0]
    if t_steel >= d:
        return thick, names[1]
    w = (t_steel - 0.5 * d) / (0.5 * d)
    return thin + w * (thick - thin), (f"interpolated between {names[2]}, t/d = "
                                       f"{t_steel / d:.3g}")


#: Why a plate at least 0.5 d thick is still taken as thin.
LOOSE_HOLES = ("the holes' tolerance is not under 0.1 d, so the plate does not count as thick "
               "(EN 1995-1-1 8.2.3(1), from memory)")


def loose_holes(d: float, hole: float | None) -> bool:
    """True where holes of diameter ``hole`` leave a bolt of diameter d a tolerance of
    0.1 d or more: such a plate is not thick, whatever its thickness (EN 1995-1-1
    8.2.3(1), from memory); None: the hole is not known (taken as tight).
    """
    return hole is not None and hole - d >= 0.1 * d * (1 - 1e-12)


def en_steel_single(f_h: float, t1: float, d: float, M_y: float,
                    t_steel: float, hole: float | None = None) -> tuple[float, str]:
    """EN 1995-1-1 8.2.3 steel-to-timber, single shear, by the plate thickness t (from
    memory): thin (t <= 0.5 d) by (8.9), thick (t >= d) by (8.10), linear interpolation
    between; t1 is the timber member's thickness. Returns (F_v,Rk per shear plane, N;
    which rule).
    """
    return _by_thickness(en_thin_steel_single(f_h, t1, d, M_y).value,
                         en_thick_steel_single(f_h, t1, d, M_y).value, d, t_steel, hole,
                         ("thin plate (8.9)", "thick plate (8.10)", "(8.9) and (8.10)"))
