"""The plate's share of the loads its bolts pass on, by hand.

EU (EN 1995-1-1 2.3.2.2, from memory): the timbers creep and the plate does not, so at ULS
the plate's share is the larger of alpha at once and alpha on the final section (timber
E_mean / (1 + psi2 k_def)), for the whole combination, as the plate's own stresses take
it. US: alpha at once (common practice; NDS 2018 has no rule for the redistribution by
creep in a connection). alpha = E_s I_s / (E_w I_w + E_s I_s) of a flitch whose plies
share one neutral axis (common practice); reactions of a simple span by statics. Sections
and loads as in test_load_transfer.py (US) and test_eu_final_moduli.py (EU).
"""

from __future__ import annotations

import pytest

from plystack.core.io.project_file import from_dict
from plystack.core.pipeline import run
from tests.validation.test_eu_final_moduli import flitch as eu_flitch
from tests.validation.test_load_transfer import ALPHA, LBF, flitch


def _transfers(a, combination):
    return sorted((c for c in a.checks if c.id == "load-transfer"
                   and c.combination == combination), key=lambda c: c.x)


def test_us_transfers_take_the_share_at_once():
    """D + L on 12 ft: R1 = 312 x 6 + 300 x 8 / 12 = 2072 lbf, R2 = 1872 + 100 = 1972 lbf;
    the 300 lbf post at 4 ft."""
    a = run(from_dict(flitch()))
    r1, post, r2 = _transfers(a, "D + L")
    for c, R in ((r1, 2072.0), (r2, 1972.0), (post, 300.0)):
        assert c.demand / LBF == pytest.approx(ALPHA * R, rel=1e-9)


E_T, E_P = 11_000e6, 210_000e6
I_T, I_P = 2 * 0.045 * 0.220**3 / 12, 0.010 * 0.200**3 / 12


@pytest.mark.parametrize(("g", "q", "psi2"), [(0.5, 3.0, 0.3), (6.0, 1.0, 1.0)])
def test_eu_the_whole_combination_takes_the_final_share(g, q, psi2):
    """ULS 1.35 G + 1.5 Q on 4 m: R = (1.35 g + 1.5 q) x 2 m; alpha on the final section
    with psi2 of the governing action (test_eu_final_moduli.py), k_def 0.6."""
    a = run(from_dict(eu_flitch(f"{g} kN/m", f"{q} kN/m")))
    R = (1.35 * g + 1.5 * q) * 1e3 * 2.0
    fin = E_P * I_P / (E_T / (1 + psi2 * 0.6) * I_T + E_P * I_P)
    at_once = E_P * I_P / (E_T * I_T + E_P * I_P)
    assert fin > at_once
    c = _transfers(a, "ULS 1.35G + 1.5Q[L]")[0]
    assert c.demand == pytest.approx(fin * R, rel=1e-9)
