"""Warnings about the materials of a section that every result must carry: existing
timber of unknown grade (verify on site). Glulam Fbx- is used by the bending checks of
hogging moment (core.design.us_timber), so it needs no warning here.
"""

from __future__ import annotations

from ..actions.analysis import BeamResult
from ..model.errors import Problem
from ..model.materials import VERIFY_ON_SITE
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
    del beam, system  # glulam Fbx- is used by the bending checks themselves
    return out


