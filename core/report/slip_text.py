"""The sheet's worked lines for stacked plies that slip on their fasteners (EN 1995-1-1
Annex B, the gamma method, from memory), K_u = 2/3 K_ser (7.1(4)) for stresses and
fastener loads. Each function returns (lines, demand line, value in SI) so that the
sheet can hold the value against the check's own demand.
"""

from __future__ import annotations

from ..section.gamma import Joint, PartialSection
from ..section.transformed import Section
from .numbers import TIMES, factor_text, num, q, q_den

#: Significant digits of the worked numbers (as the rest of the sheet).
DIGITS = 5


def zero_line(sec: Section, i: int) -> float:
    """The height where ply i's stress is zero: the neutral axis, or with slip the ply's
    own z_i = y_c - gamma (y_c - y_na).
    """
    if isinstance(sec, PartialSection):
        return float(sec.zero_stress_heights()[i])
    return sec.neutral_axis_y


def stress_I(sec: Section) -> float:
    """The second moment stresses are taken with: I_t, or with slip (EI)_ef / E_ref (K_u)."""
    return sec.EI_uls / sec.E_ref if isinstance(sec, PartialSection) else sec.I_transformed


def bending(sec: PartialSection, i: int, M: float, u: str, sym: str, final: bool,
            moment_factor: str, result: str) -> tuple[list[str], str, float]:
    """(B.7), (B.8): the edge stress sigma_i + sigma_m,i = E_i (gamma_i a_i + h_i / 2) |M| /
    (EI)_ef, written n |M| c / I_ef with n = E_i / E_ref, c = gamma_i a_i + h_i / 2 and
    I_ef = (EI)_ef / E_ref. ``M`` is |M| in N m; ``result`` the printed demand.
    """
    g, n = float(sec.gamma_uls[i]), float(sec.n[i])
    a_i = float(sec.centroid[i]) - sec.neutral_axis_y
    h = float(sec.y_top[i] - sec.y_bottom[i])
    if abs(a_i) <= 1e-9 * h:  # the web of a symmetric section: a_2 = 0
        a_i = 0.0
    I_ef = stress_I(sec)
    dist = g * abs(a_i) + h / 2
    value = n * M * dist / I_ef
    L = "length"
    lines = [f"ply {sec.plies[i].name}: \u03b3 = {factor_text(g)} (K_u = 2/3 K_ser, EN 1995-1-1 "
             f"7.1(4)), a = |y_c \u2212 y_na| = {q(abs(a_i), L, u, DIGITS)}, h = "
             f"{q(h, L, u, DIGITS)}: c = \u03b3 a + h / 2 = {q(dist, L, u, DIGITS)}; n = E / "
             f"E_ref = {num(n, DIGITS)}; I_ef = (EI)_ef / E_ref = "
             f"{q(I_ef, 'second_moment', u, DIGITS)} (EN 1995-1-1 Annex B"
             + (", final state: timber moduli and slip moduli / (1 + \u03c8\u2082 k_def))"
                if final else ")")]
    demand = (f"{sym} = n |M| c / I_ef = {num(n, DIGITS)} {TIMES} {q(M, 'moment', u, DIGITS)} "
              f"{TIMES} {moment_factor} {TIMES} {q(dist, L, u, DIGITS)} / "
              f"{q_den(I_ef, 'second_moment', u, DIGITS)} = {result}")
    return lines, demand, value


def connector(sec: PartialSection, joint: Joint, V: float, combination: str, u: str,
              result: str) -> tuple[list[str], str, float]:
    """(B.10): F_i = gamma_i E_i A_i a_i s_i V / (EI)_ef, written gamma n A a s_i |V| / I_ef
    with n = E_i / E_ref and I_ef = (EI)_ef / E_ref. ``V`` is |V| in N.
    """
    i = joint.flange
    g, n, A = float(sec.gamma_uls[i]), float(sec.n[i]), float(sec.area[i])
    a_i = abs(float(sec.centroid[i]) - sec.neutral_axis_y)
    I_ef = stress_I(sec)
    value = sec.fastener_force(joint, V)
    L = "length"
    s_i = joint.force_spacing
    lines = [f"|V| = {q(V, 'force', u, DIGITS)} (largest shear, {combination}); ply "
             f"{sec.plies[i].name}: \u03b3 = {factor_text(g)} (K_u = 2/3 K_ser, EN 1995-1-1 "
             f"7.1(4)), n = E / E_ref = {num(n, DIGITS)}, A = {q(A, 'area', u, DIGITS)}, a = "
             f"{q(a_i, L, u, DIGITS)} from the neutral axis; I_ef = (EI)_ef / E_ref = "
             f"{q(I_ef, 'second_moment', u, DIGITS)} (EN 1995-1-1 Annex B)",
             f"s_i = {q(s_i, L, u, DIGITS)} per fastener (the largest spacing over the "
             "fasteners per station)"]
    demand = (f"F = \u03b3 n A a s_i |V| / I_ef = {factor_text(g)} {TIMES} {num(n, DIGITS)} "
              f"{TIMES} {q(A, 'area', u, DIGITS)} {TIMES} {q(a_i, L, u, DIGITS)} {TIMES} "
              f"{q(s_i, L, u, DIGITS)} {TIMES} {q(V, 'force', u, DIGITS)} / "
              f"{q_den(I_ef, 'second_moment', u, DIGITS)} = {result}")
    return lines, demand, value
