"""Staged loading: a member strengthened while it carries load.

When some ply is added (``Ply.stage == "added"``) and the member is not shored
(``BeamSpec.shored``), the loads put on before the strengthening (``Load.stage ==
"before"``) and the self-weight of the existing plies act on the existing plies alone;
the loads put on after it and the self-weight of the added plies act on the built-up
section. The beam is linear, so each stage is solved on its own and the stresses and
deflections of the two stages add (superposition). Both stages share one mesh.
"""

from __future__ import annotations

from collections.abc import Mapping, Sequence
from dataclasses import dataclass

from ..model.member import BeamSpec
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

    def stage(self, which: str, factors: Mapping[str, float]) -> CaseSolution:
        """The solution of one stage ("before" or "after") for a set of factors."""
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
