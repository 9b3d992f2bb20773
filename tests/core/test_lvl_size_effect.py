"""EN 1995-1-1 3.4 (from memory): LVL's size effects. Bending (3.4(3)): k_h =
min((300/h)^s, 1.2), h the depth in mm, s the product's declared size effect exponent
(3.4(5), EN 14374). Tension parallel to the grain (3.4(4)): k_l = min((3000/l)^(s/2),
1.1), l the length in mm. Without s, Plystack takes 1.0 where the factor could only
raise the strength (h <= 300 mm, l <= 3 m) and refuses the check where it lowers it:
the verdict is then INCOMPLETE, with the field that would make the check possible.

Checked on the bundled EU demo (a stair trimmer, invented) with its joists replaced by
LVL of the library's typical record, by hand: f_m,d = k_crit k_mod k_h f_m,k / gamma_M
with gamma_M = 1.2 for LVL (Table 2.3).
"""

from __future__ import annotations

import json
from pathlib import Path
from typing import Any

import pytest

from plystack.core.codes import en1995
from plystack.core.io.project_file import from_dict
from plystack.core.model.errors import MissingCheck, ProjectError
from plystack.core.pipeline import run

ROOT = Path(__file__).resolve().parents[2] / "assets"


def _lvl(depth_mm: float, s: float | None) -> dict[str, Any]:
    data = json.loads((ROOT / "demo" / "stair-trimmer-eu.plystack.json").read_text("utf-8"))
    data.pop("alternatives", None)
    record = json.loads((ROOT / "materials.json").read_text("utf-8"))["materials"][
        "EU-LVL-typical"]
    if s is not None:
        record["s"] = s
    data.setdefault("materials", {})["LVL-T"] = record
    for ply in data["plies"]:
        if ply["material"] == "C24":
            ply["material"] = "LVL-T"
            ply["height"] = f"{depth_mm} mm"
        else:  # the plate, 10 mm clear of each edge
            ply["height"] = f"{depth_mm - 20} mm"
    return data


@pytest.mark.parametrize(("depth", "s", "k_h"), [
    (240.0, None, 1.0),                      # no increase taken without s
    (240.0, 0.12, (300 / 240) ** 0.12),
    (200.0, 0.5, 1.2),                       # (300/200)^0.5 = 1.22, capped at 1.2
    (360.0, 0.12, (300 / 360) ** 0.12),
])
def test_bending_uses_k_h_of_the_declared_exponent(depth: float, s: float | None,
                                                   k_h: float) -> None:
    a = run(from_dict(_lvl(depth, s)))
    bending = [c for c in a.checks if c.id == "bending" and c.ply == "left joist"]
    assert bending
    fm_k = 44e6  # the library record's f_m,k, 44 MPa
    for c in bending:
        assert c.factors["k_h"] == pytest.approx(k_h, rel=1e-14)
        assert c.partial_factors["gamma_M"] == 1.2
        expected = c.factors["k_crit"] * c.factors["k_mod"] * k_h * fm_k / 1.2
        assert c.capacity == pytest.approx(expected, rel=1e-12)


def test_deep_lvl_without_its_exponent_is_incomplete() -> None:
    a = run(from_dict(_lvl(360.0, None)))
    assert a.verdict == "INCOMPLETE"
    assert not [c for c in a.checks if c.id == "bending" and c.ply == "left joist"]
    missing = [w for w in a.warnings if isinstance(w, MissingCheck)
               and w.path == "materials.LVL-T.s"]
    assert missing and "300 mm" in missing[0].message
    # said once for each joist, not once per combination and check
    assert [w.message.split('"')[1] for w in missing] == ["left joist", "right joist"]


def test_the_length_factor() -> None:
    assert en1995.k_l_lvl(2.5, None) == 1.0
    assert en1995.k_l_lvl(3.6, None) is None
    assert en1995.k_l_lvl(3.6, 0.12) == pytest.approx((3000 / 3600) ** 0.06, rel=1e-14)
    assert en1995.k_l_lvl(1.0, 0.5) == pytest.approx(1.1, rel=1e-14)  # capped


def test_a_bad_exponent_names_its_field() -> None:
    with pytest.raises(ProjectError) as err:
        from_dict(_lvl(240.0, 1.5))
    assert "materials.LVL-T.s" in str(err.value)
    assert "between 0 and 1" in str(err.value)
