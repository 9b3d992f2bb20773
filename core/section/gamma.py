"""Partial composite action of stacked plies joined by mechanical fasteners: the gamma
method of EN 1995-1-1:2004 Annex B (from memory; verify against the current edition).

A web ply (2) and one or two flange plies (1 above, 3 below), rectangles stacked one over
another and joined at each interface by fasteners of slip modulus K_i at spacing s_i,
bend about the horizontal axis over a simply supported span l:

* gamma_i = [1 + pi^2 E_i A_i s_i / (K_i l^2)]^-1 for each flange (B.5), gamma_2 = 1;
* the neutral axis where sum gamma_i E_i A_i (ybar_i - y_na) = 0, which is a_2 of (B.6)
  written as a height, and a_i = |ybar_i - y_na|;
* (EI)_ef = sum (E_i I_i + gamma_i E_i A_i a_i^2) (B.1);
* sigma_i = gamma_i E_i a_i M / (EI)_ef at the centroid of ply i and
  sigma_m,i = 0.5 E_i h_i M / (EI)_ef about it (B.7, B.8): the stress in ply i is
  -E_i M (y - z_i) / (EI)_ef with z_i = ybar_i - gamma_i (ybar_i - y_na);
* the shear flow at a cut, V times the sum of E_i b_i (y - z_i) over what lies beyond the
  cut, over (EI)_ef, which in the web at the neutral axis is (B.9)
  tau_2,max = (gamma_3 E_3 A_3 a_3 + 0.5 E_2 b_2 h^2) V / (b_2 (EI)_ef), and at an
  interface the load per fastener F_i = gamma_i E_i A_i a_i s_i V / (EI)_ef (B.10).

K_i is K_ser of EN 1995-1-1 Table 7.1 for the stiffness (deflections) and K_u = 2/3 K_ser
(7.1(4)) for the stresses and the fastener loads. Under creep the slip modulus is
divided by 1 + k_def of the joint (2.3.2.2(3), (4), from memory), k_def of each timber
read off the ratio of its short-term to its crept modulus (on the US basis K_cr - 1 of
NDS 2018 3.5.2 stands for k_def). On the US basis the method is used as a published
method for the slip (NDS 2018 gives none): the strength checks take K_u and the
deflections K_ser, as EN 1995-1-1 7.1(4) splits them.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, replace

import numpy as np

from ..codes import en1995_fasteners as fasteners
from ..model.design import Connector
from ..model.errors import MissingCheck, Problem
from ..model.member import BeamSpec
from .segments import is_stepped
from .transformed import Interface, Section

#: Plies of the arrangements Annex B covers (a web with one or two flanges).
LAYERS = (2, 3)


def gamma_factor(E: float, A: float, s: float, K: float, length: float) -> float:
    """EN 1995-1-1 Annex B (B.5), from memory: gamma_i = [1 + pi^2 E_i A_i s_i /
    (K_i l^2)]^-1. E in Pa, A in m^2, s in m, K in N/m per fastener, l in m. A slip
    modulus that rounds to zero gives 0 (the flange is not held at all).
    """
    stiffness = K * length * length
    if not stiffness > 0:
        return 0.0
    return 1.0 / (1.0 + math.pi**2 * E * A * s / stiffness)


def effective_stiffness(E: np.ndarray, A: np.ndarray, centroid: np.ndarray,
                        I_own: np.ndarray, gamma: np.ndarray) -> tuple[float, float]:
    """EN 1995-1-1 Annex B (B.1), (B.6), from memory: the neutral axis y_na with
    sum gamma_i E_i A_i (ybar_i - y_na) = 0 and (EI)_ef = sum (E_i I_i + gamma_i E_i A_i
    a_i^2), a_i = ybar_i - y_na. Returns (y_na m, (EI)_ef N m^2).
    """
    gEA = gamma * E * A
    y_na = float((gEA * centroid).sum() / gEA.sum())
    EI = float((E * I_own + gEA * (centroid - y_na) ** 2).sum())
    return y_na, EI


@dataclass(frozen=True)
class Joint:
    """The fasteners that join one flange ply to the web.

    Attributes:
        flange: index of the flange ply.
        K_ser: slip modulus of one fastener (one shear plane) for serviceability, N/m.
        spacing: Annex B's s_i: the effective spacing over the fasteners per station, m.
        force_spacing: the spacing the load per fastener is taken at (the largest
            spacing over the fasteners per station: where each spacing is used along
            the member is not given, so the largest goes with the largest shear), m.
        creep: 1 + k_def of the joint (1 for the short-term section).

    """

    flange: int
    K_ser: float
    spacing: float
    force_spacing: float
    creep: float = 1.0

    @property
    def K_u(self) -> float:
        """EN 1995-1-1 7.1(4): K_u = 2/3 K_ser (with the joint's creep), N/m."""
        return fasteners.K_u(self.K_ser / self.creep)


@dataclass(frozen=True, eq=False, kw_only=True)
class PartialSection(Section):
    """A section of stacked plies with slip between them (EN 1995-1-1 Annex B).

    ``EI`` is (EI)_ef with K_ser (so the beam's deflections take the slip at
    serviceability) and ``I_na`` each ply's E_i I_i + gamma_i E_i A_i a_i^2 over E_i (so
    the moment shares sum to one); ``neutral_axis_y`` and every stress, shear stress and
    interface shear flow are those with K_u. ``interfaces`` hold the gamma-weighted first
    moments with K_u.

    Attributes:
        web: index of the web ply (gamma = 1).
        joints: the fasteners of each flange.
        length: Annex B's l (the span), m.
        gamma: gamma of each ply with K_ser (1 for the web).
        gamma_uls: gamma of each ply with K_u (1 for the web).
        EI_uls: (EI)_ef with K_u, N m^2.
        centroid: each ply's centroid height, m.
        I_own: each ply's own second moment, m^4.
        E_short: the short-term moduli, Pa (their ratio to ``E`` gives the creep).

    """

    web: int
    joints: tuple[Joint, ...]
    length: float
    gamma: np.ndarray
    gamma_uls: np.ndarray
    EI_uls: float
    centroid: np.ndarray
    I_own: np.ndarray
    E_short: np.ndarray

    def zero_stress_heights(self) -> np.ndarray:
        """z_i, the height where the stress of ply i is zero (with K_u), m."""
        return np.asarray(self.centroid - self.gamma_uls * (self.centroid
                                                            - self.neutral_axis_y))

    def curvature(self, moment: float) -> float:
        """Curvature M / (EI)_ef with K_u, 1/m (sagging positive)."""
        return moment / self.EI_uls

    def ply_of(self, y: np.ndarray | float) -> np.ndarray:
        """Index of the ply holding each height (at a shared edge, the upper ply)."""
        ys = np.atleast_1d(np.asarray(y, dtype=float))
        order = np.argsort(self.y_bottom)
        idx = np.full(ys.shape, int(order[0]))
        for i in order:
            idx = np.where(ys >= self.y_bottom[i], int(i), idx)
        return idx

    def strain(self, moment: float, y: np.ndarray | float) -> np.ndarray:
        """Strain at heights ``y`` in the ply holding each (tension positive)."""
        ys = np.asarray(y, dtype=float)
        z = self.zero_stress_heights()[self.ply_of(ys)].reshape(ys.shape)
        return np.asarray(-self.curvature(moment) * (ys - z))

    def stress(self, moment: float, ply_index: int, y: np.ndarray | float) -> np.ndarray:
        """Stress in ply ``ply_index`` at heights ``y``, Pa: -E_i M (y - z_i) / (EI)_ef."""
        z = float(self.zero_stress_heights()[ply_index])
        return np.asarray(-float(self.E[ply_index]) * self.curvature(moment)
                          * (np.asarray(y, dtype=float) - z))

    def centroid_stress(self, moment: float, ply_index: int) -> float:
        """Annex B (B.7): sigma_i = gamma_i E_i a_i M / (EI)_ef at ply i's centroid, Pa
        (tension positive: a ply below the neutral axis is in tension under sagging M).
        """
        i = ply_index
        return -float(self.E[i]) * moment * float(self.gamma_uls[i]) * (
            float(self.centroid[i]) - self.neutral_axis_y) / self.EI_uls

    def ply_extreme_stresses(self, moment: float | np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Stress at each ply's highest and lowest fibre, sigma_i +- sigma_m,i (B.7, B.8)."""
        m = np.asarray(moment, dtype=float)
        k = -m / self.EI_uls
        z = self.zero_stress_heights()
        top = np.multiply.outer(self.E * (self.y_top - z), k)
        bot = np.multiply.outer(self.E * (self.y_bottom - z), k)
        return top, bot

    def _first_moment_E(self, y: np.ndarray | float) -> np.ndarray:
        """Sum of E_i b_i (y' - z_i) over the parts above each cut, N m (unit strain slope)."""
        cuts = np.atleast_1d(np.asarray(y, dtype=float))
        z = self.zero_stress_heights()
        total = np.zeros_like(cuts)
        for i, ply in enumerate(self.plies):
            lo = np.clip(cuts, self.y_bottom[i], self.y_top[i])
            part = ply.width * (self.y_top[i] - lo)
            total += self.E[i] * part * ((self.y_top[i] + lo) / 2 - z[i])
        return total

    def first_moment_above(self, y: np.ndarray | float) -> np.ndarray:
        """The gamma-weighted first moment of what lies above each cut, in reference-material
        units, m^3 (with K_u).
        """
        return np.asarray(self._first_moment_E(y) / self.E_ref)

    def shear_flow(self, shear: float, y: np.ndarray | float) -> np.ndarray:
        """Shear flow across a full horizontal cut, V sum E b (y - z) / (EI)_ef, N/m."""
        return np.asarray(shear * self._first_moment_E(y) / self.EI_uls)

    def shear_stress(self, shear: float, y: np.ndarray) -> np.ndarray:
        """Shear stress in each ply at heights ``y`` (the shear flow over the ply's width;
        (B.9) in the web at the neutral axis), shape (plies, len(y)); NaN outside a ply.
        """
        ys = np.asarray(y, dtype=float)
        q = self.shear_flow(shear, ys)
        out = np.full((len(self.plies), ys.size), np.nan)
        for i, ply in enumerate(self.plies):
            inside = (ys >= self.y_bottom[i]) & (ys <= self.y_top[i])
            out[i] = np.where(inside, q / ply.width, np.nan)
        return out

    def interface_shear_flows(self, shear: float) -> list[tuple[Interface, float]]:
        """Shear flow each interface's fasteners carry, |V| gamma_i E_i A_i a_i / (EI)_ef, N/m."""
        return [(itf, abs(shear) * itf.Q * self.E_ref / self.EI_uls) for itf in self.interfaces]

    def fastener_force(self, joint: Joint, shear: float) -> float:
        """Annex B (B.10): F_i = gamma_i E_i A_i a_i s_i V / (EI)_ef with K_u, at the
        joint's ``force_spacing``, N.
        """
        i = joint.flange
        return float(self.gamma_uls[i] * self.E[i] * self.area[i]
                     * abs(self.centroid[i] - self.neutral_axis_y)
                     * joint.force_spacing * abs(shear) / self.EI_uls)

    def same_kind(self, plain: Section) -> Section:
        """The partial section on ``plain``'s moduli, the slip modulus of each joint divided
        by 1 + k_def of the joint (EN 1995-1-1 2.3.2.2(3), (4), from memory).
        """
        k_def = np.zeros(len(self.plies))
        for i, mat in enumerate(self.materials):
            if mat.kind == "timber" and plain.E[i] > 0:
                k_def[i] = max(float(self.E_short[i] / plain.E[i]) - 1.0, 0.0)
        joints = []
        for j in self.joints:
            pair = [k for k in (self.web, j.flange) if self.materials[k].kind == "timber"]
            kd = fasteners.k_def_joint(float(k_def[pair[0]]),
                                       float(k_def[pair[1]]) if len(pair) > 1 else None)
            joints.append(replace(j, creep=1.0 + kd))
        return build(plain, self.web, tuple(joints), self.length, self.E_short)


def build(plain: Section, web: int, joints: tuple[Joint, ...], length: float,
          E_short: np.ndarray | None = None) -> PartialSection:
    """The partial section of ``plain`` (rectangles stacked one over another)."""
    E, A = plain.E, plain.area
    centroid = plain.first_y / A
    I_own = plain.second_y - A * centroid**2

    def gammas(uls: bool) -> np.ndarray:
        g = np.ones(len(plain.plies))
        for j in joints:
            K = j.K_u if uls else j.K_ser / j.creep
            g[j.flange] = gamma_factor(float(E[j.flange]), float(A[j.flange]), j.spacing, K,
                                       length)
        return g

    g_ser, g_uls = gammas(False), gammas(True)
    y_ser, EI_ser = effective_stiffness(E, A, centroid, I_own, g_ser)
    y_uls, EI_uls = effective_stiffness(E, A, centroid, I_own, g_uls)
    I_na = I_own + g_ser * A * (centroid - y_ser) ** 2
    q = g_uls * E * A * (centroid - y_uls) / plain.E_ref
    tol = plain.depth * 1e-9
    interfaces = tuple(
        Interface(itf.y, itf.pairs, itf.length,
                  abs(float(q[plain.y_bottom >= itf.y - tol].sum())))
        for itf in plain.interfaces)
    values = {f: getattr(plain, f) for f in Section.__dataclass_fields__}
    values.update(EI=EI_ser, I_transformed=EI_ser / plain.E_ref, neutral_axis_y=y_uls,
                  I_na=I_na, interfaces=interfaces)
    return PartialSection(
        **values, web=web, joints=joints, length=length, gamma=g_ser, gamma_uls=g_uls,
        EI_uls=EI_uls, centroid=centroid, I_own=I_own,
        E_short=np.array(E if E_short is None else E_short, dtype=float))


_FULL = ("; the section is analysed as fully composite, which the slip of the fasteners "
         "makes unconservative")


def with_slip(section: Section, connector: Connector, beam: BeamSpec | None) -> Section:
    """The section with the slip of its connectors (a :class:`PartialSection`) where the
    connector is a mechanical fastener with a diameter and the section has stacked
    plies; ``section`` itself otherwise. Where Annex B does not cover the member or the
    arrangement, ``section`` with a named missing check (verdict INCOMPLETE).
    """
    if not connector.slips or not section.interfaces:
        return section
    reason = _refusal(section, connector, beam)
    if reason is not None:
        return replace(section, warnings=(*section.warnings, reason))
    assert beam is not None and connector.spacing is not None
    order = _stacked_order(section)
    assert order is not None
    web = order[1] if len(order) == 3 else max(order, key=lambda k: section.plies[k].height)
    joints = []
    for k in order:
        if k == web:
            continue
        found = _slip_modulus(section, connector, web, k)
        if isinstance(found, Problem):
            return replace(section, warnings=(*section.warnings, found))
        s_i = fasteners.s_ef(connector.spacing, connector.spacing_max) / connector.rows
        s_force = (connector.spacing_max or connector.spacing) / connector.rows
        joints.append(Joint(k, found, s_i, s_force))
    return build(section, web, tuple(joints), beam.layout.spans[0])


def _refusal(section: Section, connector: Connector, beam: BeamSpec | None) -> Problem | None:
    """Why Annex B cannot be applied here (None where it can)."""
    what = "the slip of the connectors (EN 1995-1-1 Annex B)"
    if beam is None:
        return MissingCheck("beam", f"is not given: {what} needs the span" + _FULL)
    lay = beam.layout
    if lay.supports != "simple" or len(lay.spans) != 1 or lay.overhang_left > 0 \
            or lay.overhang_right > 0:
        return MissingCheck("beam.supports", f"{what} is analysed for one simply supported "
                            "span without overhangs, whose l Annex B takes as the span"
                            + _FULL)
    if beam.notches or beam.holes:
        return MissingCheck("beam.notches" if beam.notches else "beam.holes",
                            f"{what} is not analysed together with notches or holes" + _FULL)
    if is_stepped(section.plies, lay.length):
        return MissingCheck("plies", f"{what} is not analysed where a ply stops short of "
                            "the member's ends" + _FULL)
    if connector.spacing is None:
        return MissingCheck("design.connector.spacing", f"is not given: {what} depends on "
                            "the spacing of the fasteners" + _FULL)
    if _stacked_order(section) is None:
        return MissingCheck("plies", f"{what} covers a web with one or two flanges: two or "
                            "three whole rectangular plies stacked one over another, each "
                            "the full depth of its layer" + _FULL)
    return None


def _stacked_order(section: Section) -> list[int] | None:
    """Ply indices from the bottom up where the plies are 2 or 3 whole rectangles stacked
    one over another, each touching the next at one interface; None otherwise.
    """
    n = len(section.plies)
    if n not in LAYERS or not all(section.is_unclipped(i) and section.is_connected(i)
                                  and section.area[i] > 0 for i in range(n)):
        return None
    order = sorted(range(n), key=lambda k: float(section.y_bottom[k]))
    pairs = [itf.pairs for itf in sorted(section.interfaces, key=lambda t: t.y)]
    if pairs != [((order[k], order[k + 1]),) for k in range(n - 1)]:
        return None
    return order


def _slip_modulus(section: Section, connector: Connector, web: int,
                  flange: int) -> float | Problem:
    """K_ser of one fastener joining the web and a flange (EN 1995-1-1 Table 7.1, 7.1(2),
    7.1(3)), N/m; a named missing check where the materials are not timber to timber or
    steel to timber, or a timber's density is not given.
    """
    mats = [section.materials[web], section.materials[flange]]
    timber = [m for m in mats if m.kind == "timber"]
    others = [m for m in mats if m.kind != "timber"]
    if not timber or any(m.kind != "steel" for m in others):
        return MissingCheck("design.connector.type", "EN 1995-1-1 Table 7.1 gives the slip "
                            "of fasteners between timbers or steel and timber only, not "
                            f"between {mats[0].name} and {mats[1].name}" + _FULL)
    for m in timber:
        if m.density <= 0:
            return MissingCheck(f"materials.{m.id}.density", "is not given: the slip modulus "
                                "of the fasteners (EN 1995-1-1 Table 7.1) needs the mean "
                                "density" + _FULL)
    rho = (fasteners.rho_m_joint(timber[0].density, timber[1].density) if len(timber) == 2
           else timber[0].density)
    assert connector.diameter is not None
    return fasteners.K_ser(connector.type, rho, connector.diameter, connector.predrilled,
                           steel_to_timber=bool(others))


def slip_summary(section: Section) -> Sequence[str]:
    """Lines naming gamma, K_ser and K_u of each flange of a partial section (empty for
    another section).
    """
    if not isinstance(section, PartialSection):
        return ()
    return tuple(
        f"{section.plies[j.flange].name}: K_ser = {j.K_ser / j.creep / 1e3:.5g} N/mm, "
        f"K_u = {j.K_u / 1e3:.5g} N/mm, s_i = {j.spacing * 1e3:.4g} mm, "
        f"gamma = {float(section.gamma[j.flange]):.4g} (K_ser), "
        f"{float(section.gamma_uls[j.flange]):.4g} (K_u)"
        for j in section.joints)


#: The assumptions that replace "fully connected" and "strain linear over the depth"
#: where the slip of the fasteners is analysed.
SLIP_ASSUMPTIONS = (
    "Plane sections remain plane within each ply; stacked plies slip on their fasteners "
    "(EN 1995-1-1 Annex B, the gamma method, from memory): one simply supported span, "
    "fasteners evenly spaced (or at the effective spacing 0.75 s_min + 0.25 s_max), "
    "slip modulus K_ser of Table 7.1 for deflections and K_u = 2/3 K_ser for stresses and "
    "fastener loads.",
)


def assumptions(section: Section, plain: Sequence[str]) -> tuple[str, ...]:
    """The stated assumptions ``plain`` for this section: for a partial section the lines
    on full connection and on strain linear over the depth replaced by the slip's.
    """
    if not isinstance(section, PartialSection):
        return tuple(plain)
    kept = tuple(t for t in plain if "no slip" not in t and "linear over the depth" not in t)
    return SLIP_ASSUMPTIONS + kept
