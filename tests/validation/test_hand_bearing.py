"""Bearing perpendicular to the grain worked by hand: timber on a bottom cover plate, and
under point loads with a bearing length.

Sources (from memory): NDS 2018 3.10.2 f_c_perp = R / A_b, 3.10.4 C_b = (l_b + 0.375) /
l_b for l_b < 6 in at least 3 in from the end; NDS Supplement Table 4A Douglas Fir-Larch
No.2 Fc_perp = 625 psi; EN 1995-1-1 6.1.5 A_ef = b l_ef with l_ef = l plus 30 mm on each
side within the member, k_c,90 taken as 1.0; EN 338 C24 f_c,90,k = 2.5 MPa; Table 3.1
k_mod 0.8 (medium-term, service class 1), Table 2.3 gamma_M 1.3; EN 1990 6.10 1.35 G +
1.5 Q. Reactions of a simple span: wL/2 + P b / L (statics).
"""

from __future__ import annotations

import copy

import pytest

from plystack.core.io.project_file import ProjectError, from_dict
from plystack.core.pipeline import run

PSI = 6894.757293168361

US = {
    "format": "plystack", "version": 1, "title": "hand bearing US", "display_units": "US",
    "plies": [
        {"name": "joist", "material": "DFL-No2", "x": "0 in", "y": "0.25 in",
         "width": "1.5 in", "height": "9.25 in"},
        {"name": "cover", "material": "A36", "x": "0 in", "y": "0 in",
         "width": "1.5 in", "height": "0.25 in"}],
    "beam": {"spans": ["12 ft"], "supports": "simple", "self_weight": False,
             "bearing_length": "3 in",
             "loads": [{"case": "D", "type": "line", "value": "15 plf"},
                       {"case": "L", "type": "line", "value": "30 plf"},
                       {"case": "L", "type": "point", "value": "200 lbf", "at": "6 ft",
                        "bearing_length": "2 in"}],
             "combinations": "ASD"},
    "design": {"basis": "US-ASD",
               "connector": {"type": "screw", "allowable": "300 lbf", "rows": 1}}}


def bearing(a, location):
    return next(c for c in a.checks if c.id == "bearing" and c.location.startswith(location))


def test_timber_bears_on_a_bottom_cover_plate():
    """R = (15 + 30) x 12 / 2 + 200 / 2 = 370 lbf on the joist's 1.5 in over 3 in."""
    a = run(from_dict(US))
    c = bearing(a, "support 1")
    assert c.ply == "joist"
    assert c.combination == "D + L"
    assert c.demand / PSI == pytest.approx(370.0 / (1.5 * 3.0), rel=1e-9)
    assert c.capacity / PSI == pytest.approx(625.0, rel=1e-12)
    assert c.factors["C_b"] == 1.0
    assert any("cover" in n for n in c.notes)


def test_point_load_bearing_with_C_b():
    """f = 200 / (1.5 x 2) = 66.7 psi; C_b = (2 + 0.375) / 2 = 1.1875 (NDS 3.10.4)."""
    a = run(from_dict(US))
    c = bearing(a, "point load 3")
    assert c.x == pytest.approx(6 * 0.3048, rel=1e-12)
    assert c.demand / PSI == pytest.approx(200.0 / 3.0, rel=1e-9)
    assert c.factors["C_b"] == pytest.approx(1.1875, rel=1e-12)
    assert c.capacity / PSI == pytest.approx(625.0 * 1.1875, rel=1e-12)


def test_point_load_near_the_end_gets_no_C_b():
    """Within 3 in of the end (2 in bearing centred 3.5 in from it: edge 2.5 in): C_b 1."""
    data = copy.deepcopy(US)
    data["beam"]["loads"][2]["at"] = "3.5 in"
    c = bearing(run(from_dict(data)), "point load 3")
    assert c.factors["C_b"] == 1.0


@pytest.mark.parametrize(("overhang", "C_b"), [("1.5 in", 1.0), ("4 in", 1.0),
                                               ("4.5 in", 1.125), ("10 in", 1.125)])
def test_a_support_on_a_short_overhang_bears_near_the_end(overhang, C_b):
    """NDS 2018 3.10.4: C_b only for a bearing not nearer than 3 in to the member's end.
    A 3 in bearing centred on a support with an overhang of e: its edge is e - 1.5 in
    from the end; e = 1.5 in and 4 in leave 2.5 in or less, so C_b = 1; e = 4.5 in leaves
    3 in and e = 10 in 8.5 in, so C_b = (3 + 0.375) / 3 = 1.125.
    """
    data = copy.deepcopy(US)
    data["beam"]["overhang_right"] = overhang
    a = run(from_dict(data))
    c = bearing(a, "support 2")
    assert c.factors["C_b"] == C_b
    assert c.capacity / PSI == pytest.approx(625.0 * C_b, rel=1e-12)
    assert bearing(a, "support 1").factors["C_b"] == 1.0  # at the member's end


@pytest.mark.parametrize("overhang", ["1 in", "1.4 in"])
def test_a_bearing_that_would_run_past_the_end_is_refused(overhang):
    """A 3 in bearing centred on a support 1 in (or 1.4 in) from the member's end would
    stand partly beyond it: refused by field, rather than checked on contact it has not."""
    data = copy.deepcopy(US)
    data["beam"]["overhang_right"] = overhang
    with pytest.raises(ProjectError, match=r"beam\.bearing_length: 3\.000 in centred on "
                       r"support 2 would run past the member's end"):
        from_dict(data)


def test_a_point_load_bearing_past_the_end_is_refused():
    data = copy.deepcopy(US)
    data["beam"]["loads"][2]["at"] = "0.5 in"  # a 2 in bearing: 1 in either side
    with pytest.raises(ProjectError, match=r"loads\[2\]\.bearing_length: 2\.000 in "
                       r"centred at x = .* would run past the member's end"):
        from_dict(data)


def test_missing_Fc_perp_makes_the_verdict_incomplete():
    data = copy.deepcopy(US)
    data["materials"] = {"NOFCP": {"kind": "timber", "name": "no Fc_perp", "E": "1600000 psi",
                                   "density": "33 pcf", "Fb": "900 psi", "Fv": "180 psi",
                                   "Emin": "580000 psi", "G": 0.5, "source": "test data",
                                   "product": "sawn"}}
    data["plies"][0]["material"] = "NOFCP"
    a = run(from_dict(data))
    assert not any(c.id == "bearing" for c in a.checks)
    assert a.verdict == "INCOMPLETE"
    # the cover plate's connector has no diameter: its slip is not analysed (a reason too)
    assert [r.path for r in a.incomplete_reasons] == (["materials.NOFCP.Fc_perp"] * 2
                                                      + ["design.connector.diameter"])


def test_bearing_length_only_on_point_loads():
    data = copy.deepcopy(US)
    data["beam"]["loads"][1]["bearing_length"] = "2 in"
    with pytest.raises(ProjectError, match=r"loads\[1\]\.bearing_length"):
        from_dict(data)


EU = {
    "format": "plystack", "version": 1, "title": "hand bearing EU", "display_units": "SI",
    "plies": [
        {"name": "timber", "material": "C24", "x": "0 mm", "y": "0 mm",
         "width": "75 mm", "height": "225 mm"}],
    "beam": {"spans": ["4 m"], "supports": "simple", "self_weight": False,
             "bearing_length": "100 mm",
             "loads": [{"case": "D", "type": "line", "value": "1 kN/m"},
                       {"case": "L", "type": "line", "value": "2 kN/m"},
                       {"case": "L", "type": "point", "value": "5 kN", "at": "2 m",
                        "bearing_length": "80 mm"}],
             "combinations": "EN1990"},
    "design": {"basis": "EU-LSD", "service_class": 1}}


def test_eu_support_and_point_load_bearing():
    """Support: R = (1.35 x 1 + 1.5 x 2) x 4 / 2 + 1.5 x 5 / 2 = 12.45 kN over 75 x (100 +
    30) mm; point load: 1.5 x 5 kN over 75 x (80 + 2 x 30) mm; f_c,90,d = 0.8 x 2.5 / 1.3.
    """
    a = run(from_dict(EU))
    fd = 0.8 * 2.5e6 / 1.3
    s = bearing(a, "support 2")
    assert s.demand == pytest.approx(12450.0 / (0.075 * 0.130), rel=1e-9)
    assert s.capacity == pytest.approx(fd, rel=1e-12)
    p = bearing(a, "point load 3")
    assert p.demand == pytest.approx(7500.0 / (0.075 * 0.140), rel=1e-9)
    assert p.capacity == pytest.approx(fd, rel=1e-12)
    assert p.ratio == pytest.approx(7500.0 / (0.075 * 0.140) / fd, rel=1e-9)


def test_eu_point_load_at_the_end_spreads_to_one_side():
    """A 80 mm bearing centred 40 mm from the end: l_ef = 80 + 30 mm (EN 1995-1-1 6.1.5)."""
    data = copy.deepcopy(EU)
    data["beam"]["loads"][2]["at"] = "40 mm"
    p = bearing(run(from_dict(data)), "point load 3")
    assert p.demand == pytest.approx(7500.0 / (0.075 * 0.110), rel=1e-9)


@pytest.mark.parametrize(("overhang", "spread"), [("50 mm", 0.0), ("70 mm", 0.020),
                                                  ("200 mm", 0.030)])
def test_eu_support_on_a_short_overhang_spreads_only_to_the_end(overhang, spread):
    """EN 1995-1-1 6.1.5(1): up to 30 mm beyond each side of the bearing, within the
    member. A 100 mm bearing centred on a support with an overhang of e reaches e - 50 mm
    from the end: 50 mm of overhang leaves nothing, 70 mm leaves 20 mm, 200 mm the full
    30 mm; the side towards the span spreads 30 mm. The reaction of support 2 with the
    overhang: the largest over the pattern arrangements, taken from the program's own beam
    (statics are tested elsewhere).
    """
    data = copy.deepcopy(EU)
    data["beam"]["overhang_right"] = overhang
    a = run(from_dict(data))
    s = bearing(a, "support 2")
    l_ef = 0.100 + 0.030 + spread
    combo = next(c for c in a.beam.combinations if c.name == s.combination)
    R = float(combo.reactions_max[1])
    assert s.demand == pytest.approx(R / (0.075 * l_ef), rel=1e-12)


def test_eu_spread_is_at_most_the_bearing_itself_and_half_the_gap_to_the_next():
    """EN 1995-1-1 6.1.5(1) (with A1, from memory): 30 mm each side but not more than l or
    l1 / 2. A 20 mm bearing under the point load: 20 + 20 + 20 = 60 mm (not 80); a second
    point load 60 mm away with a 40 mm bearing: the clear gap l1 = 60 - (20 + 40) / 2 =
    30 mm, so 15 mm on that side of the first (min(30, 20, 15): 20 + 20 + 15 = 55 mm) and
    of the second (min(30, 40, 15): 40 + 15 + 30 = 85 mm)."""
    data = copy.deepcopy(EU)
    data["beam"]["loads"][2]["bearing_length"] = "20 mm"
    p = bearing(run(from_dict(data)), "point load 3")
    assert p.demand == pytest.approx(7500.0 / (0.075 * 0.060), rel=1e-9)
    data["beam"]["loads"].append({"case": "L", "type": "point", "value": "1 kN", "at": "2.06 m",
                                  "bearing_length": "40 mm"})
    a = run(from_dict(data))
    assert bearing(a, "point load 3").demand == pytest.approx(7500.0 / (0.075 * 0.055),
                                                              rel=1e-9)
    assert bearing(a, "point load 4").demand == pytest.approx(1500.0 / (0.075 * 0.085),
                                                              rel=1e-9)


@pytest.mark.parametrize("data", [US, EU], ids=["US", "EU"])
def test_sheet_derives_every_bearing(data):
    """The sheet prints the point-load bearing with its own force (the sheet's derivation
    recomputes each value and refuses to print one that disagrees with the check).
    """
    import io
    import re

    from pypdf import PdfReader

    from plystack.core.report.sheet import build_sheet

    buf = io.BytesIO()
    build_sheet(from_dict(data), buf)
    text = "\n".join(p.extract_text() for p in PdfReader(io.BytesIO(buf.getvalue())).pages)
    text = re.sub(r"\s+", " ", text.replace("\u00a0", " "))
    assert "point load 3" in text
    if data is US:
        assert "steel ply cover" in text
