"""Transformed-section results against sectionproperties, a general-purpose finite
element cross-section library that takes materials with their own elastic moduli.

Source: sectionproperties (PyPI), E-weighted area (get_ea), centroid (get_c) and
E-weighted second moment about the centroid (get_eic). Tolerance 0.1 % (the issue's).
"""

from __future__ import annotations

import pytest
from sectionproperties.analysis.section import Section as FESection
from sectionproperties.pre.geometry import CompoundGeometry, Geometry
from sectionproperties.pre.pre import Material as FEMaterial

from plystack.core.section.geometry import clip_plies
from plystack.core.section.transformed import analyse
from tests.helpers import IN, rect, steel, timber

MATS = {"w": timber("w", 11.0e9), "w2": timber("w2", 8.0e9), "s": steel("s", 200e9)}


def _fe(plies):
    fe_mats = {k: FEMaterial(k, m.E, 0.3, 1.0, 1.0, "k") for k, m in MATS.items()}
    geoms = []
    for ply, g in zip(plies, clip_plies(plies), strict=True):
        polys = getattr(g, "geoms", [g])
        for poly in polys:
            if poly.area > 0:
                geoms.append(Geometry(poly, material=fe_mats[ply.material]))
    geom = CompoundGeometry(geoms)
    geom.create_mesh(mesh_sizes=[0])
    sec = FESection(geom)
    sec.calculate_geometric_properties()
    return sec.get_ea(), sec.get_c()[1], sec.get_eic()[0]


SECTIONS = {
    "flitch, timber-plate-timber": [
        rect("L", "w", 0, 0, 1.5 * IN, 9.25 * IN),
        rect("P", "s", 1.5 * IN, 0.25 * IN, 0.375 * IN, 8.75 * IN),
        rect("R", "w", 1.875 * IN, 0, 1.5 * IN, 9.25 * IN)],
    "three timbers, two plates": [
        rect("T1", "w", 0, 0, 1.5 * IN, 11.25 * IN),
        rect("P1", "s", 1.5 * IN, 0.5 * IN, 0.25 * IN, 10.5 * IN),
        rect("T2", "w", 1.75 * IN, 0, 1.5 * IN, 11.25 * IN),
        rect("P2", "s", 3.25 * IN, 0.5 * IN, 0.25 * IN, 10.5 * IN),
        rect("T3", "w", 3.5 * IN, 0, 1.5 * IN, 11.25 * IN)],
    "cover-plated joist (bottom plate)": [
        rect("J", "w", 0, 0, 1.5 * IN, 9.25 * IN),
        rect("B", "s", 0, -0.25 * IN, 1.5 * IN, 0.25 * IN)],
    "top and bottom plates, mixed timbers": [
        rect("J1", "w", 0, 0, 1.5 * IN, 7.25 * IN),
        rect("J2", "w2", 1.5 * IN, 0, 1.5 * IN, 7.25 * IN),
        rect("T", "s", 0, 7.25 * IN, 3.0 * IN, 0.375 * IN),
        rect("B", "s", 0.5 * IN, -0.25 * IN, 2.0 * IN, 0.25 * IN)],
    "plate let into a timber (clipped, with a hole)": [
        rect("beam", "w", 0, 0, 0.09, 0.3),
        rect("plate", "s", 0.04, 0.05, 0.01, 0.2)],
    "overlapping plies, notch cut by a later ply": [
        rect("timber", "w", 0, 0, 0.1, 0.2),
        rect("angle leg", "s", 0.06, 0.15, 0.06, 0.01),
        rect("side", "w2", 0.1, 0.0, 0.05, 0.16)],
}


@pytest.mark.parametrize("name", list(SECTIONS))
def test_against_sectionproperties(name):
    plies = SECTIONS[name]
    ours = analyse(plies, MATS)
    ea, yc, ei = _fe(plies)
    assert ours.EA == pytest.approx(ea, rel=1e-3)
    assert ours.neutral_axis_y == pytest.approx(yc, rel=1e-3, abs=1e-6)
    assert ours.EI == pytest.approx(ei, rel=1e-3)
