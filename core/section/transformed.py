"""Transformed-section analysis of a built-up section (bending about the horizontal axis).

Assumptions (stated on every output): plane sections remain plane, so strain is linear
over the depth; every ply is linear elastic; plies are fully connected (no slip).

Each ply i with modulus E_i is transformed to the reference material by scaling its width
by n_i = E_i / E_ref about its own vertical centre line; heights never change. Then
(common practice, see any mechanics of materials text):

* neutral axis y_na = sum(n_i A_i ybar_i) / sum(n_i A_i)
* I_t = sum n_i (I_i,own + A_i (ybar_i - y_na)^2), EI = E_ref I_t
* sigma_i(y) = -n_i M (y - y_na) / I_t (tension positive, sagging M positive)
* share of moment M_i / M = E_i I_i,na / EI
* shear flow across a horizontal cut q(y) = V Q_t(y) / I_t
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace

import numpy as np
from shapely import affinity
from shapely.geometry.base import BaseGeometry

from ..model.errors import MissingCheck, Problem, ProjectError
from ..model.materials import Material
from ..model.plies import Ply, validate_ply
from .geometry import (
    TOUCH_TOLERANCE,
    ProfileStack,
    WidthProfile,
    clip_plies_marked,
    is_unclipped,
    near_pairs,
    overlap,
    polygon_moments,
    rectangle_moments,
    rectangle_profile,
    rectangles_touch,
    touch_candidates,
    touches_any,
    width_profile,
)


def _meta(description: str, unit: str, kind: str = "") -> dict[str, str]:
    return {"description": description, "unit": unit, "kind": kind}


@dataclass(frozen=True)
class PlyResult:
    """Section results of one ply. SI units; the metadata gives label and unit."""

    name: str = field(metadata=_meta("Ply", ""))
    material: str = field(metadata=_meta("Material", ""))
    E: float = field(metadata=_meta("Elastic modulus", "Pa", "modulus"))
    modular_ratio: float = field(metadata=_meta("Modular ratio n", "-"))
    area: float = field(metadata=_meta("Area (after clipping)", "m^2", "area"))
    transformed_area: float = field(metadata=_meta("Transformed area n A", "m^2", "area"))
    transformed_width: float = field(metadata=_meta("Transformed width n b", "m", "length"))
    y_bottom: float = field(metadata=_meta("Lowest fibre", "m", "length"))
    y_top: float = field(metadata=_meta("Highest fibre", "m", "length"))
    centroid_y: float = field(metadata=_meta("Centroid height", "m", "length"))
    I_own: float = field(metadata=_meta("Own second moment", "m^4", "second_moment"))
    I_na: float = field(metadata=_meta("Second moment about the neutral axis", "m^4",
                                       "second_moment"))
    moment_share: float = field(metadata=_meta("Share of moment E_i I_i,na / EI", "-"))
    S_top: float = field(metadata=_meta("Section modulus to top fibre, EI/(E_i c)", "m^3",
                                        "section_modulus"))
    S_bottom: float = field(metadata=_meta("Section modulus to bottom fibre, EI/(E_i c)", "m^3",
                                           "section_modulus"))


@dataclass(frozen=True)
class Interface:
    """A horizontal contact between stacked plies, where connectors carry shear flow.

    Attributes:
        y: height of the contact, m.
        pairs: (lower ply index, upper ply index) for each contact at this height.
        length: total contact length at this height, m.
        Q: transformed first moment (reference-material units) of the part that the
            contacts hold on, about the neutral axis, m^3 (magnitude).

    """

    y: float
    pairs: tuple[tuple[int, int], ...]
    length: float
    Q: float


@dataclass(frozen=True, eq=False)
class Section:
    """An analysed section. Build it with :func:`analyse`; all arrays are per ply."""

    plies: tuple[Ply, ...]
    materials: tuple[Material, ...]
    reference_material: str
    E_ref: float
    E: np.ndarray
    n: np.ndarray
    area: np.ndarray
    first_y: np.ndarray
    second_y: np.ndarray
    y_bottom: np.ndarray
    y_top: np.ndarray
    geoms: tuple[BaseGeometry, ...]
    profiles: tuple[WidthProfile, ...]
    EA: float
    EI: float
    neutral_axis_y: float
    I_transformed: float
    mass_per_length: float
    I_na: np.ndarray
    interfaces: tuple[Interface, ...]
    warnings: tuple[Problem, ...]
    stack: ProfileStack | None = None

    # --- per-ply results --------------------------------------------------------------

    def is_connected(self, i: int) -> bool:
        """False for a ply left out of the composite section (it touches no other ply)."""
        return bool(self.E[i] > 0)

    def is_unclipped(self, i: int) -> bool:
        """True where ply i keeps its whole rectangle (no later ply cuts it)."""
        return is_unclipped(float(self.area[i]), self.plies[i])

    @property
    def A_transformed(self) -> float:
        """Transformed area sum(n A), m^2."""
        return float((self.n * self.area).sum())

    @property
    def depth(self) -> float:
        """Overall depth from the lowest to the highest fibre, m."""
        return float(self.y_top.max() - self.y_bottom.min())

    def ply_results(self) -> tuple[PlyResult, ...]:
        """Return the per-ply table."""
        out = []
        y_na = self.neutral_axis_y
        for i, ply in enumerate(self.plies):
            a = float(self.area[i])
            centroid = float(self.first_y[i] / a) if a > 0 else ply.y + ply.height / 2
            i_own = own_second_moment(self, i)
            c_top = abs(float(self.y_top[i]) - y_na)
            c_bot = abs(float(self.y_bottom[i]) - y_na)
            e = float(self.E[i])
            out.append(
                PlyResult(
                    name=ply.name,
                    material=ply.material,
                    E=e,
                    modular_ratio=float(self.n[i]),
                    area=a,
                    transformed_area=float(self.n[i]) * a,
                    transformed_width=float(self.n[i]) * ply.width,
                    y_bottom=float(self.y_bottom[i]),
                    y_top=float(self.y_top[i]),
                    centroid_y=centroid,
                    I_own=i_own,
                    I_na=float(self.I_na[i]),
                    moment_share=float(self.E[i] * self.I_na[i] / self.EI),
                    S_top=self.EI / (e * c_top) if c_top > 0 and e > 0 else float("inf"),
                    S_bottom=self.EI / (e * c_bot) if c_bot > 0 and e > 0 else float("inf"),
                )
            )
        return tuple(out)

    # --- strain and stress ------------------------------------------------------------

    def curvature(self, moment: float) -> float:
        """Curvature kappa = M / EI, 1/m (sagging positive)."""
        return moment / self.EI

    def strain(self, moment: float, y: np.ndarray | float) -> np.ndarray:
        """Strain at heights ``y`` for moment ``moment`` (tension positive)."""
        return -self.curvature(moment) * (np.asarray(y, dtype=float) - self.neutral_axis_y)

    def stress(self, moment: float, ply_index: int, y: np.ndarray | float) -> np.ndarray:
        """Stress in ply ``ply_index`` at heights ``y``, Pa (tension positive)."""
        return float(self.E[ply_index]) * self.strain(moment, y)

    def centroid_stress(self, moment: float, ply_index: int) -> float:
        """Stress at ply ``ply_index``'s centroid, Pa (tension positive)."""
        i = ply_index
        a = float(self.area[i])
        yc = float(self.first_y[i] / a) if a > 0 else float(self.plies[i].y)
        return -float(self.E[i]) * moment * (yc - self.neutral_axis_y) / self.EI

    def same_kind(self, plain: Section) -> Section:
        """A section of this kind on the geometry and moduli of ``plain`` (a section of the
        same plies with other moduli, see :func:`with_moduli`): ``plain`` itself here; a
        section of another kind (partial composite action) rebuilds itself on it.
        """
        return plain

    def ply_extreme_stresses(self, moment: float | np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """Stress at each ply's highest and lowest fibre. With an array of moments, the
        result has shape (plies, moments).
        """
        m = np.asarray(moment, dtype=float)
        k = -m / self.EI
        top = np.multiply.outer(self.E * (self.y_top - self.neutral_axis_y), k)
        bot = np.multiply.outer(self.E * (self.y_bottom - self.neutral_axis_y), k)
        return top, bot

    def moment_shares(self) -> np.ndarray:
        """Share of the moment carried by each ply, E_i I_i,na / EI."""
        return np.asarray(self.E * self.I_na / self.EI)

    # --- shear ------------------------------------------------------------------------

    def first_moment_above(self, y: np.ndarray | float) -> np.ndarray:
        """Transformed first moment Q_t(y) of everything above each cut, about the
        neutral axis, m^3 (reference-material units).
        """
        cuts = np.atleast_1d(np.asarray(y, dtype=float))
        total = np.zeros_like(cuts)
        a, s = self._stack().above(cuts)
        terms = self.n[:, None] * (s - self.neutral_axis_y * a)
        for row in terms:  # ply by ply, in order
            total += row
        return total

    def _stack(self) -> ProfileStack:
        return self.stack if self.stack is not None else ProfileStack.of(self.profiles)

    def shear_flow(self, shear: float, y: np.ndarray | float) -> np.ndarray:
        """Shear flow q(y) = V Q_t(y) / I_t across a full horizontal cut, N/m."""
        return shear * self.first_moment_above(y) / self.I_transformed

    def shear_stress(self, shear: float, y: np.ndarray) -> np.ndarray:
        """Shear stress in each ply at heights ``y``, shape (plies, len(y)); NaN where
        the ply has no material at that height.

        A ply cut at height y carries its own part n_i Q_i(y) (plies side by side, as in
        a flitch beam) plus a share, in proportion to n_i b_i, of the first moment of the
        plies lying wholly beyond the cut (stacked plies):
        tau_i = V n_i (Q_i + b_i Q_beyond / sum_j n_j b_j) / (I_t b_i). Above the neutral
        axis the first moments are taken of what lies above the cut, below it of what
        lies below, so that every free edge carries no shear.
        """
        y = np.asarray(y, dtype=float).reshape(-1)
        y_na = self.neutral_axis_y
        upper = y >= y_na
        stack = self._stack()
        widths = stack.width_inside(y)
        a, s = stack.above(y)  # every ply at once, shape (plies, cuts)
        q_above = s - y_na * a
        q_total = (self.first_y - y_na * self.area)[:, None]
        # from the nearer free edge: the part above the cut above the neutral axis,
        # minus the part below the cut below it (so a free edge carries no shear)
        q_i = np.where(upper, q_above, q_above - q_total)
        crossing = widths > 0
        own_q = np.where(crossing, q_i, 0.0)
        wholly_beyond = np.where(upper, self.y_bottom[:, None] >= y, self.y_top[:, None] <= y)
        terms = np.where((~crossing) & wholly_beyond,
                         self.n[:, None] * np.where(upper, q_total, -q_total), 0.0)
        beyond = np.zeros(y.size)
        for row in terms:  # ply by ply, in order
            beyond += row
        nb = (self.n[:, None] * widths).sum(axis=0)
        with np.errstate(divide="ignore", invalid="ignore"):
            share = np.where(nb > 0, beyond / nb, 0.0)
            tau = shear * self.n[:, None] * (own_q + widths * share[None, :]) / (
                self.I_transformed * widths
            )
        return np.where(widths > 0, tau, np.nan)

    def interface_shear_flows(self, shear: float) -> list[tuple[Interface, float]]:
        """Shear flow that connectors must carry at each horizontal interface, N/m."""
        return [(itf, abs(shear) * itf.Q / self.I_transformed) for itf in self.interfaces]

    def transformed_geometry(self, index: int) -> BaseGeometry:
        """The clipped ply scaled in width by n about its own vertical centre line."""
        ply = self.plies[index]
        return affinity.scale(
            self.geoms[index], xfact=float(self.n[index]), yfact=1.0, origin=(ply.x_centre, 0.0)
        )


def own_second_moment(section: Section, i: int) -> float:
    """Ply i's second moment about its own centroid, m^4: b h^3 / 12 of a whole
    rectangle (exact: the parallel-axis difference of moments about y = 0 loses digits
    for a thin ply far from it), else that difference of the clipped polygon's moments.
    """
    a = float(section.area[i])
    if a <= 0:
        return 0.0
    if section.is_unclipped(i):
        ply = section.plies[i]
        return ply.width * ply.height ** 3 / 12
    centroid = float(section.first_y[i]) / a
    return float(section.second_y[i]) - a * centroid * centroid


def analyse(
    plies: Sequence[Ply],
    materials: Mapping[str, Material],
    reference: str | None = None,
    moduli: Sequence[float] | np.ndarray | None = None,
) -> Section:
    """Analyse a section.

    Args:
        plies: plies in stacking order (later plies win where they overlap).
        materials: materials by id (project and library merged).
        reference: reference material id; default the first timber material.
        moduli: optional per-ply moduli replacing the materials' E (used for creep).

    Raises:
        ProjectError: no plies, bad dimensions, unknown materials, or no stiffness left.

    """
    plies = tuple(plies)
    problems: list[Problem] = []
    if not plies:
        raise ProjectError(Problem("plies", "the section has no plies"))
    for i, ply in enumerate(plies):
        problems.extend(validate_ply(ply, f"plies[{i}]"))
        if ply.material not in materials:
            problems.append(Problem(f"plies[{i}].material", f'"{ply.material}" is not a known '
                                    "material (not in the project nor the library)"))
    if reference is not None and reference not in materials:
        problems.append(Problem("reference", f'"{reference}" is not a known material'))
    if problems:
        raise ProjectError(problems)
    mats = tuple(materials[p.material] for p in plies)
    if reference is None:
        timber = [m.id for m in mats if m.kind == "timber"]
        reference = timber[0] if timber else mats[0].id
    E_ref = materials[reference].E
    E = np.array([m.E for m in mats], dtype=float) if moduli is None else np.asarray(
        moduli, dtype=float)
    clipped, whole = clip_plies_marked(plies)
    geoms = tuple(clipped)
    mom = [rectangle_moments(p) if w else polygon_moments(g)
           for p, g, w in zip(plies, geoms, whole, strict=True)]
    area = np.array([m.area for m in mom])
    first_y = np.array([m.first_y for m in mom])
    second_y = np.array([m.second_y for m in mom])
    warnings: list[Problem] = []
    size = max(max(p.width, p.height) for p in plies)
    y_bottom = np.empty(len(plies))
    y_top = np.empty(len(plies))
    for i, (ply, g) in enumerate(zip(plies, geoms, strict=True)):
        if whole[i] and area[i] > size * size * 1e-12:
            y_bottom[i], y_top[i] = ply.y, ply.top  # a box's bounds are its corners
        elif g.is_empty or area[i] <= size * size * 1e-12:
            warnings.append(Problem(f"plies[{i}]", f'"{ply.name}" is clipped away completely '
                                    "by later plies and carries nothing"))
            area[i] = first_y[i] = second_y[i] = 0.0
            y_bottom[i], y_top[i] = ply.y, ply.top
        else:
            _, y_bottom[i], _, y_top[i] = g.bounds
            later = [f'"{q.name}"' for q in plies[i + 1:] if overlap(ply, q)]
            warnings.append(Problem(f"plies[{i}]", f'"{ply.name}" is cut by the later '
                                    f"{', '.join(later)} where they overlap (the later ply "
                                    "wins there): check the widths and positions"))
    unclipped = all(is_unclipped(float(a), p) for a, p in zip(area, plies, strict=True))
    loose: list[int] = []
    if len(plies) > 1:
        touch_tol = size * TOUCH_TOLERANCE
        touched = {k for i, j in near_pairs(plies, touch_tol)
                   if rectangles_touch(plies[i], plies[j], touch_tol) for k in (i, j)}
        candidates = None if unclipped else touch_candidates(plies, size)
        for i, ply in enumerate(plies):
            if unclipped:
                touching = i in touched
            else:
                touching = area[i] > 0 and touches_any(i, list(geoms), size,
                                                       candidates[i] if candidates else None)
            if area[i] > 0 and not touching:
                loose.append(i)
                warnings.append(MissingCheck(f"plies[{i}]", f'"{ply.name}" {LOOSE}'))
    if loose and len(loose) < sum(1 for a in area if a > 0):
        E = E.copy()
        E[loose] = 0.0
    profiles = tuple(rectangle_profile(p) if w and area[i] > 0 else width_profile(g)
                     for i, (p, g, w) in enumerate(zip(plies, geoms, whole, strict=True)))
    return _assemble(plies, mats, reference, E_ref, E, area, first_y, second_y, y_bottom, y_top,
                     geoms, profiles, tuple(warnings), size, ProfileStack.of(profiles))


#: What a ply that touches no other is told (``analyse``); :func:`falls_apart` reads it.
LOOSE = ("touches no other ply; nothing connects it to the rest of the section, so it is "
         "left out of the composite section and not checked as part of it")


def falls_apart(section: Section) -> bool:
    """True where the section has two or more plies of some area, none of them touches
    another, and their centroids stand at different heights. ``analyse`` then keeps
    every modulus (leaving every ply out would leave nothing), which is exact only where
    the centroids share one height: the plies then bend about it alike, the composite
    EI is the sum of their own and each stress is its own (two joists beside the gap a
    flitch plate will fill). Elsewhere the composite numbers would describe a section
    that does not exist.
    """
    solid = [i for i, a in enumerate(section.area) if a > 0]
    loose = sum(1 for w in section.warnings if w.message.endswith(LOOSE))
    if len(solid) < 2 or loose < len(solid):
        return False
    heights = [float(section.first_y[i]) / float(section.area[i]) for i in solid]
    depth = max(float(section.y_top[i]) for i in solid) - min(float(section.y_bottom[i])
                                                              for i in solid)
    return max(heights) - min(heights) > 1e-9 * depth


def with_moduli(section: Section, moduli: Sequence[float] | np.ndarray) -> Section:
    """The same geometry with other per-ply moduli (creep), without re-clipping; the
    contacts between plies are the section's own (they do not depend on the moduli),
    only the first moments they hold are found again.
    """
    size = max(max(p.width, p.height) for p in section.plies)
    plain = _assemble(section.plies, section.materials, section.reference_material,
                      section.E_ref, np.asarray(moduli, dtype=float), section.area,
                      section.first_y, section.second_y, section.y_bottom, section.y_top,
                      section.geoms, section.profiles, section.warnings, size,
                      section.stack, section.interfaces)
    return section.same_kind(plain)


def _assemble(plies: tuple[Ply, ...], mats: tuple[Material, ...], reference: str, E_ref: float,
              E: np.ndarray, area: np.ndarray, first_y: np.ndarray, second_y: np.ndarray,
              y_bottom: np.ndarray, y_top: np.ndarray, geoms: tuple[BaseGeometry, ...],
              profiles: tuple[WidthProfile, ...], warnings: tuple[Problem, ...],
              size: float, stack: ProfileStack | None = None,
              contacts_of: tuple[Interface, ...] | None = None) -> Section:
    EA = float((E * area).sum())
    if EA <= 0:
        raise ProjectError(Problem("plies", "the section has no stiffness left after clipping"))
    y_na = float((E * first_y).sum() / EA)
    I_na = second_y - 2 * y_na * first_y + y_na**2 * area
    EI = float((E * I_na).sum())
    n = E / E_ref
    beyond = _Beyond(n * (first_y - y_na * area), area > 0, y_bottom, y_top, size * 1e-9)
    if contacts_of is not None:  # the contacts do not depend on the moduli
        interfaces = _with_first_moments(contacts_of, beyond)
    else:
        interfaces = _find_interfaces(plies, area, geoms, beyond)
    return Section(
        plies=plies,
        materials=mats,
        reference_material=reference,
        E_ref=E_ref,
        E=E,
        n=n,
        area=area,
        first_y=first_y,
        second_y=second_y,
        y_bottom=y_bottom,
        y_top=y_top,
        geoms=geoms,
        profiles=profiles,
        EA=EA,
        EI=EI,
        neutral_axis_y=y_na,
        I_transformed=EI / E_ref,
        mass_per_length=float(sum(m.density * a for m, a in zip(mats, area, strict=True))),
        I_na=I_na,
        interfaces=interfaces,
        warnings=warnings,
        stack=stack,
    )


@dataclass(frozen=True, eq=False)
class _Beyond:
    """What the first moments held at an interface are found from: per ply, n Q about
    the neutral axis, whether it has material, its lowest and highest fibre; and the
    tolerance of "level with".
    """

    q: np.ndarray
    valid: np.ndarray
    y_bottom: np.ndarray
    y_top: np.ndarray
    tol: float


def _rectangle_contacts(plies: tuple[Ply, ...], area: np.ndarray, tol: float
                        ) -> dict[float, list[tuple[int, int, float]]] | None:
    """Horizontal contacts of unclipped rectangles (None where some ply is clipped)."""
    if not all(is_unclipped(float(a), p) for a, p in zip(area, plies, strict=True)):
        return None
    found = []
    for a, b in near_pairs(plies, tol):
        for i, j in ((a, b), (b, a)):
            lo, up = plies[i], plies[j]
            if abs(lo.top - up.y) > tol:
                continue
            length = min(lo.x + lo.width, up.x + up.width) - max(lo.x, up.x)
            if length > tol:
                found.append((i, j, length))
    contacts: dict[float, list[tuple[int, int, float]]] = {}
    for i, j, length in sorted(found):  # the order of a loop over i, then j
        key = round(plies[j].y / tol) * tol
        contacts.setdefault(key, []).append((i, j, length))
    return contacts


def _find_interfaces(plies: tuple[Ply, ...], area: np.ndarray,
                     all_geoms: tuple[BaseGeometry, ...],
                     beyond: _Beyond) -> tuple[Interface, ...]:
    """Find horizontal contacts between plies and the first moment they must hold."""
    tol = beyond.tol
    fast = _rectangle_contacts(plies, area, tol)
    contacts: dict[float, list[tuple[int, int, float]]] = fast or {}
    geoms = all_geoms if fast is None else ()
    near: list[list[int]] = [[] for _ in geoms]
    for a, b in near_pairs(plies, tol * 20) if geoms else ():
        near[a].append(b)
        near[b].append(a)
    for i, gi in enumerate(geoms):
        if gi.is_empty:
            continue
        for j in sorted(near[i]):
            gj = geoms[j]
            if gj.is_empty:
                continue
            # i below j: i's top edge level with j's bottom edge somewhere
            common = gi.boundary.intersection(gj.boundary)
            if common.is_empty:
                continue
            for seg in getattr(common, "geoms", [common]):
                coords = np.asarray(getattr(seg, "coords", []))
                if coords.shape[0] < 2:
                    continue
                for a, b in zip(coords[:-1], coords[1:], strict=True):
                    if abs(a[1] - b[1]) > tol or abs(a[0] - b[0]) <= tol:
                        continue
                    yc = float(a[1])
                    mid = ((a[0] + b[0]) / 2, yc)
                    below = _contains_near(gi, mid, -tol * 10)
                    above = _contains_near(gj, mid, tol * 10)
                    if below and above:
                        key = round(yc / tol) * tol
                        contacts.setdefault(key, []).append((i, j, abs(b[0] - a[0])))
    if not contacts:
        return ()
    heights = sorted(contacts)
    q_above, q_below = _first_moments_beyond(beyond, np.array(heights))
    out = []
    for k, yc in enumerate(heights):
        items = contacts[yc]
        pairs = tuple(sorted({(i, j) for i, j, _ in items}))
        length = sum(ln for _, _, ln in items)
        out.append(Interface(yc, pairs, length,
                             max(abs(float(q_above[k])), abs(float(q_below[k])))))
    return tuple(out)


def _with_first_moments(interfaces: tuple[Interface, ...],
                        beyond: _Beyond) -> tuple[Interface, ...]:
    """The same contacts (heights, pairs, lengths) with the first moments of ``beyond``,
    found as :func:`_find_interfaces` finds them.
    """
    if not interfaces:
        return ()
    heights = np.array([itf.y for itf in interfaces])
    q_above, q_below = _first_moments_beyond(beyond, heights)
    return tuple(replace(itf, Q=max(abs(float(q_above[k])), abs(float(q_below[k]))))
                 for k, itf in enumerate(interfaces))


def _first_moments_beyond(b: _Beyond, heights: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """At each height, the sums of n Q of the plies wholly above it and wholly below it.

    The sums run over the plies in order (a cumulative sum of rows in which the other
    plies count zero), so they are the same numbers as a loop adding one ply at a time.
    """
    q, valid, tol = b.q, b.valid, b.tol
    above = valid & (b.y_bottom[None, :] >= heights[:, None] - tol)
    below = valid & ~above & (b.y_top[None, :] <= heights[:, None] + tol)
    q_above = np.cumsum(np.where(above, q, 0.0), axis=1)[:, -1]
    q_below = np.cumsum(np.where(below, q, 0.0), axis=1)[:, -1]
    return q_above, q_below


def _contains_near(geom: BaseGeometry, point: tuple[float, float], dy: float) -> bool:
    from shapely.geometry import Point

    return bool(geom.contains(Point(point[0], point[1] + dy)))
