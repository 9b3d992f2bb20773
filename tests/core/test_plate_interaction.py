"""AISC 360-16 H2-1 (from memory) for a steel plate off the neutral axis under the
``AISC-F11`` rule: |f_ra| / F_ca + f_rb / F_cb <= 1.0, F_ca = F_y / 1.67 in tension
(D2(a)), F_cr / 1.67 in compression (E3), F_cb = 1.5 F_y / 1.67 for a plate lying flat
(F11-1, minor axis). A flat plate is mostly in axial tension or compression, so the
extreme-fibre stress against 1.5 F_y / 1.67 alone would overstate its strength.

Hand calculation (beam theory, the section by its own formulas): a 3.5 x 0.25 in A36
plate under (or over) a 3.5 x 11.875 in LVL 2.0E of the library, simply supported over
22 ft, a live load of 55 psf over 7.2 ft (no self-weight, no dead load, so no creep
part), M = w L^2/8.
"""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest

from plystack.core.io.project_file import load
from plystack.core.model.constants import INCH
from plystack.core.model.member import Load
from plystack.core.model.plies import Ply
from plystack.core.model.project import Project
from plystack.core.pipeline import run

DEMOS = Path(__file__).resolve().parents[2] / "assets" / "demo"
FT = 0.3048
PSF = 47.88025898033584  # lbf/ft^2 in Pa
T, B, H = 0.25 * INCH, 3.5 * INCH, 11.875 * INCH


def _project(plate_on_top: bool, rule: str = "AISC-F11") -> Project:
    p = load(DEMOS / "porch-header.plystack.json")
    plate_y, beam_y = (H, 0.0) if plate_on_top else (0.0, T)
    plies = (Ply("plate", "A36", 0.0, plate_y, B, T),
             Ply("beam", "LVL-2.0E", 0.0, beam_y, B, H))
    beam = p.beam
    assert beam is not None
    beam = replace(beam, self_weight=False, loads=(Load("L", "area", 55 * PSF, 7.2 * FT),),
                   layout=replace(beam.layout, spans=(22 * FT,)))
    return replace(p.with_plies(plies), beam=beam,
                   design=replace(p.design_or_default(), steel_rule=rule))


def _hand(p: Project, plate_on_top: bool) -> tuple[float, float]:
    """(f_ra, f_rb) of the plate at midspan: signed centroid stress and own bending."""
    mats = p.all_materials()
    Es, Et = mats["A36"].E, mats["LVL-2.0E"].E
    yc_p, yc_t = (H + T / 2, H / 2) if plate_on_top else (T / 2, T + H / 2)
    EA = Es * B * T + Et * B * H
    y_na = (Es * B * T * yc_p + Et * B * H * yc_t) / EA
    EI = (Es * (B * T ** 3 / 12 + B * T * (yc_p - y_na) ** 2)
          + Et * (B * H ** 3 / 12 + B * H * (yc_t - y_na) ** 2))
    L = 22 * FT
    M = 55 * PSF * 7.2 * FT * L ** 2 / 8  # sagging
    f_a = -M * (yc_p - y_na) * Es / EI  # tension positive
    f_b = M * (T / 2) * Es / EI
    return f_a, f_b


@pytest.mark.parametrize("plate_on_top", [False, True])
def test_a_flat_plate_takes_the_interaction(plate_on_top: bool) -> None:
    p = _project(plate_on_top)
    a = run(p)
    f_a, f_b = _hand(p, plate_on_top)
    Fy = p.all_materials()["A36"].value("Fy")
    assert Fy is not None
    if plate_on_top:  # compression, buckling between the screws (L_c their spacing)
        assert f_a < 0
        spacing = p.design_or_default().connector.spacing
        L_c = spacing if spacing is not None else p.design_or_default().bolt.spacing
        L_c = L_c if L_c is not None else 24 * INCH
        Fe = math.pi ** 2 * p.all_materials()["A36"].E / (L_c / (T / math.sqrt(12))) ** 2
        Fcr = 0.658 ** (Fy / Fe) * Fy if Fy / Fe <= 2.25 else 0.877 * Fe
        F_ca, cid = Fcr / 1.67, "compression-bending"
    else:
        assert f_a > 0
        F_ca, cid = Fy / 1.67, "tension-bending"
    expected = abs(f_a) / F_ca + f_b / (1.5 * Fy / 1.67)
    checks = [c for c in a.checks if c.id == cid and c.ply == "plate"]
    assert len(checks) == 1
    assert checks[0].demand == pytest.approx(expected, rel=1e-12)
    assert checks[0].capacity == 1.0
    # the extreme-fibre bending check alone passes where the interaction does not
    bending = next(c for c in a.checks if c.id == "bending" and c.ply == "plate")
    assert bending.demand == pytest.approx(abs(f_a) + f_b, rel=1e-12)
    if not plate_on_top:
        assert bending.ratio < 1.0 < checks[0].ratio
        assert a.verdict == "NOT OK"


def test_the_traditional_rule_is_unchanged() -> None:
    """0.6 F_y on the extreme fibre is already the linear interaction at 0.6 F_y."""
    a = run(_project(False, "0.6Fy"))
    assert not [c for c in a.checks if c.id.endswith("-bending") and c.ply == "plate"]


def test_a_centred_flitch_plate_has_no_interaction() -> None:
    p = load(DEMOS / "porch-header.plystack.json")
    p = replace(p, design=replace(p.design_or_default(), steel_rule="AISC-F11"))
    a = run(p)
    assert not [c for c in a.checks if c.id.endswith("-bending") and c.ply == "flitch plate"]
