"""Writing the parts of a project file (quantities as strings that read back exactly)."""

from __future__ import annotations

from collections.abc import Mapping
from typing import TYPE_CHECKING, Any

from ..model.materials import DENSITY_KEYS, NUMBER_KEYS, Existing, Material
from ..model.plies import Ply
from ..model.units import exact_text
from .openings_file import write_holes, write_notches

if TYPE_CHECKING:
    from ..model.member import BeamSpec


def write_materials(materials: Mapping[str, Material], system: str) -> dict[str, Any]:
    """Project materials as file records."""
    out: dict[str, Any] = {}
    for mid, m in materials.items():
        if m.existing is not None:
            out[mid] = _existing_record(m, m.existing)
            continue
        rec: dict[str, Any] = {"kind": m.kind, "name": m.name,
                               "E": exact_text(m.E, "modulus", system),
                               "density": exact_text(m.density, "density", system)}
        for key, v in m.values.items():
            if key in NUMBER_KEYS:
                rec[key] = v
            elif key in DENSITY_KEYS:
                rec[key] = exact_text(v, "density", system)
            else:
                rec[key] = exact_text(v, "stress", system)
        rec["source"] = m.source
        rec["product"] = m.product
        if m.size_adjusted:
            rec["size_adjusted"] = True
        if m.sources:
            rec["sources"] = dict(m.sources)
        if m.notes:
            rec["notes"] = m.notes
        if m.grade_rule:
            rec["grade_rule"] = m.grade_rule
        out[mid] = rec
    return out


def _existing_record(m: Material, existing: Existing) -> dict[str, Any]:
    """An existing-timber record: the assumed grade and condition factor, not the values."""
    rec: dict[str, Any] = {"existing": {"assumed": existing.assumed,
                                        "condition_factor": existing.condition_factor},
                           "name": m.name}
    if m.notes:
        rec["notes"] = m.notes
    return rec


def write_plies(plies: tuple[Ply, ...], system: str) -> list[dict[str, Any]]:
    """Plies as file records."""
    out = []
    for p in plies:
        rec: dict[str, Any] = {
            "name": p.name, "material": p.material,
            "x": exact_text(p.x, "length", system), "y": exact_text(p.y, "length", system),
            "width": exact_text(p.width, "length", system),
            "height": exact_text(p.height, "length", system)}
        if p.start is not None:
            rec["from"] = exact_text(p.start, "span", system)
        if p.end is not None:
            rec["to"] = exact_text(p.end, "span", system)
        if p.stage != "existing":
            rec["stage"] = p.stage
        out.append(rec)
    return out


def write_beam(beam: BeamSpec, system: str) -> dict[str, Any]:
    """The "beam" object."""
    lay = beam.layout
    out: dict[str, Any] = {
        "spans": [exact_text(s, "span", system) for s in lay.spans],
        "supports": lay.supports,
    }
    if lay.overhang_left:
        out["overhang_left"] = exact_text(lay.overhang_left, "span", system)
    if lay.overhang_right:
        out["overhang_right"] = exact_text(lay.overhang_right, "span", system)
    if beam.bearing_length is not None:
        out["bearing_length"] = exact_text(beam.bearing_length, "length", system)
    out["self_weight"] = beam.self_weight
    loads = []
    for ld in beam.loads:
        rec: dict[str, Any] = {"case": ld.case, "type": ld.type}
        kind = {"area": "area_load", "line": "line_load", "point": "force"}[ld.type]
        rec["value"] = exact_text(ld.value, kind, system)
        if ld.tributary_width is not None:
            rec["tributary_width"] = exact_text(ld.tributary_width, "length", system)
        if ld.start is not None:
            rec["from"] = exact_text(ld.start, "span", system)
        if ld.end is not None:
            rec["to"] = exact_text(ld.end, "span", system)
        if ld.at is not None:
            rec["at"] = exact_text(ld.at, "span", system)
        if ld.value_end is not None:
            rec["value_end"] = exact_text(ld.value_end, kind, system)
        if ld.description:
            rec["description"] = ld.description
        if ld.bearing_length is not None:
            rec["bearing_length"] = exact_text(ld.bearing_length, "length", system)
        if ld.stage != "after":
            rec["stage"] = ld.stage
        loads.append(rec)
    out["loads"] = loads
    if beam.combinations is None:
        pass
    elif isinstance(beam.combinations, str):
        out["combinations"] = beam.combinations
    else:
        out["combinations"] = [
            {"name": c.name, "factors": dict(c.factors),
             **({"duration": c.duration} if c.duration else {}),
             **({"kind": c.kind} if c.kind else {})}
            for c in beam.combinations]
    if beam.sustained_live_fraction is not None:
        out["sustained_live_fraction"] = beam.sustained_live_fraction
    if not beam.pattern_live_load:
        out["pattern_live_load"] = False
    if beam.hold_down is not None:
        out["hold_down"] = exact_text(beam.hold_down, "force", system)
    if beam.shored:
        out["shored"] = True
    if beam.notches:
        out["notches"] = write_notches(beam.notches, system)
    if beam.holes:
        out["holes"] = write_holes(beam.holes, system)
    return out
