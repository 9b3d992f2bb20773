"""The final moduli of a ULS combination, EN 1995-1-1 2.3.2.2(2) (from memory): E_mean,fin
= E_mean / (1 + psi2 k_def), psi2 of the action causing the largest stress in relation to
the strength, replaced by 1 where that action is permanent.

Worked by hand on an invented flitch: two C24 45 x 220 mm timbers (E_mean 11,000 MPa, EN
338 Table 1, from memory) either side of a 10 x 200 mm S275 plate (E 210,000 MPa, EN
1993-1-1 3.2.6) centred on them, a 4 m simple span, line loads G and Q (category A: psi2
0.3, EN 1990 Table A1.1), no self-weight; service class 1: k_def 0.6 (EN 1995-1-1 Table
3.2), k_mod 0.6 permanent and 0.8 medium-term (Table 3.1). ULS 1.35 G + 1.5 Q (EN 1990
6.10): M = (1.35 g + 1.5 q) L^2 / 8 at mid-span. The action "causing the largest stress in
relation to the strength": its own design moment over k_mod of its own duration (the
strength that stress is related to).
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_splitting import _eu

E_T, E_S = 11_000e6, 210_000e6


def flitch(g: str, q: str) -> dict:
    """The EU flitch of test_splitting.py with line loads g (G) and q (Q), its bolt
    stations left to the program, EN 1990 (6.10)."""
    data = _eu(None)
    data["beam"]["loads"] = [{"case": "D", "type": "line", "value": g},
                             {"case": "L", "type": "line", "value": q}]
    del data["design"]["bolt"]["stations"]
    data["design"]["en1990_expression"] = "6.10"
    return data


def plate_stress(g: float, q: float, psi2: float) -> float:
    """sigma = E_s M c / EI_fin, c = 100 mm (the plate's top edge above the common
    neutral axis at 110 mm)."""
    M = (1.35 * g + 1.5 * q) * 4.0**2 / 8
    EI = 2 * E_T / (1 + psi2 * 0.6) * 0.045 * 0.220**3 / 12 + E_S * 0.010 * 0.200**3 / 12
    return E_S * M * 0.100 / EI


@pytest.mark.parametrize(("g", "q", "psi2"), [
    # G governs: 1.35 x 6 / 0.6 = 13.5 against 1.5 x 1 / 0.8 = 1.9: psi2 -> 1
    (6.0, 1.0, 1.0),
    # Q governs: 1.35 x 0.5 / 0.6 = 1.1 against 1.5 x 3 / 0.8 = 5.6: psi2 of Q, 0.3
    (0.5, 3.0, 0.3),
    # Q's design moment the larger (1.35 x 2 = 2.7 < 1.5 x 2 = 3.0), but in relation to
    # the strength G's (2.7 / 0.6 = 4.5 > 3.0 / 0.8 = 3.75): psi2 -> 1
    (2.0, 2.0, 1.0),
])
def test_the_plate_after_creep_takes_psi2_of_the_action_that_governs(g, q, psi2):
    a = run(from_dict(flitch(f"{g} kN/m", f"{q} kN/m")))
    c = next(c for c in a.checks if c.id == "bending" and c.ply == "P"
             and c.combination == "ULS 1.35G + 1.5Q[L]")
    assert c.demand == pytest.approx(plate_stress(g * 1e3, q * 1e3, psi2), rel=1e-12)
