"""Bending on the net section where a through-bolt crosses more plies than the plate's
joint: a doubled 2x10 joist with a 1/4 x 9 in steel plate on each face (an invented test
member), bolted through all four plies.

Hand calculation (NDS 2018 3.1.2 net section, AISC 360-16 B4.3; from memory): the
section is symmetric about y = 4.625 in, the two bolt rows at 4.625 -/+ 1.625 in, so the
net neutral axis stays at 4.625 in and the loss of section modulus of every ply is
EI_gross / EI_net. Each hole (D + 1/16 = 0.6875 in high) takes b (d^3 / 12 + d e^2) of
each ply it crosses: both joists and both plates, not only one plate and its joist.
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run

E_W = 1.6e6  # DFL No.2, psi (NDS Supplement Table 4A, from memory)
E_S = 29e6  # A36, psi (AISC 360-16, from memory)


def doubled_joist_plies(plate_stage: str = "existing") -> list[dict[str, str]]:
    """Two 2x10 DFL No.2 joists side by side with a 1/4 x 9 in A36 plate on each face."""
    joist = {"y": "0 in", "height": "9.25 in", "material": "DFL-No2", "width": "1.5 in"}
    plate = {"y": "0.125 in", "height": "9 in", "material": "A36", "width": "0.25 in",
             "stage": plate_stage}
    return [{**plate, "name": "plate A", "x": "0 in"},
            {**joist, "name": "joist A", "x": "0.25 in"},
            {**joist, "name": "joist B", "x": "1.75 in"},
            {**plate, "name": "plate B", "x": "3.25 in"}]


def _project():
    return from_dict({
        "format": "plystack", "version": 1, "title": "through bolts", "display_units": "US",
        "plies": doubled_joist_plies(),
        "beam": {"spans": ["10 ft"], "supports": "simple", "self_weight": False,
                 "loads": [{"case": "D", "type": "line", "value": "100 plf"},
                           {"case": "L", "type": "line", "value": "200 plf"}],
                 "combinations": "ASD"},
        "design": {"basis": "US-ASD", "steel_bears": True,
                   "bolt": {"diameter": "0.625 in",
                            "stations": ["6 in", "30 in", "60 in", "90 in", "114 in"],
                            "rows": ["3 in", "6.25 in"]}}})


def _loss(E_w: float) -> float:
    d, e = 0.6875, 1.625
    EI = 2 * E_w * 1.5 * 9.25**3 / 12 + 2 * E_S * 0.25 * 9**3 / 12
    holes = 2 * (2 * E_w * 1.5 + 2 * E_S * 0.25) * (d**3 / 12 + d * e**2)
    return EI / (EI - holes)


def _expected_loss(ply: str) -> float:
    """A joist's gross demand is at once (its stress is largest before the timber creeps
    and sheds load to the steel): the section at once. A plate's demand grows with creep
    (timber E / K_cr, K_cr = 1.5 for seasoned lumber, NDS 2018 3.5.2, from memory): the
    larger of the section at once and with creep, here with creep (a hole takes a larger
    part of a 9 in plate than of a 9.25 in joist, and creep weights the plates more).
    """
    if ply.startswith("joist"):
        return _loss(E_W)
    return max(_loss(E_W), _loss(E_W / 1.5))


@pytest.mark.parametrize("ply", ["plate A", "joist A", "joist B", "plate B"])
def test_the_holes_of_a_through_bolt_come_out_of_every_ply(ply):
    a = run(_project())
    for combo in ("D", "D + L"):
        gross = next(c for c in a.checks if c.id == "bending" and c.ply == ply
                     and c.combination == combo)
        net = [c for c in a.checks if c.id == "bending-net" and c.ply == ply
               and c.combination == combo]
        assert net
        for c in net:  # each plate's layout gives the same holes
            assert c.demand / gross.demand == pytest.approx(_expected_loss(ply), rel=1e-12)
