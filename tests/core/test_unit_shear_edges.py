"""The largest shear stress of each ply of a stacked section. A cut exactly at an
interface is shared by the plies on both sides, which split between them the part of the
plies wholly beyond the cut; a ply's own value there is taken just inside its edge. Before,
a ply with another wholly beyond it (the middle one of three, a thin ply between two
others) got only the shared value or an even cut inside it (48 times too little in one
case). Hand calculation: tau = V n Q / (I_t b), the transformed-section shear formula
(common practice). The first tests held before as well; they guard the plain cases.
"""

from __future__ import annotations

import math
from pathlib import Path

import pytest

from plystack.core.design.common import unit_shear_stress
from plystack.core.io.project_file import load
from plystack.core.model.plies import Ply
from plystack.core.section.transformed import analyse

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo" / "porch-header.plystack.json"


@pytest.mark.parametrize("t_plate", [0.00635, 0.0127, 0.025])
def test_plate_under_a_timber_takes_its_value_at_the_interface(t_plate):
    mats = load(DEMO).all_materials()
    b, h = 0.0889, 0.2286
    plies = [Ply("plate", "A36", 0.0, 0.0, b, t_plate),
             Ply("timber", "DFL-No2", 0.0, t_plate, b, h)]
    s = analyse(plies, mats, "DFL-No2")
    n_p = mats["A36"].E / mats["DFL-No2"].E
    A_p = b * t_plate
    y_c = t_plate / 2
    # neutral axis and I of the transformed section, by hand
    EA = n_p * A_p + b * h
    y_na = (n_p * A_p * y_c + b * h * (t_plate + h / 2)) / EA
    I_t = (n_p * (b * t_plate ** 3 / 12 + A_p * (y_na - y_c) ** 2)
           + b * h ** 3 / 12 + b * h * (t_plate + h / 2 - y_na) ** 2)
    assert t_plate < y_na
    expected_plate = n_p * A_p * (y_na - y_c) / (I_t * b)
    # the timber's largest value is at the neutral axis: Q of what lies below it
    q_na = n_p * A_p * (y_na - y_c) + b * (y_na - t_plate) ** 2 / 2
    expected_timber = q_na / (I_t * b)
    tau = unit_shear_stress(s)
    assert math.isclose(float(tau[0]), expected_plate, rel_tol=1e-12)
    assert math.isclose(float(tau[1]), expected_timber, rel_tol=1e-12)


def test_side_by_side_plies_keep_their_value_at_the_neutral_axis():
    s = load(DEMO)
    sec = analyse(list(s.plies), s.all_materials(), "DFL-No2")
    tau = unit_shear_stress(sec)
    y_na = sec.neutral_axis_y
    exact = abs(sec.shear_stress(1.0, [y_na]))[:, 0]
    # a flitch beam's largest is at the NA (a cut beside it may round one ulp higher)
    assert all(t >= e and math.isclose(t, e, rel_tol=1e-14)
               for t, e in zip(tau, exact, strict=True))


@pytest.mark.parametrize("heights", [(0.05, 0.05, 0.2), (0.2, 0.05, 0.05), (0.1, 0.1, 0.1)])
def test_three_stacked_timbers_are_one_rectangle(heights):
    """Three timbers of one width stacked (side offsets do not change bending about the
    horizontal axis) carry tau(y) = V Q(y) / (I b) of one b x h rectangle: each ply's
    largest is at the neutral axis where it holds it, else at its edge nearest the axis.
    At an interface the cut is shared by the plies on both sides: that cut alone gives the
    middle ply of (0.05, 0.05, 0.2) 80.2 and the old even cuts 115.16, not 116.65 (per N).
    """
    mats = load(DEMO).all_materials()
    b = 0.0381
    plies, y = [], 0.0
    for k, h in enumerate(heights):
        plies.append(Ply(f"t{k}", "DFL-No2", 0.01 * (k % 2), y, b, h))
        y += h
    depth = y
    s = analyse(plies, mats, "DFL-No2")
    second = b * depth ** 3 / 12
    c = depth / 2
    assert math.isclose(s.neutral_axis_y, c, rel_tol=1e-12)

    def tau(at: float) -> float:  # V Q / (I b) of the part below the cut
        return b * at * (c - at / 2) / (second * b)

    got = unit_shear_stress(s)
    y = 0.0
    for k, h in enumerate(heights):
        lo, hi = y, y + h
        at = c if lo <= c <= hi else (hi if hi < c else lo)
        assert math.isclose(float(got[k]), tau(at), rel_tol=1e-12), (k, got[k], tau(at))
        y = hi


def test_the_sheet_derives_a_thin_ply_between_two_others():
    """The sheet's derivation of each shear check reproduces the check (it raises where
    it does not): a thin timber between a steel plate and a timber, whose largest shear
    is just inside its bottom edge, above the neutral axis.
    """
    import io
    from dataclasses import replace

    from plystack.core.pipeline import run
    from plystack.core.report.sheet import build_sheet

    p = load(DEMO)
    plies = (Ply("steel", "A36", 0.01, 0.0, 0.1, 0.2),
             Ply("thin", "DFL-No2", 0.0, 0.2, 0.0381, 0.01),
             Ply("timber", "DFL-No2", 0.01, 0.21, 0.1, 0.2))
    q = replace(p.with_plies(plies), alternatives=())
    s = analyse(list(plies), q.all_materials(), "DFL-No2")
    assert 0.0 < s.neutral_axis_y < 0.2
    # the whole shear flow above the cut passes through the thin ply: V Q / (I_t b), by
    # hand (transformed to the timber: the steel's width times n)
    mats = q.all_materials()
    n_s = mats["A36"].E / mats["DFL-No2"].E
    parts = [(n_s * 0.1 * 0.2, 0.1), (0.0381 * 0.01, 0.205), (0.1 * 0.2, 0.31)]  # (A, y_c)
    y_na = sum(a * y for a, y in parts) / sum(a for a, _ in parts)
    i_t = (n_s * 0.1 * 0.2 ** 3 / 12 + 0.0381 * 0.01 ** 3 / 12 + 0.1 * 0.2 ** 3 / 12
           + sum(a * (y - y_na) ** 2 for a, y in parts))
    Q = sum(a * (y - y_na) for a, y in parts[1:])
    expected = Q / (i_t * 0.0381)
    assert math.isclose(float(unit_shear_stress(s)[1]), expected, rel_tol=1e-12)
    a = run(q)
    assert any(c.id == "shear" and c.ply == "thin" for c in a.checks)
    assert build_sheet(q, io.BytesIO()) > 0


def test_check_shear_option_reports_a_thin_ply_whole(tmp_path, capsys):
    """``check --shear`` lists each ply's largest shear stress with the checks' cuts: the
    thin ply between two others gets V Q / (I_t b), not the shared interface value.
    """
    import json

    from plystack.core.cli import main
    from plystack.core.io.project_file import save

    p = load(DEMO)
    plies = (Ply("steel", "A36", 0.01, 0.0, 0.1, 0.2),
             Ply("thin", "DFL-No2", 0.0, 0.2, 0.0381, 0.01),
             Ply("timber", "DFL-No2", 0.01, 0.21, 0.1, 0.2))
    path = tmp_path / "thin.plystack.json"
    from dataclasses import replace

    save(replace(p.with_plies(plies), alternatives=()), path)
    assert main(["check", str(path), "--json", "--shear", "1000 N"]) in (0, 1)
    out = json.loads(capsys.readouterr().out)
    rows = {r["name"]: r for r in out["shear"]["plies"]}
    mats = p.all_materials()  # by hand, as in the test above
    n_s = mats["A36"].E / mats["DFL-No2"].E
    parts = [(n_s * 0.1 * 0.2, 0.1), (0.0381 * 0.01, 0.205), (0.1 * 0.2, 0.31)]  # (A, y_c)
    y_na = sum(a * y for a, y in parts) / sum(a for a, _ in parts)
    i_t = (n_s * 0.1 * 0.2 ** 3 / 12 + 0.0381 * 0.01 ** 3 / 12 + 0.1 * 0.2 ** 3 / 12
           + sum(a * (y - y_na) ** 2 for a, y in parts))
    hand = 1000 * sum(a * (y - y_na) for a, y in parts[1:]) / (i_t * 0.0381)
    assert math.isclose(rows["thin"]["tau_max"], hand, rel_tol=1e-12)
