"""Beam actions of a project for one section: every load case and combination, with creep.

Self-weight (g = 9.80665 m/s^2, standard gravity) joins case D. Creep: the sustained part
of each combination (its D, plus ``sustained_live_fraction`` of its L) acts on the
section with timber moduli divided by the creep factor (NDS 2018 3.5.2 K_cr, or
1 + k_def per EN 1995-1-1 2.3.2.2, from memory); steel does not creep, so the section is
re-transformed and the steel takes a larger share of that moment. The rest acts on the
short-term section. Total deflection = long-term part + short-term part.

Sustained part (from memory): US, NDS 2018 3.5.2: the combination's D plus
``sustained_live_fraction`` of its L. EU, EN 1995-1-1 2.2.3(5) and 2.3.2.2: all of G and
psi2 of each variable action the combination holds, so that
u_fin = u_inst,G (1 + k_def) + u_inst,Q1 (1 + psi2,1 k_def) + sum u_inst,Qi (psi0,i +
psi2,i k_def) for a homogeneous member, with the steel's share taken by re-transforming.

The beam's mesh and stiffness do not depend on the section and every case is linear in
its loads, so :class:`PreparedBeam` solves each case once (self-weight as a unit case),
splits the patterned cases by span (actions.patterns) and finds the arrangements worth
solving; :func:`analyse_beams` then scales and combines them for any number of sections
and reduces every solution to its extremes in one batched pass.

A member whose plies stop short of its ends (a :class:`Stepping`) is prepared for one
section: each case is solved on the stepped stiffness, and again on the stepped creep
stiffness for the sustained parts (timber creeps, steel does not, so the steps change
under creep); the total with creep is the sustained part on the creep model plus the
rest on the short-term model. Its solutions are true deflections (EI = 1 when read), its
self-weight is each segment's own, and :func:`analyse_stepped` also gives the extremes
within each segment.
"""

from __future__ import annotations

import functools
from collections.abc import Callable, Mapping, Sequence
from dataclasses import dataclass, field, replace

import numpy as np

from ..codes import en1995, nds
from ..model.combination import EN1990_PSI, Combination, duration_of
from ..model.constants import GRAVITY
from ..model.design import DesignSpec
from ..model.errors import Problem, ProjectError
from ..model.member import BeamSpec, Load
from ..section.transformed import Section, with_moduli
from .beam import BeamModel, CaseSolution, combine, moment_at
from .combinations import asd_combinations, en1990_combinations
from .extremes import Extremes, extremes_many, extremes_within
from .patterns import PATTERNED, Plan, RegionParts, plan, reaction_envelope, region_parts


@dataclass(frozen=True, eq=False)
class CombinationResult:
    """Actions of one combination (SI; deflection positive downward), enveloped over the
    pattern arrangements where the variable cases are patterned.

    Attributes:
        combination: the combination.
        duration: its load-duration class.
        solution: the combination with every region loaded, short-term section.
        extremes: envelope of the extremes (short-term EI).
        sustained_factors: factors of its sustained part, per case.
        sustained: the sustained part (every region loaded), or None.
        rest: the part that is not sustained (every region loaded), or None.
        total: envelope of the total with creep (sustained part on the creep section).
        total_solution: the total with creep, every region loaded.
        long_term: extremes of the sustained part on the creep section, for the
            arrangement that governs the total deflection, or None.
        short_term_rest: extremes of the rest, same arrangement, or None.
        M_governing: the moment of largest magnitude of the envelope, N m.
        model: the beam mesh.
        EI: short-term stiffness, N m^2.
        EI_creep: stiffness of the creep section, N m^2.
        reactions_max: largest reaction of each support over the arrangements, N.
        reactions_min: smallest reaction of each support (negative: uplift), N.
        governing_patterns: for "M_max", "M_min" and "deflection_max_abs", the regions
            loaded in the arrangement that governs it.
        patterns_tried: how many arrangements were solved.
        variable_only: envelope of the variable actions alone (EU characteristic
            combinations), or None.
        M_sustained_at_max: the sustained part's moment where M_max occurs, in the
            arrangement that governs M_max, N m (for stresses with creep).
        M_sustained_at_min: the same where M_min occurs, N m.

    """

    combination: Combination
    duration: str
    solution: CaseSolution
    extremes: Extremes
    sustained_factors: Mapping[str, float]
    sustained: CaseSolution | None
    rest: CaseSolution | None
    total: Extremes
    total_solution: CaseSolution
    long_term: Extremes | None
    short_term_rest: Extremes | None
    M_governing: float
    model: BeamModel
    EI: float
    EI_creep: float
    reactions_max: np.ndarray = field(default_factory=lambda: np.zeros(0))
    reactions_min: np.ndarray = field(default_factory=lambda: np.zeros(0))
    governing_patterns: Mapping[str, tuple[str, ...]] = field(default_factory=dict)
    patterns_tried: int = 1
    variable_only: Extremes | None = None
    M_sustained_at_max: float = 0.0
    M_sustained_at_min: float = 0.0

    @property
    def name(self) -> str:
        """The combination's name."""
        return self.combination.name

    @property
    def kind(self) -> str:
        """The combination's kind (ASD, ULS, SLS-...)."""
        return self.combination.kind_on("US" if self.combination.kind == "ASD" else "EU")

    @property
    def M_sustained(self) -> float:
        """Sustained moment of largest magnitude, N m."""
        e = self.long_term
        if e is None:
            return 0.0
        return e.M_max if abs(e.M_max) >= abs(e.M_min) else e.M_min


@dataclass(frozen=True)
class ReactionBound:
    """The envelope of one support's reaction over every combination and arrangement.

    Attributes:
        support: 1-based support number.
        x: its position, m.
        max: largest reaction (upward positive), N.
        min: smallest reaction, N (negative: uplift).
        combination_max: the combination giving ``max``.
        combination_min: the combination giving ``min``.
        strength_min: smallest reaction over the strength combinations, N.
        strength_combination_min: the strength combination giving it.

    """

    support: int
    x: float
    max: float
    min: float
    combination_max: str
    combination_min: str
    strength_min: float
    strength_combination_min: str


@dataclass(frozen=True, eq=False)
class BeamResult:
    """Beam actions for every case and combination.

    Attributes:
        spec: the beam as entered.
        model: the mesh.
        cases: solution of every load case alone, every region loaded.
        case_extremes: envelope of every case alone over the arrangements (short-term EI).
        combinations: every combination that carries a load.
        creep_factor: K_cr or 1 + k_def.
        creep_section: the section with crept timber moduli.
        self_weight_line: self-weight, N/m.
        basis: "US" or "EU".
        EI: short-term stiffness, N m^2.
        reaction_envelope: per support, over every combination and arrangement.
        patterned_cases: the cases loaded region by region (empty: no patterns).
        regions: the region labels of the member.

    """

    spec: BeamSpec
    model: BeamModel
    cases: Mapping[str, CaseSolution]
    case_extremes: Mapping[str, Extremes]
    combinations: tuple[CombinationResult, ...]
    creep_factor: float
    creep_section: Section
    self_weight_line: float
    basis: str
    EI: float
    reaction_envelope: tuple[ReactionBound, ...] = ()
    patterned_cases: tuple[str, ...] = ()
    regions: tuple[str, ...] = ()
    stepped: bool = False
    segments: tuple[BeamResult, ...] = ()
    bounds: tuple[float, float] | None = None

    @property
    def solution_EI(self) -> float:
        """The EI that the solutions' deflections are divided by: the section's, or 1 on a
        stepped member (its solutions already hold each segment's EI).
        """
        return 1.0 if self.stepped else self.EI

    def extremes_of(self, case: str) -> Extremes:
        """Extremes of one load case alone (short-term EI), enveloped over arrangements."""
        return self.case_extremes[case]

    def serviceability(self) -> tuple[CombinationResult, ...]:
        """Combinations that deflection checks, diagrams and studies use (ASD, SLS)."""
        return tuple(c for c in self.combinations
                     if c.combination.for_serviceability(self.basis))

    def strength(self) -> tuple[CombinationResult, ...]:
        """Combinations that strength checks use (ASD, ULS)."""
        return tuple(c for c in self.combinations if c.combination.for_strength(self.basis))


def combinations_for(spec: BeamSpec, basis: str, design: DesignSpec) -> tuple[Combination, ...]:
    """The combinations of a beam: the named set or the user's list."""
    present = {ld.case for ld in spec.loads}
    if spec.self_weight:
        present.add("D")
    chosen = spec.combinations
    if chosen is None:
        chosen = "ASD" if basis == "US" else "EN1990"
    if isinstance(chosen, str):
        if chosen == "EN1990":
            return en1990_combinations(present, design.psi, design.en1990_expression)
        return asd_combinations(present)
    return chosen


def creep_factor(section: Section, design: DesignSpec) -> float:
    """The creep factor of the section's timber: NDS 2018 3.5.2 K_cr or
    1 + k_def of EN 1995-1-1 Table 3.2 (from memory), unless the user gives one.
    """
    if design.us:
        return design.K_cr if design.K_cr is not None else nds.K_cr(design.wet_service)
    # k_def of Table 3.2 is the same for solid timber, glulam and LVL
    k_def = design.k_def if design.k_def is not None else en1995.k_def(design.service_class)
    return 1.0 + k_def


def creep_moduli(section: Section, factor: float) -> np.ndarray:
    """Per-ply moduli under sustained load: timber divided by the creep factor."""
    return np.array([e / factor if m.kind == "timber" else e
                     for m, e in zip(section.materials, section.E, strict=True)])


def sustained_factors(combo: Combination, basis: str, design: DesignSpec,
                      frac: float, present: Sequence[str]) -> dict[str, float]:
    """The factors of a combination's sustained part (see the module docstring)."""
    f = combo.factors
    if basis == "US":
        return {c: v * (1.0 if c == "D" else frac) for c, v in f.items()
                if c in ("D", "L") and c in present}
    psi = {**EN1990_PSI, **design.psi}
    return {c: (v if c == "D" else min(v, psi[c][2]) if v > 0 else v)
            for c, v in f.items() if c in present and (c == "D" or psi.get(c, (0, 0, 0))[2])}


@dataclass(frozen=True, eq=False)
class _Planned:
    """A combination with its arrangements and sustained factors."""

    combination: Combination
    plan: Plan
    sustained: dict[str, float]
    variable_plan: Plan | None


@dataclass(frozen=True)
class Stepping:
    """A member of stepped stiffness: per segment, (from, to) in m, the short-term EI and
    the creep EI (N m^2) and the self-weight (N/m, zero where it is not counted).
    """

    bounds: tuple[tuple[float, float], ...]
    EI: tuple[float, ...]
    EI_creep: tuple[float, ...]
    self_weight: tuple[float, ...]

    def steps(self, creep: bool) -> tuple[tuple[float, float, float], ...]:
        """(from, to, EI) of every segment."""
        return tuple((a, b, e) for (a, b), e in zip(
            self.bounds, self.EI_creep if creep else self.EI, strict=True))

    def weight_loads(self) -> tuple[Load, ...]:
        """The self-weight of every segment as case D line loads."""
        return tuple(Load("D", "line", w, start=a, end=b, description="self-weight")
                     for (a, b), w in zip(self.bounds, self.self_weight, strict=True) if w)


@dataclass(frozen=True, eq=False)
class PreparedBeam:
    """A beam solved once for every section: mesh, each case without self-weight, the
    solution of a unit self-weight (1 N/m) where the member's weight counts, the
    patterned cases by region, and the arrangements of every combination.
    """

    spec: BeamSpec
    model: BeamModel
    cases: Mapping[str, CaseSolution]
    unit_self_weight: CaseSolution | None
    basis: str
    parts: RegionParts | None
    planned: tuple[_Planned, ...]
    case_plans: Mapping[str, Plan]
    stepped: bool = False
    creep: PreparedBeam | None = None

    @staticmethod
    def of(spec: BeamSpec, design: DesignSpec, stepping: Stepping | None = None,
           creep: bool = False) -> PreparedBeam:
        """Mesh the beam, solve each load case and plan the arrangements (on the stepped
        stiffness where ``stepping`` is given, its creep stiffness with ``creep``). The
        creep stiffness's member (:attr:`creep`) is not planned: its solutions are built on
        the plans of the short-term member, and its own would never be read.
        """
        basis = "US" if design.us else "EU"
        steps = () if stepping is None else stepping.steps(creep)
        own = () if stepping is None else stepping.weight_loads()
        model = BeamModel(spec.layout, spec.loads + own, steps)
        cases = {c: model.solve([ld for ld in spec.loads + own if ld.case == c])
                 for c in sorted({ld.case for ld in spec.loads + own})}
        unit = (model.solve([], extra_line=1.0) if spec.self_weight and stepping is None
                else None)
        present = sorted(set(cases) | ({"D"} if spec.self_weight else set()))
        parts = None
        if spec.pattern_live_load and len(spec.layout.regions()) > 1:
            patterned = [c for c in PATTERNED[basis] if c in cases]
            if patterned:
                parts = region_parts(model, spec, patterned)
        if creep:
            return PreparedBeam(spec, model, cases, unit, basis, parts, (), {},
                                stepping is not None, None)
        empty = RegionParts((), {})
        frac = spec.sustained_live_fraction or 0.0
        planned = []
        for combo in combinations_for(spec, basis, design):
            if not any(c in present for c in combo.cases()):
                continue
            var = None
            if basis == "EU" and combo.kind == "SLS-characteristic":
                var = plan(model, parts or empty, {c: f for c, f in combo.factors.items()
                                                   if c != "D"})
            planned.append(_Planned(combo, plan(model, parts or empty, combo.factors),
                                    sustained_factors(combo, basis, design, frac, present),
                                    var))
        case_plans = {c: plan(model, parts or empty, {c: 1.0}) for c in present}
        crept = (PreparedBeam.of(spec, design, stepping, creep=True)
                 if stepping is not None else None)
        return PreparedBeam(spec, model, cases, unit, basis, parts, tuple(planned),
                            case_plans, stepping is not None, crept)

    def cases_with_self_weight(self, self_weight: float) -> dict[str, CaseSolution]:
        """Every case's solution, the self-weight (N/m) added to case D."""
        cases = dict(self.cases)
        if self.unit_self_weight is not None:
            own = self.unit_self_weight.scaled(self_weight)
            cases["D"] = cases["D"] + own if "D" in cases else own
        return cases


def _build_all(prepared: PreparedBeam, cases: Mapping[str, CaseSolution], plan_: Plan,
               g: Mapping[str, float]) -> list[CaseSolution]:
    """:func:`_build` of every arrangement of ``plan_``: the same sums, unit by unit in
    the same order, made for all arrangements at once (one row each).
    """
    masks = plan_.masks
    parts = prepared.parts
    if len(masks) < 3 or parts is None:
        return [_build(prepared, cases, plan_, m, g) for m in masks]
    patterned = set(parts.parts)
    base = combine(cases, {c: v for c, v in g.items() if c not in patterned})
    terms = [(u, parts.part(unit).scaled(g[unit.case]))
             for u, unit in enumerate(plan_.units) if g.get(unit.case)]
    shapes = {(s._e, s._s, s._w) for _, s in terms} | (
        set() if base is None else {(base._e, base._s, base._w)})
    if len(shapes) != 1:  # not one layout of numbers: one arrangement at a time
        return [_build(prepared, cases, plan_, m, g) for m in masks]
    e, n_s, w = shapes.pop()
    on_all = np.array(masks, dtype=bool).reshape(len(masks), -1)
    started = np.zeros(len(masks), dtype=bool)
    acc = np.zeros((len(masks), (base if base is not None else terms[0][1]).data.size))
    if base is not None:
        acc[:] = base.data
        started[:] = True
    for u, s in terms:
        on = on_all[:, u]
        # a started row adds the part (sol + s), a new one takes it (sol = s); only the
        # rows that load the part are touched
        add = on & started
        if add.any():
            acc[add] += s.data
        new = on & ~started
        if new.any():
            acc[new] = s.data
        started |= on
    zero = None
    out = []
    for r in range(len(masks)):
        if started[r]:
            out.append(CaseSolution._of(acc[r], e, n_s, w))
        else:
            zero = zero or next(iter(cases.values())).scaled(0.0)
            out.append(zero)
    return out


def _build(prepared: PreparedBeam, cases: Mapping[str, CaseSolution], plan_: Plan,
           mask: tuple[bool, ...], g: Mapping[str, float]) -> CaseSolution:
    """The solution of factors ``g`` with the arrangement ``mask`` of ``plan_``."""
    parts = prepared.parts
    patterned = set(parts.parts) if parts is not None else set()
    sol = combine(cases, {c: v for c, v in g.items() if c not in patterned})
    for unit, on in zip(plan_.units, mask, strict=True):
        if on and g.get(unit.case) and parts is not None:
            s = parts.part(unit).scaled(g[unit.case])
            sol = s if sol is None else sol + s
    if sol is None:
        return next(iter(cases.values())).scaled(0.0)
    return sol


def envelope(ext: Sequence[Extremes]) -> tuple[Extremes, dict[str, int]]:
    """The worst of several extremes, and which one governs M_max, M_min, the shear and
    the deflection.
    """
    if len(ext) == 1:  # one arrangement: its own extremes
        return ext[0], {"M_max": 0, "M_min": 0, "V_max_abs": 0, "deflection_max_abs": 0}
    i_max = max(range(len(ext)), key=lambda i: ext[i].M_max)
    i_min = min(range(len(ext)), key=lambda i: ext[i].M_min)
    i_v = max(range(len(ext)), key=lambda i: ext[i].V_max_abs)
    i_w = max(range(len(ext)), key=lambda i: ext[i].deflection_max_abs)
    by_region = _worst_by_region(ext)
    e = Extremes(M_max=ext[i_max].M_max, x_M_max=ext[i_max].x_M_max,
                 M_min=ext[i_min].M_min, x_M_min=ext[i_min].x_M_min,
                 V_max_abs=ext[i_v].V_max_abs, x_V_max_abs=ext[i_v].x_V_max_abs,
                 deflection_max_abs=ext[i_w].deflection_max_abs,
                 x_deflection_max=ext[i_w].x_deflection_max,
                 deflection_by_region=by_region)
    return e, {"M_max": i_max, "M_min": i_min, "V_max_abs": i_v, "deflection_max_abs": i_w}


def _worst_by_region(ext: Sequence[Extremes]) -> tuple[tuple[str, float, float], ...]:
    """For every region, the (name, deflection, x) of the extremes whose |deflection|
    there is largest, the first of equals (as ``max`` over ``ext`` finds it): one
    ``argmax`` over the arrangements and regions at once where every value is a finite
    number, else region by region.
    """
    first = ext[0].deflection_by_region
    try:
        w = np.array([[r[1] for r in e.deflection_by_region] for e in ext], dtype=float)
    except ValueError:  # regions of unequal number (not of one member)
        w = np.zeros((0, 0))
    if w.shape != (len(ext), len(first)) or not np.isfinite(w).all():
        out = []
        for r, (name, _, _) in enumerate(first):
            best = max(ext, key=lambda e: abs(e.deflection_by_region[r][1]))
            out.append((name, best.deflection_by_region[r][1], best.deflection_by_region[r][2]))
        return tuple(out)
    worst = np.abs(w).argmax(axis=0).tolist() if first else []
    return tuple((name, ext[k].deflection_by_region[r][1], ext[k].deflection_by_region[r][2])
                 for r, ((name, _, _), k) in enumerate(zip(first, worst, strict=True)))


class _Batch:
    """Solutions waiting for one batched extremes pass."""

    def __init__(self) -> None:
        self.solutions: list[CaseSolution] = []
        self.stiffness: list[float] = []

    def ask(self, sol: CaseSolution, EI: float) -> int:
        self.solutions.append(sol)
        self.stiffness.append(EI)
        return len(self.solutions) - 1


def analyse_beam(prepared: PreparedBeam, section: Section, design: DesignSpec) -> BeamResult:
    """Solve every case and combination of the beam for one section."""
    return analyse_beams(prepared, [section], design)[0]


def analyse_beams(prepared: PreparedBeam, sections: Sequence[Section],
                  design: DesignSpec) -> list[BeamResult]:
    """Solve every case and combination of the beam for each section; the extremes of
    every solution of every section and arrangement come from one batched pass.
    """
    if not prepared.planned:
        raise ProjectError(Problem("beam.combinations", "no combination has a load case "
                                   "that the beam carries"))
    batch = _Batch()
    jobs = [_ask_section(prepared, section, design, batch, defer=True)
            for section in sections]
    ext = extremes_many(prepared.model, batch.solutions, batch.stiffness)
    extra = _Batch()
    for job in jobs:
        _ask_deferred(prepared, job, ext, extra, len(batch.solutions))
    if extra.solutions:
        ext = ext + extremes_many(prepared.model, extra.solutions, extra.stiffness)
    built = batch.solutions + extra.solutions
    return [_finish_section(prepared, section, job, ext, built)
            for section, job in zip(sections, jobs, strict=True)]


#: An index of a solution not yet built (see :func:`_ask_deferred`).
_DEFERRED = -1


def _ask_deferred(prepared: PreparedBeam, job: _Job, ext: Sequence[Extremes], extra: _Batch,
                  offset: int) -> None:
    """Build and ask (in ``extra``, whose indices follow ``offset``) the sustained and
    rest solutions that the result reads of a combination with several arrangements: the
    arrangement governing the total deflection, and the sustained part of those governing
    the moments. The others are never read, so they are not built.
    """
    for ci, idx in enumerate(job.combo_idx):
        if _DEFERRED not in idx["sustained"] and _DEFERRED not in idx["rest"]:
            continue
        _, gov = envelope([ext[i] for i in idx["solution"] if i is not None])
        _, tgov = envelope([ext[i] for i in idx["total"] if i is not None])
        j = tgov["deflection_max_abs"]
        for kind, m in (("sustained", j), ("rest", j), ("sustained", gov["M_max"]),
                        ("sustained", gov["M_min"])):
            if idx[kind][m] == _DEFERRED:
                sol, EI = job.later[(ci, kind, m)]()
                idx[kind][m] = offset + extra.ask(sol, EI)


@dataclass(frozen=True, eq=False)
class _Job:
    """What one section asked of the batch."""

    sw: float
    cases: dict[str, CaseSolution]
    creep_cases: dict[str, CaseSolution]
    factor: float
    creep_section: Section
    case_idx: dict[str, list[int]]
    combo_idx: list[dict[str, list[int | None]]]
    later: dict[tuple[int, str, int], Callable[[], tuple[CaseSolution, float]]]


def _ask_section(prepared: PreparedBeam, section: Section, design: DesignSpec,
                 batch: _Batch, defer: bool = False) -> _Job:
    """Ask the batch for every solution of the section. With ``defer``, the sustained
    and rest parts of a combination with several arrangements are left to be built by
    :func:`_ask_deferred` (marked ``_DEFERRED``), only where the result reads them.
    """
    sw = section.mass_per_length * GRAVITY if prepared.spec.self_weight else 0.0
    cases = prepared.cases_with_self_weight(sw)
    factor = creep_factor(section, design)
    creep_section = with_moduli(section, creep_moduli(section, factor))
    EI, EI_c = section.EI, creep_section.EI
    crept = prepared.creep or prepared
    creep_cases = crept.cases_with_self_weight(sw)
    if prepared.stepped:
        EI = EI_c = 1.0
    case_idx = {c: [batch.ask(s, EI) for s in _build_all(prepared, cases, pl, {c: 1.0})]
                for c, pl in prepared.case_plans.items() if c in cases}
    combo_idx = []
    later: dict[tuple[int, str, int], Callable[[], tuple[CaseSolution, float]]] = {}
    for ci, item in enumerate(prepared.planned):
        f, sus = dict(item.combination.factors), item.sustained
        rest = {c: v - sus.get(c, 0.0) for c, v in f.items()}
        idx: dict[str, list[int | None]] = {"solution": [], "total": [], "sustained": [],
                                            "rest": [], "variable": []}
        lazy = (defer and len(item.plan.masks) > 1 and prepared.parts is not None
                and crept.parts is not None)
        solutions = _build_all(prepared, cases, item.plan, f)
        totals = _total_all(prepared, cases, creep_cases, item.plan, f, sus,
                            section.EI / creep_section.EI)
        for k, m in enumerate(item.plan.masks):
            idx["solution"].append(batch.ask(solutions[k], EI))
            idx["total"].append(batch.ask(totals[k], EI))
            if lazy:
                for kind, parts_of, cs, g, stiff in (
                        ("sustained", crept, creep_cases, sus, EI_c),
                        ("rest", prepared, cases, rest, EI)):
                    if not any(g.values()):
                        idx[kind].append(None)
                        continue
                    idx[kind].append(_DEFERRED)
                    later[(ci, kind, k)] = functools.partial(
                        _built_with, parts_of, cs, item.plan, m, g, stiff)
                continue
            idx["sustained"].append(batch.ask(_build(crept, creep_cases, item.plan, m, sus),
                                              EI_c) if any(sus.values()) else None)
            idx["rest"].append(batch.ask(_build(prepared, cases, item.plan, m, rest), EI)
                               if any(rest.values()) else None)
        if item.variable_plan is not None:
            var = {c: v for c, v in f.items() if c != "D"}
            idx["variable"] = [batch.ask(s, EI)
                               for s in _build_all(prepared, cases, item.variable_plan, var)]
        combo_idx.append(idx)
    return _Job(sw, cases, creep_cases, factor, creep_section, case_idx, combo_idx, later)


def _built_with(prepared: PreparedBeam, cases: Mapping[str, CaseSolution], plan_: Plan,
                mask: tuple[bool, ...], g: Mapping[str, float],
                EI: float) -> tuple[CaseSolution, float]:
    return _build(prepared, cases, plan_, mask, g), EI


def _total_all(prepared: PreparedBeam, cases: Mapping[str, CaseSolution],
               creep_cases: Mapping[str, CaseSolution], plan_: Plan, f: Mapping[str, float],
               sus: Mapping[str, float], ratio: float) -> list[CaseSolution]:
    """:func:`_total` of every arrangement of ``plan_`` (see :func:`_build_all`)."""
    if not prepared.stepped or prepared.creep is None:
        return _build_all(prepared, cases, plan_, {
            c: sus.get(c, 0.0) * ratio + v - sus.get(c, 0.0) for c, v in f.items()})
    rest = {c: v - sus.get(c, 0.0) for c, v in f.items()}
    return [a + b for a, b in zip(_build_all(prepared.creep, creep_cases, plan_, sus),
                                  _build_all(prepared, cases, plan_, rest), strict=True)]


def _total(prepared: PreparedBeam, cases: Mapping[str, CaseSolution],
           creep_cases: Mapping[str, CaseSolution], plan_: Plan, mask: tuple[bool, ...],
           f: Mapping[str, float], sus: Mapping[str, float], ratio: float) -> CaseSolution:
    """The total with creep: the sustained part on the creep section plus the rest. On a
    prismatic member that is the sustained part times EI / EI_creep on the short-term
    section (``ratio``); on a stepped one the sustained part on the creep model.
    """
    if not prepared.stepped or prepared.creep is None:
        return _build(prepared, cases, plan_, mask, {
            c: sus.get(c, 0.0) * ratio + v - sus.get(c, 0.0) for c, v in f.items()})
    rest = {c: v - sus.get(c, 0.0) for c, v in f.items()}
    return (_build(prepared.creep, creep_cases, plan_, mask, sus)
            + _build(prepared, cases, plan_, mask, rest))


def _finish_section(prepared: PreparedBeam, section: Section, job: _Job,
                    ext: list[Extremes], built: Sequence[CaseSolution]) -> BeamResult:
    """The beam result of one section from the extremes of the batch; ``built`` holds
    the batch's solutions, reused where a result is one of them (the solution and the
    total of the first arrangement, the sustained part of the governing ones).
    """
    basis = prepared.basis
    names = prepared.parts.names if prepared.parts is not None else ()
    n_sup = len(prepared.spec.layout.support_positions())
    results = []
    for item, idx in zip(prepared.planned, job.combo_idx, strict=True):
        sol_ext = [ext[i] for i in idx["solution"] if i is not None]
        env, gov = envelope(sol_ext)
        tot_ext = [ext[i] for i in idx["total"] if i is not None]
        total, tgov = envelope(tot_ext)
        j = tgov["deflection_max_abs"]
        sus_i, rest_i = idx["sustained"][j], idx["rest"][j]
        if _DEFERRED in (sus_i, rest_i):  # -1 would read the batch's last extremes
            raise RuntimeError("internal: a beam solution was read before it was built")
        f = dict(item.combination.factors)
        first = built[_index(idx["solution"][0])]
        if prepared.parts is not None:
            base = combine(job.cases, {c: v for c, v in f.items()
                                       if c not in prepared.parts.parts})
            hi, lo = reaction_envelope(base, prepared.parts, item.plan, n_sup)
        elif _carries(job.cases, f):  # the first solution is combine(cases, f) itself
            hi, lo = first.reactions.copy(), first.reactions.copy()
        else:
            hi, lo = _reactions(job.cases, f, n_sup)
        masks = item.plan.masks
        variable = (envelope([ext[i] for i in idx["variable"] if i is not None])[0]
                    if idx["variable"] else None)
        sus = item.sustained
        rest = {c: v - sus.get(c, 0.0) for c, v in f.items()}
        crept = prepared.creep or prepared
        sustained = None
        if any(sus.values()):
            sustained = (built[_index(idx["sustained"][0])]
                         if crept.parts is None and _carries(job.creep_cases, sus)
                         else combine(job.creep_cases, sus))
        rest_solution = None
        if any(rest.values()):
            rest_solution = (built[_index(idx["rest"][0])]
                             if prepared.parts is None and _carries(job.cases, rest)
                             else combine(job.cases, rest))
        m_sus = [moment_at(prepared.model, built[_index(idx["sustained"][gov[k]])], x)
                 if any(sus.values()) else 0.0
                 for k, x in (("M_max", env.x_M_max), ("M_min", env.x_M_min))]
        results.append(CombinationResult(
            combination=item.combination, duration=duration_of(item.combination, basis),
            solution=first, extremes=env,
            sustained_factors=sus, sustained=sustained, rest=rest_solution,
            total=total, total_solution=built[_index(idx["total"][0])],
            long_term=None if sus_i is None else ext[sus_i],
            short_term_rest=None if rest_i is None else ext[rest_i],
            M_governing=env.M_max if abs(env.M_max) >= abs(env.M_min) else env.M_min,
            model=prepared.model, EI=section.EI, EI_creep=job.creep_section.EI,
            reactions_max=hi, reactions_min=lo,
            governing_patterns={
                "M_max": tuple(item.plan.labels(masks[gov["M_max"]], names)),
                "M_min": tuple(item.plan.labels(masks[gov["M_min"]], names)),
                "deflection_max_abs": tuple(item.plan.labels(
                    masks[gov["deflection_max_abs"]], names))},
            patterns_tried=len(masks), variable_only=variable,
            M_sustained_at_max=m_sus[0], M_sustained_at_min=m_sus[1]))
    case_ext = {c: envelope([ext[i] for i in idx])[0] for c, idx in job.case_idx.items()}
    return BeamResult(
        spec=prepared.spec, model=prepared.model, cases=job.cases, case_extremes=case_ext,
        combinations=tuple(results), creep_factor=job.factor, creep_section=job.creep_section,
        self_weight_line=job.sw, basis=basis, EI=section.EI,
        reaction_envelope=_reaction_bounds(prepared, results),
        patterned_cases=tuple(prepared.parts.parts) if prepared.parts is not None else (),
        regions=tuple(n for n, _, _ in prepared.spec.layout.regions()),
        stepped=prepared.stepped)


def _carries(cases: Mapping[str, CaseSolution], g: Mapping[str, float]) -> bool:
    """True where :func:`combine` of ``g`` has a case to add (it is not None)."""
    return any(c in cases and v != 0 for c, v in g.items())


def _index(i: int | None) -> int:
    """A batch index that the job always asks for."""
    if i is None or i == _DEFERRED:  # -1 would read the batch's last solution
        raise RuntimeError("internal: a beam solution was read before it was built")
    return i


def analyse_stepped(prepared: PreparedBeam, section: Section, design: DesignSpec,
                    bounds: Sequence[tuple[float, float]]) -> BeamResult:
    """A stepped member's beam actions for its (whole-member) ``section``, with
    ``segments``: the same actions with every extreme sought within one segment (both
    ends included), in the order of the stepping's bounds.
    """
    if not prepared.planned:
        raise ProjectError(Problem("beam.combinations", "no combination has a load case "
                                   "that the beam carries"))
    batch = _Batch()
    job = _ask_section(prepared, section, design, batch, defer=True)
    model = prepared.model
    spans = [(model.node_index(a), model.node_index(b)) for a, b in bounds]
    found = extremes_within(model, batch.solutions, batch.stiffness, spans)
    # the sustained and rest parts that the whole member and each segment read (each
    # has its own governing arrangements), built once each
    extra = _Batch()
    for ext in found:
        _ask_deferred(prepared, job, ext, extra, len(batch.solutions))
    if extra.solutions:
        more = extremes_within(model, extra.solutions, extra.stiffness, spans)
        found = [a + b for a, b in zip(found, more, strict=True)]
    built = batch.solutions + extra.solutions
    every, *within = found
    whole = _finish_section(prepared, section, job, every, built)
    parts = []
    for (a, b), ext in zip(bounds, within, strict=True):
        parts.append(replace(_finish_section(prepared, section, job, ext, built),
                             bounds=(a, b)))
    return replace(whole, segments=tuple(parts))


def _reactions(cases: Mapping[str, CaseSolution], f: Mapping[str, float],
               n_sup: int) -> tuple[np.ndarray, np.ndarray]:
    sol = combine(cases, f)
    r = np.zeros(n_sup) if sol is None else sol.reactions.copy()
    return r, r.copy()


def _reaction_bounds(prepared: PreparedBeam,
                     results: Sequence[CombinationResult]) -> tuple[ReactionBound, ...]:
    out = []
    strength = [c for c in results if c.combination.for_strength(prepared.basis)] or list(results)
    for k, x in enumerate(prepared.spec.layout.support_positions()):
        top = max(results, key=lambda c: c.reactions_max[k])
        low = min(results, key=lambda c: c.reactions_min[k])
        slow = min(strength, key=lambda c: c.reactions_min[k])
        out.append(ReactionBound(k + 1, x, float(top.reactions_max[k]),
                                 float(low.reactions_min[k]), top.name, low.name,
                                 float(slow.reactions_min[k]), slow.name))
    return tuple(out)
