"""The connector check of stacked plies whose fasteners slip (EN 1995-1-1 Annex B, from
memory): the load per fastener F_i = gamma_i E_i A_i a_i s_i V / (EI)_ef (B.10) with K_u,
under the largest strength-combination shear, against the user's connector value
(allowable for US, design value for EU). On the US basis Annex B is used as a published
method for the slip; the capacity is the user's NDS lateral value.
"""

from __future__ import annotations

from typing import Any

from ..actions.analysis import BeamResult
from ..model.design import DesignSpec
from ..model.errors import MissingCheck, Problem
from ..model.units import fmt
from ..section.gamma import PartialSection
from ..section.transformed import Section
from .check import Check, Fasteners


def carries_axial(section: Section, i: int) -> bool:
    """True where ply i of a section that slips carries an axial force with its bending
    (gamma_i a_i not zero, EN 1995-1-1 Annex B (B.7)), so that the combined checks (NDS
    2018 3.9.1 / 3.9.2, EN 1995-1-1 6.2.3 / 6.2.4) apply to it even where it holds the
    neutral axis (the web of a T); False for any other section.
    """
    if not isinstance(section, PartialSection):
        return False
    offset = float(section.gamma_uls[i]) * abs(float(section.centroid[i])
                                               - section.neutral_axis_y)
    return offset > 1e-9 * section.depth


def connector_check(plies: str, combination: str, demand: float, allowable: float,
                    **rest: Any) -> Check:
    """A ``connectors`` check: the force on one fastener against the user's allowable
    value per fastener (already adjusted), with no further factors; ``rest``: sources,
    equation, location, fasteners, x and notes.
    """
    return Check(id="connectors", ply=plies, combination=combination, demand=demand,
                 capacity=allowable, quantity="force",
                 reference=("allowable per connector", allowable), factors={},
                 partial_factors={}, **rest)


def slip_connector_checks(section: PartialSection, beam: BeamResult, design: DesignSpec,
                          system: str, warnings: list[Problem]) -> list[Check]:
    """One "connectors" check per flange of the partial section."""
    conn = design.connector
    combos = list(beam.strength()) or list(beam.combinations)
    worst = max(combos, key=lambda c: c.extremes.V_max_abs)
    V = worst.extremes.V_max_abs
    out = []
    for joint in section.joints:
        f = joint.flange
        F = section.fastener_force(joint, V)
        other = section.plies[section.web].name
        names = f"{section.plies[f].name} / {other}"
        y = (float(section.y_bottom[f]) if section.y_bottom[f] >= section.y_top[section.web]
             - 1e-12 else float(section.y_top[f]))
        if conn.allowable is None:
            warnings.append(MissingCheck("design.connector.allowable", "not given: each "
                                         f"{conn.type} between {names} carries "
                                         f"{fmt(F, 'force', system)} at the largest shear "
                                         "(EN 1995-1-1 Annex B); give the connector's "
                                         "allowable load to check it"))
            continue
        basis = ("design value" if not design.us else "allowable")
        out.append(connector_check(
            names, worst.name, F, conn.allowable,
            sources={"allowable per connector": f"the user's connector {basis} (already "
                     "adjusted)",
                     "F_i": "EN 1995-1-1 Annex B (B.10), K_u of 7.1(4), K_ser of Table 7.1 "
                     "(from memory)"},
            equation="F_i = gamma_i E_i A_i a_i s_i V / (EI)_ef <= allowable",
            location=f"one {conn.type} every "
            f"{fmt(conn.spacing_max or conn.spacing or 0.0, 'length', system, 3)} "
            f"({conn.rows} per row) along the region of highest shear",
            fasteners=Fasteners(rows=conn.rows, spacing=conn.spacing),
            x=y,
            notes=(f"gamma = {float(section.gamma_uls[f]):.4g} with K_u = "
                   f"{joint.K_u / 1e3:.5g} N/mm (K_ser = {joint.K_ser / joint.creep / 1e3:.5g}"
                   f" N/mm), s_i = {joint.spacing * 1e3:.4g} mm, l = "
                   f"{section.length:.4g} m; (EI)_ef = {section.EI_uls:.5g} N m^2; "
                   f"|V| = {V:.1f} N; the load is taken at the largest spacing "
                   f"({joint.force_spacing * 1e3:.4g} mm per fastener).",)))
    return out
