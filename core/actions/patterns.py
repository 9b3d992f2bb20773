"""Pattern (skip) loading of the variable actions, span by span, enveloped exactly.

ASCE 7-16 4.3.3 (live load placed where most unfavourable, also on parts of the member)
and 7.5 (snow on continuous members); EN 1991-1-1 6.2.1 (imposed loads in the most
unfavourable positions); all from memory. The patterned cases (US: L, Lr, S; EU: every
variable case) are split into their parts on each span and overhang (a *region*); each
part is loaded or not, independently, and the worst arrangement is found for every
quantity. The beam is linear, so each region's part is solved once and superposed.

The arrangement that governs a quantity at a point loads exactly the parts whose
contribution there has the unfavourable sign. Sampling every element at its ends and
quarter points gives the arrangements that can govern anywhere; each of those is then
solved exactly (true extrema inside elements), and the envelope is the worst of them.
Reactions are enveloped exactly, support by support.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field, replace

import numpy as np

from ..model.member import MERGE_TOLERANCE, BeamSpec, Load
from .beam import BeamModel, CaseSolution
from .extremes import w_up_coefficients

#: Cases loaded span by span, by basis.
PATTERNED = {"US": ("L", "Lr", "S"), "EU": ("L", "Lr", "S", "W")}
#: Sample points per element (local fraction of its length).
SAMPLES = np.array([0.0, 0.25, 0.5, 0.75, 1.0])


def clipped(load: Load, x0: float, x1: float, length: float, last: bool) -> Load | None:
    """The part of ``load`` on [x0, x1] (a point load belongs to the region that holds
    it, the right end only for the last region); None where nothing is left.
    """
    tol = MERGE_TOLERANCE * max(length, 1.0)  # positions this close share a beam node
    if load.type == "point":
        at = float(load.at or 0.0)
        return load if (x0 - tol <= at < x1 - tol or (last and at >= x1 - tol)) else None
    a = 0.0 if load.start is None else load.start
    b = length if load.end is None else load.end
    lo, hi = max(a, x0), min(b, x1)
    if hi <= lo:
        return None
    value, value_end = load.value, load.value_end
    if value_end is not None:
        t0, t1 = (lo - a) / (b - a), (hi - a) / (b - a)
        value, value_end = (load.value + t0 * (value_end - load.value),
                            load.value + t1 * (value_end - load.value))
    return replace(load, start=lo, end=hi, value=value, value_end=value_end)


@dataclass(frozen=True, eq=False)
class RegionParts:
    """The patterned cases split by region.

    Attributes:
        names: region labels ("span 1", "overhang left", ...).
        parts: per patterned case, its solution on each region (None: no load there).
        model: the mesh the parts are solved on (None where not given).
        samples: per patterned case, the samples of each region's part on ``model``
            (:func:`_samples`, made once for every plan of the member).

    """

    names: tuple[str, ...]
    parts: Mapping[str, tuple[CaseSolution | None, ...]]
    model: BeamModel | None = None
    samples: Mapping[str, tuple[np.ndarray | None, ...]] = field(default_factory=dict)

    def part(self, unit: Unit) -> CaseSolution:
        """The solution of one unit's part (units only exist where there is a load)."""
        sol = self.parts[unit.case][unit.region]
        if sol is None:
            raise ValueError(f"no load of case {unit.case} on {self.names[unit.region]}")
        return sol

    def sampled(self, model: BeamModel, unit: Unit) -> np.ndarray:
        """:func:`_samples` of one unit's part on ``model`` (the samples made with the
        parts where they are of this model).
        """
        held = self.samples.get(unit.case) if model is self.model else None
        found = held[unit.region] if held is not None else None
        return found if found is not None else _samples(model, self.part(unit))


def region_parts(model: BeamModel, spec: BeamSpec, cases: Sequence[str]) -> RegionParts:
    """Solve each patterned case's part on each region of the member."""
    regions = model.layout.regions()
    length = model.layout.length
    parts: dict[str, tuple[CaseSolution | None, ...]] = {}
    for case in cases:
        loads = [ld for ld in spec.loads if ld.case == case]
        per: list[CaseSolution | None] = []
        for r, (_, x0, x1) in enumerate(regions):
            mine = [c for ld in loads
                    if (c := clipped(ld, x0, x1, length, r == len(regions) - 1)) is not None]
            per.append(model.solve(mine) if mine else None)
        parts[case] = tuple(per)
    samples = {c: tuple(None if sol is None else _read_only(_samples(model, sol))
                        for sol in per) for c, per in parts.items()}
    return RegionParts(tuple(n for n, _, _ in regions), parts, model, samples)


@dataclass(frozen=True)
class Unit:
    """One patterned case on one region, with its factor in a combination."""

    case: str
    region: int
    factor: float


@dataclass(frozen=True, eq=False)
class Plan:
    """The arrangements worth solving for one set of factors.

    Attributes:
        units: the patterned parts that the factors load.
        masks: candidate arrangements, each a tuple of booleans over ``units``; the
            first is "everything loaded".

    """

    units: tuple[Unit, ...]
    masks: tuple[tuple[bool, ...], ...]

    def labels(self, mask: tuple[bool, ...], names: Sequence[str]) -> list[str]:
        """The regions loaded by an arrangement (in member order)."""
        loaded = {u.region for u, on in zip(self.units, mask, strict=True) if on}
        return [names[r] for r in sorted(loaded)]


def _read_only(a: np.ndarray) -> np.ndarray:
    a.setflags(write=False)
    return a


def _samples(model: BeamModel, sol: CaseSolution) -> np.ndarray:
    """Moment, shear and deflection (EI = 1) at the sample points of every element (the
    elements' polynomials by Horner's rule, all elements at once).
    """
    le = model.lengths
    x = SAMPLES[None, :] * le[:, None]
    u = sol.u
    wq, wdq = sol.deflection_loads()
    coeffs = (np.stack([sol.dq / 6, sol.q / 2, sol.V0, sol.M0], axis=-1),
              np.stack([sol.dq / 2, sol.q, sol.V0], axis=-1),
              -w_up_coefficients(u[0:-2:2], u[1:-2:2], u[2::2], u[3::2], wq, wdq, le,
                                 scalar_powers=True) / 1.0)
    out = []
    for c in coeffs:
        y = np.zeros_like(x)
        for j in range(c.shape[1]):
            y = y * x + c[:, j : j + 1]
        out.append(y)
    return np.concatenate(out, axis=1).reshape(-1)


def plan(model: BeamModel, parts: RegionParts, factors: Mapping[str, float]) -> Plan:
    """The candidate arrangements for a combination's factors (see the module text)."""
    units = tuple(Unit(c, r, f) for c, f in factors.items() if f and c in parts.parts
                  for r, sol in enumerate(parts.parts[c]) if sol is not None)
    if not units:
        return Plan((), ((),))
    values = np.stack([u.factor * parts.sampled(model, u) for u in units])
    masks: dict[tuple[bool, ...], None] = {tuple([True] * len(units)): None}
    scale = np.abs(values).max(axis=0, initial=0.0)
    significant = np.abs(values) > 1e-9 * np.where(scale > 0, scale, 1.0)
    for sign in (1.0, -1.0):
        chosen = (sign * values > 0) & significant
        # the distinct sample columns in the order of numpy's unique rows (lexicographic,
        # False before True), as tuples of booleans
        for col in sorted(set(map(tuple, chosen.T.tolist()))):
            masks.setdefault(col, None)
    return Plan(units, tuple(masks))


def reaction_envelope(base: CaseSolution | None, parts: RegionParts, plan_: Plan,
                      n_supports: int) -> tuple[np.ndarray, np.ndarray]:
    """Largest and smallest reaction of every support over every arrangement (exact)."""
    lo = np.zeros(n_supports) if base is None else base.reactions.copy()
    hi = lo.copy()
    for u in plan_.units:
        r = u.factor * parts.part(u).reactions
        hi += np.maximum(r, 0.0)
        lo += np.minimum(r, 0.0)
    return hi, lo
