"""EN 1990 combination sets, from memory of EN 1990:2002 6.4.3.2 (6.10), (6.10a/b),
A1.3.1 and Table A1.2(B): gamma_G,sup 1.35, gamma_G,inf 1.0, gamma_Q 1.5, xi 0.85; psi0
of Table A1.1: domestic imposed 0.7, snow (below 1000 m) 0.5, wind 0.6. Load-duration
classes for k_mod: EN 1995-1-1 2.3.1.2 and Table 3.1 (from memory).
"""

from __future__ import annotations

import pytest

from plystack.core.actions.combinations import en1990_combinations
from plystack.core.codes import en1995
from plystack.core.model.combination import EU_CASE_DURATION, EU_DURATIONS, duration_of


def factor_sets(combos, kind):
    return [{c: round(f, 12) for c, f in x.factors.items() if f} for x in combos
            if x.kind == kind]


def test_uls_set_holds_the_leading_action_alone_and_with_accompanying_ones():
    uls = factor_sets(en1990_combinations({"D", "L", "S", "W"}), "ULS")
    assert {"D": 1.35, "L": 1.5} in uls
    assert {"D": 1.35, "L": 1.5, "S": 0.75} in uls          # 1.5 x psi0 0.5
    assert {"D": 1.35, "L": 1.5, "S": 0.75, "W": 0.9} in uls  # 1.5 x 0.6
    assert {"D": 1.0, "W": 1.5} in uls                     # G favourable (uplift)
    assert {"D": 1.35} in uls and {"D": 1.0} in uls
    assert {"D": 1.35, "S": 1.5, "L": 1.05} in uls          # 1.5 x psi0 0.7


def test_610ab_gives_the_xi_reduced_pair():
    uls = factor_sets(en1990_combinations({"D", "L"}, expression="6.10a/b"), "ULS")
    assert {"D": 1.35, "L": 1.05} in uls                   # 6.10a: psi0 Q
    assert {"D": round(0.85 * 1.35, 12), "L": 1.5} in uls  # 6.10b: xi gamma_G
    assert {"D": 1.35, "L": 1.5} not in uls


def test_sls_sets():
    combos = en1990_combinations({"D", "L", "S"})
    assert {"D": 1.0, "L": 1.0, "S": 0.5} in factor_sets(combos, "SLS-characteristic")
    assert {"D": 1.0, "L": 1.0} in factor_sets(combos, "SLS-characteristic")
    assert {"D": 1.0, "L": 0.5} in factor_sets(combos, "SLS-frequent")       # psi1 L
    assert {"D": 1.0, "L": 0.3} in factor_sets(combos, "SLS-quasi-permanent")  # psi2 L


@pytest.mark.parametrize("service_class", [1, 2, 3])
def test_k_mod_follows_the_shortest_action(service_class):
    for combo in en1990_combinations({"D", "L", "S", "W"}):
        shortest = max((EU_CASE_DURATION[c] for c in combo.cases()), key=EU_DURATIONS.index)
        if combo.duration:
            continue
        assert duration_of(combo, "EU") == shortest
        assert en1995.k_mod(duration_of(combo, "EU"), service_class) == en1995.k_mod(
            shortest, service_class)


def test_wind_leading_combination_gets_instantaneous_k_mod_only_with_wind():
    combos = en1990_combinations({"D", "L", "W"})
    alone = next(c for c in combos if dict(c.factors) == {"D": 1.35, "L": 1.5})
    assert duration_of(alone, "EU") == "medium-term"
    assert en1995.k_mod("medium-term", 1) == 0.8  # Table 3.1, solid timber, class 1
