"""Staged loading: a member strengthened while it carries load.

When some ply is added (``Ply.stage == "added"``) and the member is not shored
(``BeamSpec.shored``), the loads put on before the strengthening (``Load.stage ==
"before"``) and the self-weight of the existing plies act on the existing plies alone;
the loads put on after it and the self-weight of the added plies act on the built-up
section. The beam is linear, so each stage is solved on its own and the stresses and
deflections of the two stages add (superposition). Both stages share one mesh.

On a member whose plies stop short of its ends (a stepped member) each stage is solved on
its own stepped stiffness, the before-stage on the EI of the existing plies of every
segment, the after-stage on the EI of every ply there (statically indeterminate members
redistribute each stage by its own stiffness), and once more on the crept EI of each for
the sustained part; the self-weight of each stage is the weight of its plies segment by
segment. Those solutions are in true units (read with EI = 1) and share the mesh, whose
nodes are the same for every stage (the steps are the same), so they add element by
element.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass, field

from ..model.member import BeamSpec, Load
from ..model.plies import Ply
from .beam import BeamModel, CaseSolution, combine


def is_staged(plies: Sequence[Ply], spec: BeamSpec | None) -> bool:
    """True where the stages differ: some ply is added and the member is not shored."""
    return (spec is not None and not spec.shored
            and any(p.stage == "added" for p in plies)
            and any(p.stage == "existing" for p in plies))


@dataclass(frozen=True, eq=False)
class StageSolutions:
    """Each load case solved separately for the two stages (EI = 1, same mesh).

    Attributes:
        model: the mesh.
        before: per case, the before-loads (and the existing plies' self-weight in D).
        after: per case, the after-loads (and the added plies' self-weight in D).

    """

    model: BeamModel
    before: Mapping[str, CaseSolution]
    after: Mapping[str, CaseSolution]
    before_creep: Mapping[str, CaseSolution] = field(default_factory=dict)
    after_creep: Mapping[str, CaseSolution] = field(default_factory=dict)

    @property
    def stepped(self) -> bool:
        """True where each stage was solved on its stepped stiffness (true units)."""
        return bool(self.after_creep)

    def stage(self, which: str, factors: Mapping[str, float],
              crept: bool = False) -> CaseSolution:
        """The solution of one stage ("before" or "after") for a set of factors; with
        ``crept`` on the stage's crept stepped stiffness (stepped members only).
        """
        if crept:
            cases = self.before_creep if which == "before" else self.after_creep
        else:
            cases = self.before if which == "before" else self.after
        sol = combine(cases, factors)
        if sol is None:
            return next(iter(self.after.values())).scaled(0.0)
        return sol


def stage_solutions(spec: BeamSpec, existing_weight: float,
                    added_weight: float) -> StageSolutions:
    """Solve every case of both stages; the weights are N/m (zero when not counted)."""
    model = BeamModel(spec.layout, spec.loads)
    cases = sorted({ld.case for ld in spec.loads} | {"D"})
    out = {}
    for stage, weight in (("before", existing_weight), ("after", added_weight)):
        out[stage] = {c: model.solve([ld for ld in spec.loads
                                      if ld.case == c and ld.stage == stage],
                                     extra_line=weight if c == "D" else 0.0)
                      for c in cases}
    return StageSolutions(model, out["before"], out["after"])


@dataclass(frozen=True)
class StageStiffness:
    """The stepped stiffness of both stages of a stepped member (see the module text).

    Attributes:
        bounds: (from, to) of every segment, m.
        before: EI of the existing plies of each segment, N m^2.
        after: EI of every ply of each segment, N m^2.
        before_creep: the same with the timber moduli divided by the creep factor.
        after_creep: the same for the after-stage.
        before_weight: self-weight of the existing plies of each segment, N/m.
        after_weight: self-weight of the added plies of each segment, N/m.

    """

    bounds: tuple[tuple[float, float], ...]
    before: tuple[float, ...]
    after: tuple[float, ...]
    before_creep: tuple[float, ...]
    after_creep: tuple[float, ...]
    before_weight: tuple[float, ...]
    after_weight: tuple[float, ...]


def stepped_stage_solutions(spec: BeamSpec, stiffness: StageStiffness) -> StageSolutions:
    """Solve every case of both stages, each on its own stepped stiffness (and crept)."""
    cases = sorted({ld.case for ld in spec.loads} | {"D"})
    b = stiffness.bounds
    out: dict[str, dict[str, CaseSolution]] = {}
    model = None
    for name, EI, weights, stage in (
            ("before", stiffness.before, stiffness.before_weight, "before"),
            ("before_creep", stiffness.before_creep, stiffness.before_weight, "before"),
            ("after", stiffness.after, stiffness.after_weight, "after"),
            ("after_creep", stiffness.after_creep, stiffness.after_weight, "after")):
        m = BeamModel(spec.layout, spec.loads,
                      steps=[(lo, hi, e) for (lo, hi), e in zip(b, EI, strict=True)])
        weight = [Load("D", "line", w, start=lo, end=hi, stage=stage)
                  for (lo, hi), w in zip(b, weights, strict=True) if w]
        out[name] = {c: m.solve([ld for ld in spec.loads if ld.case == c and ld.stage == stage]
                                + (weight if c == "D" else []))
                     for c in cases}
        if name == "after":
            model = m
    assert model is not None
    return StageSolutions(model, out["before"], out["after"], out["before_creep"],
                          out["after_creep"])
