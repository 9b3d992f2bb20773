"""Warnings about the materials of a section that every result must carry: existing
timber of unknown grade (verify on site), and glulam whose Fbx- is lower than Fbx+ where
the member has negative moment (the US bending check uses Fb for both signs).
"""

from __future__ import annotations

from ..actions.analysis import BeamResult
from ..model.errors import Problem
from ..model.materials import VERIFY_ON_SITE
from ..model.units import fmt
from ..section.transformed import Section


def material_warnings(section: Section, beam: BeamResult | None, system: str) -> list[Problem]:
    """Named warnings about the section's materials (each material or ply once)."""
    out = []
    seen: set[str] = set()
    for m in section.materials:
        if m.existing is not None and m.id not in seen:
            seen.add(m.id)
            out.append(Problem(f"materials.{m.id}", f"existing timber of unknown grade, taken "
                               f"as {m.existing.assumed} with condition factor "
                               f"{m.existing.condition_factor:g} (the user's judgement): "
                               f"{VERIFY_ON_SITE}"))
    if beam is None or beam.basis != "US" or not _negative_moment(beam):
        return out
    for i, (ply, m) in enumerate(zip(section.plies, section.materials, strict=True)):
        fb, fb_neg = m.value("Fb"), m.value("Fb_neg")
        if fb is not None and fb_neg is not None and fb_neg < fb:
            out.append(Problem(f"plies[{i}].material", f'"{m.id}" ({ply.name}) has Fbx- = '
                               f"{fmt(fb_neg, 'stress', system)}, lower than Fbx+ = "
                               f"{fmt(fb, 'stress', system)}, and the member has negative "
                               "moment: the bending check uses Fb for both signs; check the "
                               "negative moment against Fbx- by hand or use a balanced layup"))
    return out


def _negative_moment(beam: BeamResult) -> bool:
    scale = max((max(abs(c.extremes.M_max), abs(c.extremes.M_min))
                 for c in beam.combinations), default=0.0)
    return any(c.extremes.M_min < -1e-6 * scale for c in beam.combinations)
